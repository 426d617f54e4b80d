import { type LabelledMesh, triangleArea } from './labelled-mesh';

/**
 * Area (mm²) of A's face of one break that lies on B's face of the same break, before any
 * resampling: both sides come from one boolean split, so their shared vertices are identical
 * and a triangle of A whose three corners are all corners of B's face lies on B's face.
 */
export function contactArea(a: LabelledMesh, b: LabelledMesh, label: number): number {
  const corners = new VertexSet();
  const bits = new Uint32Array(b.positions.buffer, b.positions.byteOffset, b.positions.length);
  for (let t = 0; t < b.labels.length; t++) {
    if (b.labels[t] !== label) continue;
    for (let k = 0; k < 3; k++) corners.add(bits, b.triangles[t * 3 + k]);
  }
  if (corners.size === 0) return 0;
  let area = 0;
  const abits = new Uint32Array(a.positions.buffer, a.positions.byteOffset, a.positions.length);
  const ta = a.triangles;
  for (let t = 0; t < a.labels.length; t++) {
    if (a.labels[t] !== label) continue;
    if (corners.has(abits, ta[t * 3]) && corners.has(abits, ta[t * 3 + 1]) && corners.has(abits, ta[t * 3 + 2])) {
      area += triangleArea(a.positions, ta, t);
    }
  }
  return area;
}

/** Area (mm²) of the triangles with a given label. */
export function labelArea(m: LabelledMesh, label: number): number {
  let area = 0;
  for (let t = 0; t < m.labels.length; t++) if (m.labels[t] === label) area += triangleArea(m.positions, m.triangles, t);
  return area;
}

/** A set of exact vertex positions (the bit patterns of x, y, z), open addressing. */
class VertexSet {
  private keys = new Uint32Array(3 * 1024);
  private used = new Uint8Array(1024);
  size = 0;

  add(bits: Uint32Array, v: number): void {
    if ((this.size + 1) * 2 > this.used.length) this.grow();
    const x = bits[v * 3], y = bits[v * 3 + 1], z = bits[v * 3 + 2];
    const mask = this.used.length - 1;
    for (let i = hash(x, y, z) & mask; ; i = (i + 1) & mask) {
      if (!this.used[i]) {
        this.used[i] = 1;
        this.keys[i * 3] = x;
        this.keys[i * 3 + 1] = y;
        this.keys[i * 3 + 2] = z;
        this.size++;
        return;
      }
      if (this.keys[i * 3] === x && this.keys[i * 3 + 1] === y && this.keys[i * 3 + 2] === z) return;
    }
  }

  has(bits: Uint32Array, v: number): boolean {
    const x = bits[v * 3], y = bits[v * 3 + 1], z = bits[v * 3 + 2];
    const mask = this.used.length - 1;
    for (let i = hash(x, y, z) & mask; ; i = (i + 1) & mask) {
      if (!this.used[i]) return false;
      if (this.keys[i * 3] === x && this.keys[i * 3 + 1] === y && this.keys[i * 3 + 2] === z) return true;
    }
  }

  private grow(): void {
    const oldKeys = this.keys;
    const oldUsed = this.used;
    this.keys = new Uint32Array(oldKeys.length * 2);
    this.used = new Uint8Array(oldUsed.length * 2);
    this.size = 0;
    for (let i = 0; i < oldUsed.length; i++) if (oldUsed[i]) this.add(oldKeys, i);
  }
}

function hash(x: number, y: number, z: number): number {
  let h = Math.imul(x ^ 0x9e3779b9, 0x85ebca6b);
  h = Math.imul(h ^ y ^ (h >>> 13), 0xc2b2ae35);
  h = Math.imul(h ^ z ^ (h >>> 16), 0x27d4eb2f);
  return (h ^ (h >>> 15)) >>> 0;
}
