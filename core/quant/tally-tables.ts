import type { Tally } from './tally';

/**
 * The counts of `knitbone tally` as one flat table for a spreadsheet: a row per reading
 * (summary), per taxon and per taxon-element, each saying what it is (`level`) and whether
 * it is as recorded or refitted (`reading`), so rows can be filtered and pivoted. Cells a
 * level does not have are left empty (null).
 */
export const TALLY_COLUMNS = [
  'level', 'reading', 'taxon', 'element', 'nsp', 'nisp', 'nisp_fragments', 'identified_to_element', 'identified_to_taxon',
  'mni', 'l_plus_r_minus_p', 'mne_left', 'mne_right', 'mne', 'mau', 'percent_mau', 'pairs',
] as const;

type Cell = string | number | null;

export function tallyRows(counts: { nsp: number; recorded: Tally; refitted: Tally }): Cell[][] {
  const rows: Cell[][] = [];
  const row = (values: Partial<Record<(typeof TALLY_COLUMNS)[number], Cell | undefined>>) =>
    rows.push(TALLY_COLUMNS.map((c) => values[c] ?? null));
  for (const [reading, t] of [['recorded', counts.recorded], ['refitted', counts.refitted]] as const) {
    row({
      level: 'summary', reading, nsp: counts.nsp, nisp: t.nisp, nisp_fragments: t.nispFragments,
      identified_to_element: t.identifiedToElement, identified_to_taxon: t.identifiedToTaxon,
    });
    for (const x of t.byTaxon) row({ level: 'taxon', reading, taxon: x.taxon, nisp: x.nisp, mni: x.mni, l_plus_r_minus_p: x.lrp });
    for (const x of t.byElement) {
      row({
        level: 'element', reading, taxon: x.taxon, element: x.element, nisp: x.nisp, mne_left: x.mneLeft, mne_right: x.mneRight,
        mne: x.mne, mau: x.mau, percent_mau: x.percentMau, pairs: x.pairs,
      });
    }
  }
  return rows;
}
