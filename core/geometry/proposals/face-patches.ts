/**
 * Split a break face into patches where its surface turns sharply (design.md section 7, step 8:
 * a break surface may meet more than one partner). Segmentation often returns one connected
 * fracture face holding several breaks that meet at ridges; each break meets its own partner,
 * so each patch is matched on its own as well. Region growing over the face samples: samples
 * closer than 1.6 spacings are neighbours, normals are first averaged over 2.5 spacings, and a
 * neighbour joins a patch when the averaged normals differ by less than `angleDeg`.
 */
import { KdTree } from '../registration/nearest-neighbours';

export interface Patch {
  indices: number[];
}

/** The fewest samples a patch (or a face's corner piece, prepared-fragment.ts) is matched with. */
export const MIN_PATCH_SAMPLES = 40;

export function splitIntoPatches(points: Float32Array, normals: Float32Array, spacing: number, options: { angleDeg?: number; meanAngleDeg?: number; minShare?: number; minSamples?: number } = {}): Patch[] {
  const n = points.length / 3;
  const tree = new KdTree(points, 3);
  const smooth = new Float32Array(3 * n);
  const buf: number[] = [];
  const q = [0, 0, 0];
  for (let i = 0; i < n; i++) {
    q[0] = points[3 * i]; q[1] = points[3 * i + 1]; q[2] = points[3 * i + 2];
    tree.within(q, 2.5 * spacing, buf);
    let x = 0, y = 0, z = 0;
    for (const j of buf) { x += normals[3 * j]; y += normals[3 * j + 1]; z += normals[3 * j + 2]; }
    const l = Math.hypot(x, y, z) || 1;
    smooth[3 * i] = x / l; smooth[3 * i + 1] = y / l; smooth[3 * i + 2] = z / l;
  }
  const cos = Math.cos(((options.angleDeg ?? 20) * Math.PI) / 180);
  const cosMean = Math.cos(((options.meanAngleDeg ?? 40) * Math.PI) / 180);
  const label = new Int32Array(n).fill(-1);
  const patches: Patch[] = [];
  for (let s = 0; s < n; s++) {
    if (label[s] >= 0) continue;
    const id = patches.length;
    const members = [s];
    label[s] = id;
    let mx = smooth[3 * s], my = smooth[3 * s + 1], mz = smooth[3 * s + 2];
    for (let h = 0; h < members.length; h++) {
      const i = members[h];
      q[0] = points[3 * i]; q[1] = points[3 * i + 1]; q[2] = points[3 * i + 2];
      tree.within(q, 1.6 * spacing, buf);
      for (const j of buf) {
        if (label[j] >= 0) continue;
        const c = smooth[3 * i] * smooth[3 * j] + smooth[3 * i + 1] * smooth[3 * j + 1] + smooth[3 * i + 2] * smooth[3 * j + 2];
        if (c < cos) continue;
        // and stay within meanAngleDeg of the patch's mean normal, so a patch cannot creep round a ridge
        const ml = Math.hypot(mx, my, mz) || 1;
        if ((mx * smooth[3 * j] + my * smooth[3 * j + 1] + mz * smooth[3 * j + 2]) / ml < cosMean) continue;
        label[j] = id;
        members.push(j);
        mx += smooth[3 * j]; my += smooth[3 * j + 1]; mz += smooth[3 * j + 2];
      }
    }
    patches.push({ indices: members });
  }
  const minSamples = Math.max(options.minSamples ?? MIN_PATCH_SAMPLES, (options.minShare ?? 0.12) * n);
  return patches.filter((p) => p.indices.length >= minSamples).sort((a, b) => b.indices.length - a.indices.length);
}
