/**
 * Uniform grid over the segments of a shape, for exact nearest-segment
 * queries in the report's distance bound (hausdorff.ts).
 *
 * Layout: `segs[4k..4k+3] = ax, ay, bx, by` (mm) is segment k, in polyline
 * order (a one-point polyline is a zero-length segment). Cell (i, j) covers
 * the points whose `cellX(x) = i`, `cellY(y) = j`; its listings are the slots
 * `t = start[c] .. start[c + 1] − 1` with `c = j·nx + i`: segment id `items[t]`
 * and a copy of its coordinates in `coords[4t..4t+3]` (so a query reads one
 * cell's segments from consecutive memory). A segment is listed in every cell
 * its bounding box meets, so a box query over the cells of a square sees every
 * segment that reaches into the square.
 *
 * Cell size: at least 2 mean segment lengths and 1/8 of the longest segment
 * (each segment is listed in few cells), and large enough that there are at
 * most about CELLS_PER_SEGMENT · n cells (memory and set-up stay linear).
 * Why a grid and not an R-tree: the samples are short, evenly spaced chords,
 * and a grid answers "every segment within u of p" with a few array reads
 * and no allocation, where a tree walk allocates its queue and results.
 */

/** Euclidean distance from (px, py) to the segment (ax, ay)–(bx, by); a zero-length segment is a point. */
export function distPointSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  let ex = px - ax, ey = py - ay;
  const len2 = dx * dx + dy * dy;
  if (len2 > 0) {
    let t = (ex * dx + ey * dy) / len2;
    if (t > 1) t = 1;
    else if (t < 0) t = 0;
    ex -= t * dx;
    ey -= t * dy;
  }
  return Math.sqrt(ex * ex + ey * ey);
}

/** Upper limit on cells per segment (sets the smallest cell on compact shapes). */
const CELLS_PER_SEGMENT = 4;
/** Mean listings per occupied cell above which the cells are made finer, and the aim then. */
const MAX_OCCUPANCY = 32;
const TARGET_OCCUPANCY = 8;
/** Upper limit on cells per segment for that finer layout. */
const SPARSE_CELLS_PER_SEGMENT = 64;
/** Smallest cell, in mean segment lengths. */
const MIN_CELL_LENGTHS = 2;

/** Spatial index of a shape's segments (see the module header for the layout). */
export class SegmentGrid {
  /** ax, ay, bx, by per segment (mm). */
  segs = new Float64Array(0);
  /** Number of segments. */
  count = 0;
  /** mm, mean segment length. */
  meanLength = 0;
  /** mm, grid origin (lowest x and y of all segments) and cell size. */
  x0 = 0; y0 = 0; cell = 1;
  /** 1/cell, or 0 when the extent is not finite (then one cell holds everything). */
  private inv = 0;
  nx = 1; ny = 1;
  private start = new Int32Array(2);
  private items = new Int32Array(0);
  private coords = new Float64Array(0);
  /** Per segment during build: its only cell, or −1 when it meets several. */
  private home = new Int32Array(0);
  /** Listings (segment-in-cell entries) of the current layout. */
  private listed = 0;
  /** Bytes held in this grid's buffers (so a caller can drop a grid grown by a huge shape). */
  get bytes(): number {
    return this.segs.byteLength + this.start.byteLength + this.items.byteLength + this.coords.byteLength + this.home.byteLength;
  }

  /** Segment id of the last query's answer (−1 when the grid is empty). */
  hit = -1;

