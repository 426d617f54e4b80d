import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openCatalogue } from '../../core/catalogue/catalogue';
import { KnitboneError } from '../../core/host/errors';
import { Host } from '../../core/host/host';
import { brokenTube, type BrokenTube } from '../unit/geometry/broken-tube';
import { obj, plyBinary, stlAscii } from '../unit/geometry/mesh-writers';

const bin = join(import.meta.dirname, '../../bin/knitbone.js');
const host = new Host();
let dir: string, folder: string, catalogue: string, tube: BrokenTube;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'knitbone-scans-'));
  folder = join(dir, 'scans');
  mkdirSync(folder);
  catalogue = join(dir, 'site.sqlite');
  // A small broken tube (truth from its construction: see broken-tube.ts).
  tube = await brokenTube({ cuts: [{ normal: [0, 0, 1], offset: -20 }, { normal: [0, 0, -1], offset: -20 }], edgeLength: 2, length: 60 });
  writeFileSync(join(folder, 'KB-1.ply'), plyBinary(tube.mesh, false));
  writeFileSync(join(folder, 'KB-2.stl'), stlAscii(tube.mesh));
  writeFileSync(join(folder, 'KB-3.obj'), obj(tube.mesh));
  writeFileSync(join(folder, 'NOT-CATALOGUED.ply'), plyBinary(tube.mesh, true));
  writeFileSync(join(folder, 'notes.txt'), 'not a scan');
  await host.call('catalogue.init', { catalogue });
  for (const no of ['KB-0', 'KB-1', 'KB-2', 'KB-3']) await host.call('specimens.create', { catalogue, specimen: { catalogueNo: no } });
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('knitbone inspect', () => {
  it('prints the figures and faces as one JSON document and writes one label byte per input triangle', () => {
    const labels = join(dir, 'labels.bin');
    const r = spawnSync(process.execPath, [bin, 'inspect', join(folder, 'KB-1.ply'), '--json', '--labels', labels], { encoding: 'utf8' });
    expect(r.status).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.triangles).toBe(tube.truth.length);
    expect(doc.closed).toBe(true);
    expect(typeof doc.area).toBe('number');
    expect(typeof doc.volume).toBe('number');
    const fractures = doc.faces.filter((f: { kind: string }) => f.kind === 'fracture');
    expect(fractures).toHaveLength(2);
    for (const f of doc.faces) {
      expect(Object.keys(f)).toEqual(expect.arrayContaining(['id', 'kind', 'area', 'triangles', 'meanAngleDeg', 'angleClass', 'outlineClass']));
    }
    // Two transverse plane cuts: right angles, transverse outlines (analytic).
    for (const f of fractures) {
      expect(f.angleClass).toBe('right');
      expect(f.outlineClass).toBe('transverse');
    }
    const bytes = readFileSync(labels);
    expect(bytes.length).toBe(tube.truth.length);
    let agree = 0;
    for (let i = 0; i < bytes.length; i++) if (bytes[i] === tube.truth[i]) agree++;
    expect(agree / bytes.length).toBeGreaterThan(0.97);
  });

  it('exits 1 with the file and the reason for a bad file', () => {
    const bad = join(dir, 'short.ply');
    writeFileSync(bad, plyBinary(tube.mesh, true).subarray(0, 3000));
    const r = spawnSync(process.execPath, [bin, 'inspect', bad, '--json'], { encoding: 'utf8' });
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/short\.ply: PLY file is truncated/);
  });
});

