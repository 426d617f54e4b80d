/**
 * A k-d tree over points of any dimension (3 for surface samples, more for descriptors):
 * k nearest neighbours and fixed-radius search (Friedman, Bentley & Finkel 1977).
 * Built once over a packed array; nodes are implicit (median split over a permutation).
 */
export class KdTree {
  readonly dim: number;
  readonly count: number;
  private readonly data: ArrayLike<number>;
  private readonly order: Uint32Array;
  /** For node covering order[lo, hi): split dimension stored at mid index. */
  private readonly splitDim: Uint8Array;
  private static readonly LEAF = 8;

  constructor(data: ArrayLike<number>, dim: number) {
    this.dim = dim;
    this.data = data;
    this.count = Math.floor(data.length / dim);
    this.order = new Uint32Array(this.count);
    for (let i = 0; i < this.count; i++) this.order[i] = i;
    this.splitDim = new Uint8Array(this.count);
    if (this.count > 0) this.build(0, this.count);
    if (dim === 3) {
      // points in tree order, as doubles: the nearest-one search of 3-d samples reads them in
      // place of the generic layout (same traversal and arithmetic, so the same answers)
      this.points3 = new Float64Array(3 * this.count);
      for (let k = 0; k < this.count; k++) for (let d = 0; d < 3; d++) this.points3[3 * k + d] = data[this.order[k] * 3 + d];
      // the points' bounding box: a query farther from it than its radius has no answer
      const box = this.box3;
      for (let k = 0; k < 3 * this.count; k += 3) for (let d = 0; d < 3; d++) {
        const v = this.points3[k + d];
        if (v < box[d]) box[d] = v;
        if (v > box[3 + d]) box[3 + d] = v;
      }
    }
  }

  private readonly box3 = Float64Array.of(Infinity, Infinity, Infinity, -Infinity, -Infinity, -Infinity);

  private readonly points3: Float64Array | undefined;

  private build(lo: number, hi: number): void {
    const stack: number[] = [lo, hi];
    while (stack.length) {
      const h = stack.pop()!, l = stack.pop()!;
      if (h - l <= KdTree.LEAF) continue;
      // split along the widest dimension of this node
      let bestDim = 0, bestSpread = -1;
      for (let d = 0; d < this.dim; d++) {
        let mn = Infinity, mx = -Infinity;
        for (let i = l; i < h; i++) {
          const v = this.data[this.order[i] * this.dim + d];
          if (v < mn) mn = v;
          if (v > mx) mx = v;
        }
        if (mx - mn > bestSpread) {
          bestSpread = mx - mn;
          bestDim = d;
        }
      }
      const mid = (l + h) >> 1;
      this.select(l, h - 1, mid, bestDim);
      this.splitDim[mid] = bestDim;
      stack.push(l, mid, mid + 1, h);
    }
  }

  /** Quickselect so that order[k] holds the k-th smallest along dimension d. */
  private select(lo: number, hi: number, k: number, d: number): void {
    const o = this.order, x = this.data, D = this.dim;
    while (hi > lo) {
      const pivot = x[o[(lo + hi) >> 1] * D + d];
      let i = lo, j = hi;
      while (i <= j) {
        while (x[o[i] * D + d] < pivot) i++;
        while (x[o[j] * D + d] > pivot) j--;
        if (i <= j) {
          const t = o[i]; o[i] = o[j]; o[j] = t;
          i++; j--;
        }
      }
      if (k <= j) hi = j;
      else if (k >= i) lo = i;
      else return;
    }
  }

  private dist2(q: ArrayLike<number>, idx: number): number {
    let s = 0;
    const base = idx * this.dim;
    for (let d = 0; d < this.dim; d++) {
      const t = q[d] - this.data[base + d];
      s += t * t;
    }
    return s;
  }

  /** The k nearest points to q: indices and squared distances, nearest first. */
  nearest(q: ArrayLike<number>, k: number, maxDist2 = Infinity): { indices: number[]; dist2: number[] } {
    if (this.count === 0 || k <= 0) return { indices: [], dist2: [] };
    if (this.kIdx.length < k) {
      this.kIdx = new Int32Array(k + 1);
      this.kDist = new Float64Array(k + 1);
    }
    this.kWant = k;
    this.kFound = 0;
    this.kMax = maxDist2;
    this.kWorst = maxDist2;
    this.visitK(q, 0, this.count);
    const m = this.kFound;
    const indices = new Array<number>(m), dist2 = new Array<number>(m);
    for (let i = 0; i < m; i++) {
      indices[i] = this.kIdx[i];
      dist2[i] = this.kDist[i];
    }
    return { indices, dist2 };
  }

