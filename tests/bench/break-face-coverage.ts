/**
 * Why a true join has no face on its break (the proposals bench's "no face >= 30% on the break
 * (segmentation)" step, section 2e): for each side of each such join, how much of the break's
 * surface the segmentation gave to some face, and what share of those faces lies on the break.
 * Reads an imported catalogue the proposals bench made (its analysis cache) and the generated
 * folder's truth; analyses nothing again.
 *
 *   npx tsx tests/bench/break-face-coverage.ts <imported-dir> <generated-dir>
 *
 * A side is put in the first class that fits:
 *   missed   under 30% of the break's area lies in any face (read as original surface);
 *   merged   the faces (and their pieces) that hold the break lie under 30% on it (joined to
 *            other breaks or to original surface), so no face counts as being on this break;
 *   ok       some face lies at least 30% on the break (the other side is the one that fails).
 * Development data only (never the held-out seed).
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { openCatalogue } from '../../core/catalogue/catalogue';
import { cacheDirFor, fragmentKey, readFragment } from '../../core/jobs/fragment-cache';
import { parseMeshFile } from '../../core/geometry/parse';
import { KdTree } from '../../core/geometry/registration/nearest-neighbours';
import { trueJoinKey } from './candidate-recall';
import { studyFromCache } from './candidate-study';

interface TruthFragment { catalogueNo: string; scanFile: string; triangleLabels: string }
interface TruthJoin { a: string; b: string; type: string; breakId: number; pattern: string; survivingFraction: number; damaged: boolean }

const [importedDir, genDir] = process.argv.slice(2);
if (!importedDir || !genDir) {
  process.stderr.write('usage: npx tsx tests/bench/break-face-coverage.ts <imported-dir> <generated-dir>\n');
  process.exit(2);
}
const truth = JSON.parse(readFileSync(join(genDir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[]; joins: TruthJoin[] };
const catPath = join(importedDir, 'base.sqlite');
const cat = openCatalogue(catPath);
const numbers = new Map(cat.specimens.list().map((s) => [s.id, s.catalogueNo]));
const scanOf = new Map(cat.scans.list().map((s) => [numbers.get(s.specimenId) ?? '', s]));
cat.close();
// the sampling the bench's propose run used (its pruned.sqlite), else the bench's default for 1.0 mm scans
const runCat = join(importedDir, 'pruned.sqlite');
let parameters: { sampling?: { spacing: number } } | undefined;
if (existsSync(runCat)) {
  const c = openCatalogue(runCat);
  parameters = c.joins.list({ status: 'proposed' })[0]?.parameters as typeof parameters;
  c.close();
}
const spacing = parameters?.sampling?.spacing ?? Number(process.env.KNITBONE_STUDY_SPACING ?? 1.05);

interface Side { breakArea: number; coveredArea: number; bestShare: number; faces: number; fragmentArea: number; reached: boolean;
  /** The whole face that holds most of the break: its area, and the shares of it on this break, on other breaks and on original surface. */
  host?: { area: number; here: number; otherBreaks: number; original: number; mainOther: number };
  /** Area-weighted sum of the break's triangle normals (file frame). */
  normal: [number, number, number] }
/** Per fragment: break id -> area of the break, area of it in faces, best share of a face on it. */
const sides = new Map<string, Map<number, Side>>();

