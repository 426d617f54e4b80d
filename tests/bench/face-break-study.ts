/**
 * Which true breaks each break face holds, and whether the regions under it already separate
 * them (dev data only). Usage: npx tsx tests/bench/face-break-study.ts <demo dir> [settings json]
 * Prints per sample: face purity (area), region-level break purity of the fracture regions
 * (what grouping whole regions could reach at best), and for impure faces the angle between
 * the mean normals of their two largest breaks.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyseFragment } from '../../core/geometry/analyse-fragment';
import { triangleNormalsAndAreas } from '../../core/geometry/mesh';
import { parseMeshFile } from '../../core/geometry/parse/index';

interface Truth { fragments: Array<{ catalogueNo: string; scanFile: string; triangleLabels: string }> }
const dir = process.argv[2];
const settings = process.argv[3] ? JSON.parse(process.argv[3]) : {};
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as Truth;
let faceArea = 0, faceDom = 0, regArea = 0, regDom = 0;
const angles: number[] = [];
for (const frag of truth.fragments) {
  const labels = Buffer.from(frag.triangleLabels, 'base64');
  const parsed = parseMeshFile(readFileSync(join(dir, frag.scanFile)), frag.scanFile);
  const a = analyseFragment(parsed.mesh, settings);
  const { areas } = triangleNormalsAndAreas(a.mesh);
  const tn = a.triangleNormals;
  // region purity over fracture regions
  const regBreak = new Map<number, Map<number, number>>();
  for (let f = 0; f < a.triangleClass.length; f++) {
    if (a.triangleClass[f] !== 0) continue;
    const l = labels[a.sourceTriangle[f]];
    const r = a.regionOfTriangle[f];
    let m = regBreak.get(r); if (!m) regBreak.set(r, (m = new Map()));
    m.set(l >= 10 ? l : -1, (m.get(l >= 10 ? l : -1) ?? 0) + areas[f]);
  }
  for (const m of regBreak.values()) { let s = 0, d = 0; for (const [k, v] of m) { s += v; if (k >= 0) d = Math.max(d, v); } regArea += s; regDom += d; }
  for (const face of a.fractureFaces) {
    const m = new Map<number, { area: number; n: [number, number, number] }>();
    let s = 0;
    for (const f of face.triangleIds) {
      const l = labels[a.sourceTriangle[f]]; s += areas[f];
      if (l < 10) continue;
      let e = m.get(l); if (!e) m.set(l, (e = { area: 0, n: [0, 0, 0] }));
      e.area += areas[f]; for (let i = 0; i < 3; i++) e.n[i] += areas[f] * tn[3 * f + i];
    }
    const sorted = [...m.values()].sort((x, y) => y.area - x.area);
    faceArea += s; faceDom += sorted[0]?.area ?? 0;
    if (sorted.length >= 2 && sorted[1].area > 0.2 * s) {
      const u = sorted[0].n, v = sorted[1].n;
      const c = (u[0] * v[0] + u[1] * v[1] + u[2] * v[2]) / (Math.hypot(...u) * Math.hypot(...v));
      const ang = (Math.acos(Math.max(-1, Math.min(1, c))) * 180) / Math.PI;
      angles.push(ang);
      const regs = new Set(face.triangleIds.map((f) => a.regionOfTriangle[f]));
      console.log(`${frag.catalogueNo} face ${face.id} area ${s.toFixed(0)} breaks ${sorted.map((x) => (x.area / s).toFixed(2)).join('/')} angle ${ang.toFixed(0)} regions ${regs.size} outline ${face.outlines.length}`);
    }
  }
}
angles.sort((x, y) => x - y);
console.log(`face purity ${(faceDom / faceArea).toFixed(3)} region break purity ${(regDom / regArea).toFixed(3)} impure faces ${angles.length} angle quartiles ${[0.25, 0.5, 0.75].map((q) => angles[Math.floor(q * angles.length)]?.toFixed(0)).join(' ')}`);
