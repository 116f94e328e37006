/**
 * Affine 2-D matrices in SVG order.
 *
 * Layout (see matrixTypes.ts): `m = [a, b, c, d, e, f]` maps
 * (x, y) → (a·x + c·y + e, b·x + d·y + f), i.e. the column-major 3×3
 *
 *     | a c e |
 *     | b d f |
 *     | 0 0 1 |
 *
 * Kernel operations take an `out` first and read every input before writing
 * it, so `multiply(a, a, b)` and `invert(m, m)` are safe.
 */
import type { Matrix } from './matrixTypes.js';

/** A new identity matrix `[1 0 0 1 0 0]`. */
export function identityMatrix(): Matrix {
  const m = new Float64Array(6);
  m[0] = 1;
  m[3] = 1;
  return m;
}

/** A new matrix with the six SVG values `matrix(a b c d e f)`. */
export function matrix(a: number, b: number, c: number, d: number, e: number, f: number): Matrix {
  const m = new Float64Array(6);
  m[0] = a;
  m[1] = b;
  m[2] = c;
  m[3] = d;
  m[4] = e;
  m[5] = f;
  return m;
}

/**
 * out = a·b: a point is mapped by `b` first, then by `a` (SVG nesting order:
 * `transform="A B"` is A·B). Safe when `out` is `a` or `b`.
 * @returns out
 */
export function multiply(out: Matrix, a: Matrix, b: Matrix): Matrix {
  const a0 = a[0], a1 = a[1], a2 = a[2], a3 = a[3], a4 = a[4], a5 = a[5];
  const b0 = b[0], b1 = b[1], b2 = b[2], b3 = b[3], b4 = b[4], b5 = b[5];
  out[0] = a0 * b0 + a2 * b1;
  out[1] = a1 * b0 + a3 * b1;
  out[2] = a0 * b2 + a2 * b3;
  out[3] = a1 * b2 + a3 * b3;
  out[4] = a0 * b4 + a2 * b5 + a4;
  out[5] = a1 * b4 + a3 * b5 + a5;
  return out;
}

/** Determinant of the linear part, a·d − b·c (signed area scale; < 0 means a reflection). */
export function determinant(m: Matrix): number {
  return m[0] * m[3] - m[1] * m[2];
}

/**
 * out = m⁻¹. Returns `null` (and leaves `out` untouched) when the matrix is
 * singular or any entry or the result is non-finite. Safe when `out` is `m`.
 */
export function invert(out: Matrix, m: Matrix): Matrix | null {
  const a = m[0], b = m[1], c = m[2], d = m[3], e = m[4], f = m[5];
  const det = a * d - b * c;
  if (det === 0 || !Number.isFinite(det)) return null;
  const k = 1 / det;
  const r0 = d * k, r1 = -b * k, r2 = -c * k, r3 = a * k;
  const r4 = -(r0 * e + r2 * f);
  const r5 = -(r1 * e + r3 * f);
  if (!(Number.isFinite(r0) && Number.isFinite(r1) && Number.isFinite(r2) &&
    Number.isFinite(r3) && Number.isFinite(r4) && Number.isFinite(r5))) return null;
  out[0] = r0;
  out[1] = r1;
  out[2] = r2;
  out[3] = r3;
  out[4] = r4;
  out[5] = r5;
  return out;
}

/** x coordinate of m·(x, y). */
export function applyX(m: Matrix, x: number, y: number): number {
  return m[0] * x + m[2] * y + m[4];
}

/** y coordinate of m·(x, y). */
export function applyY(m: Matrix, x: number, y: number): number {
  return m[1] * x + m[3] * y + m[5];
}

/**
 * Map every (x, y) pair of `xy` by `m` into `out` in one loop. `out` may be
 * `xy` itself; it must be at least as long as `xy`. An odd trailing value is
 * left unmapped.
 * @returns out
 */
export function transformBuffer(out: Float64Array, m: Matrix, xy: Float64Array): Float64Array {
  const a = m[0], b = m[1], c = m[2], d = m[3], e = m[4], f = m[5];
  const n = xy.length - (xy.length & 1);
  for (let i = 0; i < n; i += 2) {
    const x = xy[i], y = xy[i + 1];
    out[i] = a * x + c * y + e;
    out[i + 1] = b * x + d * y + f;
  }
  return out;
}

/**
 * Singular values σ1 ≥ σ2 ≥ 0 of the linear part [a c; b d], closed form
 * (S = a²+b²+c²+d², D = sqrt((a²+c²−b²−d²)² + 4(ab+cd)²); σ = sqrt((S ± D)/2)),
 * REFERENCES.md §5.2 step 3.
 */
function singular(m: Matrix, largest: boolean): number {
  const a = m[0], b = m[1], c = m[2], d = m[3];
  const s = a * a + b * b + c * c + d * d;
  const p = a * a + c * c - b * b - d * d;
  const q = 2 * (a * b + c * d);
  const dq = Math.hypot(p, q);
  if (largest) return Math.sqrt((s + dq) / 2);
  // σ2 = |det| / σ1 avoids the cancellation in (S − D) when the map is near-singular.
  const s1 = Math.sqrt((s + dq) / 2);
  return s1 === 0 ? 0 : Math.abs(a * d - b * c) / s1;
}

/** Largest singular value of the linear part: the most a length can grow under `m`. */
export function maxScale(m: Matrix): number {
  return singular(m, true);
}

/** Smallest singular value of the linear part: the most a length can shrink under `m`. */
export function minScale(m: Matrix): number {
  return singular(m, false);
}

/**
 * True when `m` is a similarity: uniform scale + rotation (+ reflection) +
 * translation, i.e. circles stay circles. The test is σ1 − σ2 ≤ relEps·σ1
 * (relative to the larger scale, so it is unit-free). A zero linear part is
 * not a similarity.
 * @param relEps relative tolerance, e.g. 1e-9
 */
export function isSimilarity(m: Matrix, relEps: number): boolean {
  const s1 = maxScale(m);
  if (!(s1 > 0) || !Number.isFinite(s1)) return false;
  return s1 - minScale(m) <= relEps * s1;
}
