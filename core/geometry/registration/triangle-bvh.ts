/**
 * Closest point on a triangle mesh: a bounding volume hierarchy over the triangles (median
 * split of triangle centroids along the widest axis, axis-aligned boxes), searched nearest box
 * first and pruned by the best distance found so far; the closest point on each triangle by
 * Ericson's Voronoi-region test (Real-Time Collision Detection, 2005, section 5.1.5). Exact,
 * like three-mesh-bvh's closestPointToPoint (tests/unit/geometry/registration/triangle-bvh.test.ts
 * compares the two), but on flat typed arrays (float32 corners, as scans are stored) with no
 * objects made per query: ICP and the join score ask it thousands of times per motion.
 */
const LEAF = 8;

export interface TriangleHit {
  x: number;
  y: number;
  z: number;
  /** Index of the triangle in the mesh's own numbering. */
  triangle: number;
  distance: number;
}

export class TriangleBvh {
  /** Per node: box min xyz, max xyz. */
  private readonly box: Float32Array;
  /** Per node: first child (the second is first + 1), or -1 for a leaf. */
  private readonly child: Int32Array;
  /** Per node: range [start, end) in `order`. */
  private readonly start: Uint32Array;
  private readonly end: Uint32Array;
  /** Triangle numbers in tree order, and their corners in that order (9 numbers each). */
  private readonly order: Uint32Array;
  private readonly corners: Float32Array;
  private readonly stack: Int32Array;
  /** Box distance of each node on the stack, beside it. */
  private readonly stackDist: Float64Array;
  private nodes = 0;

  /**
   * `order` (optional): the triangle order of a tree built before from the same mesh
   * (`triangleOrder`); the nodes are then laid out as the build lays them out (a node's split
   * depends only on how many triangles it holds) without sorting any centroid: the same tree,
   * array for array, for a fraction of the time.
   */
  constructor(positions: ArrayLike<number>, triangles: ArrayLike<number>, order?: Uint32Array) {
    const nt = Math.floor(triangles.length / 3);
    const given = order !== undefined && isPermutation(order, nt);
    // triangle centroids, one array per coordinate, kept in the order of `order` (the selection
    // below swaps them with it): the same comparisons of the same values as reading them through
    // `order`, so the same tree, but read in sequence instead of all over memory (the build costs
    // about a third as much; a propose worker builds every fragment's tree)
    const cx = new Float64Array(given ? 0 : nt), cy = new Float64Array(given ? 0 : nt), cz = new Float64Array(given ? 0 : nt);
    for (let t = 0; !given && t < nt; t++) {
      const a = 3 * triangles[3 * t], b = 3 * triangles[3 * t + 1], c = 3 * triangles[3 * t + 2];
      cx[t] = (positions[a] + positions[b] + positions[c]) / 3;
      cy[t] = (positions[a + 1] + positions[b + 1] + positions[c + 1]) / 3;
      cz[t] = (positions[a + 2] + positions[b + 2] + positions[c + 2]) / 3;
    }
    this.order = given ? Uint32Array.from(order) : new Uint32Array(nt);
    for (let t = 0; !given && t < nt; t++) this.order[t] = t;
    const maxNodes = Math.max(1, 2 * Math.ceil(nt / (LEAF / 2)) + 1);
    this.box = new Float32Array(6 * maxNodes);
    this.child = new Int32Array(maxNodes).fill(-1);
    this.start = new Uint32Array(maxNodes);
    this.end = new Uint32Array(maxNodes);
    this.stack = new Int32Array(2 * maxNodes + 8);
    this.stackDist = new Float64Array(2 * maxNodes + 8);
    // build (explicit stack of nodes to split)
    const todo: number[] = [];
    this.nodes = 1;
    this.start[0] = 0;
    this.end[0] = nt;
    todo.push(0);
    while (todo.length) {
      const node = todo.pop()!;
      const s = this.start[node], e = this.end[node];
      if (e - s <= LEAF) continue;
      const mid = (s + e) >> 1;
      if (!given) splitAtMedian(this.order, cx, cy, cz, s, e, mid);
      const a = this.nodes, b = this.nodes + 1;
      this.nodes += 2;
      this.child[node] = a;
      this.start[a] = s; this.end[a] = mid;
      this.start[b] = mid; this.end[b] = e;
      todo.push(a, b);
    }
    // corners in tree order, and boxes bottom-up (children always come after their parent)
    this.corners = new Float32Array(9 * nt);
    for (let i = 0; i < nt; i++) {
      const t = this.order[i];
      for (let v = 0; v < 3; v++) for (let k = 0; k < 3; k++) this.corners[9 * i + 3 * v + k] = positions[3 * triangles[3 * t + v] + k];
    }
    this.fillBoxes();
  }

