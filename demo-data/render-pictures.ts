/**
 * Render pictures of a generated assemblage so a person can see that the fragments look like
 * broken long bone: a row of single fragments as scanned, and one bone put back together from
 * its fragments with the true poses. three.js in headless Chromium (software WebGL).
 *
 *   npx tsx demo-data/render-pictures.ts <assemblage-dir> <out.png> [bone-id] [explode factor, 0 = closed]
 *
 * Fracture faces are drawn in a darker, warmer tone than the original bone surface; damage
 * scars in grey.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';
import { applyToPoint, invertRigid } from './pose';

interface TruthFragment {
  catalogueNo: string;
  scanFile: string;
  boneId: string;
  element: string;
  poseBoneToScan: number[];
  triangleLabels: string;
}

const [dir, out, wantBone, explode] = process.argv.slice(2);
const explodeFactor = explode === undefined ? 1 : Number(explode);
if (!dir || !out) {
  process.stderr.write('usage: tsx demo-data/render-pictures.ts <assemblage-dir> <out.png> [bone-id]\n');
  process.exit(2);
}
const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8')) as { fragments: TruthFragment[]; bones: Array<{ boneId: string; fragments: string[] }> };
const bone = truth.bones.find((b) => b.boneId === wantBone) ?? [...truth.bones].sort((a, b) => b.fragments.length - a.fragments.length)[0];
const members = truth.fragments.filter((f) => f.boneId === bone.boneId);
const singles = truth.fragments.filter((f) => f.boneId !== bone.boneId).slice(0, 4);

/** Read our own binary PLY (float xyz, uchar-int faces) into a flat triangle soup. */
function readScan(f: TruthFragment, toBone: boolean): { soup: Float32Array; labels: Uint8Array } {
  const buf = readFileSync(join(dir, f.scanFile));
  const end = buf.indexOf('end_header\n') + 'end_header\n'.length;
  const header = buf.subarray(0, end).toString('ascii');
  const nv = Number(/element vertex (\d+)/.exec(header)![1]);
  const nf = Number(/element face (\d+)/.exec(header)![1]);
  const inv = invertRigid(f.poseBoneToScan);
  const pos = new Float64Array(nv * 3);
  for (let i = 0; i < nv; i++) {
    const x = buf.readFloatLE(end + i * 12), y = buf.readFloatLE(end + i * 12 + 4), z = buf.readFloatLE(end + i * 12 + 8);
    const q = toBone ? applyToPoint(inv, x, y, z) : [x, y, z];
    pos.set(q, i * 3);
  }
  const labels = new Uint8Array(Buffer.from(f.triangleLabels, 'base64'));
  const soup = new Float32Array(nf * 9);
  let o = end + nv * 12;
  for (let t = 0; t < nf; t++) {
    for (let k = 0; k < 3; k++) {
      const v = buf.readInt32LE(o + 1 + k * 4);
      soup[t * 9 + k * 3] = pos[v * 3];
      soup[t * 9 + k * 3 + 1] = pos[v * 3 + 1];
      soup[t * 9 + k * 3 + 2] = pos[v * 3 + 2];
    }
    o += 13;
  }
  return { soup, labels };
}

// one binary blob (float soups, then label bytes) and a small index of where each item lies
const chunks: Buffer[] = [];
let offset = 0;
const index = { singles: [] as object[], bone: [] as object[] };
for (const [group, list, toBone] of [['singles', singles, false], ['bone', members, true]] as const) {
  for (const f of list) {
    const { soup, labels } = readScan(f, toBone);
    const soupAt = offset;
    chunks.push(Buffer.from(soup.buffer, soup.byteOffset, soup.byteLength));
    offset += soup.byteLength;
    const labelsAt = offset;
    const padded = Buffer.alloc(Math.ceil(labels.length / 4) * 4);
    padded.set(labels);
    chunks.push(padded);
    offset += padded.length;
    index[group].push({ name: f.catalogueNo, soupAt, labelsAt, triangles: labels.length });
  }
}
const blob = Buffer.concat(chunks);