  // state of one k-nearest query (a sorted list of the best so far, no allocation per query)
  private kIdx = new Int32Array(8);
  private kDist = new Float64Array(8);
  private kWant = 0;
  private kFound = 0;
  private kMax = Infinity;
  private kWorst = Infinity;

  private considerK(q: ArrayLike<number>, i: number): void {
    const d2 = this.dist2(q, i);
    if (d2 >= this.kWorst && this.kFound >= this.kWant) return;
    if (d2 > this.kMax) return;
    const dd = this.kDist, idx = this.kIdx;
    let pos = this.kFound;
    while (pos > 0 && dd[pos - 1] > d2) {
      dd[pos] = dd[pos - 1];
      idx[pos] = idx[pos - 1];
      pos--;
    }
    dd[pos] = d2;
    idx[pos] = i;
    if (this.kFound < this.kWant) this.kFound++;
    if (this.kFound === this.kWant) this.kWorst = Math.min(this.kMax, dd[this.kWant - 1]);
  }

  private visitK(q: ArrayLike<number>, lo: number, hi: number): void {
    if (hi - lo <= KdTree.LEAF) {
      for (let i = lo; i < hi; i++) this.considerK(q, this.order[i]);
      return;
    }
    const mid = (lo + hi) >> 1;
    const d = this.splitDim[mid];
    const p = this.order[mid];
    const diff = q[d] - this.data[p * this.dim + d];
    this.considerK(q, p);
    if (diff < 0) {
      this.visitK(q, lo, mid);
      if (diff * diff < this.kWorst) this.visitK(q, mid + 1, hi);
    } else {
      this.visitK(q, mid + 1, hi);
      if (diff * diff < this.kWorst) this.visitK(q, lo, mid);
    }
  }

  /** Index of the single nearest point (or -1) and its squared distance. */
  nearestOne(q: ArrayLike<number>, maxDist2 = Infinity): { index: number; dist2: number } {
    const index = this.nearestIndex(q, maxDist2);
    return { index, dist2: this.lastDist2 };
  }

  /** nearestOne's index, its squared distance left in `lastDist2` (Infinity when none), no object made. */
  nearestIndex(q: ArrayLike<number>, maxDist2 = Infinity): number {
    this.bestIndex = -1;
    this.bestDist2 = maxDist2;
    if (this.count > 0) {
      if (this.points3) {
        const x = q[0], y = q[1], z = q[2], b = this.box3;
        const dx = x < b[0] ? b[0] - x : x > b[3] ? x - b[3] : 0;
        const dy = y < b[1] ? b[1] - y : y > b[4] ? y - b[4] : 0;
        const dz = z < b[2] ? b[2] - z : z > b[5] ? z - b[5] : 0;
        if (dx * dx + dy * dy + dz * dz <= maxDist2) this.visitOne3(x, y, z, 0, this.count);
      }
      else this.visitOne(q, 0, this.count);
    }
    this.lastDist2 = this.bestIndex < 0 ? Infinity : this.bestDist2;
    return this.bestIndex;
  }

  private bestIndex = -1;
  private bestDist2 = Infinity;

  /**
   * nearestOne with a guess: `hint` is a point an earlier query near q returned (ICP asks for the
   * same moved sample round after round, and its nearest point seldom goes far). Each point j
   * keeps its NEAR_LIST nearest other points and D(j), the distance to the next one: every point
   * outside that list lies at least D(j) - |q - j| from q (triangle inequality). So when the best
   * of j and its list is nearer than that bound, and nearer than the second best of them, it is
   * the only nearest point of q, the search would find it whatever its order (no tie), and it is
   * the answer, with the squared distance worked out as the search works it out: the same index
   * and dist2 as nearestOne, to the last bit. Both comparisons keep a relative margin of 1e-6, far
   * beyond rounding. 3-d trees only; otherwise, or when the guess does not settle it, the search.
   */
  nearestOneNear(q: ArrayLike<number>, maxDist2: number, hint: number): { index: number; dist2: number } {
    if (!this.points3) return this.nearestOne(q, maxDist2);
    const index = this.nearestOneNear3(q[0], q[1], q[2], maxDist2, hint);
    return { index, dist2: index < 0 ? Infinity : this.lastDist2 };
  }

