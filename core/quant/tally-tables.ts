import type { Tally } from './tally';

/** One table for a spreadsheet: a header row and data rows. */
export interface Table {
  name: string;
  header: string[];
  rows: Array<Array<string | number | null>>;
}

/**
 * The counts of `knitbone tally` as three tables (summary, taxa, elements), each with a
 * `reading` column saying whether a row is as recorded or refitted, so both readings sit
 * side by side in one sheet.
 */
export function tallyTables(counts: { nsp: number; recorded: Tally; refitted: Tally }): Table[] {
  const readings = [
    ['recorded', counts.recorded],
    ['refitted', counts.refitted],
  ] as const;
  return [
    {
      name: 'summary',
      header: ['reading', 'nsp', 'nisp', 'nisp_fragments', 'identified_to_element', 'identified_to_taxon'],
      rows: readings.map(([r, t]) => [r, counts.nsp, t.nisp, t.nispFragments, t.identifiedToElement, t.identifiedToTaxon]),
    },
    {
      name: 'taxa',
      header: ['reading', 'taxon', 'nisp', 'mni', 'l_plus_r_minus_p'],
      rows: readings.flatMap(([r, t]) => t.byTaxon.map((x) => [r, x.taxon, x.nisp, x.mni, x.lrp ?? null])),
    },
    {
      name: 'elements',
      header: ['reading', 'taxon', 'element', 'nisp', 'mne_left', 'mne_right', 'mne', 'mau', 'percent_mau', 'pairs'],
      rows: readings.flatMap(([r, t]) =>
        t.byElement.map((x) => [r, x.taxon, x.element, x.nisp, x.mneLeft, x.mneRight, x.mne, x.mau, x.percentMau, x.pairs ?? null]),
      ),
    },
  ];
}
