/* Frozen copy of src/report/hausdorff.ts at 22d6eec, kept only as the benchmark's baseline (bench/measure.ts). Not used by the tool. */
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
 *
 * Candidates: one distance-bounded flatbush query around an anchor vertex
 * serves every following segment of `a` that stays within a few mean segment
 * lengths of `b` of it (see `gather`), so the work per segment is the number of
 * segments of `b` at about the local distance, not the size of `b`.
 */
import Flatbush from 'flatbush';

/** Spatial index of a shape's segments. */
export interface SegmentIndex {
  tree: Flatbush;
  /** ax, ay, bx, by per segment, in index item order. */
  segs: Float64Array;
  /** mm, mean segment length (sets how far one candidate query is reused). */
  meanLength: number;
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
  let k = 0, total = 0;
  for (const pl of polylines) {
    const n = pl.length >> 1;
    if (n === 0) continue;
    const last = n === 1 ? 1 : n - 1;
    for (let i = 0; i < last; i++) {
      const j = n === 1 ? 0 : i + 1;
      const ax = pl[2 * i], ay = pl[2 * i + 1], bx = pl[2 * j], by = pl[2 * j + 1];
      segs[k++] = ax; segs[k++] = ay; segs[k++] = bx; segs[k++] = by;
      total += Math.hypot(bx - ax, by - ay);
      tree.add(Math.min(ax, bx), Math.min(ay, by), Math.max(ax, bx), Math.max(ay, by));
    }
  }
  tree.finish();
  return { tree, segs, meanLength: total / count };
}

/**
 * Radius, in mean segment lengths of `b`, within which one candidate query is reused.
 * Larger means fewer tree walks but more candidates per distance evaluation.
 */
const ANCHOR_REACH = 8;

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
  if (index === null) {
    const first = a.find((pl) => pl.length > 0)!;
    return { max: Infinity, mean: Infinity, worstX: first[0], worstY: first[1], samples: pointCount };
  }
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

  let max = -Infinity, worstX = NaN, worstY = NaN, sum = 0, samples = 0;

  // Upper bound of the distance to b on an interval with end distances d0/d1 over the candidates:
  // the convexity bound, capped by the Lipschitz one (module header).
  const bound = (d0: Float64Array, d1: Float64Array, f0: number, f1: number, len: number): number => {
    let convex = Infinity;
    for (let j = 0; j < m; j++) {
      const v = d0[j] > d1[j] ? d0[j] : d1[j];
      if (v < convex) convex = v;
    }
    const lip = (f0 + f1 + len) / 2;
    return convex < lip ? convex : lip;
  };
  const settled = (ub: number, f0: number, f1: number, len: number): boolean =>
    ub - (f0 > f1 ? f0 : f1) <= resolution || len <= 2 * resolution;

  // Bisect the interval x0→x1 until its bound is settled; raise `max` by what it finds.
  const refine = (x0: number, y0: number, f0: number, d0: Float64Array, x1: number, y1: number, f1: number, d1: Float64Array, len: number, depth: number): void => {
    const ub = bound(d0, d1, f0, f1, len);
    if (ub <= max) return; // cannot raise the maximum
    if (settled(ub, f0, f1, len) || depth >= MAX_DEPTH) {
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

  // The anchor: candidates in `cand` hold the nearest segment of b for every point within
  // `anchorR` of (anchorX, anchorY). For such a point x, f(x) ≤ f(A) + R, and its nearest segment j
  // has d_j(A) ≤ d_j(x) + R ≤ f(A) + 2R: so all segments whose box is within U + 2R of A
  // (U ≥ f(A)) suffice, and flatbush's distance-bounded search returns exactly those.
  let anchorX = NaN, anchorY = NaN, anchorR = -1;
  const reach = ANCHOR_REACH * index.meanLength;
  let fp = 0, fq = 0;
  /**
   * Make the candidates hold the nearest segment of b for every point of p→q; leave end
   * distances in rows[0] (p) / rows[1] (q), fp and fq. `fpIn` bounds f(p) from above;
   * `chained` says rows[1] holds p's distances (the previous segment's end).
   */
  const gather = (px: number, py: number, qx: number, qy: number, len: number, fpIn: number, chained: boolean): void => {
    const r2 = anchorR * anchorR;
    const inside = (px - anchorX) ** 2 + (py - anchorY) ** 2 <= r2 && (qx - anchorX) ** 2 + (qy - anchorY) ** 2 <= r2;
    if (inside && chained) {
      const t = rows[0]; // p's distances are the previous segment's end distances
      rows[0] = rows[1];
      rows[1] = t;
      fp = fpIn;
      fq = distances(row(1), qx, qy);
      return;
    }
    if (!inside) {
      anchorX = px;
      anchorY = py;
      anchorR = Math.max(reach, len);
      m = 0;
      for (const id of tree.neighbors(px, py, Infinity, (fpIn + 2 * anchorR) * (1 + 1e-12) + 1e-12)) collect(id);
    }
    fp = distances(row(0), px, py);
    fq = distances(row(1), qx, qy);
  };

  for (const pl of a) {
    const n = pl.length >> 1;
    if (n === 0) continue;
    let px = pl[0], py = pl[1];
    // Any segment's distance bounds f(p) from above; the nearest box gives a good one.
    const near = 4 * tree.neighbors(px, py, 1)[0];
    fp = distPointSegment(px, py, segs[near], segs[near + 1], segs[near + 2], segs[near + 3]);
    if (n === 1) {
      gather(px, py, px, py, 0, fp, false);
      if (fp > max) { max = fp; worstX = px; worstY = py; }
      sum += fp;
      samples++;
      continue;
    }
    const closedRepeat = pl[2 * n - 2] === px && pl[2 * n - 1] === py;
    for (let i = 1; i < n; i++) {
      const qx = pl[2 * i], qy = pl[2 * i + 1];
      const len = Math.hypot(qx - px, qy - py);
      gather(px, py, qx, qy, len, fp, i > 1);
      if (i === 1) { sum += fp; samples++; }
      if (i < n - 1 || !closedRepeat) { sum += fq; samples++; }
      refine(px, py, fp, rows[0], qx, qy, fq, rows[1], len, 0);
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