const here = dirname(fileURLToPath(import.meta.url));
const threeDir = join(here, '..', 'node_modules', 'three', 'build');
const page = `<!doctype html><html><body style="margin:0;background:#f4f1ea">
<canvas id="c" width="1600" height="900"></canvas>
<script type="importmap">{"imports":{"three":"http://render.local/three.module.js"}}</script>
<script type="module">
import * as THREE from 'three';
const EXPLODE_SIDE = ${0.9 * explodeFactor};
const EXPLODE_ALONG = ${0.12 * explodeFactor};
const index = await (await fetch('http://render.local/scene.json')).json();
const blob = await (await fetch('http://render.local/scene.bin')).arrayBuffer();
const unpack = (e) => ({ soup: new Float32Array(blob, e.soupAt, e.triangles * 9), labels: new Uint8Array(blob, e.labelsAt, e.triangles) });
const data = { singles: index.singles.map(unpack), bone: index.bone.map(unpack) };
const renderer = new THREE.WebGLRenderer({ canvas: document.getElementById('c'), antialias: true });
renderer.setClearColor(0xf4f1ea);
const scene = new THREE.Scene();
scene.add(new THREE.HemisphereLight(0xffffff, 0x8a7a66, 1.6));
const sun = new THREE.DirectionalLight(0xffffff, 2.2); sun.position.set(0.6, 1, 1.4); scene.add(sun);
const colours = { 0: [0.86, 0.80, 0.68], 1: [0.62, 0.48, 0.36], 2: [0.55, 0.55, 0.55] };
function meshOf(item, fractureTone) {
  const g = new THREE.BufferGeometry();
  g.setAttribute('position', new THREE.BufferAttribute(item.soup, 3));
  const col = new Float32Array(item.soup.length);
  for (let t = 0; t < item.labels.length; t++) {
    const l = item.labels[t];
    const c = l >= 10 ? fractureTone : colours[l];
    for (let k = 0; k < 3; k++) col.set(c, (t * 3 + k) * 3);
  }
  g.setAttribute('color', new THREE.BufferAttribute(col, 3));
  g.computeVertexNormals();
  return new THREE.Mesh(g, new THREE.MeshStandardMaterial({ vertexColors: true, roughness: 0.85, flatShading: false }));
}
// the reassembled bone, lying along x at the top
const boneGroup = new THREE.Group();
const tones = [[0.74, 0.45, 0.30], [0.66, 0.38, 0.26], [0.78, 0.52, 0.34]];
const boneMeshes = data.bone.map((item, i) => meshOf(item, tones[i % tones.length]));
// pull the pieces a little apart (sideways from the shaft axis, a little along it) so the breaks show
const all = new THREE.Box3();
boneMeshes.forEach((m) => all.expandByObject(m));
const mid = all.getCenter(new THREE.Vector3());
for (const m of boneMeshes) {
  const c = new THREE.Box3().setFromObject(m).getCenter(new THREE.Vector3()).sub(mid);
  m.position.set(c.x * EXPLODE_SIDE, c.y * EXPLODE_SIDE, c.z * EXPLODE_ALONG);
  boneGroup.add(m);
}
boneGroup.rotation.set(0, Math.PI / 2, 0);
boneGroup.rotateX(-0.35);
scene.add(boneGroup);
const bb = new THREE.Box3().setFromObject(boneGroup);
const bc = bb.getCenter(new THREE.Vector3());
boneGroup.position.sub(bc);
const boneLen = bb.getSize(new THREE.Vector3()).length();
boneGroup.scale.setScalar(300 / boneLen);
boneGroup.position.multiplyScalar(300 / boneLen);
boneGroup.position.y += 70;
// single fragments, as scanned, along the bottom
data.singles.forEach((item, i) => {
  const m = meshOf(item, [0.74, 0.45, 0.30]);
  const b = new THREE.Box3().setFromObject(m);
  const s = 70 / b.getSize(new THREE.Vector3()).length();
  m.scale.setScalar(s);
  m.position.copy(b.getCenter(new THREE.Vector3()).multiplyScalar(-s));
  const holder = new THREE.Group(); holder.add(m);
  holder.position.set(-135 + i * 90, -70, 0);
  scene.add(holder);
});
const camera = new THREE.PerspectiveCamera(30, 1600 / 900, 1, 5000);
camera.position.set(0, 0, 520);
camera.lookAt(0, 0, 0);
renderer.render(scene, camera);
document.title = 'done';
</script></body></html>`;

const profile = mkdtempSync(join(tmpdir(), 'knitbone-render-'));
const context = await chromium.launchPersistentContext(profile, {
  executablePath: '/usr/bin/chromium',
  headless: true,
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  viewport: { width: 1600, height: 900 },
});
try {
  await context.route('http://render.local/**', async (route) => {
    const name = new URL(route.request().url()).pathname.slice(1);
    if (name === 'scene.json') return route.fulfill({ contentType: 'application/json', body: JSON.stringify(index) });
    if (name === 'scene.bin') return route.fulfill({ contentType: 'application/octet-stream', body: blob });
    if (name === 'index.html') return route.fulfill({ contentType: 'text/html', body: page });
    return route.fulfill({ contentType: 'text/javascript', body: readFileSync(join(threeDir, name)) });
  });
  const tab = await context.newPage();
  tab.on('pageerror', (e) => process.stderr.write(`page error: ${e.message}\n`));
  await tab.goto('http://render.local/index.html');
  await tab.waitForFunction(() => document.title === 'done', undefined, { timeout: 120_000 });
  await tab.screenshot({ path: out });
  process.stderr.write(`wrote ${out}: bone ${bone.boneId} (${members.length} fragments) and ${singles.length} single fragments\n`);
} catch (err) {
  process.stderr.write(`render failed: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exitCode = 1;
} finally {
  await context.close().catch(() => {});
  rmSync(profile, { recursive: true, force: true });
}