  /** Squared distance of the point the last nearestIndex or nearestOneNear3 returned (Infinity when none). */
  lastDist2 = Infinity;

  /**
   * nearestOneNear of a 3-d tree with the query's coordinates as numbers: the index it returns
   * (or -1), its squared distance left in `lastDist2`, no object made (ICP asks this for every
   * sample in every round). The same answers as nearestOneNear.
   */
  nearestOneNear3(x: number, y: number, z: number, maxDist2: number, hint: number): number {
    const P = this.points3!;
    let bound = maxDist2;
    if (hint >= 0) {
      if (!this.nearList) this.listNeighbours();
      const L = this.nearList!, pos = this.positionOf![hint];
      const o = (KdTree.NEAR_LIST + 1) * pos;
      let best = -1, b2 = Infinity, s2 = Infinity;
      for (let m = o; m <= o + KdTree.NEAR_LIST; m++) {
        const k = L[m];
        if (k < 0) break;
        const dx = x - P[3 * k], dy = y - P[3 * k + 1], dz = z - P[3 * k + 2];
        const d2 = dx * dx + dy * dy + dz * dz;
        if (d2 < b2) { s2 = b2; b2 = d2; best = k; } else if (d2 < s2) s2 = d2;
      }
      // the list's own first entry is j itself: |q - j| is known from the loop's first distance
      const k0 = L[o];
      const ex = x - P[3 * k0], ey = y - P[3 * k0 + 1], ez = z - P[3 * k0 + 2];
      const rest = this.beyond![pos] - Math.sqrt(ex * ex + ey * ey + ez * ez);
      if (rest > 1e-3 * this.beyond![pos] && b2 * (1 + 1e-6) < rest * rest && b2 * (1 + 1e-6) < s2) {
        // exactly at the radius the search may or may not find it (it prunes a side whose plane lies
        // at the radius): that one case is left to the search
        if (b2 !== maxDist2) {
          // the nearest point, and no other point nearer than the second of the list or the list's reach
          this.nearPos = best;
          this.nearDist = Math.sqrt(b2);
          this.otherDist = Math.min(Math.sqrt(s2), rest);
        }
        if (b2 < maxDist2) { this.lastDist2 = b2; return this.order[best]; }
        if (b2 > maxDist2) { this.lastDist2 = Infinity; return -1; }
      }
      // the best of the list bounds the search from the start, a hair above it (strictly: see
      // searchOne3), so the search prunes more and still ends where a search from maxDist2 ends
      const above = b2 * (1 + 1e-9);
      if (above > b2 && above < maxDist2) bound = above;
    }
    return this.searchOne3(x, y, z, maxDist2, bound);
  }

  /**
   * nearestOne's search for 3-d points, pruned from the start by `bound` (<= maxDist2) instead of
   * maxDist2, where some point is known to lie strictly within `bound` when it is below maxDist2.
   * The same index and squared distance as nearestOne: until the search meets the first of the
   * points at the least distance d (depth first, nearer side first, the order of nearestOne), its
   * best stays above d, so no side holding such a point is pruned (a point's squared distance is
   * never below its split plane's, rounding being monotone), and after that its best is d in both.
   */
  private searchOne3(x: number, y: number, z: number, maxDist2: number, bound: number): number {
    this.bestIndex = -1;
    this.bestDist2 = bound;
    if (this.count > 0) {
      const b = this.box3;
      const dx = x < b[0] ? b[0] - x : x > b[3] ? x - b[3] : 0;
      const dy = y < b[1] ? b[1] - y : y > b[4] ? y - b[4] : 0;
      const dz = z < b[2] ? b[2] - z : z > b[5] ? z - b[5] : 0;
      const box2 = dx * dx + dy * dy + dz * dz;
      if (box2 <= maxDist2) {
        this.visitOne3(x, y, z, 0, this.count, true);
        // every point was either visited or behind a plane no nearer than pruned2
        const v1 = this.visitedMin, pruned = this.pruned2;
        if (v1 < pruned) {
          this.nearPos = this.visitedMinPos;
          this.nearDist = Math.sqrt(v1);
          this.otherDist = Math.sqrt(Math.min(this.visitedSecond, pruned));
        } else {
          this.nearPos = -1;
          this.nearDist = this.otherDist = Math.sqrt(pruned);
        }
      } else {
        // every point lies at least as far as the bounding box
        this.nearPos = -1;
        this.nearDist = this.otherDist = Math.sqrt(box2);
      }
    } else {
      this.nearPos = -1;
      this.nearDist = this.otherDist = Infinity;
    }
    this.lastDist2 = this.bestIndex < 0 ? Infinity : this.bestDist2;
    return this.bestIndex;
  }

