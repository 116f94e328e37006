/**
 * 2D projective geometric algebra R(2,0,1): the data layout, written once.
 *
 * Basis: e0, e1, e2 with e0² = 0, e1² = e2² = 1; bivectors e01, e02, e12.
 *
 * | kind   | array        | coefficients               | meaning |
 * |--------|--------------|----------------------------|---------|
 * | Line   | Float64Array(3) | [e0, e1, e2]            | a·x + b·y + c = 0 is c e0 + a e1 + b e2 |
 * | Point  | Float64Array(3) | [e01, e02, e12]         | (x, y) is y e01 − x e02 + 1 e12; weight = e12 part; weight 0 is an ideal point (a direction d: d_y e01 − d_x e02) |
 * | Motor  | Float64Array(4) | [1, e01, e02, e12]      | even element acting by X ↦ M X M̃ |
 *
 * A normalised motor s + p e01 + q e02 + r e12 (s² + r² = 1) with r ≠ 0 is a
 * rotation about the point C = (−q/r, p/r) by the angle −2·atan2(r, s),
 * positive from +x towards +y. With r = 0 it is a translation by (−2p/s, −2q/s).
 */
export type Line = Float64Array;
export type Point = Float64Array;
export type Motor = Float64Array;

/** The line a·x + b·y + c = 0. */
export function line(a: number, b: number, c: number): Line {
  const out = new Float64Array(3);
  out[0] = c;
  out[1] = a;
  out[2] = b;
  return out;
}

/** The Euclidean point (x, y) with weight 1. */
export function point(x: number, y: number): Point {
  const out = new Float64Array(3);
  out[0] = y;
  out[1] = -x;
  out[2] = 1;
  return out;
}

/** The ideal point (direction) (dx, dy): weight 0. */
export function idealPoint(dx: number, dy: number): Point {
  const out = new Float64Array(3);
  out[0] = dy;
  out[1] = -dx;
  out[2] = 0;
  return out;
}

/** The identity motor. */
export function identity(): Motor {
  const out = new Float64Array(4);
  out[0] = 1;
  return out;
}

/** Euclidean x of a point with non-zero weight. */
export function pointX(p: Point): number {
  return -p[1] / p[2];
}

/** Euclidean y of a point with non-zero weight. */
export function pointY(p: Point): number {
  return p[0] / p[2];
}
