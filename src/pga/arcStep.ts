/**
 * The rotor construction of a tangent-continuous arc spline.
 *
 * Given the previous motor R (or a seed) and the next chord P_i → P_{i+1}:
 *   L_bis = (P_i + P_{i+1}) · (P_i ∨ P_{i+1})      the chord's perpendicular bisector
 *   L_rad = ⟨R⟩₂ ∨ reverse(P_i)                     the line through the previous centre and P_i
 *   R_i   = normalise(L_bis · L_rad)                so that R_i P_i R̃_i = P_{i+1}
 * The reverse keeps every arc running on in the direction of the previous one.
 * Parallel lines (the chord continues the tangent) give a translation: a line segment.
 * No trigonometry and no explicit centre is needed.
 */
import type { Motor, Point } from './layout.js';
import { addPoints, innerPointLine, join, mulLines, normalizeMotor, reversePoint } from './ops.js';

const tmpSum = new Float64Array(3);
const tmpChord = new Float64Array(3);
const tmpBis = new Float64Array(3);
const tmpRev = new Float64Array(3);
const tmpCentre = new Float64Array(3);
const tmpRad = new Float64Array(3);
const tmpProd = new Float64Array(4);

/**
 * The seed motor for start tangent (tx, ty): 1 + n, with n the ideal point in the
 * direction of the tangent turned by −90°. Its bivector part joined with P_0 is
 * the normal line at P_0.
 */
export function seedMotor(out: Motor, tx: number, ty: number): Motor {
  // n = t turned by −90° = (ty, −tx); ideal point d_y e01 − d_x e02.
  const nx = ty, ny = -tx;
  out[0] = 1;
  out[1] = ny;
  out[2] = -nx;
  out[3] = 0;
  return out;
}

/** Object form of the arc step, built from the kernel operations. Returns null when degenerate. */
export function arcStep(out: Motor, prev: Motor, pi: Point, pj: Point): Motor | null {
  addPoints(tmpSum, pi, pj);
  join(tmpChord, pi, pj);
  innerPointLine(tmpBis, tmpSum, tmpChord);
  tmpCentre[0] = prev[1];
  tmpCentre[1] = prev[2];
  tmpCentre[2] = prev[3];
  reversePoint(tmpRev, pi);
  join(tmpRad, tmpCentre, tmpRev);
  mulLines(tmpProd, tmpBis, tmpRad);
  return normalizeMotor(out, tmpProd);
}

/**
 * Scalar form of the same step for the fitter's inner loop: the previous motor's
 * bivector part (bp, bq, br) = [e01, e02, e12], the chord (xi, yi) → (xj, yj).
 * Writes the normalised motor into out[o..o+3]; returns false when degenerate.
 * Algebraically identical to `arcStep` (checked in the tests).
 */
export function arcStepScalar(
  out: Float64Array, o: number,
  bp: number, bq: number, br: number,
  xi: number, yi: number, xj: number, yj: number,
): boolean {
  // Chord join P_i ∨ P_j (cross product of homogeneous coordinates): a x + b y + c = 0.
  const a = yi - yj, b = xj - xi;
  // Bisector (P_i + P_j) · join: e1 = 2b, e2 = −2a, e0 = (yi+yj)a − (xi+xj)b.
  const l1a = 2 * b, l1b = -2 * a, l1c = (yi + yj) * a - (xi + xj) * b;
  // Centre line ⟨R⟩₂ ∨ reverse(P_i); homogeneous centre (X, Y, W) = (−bq, bp, br), −P_i = (−xi, −yi, −1).
  const X = -bq, Y = bp, W = br;
  const l2a = -Y + W * yi, l2b = X - W * xi, l2c = Y * xi - X * yi;
  // Geometric product of the two lines.
  const s = l1a * l2a + l1b * l2b;
  const p = l1c * l2a - l1a * l2c;
  const q = l1c * l2b - l1b * l2c;
  const r = l1a * l2b - l1b * l2a;
  const n2 = s * s + r * r;
  if (!(n2 > 0) || !Number.isFinite(n2)) return false;
  const k = 1 / Math.sqrt(n2);
  out[o] = s * k;
  out[o + 1] = p * k;
  out[o + 2] = q * k;
  out[o + 3] = r * k;
  return true;
}