  /** Triangle numbers in tree order: enough, with the same mesh, to build this tree again without sorting (constructor's `order`). */
  get triangleOrder(): Uint32Array {
    return this.order;
  }

  private fillBoxes(): void {
    for (let node = this.nodes - 1; node >= 0; node--) {
      const o = 6 * node;
      const c = this.child[node];
      if (c < 0) {
        this.box[o] = this.box[o + 1] = this.box[o + 2] = Infinity;
        this.box[o + 3] = this.box[o + 4] = this.box[o + 5] = -Infinity;
        for (let i = 9 * this.start[node]; i < 9 * this.end[node]; i += 3) {
          for (let k = 0; k < 3; k++) {
            const v = this.corners[i + k];
            if (v < this.box[o + k]) this.box[o + k] = v;
            if (v > this.box[o + 3 + k]) this.box[o + 3 + k] = v;
          }
        }
      } else {
        for (let k = 0; k < 3; k++) {
          this.box[o + k] = Math.min(this.box[6 * c + k], this.box[6 * (c + 1) + k]);
          this.box[o + 3 + k] = Math.max(this.box[6 * c + 3 + k], this.box[6 * (c + 1) + 3 + k]);
        }
      }
    }
  }
  private boxDist2(node: number, x: number, y: number, z: number): number {
    const o = 6 * node, b = this.box;
    const dx = x < b[o] ? b[o] - x : x > b[o + 3] ? x - b[o + 3] : 0;
    const dy = y < b[o + 1] ? b[o + 1] - y : y > b[o + 4] ? y - b[o + 4] : 0;
    const dz = z < b[o + 2] ? b[o + 2] - z : z > b[o + 5] ? z - b[o + 5] : 0;
    return dx * dx + dy * dy + dz * dz;
  }

  /** The closest point of the mesh to (x, y, z) within maxDistance, written into `out`; false when none. */
  closest(x: number, y: number, z: number, maxDistance: number, out: TriangleHit): boolean {
    if (this.order.length === 0) return false;
    let best2 = maxDistance === Infinity ? Infinity : maxDistance * maxDistance;
    let bestI = -1, bx = 0, by = 0, bz = 0;
    const st = this.stack, C = this.corners;
    const sd = this.stackDist;
    let sp = 0;
    const d00 = this.boxDist2(0, x, y, z);
    if (d00 > best2) return false;
    st[sp] = 0;
    sd[sp++] = d00;
    while (sp > 0) {
      // each node's box distance was worked out when it was pushed
      const node = st[--sp];
      if (sd[sp] > best2) continue;
      const c = this.child[node];
      if (c >= 0) {
        const d0 = this.boxDist2(c, x, y, z), d1 = this.boxDist2(c + 1, x, y, z);
        // the nearer child is searched first (pushed last)
        if (d0 <= d1) {
          if (d1 <= best2) { st[sp] = c + 1; sd[sp++] = d1; }
          if (d0 <= best2) { st[sp] = c; sd[sp++] = d0; }
        } else {
          if (d0 <= best2) { st[sp] = c; sd[sp++] = d0; }
          if (d1 <= best2) { st[sp] = c + 1; sd[sp++] = d1; }
        }
        continue;
      }
      for (let i = this.start[node]; i < this.end[node]; i++) {
        const o = 9 * i;
        const ax = C[o], ay = C[o + 1], az = C[o + 2];
        const abx = C[o + 3] - ax, aby = C[o + 4] - ay, abz = C[o + 5] - az;
        const acx = C[o + 6] - ax, acy = C[o + 7] - ay, acz = C[o + 8] - az;
        const apx = x - ax, apy = y - ay, apz = z - az;
        // Ericson 2005, ClosestPtPointTriangle: which Voronoi region of the triangle holds p
        let px: number, py: number, pz: number;
        const d1 = abx * apx + aby * apy + abz * apz, d2 = acx * apx + acy * apy + acz * apz;
        if (d1 <= 0 && d2 <= 0) {
          px = ax; py = ay; pz = az;
        } else {
          const bpx = x - C[o + 3], bpy = y - C[o + 4], bpz = z - C[o + 5];
          const d3 = abx * bpx + aby * bpy + abz * bpz, d4 = acx * bpx + acy * bpy + acz * bpz;
          if (d3 >= 0 && d4 <= d3) {
            px = C[o + 3]; py = C[o + 4]; pz = C[o + 5];
          } else {
            const vc = d1 * d4 - d3 * d2;
            if (vc <= 0 && d1 >= 0 && d3 <= 0) {
              const v = d1 / (d1 - d3);
              px = ax + v * abx; py = ay + v * aby; pz = az + v * abz;
            } else {
              const cpx = x - C[o + 6], cpy = y - C[o + 7], cpz = z - C[o + 8];
              const d5 = abx * cpx + aby * cpy + abz * cpz, d6 = acx * cpx + acy * cpy + acz * cpz;
              if (d6 >= 0 && d5 <= d6) {
                px = C[o + 6]; py = C[o + 7]; pz = C[o + 8];
              } else {
                const vb = d5 * d2 - d1 * d6;
                if (vb <= 0 && d2 >= 0 && d6 <= 0) {
                  const w = d2 / (d2 - d6);
                  px = ax + w * acx; py = ay + w * acy; pz = az + w * acz;
                } else {
                  const va = d3 * d6 - d5 * d4;
                  if (va <= 0 && d4 - d3 >= 0 && d5 - d6 >= 0) {
                    const w = (d4 - d3) / (d4 - d3 + (d5 - d6));
                    px = C[o + 3] + w * (C[o + 6] - C[o + 3]); py = C[o + 4] + w * (C[o + 7] - C[o + 4]); pz = C[o + 5] + w * (C[o + 8] - C[o + 5]);
                  } else {
                    const sum = va + vb + vc;
                    if (!(sum > 0)) {
                      px = ax; py = ay; pz = az;
                    } else {
                      const v = vb / sum, w = vc / sum;
                      px = ax + abx * v + acx * w; py = ay + aby * v + acy * w; pz = az + abz * v + acz * w;
                    }
                  }
                }
              }
            }
          }
        }
        const dx = x - px, dy = y - py, dz = z - pz;
        const d = dx * dx + dy * dy + dz * dz;
        if (d < best2 || (d === best2 && bestI < 0)) {
          best2 = d;
          bestI = i;
          bx = px; by = py; bz = pz;
        }
      }
    }
    if (bestI < 0) return false;
    out.x = bx; out.y = by; out.z = bz;
    out.triangle = this.order[bestI];
    out.distance = Math.sqrt(best2);
    return true;
  }
}

