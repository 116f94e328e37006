/**
 * Directed and two-sided Hausdorff distance between polylines, as a
 * guaranteed upper bound.
 *
 * Polylines are `Float64Array`s of x,y pairs (mm); a set of them is one shape.
 * The segments of the target shape go into a uniform grid (segmentGrid.ts).
 *
 * What `directedDistance(a, b).max` bounds: D = sup over every point x on every
 * segment of `a` (not only the vertices) of the distance f(x) from x to the
 * union of the segments of `b`. The result M satisfies D ≤ M ≤ D + resolution.
 * Two facts make that cheap:
 * 1. along a segment of `a` the distance to one fixed segment of `b` is convex
 *    (distance to a convex set composed with an affine map), so on an interval
 *    it is at most the larger of its two end values; this holds for *any*
 *    segment of `b`, and we use the ones nearest to the two ends;
 * 2. f is 1-Lipschitz, so on an interval of length ℓ with end values f0, f1 it
 *    is at most (f0 + f1 + ℓ)/2.
 * Both bounds stay upper bounds even if an end value were only an upper bound
 * of f there; exact end values (exact nearest-segment queries) are what keeps
 * M within `resolution` of D. Intervals whose bound is not within `resolution`
 * of what was observed are bisected.
 *
 * Order of work: first the exact distance of every vertex of `a` (each query
 * starts from the previous vertex's nearest segment, so it reads one or two
 * grid cells); their maximum is a true distance, so every interval whose bound
 * does not exceed it can be skipped, which is nearly all of them. For exact
 * curves A, B sampled with chord bounds eA, eB (see sample.ts):
 * H(A→B) ≤ M + eA + eB.
 */
import { SegmentGrid, distPointSegment } from './segmentGrid.js';

export { distPointSegment };

/** Spatial index of a shape's segments. */
export type SegmentIndex = SegmentGrid;

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

/**
 * Index the segments of a shape; a one-point polyline counts as a zero-length
 * segment. Null when it has no points. `reuse` lends its buffers (it is
 * overwritten and returned), so repeated measurements allocate nothing.
 */
export function buildSegmentIndex(polylines: readonly Float64Array[], reuse?: SegmentIndex): SegmentIndex | null {
  const g = reuse ?? new SegmentGrid();
  return g.build(polylines) ? g : null;
}

/** Deepest bisection (2^-48 of a segment is far below double noise for our sizes). */
const MAX_DEPTH = 48;

/**
 * The running result of one directedDistance call, handed to the recursion
 * as an explicit out-parameter (no closure, no module state): `refine` raises
 * `max` and moves the worst spot with it.
 */
interface Running {
  /** mm, largest bound so far. */
  max: number;
  worstX: number;
  worstY: number;
  /** mm, the bisection resolution of this call. */
  readonly res: number;
}

// Scratch only (no results pass through it): reused by every call, single-threaded, never across a call.
/** Vertex distances and nearest-segment ids of `a`, grown as needed and reused. */
let vf = new Float64Array(1024);
let vj = new Int32Array(1024);
/** Vertex scratch beyond this many points is dropped after use. */
const KEEP_POINTS = 1 << 18;

/**
 * Directed distance from polylines `a` to polylines `b` (mm), as an upper bound
 * within `resolution` of the exact polyline value (module header).
 *
 * @param index the index of `b` (built here when omitted)
 * @param resolution mm, > 0: how close to the exact value the bound must be
 */
