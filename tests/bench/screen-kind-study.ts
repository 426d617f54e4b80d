/**
 * Where the screen's CPU goes by kind of face pair, on an imported catalogue's match cache with the
 * generator's truth:
 *   npx tsx tests/bench/screen-kind-study.ts <catalogue>.match-cache [out.jsonl]
 * (KNITBONE_PROFILE_PAIRS: strided fragment pairs besides every true pair, default 200;
 * KNITBONE_PROFILE_PARAMS: match parameters over the defaults). Each studied fragment pair's
 * candidate face pairs go through screenFacePairs together, as a worker screens them, each pair
 * with its steps timed (MatchTrace.times; a pair's CPU is the sum of its steps); the table splits
 * face pairs, coarse hypotheses (short ICP runs) and the CPU of each step by kind (ww whole-whole,
 * wp a part against a whole, pp part-part; a part is a piece or patch of a break face), by whether
 * the face pair is small (pair voting's size) and by whether the fragment pair is a true join;
 * "correct" counts the face pairs whose screened motions hold one within 5 degrees and 5 mm of the
 * truth, "only" those that are the only such face pair of their fragment pair. out.jsonl gets one
 * row per face pair with every coarse hypothesis's step, overlap share and correctness.
 */
import { appendFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { DEFAULT_MATCH_PARAMETERS, screenFacePairs, type MatchParameters, type MatchTrace } from '../../core/geometry/proposals/pairwise-match';
import type { PreparedFragment } from '../../core/geometry/proposals/prepared-fragment';
import { matchCacheTruth } from './match-cache-truth';
import { isCorrectMotion } from './correct-motion';

const dir = process.argv[2];
const out = process.argv[3];
const maxPairs = Number(process.env.KNITBONE_PROFILE_PAIRS ?? 200);
const params: MatchParameters = { ...DEFAULT_MATCH_PARAMETERS, ...(JSON.parse(process.env.KNITBONE_PROFILE_PARAMS ?? '{}') as Partial<MatchParameters>) };
const { nos, joins, studied, assemble } = matchCacheTruth(dir, maxPairs);
const whole = (f: PreparedFragment, i: number): boolean => i === 0 || f.faces[i - 1].parent !== f.faces[i].parent;
const cpu = (): number => { const u = process.cpuUsage(); return (u.user + u.system) / 1e6; };
interface Row { facePairs: number; hyps: number; cpu: number; steps: Record<string, number>; withCorrect: number; correctOnly: number }
const rows = new Map<string, Row>();
const row = (k: string): Row => { let r = rows.get(k); if (!r) { r = { facePairs: 0, hyps: 0, cpu: 0, steps: {}, withCorrect: 0, correctOnly: 0 }; rows.set(k, r); } return r; };
let total = 0;
for (const list of studied) {
  const a = assemble(list[0].a), b = assemble(list[0].b);
  const key = `${nos[list[0].a]}|${nos[list[0].b]}`;
  const want = joins.get(key);
  const lines: string[] = [];
  const found: Array<{ k: string; correct: boolean }> = [];
  // the fragment pair's face pairs screened together, as a worker screens them (screenFacePairs)
  const traces: MatchTrace[] = list.map(() => ({ coarse: [], refined: [], kept: [], times: {}, stages: [] }));
  const t0 = cpu();
  const screened = screenFacePairs(a, b, list.map((c): [number, number] => [c.faceA, c.faceB]), params, traces);
  total += cpu() - t0;
  list.forEach((c, n) => {
    const kind = (whole(a, c.faceA) ? 'w' : 'p') + (whole(b, c.faceB) ? 'w' : 'p');
    const small = Math.min(a.faces[c.faceA].points.length, b.faces[c.faceB].points.length) / 3 <= params.pairVoteMaxFaceSamples;
    const k = `${kind === 'pw' ? 'wp' : kind} ${small ? 'small' : 'large'} ${want ? 'true ' : 'wrong'}`;
    const trace = traces[n];
    const kept = screened.filter((s) => s.i === c.faceA && s.j === c.faceB).map((s) => s.motion);
    // a pair's CPU: the sum of its timed steps (the screen's untimed rest is small)
    const dt = Object.values(trace.times!).reduce((x, y) => x + y, 0) / 1000;
    const r = row(k);
    r.facePairs++;
    r.hyps += trace.coarse.length;
    r.cpu += dt;
    for (const [s, v] of Object.entries(trace.times!)) r.steps[s] = (r.steps[s] ?? 0) + v / 1000;
    const correct = !!want && kept.some((m) => isCorrectMotion(m.transform, want, b.centroid));
    if (correct) r.withCorrect++;
    found.push({ k, correct });
    if (out) lines.push(JSON.stringify({ pair: key, true: !!want, i: c.faceA, j: c.faceB, kind, small, na: a.faces[c.faceA].points.length / 3, nb: b.faces[c.faceB].points.length / 3, hyps: trace.coarse.length, cpu: dt, steps: trace.times, kept: kept.length, correct, pa: a.faces[c.faceA].parent, pb: b.faces[c.faceB].parent, refined: trace.refined.map((r, m) => ({ stage: trace.stages![m], overlap: r.overlap, correct: !!want && isCorrectMotion(r.transform, want, b.centroid), kept: kept.includes(r) })), keptCorrect: kept.map((m) => !!want && isCorrectMotion(m.transform, want, b.centroid)) }));
  });
  // face pairs that are the fragment pair's only ones with a correct screened motion
  const good = found.filter((x) => x.correct);
  if (good.length === 1) row(good[0].k).correctOnly++;
  if (out && lines.length) appendFileSync(out, lines.join('\n') + '\n');
}
const steps = [...new Set([...rows.values()].flatMap((r) => Object.keys(r.steps)))].sort();
process.stdout.write(`fragment pairs ${studied.length} (true ${studied.filter((l) => joins.has(`${nos[l[0].a]}|${nos[l[0].b]}`)).length}), screen CPU ${total.toFixed(2)} s, load ${loadavg()[0].toFixed(2)}\n`);
const timedTotal = [...rows.values()].reduce((x, r) => x + r.cpu, 0);
process.stdout.write(`timed steps ${timedTotal.toFixed(2)} s (the share column is of these)\n`);
process.stdout.write(`${'kind'.padEnd(20)} ${'pairs'.padStart(6)} ${'hyps'.padStart(6)} ${'CPU s'.padStart(7)} ${'share'.padStart(6)} ${steps.map((s) => s.padStart(16)).join('')} ${'correct'.padStart(8)} ${'only'.padStart(5)}\n`);
for (const [k, r] of [...rows.entries()].sort()) {
  process.stdout.write(`${k.padEnd(20)} ${String(r.facePairs).padStart(6)} ${String(r.hyps).padStart(6)} ${r.cpu.toFixed(2).padStart(7)} ${((100 * r.cpu) / timedTotal).toFixed(1).padStart(5)}% ${steps.map((s) => (r.steps[s] ?? 0).toFixed(2).padStart(16)).join('')} ${String(r.withCorrect).padStart(8)} ${String(r.correctOnly).padStart(5)}\n`);
}