/**
 * Quickselect: order[k] gets the triangle whose centroid is k-th along the axis whose
 * coordinates are `key` (one of cx, cy, cz), within [lo, hi]; the three coordinate arrays move
 * with `order` (Hoare's partition about the middle element, as on the centroids read through
 * `order`: the same swaps).
 */
function select(order: Uint32Array, key: Float64Array, cx: Float64Array, cy: Float64Array, cz: Float64Array, lo: number, hi: number, k: number): void {
  while (hi > lo) {
    const pivot = key[(lo + hi) >> 1];
    let i = lo, j = hi;
    while (i <= j) {
      while (key[i] < pivot) i++;
      while (key[j] > pivot) j--;
      if (i <= j) {
        const t = order[i]; order[i] = order[j]; order[j] = t;
        const x = cx[i]; cx[i] = cx[j]; cx[j] = x;
        const y = cy[i]; cy[i] = cy[j]; cy[j] = y;
        const z = cz[i]; cz[i] = cz[j]; cz[j] = z;
        i++; j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return;
  }
}

/** The build's split of node [s, e): the centroids' widest axis, the median by quickselect (order and centroids move together). */
function splitAtMedian(order: Uint32Array, cx: Float64Array, cy: Float64Array, cz: Float64Array, s: number, e: number, mid: number): void {
  let lo0 = Infinity, lo1 = Infinity, lo2 = Infinity, hi0 = -Infinity, hi1 = -Infinity, hi2 = -Infinity;
  for (let i = s; i < e; i++) {
    const x = cx[i], y = cy[i], z = cz[i];
    if (x < lo0) lo0 = x;
    if (x > hi0) hi0 = x;
    if (y < lo1) lo1 = y;
    if (y > hi1) hi1 = y;
    if (z < lo2) lo2 = z;
    if (z > hi2) hi2 = z;
  }
  const w0 = hi0 - lo0, w1 = hi1 - lo1, w2 = hi2 - lo2;
  const axis = w0 >= w1 && w0 >= w2 ? 0 : w1 >= w2 ? 1 : 2;
  select(order, axis === 0 ? cx : axis === 1 ? cy : cz, cx, cy, cz, s, e - 1, mid);
}

/** Whether `order` holds each of 0..n-1 once (a stored order that does not fit the mesh is ignored). */
function isPermutation(order: Uint32Array, n: number): boolean {
  if (order.length !== n) return false;
  const seen = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const t = order[i];
    if (t >= n || seen[t]) return false;
    seen[t] = 1;
  }
  return true;
}
