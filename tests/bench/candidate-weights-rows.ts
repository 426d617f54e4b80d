/**
 * candidate-weights.ts for large assemblages (1,000 fragments, 6,500 faces), where a full
 * matrix per figure does not fit: only the rows of faces that lie on a true join are kept (each
 * figure's loss term per pair, quantised to 1/2000), and the candidate recall of the union of
 * each face's k best is read from the rank of each true partner in its face's row (a join is
 * reached when one of its face pairs ranks under k on either side). Coordinate search on the
 * mean recall at k = 30 and 60 over the given assemblages, as candidate-weights.ts: each weight
 * x0, x0.5, x0.7, x1.4, x2 (0.5, 1, 2 when 0), each scale x0.5, x2. Prints the parameters;
 * check the face pairs per face and the recall with candidate-weights.ts or candidate-recall.ts.
 *   npx tsx tests/bench/candidate-weights-rows.ts <demo-dir>[,<demo-dir>...] [rounds]
 *   CANDIDATE_WEIGHTS='<json>' only reports the given parameters.
 */
import { cappedCauchyLoss } from '../../core/geometry/proposals/capped-cauchy-loss';
import { DESCRIPTOR_FIGURES, TEXTURE_WEIGHT } from '../../core/geometry/proposals/face-descriptor';
import { fitOrReport, type CostParameters } from './candidate-weights';
import { loadSet, type RuleSet } from './candidate-rules';

const MISSING = Math.log(2);
const Q = 2000;

interface Rows {
  s: RuleSet;
  n: number;
  /** faces on some true join, and their row number */
  rows: Int32Array;
  rowOf: Int32Array;
  /** per figure, quantised loss term of (row, column) */
  terms: Uint16Array[];
  texture: Float32Array;
  /** pairs that may not pair (own fragment, size classes) */
  banned: Uint8Array;
}

function termsFor(r: Rows, c: number, scale: number): Uint16Array {
  const { s, n, rows } = r;
  const out = new Uint16Array(rows.length * n);
  const opp = DESCRIPTOR_FIGURES[c].opposite;
  for (let a = 0; a < rows.length; a++) {
    const x = s.desc[rows[a]].figures[c];
    for (let j = 0; j < n; j++) {
      const y = s.desc[j].figures[c];
      const v = Number.isNaN(x) || Number.isNaN(y) ? MISSING : cappedCauchyLoss((opp ? x + y : x - y) / scale, DESCRIPTOR_FIGURES[c].cap);
      out[a * n + j] = Math.min(65535, Math.round(v * Q));
    }
  }
  return out;
}

function build(s: RuleSet, scales: number[]): Rows {
  const n = s.nFaces;
  const on = new Set<number>();
  for (const j of s.joins) for (const [x, y] of j) { on.add(x); on.add(y); }
  const rows = Int32Array.from([...on].sort((a, b) => a - b));
  const rowOf = new Int32Array(n).fill(-1);
  rows.forEach((x, a) => { rowOf[x] = a; });
  const r: Rows = { s, n, rows, rowOf, terms: [], texture: new Float32Array(rows.length * n), banned: new Uint8Array(rows.length * n) };
  for (let a = 0; a < rows.length; a++) {
    const A = s.desc[rows[a]], fa = s.fragOfFace[rows[a]];
    for (let j = 0; j < n; j++) {
      const fb = s.fragOfFace[j];
      r.banned[a * n + j] = fa === fb || !s.compatible(Math.min(fa, fb), Math.max(fa, fb)) ? 1 : 0;
      const B = s.desc[j];
      let d = 0;
      for (let m = 0; m < A.mirrored.length; m++) d += (A.mirrored[m] - B.fpfh[m]) ** 2;
      r.texture[a * n + j] = Math.sqrt(d);
    }
  }
  r.terms = DESCRIPTOR_FIGURES.map((_, c) => termsFor(r, c, scales[c]));
  return r;
}

/** Candidate recall of the k-best union at each k, from the rows. */
function recall(r: Rows, q: CostParameters, ks: number[]): number[] {
  const { n, rows, s } = r;
  const row = new Float32Array(n);
  const rank = new Map<number, number>();
  const partners = new Map<number, number[]>();
  for (const j of s.joins) for (const [x, y] of j) {
    (partners.get(x) ?? partners.set(x, []).get(x)!).push(y);
    (partners.get(y) ?? partners.set(y, []).get(y)!).push(x);
  }
  const w = q.w.map((v) => v / Q);
  for (let a = 0; a < rows.length; a++) {
    const base = a * n;
    for (let j = 0; j < n; j++) row[j] = q.tw * r.texture[base + j];
    for (let c = 0; c < w.length; c++) {
      if (!w[c]) continue;
      const t = r.terms[c], wc = w[c];
      for (let j = 0; j < n; j++) row[j] += wc * t[base + j];
    }
    for (const y of partners.get(rows[a]) ?? []) {
      const v = row[y];
      let k = 0;
      for (let j = 0; j < n; j++) if (!r.banned[base + j] && row[j] < v) k++;
      rank.set(rows[a] * n + y, k);
    }
  }
  return ks.map((k) => {
    let hit = 0;
    for (const j of s.joins) if (j.some(([x, y]) => (rank.get(x * n + y) ?? Infinity) < k || (rank.get(y * n + x) ?? Infinity) < k)) hit++;
    return hit / s.reachable;
  });
}

if (process.argv[1]?.endsWith('candidate-weights-rows.ts')) {
  const dirs = process.argv[2].split(',');
  const rounds = Number(process.argv[3] ?? 1);
  const c0 = process.cpuUsage();
  const current: CostParameters = { w: DESCRIPTOR_FIGURES.map((f) => f.weight), sc: DESCRIPTOR_FIGURES.map((f) => f.scale), tw: TEXTURE_WEIGHT };
  const sets = dirs.map((d) => build(loadSet(d), current.sc));
  console.log(`built in ${(process.cpuUsage(c0).user / 1e6).toFixed(1)} CPU s`);
  // the terms of a figure at another scale, made when first asked for
  const scaleTerms = new Map<string, Uint16Array>();
  const withScales = (q: CostParameters): void => {
    for (const r of sets) {
      const si = sets.indexOf(r);
      r.terms = q.sc.map((sc, c) => {
        const key = `${si}:${c}:${sc}`;
        if (sc === current.sc[c]) return scaleTerms.get(key) ?? (scaleTerms.set(key, r.terms[c]), r.terms[c]);
        return scaleTerms.get(key) ?? scaleTerms.set(key, termsFor(r, c, sc)).get(key)!;
      });
    }
  };
  withScales(current);
  const score = (q: CostParameters): number => {
    withScales(q);
    let v = 0;
    for (const r of sets) { const [a, b] = recall(r, q, [30, 60]); v += a + b; }
    return v / sets.length / 2;
  };
  const report = (q: CostParameters, label: string): void => {
    withScales(q);
    sets.forEach((r, i) => {
      const [a, b] = recall(r, q, [30, 60]);
      console.log(`${label} ${dirs[i]}: ${r.n} faces, ${r.s.reachable} reachable joins; k 30: ${(100 * a).toFixed(1)}%, k 60: ${(100 * b).toFixed(1)}%`);
    });
  };
  fitOrReport(current, score, report, rounds);
  console.log(`${(process.cpuUsage(c0).user / 1e6).toFixed(1)} CPU s`);
}
