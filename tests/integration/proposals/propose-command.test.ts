/**
 * `knitbone propose` end to end on a small catalogue (issue 6, item 2): a tube (analytic solid
 * built with manifold-3d, a reference library) cut in two by a rough surface, plus one piece of
 * another cut tube with no partner present; scanned pieces moved by known rigid motions. The true joins must be each piece's best
 * proposal with the right motion; a second run must only skip; a region correction makes that scan's
 * pairs new again; a decided join is never touched.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { openCatalogue } from '../../../core/catalogue/catalogue';
import { applyToPoints, compose, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom, type RigidTransform } from '../../../core/geometry/registration/rigid-transform';
import { latestScanRefs, runSampling } from '../../../core/host/proposals/describe-faces';
import { cacheDirFor, readSummary, readTraits } from '../../../core/jobs/fragment-cache';
import { cutTube } from '../../support/bunny-cut';
import { writePly } from '../../support/write-ply';

const bin = join(import.meta.dirname, '../../../bin/knitbone.js');
const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });
const dir = mkdtempSync(join(tmpdir(), 'knitbone-propose-'));
const catalogue = join(dir, 'site.sqlite');
/** A copy of the catalogue as imported, before any run, for the size-class runs. */
const sized = join(dir, 'sized.sqlite');
/** Pose of each scan file: file frame = pose * construction frame. */
const poses = new Map<string, RigidTransform>();

beforeAll(async () => {
  mkdirSync(join(dir, 'scans'));
  mkdirSync(join(dir, 'later'));
  const tubes = [await cutTube(), await cutTube({ outerRadius: 10, innerRadius: 6, length: 70, cutY: 8, amplitude: 2, seed: 3 })];
  let k = 0;
  for (const [t, tube] of tubes.entries()) {
    // the second tube contributes only its lower piece: a fragment with no partner present
    // the second tube's upper piece is scanned later (a new scan for a later run)
    const pieces = [['lower', tube.lower], ['upper', tube.upper]] as const;
    for (const [name, piece] of pieces) {
      const no = `T-${t + 1}${name === 'lower' ? 'a' : 'b'}`;
      const pose = transformFrom(rotationAboutAxis([1 + k, 2 - k, k - 1], 0.7 + 0.9 * k), [40 * k, -25 * k, 15]);
      k++;
      poses.set(no, pose);
      writePly(join(dir, t === 1 && name === 'upper' ? 'later' : 'scans', `${no}.ply`), applyToPoints(pose, piece.positions), piece.triangles);
    }
  }
  writeFileSync(join(dir, 'specimens.csv'), 'catalogue_no\n' + [...poses.keys()].join('\n') + '\n');
  expect(run('init', catalogue).status).toBe(0);
  expect(run('import', 'specimens', catalogue, join(dir, 'specimens.csv')).status).toBe(0);
  expect(run('import', 'scans', catalogue, join(dir, 'scans')).status).toBe(0);
  cpSync(catalogue, sized);
  if (existsSync(cacheDirFor(catalogue))) cpSync(cacheDirFor(catalogue), cacheDirFor(sized), { recursive: true });
}, 400_000);

interface JoinOut { id: number; a: string; b: string; status: string; score: number; transform: number[] }

