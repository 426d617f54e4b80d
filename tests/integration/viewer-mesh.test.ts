/**
 * The app's 3D view of a scan (`viewer.mesh`) segments the scan as the catalogue holds it: with
 * the settings it was imported with (same region ids and classes as the stored summary) and
 * with the analyst's region class corrections applied. Scan: a fragment of the generated
 * sample assemblage (demo-data/sample).
 */
import { copyFileSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { Host } from '../../core/host/host';

const sample = join(import.meta.dirname, '../../demo-data/sample');
const dir = mkdtempSync(join(tmpdir(), 'knitbone-viewer-mesh-'));
const catalogue = join(dir, 'site.sqlite');
const host = new Host();
const call = host.callUnchecked.bind(host) as (name: string, input: unknown) => Promise<any>;
const no = 'QS-10837';

interface Mesh {
  scanId: number;
  triangleFaces: string;
  triangleRegions: string;
  regions: Array<{ id: number; surfaceClass: string; area: number; corrected: boolean }>;
  correctable: boolean;
}
const int32 = (b64: string): Int32Array => {
  const buf = Buffer.from(b64, 'base64');
  return new Int32Array(buf.buffer, buf.byteOffset, buf.byteLength / 4);
};
/** Triangles of a region that lie in some fracture face. */
function inFractureFaces(mesh: Mesh, region: number): { total: number; inFaces: number } {
  const regions = int32(mesh.triangleRegions);
  const faces = int32(mesh.triangleFaces);
  let total = 0;
  let inFaces = 0;
  for (let t = 0; t < regions.length; t++) {
    if (regions[t] !== region) continue;
    total++;
    if (faces[t] >= 0) inFaces++;
  }
  return { total, inFaces };
}

let specimenId: number;
let stored: Array<{ id: number; surfaceClass: string; area: number }>;

beforeAll(async () => {
  mkdirSync(join(dir, 'scans'));
  copyFileSync(join(sample, 'scans', `${no}.ply`), join(dir, 'scans', `${no}.ply`));
  writeFileSync(join(dir, 'specimens.csv'), `catalogue_no\n${no}\n`);
  await call('catalogue.init', { catalogue });
  await call('specimens.import', { catalogue, file: join(dir, 'specimens.csv') });
  await call('scans.import', { catalogue, folder: join(dir, 'scans'), workers: 1 });
  const [listed] = await call('specimens.list', { catalogue });
  const s = await call('specimens.get', { catalogue, id: listed.id });
  specimenId = s.specimen.id;
  stored = s.scans[0].stats.regions;
}, 120_000);

describe('viewer.mesh', () => {
  it('segments as stored: the same regions with the same classes as the imported summary', async () => {
    const mesh = (await call('viewer.mesh', { catalogue, specimenId })) as Mesh;
    expect(mesh.correctable).toBe(true);
    expect(mesh.regions.map((r) => [r.id, r.surfaceClass])).toEqual(stored.map((r) => [r.id, r.surfaceClass]));
    for (const [i, r] of mesh.regions.entries()) expect(r.area).toBeCloseTo(stored[i].area, 1);
    expect(mesh.regions.every((r) => !r.corrected)).toBe(true);
  });

  it("applies the analyst's correction, and withdrawing it brings the program's class back", async () => {
    const fracture = stored.filter((r) => r.surfaceClass === 'fracture').sort((a, b) => b.area - a.area)[0];
    const before = (await call('viewer.mesh', { catalogue, specimenId })) as Mesh;
    // Before: the region's triangles belong to fracture faces.
    const was = inFractureFaces(before, fracture.id);
    expect(was.total).toBeGreaterThan(0);
    expect(was.inFaces).toBe(was.total);

    await call('scans.correctRegion', { catalogue, scanId: before.scanId, regionId: fracture.id, surfaceClass: 'medullary' });
    const after = (await call('viewer.mesh', { catalogue, specimenId })) as Mesh;
    expect(after.regions.find((r) => r.id === fracture.id)).toMatchObject({ surfaceClass: 'medullary', corrected: true });
    expect(inFractureFaces(after, fracture.id)).toEqual({ total: was.total, inFaces: 0 });
    // The other regions keep their classes.
    for (const r of after.regions) if (r.id !== fracture.id) expect(r.surfaceClass).toBe(stored[r.id].surfaceClass);

    await call('scans.correctRegion', { catalogue, scanId: before.scanId, regionId: fracture.id, surfaceClass: null });
    const back = (await call('viewer.mesh', { catalogue, specimenId })) as Mesh;
    expect(back.regions.find((r) => r.id === fracture.id)).toMatchObject({ surfaceClass: 'fracture', corrected: false });
    expect(inFractureFaces(back, fracture.id).inFaces).toBe(was.total);
  }, 120_000);
});
