/**
 * `knitbone match` end to end: scan files in, JSON out (issue 6, items 1 and 8). The pieces are
 * a tube (analytic solid built with manifold-3d, a reference library) cut in two by a rough
 * surface; B is moved by a known rigid motion, so the right answer is that motion's inverse.
 * The command is not told which triangles are break faces: segmentation finds them.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { IcosahedronGeometry } from 'three';
import { beforeAll, describe, expect, it } from 'vitest';
import { cutTube } from '../../support/bunny-cut';
import { writePly } from '../../support/write-ply';
import { applyToPoints, displacementAt, invert, rotationAboutAxis, rotationErrorDegrees, transformFrom } from '../../../core/geometry/registration/rigid-transform';

const bin = join(import.meta.dirname, '../../../bin/knitbone.js');
const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });
const dir = mkdtempSync(join(tmpdir(), 'knitbone-match-'));
const motion = transformFrom(rotationAboutAxis([1, 2, -1], (130 * Math.PI) / 180), [60, -30, 90]);
let diagonal = 0;
let centroidB: number[] = [0, 0, 0];

beforeAll(async () => {
  const { lower, upper, diagonal: d } = await cutTube();
  diagonal = d;
  const moved = applyToPoints(motion, upper.positions);
  let cx = 0, cy = 0, cz = 0;
  for (let i = 0; i < moved.length; i += 3) { cx += moved[i]; cy += moved[i + 1]; cz += moved[i + 2]; }
  centroidB = [cx, cy, cz].map((v) => (3 * v) / moved.length);
  writePly(join(dir, 'a.ply'), lower.positions, lower.triangles);
  writePly(join(dir, 'b.ply'), moved, upper.triangles);
  // the same piece in metres: a scan in the wrong units
  writePly(join(dir, 'a-in-metres.ply'), lower.positions.map((v) => v / 1000), lower.triangles);
  // a smooth, whole sphere (three.js IcosahedronGeometry): nothing is broken
  const g = new IcosahedronGeometry(20, 4);
  const p = g.getAttribute('position').array as Float32Array;
  writePly(join(dir, 'sphere.ply'), p, Uint32Array.from({ length: p.length / 3 }, (_, i) => i));
});

describe('knitbone match', () => {
  it('prints the join of two halves of a broken tube with the motion within 1 degree and 1% of the diagonal', () => {
    const r = run('match', join(dir, 'a.ply'), join(dir, 'b.ply'), '--json');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out).sort()).toEqual(['candidates', 'contactFraction', 'faceA', 'faceB', 'gapRmsMm', 'outlineAgreement', 'penetrationMm', 'score', 'transform'].sort());
    expect(out.transform).toHaveLength(16);
    const truth = invert(motion);
    expect(rotationErrorDegrees(out.transform, truth)).toBeLessThan(1);
    expect(displacementAt(out.transform, truth, centroidB)).toBeLessThan(0.01 * diagonal);
    expect(out.score).toBeGreaterThan(0.8);
    for (const c of out.candidates) {
      expect(Object.keys(c).sort()).toEqual(Object.keys(out).filter((k) => k !== 'candidates').sort());
      expect(c.score).toBeLessThanOrEqual(out.score);
    }
  });

  it('refuses two identical files with a clear message (exit 1)', () => {
    const r = run('match', join(dir, 'a.ply'), join(dir, 'a.ply'), '--json');
    expect(r.status).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/same scan/);
  });

  it('refuses a scan in the wrong units, naming the file and the fix (exit 1)', () => {
    const r = run('match', join(dir, 'a-in-metres.ply'), join(dir, 'b.ply'), '--json');
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/a-in-metres\.ply.*--units/);
  });

  it('refuses a fragment with no break face (exit 1)', () => {
    const r = run('match', join(dir, 'sphere.ply'), join(dir, 'b.ply'), '--json');
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/sphere\.ply.*no break face/);
  });

  it('refuses a degenerate file (exit 1)', () => {
    writeFileSync(join(dir, 'flat.ply'), 'ply\nformat ascii 1.0\nelement vertex 3\nproperty float x\nproperty float y\nproperty float z\nelement face 1\nproperty list uchar int vertex_indices\nend_header\n0 0 0\n1 0 0\n2 0 0\n3 0 1 2\n');
    const r = run('match', join(dir, 'flat.ply'), join(dir, 'b.ply'), '--json');
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/flat\.ply/);
  });
});