describe('knitbone propose', () => {
  it('importing the scans described their break faces at the sampling a run will use', () => {
    const cat = openCatalogue(catalogue);
    const { scans } = latestScanRefs(cat);
    cat.close();
    const summaries = scans.map((s) => readSummary(s.cache!.dir, s.cache!.key)!);
    expect(summaries.every((s) => s && !s.problem)).toBe(true);
    const sampling = runSampling(summaries);
    for (const s of scans) {
      const t = readTraits(s.cache!.dir, s.cache!.key, sampling);
      expect(t).toBeDefined();
      expect(t!.traits.length).toBeGreaterThan(0);
    }
  });

  it('proposes the true joins as each piece\'s best, with the motion that puts B on A', () => {
    const r = run('propose', catalogue, '--workers', '2', '--json');
    expect(r.status).toBe(0);
    const list = JSON.parse(r.stdout) as JoinOut[];
    for (const [a, b] of [['T-1a', 'T-1b'], ['T-1b', 'T-1a']]) {
      const best = list.filter((j) => j.a === a || j.b === a).sort((p, q) => q.score - p.score)[0];
      expect([best.a, best.b].sort()).toEqual([a, b].sort());
      // B's file -> A's file = pose_A * pose_B^-1 (composition of rigid motions)
      const truth = compose(poses.get(best.a)!, invert(poses.get(best.b)!));
      expect(rotationErrorDegrees(best.transform, truth)).toBeLessThan(1);
    }
  }, 400_000);

  it('a second run with the same parameters aligns nothing again and reads no scan again', () => {
    const r = run('propose', catalogue, '--workers', '1');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/aligned 0,/);
    expect(r.stdout).toMatch(/\(0 scans analysed/);
  }, 400_000);

  it('after a new scan, a run aligns only pairs that include it, with the analysis the import stored', () => {
    expect(run('import', 'scans', catalogue, join(dir, 'later')).status).toBe(0);
    const cat = openCatalogue(catalogue);
    const newScan = cat.scans.list().find((s) => s.path.includes('T-2b'))!;
    const before = cat.db.prepare('SELECT count(*) AS n FROM proposal_pair').get() as { n: number };
    cat.close();
    const r = run('propose', catalogue, '--workers', '1');
    expect(r.status).toBe(0);
    // importing the scan analysed it and described the faces: no scan is read or described again
    expect(r.stdout).toMatch(/\(0 scans analysed and 0 described in this run/);
    // every fragment was prepared by the first run, or while describing the new scan, and its
    // parts kept in the match cache: none is prepared again while aligning; and the worker's busy
    // time lies within the aligning stage
    const m = /while aligning: (\d+) fragments prepared by the workers; workers busy ([\d.]+) s of ([\d.]+) s/.exec(r.stdout);
    expect(m).not.toBeNull();
    expect(Number(m![1])).toBe(0);
    expect(Number(m![2])).toBeLessThanOrEqual(Number(m![3]) + 0.05);
    const again = openCatalogue(catalogue);
    const rows = again.db.prepare('SELECT scan_a, scan_b FROM proposal_pair ORDER BY rowid').all() as Array<{ scan_a: number; scan_b: number }>;
    again.close();
    const added = rows.slice(before.n);
    expect(added.length).toBeGreaterThan(0);
    for (const p of added) expect([p.scan_a, p.scan_b]).toContain(newScan.id);
  }, 400_000);

  it('after a region of one scan is corrected, a run aligns again only the pairs that include it', () => {
    const cat = openCatalogue(catalogue);
    const scan = cat.scans.list().find((s) => s.path.includes('T-1a'))!;
    const region = ((scan.stats.regions ?? []) as Array<{ id: number; surfaceClass: 'fracture' | 'outer-cortical' | 'medullary' | 'articular' }>)[0];
    // the analyst confirms the class the segmentation gave: the faces stay, but the scan's
    // analysis is now the analyst's and the pairs made before it are not taken as done
    const correction = cat.regionClasses.correct(scan.id, region.id, region.surfaceClass, 'test');
    cat.close();
    const r = run('propose', catalogue, '--workers', '1');
    expect(r.status).toBe(0);
    const aligned = Number(/aligned (\d+),/.exec(r.stdout)![1]);
    expect(aligned).toBeGreaterThan(0);
    const again = openCatalogue(catalogue);
    const redone = again.db.prepare('SELECT scan_a, scan_b FROM proposal_pair WHERE done_at >= ?').all(correction.createdAt) as Array<{ scan_a: number; scan_b: number }>;
    again.close();
    expect(redone.length).toBeGreaterThan(0);
    for (const p of redone) expect([p.scan_a, p.scan_b]).toContain(scan.id);
    // and a further run takes them as done again
    expect(run('propose', catalogue, '--workers', '1').stdout).toMatch(/aligned 0,/);
  }, 400_000);

  it('never touches a decided join, even when parameters change', () => {
    const cat = openCatalogue(catalogue);
    const first = cat.joins.list({ status: 'proposed' })[0];
    const rejected = cat.joins.update(first.id, { status: 'rejected', decidedBy: 'test', decidedAt: new Date().toISOString() });
    cat.close();
    const r = run('propose', catalogue, '--workers', '1', '--min-score', '0.01');
    expect(r.status).toBe(0);
    const again = openCatalogue(catalogue);
    expect(again.joins.get(first.id)).toEqual(rejected);
    const samePair = again.joins.list().filter((j) => j.id !== first.id && [j.specimenA, j.specimenB].sort().join() === [first.specimenA, first.specimenB].sort().join());
    again.close();
    expect(samePair).toEqual([]);
  }, 400_000);

  it('pieces recorded in size classes further apart than --size-class-gap are not paired; "any" ignores the classes', () => {
    // a join is two pieces of one bone, so of one animal and one size class (common practice):
    // the two halves of one tube recorded two classes apart are not paired by default
    const csv = join(dir, 'size-classes.csv');
    writeFileSync(csv, 'catalogue_no,size_class\nT-1a,2\nT-1b,4\n');
    expect(run('import', 'specimens', sized, csv, '--update').status).toBe(0);
    const pairOf = (out: string): JoinOut | undefined => (JSON.parse(out) as JoinOut[]).find((j) => [j.a, j.b].sort().join() === 'T-1a,T-1b');
    const apart = run('propose', sized, '--workers', '1', '--json');
    expect(apart.status).toBe(0);
    expect(pairOf(apart.stdout)).toBeUndefined();
    const text = run('propose', sized, '--workers', '1', '--size-class-gap', '1');
    expect(text.stdout).toMatch(/size classes: 2 of 3 pieces have one recorded; pieces more than 1 class apart were not paired/);
    expect(text.stdout).toMatch(/aligned 0,/);
    // two classes apart is within a gap of 2, and "any" ignores the classes: the join is proposed
    const near = run('propose', sized, '--workers', '1', '--size-class-gap', 'any', '--json');
    expect(near.status).toBe(0);
    const join12 = pairOf(near.stdout);
    expect(join12).toBeDefined();
    const truth = compose(poses.get(join12!.a)!, invert(poses.get(join12!.b)!));
    expect(rotationErrorDegrees(join12!.transform, truth)).toBeLessThan(1);
    const bad = run('propose', sized, '--size-class-gap', 'two');
    expect(bad.status).not.toBe(0);
    expect(bad.stderr).toMatch(/--size-class-gap must be a whole number of classes from 0 to 10, or "any".*got "two"/);
  }, 400_000);
});
