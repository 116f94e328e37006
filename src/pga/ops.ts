/**
 * Kernel operations in `op(out, a, b) → out` form. Every input is read into
 * locals before `out` is written, so `op(a, a, b)` is safe. Layouts: ./layout.ts.
 */
import type { Line, Motor, Point } from './layout.js';

/** Join (regressive product) P ∨ Q of two points: the line through both. */
export function join(out: Line, p: Point, q: Point): Line {
  // Homogeneous coordinates (X, Y, W) = (−e02, e01, e12); the join is their cross product.
  const x1 = -p[1], y1 = p[0], w1 = p[2];
  const x2 = -q[1], y2 = q[0], w2 = q[2];
  out[1] = y1 * w2 - w1 * y2; // e1 (a)
  out[2] = w1 * x2 - x1 * w2; // e2 (b)
  out[0] = x1 * y2 - y1 * x2; // e0 (c)
  return out;
}

/** Inner product P · L of a point (bivector) with a line: the line through P perpendicular to L. */
export function innerPointLine(out: Line, p: Point, l: Line): Line {
  const p01 = p[0], p02 = p[1], p12 = p[2];
  const c = l[0], a = l[1], b = l[2];
  out[1] = p12 * b;
  out[2] = -p12 * a;
  out[0] = p01 * a + p02 * b;
  void c;
  return out;
}

/** Geometric product of two lines: a rotation (lines meet) or a translation (parallel lines). */
export function mulLines(out: Motor, l1: Line, l2: Line): Motor {
  const c1 = l1[0], a1 = l1[1], b1 = l1[2];
  const c2 = l2[0], a2 = l2[1], b2 = l2[2];
  out[0] = a1 * a2 + b1 * b2;
  out[1] = c1 * a2 - a1 * c2;
  out[2] = c1 * b2 - b1 * c2;
  out[3] = a1 * b2 - b1 * a2;
  return out;
}

/** Geometric product of two motors (composition: apply b, then a). */
export function mulMotors(out: Motor, a: Motor, b: Motor): Motor {
  const as = a[0], ap = a[1], aq = a[2], ar = a[3];
  const bs = b[0], bp = b[1], bq = b[2], br = b[3];
  // e12² = −1, e01·e12 = e02, e12·e01 = −e02, e02·e12 = −e01, e12·e02 = e01, products of e0-bivectors vanish.
  out[0] = as * bs - ar * br;
  out[1] = as * bp + ap * bs - aq * br + ar * bq;
  out[2] = as * bq + aq * bs + ap * br - ar * bp;
  out[3] = as * br + ar * bs;
  return out;
}

/** Sum of two points (for weight-1 points, twice their midpoint). */
export function addPoints(out: Point, p: Point, q: Point): Point {
  out[0] = p[0] + q[0];
  out[1] = p[1] + q[1];
  out[2] = p[2] + q[2];
  return out;
}

/** Reverse of a point: bivectors change sign. */
export function reversePoint(out: Point, p: Point): Point {
  out[0] = -p[0];
  out[1] = -p[1];
  out[2] = -p[2];
  return out;
}

/** Reverse of a motor: the scalar stays, the bivector part changes sign. */
export function reverseMotor(out: Motor, m: Motor): Motor {
  out[0] = m[0];
  out[1] = -m[1];
  out[2] = -m[2];
  out[3] = -m[3];
  return out;
}

/** Scale a motor to s² + r² = 1. Returns null (and leaves out untouched) when the weight is zero. */
export function normalizeMotor(out: Motor, m: Motor): Motor | null {
  const n2 = m[0] * m[0] + m[3] * m[3];
  if (!(n2 > 0) || !Number.isFinite(n2)) return null;
  const k = 1 / Math.sqrt(n2);
  out[0] = m[0] * k;
  out[1] = m[1] * k;
  out[2] = m[2] * k;
  out[3] = m[3] * k;
  return out;
}

/** Scale a point to weight 1. Returns null for an ideal (zero-weight) point. */
export function normalizePoint(out: Point, p: Point): Point | null {
  const w = p[2];
  if (w === 0 || !Number.isFinite(w)) return null;
  const k = 1 / w;
  out[0] = p[0] * k;
  out[1] = p[1] * k;
  out[2] = 1;
  return out;
}

/** Sandwich M X M̃: apply a motor to a point. */
export function sandwich(out: Point, m: Motor, x: Point): Point {
  const s = m[0], p = m[1], q = m[2], r = m[3];
  const x1 = x[0], x2 = x[1], w = x[2];
  const ss = s * s, rr = r * r;
  out[0] = (ss - rr) * x1 + 2 * s * r * x2 + 2 * (r * p - s * q) * w;
  out[1] = (ss - rr) * x2 - 2 * s * r * x1 + 2 * (r * q + s * p) * w;
  out[2] = (ss + rr) * w;
  return out;
}

/** Meet (outer product) L1 ∧ L2 of two lines: their intersection point (ideal when parallel). */
export function meet(out: Point, l1: Line, l2: Line): Point {
  const c1 = l1[0], a1 = l1[1], b1 = l1[2];
  const c2 = l2[0], a2 = l2[1], b2 = l2[2];
  out[0] = c1 * a2 - a1 * c2;
  out[1] = c1 * b2 - b1 * c2;
  out[2] = a1 * b2 - b1 * a2;
  return out;
}
