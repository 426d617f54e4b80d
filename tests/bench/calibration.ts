/**
 * Calibration of a probability forecast against outcomes (for the join score): a reliability
 * table in fixed bins and the Brier score (Brier 1950) with Murphy's decomposition (Murphy 1973,
 * from memory): BS = reliability - resolution + uncertainty, where reliability is the
 * count-weighted squared gap between each bin's mean forecast and its observed frequency,
 * resolution the weighted squared gap between each bin's observed frequency and the overall one,
 * and uncertainty o(1 - o) for the overall frequency o (exact when every forecast in a bin equals
 * the bin's mean; close otherwise). The reliability table is the numeric form of the reliability
 * diagram (DeGroot & Fienberg 1983, from memory).
 */
export const CALIBRATION_BINS = [0, 0.1, 0.2, 0.4, 0.6, 0.8, 0.9, 1.0001];

/** Reliability table and Brier score with Murphy's (1973) decomposition over CALIBRATION_BINS. */
export function reliability(p: number[], y: number[]): { rows: Array<Record<string, string | number>>; brier: number; rel: number; res: number; unc: number } {
  const n = p.length;
  const base = y.reduce((s, v) => s + v, 0) / Math.max(1, n);
  let brier = 0, rel = 0, res = 0;
  p.forEach((v, i) => (brier += (v - y[i]) ** 2 / n));
  const rows: Array<Record<string, string | number>> = [];
  for (let b = 0; b + 1 < CALIBRATION_BINS.length; b++) {
    const idx = p.map((v, i) => (v >= CALIBRATION_BINS[b] && v < CALIBRATION_BINS[b + 1] ? i : -1)).filter((i) => i >= 0);
    const mp = idx.reduce((s, i) => s + p[i], 0) / Math.max(1, idx.length);
    const oy = idx.reduce((s, i) => s + y[i], 0) / Math.max(1, idx.length);
    if (idx.length) {
      rel += (idx.length / n) * (mp - oy) ** 2;
      res += (idx.length / n) * (oy - base) ** 2;
    }
    rows.push({ score: `${CALIBRATION_BINS[b].toFixed(1)}-${Math.min(1, CALIBRATION_BINS[b + 1]).toFixed(1)}`, motions: idx.length, correct: idx.reduce((s, i) => s + y[i], 0), 'mean predicted': idx.length ? mp.toFixed(3) : '-', observed: idx.length ? oy.toFixed(3) : '-' });
  }
  return { rows, brier, rel, res, unc: base * (1 - base) };
}

export function table(rows: Array<Record<string, string | number>>): void {
  if (!rows.length) return;
  const cols = Object.keys(rows[0]);
  const w = cols.map((c) => Math.max(c.length, ...rows.map((r) => String(r[c] ?? '').length)));
  process.stdout.write(cols.map((c, i) => c.padEnd(w[i])).join('  ') + '\n');
  for (const r of rows) process.stdout.write(cols.map((c, i) => String(r[c] ?? '').padEnd(w[i])).join('  ') + '\n');
}

