/**
 * One candidate piece of the spline: the rotor step from the previous motor
 * through the next knot, classified as arc or line and checked against the
 * vertices it stands for.
 */
import { arcStepScalar } from '../pga/arcStep.js';
import { arcFits, len2, lineFits } from './check.js';


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

/** The step's motor before it is known to fit; copied out only for pieces that pass. */
const scratch = new Float64Array(4);

/**
 * Build the piece from (qx, qy) to (ex, ey) continuing the motor whose bivector
 * part is (bp, bq, br), and check it against vertices a..b. Null if degenerate or
 * outside the tolerance.
 */
export function makePiece(
  pts: Float64Array, a: number, b: number,
  bp: number, bq: number, br: number,
  qx: number, qy: number, ex: number, ey: number, tol: number,
): Piece | null {
  const dx = ex - qx, dy = ey - qy;
  const chord = Math.sqrt(dx * dx + dy * dy);
  if (!(chord > 0)) return null;
  const m = scratch;
  if (!arcStepScalar(m, 0, bp, bq, br, qx, qy, ex, ey)) return null;
  const s = m[0], r = m[3];
  const halfAngle = Math.abs(Math.atan2(r, s)); // |φ|: half the arc's central angle
  const sagitta = 0.5 * chord * Math.tan(0.5 * halfAngle);
  if (sagitta <= LINE_SAGITTA * tol) {
    // The two lines of the step were parallel up to rounding: a translation.
    if (!lineFits(pts, a, b, qx, qy, ex, ey, tol)) return null;
    return { kind: 'line', ms: 1, mp: -0.5 * dx, mq: -0.5 * dy, mr: 0, x0: qx, y0: qy, x1: ex, y1: ey, a, b, tx: dx / chord, ty: dy / chord };
  }
  const cx = -m[2] / r, cy = m[1] / r;
  const rad = len2(qx - cx, qy - cy);
  const sweep = -2 * Math.atan2(r, s);
  if (!arcFits(pts, a, b, cx, cy, rad, sweep, qx, qy, ex, ey, tol)) return null;
  // Tangent at the end: the radius vector turned by ±90° in the sweep direction.
  const sg = sweep > 0 ? 1 : -1;
  const tx = (-sg * (ey - cy)) / rad, ty = (sg * (ex - cx)) / rad;
  return { kind: 'arc', ms: s, mp: m[1], mq: m[2], mr: r, x0: qx, y0: qy, x1: ex, y1: ey, a, b, tx, ty };
}

/** Unit tangent at the start of a piece (for tests and the closure). */
export function pieceStartTangent(p: Piece): [number, number] {
  if (p.kind === 'line') {
    const l = len2(p.x1 - p.x0, p.y1 - p.y0);
    return [(p.x1 - p.x0) / l, (p.y1 - p.y0) / l];
  }
  const r = p.mr;
  const cx = -p.mq / r, cy = p.mp / r;
  const rad = len2(p.x0 - cx, p.y0 - cy);
  const sg = -2 * Math.atan2(r, p.ms) > 0 ? 1 : -1;
  return [(-sg * (p.y0 - cy)) / rad, (sg * (p.x0 - cx)) / rad];
}
