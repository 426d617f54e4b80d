import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { layerTopPoints, siteUnits, unitLevels } from './site';

/** File name of the site's unit, level and layer definitions in a demo folder. */
export const SITE_DEFINITIONS_FILE = 'site.json';

/**
 * The invented site's excavation units, spits and layer tops in the format `knitbone import
 * site` reads (JSON: units, levels, layerBoundaries), so the spatial screens can place the
 * demo's specimens and draw its layers. They agree with the provenience written for every
 * fragment (site.ts). Returns the bytes written.
 */
export function writeSiteDefinitions(dir: string): number {
  const units = siteUnits();
  const text =
    '{\n"units": [\n' +
    units.map((u) => JSON.stringify(u)).join(',\n') +
    '\n],\n"levels": [\n' +
    units.flatMap((u) => unitLevels(u.unit)).map((l) => JSON.stringify(l)).join(',\n') +
    '\n],\n"layerBoundaries": [\n' +
    layerTopPoints().map((p) => JSON.stringify(p)).join(',\n') +
    '\n]\n}\n';
  writeFileSync(join(dir, SITE_DEFINITIONS_FILE), text);
  return Buffer.byteLength(text);
}
