/**
 * Per-face study of the fracture angle (issue 5, point 7): for every found face whose angle
 * class disagrees with the generator's break (or every face with KNITBONE_STUDY_ALL=1), the
 * samples' parts next to the same measurement on the truth labels at the nearest rim point:
 * - lean: the fitted bone-surface normal against the shaft's radial direction at the edge point;
 * - radial: the angle read against the radial direction instead;
 * - dFace / dSurf: how far the found face's normal and the fitted surface normal are from the
 *   ones the truth labels give at the nearest truth sample (within 2 mm), and tAngle, the angle
 *   read there on the truth labels.
 * - local1.5 / local2.5: a plain local angle on the truth labels (mean normals of the break's
 *   and the outer surface's triangles within 1.5 / 2.5 mm of the edge point).
 * KNITBONE_STUDY_ALL=1: every found face, and a table of class agreement and mean error against
 * local1.5 for several bone-surface normal estimators (the fit, the radial-turned mean, the plain
 * mean, the radial direction). KNITBONE_STUDY_SAMPLES=1 prints each sample; KNITBONE_STUDY_FRAG
 * limits the study to one catalogue number.
 * Run: KNITBONE_SAMPLE_DIR=a,b npx tsx tests/bench/fracture-angle-study.ts
 */
import { readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { fractureFaces, type AngleSampleTrace } from '../../core/geometry/fracture-faces';
import { analyseLabelled, dominantBreak, type Truth, type TruthBreak } from './fracture-angle.bench';
import { triangleCentroids } from '../../core/geometry/normal-filter';
import { offsetFromAxis } from '../../core/geometry/shaft-axis';
import { SURFACE_CLASSES } from '../../core/geometry/surface-classes';
import { buildTopology } from '../../core/geometry/topology';

type V = [number, number, number];
const FRACTURE_BASE = 10;
const OUTER = SURFACE_CLASSES.indexOf('outer-cortical');
const MEDULLARY = SURFACE_CLASSES.indexOf('medullary');
const degBetween = (a: V, b: V): number => (Math.acos(Math.max(-1, Math.min(1, a[0] * b[0] + a[1] * b[1] + a[2] * b[2]))) * 180) / Math.PI;
const fold = (a: number): number => Math.min(a, 180 - a);
const med = (xs: number[]): number => (xs.length ? [...xs].sort((x, y) => x - y)[Math.floor(xs.length / 2)] : NaN);
const f0 = (x: number): string => (Number.isFinite(x) ? x.toFixed(0) : '-');

const all = process.env.KNITBONE_STUDY_ALL === '1';
/** Surface-normal estimators compared (KNITBONE_STUDY_ALL=1): class agreement and error against the plain local angle on the truth labels. */
const ESTIMATORS = ['current', 'turned|fit', 'turned|mean', 'mean', 'radial|fit'] as const;
const agreeBy = new Map<string, { faces: number; agree: number; err: number; errN: number }>();
const tallyEst = (key: string, ok: boolean, errs: number[]): void => {
  const t = agreeBy.get(key) ?? { faces: 0, agree: 0, err: 0, errN: 0 };
  t.faces++; if (ok) t.agree++;
  for (const e of errs) if (Number.isFinite(e)) { t.err += Math.abs(e); t.errN++; }
  agreeBy.set(key, t);
};
const verbose = process.env.KNITBONE_STUDY_SAMPLES === '1';
const dirs = (process.env.KNITBONE_SAMPLE_DIR ?? '').split(',').filter(Boolean);
for (const dir of dirs) {
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
  const breaks = new Map<string, Map<number, TruthBreak>>();
  for (const b of truth.bones) breaks.set(b.boneId, new Map(b.breaks.map((x) => [x.id, x])));
  for (const frag of truth.fragments) {
    if (process.env.KNITBONE_STUDY_FRAG && frag.catalogueNo !== process.env.KNITBONE_STUDY_FRAG) continue;
    const { a, labels, normals, areas, expected } = analyseLabelled(dir, frag);
    const nt = labels.length;
    const boneBreaks = breaks.get(frag.boneId);
    const wanted: Array<{ face: number; br: TruthBreak; purity: number; exp: string }> = [];
    for (const face of a.fractureFaces) {
      const dominant = dominantBreak(face, labels, areas);
      if (!dominant) continue;
      const { breakId, breakArea, faceArea } = dominant;
      const br = boneBreaks?.get(breakId);
      if (!br) continue;
      const exp = expected(br);
      if (all || face.angleClass !== exp) wanted.push({ face: face.id, br, purity: breakArea / faceArea, exp });
    }
    if (wanted.length === 0) continue;
    const topo = buildTopology(a.mesh);
    const centroids = triangleCentroids(a.mesh.positions, a.mesh.triangles);
    const noSamples = { spacing: a.samples.spacing, points: new Float32Array(0), normals: new Float32Array(0), triangle: new Uint32Array(0) };
    const faceGroup = new Int32Array(nt).fill(-1);
    for (const face of a.fractureFaces) for (const t of face.triangleIds) faceGroup[t] = face.id;
    const found: AngleSampleTrace[] = [];
    fractureFaces({
      faceGroup, mesh: a.mesh, neighbours: topo.neighbours, triNormals: normals, areas, centroids, triClass: a.triangleClass,
      triRoughness: new Float32Array(nt).fill(1), medianRoughness: 1, axis: a.axis, samples: noSamples, settings: a.settings,
      angleTrace: (s) => found.push(s),
    });
    const truthSamples = new Map<number, AngleSampleTrace[]>();
    for (const w of wanted) {
      const label = FRACTURE_BASE + w.br.id;
      if (truthSamples.has(label)) continue;
      const list: AngleSampleTrace[] = [];
      const triClass = Uint8Array.from(labels, (l) => (l === label ? 0 : l === 0 ? OUTER : MEDULLARY));
      fractureFaces({
        mesh: a.mesh, neighbours: topo.neighbours, triNormals: normals, areas, centroids, triClass,
        triRoughness: new Float32Array(nt).fill(1), medianRoughness: 1, axis: a.axis, samples: noSamples, settings: a.settings,
        angleTrace: (s) => list.push(s),
      });
      truthSamples.set(label, list);
    }
    const q: V = [0, 0, 0];
    for (const w of wanted) {
      const face = a.fractureFaces[w.face];
      const ts = truthSamples.get(FRACTURE_BASE + w.br.id) ?? [];
      const rows = found.filter((s) => s.face === w.face).map((s) => {
        offsetFromAxis(a.axis, s.point[0], s.point[1], s.point[2], q);
        const rl = Math.hypot(q[0], q[1], q[2]);
        const radial: V = [q[0] / rl, q[1] / rl, q[2] / rl];
        let best: AngleSampleTrace | undefined, bd = 2;
        for (const t of ts) {
          const d = Math.hypot(t.point[0] - s.point[0], t.point[1] - s.point[1], t.point[2] - s.point[2]);
          if (d < bd) { bd = d; best = t; }
        }
        // Plain local angle on the truth labels: mean normals of the break's and the outer
        // surface's triangles within 1.5 and 2.5 mm of the edge point (no skip, no fit).
        const local = (r: number): number => {
          const fn: V = [0, 0, 0], sn: V = [0, 0, 0];
          for (let t = 0; t < nt; t++) {
            const dx = centroids[3 * t] - s.point[0], dy = centroids[3 * t + 1] - s.point[1], dz = centroids[3 * t + 2] - s.point[2];
            if (dx * dx + dy * dy + dz * dz > r * r) continue;
            const target = labels[t] === FRACTURE_BASE + w.br.id ? fn : labels[t] === 0 ? sn : undefined;
            if (!target) continue;
            for (let c = 0; c < 3; c++) target[c] += areas[t] * normals[3 * t + c];
          }
          const fl = Math.hypot(...fn), sl = Math.hypot(...sn);
          if (!(fl > 0 && sl > 0)) return NaN;
          return fold(180 - degBetween([fn[0] / fl, fn[1] / fl, fn[2] / fl], [sn[0] / sl, sn[1] / sl, sn[2] / sl]));
        };
        const onShaft = a.axis.support >= a.settings.angleShaftSupportMin && Math.abs(rl / a.axis.radius - 1) <= a.settings.angleShaftRadiusTolerance;
        const checked = (n: V): V => (onShaft && degBetween(n, radial) > a.settings.angleFitShaftMaxDeg ? radial : n);
        const est: Record<string, V> = {
          current: s.surfaceUsed,
          'turned|fit': checked(s.surfaceTurned ?? s.surfaceFit),
          'turned|mean': checked(s.surfaceTurned ?? s.surfaceMean),
          mean: checked(s.surfaceMean),
          'radial|fit': onShaft ? radial : checked(s.surfaceFit),
        };
        const estAngle: Record<string, number> = {};
        for (const k of ESTIMATORS) if (est[k]) estAngle[k] = fold(180 - degBetween(s.faceNormal, est[k]));
        return {
          estAngle,
          local15: local(1.5),
          local25: local(2.5),
          angle: fold(s.angleDeg),
          lean: degBetween(s.surfaceFit, radial),
          onShaft: rl / a.axis.radius,
          radialAngle: fold(180 - degBetween(s.faceNormal, radial)),
          faceAxial: degBetween(s.faceNormal, a.axis.direction as V),
          dFace: best ? degBetween(s.faceNormal, best.faceNormal) : NaN,
          dSurf: best ? degBetween(s.surfaceFit, best.surfaceFit) : NaN,
          tAngle: best ? fold(best.angleDeg) : NaN,
          tLean: best ? degBetween(best.surfaceFit, radial) : NaN,
        };
      });
      const classOf = (xs: number[]): string => {
        if (xs.length < 3) return 'indeterminate';
        const m = med(xs);
        const share = xs.filter((x) => 90 - x <= a.settings.rightAngleToleranceDeg).length / xs.length;
        return 90 - m <= a.settings.rightAngleToleranceDeg ? 'right' : share <= a.settings.obliqueShareMax ? 'oblique' : 'mixed';
      };
      for (const k of ESTIMATORS) {
        const cls = classOf(rows.map((r) => r.estAngle[k]));
        const errs = rows.map((r) => r.estAngle[k] - r.local15);
        tallyEst(k, cls === w.exp, errs);
        tallyEst(`${k} / ${w.br.age} ${w.br.pattern}`, cls === w.exp, errs);
      }
      if (all && !verbose) continue;
      console.log(`${basename(dir)} ${frag.catalogueNo} face ${w.face} ${w.br.age} ${w.br.pattern} bevel ${w.br.nominalBevelDeg} expect ${w.exp} got ${face.angleClass} ` +
        `med ${f0(face.medianAngleDeg)} right ${face.rightShare.toFixed(2)} n ${rows.length} purity ${w.purity.toFixed(2)} area ${f0(face.area)} ` +
        `| lean ${f0(med(rows.map((r) => r.lean)))} radialAngle ${f0(med(rows.map((r) => r.radialAngle)))} dFace ${f0(med(rows.map((r) => r.dFace)))} ` +
        `dSurf ${f0(med(rows.map((r) => r.dSurf)))} tAngle ${f0(med(rows.map((r) => r.tAngle)))} tLean ${f0(med(rows.map((r) => r.tLean)))} local1.5 ${f0(med(rows.map((r) => r.local15)))} local2.5 ${f0(med(rows.map((r) => r.local25)))} axisSupport ${a.axis.support.toFixed(2)} onShaft ${med(rows.map((r) => r.onShaft)).toFixed(2)}`);
      if (verbose) for (const r of rows) console.log(`   angle ${f0(r.angle)} lean ${f0(r.lean)} onShaft ${r.onShaft.toFixed(2)} radialAngle ${f0(r.radialAngle)} faceAxial ${f0(r.faceAxial)} dFace ${f0(r.dFace)} dSurf ${f0(r.dSurf)} tAngle ${f0(r.tAngle)} tLean ${f0(r.tLean)} local1.5 ${f0(r.local15)} local2.5 ${f0(r.local25)}`);
    }
  }
}

if (agreeBy.size) {
  console.table([...agreeBy.entries()].sort((x, y) => x[0].localeCompare(y[0])).map(([k, t]) => ({ estimator: k, agree: `${t.agree}/${t.faces}`, pct: ((100 * t.agree) / t.faces).toFixed(1), 'mean |angle - local truth|': (t.err / t.errN).toFixed(1) })));
}
