/**
 * Which terms of the trait cost keep each lost true join out of the candidate lists, without
 * aligning: the index is built as a propose run builds it (candidate-index.ts defaults: k, the
 * second stage, distinct whole faces, size classes from specimens.csv), the reachable true joins
 * it does not reach are the lost ones, and for each lost join's best face pair (the smallest
 * trait-cost rank either side gives the other) the rank that pair would have with each term of
 * `partnerCost` left out of every pair's cost (its face's list re-ranked), the term's cost, and
 * the same term's median cost over the face's first k partners. A term whose removal alone
 * brings the pair within k "keeps it out alone". With the pieces' own figures (samples, share on
 * the break, part or whole face, the join's contact area, damage and break pattern) so that a
 * term that reads a partial or damaged face wrongly shows. Summaries per term over the lost
 * joins, and the same rank-without-term counts for the kept joins' best pairs (how often a term
 * helps). Faces and traits from candidate-study.ts / candidate-restudy.ts.
 *   npx tsx tests/bench/candidate-term-misses.ts <studied dir> [k] [--list]
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { DEFAULT_K, candidateFacePairs, sizeClassCompatible, type IndexedFace } from '../../core/geometry/proposals/candidate-index';
import { DESCRIPTOR_FIGURES, describeFace, figureCost, textureCost, type FaceDescriptor } from '../../core/geometry/proposals/face-descriptor';
import { readStudy, sizeClassesFromCsv, trueJoinKey, type TruthJoin } from './candidate-recall';

/** Per term, the cost two faces add (DESCRIPTOR_FIGURES order, then the texture). */
export function termCosts(A: FaceDescriptor, B: FaceDescriptor): Float64Array {
  const out = new Float64Array(DESCRIPTOR_FIGURES.length + 1);
  for (let c = 0; c < DESCRIPTOR_FIGURES.length; c++) out[c] = figureCost(A, B, c);
  out[DESCRIPTOR_FIGURES.length] = textureCost(A, B);
  return out;
}

const median = (xs: number[]): number => {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
};

