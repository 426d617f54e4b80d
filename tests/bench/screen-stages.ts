/**
 * Where the screen's time goes, step by step, on the candidate face pairs of demo folders (one
 * thread): `npx tsx tests/bench/screen-stages.ts DIR [DIR...]`. Every candidate face pair (as
 * propose prunes them) goes through screenFacePair with its steps timed (`ScreenTimes`, read
 * through the trace); prints CPU ms summed per step and the share of each.
 * KNITBONE_PROFILE_PAIRS limits the fragment pairs per folder; KNITBONE_STAGE_ROUNDS=n screens
 * them n times and keeps each step's least time (the machine is shared: the least is the steadiest).
 */
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS, screenFacePair } from '../../core/geometry/proposals/pairwise-match';
import { DEFAULT_FPFH_RADIUS_SPACINGS, prepareFragment } from '../../core/geometry/proposals/prepared-fragment';
import { candidateGroups, readStudyScans } from './study-assemblage';

const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? Infinity);
const rounds = Number(process.env.KNITBONE_STAGE_ROUNDS ?? 1);
const totals: Record<string, number> = {};
let facePairs = 0;
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
let screenCpu = 0;
for (const dir of process.argv.slice(2)) {
  const { inputs, spacing } = readStudyScans(dir);
  const prepared = inputs.map((x) => prepareFragment(x, { spacing, fpfhRadiusSpacings: DEFAULT_FPFH_RADIUS_SPACINGS }));
  const grouped = candidateGroups(prepared).slice(0, maxPairs);
  const least: Record<string, number> = {};
  let leastCpu = Infinity;
  for (let round = 0; round < rounds; round++) {
    const times: Record<string, number> = {};
    const t = cpu();
    for (const list of grouped) {
      const a = prepared[list[0].a], b = prepared[list[0].b];
      for (const c of list) {
        screenFacePair(a, c.faceA, b, c.faceB, DEFAULT_MATCH_PARAMETERS, { coarse: [], refined: [], kept: [], times });
        if (round === 0) facePairs++;
      }
    }
    leastCpu = Math.min(leastCpu, cpu() - t);
    for (const [k, v] of Object.entries(times)) least[k] = Math.min(least[k] ?? Infinity, v);
  }
  screenCpu += leastCpu;
  for (const [k, v] of Object.entries(least)) totals[k] = (totals[k] ?? 0) + v;
}
const sum = Object.values(totals).reduce((s, x) => s + x, 0);
process.stdout.write(`face pairs ${facePairs}  screen CPU ${screenCpu.toFixed(2)} s (${((1000 * screenCpu) / facePairs).toFixed(2)} ms a face pair)  load ${loadavg()[0].toFixed(2)}\n`);
for (const [k, v] of Object.entries(totals).sort((x, y) => y[1] - x[1])) process.stdout.write(`  ${k.padEnd(16)} ${v.toFixed(0).padStart(7)} ms  ${((100 * v) / sum).toFixed(1)}%\n`);