describe('importing a folder of scans', () => {
  it('refuses the whole import when a file is bad, unless asked to skip bad files', async () => {
    // First in name order, so the refused run stops before reading the others.
    writeFileSync(join(folder, 'KB-0.ply'), new TextEncoder().encode('ply\nformat ascii 1.0\nelement vertex 3\nproperty float x\nproperty float y\nproperty float z\nelement face 1\nproperty list uchar int vertex_indices\nend_header\n0 0 0\n1 0 0\n0 1 0\n3 0 1 7\n'));
    let caught: unknown;
    try {
      await host.call('scans.import', { catalogue, folder, workers: 1 });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(KnitboneError);
    expect((caught as KnitboneError).problems[0]).toMatchObject({ file: 'KB-0.ply' });
    expect((caught as KnitboneError).problems[0].message).toMatch(/refers to vertex 7/);
    const cat = openCatalogue(catalogue);
    expect(cat.scans.list()).toHaveLength(0);
    cat.close();
  });

  it('a cancelled import stores nothing unfinished and a second run resumes', async () => {
    const abort = new AbortController();
    abort.abort();
    const first = await host.call('scans.import', { catalogue, folder, workers: 1, skipBad: true }, { signal: abort.signal });
    expect(first.cancelled).toBe(true);
    expect(first.imported).toHaveLength(0);
    expect(first.remaining.length).toBeGreaterThan(0);
    const events: string[] = [];
    const second = await host.call('scans.import', { catalogue, folder, workers: 1, skipBad: true }, { onProgress: (e) => events.push(`${e.stage} ${e.done}/${e.total}`) });
    expect(second.cancelled).toBe(false);
    expect(second.imported.map((s) => s.catalogueNo).sort()).toEqual(['KB-1', 'KB-2', 'KB-3']);
    expect(second.unmatched).toEqual(['NOT-CATALOGUED.ply']);
    expect(second.bad.map((b) => b.file)).toEqual(['KB-0.ply']);
    expect(events).toContain('reading scans 4/4');
    for (const s of second.imported) expect(s.fractureFaces).toBe(2);
    const third = await host.call('scans.import', { catalogue, folder, workers: 1, skipBad: true });
    expect(third.imported).toHaveLength(0);
    expect(third.alreadyImported).toHaveLength(3);
    const cat = openCatalogue(catalogue);
    const scans = cat.scans.list();
    expect(scans).toHaveLength(3);
    expect(scans[0].stats).toMatchObject({ closed: true, triangles: tube.truth.length });
    expect(scans[0].contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(scans[0].path).toBe('scans/KB-1.ply');
    cat.close();
  });

  it("keeps the analyst's correction of a region class and recomputes the faces", async () => {
    const cat = openCatalogue(catalogue);
    const scan = cat.scans.list()[0];
    cat.close();
    const regions = scan.stats.regions as Array<{ id: number; surfaceClass: string }>;
    const fracture = regions.find((r) => r.surfaceClass === 'fracture')!;
    const r = await host.call('scans.correctRegion', { catalogue, scanId: scan.id, regionId: fracture.id, surfaceClass: 'articular', who: 'tester' });
    expect(r.recomputed).toBe(true);
    const fractureArea = (faces: Array<{ kind: string; area: number }>): number => faces.filter((f) => f.kind === 'fracture').reduce((s, f) => s + f.area, 0);
    const before = fractureArea(scan.stats.faces as Array<{ kind: string; area: number }>);
    const after = fractureArea(r.scan.stats.faces as Array<{ kind: string; area: number }>);
    expect(before - after).toBeCloseTo((scan.stats.regions as Array<{ id: number; area: number }>)[fracture.id].area, 0);
    expect((r.scan.stats.regions as Array<{ surfaceClass: string }>)[fracture.id].surfaceClass).toBe('articular');
    const got = await host.call('scans.get', { catalogue, scanId: scan.id });
    expect(got.corrections).toHaveLength(1);
    expect(got.corrections[0]).toMatchObject({ regionId: fracture.id, surfaceClass: 'articular', who: 'tester' });
    // Corrections are append-only.
    const c2 = openCatalogue(catalogue);
    expect(() => c2.db.prepare('DELETE FROM scan_region_class').run()).toThrow(/append-only/);
    c2.close();
    await expect(host.call('scans.correctRegion', { catalogue, scanId: scan.id, regionId: 9999, surfaceClass: 'fracture' })).rejects.toThrow(/no region 9999/);
  });
});

describe('cancelling an import while scans are being read', () => {
  it('stores the scans finished before the cancel, and the next run reads only the rest', async () => {
    const sub = mkdtempSync(join(tmpdir(), 'knitbone-scans-cancel-'));
    try {
      const scans = join(sub, 'scans');
      mkdirSync(scans);
      const cat = join(sub, 'site.sqlite');
      for (const no of ['KC-1', 'KC-2', 'KC-3']) writeFileSync(join(scans, `${no}.ply`), plyBinary(tube.mesh, false));
      await host.call('catalogue.init', { catalogue: cat });
      for (const no of ['KC-1', 'KC-2', 'KC-3']) await host.call('specimens.create', { catalogue: cat, specimen: { catalogueNo: no } });
      // Cancel from inside the run, at the first finished scan (mid-run, not before the start).
      const abort = new AbortController();
      let readBeforeCancel = -1;
      const first = await host.call('scans.import', { catalogue: cat, folder: scans, workers: 1 }, {
        signal: abort.signal,
        onProgress: (e) => {
          if (e.stage === 'reading scans' && e.done >= 1 && !abort.signal.aborted) {
            readBeforeCancel = e.done;
            abort.abort();
          }
        },
      });
      expect(readBeforeCancel).toBe(1);
      expect(first.cancelled).toBe(true);
      expect(first.imported.length).toBeGreaterThanOrEqual(1);
      expect(first.imported.length).toBeLessThan(3);
      const firstDone = first.imported.map((s) => s.catalogueNo).sort();
      expect([...firstDone, ...first.remaining.map((f) => f.replace('.ply', ''))].sort()).toEqual(['KC-1', 'KC-2', 'KC-3']);
      const stored = openCatalogue(cat);
      expect(stored.scans.list()).toHaveLength(first.imported.length);
      stored.close();
      const second = await host.call('scans.import', { catalogue: cat, folder: scans, workers: 1 });
      expect(second.cancelled).toBe(false);
      expect(second.alreadyImported.map((s) => s.catalogueNo).sort()).toEqual(firstDone);
      expect(second.imported.map((s) => s.catalogueNo).sort()).toEqual(first.remaining.map((f) => f.replace('.ply', '')).sort());
      const all = openCatalogue(cat);
      expect(all.scans.list()).toHaveLength(3);
      all.close();
    } finally {
      rmSync(sub, { recursive: true, force: true });
    }
  });
});
