/**
 * A static k-d tree over 2D points with removal and restoration, for the plan's
 * nearest-neighbour construction, its candidate lists and endpoint matching.
 *
 * Layout: the points are sorted in place into an implicit tree (Bentley's k-d
 * tree, CACM 18 (1975) 509–517, from memory; the flat in-place layout is the one
 * common to small point-index libraries): the range [l, r] splits at
 * m = (l + r) >> 1 on x at even depth and y at odd depth, ranges of at most
 * `LEAF` slots are scanned. `slotX/slotY` hold the coordinates by slot, `ids` the
 * caller's point id by slot. `alive[m]` counts the live points of the range whose
 * split is m (every range has its own m, so the count is well defined), so a
 * search skips a range whose points were all removed: a nearest-neighbour tour
 * removes what it visits and stays O(log n) per step however the points cluster.
 */

const LEAF = 8;

export type Accept = ((id: number) => boolean) | null;

export class PointTree {
  /** Point id at each slot. */
  readonly ids: Uint32Array;
  private readonly slotX: Float64Array;
  private readonly slotY: Float64Array;
  private readonly slotOf: Uint32Array;
  private readonly alive: Uint32Array;
  private readonly dead: Uint8Array;
  private readonly n: number;
  // Search state kept in fields so a query allocates nothing.
  private qx = 0;
  private qy = 0;
  private accept: Accept = null;
  private bestD2 = 0;
  private bestId = -1;
  private k = 0;
  private found = 0;
  private outIds: Int32Array = new Int32Array(0);
  private outD2: Float64Array = new Float64Array(0);