  /**
   * What the last nearestOneNear3 proved beyond its answer, for nearestOneMoving: nearPos, the tree
   * position of the nearest point of all (-1 when not known), nearDist its distance (when -1: a
   * bound below the distance of every point), otherDist a bound below the distance of every other
   * point. Distances as computed (see nearestOneMoving for the margin that covers rounding).
   */
  private nearPos = -1;
  private nearDist = -1;
  private otherDist = -1;
  // visitOne3's extra record: the least and second least squared distance of the points it
  // visited (and the tree position of the least), and the least squared distance of a pruned side's plane
  private visitedMin = Infinity;
  private visitedMinPos = -1;
  private visitedSecond = Infinity;
  private pruned2 = Infinity;

  /** Numbers kept per query by nearestOneMoving. */
  static readonly MEMO = 8;

  /** A memo for `count` queries of nearestOneMoving, nothing known yet (in `into` when given, at least KdTree.MEMO * count long). */
  static movingMemo(count: number, into?: Float64Array): Float64Array {
    const memo = into ?? new Float64Array(KdTree.MEMO * count);
    for (let o = 0; o < KdTree.MEMO * count; o += KdTree.MEMO) { memo[o + 3] = -1; memo[o + 4] = -1; memo[o + 5] = -1; memo[o + 6] = -1; }
    return memo;
  }

  /**
   * nearestOneNear3 for a query that moves a little from call to call (ICP asks for each moved
   * sample round after round): the same index and squared distance (in lastDist2), with less work.
   * `memo` (movingMemo; KdTree.MEMO numbers per query, `slot` the query's number) keeps, from the
   * last call of this query that searched, where the query stood (q0) and what that search proved:
   * the nearest point j at distance d and no other point nearer than e, or no point nearer than d.
   * Now the query q lies s = |q - q0| from there, so (triangle inequality) j lies within d + s of q
   * and every other point beyond e - s: when d + 2s < e, j is still the only nearest point, which
   * the search would find whatever its order (no tie), and its squared distance is worked out as
   * the search works it out; when no point is nearer than d - s and that exceeds the radius, there
   * is no answer. Both comparisons keep a margin of 1e-6 of the distances and 1e-9 mm, far beyond
   * rounding; exactly at the radius, and otherwise, the search (nearestOneNear3, guessed from the
   * last answer).
   */
  nearestOneMoving(x: number, y: number, z: number, maxDist2: number, memo: Float64Array, slot: number): number {
    const o = KdTree.MEMO * slot;
    // memo: q0 (3 numbers), j's tree position (-1: none), d (-1: nothing known), the squared reach
    // of q within which j stays the only nearest ((e - d) / 2 less the margin; -1: none), the last answer
    const d = memo[o + 4];
    if (d >= 0) {
      const ex = x - memo[o], ey = y - memo[o + 1], ez = z - memo[o + 2];
      const s2 = ex * ex + ey * ey + ez * ez;
      if (s2 < memo[o + 5]) {
        const P = this.points3!, pos = memo[o + 3];
        const dx = x - P[3 * pos], dy = y - P[3 * pos + 1], dz = z - P[3 * pos + 2];
        const d2 = dx * dx + dy * dy + dz * dz;
        if (d2 < maxDist2) { this.lastDist2 = d2; return this.order[pos]; }
        if (d2 > maxDist2) { this.lastDist2 = Infinity; return -1; }
      } else {
        const t = d * (1 - 1e-6) - Math.sqrt(maxDist2) * (1 + 1e-6) - 1e-9;
        if (t > 0 && s2 < t * t) { this.lastDist2 = Infinity; return -1; }
      }
    }
    this.nearPos = -1;
    this.nearDist = this.otherDist = -1;
    const j = this.nearestOneNear3(x, y, z, maxDist2, memo[o + 6]);
    const near = this.nearDist, other = this.otherDist;
    memo[o] = x; memo[o + 1] = y; memo[o + 2] = z;
    memo[o + 3] = this.nearPos; memo[o + 4] = near;
    const reach = (other - near) / 2 - 1e-6 * other - 1e-9;
    memo[o + 5] = this.nearPos >= 0 && reach > 0 ? reach * reach : -1;
    if (j >= 0) memo[o + 6] = j;
    return j;
  }


