/**
 * Directed and two-sided Hausdorff distance between polylines, as a
 * guaranteed upper bound.
 *
 * Polylines are `Float64Array`s of x,y pairs (mm); a set of them is one shape.
 * The segments of the target shape go into a flatbush R-tree; an index item
 * `k` is the segment `segs[4k..4k+3] = ax, ay, bx, by`.
 *
 * What `directedDistance(a, b).max` bounds: D = sup over every point x on every
 * segment of `a` (not only the vertices) of the distance from x to the union of
 * the segments of `b`. The result M satisfies D ≤ M ≤ D + resolution. Two facts
 * make that cheap:
 * 1. along a segment of `a` the distance to one fixed segment of `b` is convex
 *    (distance to a convex set composed with an affine map), so on an interval
 *    it is at most the larger of its two end values; the minimum over the
 *    candidate segments of those maxima bounds the distance to `b` there;
 * 2. the distance to `b` is 1-Lipschitz, so on an interval of length ℓ with end
 *    values f0, f1 it is at most (f0 + f1 + ℓ)/2.
 * Intervals whose bound is not within `resolution` of what was observed are
 * bisected. For exact curves A, B sampled with chord bounds eA, eB (see
 * sample.ts): H(A→B) ≤ M + eA + eB.
 */
import Flatbush from 'flatbush';

/** Spatial index of a shape's segments. */
export interface SegmentIndex {
  tree: Flatbush;
  /** ax, ay, bx, by per segment, in index item order. */
  segs: Float64Array;
}

/** Result of one direction. */
export interface DirectedDistance {
  /** mm, upper bound of the directed distance from polylines `a` to polylines `b` (see module header). */
  max: number;
  /** mm, mean distance of `a`'s vertices from `b` (a closing point that repeats the first counts once). */
  mean: number;
  /** mm, a vertex of `a` next to where `max` is reached (NaN when `a` is empty). */
  worstX: number;
  worstY: number;
  /** Number of vertices that went into `mean`. */
  samples: number;
}

/** Default bisection resolution in mm (0.1 µm). */
export const DEFAULT_RESOLUTION = 1e-4;

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

/** Index the segments of a shape; a one-point polyline counts as a zero-length segment. Null when it has no points. */
export function buildSegmentIndex(polylines: Float64Array[]): SegmentIndex | null {
  let count = 0;
  for (const pl of polylines) {
    const n = pl.length >> 1;
    count += n === 1 ? 1 : Math.max(0, n - 1);
  }
  if (count === 0) return null;
  const segs = new Float64Array(count * 4);
  const tree = new Flatbush(count);
  let k = 0;
  for (const pl of polylines) {
    const n = pl.length >> 1;
    if (n === 0) continue;
    const last = n === 1 ? 1 : n - 1;
    for (let i = 0; i < last; i++) {
      const j = n === 1 ? 0 : i + 1;
      const ax = pl[2 * i], ay = pl[2 * i + 1], bx = pl[2 * j], by = pl[2 * j + 1];
      segs[k++] = ax; segs[k++] = ay; segs[k++] = bx; segs[k++] = by;
      tree.add(Math.min(ax, bx), Math.min(ay, by), Math.max(ax, bx), Math.max(ay, by));
    }
  }
  tree.finish();
  return { tree, segs };
}

/** Extra margin of a candidate query, in units of the needed radius, so that following segments can reuse it. */
const MARGIN = 1;

/** Deepest bisection (2^-48 of a segment is far below double noise for our sizes). */
const MAX_DEPTH = 48;

/**
 * Directed distance from polylines `a` to polylines `b` (mm), as an upper bound
 * within `resolution` of the exact polyline value (module header).
 *
 * @param index the index of `b` (built here when omitted)
 * @param resolution mm, > 0: how close to the exact value the bound must be
 */