if (process.argv[1]?.endsWith('candidate-term-misses.ts')) {
  const args = process.argv.slice(2);
  const dir = args[0];
  const k = args[1] && !args[1].startsWith('--') ? Number(args[1]) : DEFAULT_K;
  const list = args.includes('--list');
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { joins: Array<TruthJoin & { contactAreaMm2?: number; damaged?: boolean }> };
  const study = readStudy(dir).filter((f) => f.faces.length > 0);
  const fragOf = new Map(study.map((f, i) => [f.no, i]));
  const faces: IndexedFace[] = [];
  const meta: Array<{ no: string; part: boolean; samples: number; area: number; breaks: Record<string, number> }> = [];
  study.forEach((f, i) => f.faces.forEach((x, face) => {
    const whole = f.faces.findIndex((y) => y.parent === x.parent);
    faces.push({ fragment: i, face, whole, traits: { ...x.traits, meanFpfh: Float32Array.from(x.traits.meanFpfh) } });
    meta.push({ no: f.no, part: whole !== face, samples: x.samples, area: x.traits.area, breaks: x.breaks });
  }));
  const n = faces.length;
  const desc = faces.map((f) => describeFace(f.traits));
  const classes = process.env.KNITBONE_SIZE_CLASS === '0' || !existsSync(join(dir, 'specimens.csv')) ? undefined : sizeClassesFromCsv(readFileSync(join(dir, 'specimens.csv'), 'utf8'));
  const compatible = classes ? sizeClassCompatible(study.map((f) => classes.get(f.no) ?? null)) : () => true;
  const at = new Map(faces.map((f, i) => [`${f.fragment}:${f.face}`, i]));
  const chosen = new Set(candidateFacePairs(faces, { k, compatible }).map((c) => {
    const x = at.get(`${c.a}:${c.faceA}`)!, y = at.get(`${c.b}:${c.faceB}`)!;
    return x < y ? x * n + y : y * n + x;
  }));
  const T = DESCRIPTOR_FIGURES.length + 1;
  const names = [...DESCRIPTOR_FIGURES.map((x) => x.name), 'texture (mean FPFH)'];
  // per face (computed on demand): each partner's term costs and total
  const rows = new Map<number, { terms: Float64Array[]; total: Float64Array }>();
  const rowOf = (i: number): { terms: Float64Array[]; total: Float64Array } => {
    let r = rows.get(i);
    if (r) return r;
    const terms = Array.from({ length: T }, () => new Float64Array(n).fill(Infinity));
    const total = new Float64Array(n).fill(Infinity);
    for (let j = 0; j < n; j++) {
      const a = faces[i].fragment, b = faces[j].fragment;
      if (a === b || !compatible(Math.min(a, b), Math.max(a, b))) continue;
      const c = termCosts(desc[i], desc[j]);
      let s = 0;
      for (let t = 0; t < T; t++) { terms[t][j] = c[t]; s += c[t]; }
      total[j] = s;
    }
    r = { terms, total };
    rows.set(i, r);
    if (rows.size > 400) rows.delete(rows.keys().next().value as number);
    return r;
  };
  /** Rank of j in i's list by total minus term t (t < 0: the total). */
  const rankIn = (i: number, j: number, t: number): number => {
    const { terms, total } = rowOf(i);
    const v = t < 0 ? total[j] : total[j] - terms[t][j];
    let r = 0;
    for (let m = 0; m < n; m++) {
      if (m === j || !Number.isFinite(total[m])) continue;
      const w = t < 0 ? total[m] : total[m] - terms[t][m];
      if (w < v) r++;
    }
    return r;
  };
  const kthCost = (i: number): number => {
    const xs = [...rowOf(i).total].filter(Number.isFinite).sort((a, b) => a - b);
    return xs[Math.min(k - 1, xs.length - 1)];
  };
  const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && fragOf.has(j.a) && fragOf.has(j.b));
  const aloneLost = new Array<number>(T).fill(0), aloneKept = new Array<number>(T).fill(0);
  const costLost = new Array<number>(T).fill(0), costKept = new Array<number>(T).fill(0);
  const excessOverMedian: number[][] = Array.from({ length: T }, () => []);
  let nLost = 0, nKept = 0, reachable = 0, needTwo = 0;
  const rankHist = [0, 0, 0, 0, 0, 0];
  const byPattern = new Map<string, [number, number]>();
  const partKinds = new Map<string, number>();
  const damagedLost = [0, 0];
  const sampleRatioLost: number[] = [], sampleRatioKept: number[] = [];
  for (const jn of eligible) {
    const ia = fragOf.get(jn.a)!, ib = fragOf.get(jn.b)!;
    const on = (x: number): boolean => (meta[x].breaks[jn.breakId] ?? 0) >= 0.3;
    const A: number[] = [], B: number[] = [];
    for (let x = 0; x < n; x++) {
      if (!on(x)) continue;
      if (faces[x].fragment === ia) A.push(x);
      if (faces[x].fragment === ib) B.push(x);
    }
    if (!A.length || !B.length) continue;
    reachable++;
    const kept = A.some((x) => B.some((y) => chosen.has(x < y ? x * n + y : y * n + x)));
    const pat = byPattern.get(jn.pattern) ?? [0, 0];
    pat[kept ? 0 : 1]++;
    byPattern.set(jn.pattern, pat);
    // best face pair by trait rank either way round
    let best = { r: Infinity, x: A[0], y: B[0], rx: Infinity, ry: Infinity };
    for (const x of A) for (const y of B) {
      const rx = rankIn(x, y, -1), ry = rankIn(y, x, -1);
      if (Math.min(rx, ry) < best.r) best = { r: Math.min(rx, ry), x, y, rx, ry };
    }
    // the side that ranks the pair better is the list it would enter
    const [p, q] = best.rx <= best.ry ? [best.x, best.y] : [best.y, best.x];
    const c = rowOf(p).terms.map((row) => row[q]);
    const without = Array.from({ length: T }, (_, t) => Math.min(rankIn(p, q, t), rankIn(q, p, t)));
    const ratio = Math.min(meta[p].samples, meta[q].samples) / Math.max(meta[p].samples, meta[q].samples);
    if (kept) {
      nKept++;
      sampleRatioKept.push(ratio);
      c.forEach((v, t) => { costKept[t] += v; });
      without.forEach((r, t) => { if (best.r >= k && r < k) aloneKept[t]++; });
      continue;
    }
    nLost++;
    sampleRatioLost.push(ratio);
    if (jn.damaged) damagedLost[0]++; else damagedLost[1]++;
    const edges = [0, 27, 60, 100, 200, 400, Infinity];
    for (let b = 0; b + 1 < edges.length; b++) if (best.r >= edges[b] && best.r < edges[b + 1]) rankHist[b]++;
    const kind = `${meta[p].part ? 'part' : 'whole'}-${meta[q].part ? 'part' : 'whole'}`;
    partKinds.set(kind, (partKinds.get(kind) ?? 0) + 1);
    c.forEach((v, t) => { costLost[t] += v; });
    // the term's cost over the median of the same term among p's first k partners
    const top = [...rowOf(p).total.keys()].filter((m) => Number.isFinite(rowOf(p).total[m])).sort((u, v) => rowOf(p).total[u] - rowOf(p).total[v]).slice(0, k);
    const med = Array.from({ length: T }, (_, t) => median(top.map((m) => rowOf(p).terms[t][m])));
    c.forEach((v, t) => excessOverMedian[t].push(v - med[t]));
    let any = false;
    without.forEach((r, t) => { if (r < k) { aloneLost[t]++; any = true; } });
    if (!any) needTwo++;
    if (list) {
      const fp = desc[p].figures, fq = desc[q].figures;
      const terms = names.map((name, t) => ({ name, t, cost: c[t], med: med[t], without: without[t] })).filter((x) => x.cost - x.med > 0.5 || x.without < k).sort((u, v) => (v.cost - v.med) - (u.cost - u.med));
      console.log(`lost ${jn.a}|${jn.b}#${jn.breakId} ${jn.pattern}${jn.damaged ? ' damaged' : ''} surv ${jn.survivingFraction.toFixed(2)} contact ${jn.contactAreaMm2 ?? '?'} mm2: rank ${best.r} (${best.rx}, ${best.ry}), cost ${rowOf(p).total[q].toFixed(2)} vs k-th ${kthCost(p).toFixed(2)}; ${meta[p].no}${meta[p].part ? ' part' : ''} ${meta[p].samples} samples area ${meta[p].area.toFixed(0)} on ${(meta[p].breaks[jn.breakId] ?? 0).toFixed(2)} / ${meta[q].no}${meta[q].part ? ' part' : ''} ${meta[q].samples} samples area ${meta[q].area.toFixed(0)} on ${(meta[q].breaks[jn.breakId] ?? 0).toFixed(2)}`);
      for (const x of terms) {
        const fig = x.t < DESCRIPTOR_FIGURES.length ? ` (${fp[x.t].toFixed(3)} / ${fq[x.t].toFixed(3)})` : '';
        console.log(`    ${x.name.padEnd(32)} cost ${x.cost.toFixed(2)} (top-k median ${x.med.toFixed(2)}) rank without ${x.without}${fig}`);
      }
    }
  }
  console.log(`${dir}: ${n} faces, k ${k}, ${reachable} reachable joins, ${nKept} reached, ${nLost} lost (${chosen.size} face pairs)`);
  console.log(`lost by best trait rank: <27 ${rankHist[0]}, 27-59 ${rankHist[1]}, 60-99 ${rankHist[2]}, 100-199 ${rankHist[3]}, 200-399 ${rankHist[4]}, 400+ ${rankHist[5]}`);
  console.log(`lost: damaged ${damagedLost[0]}, not ${damagedLost[1]}; best pair kinds ${[...partKinds].map(([a, b]) => `${a} ${b}`).join(', ')}; need two or more terms out ${needTwo}`);
  console.log(`sample ratio (smaller / larger) median lost ${median(sampleRatioLost).toFixed(2)}, kept ${median(sampleRatioKept).toFixed(2)}`);
  console.log(`by pattern (reached / lost): ${[...byPattern].map(([a, [x, y]]) => `${a} ${x}/${y}`).join(', ')}`);
  console.log('term: mean cost lost / kept, lost brought within k by leaving it out alone, median excess over the top-k median (lost), kept-joins ranked beyond k that it alone would bring in');
  names.forEach((name, t) => console.log(`  ${name.padEnd(34)} ${(costLost[t] / Math.max(1, nLost)).toFixed(2).padStart(6)} / ${(costKept[t] / Math.max(1, nKept)).toFixed(2).padEnd(6)} alone ${String(aloneLost[t]).padStart(4)}  excess ${median(excessOverMedian[t]).toFixed(2).padStart(6)}  ${aloneKept[t]}`));
}
