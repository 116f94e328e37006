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
import { findCorners, sharpestVertex } from './corners.js';
import { searchSpline } from './beam.js';
import { makePiece, type Piece } from './piece.js';
import { mergeNeighbours, sameCarrier, straightenFlatArcs } from './merge.js';

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

  // 4. Pieces between corners (or one seam piece for a smooth closed contour).
  const extent = bboxDiagonal(cxy);
  const maxRadius = Math.max(20 * extent, 1e4 * tol);
  const out: Segment[] = [];
  let breaks = 0;
  const emit = (pieces: Piece[], map: (j: number) => number): void => {
    for (const p of pieces) {
      out.push(toSegment(p, map, ox, oy, orig, coarseIdx));
    }
  };
  if (!closed || cornersC.length > 0) {
    let bounds: number[];
    if (!closed) bounds = [...new Set([0, ...cornersC, mc - 1])].sort((a, b) => a - b);
    else bounds = [...cornersC, cornersC[0] + mc];
    for (let q = 0; q + 1 < bounds.length; q++) {
      const from = bounds[q], to = bounds[q + 1];
      const pts = slice(cxy, mc, from, to);
      const res = fitOpen(pts, to - from, tolFit, width, maxRadius);
      breaks += res.breaks;
      emit(res.pieces, (j) => (from + j) % mc);
    }
  } else {
    const seam = sharpestVertex(cxy, true, 5 * tolFit);
    let res = fitClosed(slice(cxy, mc, seam, seam + mc), mc, tolFit, width, maxRadius);
    let shift = seam;
    // Two pieces on one circle across the seam: move the seam to the first knot and search again.
    if (res.pieces.length > 2 && sameCarrier(res.pieces[res.pieces.length - 1], res.pieces[0], tolFit)) {
      const s2 = (seam + res.pieces[0].b) % mc;
      const again = fitClosed(slice(cxy, mc, s2, s2 + mc), mc, tolFit, width, maxRadius);
      if (again.pieces.length < res.pieces.length) {
        res = again;
        shift = s2;
      }
    }
    breaks += res.breaks;
    emit(res.pieces, (j) => (shift + j) % mc);
  }
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

/** Vertices from..to (indices modulo mc) as their own flat array. */
function slice(cxy: Float64Array, mc: number, from: number, to: number): Float64Array {
  const out = new Float64Array(2 * (to - from + 1));
  for (let j = from; j <= to; j++) {
    const k = j % mc;
    out[2 * (j - from)] = cxy[2 * k];
    out[2 * (j - from) + 1] = cxy[2 * k + 1];
  }
  return out;
}

interface PieceRun {
  pieces: Piece[];
  breaks: number;
}

/** An open run of vertices 0..last: free tangents at both ends. */
function fitOpen(pts: Float64Array, last: number, tol: number, width: number, maxRadius: number): PieceRun {
  const all: Piece[] = [];
  let breaks = 0;
  let start = 0, qx = pts[0], qy = pts[1];
  for (;;) {
    const res = searchSpline({ pts, start, last, qx, qy, closed: false, tol, width });
    if (res.complete) {
      all.push(...res.pieces);
      break;
    }
    breaks++;
    if (res.pieces.length > 0) {
      all.push(...res.pieces);
      const p = res.pieces[res.pieces.length - 1];
      start = p.b;
      qx = p.x1;
      qy = p.y1;
    } else {
      // No piece at all from here: a straight step to the next vertex (always within tol of both).
      const ex = pts[2 * start + 2], ey = pts[2 * start + 3];
      const l = Math.hypot(ex - qx, ey - qy);
      const p = makePiece(pts, start, start + 1, -(ex - qx) / l, -(ey - qy) / l, 0, qx, qy, ex, ey, tol);
      if (p) all.push(p);
      start++;
      qx = ex;
      qy = ey;
    }
  }
  return { pieces: straightenFlatArcs(pts, mergeNeighbours(pts, all, tol), maxRadius, tol), breaks };
}

/** A closed run whose pts end with the seam vertex again: the spline must close smoothly there. */
function fitClosed(pts: Float64Array, last: number, tol: number, width: number, maxRadius: number): PieceRun {
  const res = searchSpline({ pts, start: 0, last, qx: pts[0], qy: pts[1], closed: true, tol, width });
  if (!res.complete) {
    const open = fitOpen(pts, last, tol, width, maxRadius);
    return { pieces: open.pieces, breaks: open.breaks + 1 };
  }
  return { pieces: straightenFlatArcs(pts, mergeNeighbours(pts, res.pieces, tol), maxRadius, tol), breaks: 0 };
}

function toSegment(p: Piece, map: (j: number) => number, ox: number, oy: number, orig: Int32Array, coarseIdx: number[]): Segment {
  const m = new Float64Array(4);
  m[0] = p.ms;
  // Move the motor back from the local frame: the centre (−q/r, p/r) shifts by (ox, oy).
  m[1] = p.mp + p.mr * oy;
  m[2] = p.mq - p.mr * ox;
  m[3] = p.mr;
  return {
    kind: p.kind, motor: m,
    x0: p.x0 + ox, y0: p.y0 + oy, x1: p.x1 + ox, y1: p.y1 + oy,
    i0: orig[coarseIdx[map(p.a)]], i1: orig[coarseIdx[map(p.b)]],
  };
}
