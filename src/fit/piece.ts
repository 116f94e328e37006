/**
 * One candidate piece of the spline: the rotor step from the previous motor
 * through the next knot, classified as arc or line and checked against the
 * vertices it stands for.
 */
import { arcStepScalar } from '../pga/arcStep.js';
import { rotorCentreX, rotorCentreY, rotorSweep } from '../pga/motor.js';
import { arcFitsIn, FIT_ARGS, FIT_CX, FIT_CY, FIT_R, FIT_SWEEP, len2, lineFitsIn, setEnds } from './check.js';


/** A piece between two knots, with the motor that carries its start to its end. */
export interface Piece {
  kind: 'arc' | 'line';
  /** Normalised motor ms + mp e01 + mq e02 + mr e12. */
  ms: number;
  mp: number;
  mq: number;
  mr: number;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  /** Vertex range [a, b] it stands for, in the fitter's local vertex numbering. */
  a: number;
  b: number;
  /** Unit tangent at the end. */
  tx: number;
  ty: number;
}

/** An arc whose sagitta is below this fraction of the tolerance is a line. */
const LINE_SAGITTA = 1e-6;

/** What `tryPiece` found: no piece, a line or an arc. */
export const NO_PIECE = 0, LINE_PIECE = 1, ARC_PIECE = 2;

/**
 * Layout of the record `tryPiece` writes: the normalised motor (s, e01, e02,
 * e12), the end point and the unit tangent there.
 */
export const PIECE_MS = 0, PIECE_MP = 1, PIECE_MQ = 2, PIECE_MR = 3, PIECE_X1 = 4, PIECE_Y1 = 5, PIECE_TX = 6, PIECE_TY = 7;
/** Numbers in one piece record. */
export const PIECE_FIELDS = 8;

/**
 * Slots of the argument block of `tryPiece` (numbers passed in a Float64Array,
 * which boxes none; see ./check.ts): the previous motor's bivector part, the
 * start and end points and the tolerance.
 */
export const STEP_BP = 0, STEP_BQ = 1, STEP_BR = 2, STEP_QX = 3, STEP_QY = 4, STEP_EX = 5, STEP_EY = 6, STEP_TOL = 7;
/** Numbers in the argument block of `tryPiece`. */
export const STEP_ARGS = 8;

/** The check's argument block (one per thread; the checks never run inside each other). */
const fit = new Float64Array(FIT_ARGS);

/**
 * Build the piece from (qx, qy) to (ex, ey) continuing the motor whose bivector
 * part is (bp, bq, br), all given in the block `g` (STEP_ slots), and check it
 * against vertices a..b. Writes the piece's record at out[o..o + PIECE_FIELDS)
 * when it fits and allocates nothing (the search calls it for every candidate
 * knot).
 * @returns NO_PIECE if degenerate or outside the tolerance, else LINE_PIECE or ARC_PIECE
 */
export function tryPiece(out: Float64Array, o: number, pts: Float64Array, a: number, b: number, g: Float64Array): number {
  const qx = g[STEP_QX], qy = g[STEP_QY], ex = g[STEP_EX], ey = g[STEP_EY], tol = g[STEP_TOL];
  const dx = ex - qx, dy = ey - qy;
  const chord = Math.sqrt(dx * dx + dy * dy);
  if (!(chord > 0)) return NO_PIECE;
  if (!arcStepScalar(out, o, g[STEP_BP], g[STEP_BQ], g[STEP_BR], qx, qy, ex, ey)) return NO_PIECE;
  const s = out[o + PIECE_MS], r = out[o + PIECE_MR];
  const halfAngle = Math.abs(Math.atan2(r, s)); // |φ|: half the arc's central angle
  const sagitta = 0.5 * chord * Math.tan(0.5 * halfAngle);
  out[o + PIECE_X1] = ex;
  out[o + PIECE_Y1] = ey;
  setEnds(fit, qx, qy, ex, ey, tol);
  if (sagitta <= LINE_SAGITTA * tol) {
    // The two lines of the step were parallel up to rounding: a translation.
    if (!lineFitsIn(pts, a, b, fit)) return NO_PIECE;
    out[o + PIECE_MS] = 1;
    out[o + PIECE_MP] = -0.5 * dx;
    out[o + PIECE_MQ] = -0.5 * dy;
    out[o + PIECE_MR] = 0;
    out[o + PIECE_TX] = dx / chord;
    out[o + PIECE_TY] = dy / chord;
    return LINE_PIECE;
  }
  const cx = rotorCentreX(out[o + PIECE_MQ], r), cy = rotorCentreY(out[o + PIECE_MP], r);
  const rad = len2(qx - cx, qy - cy);
  const sweep = rotorSweep(s, r);
  fit[FIT_CX] = cx;
  fit[FIT_CY] = cy;
  fit[FIT_R] = rad;
  fit[FIT_SWEEP] = sweep;
  if (!arcFitsIn(pts, a, b, fit)) return NO_PIECE;
  // Tangent at the end: the radius vector turned by ±90° in the sweep direction.
  const sg = sweep > 0 ? 1 : -1;
  out[o + PIECE_TX] = (-sg * (ey - cy)) / rad;
  out[o + PIECE_TY] = (sg * (ex - cx)) / rad;
  return ARC_PIECE;
}

/** The piece of a record `tryPiece` wrote (kind LINE_PIECE or ARC_PIECE), starting at (x0, y0). */
export function pieceFrom(rec: Float64Array, o: number, kind: number, a: number, b: number, x0: number, y0: number): Piece {
  return {
    kind: kind === LINE_PIECE ? 'line' : 'arc',
    ms: rec[o + PIECE_MS], mp: rec[o + PIECE_MP], mq: rec[o + PIECE_MQ], mr: rec[o + PIECE_MR],
    x0, y0, x1: rec[o + PIECE_X1], y1: rec[o + PIECE_Y1], a, b, tx: rec[o + PIECE_TX], ty: rec[o + PIECE_TY],
  };
}

const scratch = new Float64Array(PIECE_FIELDS);
const args = new Float64Array(STEP_ARGS);

/**
 * `tryPiece` returning the piece as an object, or null if degenerate or
 * outside the tolerance.
 */
export function makePiece(
  pts: Float64Array, a: number, b: number,
  bp: number, bq: number, br: number,
  qx: number, qy: number, ex: number, ey: number, tol: number,
): Piece | null {
  const g = args;
  g[STEP_BP] = bp;
  g[STEP_BQ] = bq;
  g[STEP_BR] = br;
  g[STEP_QX] = qx;
  g[STEP_QY] = qy;
  g[STEP_EX] = ex;
  g[STEP_EY] = ey;
  g[STEP_TOL] = tol;
  const kind = tryPiece(scratch, 0, pts, a, b, g);
  return kind === NO_PIECE ? null : pieceFrom(scratch, 0, kind, a, b, qx, qy);
}

/** Unit tangent at the start of a piece (for tests and the closure). */
export function pieceStartTangent(p: Piece): [number, number] {
  if (p.kind === 'line') {
    const l = len2(p.x1 - p.x0, p.y1 - p.y0);
    return [(p.x1 - p.x0) / l, (p.y1 - p.y0) / l];
  }
  const r = p.mr;
  const cx = rotorCentreX(p.mq, r), cy = rotorCentreY(p.mp, r);
  const rad = len2(p.x0 - cx, p.y0 - cy);
  const sg = rotorSweep(p.ms, r) > 0 ? 1 : -1;
  return [(-sg * (p.y0 - cy)) / rad, (sg * (p.x0 - cx)) / rad];
}
