/**
 * The counts as the host's `tally.counts` answers them (NSP; NISP, identification rates,
 * MNE, MNI, MAU and %MAU as recorded and as refitted), and pure helpers to set the two
 * readings side by side and write them out.
 */
import type { ElementTally, Tally, TaxonTally } from '../../../../core/quant/tally';

export type { ElementTally, Tally, TaxonTally };

export interface Counts {
  nsp: number;
  recorded: Tally;
  refitted: Tally;
}

export interface Paired<T> {
  key: string;
  recorded: T | null;
  refitted: T | null;
}

/** Rows of both readings matched by key, in the refitted reading's order then the rest. */
export function pairRows<T>(recorded: T[], refitted: T[], key: (t: T) => string): Paired<T>[] {
  const rec = new Map(recorded.map((t) => [key(t), t]));
  const out: Paired<T>[] = [];
  const seen = new Set<string>();
  for (const t of [...refitted, ...recorded]) {
    const k = key(t);
    if (seen.has(k)) continue;
    seen.add(k);
    out.push({ key: k, recorded: rec.get(k) ?? null, refitted: refitted.find((x) => key(x) === k) ?? null });
  }
  return out.sort((a, b) => a.key.localeCompare(b.key));
}

export const elementKey = (e: ElementTally): string => `${e.taxon} / ${e.element}`;

export function percent(share: number): string {
  return `${(share * 100).toFixed(1)}%`;
}

function csvCell(v: string | number | null | undefined): string {
  if (v === null || v === undefined) return '';
  const s = String(v);
  return /[",\n;]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One CSV with a `reading` column (recorded / refitted), element rows after a summary. */
export function countsCsv(c: Counts): string {
  const lines: string[] = [];
  const row = (...cells: Array<string | number | null | undefined>): void => void lines.push(cells.map(csvCell).join(','));
  row('table', 'reading', 'taxon', 'element', 'nsp', 'nisp', 'nisp_fragments', 'identified_to_element', 'identified_to_taxon', 'mni', 'mne_left', 'mne_right', 'mne', 'mau', 'percent_mau');
  for (const [name, t] of [['recorded', c.recorded], ['refitted', c.refitted]] as const) {
    row('summary', name, '', '', c.nsp, t.nisp, t.nispFragments, t.identifiedToElement, t.identifiedToTaxon);
  }
  for (const [name, t] of [['recorded', c.recorded], ['refitted', c.refitted]] as const) {
    for (const x of t.byTaxon) row('taxon', name, x.taxon, '', '', x.nisp, '', '', '', x.mni);
  }
  for (const [name, t] of [['recorded', c.recorded], ['refitted', c.refitted]] as const) {
    for (const x of t.byElement) row('element', name, x.taxon, x.element, '', x.nisp, '', '', '', '', x.mneLeft, x.mneRight, x.mne, x.mau, x.percentMau);
  }
  return lines.join('\n') + '\n';
}
