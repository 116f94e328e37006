/**
 * Closing a smooth closed contour: the last stretch must arrive at the seam with
 * the seam's start tangent. A biarc does that (Bolton, "Biarc curves", CAD 7(2),
 * 1975): two arcs meeting tangentially at a junction J chosen here with equal
 * tangent lengths. Both halves are rotor arcs (./piece.ts): the first continues
 * the spline into J, the second continues the first into the seam.
 */
import { makePiece, type Piece } from './piece.js';

/** Largest sine of the angle between two tangents that still counts as the same tangent. */
export const TANGENT_EPS = 1e-7;

/**
 * Biarc from knot (qx, qy) with tangent (tx, ty) and motor bivector (bp, bq, br),
 * standing for vertices a..last, to (ex, ey) (at or within tol of pts[last])
 * arriving with tangent (t0x, t0y).
 */
export function biarcClosure(
  pts: Float64Array, a: number, last: number,
  bp: number, bq: number, br: number,
  qx: number, qy: number, tx: number, ty: number,
  ex: number, ey: number, t0x: number, t0y: number, tol: number,
): [Piece, Piece] | null {
  const vx = ex - qx, vy = ey - qy;
  const sx = tx + t0x, sy = ty + t0y;
  const tt = sx * sx + sy * sy, vt = vx * sx + vy * sy, vv = vx * vx + vy * vy;
  if (!(vv > 0)) return null;
  // Equal tangent lengths d: |v − d(t_a + t_0)| = 2d.
  let d: number;
  if (Math.abs(tt - 4) < 1e-12) {
    if (!(vt > 0)) return null;
    d = vv / (2 * vt);
  } else {
    const disc = vt * vt - (tt - 4) * vv;
    d = (vt - Math.sqrt(Math.max(0, disc))) / (tt - 4);
  }
  if (!(d > 0) || !Number.isFinite(d)) return null;
  // The equal-length biarc first, then others of the one-parameter family: for a first tangent
  // length d1 the second is d2 = (|w|² − d1²) / (2 (w·t_0 + d1)) with w = v − d1 t_a, and the
  // junction divides the control segment in the ratio d1 : d2.
  for (const lambda of BIARC_RATIOS) {
    const d1 = lambda * d;
    const wx = vx - d1 * tx, wy = vy - d1 * ty;
    const d2 = (wx * wx + wy * wy - d1 * d1) / (2 * (wx * t0x + wy * t0y + d1));
    if (!(d2 > 0) || !Number.isFinite(d2)) continue;
    const ax = qx + d1 * tx, ay = qy + d1 * ty, bx = ex - d2 * t0x, by = ey - d2 * t0y;
    const f = d1 / (d1 + d2);
    const pair = halves(pts, a, last, bp, bq, br, qx, qy, ax + f * (bx - ax), ay + f * (by - ay), ex, ey, t0x, t0y, tol);
    if (pair) return pair;
  }
  return null;
}

/** Ratios of the first tangent length to the equal-length one, tried in turn. */
const BIARC_RATIOS = [1, 0.6, 1.6, 0.35, 2.8];

/** The two rotor arcs through junction (jx, jy), checked; null if either is off. */
function halves(
  pts: Float64Array, a: number, last: number, bp: number, bq: number, br: number,
  qx: number, qy: number, jx: number, jy: number, ex: number, ey: number, t0x: number, t0y: number, tol: number,
): [Piece, Piece] | null {
  // Split the vertex range at the vertex nearest the junction.
  let split = a, best = Infinity;
  for (let k = a; k <= last; k++) {
    const dd = (pts[2 * k] - jx) ** 2 + (pts[2 * k + 1] - jy) ** 2;
    if (dd < best) {
      best = dd;
      split = k;
    }
  }
  const first = makePiece(pts, a, split, bp, bq, br, qx, qy, jx, jy, tol);
  if (!first) return null;
  const second = makePiece(pts, split, last, first.mp, first.mq, first.mr, jx, jy, ex, ey, tol);
  if (!second) return null;
  if (second.tx * t0x + second.ty * t0y <= 0 || Math.abs(second.tx * t0y - second.ty * t0x) > 1e-6) return null;
  return [first, second];
}
