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
import { concentratedTurn, findCorners } from './corners.js';
import type { Piece } from './piece.js';
import { findRuns } from './runs.js';
import { fitStretches } from './stretches.js';
import { FIT_ARC_SHARE, FIT_LINES_SHARE, FIT_THIN_SHARE } from '../budget.js';
import { thinnedLines } from './thinLines.js';
import { startAt } from './pierce.js';

export interface FitOptions {
  /** Largest allowed two-sided distance between input and fit (same units as xy, normally mm). */
  tolerance: number;
  /** Whether the last vertex joins back to the first. Default false. */
  closed?: boolean;
  /** Turns sharper than this (degrees) stay sharp corners. Default 30. */
  cornerAngle?: number;
  /** Vertex indices where the source has a tangent break; each stays a corner where it turns by cornerAngle or more at the tolerance's scale. */
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
  /** What the segments are: the arc spline, or straight moves through a vertex subset (./thinLines.ts) where those need no more pieces. */
  choice: 'spline' | 'lines';
}

/** Shares of the tolerance for thinning and for the arcs: src/budget.ts owns the split. */
const THIN_SHARE = FIT_THIN_SHARE;
const FIT_SHARE = FIT_ARC_SHARE;
/** Share of the tolerance the straight-move alternative (./thinLines.ts) uses (src/budget.ts). */
export const LINES_SHARE = FIT_LINES_SHARE;

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
  if (n < 2) return { segments: [], corners: [], breaks: 0, choice: 'spline' };
  const forcedIdx = opts.corners ? Int32Array.from(opts.corners).filter((k) => k >= 0 && k < n).sort() : null;

  // 1. Thin the input within a small share of the tolerance (closed: walk round and back to vertex 0);
  //    exactly repeated vertices drop out here.
  const kept = thinWithin(xy, n, closedIn, THIN_SHARE * tol, forcedIdx);
  const coarseIdx: number[] = [];
  for (let j = 0; j < kept.length; j++) {
    const k = kept[j];
    const prev = coarseIdx.length > 0 ? coarseIdx[coarseIdx.length - 1] : -1;
    if (prev >= 0 && xy[2 * k] === xy[2 * prev] && xy[2 * k + 1] === xy[2 * prev + 1]) continue;
    coarseIdx.push(k);
  }
  if (closedIn) {
    // The walk came back to vertex 0 (or to a copy of it): do not keep it twice.
    while (coarseIdx.length > 1 && xy[2 * coarseIdx[coarseIdx.length - 1]] === xy[0] && xy[2 * coarseIdx[coarseIdx.length - 1] + 1] === xy[1]) coarseIdx.pop();
  }
  if (coarseIdx.length < 2) {
    // Everything within a sliver of the tolerance of one point (a speck): straight moves still draw it.
    const lines = thinnedLines(xy, closedIn, LINES_SHARE * tol);
    return { segments: lines, corners: lines.map((s) => s.i0), breaks: 0, choice: 'lines' };
  }
  // A closed contour of two distinct vertices runs out and back: fit it open, back to its start.
  if (closedIn && coarseIdx.length === 2) coarseIdx.push(coarseIdx[0]);
  const mc = coarseIdx.length;
  // The arcs get the fit's share less what the thinning may have cost: nothing when it dropped no vertex
  // but exact repeats (a coarse polyline, a grid-snapped font), where the thinned polyline is the input.
  let distinct = n > 0 ? 1 : 0;
  for (let i = 1; i < n; i++) if (xy[2 * i] !== xy[2 * i - 2] || xy[2 * i + 1] !== xy[2 * i - 1]) distinct++;
  if (closedIn && n > 1 && xy[2 * n - 2] === xy[0] && xy[2 * n - 1] === xy[1]) distinct--;
  const tolFit = (mc >= distinct ? FIT_SHARE : FIT_SHARE - THIN_SHARE) * tol;
  const closed = closedIn && mc >= 3 && coarseIdx[mc - 1] !== coarseIdx[0];
  // The fitter works in a local frame at the first vertex (keeps precision far from the origin).
  const ox = xy[0], oy = xy[1];
  const cxy = new Float64Array(2 * mc);
  for (let j = 0; j < mc; j++) {
    cxy[2 * j] = xy[2 * coarseIdx[j]] - ox;
    cxy[2 * j + 1] = xy[2 * coarseIdx[j] + 1] - oy;
  }
  const forced = new Set<number>(forcedIdx ?? []);

  // 3. Corners on the thinned polyline, plus the forced ones.
  const cornerSet = new Set<number>(findCorners(cxy, closed, 5 * tolFit, angle));
  // A tangent break in the source (a join of two curves) stays a corner unless it sits among joins of
  // pieces shorter than the tolerance's scale (where the source is made of tiny pieces), and there only
  // where it turns by the corner angle at that scale.
  const scale = 5 * tolFit;
  const forcedJ: number[] = [];
  coarseIdx.forEach((c, j) => {
    if (forced.has(c)) forcedJ.push(j);
  });
  forcedJ.forEach((j, k) => {
    const near = (o: number): boolean => {
      if (forcedJ.length < 2 || (!closed && (o < 0 || o >= forcedJ.length))) return false;
      const i = forcedJ[(o + forcedJ.length) % forcedJ.length];
      return i !== j && len(cxy, i, j) < scale;
    };
    if (!(near(k - 1) || near(k + 1)) || concentratedTurn(cxy, closed, j, scale) >= angle) cornerSet.add(j);
  });
  const cornersC = [...cornerSet].sort((a, b) => a - b);

  // 4. Straight runs, then the stretches between runs and corners.
  const runs = findRuns(xy, n, coarseIdx, closed, tolFit);
  for (const r of runs) {
    r.px -= ox;
    r.py -= oy;
  }
  const extent = bboxDiagonal(cxy);
  const fit = fitStretches({
    cxy, mc, closed, corners: cornersC, runs, tol: tolFit, width,
    maxRadius: Math.max(20 * extent, 1e4 * tol),
  });
  const fitted = fit.pieces.map((p) => toSegment(p, mc, ox, oy, coarseIdx));
  // A closed contour starts where the drawing starts it (the pierce point), as near as its knots allow.
  const out = closed ? startAt(fitted, xy[0], xy[1]) : fitted;
  const breaks = fit.breaks;
  const cornersOut = cornersC.map((j) => coarseIdx[j]);
  // Never worse than straight moves: where lines through a vertex subset need no more pieces (noisy
  // coastlines, coarse grids, tiny islands), they are the fit, and fewer bytes. They are proven within the
  // tolerance by construction, so they take nearly all of it (the spline keeps a margin for its own checks).
  const lines = thinnedLines(xy, closedIn, LINES_SHARE * tol);
  if (lines.length > 0 && (out.length === 0 || lines.length <= out.length)) return { segments: lines, corners: lines.map((s) => s.i0), breaks: 0, choice: 'lines' };
  return { segments: out, corners: cornersOut, breaks, choice: 'spline' };
}

/** Distance between vertices i and j of flat x,y pairs. */
function len(xy: Float64Array, i: number, j: number): number {
  return Math.hypot(xy[2 * i] - xy[2 * j], xy[2 * i + 1] - xy[2 * j + 1]);
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

function toSegment(p: Piece, mc: number, ox: number, oy: number, coarseIdx: number[]): Segment {
  const m = new Float64Array(4);
  m[0] = p.ms;
  // Move the motor back from the local frame: the centre (−q/r, p/r) shifts by (ox, oy).
  m[1] = p.mp + p.mr * oy;
  m[2] = p.mq - p.mr * ox;
  m[3] = p.mr;
  return {
    kind: p.kind, motor: m,
    x0: p.x0 + ox, y0: p.y0 + oy, x1: p.x1 + ox, y1: p.y1 + oy,
    i0: coarseIdx[p.a % mc], i1: coarseIdx[p.b % mc],
  };
}
