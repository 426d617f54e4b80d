import type { ExtraExport } from '../../catalogue/export';
import { TALLY_COLUMNS, tallyRows } from '../../quant/tally-tables';
import { countsFor } from './refits-cache';

/** tally.csv in `knitbone export`: the same table as `knitbone tally --csv`. */
export const tallyExport: ExtraExport = {
  name: 'tally.csv',
  header: [...TALLY_COLUMNS],
  rows: (cat) => tallyRows(countsFor(cat)).map((r) => r.map((v) => v ?? '')),
};
