/**
 * Fit a polyline (open or closed, in mm) with the fewest tangent-continuous
 * circular arcs and lines within a tolerance: the library's core call.
 *
 * Stages: drop repeated vertices → thin within a small share of the tolerance
 * (./prefilter.ts) → find sharp corners (./corners.ts) → between corners, search
 * knots for the rotor spline (./beam.ts) → merge neighbours on one circle and
 * straighten absurd radii (./merge.ts) → report segments with their motors and
 * the input vertex ranges they stand for.
 */
import type { Segment } from './segment.js';
import { thinWithin } from './prefilter.js';
import { findCorners } from './corners.js';
import type { Piece } from './piece.js';
import { findRuns } from './runs.js';
import { fitStretches } from './stretches.js';

export interface FitOptions {
  /** Largest allowed two-sided distance between input and fit (same units as xy, normally mm). */
  tolerance: number;
  /** Whether the last vertex joins back to the first. Default false. */
  closed?: boolean;
  /** Turns sharper than this (degrees) stay sharp corners. Default 30. */
  cornerAngle?: number;
  /** Vertex indices that must stay corners (tangent breaks in the source). */
  corners?: ArrayLike<number>;
  /** Candidates kept per level of the knot search. Default 12. */
  beamWidth?: number;
}

export interface FitResult {
  segments: Segment[];
  /** Input vertex indices kept as sharp corners. */
  corners: number[];
  /** Places where the search found no tangent-continuous way on and the spline breaks (rare; noisy input). */
  breaks: number;
}

/** Share of the tolerance spent on thinning the input before fitting. */
const THIN_SHARE = 0.05;
/** Share of the tolerance the arcs may use (the rest is margin for rounding in the checks). */
const FIT_SHARE = 0.94;

/** Fit `xy` (flat x,y pairs) with arcs and lines. */
export function fitPolyline(xy: Float64Array, opts: FitOptions): FitResult {
  const tol = opts.tolerance;
  if (!(tol > 0) || !Number.isFinite(tol)) throw new RangeError(`tolerance must be positive and finite, got ${tol}`);
  const closedIn = opts.closed ?? false;
  const angle = ((opts.cornerAngle ?? 30) * Math.PI) / 180;
  const width = opts.beamWidth ?? 12;
  const n = xy.length >> 1;
  for (let i = 0; i < 2 * n; i++) {
    if (!Number.isFinite(xy[i])) throw new RangeError(`coordinate ${i >> 1} is not finite: ${xy[i]}`);
  }
  // 1. Distinct consecutive vertices, in a local frame at the first vertex (keeps precision far from the origin).
  const ox = n > 0 ? xy[0] : 0, oy = n > 0 ? xy[1] : 0;
  const orig = new Int32Array(n);
  const clean = new Float64Array(2 * n);
  let m = 0;
  for (let i = 0; i < n; i++) {
    const x = xy[2 * i] - ox, y = xy[2 * i + 1] - oy;
    if (m > 0 && clean[2 * m - 2] === x && clean[2 * m - 1] === y) continue;
    clean[2 * m] = x;
    clean[2 * m + 1] = y;
    orig[m++] = i;
  }
  if (closedIn && m > 1 && clean[0] === clean[2 * m - 2] && clean[1] === clean[2 * m - 1]) m--;
  const closed = closedIn && m >= 3;
  const forced = new Set<number>();
  if (opts.corners) {
    const pos = new Map<number, number>();
    for (let k = 0; k < m; k++) pos.set(orig[k], k);
    for (let i = 0; i < opts.corners.length; i++) {
      const k = pos.get(opts.corners[i]);
      if (k !== undefined) forced.add(k);
    }
  }
  if (m < 2) return { segments: [], corners: [], breaks: 0 };
  const tolFit = FIT_SHARE * tol - THIN_SHARE * tol;

  // 2. Thin (closed: walk round and back to vertex 0).
  const order = new Int32Array(closed ? m + 1 : m);
  for (let k = 0; k < m; k++) order[k] = k;
  const anchors = new Uint8Array(order.length);
  for (const k of forced) anchors[k] = 1;
  const keptPos = thinWithin(clean, order, THIN_SHARE * tol, anchors);
  const coarseIdx: number[] = [];
  for (let j = 0; j < keptPos.length; j++) coarseIdx.push(order[keptPos[j]]);
  if (closed) coarseIdx.pop(); // vertex 0 again
  const mc = coarseIdx.length;
  const cxy = new Float64Array(2 * mc);
  for (let j = 0; j < mc; j++) {
    cxy[2 * j] = clean[2 * coarseIdx[j]];
    cxy[2 * j + 1] = clean[2 * coarseIdx[j] + 1];
  }

  // 3. Corners on the thinned polyline, plus the forced ones.
  const cornerSet = new Set<number>(findCorners(cxy, closed, 5 * tolFit, angle));
  coarseIdx.forEach((c, j) => {
    if (forced.has(c)) cornerSet.add(j);
  });
  const cornersC = [...cornerSet].sort((a, b) => a - b);

  // 4. Straight runs, then the stretches between runs and corners.
  const runs = findRuns(clean, m, coarseIdx, closed, tolFit);
  const extent = bboxDiagonal(cxy);
  const fit = fitStretches({
    cxy, mc, closed, corners: cornersC, runs, tol: tolFit, width,
    maxRadius: Math.max(20 * extent, 1e4 * tol), scale: 5 * tolFit,
  });
  const out = fit.pieces.map((p) => toSegment(p, mc, ox, oy, orig, coarseIdx));
  const breaks = fit.breaks;
  const cornersOut = cornersC.map((j) => orig[coarseIdx[j]]);
  return { segments: out, corners: cornersOut, breaks };
}

function bboxDiagonal(xy: Float64Array): number {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (let i = 0; i < xy.length; i += 2) {
    if (xy[i] < x0) x0 = xy[i];
    if (xy[i] > x1) x1 = xy[i];
    if (xy[i + 1] < y0) y0 = xy[i + 1];
    if (xy[i + 1] > y1) y1 = xy[i + 1];
  }
  return Math.hypot(x1 - x0, y1 - y0);
}

function toSegment(p: Piece, mc: number, ox: number, oy: number, orig: Int32Array, coarseIdx: number[]): Segment {
  const m = new Float64Array(4);
  m[0] = p.ms;
  // Move the motor back from the local frame: the centre (−q/r, p/r) shifts by (ox, oy).
  m[1] = p.mp + p.mr * oy;
  m[2] = p.mq - p.mr * ox;
  m[3] = p.mr;
  return {
    kind: p.kind, motor: m,
    x0: p.x0 + ox, y0: p.y0 + oy, x1: p.x1 + ox, y1: p.y1 + oy,
    i0: orig[coarseIdx[p.a % mc]], i1: orig[coarseIdx[p.b % mc]],
  };
}