  /**
   * Index the segments of `polylines` (mm, x,y pairs), reusing this grid's
   * buffers. Returns false (and indexes nothing) when there are no points.
   */
  build(polylines: readonly Float64Array[]): boolean {
    let count = 0;
    for (const pl of polylines) {
      const n = pl.length >> 1;
      count += n === 1 ? 1 : Math.max(0, n - 1);
    }
    this.count = count;
    if (count === 0) return false;
    if (this.segs.length < 4 * count) this.segs = new Float64Array(4 * count + (count >> 1) * 4);
    const segs = this.segs;
    let k = 0, total = 0, longest = 0;
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (const pl of polylines) {
      const n = pl.length >> 1;
      if (n === 0) continue;
      const last = n === 1 ? 1 : n - 1;
      for (let i = 0; i < last; i++) {
        const j = n === 1 ? 0 : i + 1;
        const ax = pl[2 * i], ay = pl[2 * i + 1], bx = pl[2 * j], by = pl[2 * j + 1];
        segs[k++] = ax; segs[k++] = ay; segs[k++] = bx; segs[k++] = by;
        const dx = bx - ax, dy = by - ay, len = Math.sqrt(dx * dx + dy * dy);
        total += len;
        if (len > longest) longest = len;
        if (ax < minX) minX = ax; if (ax > maxX) maxX = ax;
        if (bx < minX) minX = bx; if (bx > maxX) maxX = bx;
        if (ay < minY) minY = ay; if (ay > maxY) maxY = ay;
        if (by < minY) minY = by; if (by > maxY) maxY = by;
      }
    }
    this.meanLength = total / count;
    const w = maxX - minX, h = maxY - minY;
    let cell = Math.max(
      Math.sqrt((w * h) / (CELLS_PER_SEGMENT * count)), (w + h) / (CELLS_PER_SEGMENT * count),
      MIN_CELL_LENGTHS * this.meanLength, longest / 8,
    );
    this.x0 = minX;
    this.y0 = minY;
    if (!Number.isFinite(cell) || !Number.isFinite(w) || !Number.isFinite(h)) cell = Infinity; // one cell, a plain scan
    else if (!(cell > 0)) cell = 1; // every point the same: any cell size works
    const occupied = this.place(cell, w, h);
    // Sparse shapes (a dense part and a far outlier) crowd their few occupied cells: refine the
    // cells once, within a larger memory budget, to about TARGET_OCCUPANCY listings each.
    const occupancy = this.listed / occupied;
    if (occupancy > MAX_OCCUPANCY && Number.isFinite(cell)) {
      const finer = Math.max(cell * Math.sqrt(TARGET_OCCUPANCY / occupancy), Math.sqrt((w * h) / (SPARSE_CELLS_PER_SEGMENT * count)),
        (w + h) / (SPARSE_CELLS_PER_SEGMENT * count), MIN_CELL_LENGTHS * this.meanLength, longest / 8);
      if (finer < cell) this.place(finer, w, h);
    }
    return true;
  }

