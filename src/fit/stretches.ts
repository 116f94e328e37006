/**
 * The contour as stretches between boundaries: sharp corners (no tangent
 * condition), straight runs (./runs.ts: one line each, met tangentially), free
 * ends of an open contour, or, for a smooth closed contour without either, one
 * stretch round from a seam back to itself.
 */
import { endAt, searchSpline, type SearchEnd } from './beam.js';
import { makePiece, pieceStartTangent, type Piece } from './piece.js';
import { TANGENT_EPS } from './closure.js';
import { kasaCircle } from './circleFit.js';
import { mergeNeighbours, straightenFlatArcs } from './merge.js';
import { openSeeds, seamSeeds } from './seeds.js';
import type { Run } from './runs.js';
import { thinWithin } from './prefilter.js';
import { rotorCentreX, rotorCentreY } from '../pga/motor.js';

export interface StretchFit {
  /** Pieces in order; their a, b are thinned-vertex indices, possibly ≥ mc for a closed contour (take them mod mc). */
  pieces: Piece[];
  /** Tangent breaks the search had to make. */
  breaks: number;
}

interface Marker {
  at: number;
  run: Run | null;
}

export interface StretchParams {
  cxy: Float64Array;
  mc: number;
  closed: boolean;
  corners: number[];
  runs: Run[];
  tol: number;
  width: number;
  maxRadius: number;
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

function shift(pieces: Piece[], by: number): Piece[] {
  for (const p of pieces) {
    p.a += by;
    p.b += by;
  }
  return pieces;
}

/**
 * One stretch: vertices 0..last of pts from (qx, qy), with the given seeds and end.
 * Falls back to a fresh start (a tangent break) where the search gets stuck.
 */
function fitStretch(pts: Float64Array, last: number, qx: number, qy: number, seeds: number[][] | null, end: SearchEnd, sp: StretchParams): StretchFit {
  // Free at both ends (between corners): one line when the chord holds everything (a straight side, noisy or not).
  if (!seeds && end.kind === 'point') {
    const ex = pts[2 * last], ey = pts[2 * last + 1];
    const l = Math.hypot(ex - qx, ey - qy);
    const line = l > 0 ? makePiece(pts, 0, last, -(ex - qx) / l, -(ey - qy) / l, 0, qx, qy, ex, ey, sp.tol) : null;
    if (line && line.kind === 'line') return { pieces: [line], breaks: 0 };
  }
  const all: Piece[] = [];
  let breaks = 0;
  let start = 0;
  for (;;) {
    const s = seeds && start === 0 ? seeds : end.kind === 'seam' && start === 0 ? seamSeeds(pts, last) : openSeeds(pts, start, last, qx, qy);
    const res = searchSpline({ pts, start, last, qx, qy, seeds: s, end: end.kind === 'seam' && start > 0 ? endAt('point') : end, tol: sp.tol, width: sp.width });
    all.push(...res.pieces);
    if (res.complete) break;
    breaks++;
    if (res.pieces.length > 0) {
      const p = res.pieces[res.pieces.length - 1];
      start = p.b;
      qx = p.x1;
      qy = p.y1;
    } else {
      // No piece at all from here: a straight step to the next vertex (always within tol of both).
      const ex = pts[2 * start + 2], ey = pts[2 * start + 3];
      const l = Math.hypot(ex - qx, ey - qy);
      if (l > 0) all.push(makePiece(pts, start, start + 1, -(ex - qx) / l, -(ey - qy) / l, 0, qx, qy, ex, ey, sp.tol) ?? rawLine(qx, qy, ex, ey, start));
      start++;
      qx = ex;
      qy = ey;
    }
    if (start >= last) break;
  }
  const pieces = straightenFlatArcs(pts, mergeNeighbours(pts, all, sp.tol), sp.maxRadius, sp.tol);
  // Free at both ends (corner to corner, or an open end): straight moves where they need no more pieces.
  if (!seeds && end.kind === 'point' && pieces.length > 1) {
    const lines = stretchLines(pts, last, sp.tol);
    if (lines.length <= pieces.length) return { pieces: lines, breaks: 0 };
  }
  return { pieces, breaks };
}

/** Lines through a vertex subset of pts[0..last] within tol of it (./prefilter.ts), as pieces. */
function stretchLines(pts: Float64Array, last: number, tol: number): Piece[] {
  const kept = thinWithin(pts, last + 1, false, tol, null);
  const out: Piece[] = [];
  for (let j = 0; j + 1 < kept.length; j++) {
    const a = kept[j], b = kept[j + 1];
    const p = rawLine(pts[2 * a], pts[2 * a + 1], pts[2 * b], pts[2 * b + 1], a);
    p.b = b;
    if (p.x0 !== p.x1 || p.y0 !== p.y1) out.push(p);
  }
  return out;
}

/**
 * The straight step (qx, qy)–(ex, ey) as a piece without a check: a step the check refuses is still
 * drawn, so the pieces stay end to end (the contour's measurement then decides).
 */
function rawLine(qx: number, qy: number, ex: number, ey: number, a: number): Piece {
  const dx = ex - qx, dy = ey - qy, l = Math.hypot(dx, dy);
  return { kind: 'line', ms: 1, mp: -0.5 * dx, mq: -0.5 * dy, mr: 0, x0: qx, y0: qy, x1: ex, y1: ey, a, b: a + 1, tx: dx / l, ty: dy / l };
}

/** Fit the whole contour. */
export function fitStretches(sp: StretchParams): StretchFit {
  const { cxy, mc, closed } = sp;
  const markers: Marker[] = [];
  const cornerSet = new Set(sp.corners);
  if (!closed) {
    cornerSet.add(0);
    cornerSet.add(mc - 1);
  }
  for (const c of cornerSet) markers.push({ at: c, run: null });
  for (const r of sp.runs) markers.push({ at: r.j, run: r });
  markers.sort((u, v) => u.at - v.at || (u.run ? 1 : 0) - (v.run ? 1 : 0));
  if (closed && markers.length === 0) return fitSeam(sp);

  const out: Piece[] = [];
  let breaks = 0;
  const count = closed ? markers.length : markers.length - 1;
  let qx = NaN, qy = NaN;
  let seed: number[] | null = null;
  const first = markers[0].run;
  if (closed && first) {
    // Round a closed contour the first stretch starts where the first run's line ends (the last line written).
    qx = first.px + first.tEnd * first.dx;
    qy = first.py + first.tEnd * first.dy;
    seed = [first.dx, first.dy];
  }
  for (let k = 0; k < count; k++) {
    const A = markers[k], B = markers[(k + 1) % markers.length];
    const s = A.run ? A.at + 1 : A.at;
    const e = B.at + (closed && k + 1 === markers.length ? mc : 0);
    if (!Number.isFinite(qx) || !A.run) {
      qx = cxy[2 * (s % mc)];
      qy = cxy[2 * (s % mc) + 1];
    }
    const seeds = A.run && seed ? [seed] : null;
    if (e > s) {
      const pts = slice(cxy, mc, s, e);
      const end: SearchEnd = B.run ? lineEnd(B.run, pts, e - s, cxy, mc, e) : endAt('point');
      const fit = fitStretch(pts, e - s, qx, qy, seeds, end, sp);
      breaks += fit.breaks;
      out.push(...shift(fit.pieces, s));
      const lastPiece = fit.pieces[fit.pieces.length - 1];
      if (lastPiece) {
        qx = lastPiece.x1;
        qy = lastPiece.y1;
      }
    }
    if (B.run) {
      const line = runLine(B.run, e, qx, qy, out[out.length - 1] ?? null, sp.tol);
      if (line) {
        out.push(line);
        qx = line.x1;
        qy = line.y1;
        seed = [line.tx, line.ty];
      }
    }
  }
  return { pieces: out, breaks };
}

/** The end condition of a stretch followed by run r whose first vertex is thinned vertex e. */
function lineEnd(r: Run, pts: Float64Array, last: number, cxy: Float64Array, mc: number, e: number): SearchEnd {
  const at = (x: number, y: number): number => (x - r.px) * r.dx + (y - r.py) * r.dy;
  const tE = at(pts[2 * last], pts[2 * last + 1]);
  const tPrev = last > 0 ? at(pts[2 * last - 2], pts[2 * last - 1]) : tE;
  const n1 = (e + 1) % mc;
  const tNext = at(cxy[2 * n1], cxy[2 * n1 + 1]);
  return { kind: 'line', px: r.px, py: r.py, dx: r.dx, dy: r.dy, tMin: Math.min(tPrev, tE), tMax: tNext };
}

/** The run's line piece from (qx, qy) to where its straight part ends. */
function runLine(r: Run, e: number, qx: number, qy: number, prev: Piece | null, tol: number): Piece | null {
  const ex = r.px + r.tEnd * r.dx, ey = r.py + r.tEnd * r.dy;
  const dx = ex - qx, dy = ey - qy;
  const l = Math.hypot(dx, dy);
  if (!(l > 0)) return null;
  // The rotor step from the previous motor (or a seed along the run) through the run's end: a translation.
  const bp = prev ? prev.mp : -dx / l, bq = prev ? prev.mq : -dy / l, br = prev ? prev.mr : 0;
  const p = makePiece(new Float64Array([qx, qy, ex, ey]), 0, 1, bp, bq, br, qx, qy, ex, ey, tol);
  const piece: Piece = p && p.kind === 'line' ? p : { kind: 'line', ms: 1, mp: -0.5 * dx, mq: -0.5 * dy, mr: 0, x0: qx, y0: qy, x1: ex, y1: ey, a: 0, b: 1, tx: dx / l, ty: dy / l };
  piece.a = e;
  piece.b = e + 1;
  return piece;
}

/** A smooth closed contour: one stretch from a seam round to itself, closing with the seam's tangent. */
function fitSeam(sp: StretchParams): StretchFit {
  const { cxy, mc } = sp;
  // The seam is the contour's own start: a closed cut starts where the drawing starts it (the pierce
  // point). Measured on the corpus (bench/realdata.ts) and the standard curves, a seam at the vertex that
  // turns most saved no pieces worth moving the start for.
  const pts = slice(cxy, mc, 0, mc);
  const fit = fitStretch(pts, mc, pts[0], pts[1], null, endAt('seam'), sp);
  const halves = fit.pieces.length >= 2 ? wholeCircle(pts, mc, fit.pieces, sp.tol) : null;
  return halves ? { pieces: halves, breaks: fit.breaks } : fit;
}

/**
 * A smooth closed contour that is a circle comes back as two half turns on it: the arcs through knots
 * at vertices take the circle of those vertices, noise and all, and a whole circle fitted from a seam
 * often ends as one arc nearly all the way round and a sliver (no feature of the input; and a near-full
 * arc is the worst conditioned to write, its ends almost meet). Tried on the circle of all the vertices
 * (an algebraic fit, ./circleFit.ts), then, when the spline is two arcs of one circle, on that circle.
 * Both halves are rotor steps (./piece.ts) from the start's tangent through the point opposite it, so
 * the tangent stays continuous; null when neither fits.
 */
function wholeCircle(pts: Float64Array, last: number, pieces: Piece[], tol: number): Piece[] | null {
  const A = pieces[0];
  if (A.kind !== 'arc' || pieces.some((p) => p.kind !== 'arc')) return null;
  const c = kasaCircle(pts, last);
  if (c) {
    const onFit = halvesOn(pts, last, c.cx, c.cy, c.r, A, tol);
    if (onFit) return onFit;
  }
  if (pieces.length !== 2) return null;
  const B = pieces[1];
  const ax = rotorCentreX(A.mq, A.mr), ay = rotorCentreY(A.mp, A.mr), bx = rotorCentreX(B.mq, B.mr), by = rotorCentreY(B.mp, B.mr);
  const r = Math.hypot(A.x0 - ax, A.y0 - ay);
  if (!(Math.hypot(ax - bx, ay - by) <= 1e-9 * r && Math.abs(Math.hypot(B.x0 - bx, B.y0 - by) - r) <= 1e-9 * r)) return null;
  return halvesOn(pts, last, ax, ay, r, A, tol);
}

function halvesOn(pts: Float64Array, last: number, cx: number, cy: number, r: number, A: Piece, tol: number): Piece[] | null {
  const ux = pts[0] - cx, uy = pts[1] - cy, ul = Math.hypot(ux, uy);
  if (!(ul > 0)) return null;
  const sx = cx + (r * ux) / ul, sy = cy + (r * uy) / ul;
  if (Math.hypot(sx - pts[0], sy - pts[1]) > tol) return null;
  // The turning sense of the fitted arcs: A's tangent against its radius.
  const [t0x, t0y] = pieceStartTangent(A);
  const sg = Math.sign(ux * t0y - uy * t0x) || 1;
  const tx = (-sg * uy) / ul, ty = (sg * ux) / ul;
  const ox = 2 * cx - sx, oy = 2 * cy - sy;
  let split = 0, best = Infinity;
  for (let k = 1; k < last; k++) {
    const d = (pts[2 * k] - ox) ** 2 + (pts[2 * k + 1] - oy) ** 2;
    if (d < best) {
      best = d;
      split = k;
    }
  }
  // The junction: the foot on the circle of the vertex nearest the opposite point (a knot at a vertex, so
  // each half stands for the vertices on its side; the halves then turn about half a turn each).
  const vx = pts[2 * split] - cx, vy = pts[2 * split + 1] - cy, vl = Math.hypot(vx, vy);
  if (split === 0 || !(vl > 0)) return null;
  const jx = cx + (r * vx) / vl, jy = cy + (r * vy) / vl;
  const first = makePiece(pts, 0, split, -tx, -ty, 0, sx, sy, jx, jy, tol);
  const second = first ? makePiece(pts, split, last, first.mp, first.mq, first.mr, jx, jy, sx, sy, tol) : null;
  if (!first || !second || first.kind !== 'arc' || second.kind !== 'arc') return null;
  if (second.tx * tx + second.ty * ty <= 0 || Math.abs(second.tx * ty - second.ty * tx) > TANGENT_EPS) return null;
  return [first, second];
}
