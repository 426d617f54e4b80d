/**
 * A second stage for the candidate index, measured without aligning: each face's L cheapest
 * partners by the trait cost (face-descriptor.ts `partnerCost`) are re-ranked by the trait cost
 * plus w times a signature cost computed from the faces' samples, and the union of each face's
 * first q is kept, q chosen (a dithered fractional quota, as candidate-budget.ts) so that the
 * union holds as many face pairs as the plain k-best union. Faces and labels come from a studied
 * folder (candidate-study.ts); samples from the prepared parts in a match cache.
 *   npx tsx tests/bench/candidate-rerank.ts <studied-dir> <cache-dir> [--catalogue COPY.sqlite] [--spacing 1.2] [--k 30] [--L 90]
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { sizeClassCompatible } from '../../core/geometry/proposals/candidate-index';
import { partnerCost } from '../../core/geometry/proposals/face-descriptor';
import type { PreparedFaceParts } from '../../core/geometry/proposals/prepared-fragment';
import { FPFH_DIM } from '../../core/geometry/registration/fpfh';
import { KdTree } from '../../core/geometry/registration/nearest-neighbours';
import { mirrorFpfh } from '../../core/geometry/registration/ransac-alignment';
import { readPrepared, readSummary } from '../../core/jobs/fragment-cache';
import { readStudy, sizeClassesFromCsv } from './candidate-recall';
import { loadSet } from './candidate-rules';
import { catalogueFragmentKeys } from './catalogue-fragment-keys';

const args = process.argv.slice(2);
const opt = (name: string, d?: string): string | undefined => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : d;
};
const [dir, cacheDir] = args;
const spacing = Number(opt('--spacing', '1.2'));
const K = Number(opt('--k', '30'));
const L = Number(opt('--L', '90'));
const catalogue = opt('--catalogue');

// ---- signatures per face --------------------------------------------------------------
/** Per face: a histogram (counts), and the same histogram as the partner would show it. */
interface Sig { h: Float32Array; m: Float32Array; mass: number }
type Maker = (f: PreparedFaceParts, axis: { direction: number[]; point: number[]; support: number }, surf: { p: Float32Array; n: Float32Array }) => Sig | null;

/** Bilinear vote into a nx x ny grid (x, y in [0,1]). */
function vote2(h: Float32Array, nx: number, ny: number, x: number, y: number, w = 1): void {
  const fx = Math.min(nx - 1, Math.max(0, x * nx - 0.5)), fy = Math.min(ny - 1, Math.max(0, y * ny - 0.5));
  const ix = Math.min(nx - 2, Math.floor(fx)), iy = Math.min(ny - 2, Math.floor(fy));
  const ax = fx - ix, ay = fy - iy;
  h[ix * ny + iy] += w * (1 - ax) * (1 - ay);
  h[(ix + 1) * ny + iy] += w * ax * (1 - ay);
  h[ix * ny + iy + 1] += w * (1 - ax) * ay;
  h[(ix + 1) * ny + iy + 1] += w * ax * ay;
}
function vote1(h: Float32Array, nb: number, x: number, w = 1): void {
  const f = Math.min(nb - 1, Math.max(0, x * nb - 0.5));
  const i = Math.min(nb - 2, Math.floor(f)), a = f - i;
  h[i] += w * (1 - a);
  h[i + 1] += w * a;
}

/** (|cos n.axis|, lean n.radial) per sample, lean mirrored for the partner. */
const courseHist = (NX: number, NY: number): Maker => (f, axis) => {
  if (axis.support < 0.5) return null;
  const [dx, dy, dz] = axis.direction, [px, py, pz] = axis.point;
  const n = f.points.length / 3;
  const h = new Float32Array(NX * NY), m = new Float32Array(NX * NY);
  for (let i = 0; i < n; i++) {
    const x = f.points[3 * i] - px, y = f.points[3 * i + 1] - py, z = f.points[3 * i + 2] - pz;
    const t = x * dx + y * dy + z * dz;
    const rx = x - t * dx, ry = y - t * dy, rz = z - t * dz;
    const r = Math.hypot(rx, ry, rz) || 1;
    const nx = f.normals[3 * i], ny = f.normals[3 * i + 1], nz = f.normals[3 * i + 2];
    const c = Math.abs(nx * dx + ny * dy + nz * dz);
    const lean = (nx * rx + ny * ry + nz * rz) / r;
    vote2(h, NX, NY, c, (lean + 1) / 2);
    vote2(m, NX, NY, c, (1 - lean) / 2);
  }
  return { h, m, mass: n };
};