function study(f: TruthFragment): Map<number, Side> {
  const s = scanOf.get(f.catalogueNo);
  const out = new Map<number, Side>();
  if (!s) return out;
  const cached = readFragment(cacheDirFor(catPath), fragmentKey(s.contentHash, s.units, (s.stats as { settings?: unknown }).settings, []));
  const mesh = parseMeshFile(readFileSync(join(genDir, 'scans', f.scanFile.split('/').pop()!)), f.scanFile).mesh;
  const labels = Buffer.from(f.triangleLabels, 'base64');
  const P = mesh.positions, T = mesh.triangles, nt = T.length / 3;
  const cents = new Float32Array(3 * nt), area = new Float64Array(nt);
  let fragmentArea = 0;
  for (let t = 0; t < nt; t++) {
    const a = 3 * T[3 * t], b = 3 * T[3 * t + 1], c = 3 * T[3 * t + 2];
    for (let k = 0; k < 3; k++) cents[3 * t + k] = (P[a + k] + P[b + k] + P[c + k]) / 3;
    const ux = P[b] - P[a], uy = P[b + 1] - P[a + 1], uz = P[b + 2] - P[a + 2];
    const vx = P[c] - P[a], vy = P[c + 1] - P[a + 1], vz = P[c + 2] - P[a + 2];
    area[t] = 0.5 * Math.hypot(uy * vz - uz * vy, uz * vx - ux * vz, ux * vy - uy * vx);
    fragmentArea += area[t];
    if (labels[t] >= 10) {
      const id = labels[t] - 10;
      const x = out.get(id) ?? { breakArea: 0, coveredArea: 0, bestShare: 0, faces: 0, fragmentArea: 0, reached: false, normal: [0, 0, 0] };
      x.breakArea += area[t];
      // (b - a) x (c - a) is twice the area along the normal
      x.normal[0] += 0.5 * (uy * vz - uz * vy); x.normal[1] += 0.5 * (uz * vx - ux * vz); x.normal[2] += 0.5 * (ux * vy - uy * vx);
      out.set(id, x);
    }
  }
  for (const x of out.values()) x.fragmentArea = fragmentArea;
  if (!cached) return out;
  const tree = new KdTree(cents, 3);
  const wp = cached.input.positions, wt = cached.input.triangles;
  for (const face of cached.input.faces) {
    if (!face.triangleIds) continue;
    const onBreak = new Map<number, number>();
    let faceArea = 0;
    for (const w of face.triangleIds) {
      const a = 3 * wt[3 * w], b = 3 * wt[3 * w + 1], c = 3 * wt[3 * w + 2];
      const q: [number, number, number] = [(wp[a] + wp[b] + wp[c]) / 3, (wp[a + 1] + wp[b + 1] + wp[c + 1]) / 3, (wp[a + 2] + wp[b + 2] + wp[c + 2]) / 3];
      const r = tree.nearestOne(q, 1);
      if (r.index < 0) continue;
      faceArea += area[r.index];
      if (labels[r.index] >= 10) onBreak.set(labels[r.index] - 10, (onBreak.get(labels[r.index] - 10) ?? 0) + area[r.index]);
    }
    let anyBreak = 0, mainOther = -1, mainOtherArea = 0;
    for (const [id, a] of onBreak) { anyBreak += a; if (a > mainOtherArea) { mainOtherArea = a; mainOther = id; } }
    for (const [id, a] of onBreak) {
      const x = out.get(id);
      if (!x) continue;
      if (!x.host || a > x.host.here * x.host.area) x.host = { area: faceArea, here: a / faceArea, otherBreaks: (anyBreak - a) / faceArea, original: (faceArea - anyBreak) / faceArea, mainOther };
      x.coveredArea += a;
      x.faces++;
      x.bestShare = Math.max(x.bestShare, faceArea > 0 ? a / faceArea : 0);
    }
  }
  // what the bench counts: any matched face, piece or patch (prepared-fragment.ts) with 30% of its samples on the break
  const studied = studyFromCache(genDir, f, { input: cached.input, axis: cached.summary.axis }, spacing);
  for (const [id, x] of out) x.reached = studied.faces.some((face) => (face.breaks[String(id)] ?? 0) >= 0.3);
  return out;
}

for (const f of truth.fragments) if (scanOf.has(f.catalogueNo) && existsSync(join(genDir, 'scans', f.scanFile.split('/').pop()!))) sides.set(f.catalogueNo, study(f));

/** The angle between this break's mean plane and the break that dominates its main face (degrees). */
function angleTo(s: Side, other: number, no: string): string {
  const o = sides.get(no)?.get(other);
  if (!o || o === s) return '';
  const n1 = Math.hypot(...s.normal), n2 = Math.hypot(...o.normal);
  const cos = (s.normal[0] * o.normal[0] + s.normal[1] * o.normal[1] + s.normal[2] * o.normal[2]) / (n1 * n2);
  return `; mean planes ${(Math.acos(Math.max(-1, Math.min(1, cos))) * 180 / Math.PI).toFixed(0)} deg from break ${other} (flatness ${(n1 / s.breakArea).toFixed(2)}/${(n2 / o.breakArea).toFixed(2)})`;
}
const classOf = (s: Side | undefined): string => (s?.reached ? 'ok' : !s || s.coveredArea < 0.3 * s.breakArea ? 'missed' : 'merged');
const eligible = truth.joins.filter((j) => j.type === 'conjoin' && j.survivingFraction >= 0.3 && sides.has(j.a) && sides.has(j.b));
const tally = new Map<string, number>();
const rows: string[] = [];
for (const j of eligible) {
  const sa = sides.get(j.a)!.get(j.breakId), sb = sides.get(j.b)!.get(j.breakId);
  const ca = classOf(sa), cb = classOf(sb);
  if (ca === 'ok' && cb === 'ok') continue;
  const worst = [ca, cb].includes('missed') ? 'missed' : 'merged';
  tally.set(worst, (tally.get(worst) ?? 0) + 1);
  const d = (s: Side | undefined, c: string, no: string): string => (s ? `${c.padEnd(6)} break ${s.breakArea.toFixed(0).padStart(5)} mm2 (${(100 * s.breakArea / s.fragmentArea).toFixed(0).padStart(2)}% of piece) in faces ${(100 * s.coveredArea / s.breakArea).toFixed(0).padStart(3)}%, best face share ${(100 * s.bestShare).toFixed(0).padStart(3)}%, ${s.faces} faces${s.host && c !== 'ok' ? `; its main face ${s.host.area.toFixed(0)} mm2: ${(100 * s.host.here).toFixed(0)}% this break, ${(100 * s.host.otherBreaks).toFixed(0)}% other breaks, ${(100 * s.host.original).toFixed(0)}% original${angleTo(s, s.host.mainOther, no)}` : ''}` : `${c} no break triangles`);
  rows.push(`${trueJoinKey(j).padEnd(22)} ${j.pattern.padEnd(12)} ${j.damaged ? 'damaged' : '       '} surv ${j.survivingFraction.toFixed(2)}\n    A ${j.a}: ${d(sa, ca, j.a)}\n    B ${j.b}: ${d(sb, cb, j.b)}`);
}
process.stdout.write(`${eligible.length} true joins; no face >= 30% on the break on some side: ${rows.length} (${[...tally].map(([k, v]) => `${k} ${v}`).join(', ')})\n`);
process.stdout.write(rows.join('\n') + '\n');