  /** @param xy the points, x0, y0, x1, y1, … (mm); point i has id i */
  constructor(xy: Float64Array) {
    const n = (this.n = xy.length >> 1);
    this.ids = new Uint32Array(n);
    this.slotX = new Float64Array(n);
    this.slotY = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      this.ids[i] = i;
      this.slotX[i] = xy[2 * i];
      this.slotY[i] = xy[2 * i + 1];
    }
    this.build(0, n - 1, 0);
    this.slotOf = new Uint32Array(n);
    for (let s = 0; s < n; s++) this.slotOf[this.ids[s]] = s;
    this.alive = new Uint32Array(n);
    this.dead = new Uint8Array(n);
    this.count(0, n - 1);
  }

  /** Number of points. */
  get size(): number {
    return this.n;
  }

  private build(l: number, r: number, axis: number): void {
    while (r - l > LEAF) {
      const m = (l + r) >> 1;
      this.select(m, l, r, axis);
      this.build(l, m - 1, 1 - axis);
      l = m + 1;
      axis = 1 - axis;
    }
  }

  /** Hoare's selection (quickselect) on one axis: slot k gets its sorted value, smaller before, larger after. */
  private select(k: number, l: number, r: number, axis: number): void {
    const v = axis === 0 ? this.slotX : this.slotY;
    while (r > l) {
      const pivot = v[(l + r) >> 1];
      let i = l, j = r;
      while (i <= j) {
        while (v[i] < pivot) i++;
        while (v[j] > pivot) j--;
        if (i <= j) {
          this.swap(i, j);
          i++;
          j--;
        }
      }
      if (k <= j) r = j;
      else if (k >= i) l = i;
      else return;
    }
  }

  private swap(i: number, j: number): void {
    const { ids, slotX, slotY } = this;
    const t = ids[i]; ids[i] = ids[j]; ids[j] = t;
    const x = slotX[i]; slotX[i] = slotX[j]; slotX[j] = x;
    const y = slotY[i]; slotY[i] = slotY[j]; slotY[j] = y;
  }

  private count(l: number, r: number): number {
    if (r < l) return 0;
    const m = (l + r) >> 1;
    const c = r - l <= LEAF ? r - l + 1 : 1 + this.count(l, m - 1) + this.count(m + 1, r);
    this.alive[m] = c;
    return c;
  }

  /** Walk from the root to the slot of point `id`, adding `delta` to every range count on the way. */
  private adjust(id: number, delta: number): void {
    const s = this.slotOf[id];
    let l = 0, r = this.n - 1;
    for (;;) {
      const m = (l + r) >> 1;
      this.alive[m] += delta;
      if (r - l <= LEAF || s === m) return;
      if (s < m) r = m - 1;
      else l = m + 1;
    }
  }

  /** Take point `id` out of later searches (no effect when already removed). */
  remove(id: number): void {
    const s = this.slotOf[id];
    if (this.dead[s]) return;
    this.dead[s] = 1;
    this.adjust(id, -1);
  }

  /** Put a removed point back (no effect when present). */
  restore(id: number): void {
    const s = this.slotOf[id];
    if (!this.dead[s]) return;
    this.dead[s] = 0;
    this.adjust(id, 1);
  }

  /** Whether point `id` is present. */
  has(id: number): boolean {
    return this.dead[this.slotOf[id]] === 0;
  }

  /** The nearest present point to (x, y) that `accept` takes (all when null); -1 when none. */
  nearest(x: number, y: number, accept: Accept = null): number {
    this.qx = x;
    this.qy = y;
    this.accept = accept;
    this.bestD2 = Infinity;
    this.bestId = -1;
    this.k = 1;
    this.found = 0;
    this.outIds = NEAREST_IDS;
    this.outD2 = NEAREST_D2;
    this.search(0, this.n - 1, 0);
    return this.found ? NEAREST_IDS[0] : -1;
  }

  /**
   * The `k` nearest present points to (x, y) within `maxDist` that `accept` takes, nearest
   * first, written to `outIds` (and their squared distances to `outD2`); returns how many.
   */
  nearestK(x: number, y: number, k: number, maxDist: number, accept: Accept, outIds: Int32Array, outD2: Float64Array): number {
    if (k <= 0) return 0;
    this.qx = x;
    this.qy = y;
    this.accept = accept;
    this.bestD2 = maxDist * maxDist;
    this.k = k;
    this.found = 0;
    this.outIds = outIds;
    this.outD2 = outD2;
    this.search(0, this.n - 1, 0);
    return this.found;
  }

  private consider(s: number): void {
    if (this.dead[s]) return;
    const dx = this.slotX[s] - this.qx, dy = this.slotY[s] - this.qy;
    const d2 = dx * dx + dy * dy;
    if (d2 > this.bestD2 || (d2 === this.bestD2 && this.found === this.k)) return;
    const id = this.ids[s];
    if (this.accept !== null && !this.accept(id)) return;
    // Insertion into the sorted result list; bestD2 becomes the k-th distance once full.
    const ids = this.outIds, ds = this.outD2;
    let i = this.found < this.k ? this.found++ : this.k - 1;
    while (i > 0 && ds[i - 1] > d2) {
      ids[i] = ids[i - 1];
      ds[i] = ds[i - 1];
      i--;
    }
    ids[i] = id;
    ds[i] = d2;
    if (this.found === this.k) this.bestD2 = ds[this.k - 1];
  }

  private search(l: number, r: number, axis: number): void {
    if (r < l) return;
    const m = (l + r) >> 1;
    if (this.alive[m] === 0) return;
    if (r - l <= LEAF) {
      for (let s = l; s <= r; s++) this.consider(s);
      return;
    }
    this.consider(m);
    const d = axis === 0 ? this.qx - this.slotX[m] : this.qy - this.slotY[m];
    if (d <= 0) {
      this.search(l, m - 1, 1 - axis);
      if (d * d <= this.bestD2) this.search(m + 1, r, 1 - axis);
    } else {
      this.search(m + 1, r, 1 - axis);
      if (d * d <= this.bestD2) this.search(l, m - 1, 1 - axis);
    }
  }
}

const NEAREST_IDS = new Int32Array(1);
const NEAREST_D2 = new Float64Array(1);