  /**
   * Whether some point lies within sqrt(maxDist2) of q, as `nearestOne(q, maxDist2).index >= 0`
   * answers it: the index of such a point (not always the nearest) or -1. A `hint` strictly
   * inside the radius answers at once (the search would then find at least that near a point);
   * otherwise the search, whose answer becomes the next hint.
   */
  someWithin(q: ArrayLike<number>, maxDist2: number, hint: number): number {
    const P = this.points3;
    if (hint >= 0 && P) {
      const k = (this.positionOf ?? this.positions())[hint];
      const dx = q[0] - P[3 * k], dy = q[1] - P[3 * k + 1], dz = q[2] - P[3 * k + 2];
      if (dx * dx + dy * dy + dz * dz < maxDist2) return hint;
    }
    return this.nearestOne(q, maxDist2).index;
  }

  private positions(): Uint32Array {
    const pos = new Uint32Array(this.count);
    for (let k = 0; k < this.count; k++) pos[this.order[k]] = k;
    this.positionOf = pos;
    return pos;
  }

  /** Points listed per point for nearestOneNear. */
  private static readonly NEAR_LIST = 8;
  /** Per tree position: itself and its NEAR_LIST nearest other points (tree positions, -1 past the end), and D: the distance to the next one (Infinity when none). */
  private nearList: Int32Array | undefined;
  private beyond: Float64Array | undefined;
  private positionOf: Uint32Array | undefined;

  private listNeighbours(): void {
    const n = this.count, P = this.points3!, M = KdTree.NEAR_LIST + 1;
    const pos = this.positionOf ?? this.positions();
    const list = new Int32Array(M * n).fill(-1), beyond = new Float64Array(n);
    const q = [0, 0, 0];
    for (let k = 0; k < n; k++) {
      q[0] = P[3 * k]; q[1] = P[3 * k + 1]; q[2] = P[3 * k + 2];
      const near = this.nearest(q, M + 1);
      // itself first (a repeated point may come first instead: then D is 0 and nothing certifies)
      list[M * k] = k;
      let m = 1;
      for (let t = 0; t < near.indices.length && m < M; t++) if (pos[near.indices[t]] !== k) list[M * k + m++] = pos[near.indices[t]];
      beyond[k] = near.indices.length > M ? Math.sqrt(near.dist2[M]) : Infinity;
      if (near.dist2.length > 1 && near.dist2[1] === 0) beyond[k] = 0;
    }
    this.nearList = list;
    this.beyond = beyond;
  }

  private visitOne(q: ArrayLike<number>, lo: number, hi: number): void {
    if (hi - lo <= KdTree.LEAF) {
      for (let i = lo; i < hi; i++) {
        const p = this.order[i];
        const d2 = this.dist2(q, p);
        if (d2 < this.bestDist2 || (d2 === this.bestDist2 && this.bestIndex < 0)) {
          this.bestDist2 = d2;
          this.bestIndex = p;
        }
      }
      return;
    }
    const mid = (lo + hi) >> 1;
    const p = this.order[mid];
    const diff = q[this.splitDim[mid]] - this.data[p * this.dim + this.splitDim[mid]];
    const d2 = this.dist2(q, p);
    if (d2 < this.bestDist2 || (d2 === this.bestDist2 && this.bestIndex < 0)) {
      this.bestDist2 = d2;
      this.bestIndex = p;
    }
    if (diff < 0) {
      this.visitOne(q, lo, mid);
      if (diff * diff < this.bestDist2) this.visitOne(q, mid + 1, hi);
    } else {
      this.visitOne(q, mid + 1, hi);
      if (diff * diff < this.bestDist2) this.visitOne(q, lo, mid);
    }
  }

