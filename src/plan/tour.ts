/**
 * The order being improved: a sequence of contours, each with two ends.
 *
 * Layout: `seq[k]` is the item drawn k-th and `pos[item]` its position. An item's
 * end A is (ax, ay), end B (bx, by): an open contour's first and last vertex, a
 * closed contour's entry vertex twice. `rev[item]` = 1 when the item is drawn from
 * B to A. Positions -1 and n are sentinels: the exit of position -1 is the start
 * point (NaN when there is none) and the entry of position n is NaN (the job ends
 * anywhere); a distance to NaN is 0, so the path is free at a missing end.
 * `parent[item]` (or null) is the container that must come after the item.
 */

export class Tour {
  readonly n: number;
  readonly seq: Int32Array;
  readonly pos: Int32Array;
  readonly rev: Uint8Array;
  readonly ax: Float64Array;
  readonly ay: Float64Array;
  readonly bx: Float64Array;
  readonly by: Float64Array;
  sx = NaN;
  sy = NaN;
  parent: Int32Array | null = null;
  childStart: Int32Array | null = null;
  childList: Int32Array | null = null;

  constructor(n: number) {
    this.n = n;
    this.seq = new Int32Array(n);
    this.pos = new Int32Array(n);
    this.rev = new Uint8Array(n);
    this.ax = new Float64Array(n);
    this.ay = new Float64Array(n);
    this.bx = new Float64Array(n);
    this.by = new Float64Array(n);
  }

  /** Set the containers (parent[i] must be drawn after i), building the child lists. */
  setParents(parent: Int32Array): void {
    const n = this.n;
    this.parent = parent;
    const start = new Int32Array(n + 1);
    for (let i = 0; i < n; i++) if (parent[i] >= 0) start[parent[i] + 1]++;
    for (let i = 0; i < n; i++) start[i + 1] += start[i];
    const fill = start.slice(0, n);
    const list = new Int32Array(start[n]);
    for (let i = 0; i < n; i++) if (parent[i] >= 0) list[fill[parent[i]]++] = i;
    this.childStart = start;
    this.childList = list;
  }

  exitX(k: number): number {
    if (k < 0) return this.sx;
    const i = this.seq[k];
    return this.rev[i] ? this.ax[i] : this.bx[i];
  }
  exitY(k: number): number {
    if (k < 0) return this.sy;
    const i = this.seq[k];
    return this.rev[i] ? this.ay[i] : this.by[i];
  }
  entryX(k: number): number {
    if (k >= this.n) return NaN;
    const i = this.seq[k];
    return this.rev[i] ? this.bx[i] : this.ax[i];
  }
  entryY(k: number): number {
    if (k >= this.n) return NaN;
    const i = this.seq[k];
    return this.rev[i] ? this.by[i] : this.ay[i];
  }

  /** Travel from the exit at position p to the entry at position q (mm). */
  hop(p: number, q: number): number {
    return dist(this.exitX(p), this.exitY(p), this.entryX(q), this.entryY(q));
  }

  /** Total travel, the approach from the start included when there is one (mm). */
  travel(): number {
    let t = 0;
    for (let k = 0; k < this.n; k++) t += this.hop(k - 1, k);
    return t;
  }

  /** Change in travel when positions p+1..q are drawn in reverse order and direction (-1 ≤ p < q < n). */
  twoOptDelta(p: number, q: number): number {
    const epx = this.exitX(p), epy = this.exitY(p), eqx = this.exitX(q), eqy = this.exitY(q);
    const nax = this.entryX(p + 1), nay = this.entryY(p + 1), nbx = this.entryX(q + 1), nby = this.entryY(q + 1);
    return dist(epx, epy, eqx, eqy) + dist(nax, nay, nbx, nby) - dist(epx, epy, nax, nay) - dist(eqx, eqy, nbx, nby);
  }

  /** Reverse positions p+1..q (order and direction). */
  twoOpt(p: number, q: number): void {
    const { seq, pos, rev } = this;
    for (let i = p + 1, j = q; i <= j; i++, j--) {
      const a = seq[i], b = seq[j];
      seq[i] = b;
      seq[j] = a;
      pos[b] = i;
      pos[a] = j;
      rev[a] ^= 1;
      if (a !== b) rev[b] ^= 1;
    }
  }

  /**
   * Change in travel when block s..e moves between positions g and g+1 (g < s-1 or g > e),
   * reversed or not.
   */
  orDelta(s: number, e: number, g: number, reversed: boolean): number {
    const psx = this.exitX(s - 1), psy = this.exitY(s - 1), nex = this.entryX(e + 1), ney = this.entryY(e + 1);
    const gx = this.exitX(g), gy = this.exitY(g), hx = this.entryX(g + 1), hy = this.entryY(g + 1);
    const nsx = this.entryX(s), nsy = this.entryY(s), eex = this.exitX(e), eey = this.exitY(e);
    const removed = dist(psx, psy, nsx, nsy) + dist(eex, eey, nex, ney) + dist(gx, gy, hx, hy);
    const inner = reversed
      ? dist(gx, gy, eex, eey) + dist(nsx, nsy, hx, hy)
      : dist(gx, gy, nsx, nsy) + dist(eex, eey, hx, hy);
    return dist(psx, psy, nex, ney) + inner - removed;
  }

  /** Move block s..e between g and g+1, reversed or not. */
  orMove(s: number, e: number, g: number, reversed: boolean): void {
    // A block move as reversals: reverse(B), reverse(M), reverse(B M) = M B; leaving out reverse(B) gives M B reversed.
    if (g > e) {
      if (!reversed) this.twoOpt(s - 1, e);
      this.twoOpt(e, g);
      this.twoOpt(s - 1, g);
    } else {
      this.twoOpt(g, s - 1);
      if (!reversed) this.twoOpt(s - 1, e);
      this.twoOpt(g, e);
    }
  }

  /** Whether reversing p+1..q keeps every contained item before its container. */
  twoOptAllowed(p: number, q: number): boolean {
    const par = this.parent;
    if (par === null) return true;
    for (let k = p + 1; k <= q; k++) {
      const c = par[this.seq[k]];
      if (c >= 0 && this.pos[c] > p && this.pos[c] <= q) return false;
    }
    return true;
  }

  /** Whether moving block s..e between g and g+1 keeps every contained item before its container. */
  orAllowed(s: number, e: number, g: number, reversed: boolean): boolean {
    const par = this.parent;
    if (par === null) return true;
    if (reversed && !this.twoOptAllowed(s - 1, e)) return false;
    for (let k = s; k <= e; k++) {
      const it = this.seq[k];
      if (g > e) {
        const c = par[it];
        if (c >= 0 && this.pos[c] > e && this.pos[c] <= g) return false;
      } else {
        const cs = this.childStart!, cl = this.childList!;
        for (let m = cs[it]; m < cs[it + 1]; m++) {
          const p = this.pos[cl[m]];
          if (p > g && p < s) return false;
        }
      }
    }
    return true;
  }
}

/** Euclidean distance; 0 when either point is missing (NaN), so a free end costs nothing. */
export function dist(x1: number, y1: number, x2: number, y2: number): number {
  if (x1 !== x1 || x2 !== x2) return 0;
  const dx = x2 - x1, dy = y2 - y1;
  return Math.sqrt(dx * dx + dy * dy);
}