/** Fracture angle along the rim: cos between the face normal and the nearest surface normal at outline points; negated for the partner. */
const rimAngleHist = (NB: number, reach: number): Maker => (f, _axis, surf) => {
  const no = f.outline.length / 3;
  if (!no) return null;
  const h = new Float32Array(NB), m = new Float32Array(NB);
  let mass = 0;
  for (let o = 0; o < no; o++) {
    const ox = f.outline[3 * o], oy = f.outline[3 * o + 1], oz = f.outline[3 * o + 2];
    const rf = faceTree(f).nearestOne([ox, oy, oz], Infinity), rs = surfaceTree(surf).nearestOne([ox, oy, oz], reach * reach);
    const bf = rf.index, bs = rs.index;
    if (bs < 0 || bf < 0) continue;
    const c = f.normals[3 * bf] * surf.n[3 * bs] + f.normals[3 * bf + 1] * surf.n[3 * bs + 1] + f.normals[3 * bf + 2] * surf.n[3 * bs + 2];
    vote1(h, NB, (c + 1) / 2);
    vote1(m, NB, (1 - c) / 2);
    mass++;
  }
  return mass ? { h, m, mass } : null;
};

const faceTrees = new WeakMap<Float32Array, KdTree>();
const faceTree = (f: PreparedFaceParts): KdTree => { let t = faceTrees.get(f.points); if (!t) { t = new KdTree(f.points, 3); faceTrees.set(f.points, t); } return t; };
const surfaceTree = (s: { p: Float32Array }): KdTree => { let t = faceTrees.get(s.p); if (!t) { t = new KdTree(s.p, 3); faceTrees.set(s.p, t); } return t; };

// FPFH words: a codebook made from a pooled sample of every face's FPFH (k-means, few rounds)
let codebook: Float32Array | null = null;
const WORDS = Number(process.env.WORDS ?? 32);
function nearestWord(v: Float32Array, o: number): number {
  let best = 0, bd = Infinity;
  for (let w = 0; w < WORDS; w++) {
    let d = 0;
    for (let k = 0; k < FPFH_DIM; k++) d += (v[o + k] - codebook![w * FPFH_DIM + k]) ** 2;
    if (d < bd) { bd = d; best = w; }
  }
  return best;
}
const wordHist: Maker = (f) => {
  const n = f.points.length / 3;
  const h = new Float32Array(WORDS), m = new Float32Array(WORDS);
  const mir = mirrorFpfh(f.fpfh);
  for (let i = 0; i < n; i++) { h[nearestWord(f.fpfh, i * FPFH_DIM)]++; m[nearestWord(mir, i * FPFH_DIM)]++; }
  return { h, m, mass: n };
};

function vote3(h: Float32Array, nb: number, x: number, y: number, z: number): void {
  const f = [x, y, z].map((v) => Math.min(nb - 1, Math.max(0, v * nb - 0.5)));
  const i = f.map((v) => Math.min(nb - 2, Math.floor(v)));
  const a = f.map((v, d) => v - i[d]);
  for (let dx = 0; dx < 2; dx++) for (let dy = 0; dy < 2; dy++) for (let dz = 0; dz < 2; dz++) {
    h[((i[0] + dx) * nb + i[1] + dy) * nb + i[2] + dz] += (dx ? a[0] : 1 - a[0]) * (dy ? a[1] : 1 - a[1]) * (dz ? a[2] : 1 - a[2]);
  }
}
/** Per sample the mean bin of each of FPFH's three angle histograms, in a 3-d histogram; the partner's second and third reversed. */
const fpfhMoments = (nb: number): Maker => (f) => {
  const n = f.points.length / 3;
  const h = new Float32Array(nb ** 3), m = new Float32Array(nb ** 3);
  const B = FPFH_DIM / 3;
  for (let i = 0; i < n; i++) {
    const mean = [0, 1, 2].map((q) => {
      let s = 0, w = 0;
      for (let b = 0; b < B; b++) { const v = f.fpfh[i * FPFH_DIM + q * B + b]; s += v * b; w += v; }
      return w > 0 ? s / w / (B - 1) : 0.5;
    });
    vote3(h, nb, mean[0], mean[1], mean[2]);
    vote3(m, nb, mean[0], 1 - mean[1], 1 - mean[2]);
  }
  return { h, m, mass: n };
};