  /**
   * visitOne for 3-d points: positions k in tree order, coordinates from points3. Depth first
   * through an explicit stack instead of calls (no call per node, the best so far in locals): the
   * nearer side is visited first and the farther side, pushed below it with its plane's squared
   * distance, is tested against the best when it is popped, i.e. once the nearer side is done,
   * as the recursive visit tests it: the same nodes in the same order, so the same answer.
   */
  private visitOne3(x: number, y: number, z: number, lo0: number, hi0: number, record = false): void {
    const P = this.points3!, order = this.order, split = this.splitDim, LEAF = KdTree.LEAF;
    const sLo = this.stackLo, sHi = this.stackHi, sD2 = this.stackD2;
    let best = this.bestDist2, bestIndex = this.bestIndex;
    let v1 = Infinity, v1pos = -1, v2 = Infinity, pruned = Infinity;
    let top = 0, lo = lo0, hi = hi0;
    for (;;) {
      // down the nearer sides, pushing each farther side
      while (hi - lo > LEAF) {
        const mid = (lo + hi) >> 1;
        const sd = split[mid];
        const dx = x - P[3 * mid], dy = y - P[3 * mid + 1], dz = z - P[3 * mid + 2];
        const diff = sd === 0 ? dx : sd === 1 ? dy : dz;
        const d2 = dx * dx + dy * dy + dz * dz;
        if (record && d2 < v2) { if (d2 < v1) { v2 = v1; v1 = d2; v1pos = mid; } else v2 = d2; }
        if (d2 < best || (d2 === best && bestIndex < 0)) {
          best = d2;
          bestIndex = order[mid];
        }
        sD2[top] = diff * diff;
        if (diff < 0) {
          sLo[top] = mid + 1; sHi[top] = hi;
          hi = mid;
        } else {
          sLo[top] = lo; sHi[top] = mid;
          lo = mid + 1;
        }
        top++;
      }
      for (let k = lo; k < hi; k++) {
        const dx = x - P[3 * k], dy = y - P[3 * k + 1], dz = z - P[3 * k + 2];
        const d2 = dx * dx + dy * dy + dz * dz;
        if (record && d2 < v2) { if (d2 < v1) { v2 = v1; v1 = d2; v1pos = k; } else v2 = d2; }
        if (d2 < best || (d2 === best && bestIndex < 0)) {
          best = d2;
          bestIndex = order[k];
        }
      }
      // the next farther side whose plane is nearer than the best found by now
      while (top > 0 && !(sD2[top - 1] < best)) {
        top--;
        if (record && sD2[top] < pruned) pruned = sD2[top];
      }
      if (top === 0) break;
      top--;
      lo = sLo[top]; hi = sHi[top];
    }
    this.bestDist2 = best;
    this.bestIndex = bestIndex;
    this.visitedMin = v1; this.visitedMinPos = v1pos; this.visitedSecond = v2; this.pruned2 = pruned;
  }

  /** visitOne3's stack of sides still to visit: ranges of tree positions and their planes' squared distances (one entry per level at most). */
  private readonly stackLo = new Int32Array(64);
  private readonly stackHi = new Int32Array(64);
  private readonly stackD2 = new Float64Array(64);

  /** Every point within radius r of q (unordered). */
  within(q: ArrayLike<number>, r: number, out: number[] = []): number[] {
    out.length = 0;
    if (this.count === 0) return out;
    const r2 = r * r;
    const visit = (lo: number, hi: number): void => {
      if (hi - lo <= KdTree.LEAF) {
        for (let i = lo; i < hi; i++) if (this.dist2(q, this.order[i]) <= r2) out.push(this.order[i]);
        return;
      }
      const mid = (lo + hi) >> 1;
      const d = this.splitDim[mid];
      const p = this.order[mid];
      const diff = q[d] - this.data[p * this.dim + d];
      if (this.dist2(q, p) <= r2) out.push(p);
      if (diff <= r) visit(lo, mid);
      if (diff >= -r) visit(mid + 1, hi);
    };
    visit(0, this.count);
    return out;
  }
}