  /** Lay the segments out in cells of size `cell` (mm) over the extent w × h; returns the number of occupied cells. */
  private place(cell: number, w: number, h: number): number {
    const segs = this.segs, count = this.count;
    if (cell === Infinity) {
      this.inv = 0; this.nx = 1; this.ny = 1;
    } else {
      this.inv = 1 / cell;
      this.nx = Math.floor(w * this.inv) + 1;
      this.ny = Math.floor(h * this.inv) + 1;
    }
    this.cell = cell;
    const cells = this.nx * this.ny;
    if (this.start.length < cells + 1) this.start = new Int32Array(cells + 1 + (cells >> 1));
    const start = this.start;
    start.fill(0, 0, cells + 1);
    if (this.home.length < count) this.home = new Int32Array(this.segs.length >> 2);
    const home = this.home, nx = this.nx;
    // Two passes: count per cell, then fill (start[c] ends as the first slot of cell c).
    let listed = 0;
    for (let s = 0; s < count; s++) {
      const o = 4 * s;
      const ax = segs[o], ay = segs[o + 1], bx = segs[o + 2], by = segs[o + 3];
      const i0 = this.cellX(ax < bx ? ax : bx), i1 = this.cellX(ax < bx ? bx : ax);
      const j0 = this.cellY(ay < by ? ay : by), j1 = this.cellY(ay < by ? by : ay);
      if (i0 === i1 && j0 === j1) {
        const c = j0 * nx + i0;
        home[s] = c;
        start[c + 1]++;
        listed++;
        continue;
      }
      home[s] = -1;
      for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) start[j * nx + i + 1]++;
      listed += (i1 - i0 + 1) * (j1 - j0 + 1);
    }
    let occupied = 0;
    for (let c = 0; c < cells; c++) {
      if (start[c + 1] > 0) occupied++;
      start[c + 1] += start[c];
    }
    this.listed = listed;
    if (this.items.length < listed) {
      this.items = new Int32Array(listed + (listed >> 1));
      this.coords = new Float64Array(4 * this.items.length);
    }
    const items = this.items, coords = this.coords;
    for (let s = 0; s < count; s++) {
      const o = 4 * s;
      const ax = segs[o], ay = segs[o + 1], bx = segs[o + 2], by = segs[o + 3];
      let c = home[s];
      if (c >= 0) {
        const t = start[c]++;
        items[t] = s;
        coords[4 * t] = ax; coords[4 * t + 1] = ay; coords[4 * t + 2] = bx; coords[4 * t + 3] = by;
        continue;
      }
      const i0 = this.cellX(ax < bx ? ax : bx), i1 = this.cellX(ax < bx ? bx : ax);
      const j0 = this.cellY(ay < by ? ay : by), j1 = this.cellY(ay < by ? by : ay);
      for (let j = j0; j <= j1; j++) {
        for (let i = i0; i <= i1; i++) {
          c = j * nx + i;
          const t = start[c]++;
          items[t] = s;
          coords[4 * t] = ax; coords[4 * t + 1] = ay; coords[4 * t + 2] = bx; coords[4 * t + 3] = by;
        }
      }
    }
    // The fill moved every start[c] to the end of cell c, i.e. the start of c + 1: shift back.
    for (let c = cells; c > 0; c--) start[c] = start[c - 1];
    start[0] = 0;
    return occupied;
  }

  /** Column of x, clamped to the grid (monotone in x, the same formula for building and queries). */
  cellX(x: number): number {
    const i = Math.floor((x - this.x0) * this.inv);
    return i < 0 ? 0 : i >= this.nx ? this.nx - 1 : i | 0; // NaN → 0 via `| 0`
  }

  /** Row of y, clamped to the grid. */
  cellY(y: number): number {
    const j = Math.floor((y - this.y0) * this.inv);
    return j < 0 ? 0 : j >= this.ny ? this.ny - 1 : j | 0;
  }

  /** mm, distance from (px, py) to segment k. */
  distTo(px: number, py: number, k: number): number {
    const s = this.segs, o = 4 * k;
    return distPointSegment(px, py, s[o], s[o + 1], s[o + 2], s[o + 3]);
  }

  /**
   * Exact distance (mm) from (px, py) to the nearest segment, given a segment
   * `hint` that is probably near (its distance u bounds the answer, so only the
   * cells meeting the square of half-side u are read). Sets `hit`.
   */
  nearestFrom(px: number, py: number, hint: number): number {
    let best = this.distTo(px, py, hint);
    this.hit = hint;
    if (best === 0) return 0;
    // Any segment closer than u has a point in the square, hence is listed in a cell meeting it;
    // the margin covers rounding in the distance and cell formulas.
    const u = best * (1 + 1e-9) + this.cell * 1e-9;
    const i0 = this.cellX(px - u), i1 = this.cellX(px + u), j0 = this.cellY(py - u), j1 = this.cellY(py + u);
    const coords = this.coords, start = this.start, nx = this.nx;
    // Squared distances in the loop (one square root at the end); same clamped projection as distPointSegment.
    let best2 = best * best, hitSlot = -1;
    for (let j = j0; j <= j1; j++) {
      for (let c = j * nx + i0, ce = j * nx + i1; c <= ce; c++) {
        for (let t = start[c], e = start[c + 1]; t < e; t++) {
          const o = 4 * t;
          const ax = coords[o], ay = coords[o + 1];
          const dx = coords[o + 2] - ax, dy = coords[o + 3] - ay;
          let ex = px - ax, ey = py - ay;
          const len2 = dx * dx + dy * dy;
          if (len2 > 0) {
            let r = (ex * dx + ey * dy) / len2;
            if (r > 1) r = 1;
            else if (r < 0) r = 0;
            ex -= r * dx;
            ey -= r * dy;
          }
          const d2 = ex * ex + ey * ey;
          if (d2 < best2) { best2 = d2; hitSlot = t; }
        }
      }
    }
    if (hitSlot >= 0) {
      this.hit = this.items[hitSlot];
      best = Math.sqrt(best2);
    }
    return best;
  }

  /**
   * Exact distance (mm) from (px, py) to the nearest segment with no hint:
   * rings of cells around p's (clamped) cell until the unread cells are all
   * farther than the best found. Sets `hit`.
   */
  nearest(px: number, py: number): number {
    const ci = this.cellX(px), cj = this.cellY(py), nx = this.nx, ny = this.ny;
    const coords = this.coords, items = this.items, start = this.start;
    const margin = this.cell * 1e-9;
    let best = Infinity;
    this.hit = -1;
    for (let r = 0; ; r++) {
      const i0 = ci - r, i1 = ci + r, j0 = cj - r, j1 = cj + r;
      if (i0 < 0 && j0 < 0 && i1 >= nx && j1 >= ny) break; // the ring lies outside: all read
      const ia = i0 < 0 ? 0 : i0, ib = i1 >= nx ? nx - 1 : i1;
      const ja = j0 < 0 ? 0 : j0, jb = j1 >= ny ? ny - 1 : j1;
      for (let j = ja; j <= jb; j++) {
        const edgeRow = j === j0 || j === j1;
        for (let i = ia; i <= ib; i++) {
          if (!edgeRow && i !== i0 && i !== i1) { i = i1 - 1; continue; } // inner cells were read before
          const c = j * nx + i;
          for (let t = start[c], e = start[c + 1]; t < e; t++) {
            const o = 4 * t;
            const d = distPointSegment(px, py, coords[o], coords[o + 1], coords[o + 2], coords[o + 3]);
            if (d < best) { best = d; this.hit = items[t]; }
          }
        }
      }
      // Every unread cell lies beyond one of the block's inner sides: bound its distance from p.
      let lb = Infinity;
      if (i0 > 0) lb = Math.min(lb, px - (this.x0 + i0 * this.cell));
      if (i1 < nx - 1) lb = Math.min(lb, this.x0 + (i1 + 1) * this.cell - px);
      if (j0 > 0) lb = Math.min(lb, py - (this.y0 + j0 * this.cell));
      if (j1 < ny - 1) lb = Math.min(lb, this.y0 + (j1 + 1) * this.cell - py);
      if (lb === Infinity || best <= lb - margin) break;
    }
    return best;
  }
}