/** Similarity of a's partner histogram with b's: containment (intersection over the smaller mass) or intersection of the normalised histograms. */
function similarity(a: Sig, b: Sig, mode: 'contain' | 'norm'): number {
  let s = 0;
  if (mode === 'contain') {
    for (let k = 0; k < a.m.length; k++) s += Math.min(a.m[k], b.h[k]);
    return s / Math.min(a.mass, b.mass);
  }
  for (let k = 0; k < a.m.length; k++) s += Math.min(a.m[k] / a.mass, b.h[k] / b.mass);
  return s;
}

// ---- load -----------------------------------------------------------------------------
const c0 = process.cpuUsage();
const set = loadSet(dir);
const n = set.nFaces;
const study = readStudy(dir).filter((f) => f.faces.length > 0);
const keyOf = catalogue ? catalogueFragmentKeys(catalogue) : new Map<string, string>();
const makers: Record<string, Maker> = {
  course6: courseHist(6, 6),
  course10: courseHist(10, 10),
  rim12: rimAngleHist(12, 3 * spacing),
  words: wordHist,
  fmom4: fpfhMoments(4),
  fmom6: fpfhMoments(6),
  fmom8: fpfhMoments(8),
};
const chosen = (process.env.SIGS ?? 'course6,course10,rim12').split(',');
const sigs: Record<string, Array<Sig | null>> = Object.fromEntries(chosen.map((s) => [s, [] as Array<Sig | null>]));
const loaded: Array<{ parts: PreparedFaceParts[]; axis: { direction: number[]; point: number[]; support: number }; surf: { p: Float32Array; n: Float32Array } }> = [];
const sigMs: Record<string, number> = Object.fromEntries(chosen.map((s) => [s, 0]));
for (const f of study) {
  const key = catalogue ? keyOf.get(f.no)! : f.no;
  const parts = readPrepared(cacheDir, key, { spacing, fpfhRadiusSpacings: 5 });
  const summary = readSummary(cacheDir, key);
  if (!parts || !summary || parts.faces.length !== f.faces.length) throw new Error(`${f.no}: prepared parts missing or not matching the study (${parts?.faces.length} faces against ${f.faces.length})`);
  loaded.push({ parts: parts.faces, axis: summary.axis, surf: { p: parts.surfacePoints, n: parts.surfaceNormals } });
}
if (chosen.includes('words') && process.env.CODEBOOK_IN) {
  codebook = Float32Array.from(JSON.parse(readFileSync(process.env.CODEBOOK_IN, 'utf8')) as number[]);
} else if (chosen.includes('words')) {
  // codebook from every 7th sample of every 3rd face
  const pool: number[] = [];
  loaded.forEach((l, fi) => l.parts.forEach((p, pi) => {
    if ((fi + pi) % 3) return;
    for (let i = 0; i < p.fpfh.length / FPFH_DIM; i += 7) pool.push(...p.fpfh.subarray(i * FPFH_DIM, (i + 1) * FPFH_DIM));
  }));
  const P = Float32Array.from(pool), np = P.length / FPFH_DIM;
  codebook = new Float32Array(WORDS * FPFH_DIM);
  for (let w = 0; w < WORDS; w++) codebook.set(P.subarray(Math.floor((w * np) / WORDS) * FPFH_DIM, (Math.floor((w * np) / WORDS) + 1) * FPFH_DIM), w * FPFH_DIM);
  for (let it = 0; it < 8; it++) {
    const sum = new Float64Array(WORDS * FPFH_DIM), cnt = new Float64Array(WORDS);
    for (let i = 0; i < np; i++) {
      const w = nearestWord(P, i * FPFH_DIM);
      cnt[w]++;
      for (let k = 0; k < FPFH_DIM; k++) sum[w * FPFH_DIM + k] += P[i * FPFH_DIM + k];
    }
    for (let w = 0; w < WORDS; w++) if (cnt[w]) for (let k = 0; k < FPFH_DIM; k++) codebook[w * FPFH_DIM + k] = sum[w * FPFH_DIM + k] / cnt[w];
  }
}
if (codebook && process.env.CODEBOOK_OUT) writeFileSync(process.env.CODEBOOK_OUT, JSON.stringify(Array.from(codebook)));
for (const l of loaded) for (const p of l.parts) for (const s of chosen) {
  const t0 = performance.now();
  sigs[s].push(makers[s](p, l.axis, l.surf));
  sigMs[s] += performance.now() - t0;
}
console.log(`${dir}: ${n} faces, ${set.reachable} reachable joins; loaded in ${(process.cpuUsage(c0).user / 1e6).toFixed(1)} CPU s; signature ms per face: ${chosen.map((s) => `${s} ${(sigMs[s] / n).toFixed(2)}`).join(', ')}`);

