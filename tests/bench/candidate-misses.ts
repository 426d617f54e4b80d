/**
 * Which true joins the candidate index loses, and why, without aligning: for each reachable
 * true join (as candidate-recall.ts) the best rank its partner faces give each other (the
 * smaller of "rank of B's face in A's list" and the reverse, over the join's face pairs), a
 * histogram of those ranks, and for the joins ranked at or beyond k the mean cost each figure of
 * `partnerCost` (face-descriptor.ts) adds, beside the same for the joins kept: the figures that
 * disagree on the lost joins are where a better descriptor would gain. Faces and traits come
 * from candidate-study.ts; recorded size classes (the folder's specimens.csv) prune as in a
 * propose run unless KNITBONE_SIZE_CLASS=0.
 *   npx tsx tests/bench/candidate-misses.ts <demo-dir> [k] [--list]
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { sizeClassCompatible } from '../../core/geometry/proposals/candidate-index';
import { DESCRIPTOR_FIGURES, TEXTURE_WEIGHT, partnerCost } from '../../core/geometry/proposals/face-descriptor';
import { cappedCauchyLoss } from '../../core/geometry/proposals/capped-cauchy-loss';
import { readStudy, sizeClassesFromCsv } from './candidate-recall';
import { loadSet, ranks } from './candidate-rules';

if (process.argv[1]?.endsWith('candidate-misses.ts')) {
  const [dir, kArg = '30'] = process.argv.slice(2);
  const k = Number(kArg);
  const list = process.argv.includes('--list');
  const s = loadSet(dir);
  const n = s.nFaces;
  // loadSet's fragments are readStudy's, without the fragments that have no faces
  const study = readStudy(dir).filter((f) => f.faces.length > 0);
  const flat = study.flatMap((f) => f.faces.map((x, i) => ({ no: f.no, patch: f.faces.findIndex((y) => y.parent === x.parent) !== i, samples: x.samples, share: Math.max(0, ...Object.values(x.breaks)) })));
  const classes = process.env.KNITBONE_SIZE_CLASS === '0' || !existsSync(join(dir, 'specimens.csv')) ? undefined : sizeClassesFromCsv(readFileSync(join(dir, 'specimens.csv'), 'utf8'));
  const ok = classes ? sizeClassCompatible(study.map((f) => classes.get(f.no) ?? null)) : () => true;
  const C = new Float32Array(n * n).fill(Infinity);
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) {
    const a = s.fragOfFace[i], b = s.fragOfFace[j];
    if (a === b || !ok(Math.min(a, b), Math.max(a, b))) continue;
    C[i * n + j] = C[j * n + i] = partnerCost(s.desc[i], s.desc[j]);
  }
  const R = ranks(s, C);
  const F = DESCRIPTOR_FIGURES.length;
  const contributions = (x: number, y: number): number[] => {
    const A = s.desc[x], B = s.desc[y];
    const out = DESCRIPTOR_FIGURES.map(({ scale, weight, opposite, cap }, c) => {
      const u = A.figures[c], v = B.figures[c];
      if (weight === 0) return 0;
      if (Number.isNaN(u) || Number.isNaN(v)) return weight * Math.log(2);
      const z = (opposite ? u + v : u - v) / scale;
      return weight * cappedCauchyLoss(z, cap);
    });
    let d = 0;
    for (let m = 0; m < A.mirrored.length; m++) d += (A.mirrored[m] - B.fpfh[m]) ** 2;
    return [...out, TEXTURE_WEIGHT * Math.sqrt(d)];
  };
  const lost = new Float64Array(F + 1), kept = new Float64Array(F + 1);
  let nLost = 0, nKept = 0;
  const best: number[] = [];
  for (const j of s.joins) {
    let r = Infinity, pair = j[0];
    for (const [x, y] of j) {
      const q = Math.min(R[x * n + y], R[y * n + x]);
      if (q < r) { r = q; pair = [x, y]; }
    }
    best.push(r);
    const c = contributions(pair[0], pair[1]);
    if (r >= k) { nLost++; c.forEach((v, i) => { lost[i] += v; }); } else { nKept++; c.forEach((v, i) => { kept[i] += v; }); }
    if (list && r >= k) {
      const [x, y] = pair, fx = flat[x], fy = flat[y];
      console.log(`lost ${fx.no} / ${fy.no}: rank ${r} (${R[x * n + y]}, ${R[y * n + x]}), ${j.length} true face pairs, samples ${fx.samples}/${fy.samples}, patch ${Number(fx.patch)}${Number(fy.patch)}, share on the break ${fx.share.toFixed(2)}/${fy.share.toFixed(2)}`);
    }
  }
  console.log(`${dir}: ${n} faces, ${s.reachable} reachable joins, size classes ${classes ? 'used' : 'not used'}; ${nKept} within rank ${k}, ${nLost} beyond`);
  const edges = [0, 10, 20, 30, 40, 60, 100, 200, 400, Infinity];
  for (let b = 0; b + 1 < edges.length; b++) console.log(`  best rank ${edges[b]}-${edges[b + 1] - 1}: ${best.filter((x) => x >= edges[b] && x < edges[b + 1]).length}`);
  console.log(`mean cost per figure (joins beyond rank ${k} / within):`);
  [...DESCRIPTOR_FIGURES.map((x) => x.name), 'texture (mean FPFH)'].forEach((name, i) => console.log(`  ${name.padEnd(34)} ${(lost[i] / Math.max(1, nLost)).toFixed(2).padStart(6)} / ${(kept[i] / Math.max(1, nKept)).toFixed(2)}`));
}
