import type { BoneShape } from './bone-shape';
import { orientOutwards, type TriangleMesh } from './mesh';

/**
 * Closed meshes of a long bone in its bone frame: the outer (periosteal and articular)
 * surface, and the medullary cavity as a solid to be taken away from it. Both are rings of
 * vertices in planes z = const, closed by rounded caps that end in a pole vertex.
 */
export function boneOuterMesh(shape: BoneShape, resolution: number): TriangleMesh {
  const L = shape.length;
  const capP = shape.spec.proximal.cap;
  const capD = shape.spec.distal.cap;
  const rings: Ring[] = [];
  const maxR = shape.maxOuterRadius(0, L);
  // angular spacing set by the shaft; the wider ends get coarser rings (refined later)
  const m = Math.max(24, Math.ceil((2 * Math.PI * shape.shaftRadius(L / 2)) / resolution));
  const nCapP = Math.max(4, Math.ceil(((Math.PI / 2) * Math.max(capP, maxR * 0.6)) / resolution));
  for (let i = nCapP - 1; i >= 1; i--) {
    const a = ((Math.PI / 2) * i) / nCapP;
    rings.push({ z: -capP * Math.sin(a), sampleZ: 0, scale: Math.cos(a) });
  }
  const nShaft = Math.ceil(L / resolution);
  for (let i = 0; i <= nShaft; i++) rings.push({ z: (L * i) / nShaft, sampleZ: (L * i) / nShaft, scale: 1 });
  const nCapD = Math.max(4, Math.ceil(((Math.PI / 2) * Math.max(capD, maxR * 0.6)) / resolution));
  for (let i = 1; i < nCapD; i++) {
    const a = ((Math.PI / 2) * i) / nCapD;
    rings.push({ z: L + capD * Math.sin(a), sampleZ: L, scale: Math.cos(a) });
  }
  const c0 = shape.center(0);
  const c1 = shape.center(L);
  return ringSurface(rings, m, (z, t) => shape.outerRadius(z, t), (z) => shape.center(z), [c0[0], c0[1], -capP], [c1[0], c1[1], L + capD]);
}

export function medullaryCavityMesh(shape: BoneShape, resolution: number): TriangleMesh {
  const z0 = shape.cavityStart;
  const z1 = shape.cavityEnd;
  const cap = shape.cavityCap;
  const m = Math.max(24, Math.ceil((2 * Math.PI * shape.minInnerRadius(z0, z1)) / resolution));
  const rings: Ring[] = [];
  const nCap = Math.max(4, Math.ceil(((Math.PI / 2) * cap) / resolution));
  for (let i = nCap - 1; i >= 1; i--) {
    const a = ((Math.PI / 2) * i) / nCap;
    const z = z0 - cap * Math.sin(a);
    rings.push({ z, sampleZ: z0, scale: Math.cos(a) });
  }
  const n = Math.ceil((z1 - z0) / resolution);
  for (let i = 0; i <= n; i++) {
    const z = z0 + ((z1 - z0) * i) / n;
    rings.push({ z, sampleZ: z, scale: 1 });
  }
  for (let i = 1; i < nCap; i++) {
    const a = ((Math.PI / 2) * i) / nCap;
    rings.push({ z: z1 + cap * Math.sin(a), sampleZ: z1, scale: Math.cos(a) });
  }
  const p0 = shape.center(z0 - cap);
  const p1 = shape.center(z1 + cap);
  return ringSurface(
    rings,
    m,
    (z, t) => shape.innerRadius(z, t),
    (z) => shape.center(z),
    [p0[0], p0[1], z0 - cap],
    [p1[0], p1[1], z1 + cap],
  );
}

interface Ring {
  /** Height of the ring. */
  z: number;
  /** Height at which the radius is sampled (caps reuse the end's outline, scaled). */
  sampleZ: number;
  scale: number;
}

function ringSurface(
  rings: Ring[],
  m: number,
  radius: (z: number, theta: number) => number,
  center: (z: number) => [number, number],
  pole0: [number, number, number],
  pole1: [number, number, number],
): TriangleMesh {
  const n = rings.length;
  const positions = new Float32Array((n * m + 2) * 3);
  for (let i = 0; i < n; i++) {
    const r = rings[i];
    const [cx, cy] = center(r.z);
    for (let j = 0; j < m; j++) {
      const th = (2 * Math.PI * j) / m;
      const rad = radius(r.sampleZ, th) * r.scale;
      const o = (i * m + j) * 3;
      positions[o] = cx + rad * Math.cos(th);
      positions[o + 1] = cy + rad * Math.sin(th);
      positions[o + 2] = r.z;
    }
  }
  const p0 = n * m;
  const p1 = n * m + 1;
  positions.set(pole0, p0 * 3);
  positions.set(pole1, p1 * 3);
  const triangles = new Uint32Array(((n - 1) * m * 2 + 2 * m) * 3);
  let k = 0;
  for (let i = 0; i < n - 1; i++) {
    for (let j = 0; j < m; j++) {
      const a = i * m + j;
      const b = i * m + ((j + 1) % m);
      const c = (i + 1) * m + ((j + 1) % m);
      const d = (i + 1) * m + j;
      triangles[k++] = a; triangles[k++] = b; triangles[k++] = c;
      triangles[k++] = a; triangles[k++] = c; triangles[k++] = d;
    }
  }
  for (let j = 0; j < m; j++) {
    const a = j;
    const b = (j + 1) % m;
    triangles[k++] = p0; triangles[k++] = b; triangles[k++] = a;
    const c = (n - 1) * m + j;
    const d = (n - 1) * m + ((j + 1) % m);
    triangles[k++] = c; triangles[k++] = d; triangles[k++] = p1;
  }
  return orientOutwards({ positions, triangles });
}