// ---- the shortlist by the trait cost ------------------------------------------------------
const classes = process.env.KNITBONE_SIZE_CLASS === '0' || !existsSync(join(dir, 'specimens.csv')) ? undefined : sizeClassesFromCsv(readFileSync(join(dir, 'specimens.csv'), 'utf8'));
const ok = classes ? sizeClassCompatible(study.map((f) => classes.get(f.no) ?? null)) : () => true;
const LL = Math.max(L, K);
const listJ = new Int32Array(n * LL).fill(-1), listC = new Float32Array(n * LL).fill(Infinity);
{
  const row = new Float32Array(n), idx = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let m = 0;
    for (let j = 0; j < n; j++) {
      const a = set.fragOfFace[i], b = set.fragOfFace[j];
      if (a === b || !ok(Math.min(a, b), Math.max(a, b))) continue;
      row[j] = partnerCost(set.desc[i], set.desc[j]);
      idx[m++] = j;
    }
    const part = idx.slice(0, m).sort((x, y) => row[x] - row[y]).slice(0, LL);
    part.forEach((j, r) => { listJ[i * LL + r] = j; listC[i * LL + r] = row[j]; });
  }
}
const keyPair = (i: number, j: number): number => (i < j ? i * n + j : j * n + i);
const recall = (s: Set<number>): number => {
  let hit = 0;
  for (const j of set.joins) if (j.some(([x, y]) => s.has(x * n + y))) hit++;
  return hit;
};
// candidate-budget.ts's dithered quota union, over each face's shortlist (n x LL) instead of full rows
const orderUnion = (order: Int32Array, quota: number): Set<number> => {
  const fin = new Int32Array(n);
  for (let i = 0; i < n; i++) { let m = 0; while (m < LL && order[i * LL + m] >= 0) m++; fin[i] = m; }
  const out = new Set<number>();
  for (let i = 0; i < n; i++) {
    const q = Math.min(fin[i], Math.max(0, Math.floor(quota + ((i * 0.6180339887) % 1))));
    for (let r = 0; r < q; r++) out.add(keyPair(i, order[i * LL + r]));
  }
  return out;
};
const baseSet = orderUnion(listJ, K);
const budget = baseSet.size;
const base = recall(baseSet);
const baseAtL = recall(orderUnion(listJ, LL));
console.log(`k ${K}: ${budget} face pairs (${(budget / n).toFixed(2)}/face), ${base}/${set.reachable} = ${(100 * base / set.reachable).toFixed(1)}%; the shortlist of ${LL} holds ${baseAtL} (${(100 * baseAtL / set.reachable).toFixed(1)}%)`);
// the base at k -1/+1 for the slope
for (const k of [K - 2, K + 2]) { const s = orderUnion(listJ, k); console.log(`  k ${k}: ${s.size} pairs, ${recall(s)}`); }