export function directedDistance(
  a: readonly Float64Array[], b: readonly Float64Array[], index: SegmentIndex | null = buildSegmentIndex(b),
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
  const g = index;
  if (vf.length < pointCount) {
    vf = new Float64Array(pointCount + (pointCount >> 1));
    vj = new Int32Array(vf.length);
  }
  const f = vf, jn = vj;
  const run: Running = { max: -Infinity, worstX: NaN, worstY: NaN, res: resolution };
  let sum = 0, samples = 0;

  // Pass 1: exact distance of every vertex, each query seeded by the previous vertex's nearest segment.
  let v = 0;
  for (const pl of a) {
    const n = pl.length >> 1;
    if (n === 0) continue;
    const closedRepeat = n > 1 && pl[2 * n - 2] === pl[0] && pl[2 * n - 1] === pl[1];
    let hint = -1;
    for (let i = 0; i < n; i++, v++) {
      const x = pl[2 * i], y = pl[2 * i + 1];
      const d = hint < 0 ? g.nearest(x, y) : g.nearestFrom(x, y, hint);
      hint = g.hit;
      f[v] = d;
      jn[v] = hint;
      if (i < n - 1 || !closedRepeat) { sum += d; samples++; }
      if (d > run.max) { run.max = d; run.worstX = x; run.worstY = y; }
    }
  }

  // Pass 2: the points between vertices, only where a bound can exceed the maximum so far.
  v = 0;
  for (const pl of a) {
    const n = pl.length >> 1;
    if (n === 0) continue;
    for (let i = 0; i + 1 < n; i++, v++) {
      const px = pl[2 * i], py = pl[2 * i + 1], qx = pl[2 * i + 2], qy = pl[2 * i + 3];
      const fp = f[v], fq = f[v + 1];
      const dx = qx - px, dy = qy - py, len = Math.sqrt(dx * dx + dy * dy);
      if ((fp + fq + len) / 2 <= run.max) continue; // the Lipschitz bound alone settles it, no distance needed
      refine(run, g, px, py, fp, jn[v], qx, qy, fq, jn[v + 1], len, 0);
    }
    v++; // past the polyline's last vertex
  }
  if (vf.length > KEEP_POINTS) { vf = new Float64Array(1024); vj = new Int32Array(1024); } // a huge shape's scratch is not kept
  return { max: run.max, mean: sum / samples, worstX: run.worstX, worstY: run.worstY, samples };
}

/**
 * Bound f on the interval (x0, y0)→(x1, y1) of length `len` whose ends are at
 * exact distances f0, f1 from segments j0, j1 of the grid; raise `run.max` to the
 * bound once it is within `run.res` of an observed value, bisecting until then.
 */
function refine(
  run: Running, g: SegmentGrid, x0: number, y0: number, f0: number, j0: number,
  x1: number, y1: number, f1: number, j1: number, len: number, depth: number,
): void {
  let ub = (f0 + f1 + len) / 2; // Lipschitz
  if (j0 !== j1) {
    // Convexity along the nearest segments of both ends: the better of the two.
    const c0 = Math.max(f0, g.distTo(x1, y1, j0)), c1 = Math.max(g.distTo(x0, y0, j1), f1);
    const c = c0 < c1 ? c0 : c1;
    if (c < ub) ub = c;
  } else {
    const c = f0 > f1 ? f0 : f1;
    if (c < ub) ub = c;
  }
  if (ub <= run.max) return; // cannot raise the maximum
  const hi = f0 > f1 ? f0 : f1;
  const res = run.res;
  if (ub - hi <= res || len <= 2 * res || depth >= MAX_DEPTH) {
    run.max = ub;
    if (f0 >= f1) { run.worstX = x0; run.worstY = y0; } else { run.worstX = x1; run.worstY = y1; }
    return;
  }
  const xm = (x0 + x1) / 2, ym = (y0 + y1) / 2;
  const fm = g.nearestFrom(xm, ym, j0);
  const jm = g.hit;
  refine(run, g, x0, y0, f0, j0, xm, ym, fm, jm, len / 2, depth + 1);
  refine(run, g, xm, ym, fm, jm, x1, y1, f1, j1, len / 2, depth + 1);
}

/** Both directions between shapes `a` and `b`; `max` is the two-sided Hausdorff bound (mm). */
export function hausdorff(
  a: Float64Array[], b: Float64Array[], resolution = DEFAULT_RESOLUTION,
): { max: number; ab: DirectedDistance; ba: DirectedDistance } {
  const ab = directedDistance(a, b, buildSegmentIndex(b), resolution);
  const ba = directedDistance(b, a, buildSegmentIndex(a), resolution);
  return { max: Math.max(ab.max, ba.max), ab, ba };
}