export function directedDistance(
  a: Float64Array[], b: Float64Array[], index: SegmentIndex | null = buildSegmentIndex(b),
  resolution = DEFAULT_RESOLUTION,
): DirectedDistance {
  if (!(resolution > 0)) throw new RangeError(`resolution must be a positive number of mm, got ${resolution}`);
  let pointCount = 0;
  for (const pl of a) pointCount += pl.length >> 1;
  if (pointCount === 0) return { max: 0, mean: 0, worstX: NaN, worstY: NaN, samples: 0 };
  if (index === null) return { max: Infinity, mean: Infinity, worstX: a.find((pl) => pl.length > 0)![0], worstY: a.find((pl) => pl.length > 0)![1], samples: pointCount };
  const { tree, segs } = index;

  // Candidate segments of the current segment of `a`, copied flat (stride 4), and
  // their distances at the interval ends, one scratch row per bisection depth.
  let cand = new Float64Array(64);
  let m = 0;
  let rows: Float64Array[] = [];
  const collect = (k: number): boolean => {
    if (4 * m + 4 > cand.length) {
      const next = new Float64Array(cand.length * 2);
      next.set(cand);
      cand = next;
    }
    const o = 4 * m++, s = 4 * k;
    cand[o] = segs[s]; cand[o + 1] = segs[s + 1]; cand[o + 2] = segs[s + 2]; cand[o + 3] = segs[s + 3];
    return false; // we keep our own list; flatbush's result array stays empty
  };
  const row = (depth: number): Float64Array => {
    while (rows.length <= depth) rows.push(new Float64Array(0));
    if (rows[depth].length < m) rows[depth] = new Float64Array(Math.max(m, 2 * rows[depth].length));
    return rows[depth];
  };
  const distances = (out: Float64Array, px: number, py: number): number => {
    let best = Infinity;
    for (let j = 0; j < m; j++) {
      const o = 4 * j;
      const d = distPointSegment(px, py, cand[o], cand[o + 1], cand[o + 2], cand[o + 3]);
      out[j] = d;
      if (d < best) best = d;
    }
    return best;
  };

  // The box last queried (its candidates are in `cand`).
  let qx0 = Infinity, qy0 = Infinity, qx1 = -Infinity, qy1 = -Infinity;
  let max = -Infinity, worstX = NaN, worstY = NaN, sum = 0, samples = 0;

  // Bound the distance on the interval x0→x1 (length len, end distances d0/d1 over the candidates).
  const refine = (x0: number, y0: number, f0: number, d0: Float64Array, x1: number, y1: number, f1: number, d1: Float64Array, len: number, depth: number): void => {
    let convex = Infinity;
    for (let j = 0; j < m; j++) {
      const v = d0[j] > d1[j] ? d0[j] : d1[j];
      if (v < convex) convex = v;
    }
    const lip = (f0 + f1 + len) / 2;
    const ub = convex < lip ? convex : lip;
    const lo = f0 > f1 ? f0 : f1;
    if (ub <= max) return; // cannot raise the maximum
    if (ub - lo <= resolution || len <= 2 * resolution || depth >= MAX_DEPTH) {
      max = ub;
      if (f0 >= f1) { worstX = x0; worstY = y0; } else { worstX = x1; worstY = y1; }
      return;
    }
    const xm = (x0 + x1) / 2, ym = (y0 + y1) / 2;
    const dm = row(depth + 2);
    const fm = distances(dm, xm, ym);
    refine(x0, y0, f0, d0, xm, ym, fm, dm, len / 2, depth + 1);
    refine(xm, ym, fm, dm, x1, y1, f1, d1, len / 2, depth + 1);
  };

  for (const pl of a) {
    const n = pl.length >> 1;
    if (n === 0) continue;
    let px = pl[0], py = pl[1];
    // Any segment's distance is an upper bound of the distance to `b`; the nearest box gives a good one.
    const near = tree.neighbors(px, py, 1)[0];
    let fp = distPointSegment(px, py, segs[4 * near], segs[4 * near + 1], segs[4 * near + 2], segs[4 * near + 3]);
    const closedRepeat = n > 1 && pl[2 * n - 2] === px && pl[2 * n - 1] === py;
    if (n === 1) {
      m = 0;
      qx0 = Infinity; // the single-point query below replaces the cached candidates
      const r = fp * (1 + 1e-12) + 1e-12;
      tree.search(px - r, py - r, px + r, py + r, collect);
      fp = distances(row(0), px, py);
      if (fp > max) { max = fp; worstX = px; worstY = py; }
      sum += fp;
      samples++;
      continue;
    }
    for (let i = 1; i < n; i++) {
      const qx = pl[2 * i], qy = pl[2 * i + 1];
      const len = Math.hypot(qx - px, qy - py);
      // Every point x of this segment has f(x) ≤ f(p) + len, so its nearest segment of b lies in this box.
      const r = (fp + len) * (1 + 1e-12) + 1e-12;
      const x0 = Math.min(px, qx) - r, y0 = Math.min(py, qy) - r, x1 = Math.max(px, qx) + r, y1 = Math.max(py, qy) + r;
      // Reuse the last query while the needed box lies inside it; otherwise query a box with a margin
      // of r so that the next few segments can reuse it too (fewer tree walks, a few more candidates).
      let d0 = row(0), d1 = row(1);
      if (x0 < qx0 || y0 < qy0 || x1 > qx1 || y1 > qy1) {
        qx0 = x0 - r * MARGIN; qy0 = y0 - r * MARGIN; qx1 = x1 + r * MARGIN; qy1 = y1 + r * MARGIN;
        m = 0;
        tree.search(qx0, qy0, qx1, qy1, collect);
        d0 = row(0);
        d1 = row(1);
        fp = distances(d0, px, py);
      } else if (i > 1) {
        // Same candidates as the previous segment: its end distances are this one's start distances.
        rows[0] = d1;
        rows[1] = d0;
        d0 = rows[0];
        d1 = rows[1];
      } else fp = distances(d0, px, py);
      const fq = distances(d1, qx, qy);
      if (i === 1) { sum += fp; samples++; }
      if (i < n - 1 || !closedRepeat) { sum += fq; samples++; }
      refine(px, py, fp, d0, qx, qy, fq, d1, len, 0);
      px = qx;
      py = qy;
      fp = fq;
    }
  }
  rows = [];
  return { max, mean: sum / samples, worstX, worstY, samples };
}

/** Both directions between shapes `a` and `b`; `max` is the two-sided Hausdorff bound (mm). */
export function hausdorff(
  a: Float64Array[], b: Float64Array[], resolution = DEFAULT_RESOLUTION,
): { max: number; ab: DirectedDistance; ba: DirectedDistance } {
  const ab = directedDistance(a, b, buildSegmentIndex(b), resolution);
  const ba = directedDistance(b, a, buildSegmentIndex(a), resolution);
  return { max: Math.max(ab.max, ba.max), ab, ba };
}
