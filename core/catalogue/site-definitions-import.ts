import { readFileSync } from 'node:fs';
import { basename, extname } from 'node:path';
import { parse } from 'csv-parse/sync';
import { z } from 'zod';
import { KnitboneError, type Problem } from '../host/errors';
import type { LayerBoundaryPoint, LevelDefinition, SiteDefinitions, UnitDefinition } from '../spatial/types';

/**
 * Reading unit, level and layer definitions from a file, all or nothing: any bad row or
 * field means nothing is imported, and every problem is reported with its line and column.
 *
 * JSON: { "units": [{ "unit", "xMin", "yMin", "xMax", "yMax" }],
 *         "levels": [{ "unit" (optional: absent or null = every unit), "level", "topZ", "bottomZ" }],
 *         "layerBoundaries": [{ "layer", "x", "y", "z" }] }   (each list optional)
 * CSV: one kind per file, told apart by its header (case, spaces and underscores ignored):
 *   unit, x_min, y_min, x_max, y_max          excavation units
 *   unit, level, top_z, bottom_z              levels (empty unit = every unit)
 *   layer, x, y, z                            points on the top of a layer
 */

const name = z.string().trim().min(1, 'must not be empty');
const metres = z.number().finite('must be a number of metres');

const unitSchema = z
  .object({ unit: name, xMin: metres, yMin: metres, xMax: metres, yMax: metres })
  .strict()
  .refine((u) => u.xMax > u.xMin, { message: 'xMax must be greater than xMin', path: ['xMax'] })
  .refine((u) => u.yMax > u.yMin, { message: 'yMax must be greater than yMin', path: ['yMax'] });
const levelSchema = z
  .object({ unit: name.nullable().optional(), level: name, topZ: metres, bottomZ: metres })
  .strict()
  .refine((l) => l.topZ > l.bottomZ, { message: 'topZ must be above bottomZ (elevations, positive up)', path: ['topZ'] });
const pointSchema = z.object({ layer: name, x: metres, y: metres, z: metres }).strict();

export const siteDefinitionsSchema = z
  .object({
    units: z.array(unitSchema).optional(),
    levels: z.array(levelSchema).optional(),
    layerBoundaries: z.array(pointSchema).optional(),
  })
  .strict();

/** Parse and check definitions from a file's text; `file` names it in problems. */
export function parseSiteDefinitions(text: string, file: string): SiteDefinitions {
  const ext = extname(file).toLowerCase();
  const defs = ext === '.json' || (ext !== '.csv' && text.trimStart().startsWith('{')) ? fromJson(text, file) : fromCsv(text, file);
  const problems = duplicates(defs, file);
  if (problems.length) throw new KnitboneError('bad-input', problems);
  return defs;
}

export function readSiteDefinitionsFile(path: string): SiteDefinitions {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (err) {
    throw new KnitboneError('not-found', [{ file: path, message: `cannot read: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}` }]);
  }
  return parseSiteDefinitions(text.replace(/^\uFEFF/, ''), path);
}

function fromJson(text: string, file: string): SiteDefinitions {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    throw new KnitboneError('bad-input', [{ file, message: `not valid JSON: ${(err as Error).message}` }]);
  }
  const parsed = siteDefinitionsSchema.safeParse(raw);
  if (!parsed.success) {
    throw new KnitboneError(
      'bad-input',
      parsed.error.issues.map((i) => ({ file, field: i.path.join('.'), message: `${i.path.join('.') || 'document'}: ${i.message}` })),
    );
  }
  return {
    units: parsed.data.units ?? [],
    levels: (parsed.data.levels ?? []).map((l) => ({ unit: l.unit ?? null, level: l.level, topZ: l.topZ, bottomZ: l.bottomZ })),
    layerBoundaries: parsed.data.layerBoundaries ?? [],
  };
}

