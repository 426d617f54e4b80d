import { join } from 'node:path';
import { Host } from '../../core/host/host';
import { tempDir } from './harness';

type Loose = (name: string, input: unknown) => Promise<unknown>;

/** A new catalogue in a temporary folder, made through the host API as the app would. */
export async function newCatalogue(specimens: Array<Record<string, unknown>> = []): Promise<{ path: string; call: Loose }> {
  const path = join(tempDir('catalogue'), 'assemblage.sqlite');
  const host = new Host();
  const call = host.callUnchecked.bind(host) as Loose;
  await call('catalogue.init', { catalogue: path });
  for (const s of specimens) await call('specimens.create', { catalogue: path, specimen: s });
  return { path, call };
}

/** Through the first screen into a catalogue the session already names. */
export async function openFromFirstRun(page: import('playwright-core').Page): Promise<void> {
  await page.getByRole('button', { name: 'Open catalogue' }).click();
  await page.getByRole('heading', { name: 'Catalogue', level: 1 }).waitFor();
}

/**
 * The Stanford bunny (npm `bunny`, open data) as a binary PLY in millimetres, about 80 mm
 * across: a real scanned surface for the 3D views.
 */
export async function bunnyPly(dir: string, name: string): Promise<string> {
  const { writeFileSync } = await import('node:fs');
  const { createRequire } = await import('node:module');
  const bunny = createRequire(import.meta.url)('bunny') as { positions: number[][]; cells: number[][] };
  const header = [
    'ply',
    'format binary_little_endian 1.0',
    `element vertex ${bunny.positions.length}`,
    'property float x',
    'property float y',
    'property float z',
    `element face ${bunny.cells.length}`,
    'property list uchar int vertex_indices',
    'end_header',
    '',
  ].join('\n');
  const body = Buffer.alloc(bunny.positions.length * 12 + bunny.cells.length * 13);
  let o = 0;
  for (const p of bunny.positions) for (const v of p) o = body.writeFloatLE(v * 8, o);
  for (const c of bunny.cells) {
    o = body.writeUInt8(3, o);
    for (const i of c) o = body.writeInt32LE(i, o);
  }
  const path = join(dir, name);
  writeFileSync(path, Buffer.concat([Buffer.from(header, 'latin1'), body]));
  return path;
}

/** Link a scan file to a specimen directly in the catalogue (test setup only). */
export async function linkScan(catalogue: string, catalogueNo: string, path: string): Promise<void> {
  const { openCatalogue } = await import('../../core/catalogue/catalogue');
  const cat = openCatalogue(catalogue);
  try {
    const s = cat.specimens.require(catalogueNo);
    cat.scans.insert({ specimenId: s.id, path, contentHash: catalogueNo.padEnd(64, '0').slice(0, 64) });
  } finally {
    cat.close();
  }
}

/**
 * Store a proposed join as the proposal run would (test setup only): B's scan placed on A's
 * by a 4x4 row-major transform in mm, with a score and its parts.
 */
export async function proposeJoin(catalogue: string, a: string, b: string, transform: number[], score: number, parts: Record<string, number>): Promise<number> {
  const { openCatalogue } = await import('../../core/catalogue/catalogue');
  const cat = openCatalogue(catalogue);
  try {
    const sa = cat.specimens.require(a);
    const sb = cat.specimens.require(b);
    const j = cat.joins.insert({ specimenA: sa.id, specimenB: sb.id, status: 'proposed', transform, score, scoreComponents: parts, methodVersion: 'test' });
    return j.id;
  } finally {
    cat.close();
  }
}
