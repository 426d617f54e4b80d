/**
 * How well a fragment's shaft centre is held for the face traits (face-traits.ts: the lean and
 * the axis cosine read the axis line), against the generator's axis (generator-axis.ts): for
 * each shaft piece of a propose run's match cache, the centre of each estimator (the fitted
 * direction kept) is compared with the generator's line in the plane across the axis at the
 * piece's centroid (offset along and across the direction from the true centre to the piece),
 * and each break face's lean (segmentation's samples) with the lean about the generator's axis,
 * by the piece's widest face's share of the circumference (about the generator's axis).
 *   npx tsx tests/bench/trait-centre-study.ts <demo-dir> <catalogue copy> <match-cache> [estimator,...]
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { readFragment } from '../../core/jobs/fragment-cache';
import { faceTraits, AXIS_SUPPORT_MIN, type ShaftAxisLike } from '../../core/geometry/proposals/face-traits';
import type { FragmentInput } from '../../core/geometry/proposals/prepared-fragment';
import { catalogueFragmentKeys } from './catalogue-fragment-keys';
import { generatorAxis, type TruthFragment } from './generator-axis';
import { TRAIT_CENTRE_ESTIMATORS } from './trait-centre-estimators';

const [dir, catalogue, cacheDir, which] = process.argv.slice(2).filter((a) => !a.startsWith('--'));
const names = which ? which.split(',') : Object.keys(TRAIT_CENTRE_ESTIMATORS);
// oracle-along / oracle-across: the fitted centre with its error along / across the direction to the piece removed (generator's axis)
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[] };
const keyOf = catalogueFragmentKeys(catalogue);

interface Row { no: string; support: number; share: number; offAlong: number; offAcross: number; leanDiff: number[]; cosDiff: number[]; element: string }
const rows = new Map<string, Row[]>(names.map((n) => [n, []]));
const empty = new Float32Array(0);
const c0 = process.cpuUsage();
const foot = (a: ShaftAxisLike, q: number[]): number[] => {
  const t = (q[0] - a.point[0]) * a.direction[0] + (q[1] - a.point[1]) * a.direction[1] + (q[2] - a.point[2]) * a.direction[2];
  return [0, 1, 2].map((i) => a.point[i] + t * a.direction[i]);
};
for (const f of truth.fragments) {
  const key = keyOf.get(f.catalogueNo);
  const cached = key ? readFragment(cacheDir, key) : undefined;
  if (!cached) continue;
  const fitted = cached.summary.axis;
  if (fitted.support < AXIS_SUPPORT_MIN) continue;
  const input: FragmentInput = cached.input;
  const g = generatorAxis(f, input);
  if (!g) continue;
  const gen: ShaftAxisLike = { direction: g.direction, point: g.point, support: fitted.support };
  const faces = input.faces.filter((x) => x.points.length >= 9);
  if (!faces.length) continue;
  const genTraits = faces.map((x) => faceTraits(x.points, x.normals, x.area ?? 0, empty, gen).tube!);
  const share = Math.max(...genTraits.map((t) => t.arcShare));
  // the piece's centroid (mean of its vertices) and the true centre at it
  const P = input.positions;
  const cen = [0, 0, 0];
  for (let i = 0; i < P.length; i += 3) for (let k = 0; k < 3; k++) cen[k] += P[i + k] / (P.length / 3);
  const gf = foot(gen, cen);
  const out = [cen[0] - gf[0], cen[1] - gf[1], cen[2] - gf[2]];
  const od = out[0] * gen.direction[0] + out[1] * gen.direction[1] + out[2] * gen.direction[2];
  for (let k = 0; k < 3; k++) out[k] -= od * gen.direction[k];
  const ol = Math.hypot(out[0], out[1], out[2]) || 1;
  for (let k = 0; k < 3; k++) out[k] /= ol;
  for (const name of names) {
    let axis: ShaftAxisLike;
    if (name.startsWith('oracle-')) {
      // the fitted centre with only its offset along (or across) the direction to the piece removed
      const ff = foot(fitted, cen);
      const off = [ff[0] - gf[0], ff[1] - gf[1], ff[2] - gf[2]];
      const al = off[0] * out[0] + off[1] * out[1] + off[2] * out[2];
      const fix = name === 'oracle-along' ? out.map((o) => al * o) : [0, 1, 2].map((k) => off[k] - al * out[k]);
      axis = { ...fitted, point: [ff[0] - fix[0], ff[1] - fix[1], ff[2] - fix[2]] };
    } else axis = TRAIT_CENTRE_ESTIMATORS[name](input, fitted);
    const af = foot(axis, cen);
    const off = [af[0] - gf[0], af[1] - gf[1], af[2] - gf[2]];
    const along = off[0] * out[0] + off[1] * out[1] + off[2] * out[2];
    const dd = off[0] * gen.direction[0] + off[1] * gen.direction[1] + off[2] * gen.direction[2];
    const across = Math.sqrt(Math.max(0, off[0] ** 2 + off[1] ** 2 + off[2] ** 2 - along * along - dd * dd));
    const leanDiff: number[] = [], cosDiff: number[] = [];
    faces.forEach((x, i) => {
      const t = faceTraits(x.points, x.normals, x.area ?? 0, empty, axis).tube!;
      leanDiff.push(Math.abs(t.radialLean! - genTraits[i].radialLean!));
      cosDiff.push(Math.abs(t.axisCosine! - genTraits[i].axisCosine!));
    });
    rows.get(name)!.push({ no: f.catalogueNo, support: fitted.support, share, offAlong: along, offAcross: across, leanDiff, cosDiff, element: f.element });
  }
}
const q = (xs: number[], p: number): number => {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * s.length))];
};
const bins: Array<[number, number, string]> = [[0, 0.2, '<0.2'], [0.2, 0.3, '0.2-0.3'], [0.3, 0.4, '0.3-0.4'], [0.4, 0.6, '0.4-0.6'], [0.6, 2, '>=0.6'], [0, 2, 'all']];
for (const name of names) {
  const rs = rows.get(name)!;
  console.log(`\n${name}: ${rs.length} shaft pieces`);
  console.log('share     pieces faces  |off along| med/p90  |off across| med/p90  lean|d| med / p90 / >0.2   cos|d| med / p90');
  for (const [lo, hi, label] of bins) {
    const b = rs.filter((r) => r.share >= lo && r.share < hi);
    const lean = b.flatMap((r) => r.leanDiff), cos = b.flatMap((r) => r.cosDiff);
    const al = b.map((r) => Math.abs(r.offAlong)), ac = b.map((r) => r.offAcross);
    console.log(`${label.padEnd(9)} ${String(b.length).padStart(6)} ${String(lean.length).padStart(5)}  ${q(al, 0.5).toFixed(2).padStart(6)} / ${q(al, 0.9).toFixed(2).padStart(6)}      ${q(ac, 0.5).toFixed(2).padStart(6)} / ${q(ac, 0.9).toFixed(2).padStart(6)}      ${q(lean, 0.5).toFixed(3)} / ${q(lean, 0.9).toFixed(3)} / ${((100 * lean.filter((x) => x > 0.2).length) / Math.max(1, lean.length)).toFixed(0).padStart(2)}%      ${q(cos, 0.5).toFixed(3)} / ${q(cos, 0.9).toFixed(3)}`);
  }
}
if (process.argv.includes('--list')) for (const name of names) for (const r of rows.get(name)!) console.log(`${name} ${r.no} ${r.element.padEnd(10)} support ${r.support.toFixed(2)} share ${r.share.toFixed(2)} off along ${r.offAlong.toFixed(1)} across ${r.offAcross.toFixed(1)} lean|d| ${r.leanDiff.map((x) => x.toFixed(2)).join(' ')}`);
console.log(`\n${(process.cpuUsage(c0).user / 1e6).toFixed(1)} CPU s`);