type CsvKind = 'units' | 'levels' | 'layerBoundaries';
const CSV_COLUMNS: Record<CsvKind, string[]> = {
  units: ['unit', 'xMin', 'yMin', 'xMax', 'yMax'],
  levels: ['unit', 'level', 'topZ', 'bottomZ'],
  layerBoundaries: ['layer', 'x', 'y', 'z'],
};
const squash = (h: string) => h.toLowerCase().replace(/[^a-z0-9]/g, '');

function fromCsv(text: string, file: string): SiteDefinitions {
  let rows: string[][];
  try {
    rows = parse(text, { skip_empty_lines: true, relax_column_count: true, trim: true }) as string[][];
  } catch (err) {
    throw new KnitboneError('bad-input', [{ file, message: `not readable as CSV: ${(err as Error).message}` }]);
  }
  if (rows.length === 0) throw new KnitboneError('bad-input', [{ file, message: 'the file is empty; it needs a header row and definitions' }]);
  const header = rows[0].map(squash);
  const kind = (Object.keys(CSV_COLUMNS) as CsvKind[]).find((k) => {
    const want = CSV_COLUMNS[k].map(squash);
    return want.every((c) => header.includes(c)) && header.length === want.length;
  });
  if (!kind) {
    throw new KnitboneError('bad-input', [{
      file, line: 1,
      message: `header "${rows[0].join(',')}" is not one of: unit,x_min,y_min,x_max,y_max (units); unit,level,top_z,bottom_z (levels); layer,x,y,z (layer tops)`,
    }]);
  }
  const columns = CSV_COLUMNS[kind];
  const at = columns.map((c) => header.indexOf(squash(c)));
  const problems: Problem[] = [];
  const out: SiteDefinitions = { units: [], levels: [], layerBoundaries: [] };
  rows.slice(1).forEach((row, i) => {
    const line = i + 2;
    if (row.length !== header.length) {
      problems.push({ file, line, message: `has ${row.length} fields, the header has ${header.length}` });
      return;
    }
    const value: Record<string, unknown> = {};
    columns.forEach((c, k) => {
      const cell = row[at[k]];
      const numeric = !['unit', 'level', 'layer'].includes(c);
      if (numeric) value[c] = cell === '' ? NaN : Number(cell);
      else value[c] = c === 'unit' && kind === 'levels' && cell === '' ? null : cell;
    });
    const schema = kind === 'units' ? unitSchema : kind === 'levels' ? levelSchema : pointSchema;
    const parsed = schema.safeParse(value);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const col = String(issue.path[0] ?? '');
        const k = columns.indexOf(col);
        const shown = k >= 0 ? rows[0][at[k]] : col;
        problems.push({ file, line, column: shown || undefined, message: `${JSON.stringify(row[at[k]] ?? '')}: ${issue.message}` });
      }
      return;
    }
    if (kind === 'units') out.units.push(parsed.data as UnitDefinition);
    else if (kind === 'levels') {
      const l = parsed.data as { unit?: string | null; level: string; topZ: number; bottomZ: number };
      out.levels.push({ unit: l.unit ?? null, level: l.level, topZ: l.topZ, bottomZ: l.bottomZ } satisfies LevelDefinition);
    } else out.layerBoundaries.push(parsed.data as LayerBoundaryPoint);
  });
  if (problems.length) throw new KnitboneError('bad-input', problems);
  return out;
}

/** A unit, or a level of one unit, defined twice in one file is refused (which one is meant?). */
function duplicates(defs: SiteDefinitions, file: string): Problem[] {
  const problems: Problem[] = [];
  const seen = new Set<string>();
  for (const u of defs.units) {
    if (seen.has(u.unit)) problems.push({ file, field: 'unit', message: `unit ${u.unit} is defined twice in ${basename(file)}` });
    seen.add(u.unit);
  }
  const levels = new Set<string>();
  for (const l of defs.levels) {
    const key = `${l.unit ?? ''}\u0000${l.level}`;
    if (levels.has(key)) {
      problems.push({ file, field: 'level', message: `level ${l.level} ${l.unit ? `of unit ${l.unit}` : '(every unit)'} is defined twice in ${basename(file)}` });
    }
    levels.add(key);
  }
  return problems;
}