/** Re-rank each shortlist by cost + sum of w * (-log sim) over signatures, and match the budget. */
function rerank(name: string, w: number, mode: 'contain' | 'norm', missing: number, also: Array<{ name: string; w: number; mode: 'contain' | 'norm'; missing: number }> = []): { pairs: number; found: number } {
  const S = sigs[name];
  const order = new Int32Array(n * LL).fill(-1);
  const tmp: Array<[number, number]> = [];
  for (let i = 0; i < n; i++) {
    tmp.length = 0;
    for (let r = 0; r < LL; r++) {
      const j = listJ[i * LL + r];
      if (j < 0) break;
      const a = S[i], b = S[j];
      const extra = a && b ? -Math.log(Math.max(0.02, similarity(a, b, mode))) : missing;
      let more = 0;
      for (const o of also) {
        const x = sigs[o.name][i], y = sigs[o.name][j];
        more += o.w * (x && y ? -Math.log(Math.max(0.02, similarity(x, y, o.mode))) : o.missing);
      }
      tmp.push([j, listC[i * LL + r] + w * extra + more]);
    }
    tmp.sort((x, y) => x[1] - y[1]);
    tmp.forEach(([j], r) => { order[i * LL + r] = j; });
  }
  let lo = 0, hi = LL;
  let best = orderUnion(order, K);
  if (process.env.PLAIN_K) { const p = orderUnion(order, K); console.log(`  re-ranked, plain k ${K}: ${p.size} pairs, ${recall(p)}`); }
  for (let it = 0; it < 25; it++) {
    const mid = (lo + hi) / 2;
    const s = orderUnion(order, mid);
    if (s.size <= budget) { lo = mid; best = s; } else hi = mid;
  }
  if (process.env.PLAIN_K) console.log(`  quota matched ${lo.toFixed(2)}`);
  return { pairs: best.size, found: recall(best) };
}
const medianOf = (name: string, mode: 'contain' | 'norm'): number => {
  const vals: number[] = [];
  for (let i = 0; i < n; i += 7) for (let r = 0; r < LL; r += 5) {
    const j = listJ[i * LL + r];
    if (j >= 0 && sigs[name][i] && sigs[name][j]) vals.push(-Math.log(Math.max(0.02, similarity(sigs[name][i]!, sigs[name][j]!, mode))));
  }
  vals.sort((a, b) => a - b);
  return vals[Math.floor(vals.length / 2)] ?? 0;
};
if (process.env.COMBO) {
  // COMBO='words:contain:4,rim12:norm:4;words:contain:4,course6:norm:2'
  for (const combo of process.env.COMBO.split(';')) {
    const parts = combo.split(',').map((x) => { const [name, mode, w] = x.split(':'); return { name, mode: mode as 'contain' | 'norm', w: Number(w), missing: medianOf(name, mode as 'contain' | 'norm') }; });
    const r = rerank(parts[0].name, parts[0].w, parts[0].mode, parts[0].missing, parts.slice(1));
    console.log(`combo ${combo}: ${r.found} (${r.pairs})`);
  }
  process.exit(0);
}
const ws = (process.env.WS ?? '0.5,1,2,4,8').split(',').map(Number);
for (const name of chosen) for (const mode of ['contain', 'norm'] as const) {
  // the missing cost: the median -log sim over all shortlisted pairs with both signatures
  const vals: number[] = [];
  for (let i = 0; i < n; i += 7) for (let r = 0; r < LL; r += 5) {
    const j = listJ[i * LL + r];
    if (j >= 0 && sigs[name][i] && sigs[name][j]) vals.push(-Math.log(Math.max(0.02, similarity(sigs[name][i]!, sigs[name][j]!, mode))));
  }
  vals.sort((a, b) => a - b);
  const med = vals[Math.floor(vals.length / 2)] ?? 0;
  const t0 = process.cpuUsage();
  const out = ws.map((w) => { const r = rerank(name, w, mode, med); return `w ${w}: ${r.found} (${r.pairs})`; });
  console.log(`${name} ${mode} (median -log sim ${med.toFixed(2)}; ${((process.cpuUsage(t0).user / 1e6) / ws.length).toFixed(1)} CPU s a trial): ${out.join('  ')}`);
}
