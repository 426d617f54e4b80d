/**
 * Splits each fragment's per-triangle loss into centre failures and classification failures
 * (issue 5 study): per fragment, the agreement with the fitted axis, with the generator's axis
 * imposed (its bowed centre line at the fragment's area-weighted z, as in
 * generator-axis.ts), the fitted centre's offset from that line, the region ceiling
 * (agreement if every region took its majority truth label) and the misread area split into
 * break read as original and original read as break. A fragment that stays low with the
 * generator's axis, or whose centre is near the truth, loses in classification or borders.
 * Run: npx tsx tests/bench/segmentation-failure-split.ts DIR[,DIR...] [settings JSON]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';
import type { ShaftAxis } from '../../core/geometry/shaft-axis';
import { generatorAxis, type TruthFragment } from './generator-axis';

interface Truth { fragments: TruthFragment[] }
const dirs = (process.argv[2] ?? '').split(',').filter(Boolean);
const overrides = JSON.parse(process.argv[3] ?? '{}') as Record<string, unknown>;
const listMax = Number(process.env.STUDY_LIST ?? 12);
for (const dir of dirs) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  const keyed: Array<{ loss: number; line: string }> = [];
  let all = 0, okFit = 0, okGen = 0;
  for (const frag of truth.fragments) {
    const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
    const labels = Buffer.from(frag.triangleLabels, 'base64');
    const { areas } = triangleNormalsAndAreas(parsed.mesh);
    const g0 = generatorAxis(frag, parsed.mesh);
    const gen = g0 !== undefined;
    const zb = g0 ? g0.direction : [0, 0, 1], org = g0 ? g0.point : [0, 0, 0];
    const run = (override?: (a: ShaftAxis) => ShaftAxis) => {
      const a = analyseFragment(parsed.mesh, overrides, new Map(), override);
      let ok = 0, tot = 0, breakAsOrig = 0, origAsBreak = 0;
      const regionSplit = new Map<number, [number, number]>();
      for (let f = 0; f < a.triangleClass.length; f++) {
        const s = a.sourceTriangle[f];
        const w = areas[s];
        tot += w;
        const tb = labels[s] >= 2, pb = a.triangleClass[f] === 0;
        if (tb === pb) ok += w; else if (tb) breakAsOrig += w; else origAsBreak += w;
        const r = a.regionOfTriangle[f];
        const e = regionSplit.get(r) ?? [0, 0];
        e[tb ? 1 : 0] += w;
        regionSplit.set(r, e);
      }
      let ceil = 0;
      for (const [o, b] of regionSplit.values()) ceil += Math.max(o, b);
      return { ok, tot, breakAsOrig, origAsBreak, ceil: ceil / tot, axis: a.axis };
    };
    const fit = run();
    const off = (() => {
      if (!gen) return NaN;
      const r = [fit.axis.point[0] - org[0], fit.axis.point[1] - org[1], fit.axis.point[2] - org[2]];
      const tt = r[0] * zb[0] + r[1] * zb[1] + r[2] * zb[2];
      return Math.hypot(r[0] - tt * zb[0], r[1] - tt * zb[1], r[2] - tt * zb[2]);
    })();
    const ang = gen ? (Math.acos(Math.min(1, Math.abs(zb[0] * fit.axis.direction[0] + zb[1] * fit.axis.direction[1] + zb[2] * fit.axis.direction[2]))) * 180) / Math.PI : NaN;
    const g = gen ? run((a) => ({ direction: [zb[0], zb[1], zb[2]], point: [org[0], org[1], org[2]], radius: a.radius, support: a.support })) : fit;
    all += fit.tot; okFit += fit.ok; okGen += g.ok;
    const loss = fit.tot - fit.ok;
    keyed.push({ loss, line: `  ${frag.catalogueNo} ${frag.element.padEnd(10)} ${fit.tot.toFixed(0).padStart(6)} mm2 fit ${(100 * fit.ok / fit.tot).toFixed(1).padStart(5)} gen ${(100 * g.ok / g.tot).toFixed(1).padStart(5)} lost ${loss.toFixed(0).padStart(5)} (break->orig ${fit.breakAsOrig.toFixed(0)}, orig->break ${fit.origAsBreak.toFixed(0)}) ceil ${(100 * fit.ceil).toFixed(1)} genceil ${(100 * g.ceil).toFixed(1)} centre ${off.toFixed(1)} mm ${ang.toFixed(1)} deg R ${fit.axis.radius.toFixed(1)} sup ${fit.axis.support.toFixed(2)}${fit.axis.section ? ' ell' : ''}${fit.axis.medial ? ' seg' : ''}` });
  }
  console.log(`${dir}: fitted ${(100 * okFit / all).toFixed(2)} generator's axis ${(100 * okGen / all).toFixed(2)}`);
  for (const r of keyed.sort((a, b) => b.loss - a.loss).slice(0, listMax)) console.log(r.line);
}
