import { BufferAttribute, BufferGeometry, Color, Matrix4, SRGBColorSpace, Vector3 } from 'three';
import { MeshBVH } from 'three-mesh-bvh';
import { classColour, gapColour, SURFACE } from './colours';
import type { MeshView } from './mesh-payload';

/** Scratch colour for the sRGB -> linear conversion of vertex colours. */
const sharedColour = new Color();

/** A 4x4 row-major rigid transform (design convention) as a three.js matrix. */
export function matrixFromRowMajor(m: readonly number[] | null | undefined): Matrix4 {
  const out = new Matrix4();
  if (m && m.length === 16) out.set(m[0], m[1], m[2], m[3], m[4], m[5], m[6], m[7], m[8], m[9], m[10], m[11], m[12], m[13], m[14], m[15]);
  return out;
}

/** Smooth per-vertex normals of an indexed mesh. */
function vertexNormals(mesh: MeshView): Float32Array {
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(mesh.positions, 3));
  g.setIndex(new BufferAttribute(mesh.triangles, 1));
  g.computeVertexNormals();
  const n = (g.getAttribute('normal') as BufferAttribute).array as Float32Array;
  g.dispose();
  return n;
}

export interface Colouring {
  base: readonly number[];
  /** Fracture faces in their own colour. */
  fractures: boolean;
  /** Every region in the colour of its surface class (needs the mesh's region labels). */
  byClass?: boolean;
  /** The region drawn in the selection colour. */
  selectedRegion?: number | null;
  /** Per-vertex distance (mm) to the partner's surface, for the contact-gap map. */
  gaps?: Float32Array | null;
}

/**
 * An indexed geometry with smooth normals, coloured by surface class, the selected region,
 * or the contact gap. A vertex is shared by every triangle of the same colour around it and
 * copied only where colours meet, so colours stay exact while the GPU (software WebGL on
 * most test machines) transforms about one vertex per two triangles instead of three per
 * triangle. Triangle order is kept: a picked triangle index is a triangle of `mesh`.
 */
export function buildGeometry(mesh: MeshView, colouring: Colouring): BufferGeometry {
  const tris = mesh.triangles.length / 3;
  const vertices = mesh.positions.length / 3;
  const normals = vertexNormals(mesh);
  const faceKinds = new Map(mesh.faces.map((f) => [f.id, f.kind]));
  const regionColours = new Map(mesh.regions.map((r) => [r.id, classColour(r.surfaceClass, colouring.base)]));
  const byClass = colouring.byClass === true && mesh.triangleRegions !== null;
  const selectedRegion = colouring.selectedRegion ?? null;
  // Palette of triangle colours (a handful), so a corner is known by (vertex, palette entry).
  const palette: Array<readonly number[]> = [];
  const paletteIndex = new Map<readonly number[], number>();
  const colourOf = (c: readonly number[]): number => {
    let i = paletteIndex.get(c);
    if (i === undefined) {
      i = palette.length;
      palette.push(c);
      paletteIndex.set(c, i);
    }
    return i;
  };
  const firstCopy = new Int32Array(vertices).fill(-1);
  const firstColour = new Int32Array(vertices);
  const otherCopies = new Map<number, number>();
  const pos = new Float32Array(tris * 9);
  const nor = new Float32Array(tris * 9);
  const col = new Float32Array(tris * 9);
  const index = new Uint32Array(tris * 3);
  let used = 0;
  for (let t = 0; t < tris; t++) {
    const face = mesh.triangleFaces ? mesh.triangleFaces[t] : -1;
    const region = mesh.triangleRegions ? mesh.triangleRegions[t] : -1;
    let c: readonly number[] = colouring.base;
    if (selectedRegion !== null && region === selectedRegion) c = SURFACE.selected;
    else if (byClass) c = regionColours.get(region) ?? colouring.base;
    else if (colouring.fractures && face >= 0 && faceKinds.get(face) === 'fracture') c = SURFACE.fracture;
    const p = colourOf(c);
    for (let k = 0; k < 3; k++) {
      const v = mesh.triangles[t * 3 + k];
      let copy: number | undefined;
      if (firstCopy[v] >= 0 && firstColour[v] === p) copy = firstCopy[v];
      else if (firstCopy[v] >= 0) copy = otherCopies.get(v * 64 + p);
      if (copy === undefined) {
        copy = used++;
        if (firstCopy[v] < 0) {
          firstCopy[v] = copy;
          firstColour[v] = p;
        } else otherCopies.set(v * 64 + p, copy);
        const o = copy * 3;
        pos[o] = mesh.positions[v * 3];
        pos[o + 1] = mesh.positions[v * 3 + 1];
        pos[o + 2] = mesh.positions[v * 3 + 2];
        nor[o] = normals[v * 3];
        nor[o + 1] = normals[v * 3 + 1];
        nor[o + 2] = normals[v * 3 + 2];
        const cc = colouring.gaps ? gapColour(colouring.gaps[v], c) : c;
        // The palette is written in sRGB (as the legend swatches are); three.js expects vertex
        // colours in its linear working space, so convert or the lit surface reads paler.
        sharedColour.setRGB(cc[0], cc[1], cc[2], SRGBColorSpace);
        col[o] = sharedColour.r;
        col[o + 1] = sharedColour.g;
        col[o + 2] = sharedColour.b;
      }
      index[t * 3 + k] = copy;
    }
  }
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(pos.slice(0, used * 3), 3));
  g.setAttribute('normal', new BufferAttribute(nor.slice(0, used * 3), 3));
  g.setAttribute('color', new BufferAttribute(col.slice(0, used * 3), 3));
  g.setIndex(new BufferAttribute(index, 1));
  g.computeBoundingSphere();
  return g;
}

/**
 * For every vertex of `moving` (placed by `movingMatrix`), the distance in mm to the
 * surface of `fixed` (placed by `fixedMatrix`), through a bounding-volume hierarchy.
 * Distances beyond `limit` are reported as `limit`.
 */
export function contactGaps(fixed: MeshView, fixedMatrix: Matrix4, moving: MeshView, movingMatrix: Matrix4, limit = 5): Float32Array {
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(fixed.positions, 3));
  g.setIndex(new BufferAttribute(fixed.triangles, 1));
  const bvh = new MeshBVH(g);
  const toFixed = new Matrix4().copy(fixedMatrix).invert().multiply(movingMatrix);
  const out = new Float32Array(moving.positions.length / 3);
  const p = new Vector3();
  const target = { point: new Vector3(), distance: 0, faceIndex: 0 };
  for (let i = 0; i < out.length; i++) {
    p.set(moving.positions[i * 3], moving.positions[i * 3 + 1], moving.positions[i * 3 + 2]).applyMatrix4(toFixed);
    const hit = bvh.closestPointToPoint(p, target as never, 0, limit);
    out[i] = hit ? hit.distance : limit;
  }
  g.dispose();
  return out;
}
