/**
 * The exact image of an SVG elliptical arc (or a circle) under an affine map.
 *
 * An SVG arc is the image of the unit circle under P ↦ R(φ)·diag(rx, ry)·P + c
 * (SVG 2 B.2.2). After the linear part L of a matrix the arc is the image of
 * the unit circle under E = L·R(φ)·diag(rx, ry); writing E = U·Σ·Vᵀ (SVD), the
 * image is the ellipse with semi-axes σ1 ≥ σ2 along U's columns. Closed form
 * per REFERENCES.md §5.2 (the same construction is documented by the kurbo
 * crate's `Affine::svd`).
 *
 * Flat layout used by {@link semiAxesInto}: `out = [σ1, σ2, angle]`, angle in
 * radians in [0, π), the direction of the σ1 axis.
 */
import type { Matrix } from '../svg/matrixTypes.js';

/** Radii, rotation and flags of an SVG arc command (endpoints are mapped by the caller). */
export interface ArcShape {
  /** Semi-axis lengths in the target units; rx ≥ ry > 0 unless the result was made a circle (rx = ry). */
  rx: number;
  ry: number;
  /** x-axis rotation in degrees, in [0, 180); 0 for a circle. */
  phiDeg: number;
  largeArc: boolean;
  sweep: boolean;
}

const DEG = Math.PI / 180;

/**
 * A map whose smaller semi-axis is below this fraction of the larger one is
 * treated as singular: the image is a segment in double precision anyway.
 */
export const DEGENERATE_REL = 1e-14;

/** Default relative radius difference under which the image is written as a circle. */
export const CIRCLE_REL = 1e-9;

/**
 * Semi-axes and orientation of the image of the unit circle under the 2×2
 * matrix E = [a c; b d] (columns (a, b) and (c, d) are the images of the
 * two unit semi-axes). REFERENCES.md §5.2 step 3; σ2 is taken as |det E|/σ1
 * to avoid the cancellation in sqrt((S − D)/2) for a thin ellipse.
 *
 * @param out receives [σ1, σ2, angle of the σ1 axis in radians, in [0, π)]
 * @returns out
 */
export function semiAxesInto(out: Float64Array, a: number, b: number, c: number, d: number): Float64Array {
  const s = a * a + b * b + c * c + d * d;
  const p = a * a + c * c - b * b - d * d;
  const q = 2 * (a * b + c * d);
  const s1 = Math.sqrt((s + Math.hypot(p, q)) / 2);
  let angle = 0.5 * Math.atan2(q, p);
  if (angle < 0) angle += Math.PI;
  out[0] = s1;
  out[1] = s1 === 0 ? 0 : Math.abs(a * d - b * c) / s1;
  out[2] = angle;
  return out;
}

/** Largest semi-axis σ1 of the image of the unit circle under E = [a c; b d] (scalar form for hot loops). */
export function maxSemiAxis(a: number, b: number, c: number, d: number): number {
  const s = a * a + b * b + c * c + d * d;
  const p = a * a + c * c - b * b - d * d;
  const q = 2 * (a * b + c * d);
  return Math.sqrt((s + Math.hypot(p, q)) / 2);
}

const axes = new Float64Array(3);

/**
 * Radii, rotation and flags of the image of an SVG arc under `m`
 * (REFERENCES.md §5.2). The endpoints are mapped by the caller with the full
 * matrix (translation included); only the linear part of `m` matters here.
 *
 * - fA is kept: the parameter interval is unchanged, only re-parameterised by
 *   an orthogonal Vᵀ, so |Δθ| is preserved.
 * - fS is flipped when det L < 0 (a reflection reverses orientation).
 * - A singular map (det L = 0, or σ2 ≤ DEGENERATE_REL·σ1) returns null: the
 *   image is a segment (folded back for an arc > 180°); the caller draws lines.
 * - When σ1 − σ2 ≤ circleRel·σ1 the result is a circle: rx = ry = (σ1 + σ2)/2, φ = 0.
 *
 * Out-of-range radii need no special care: Λ (F.6.6.2) is the chord measured
 * in the pre-image unit-circle frame, which the map does not change, so a
 * reader scales the new radii up by exactly the same factor.
 *
 * @param m user → target matrix [a b c d e f]
 * @param rx radii as written (signs ignored); a zero radius yields null (the arc is a line), likewise ry
 * @param phiDeg x-axis rotation in degrees
 * @param circleRel relative tolerance for "the image is a circle" (default CIRCLE_REL = 1e-9)
 */
export function transformArcShape(
  m: Matrix, rx: number, ry: number, phiDeg: number,
  largeArc: boolean, sweep: boolean, circleRel: number = CIRCLE_REL,
): ArcShape | null {
  const l0 = m[0], l1 = m[1], l2 = m[2], l3 = m[3];
  const det = l0 * l3 - l1 * l2;
  if (det === 0 || !Number.isFinite(det)) return null;
  rx = Math.abs(rx);
  ry = Math.abs(ry);
  const phi = (phiDeg % 360) * DEG;
  const cosP = Math.cos(phi), sinP = Math.sin(phi);
  // E = L·R(φ)·diag(rx, ry), columns = images of the two semi-axes.
  const ux = rx * cosP, uy = rx * sinP;
  const vx = -ry * sinP, vy = ry * cosP;
  semiAxesInto(axes, l0 * ux + l2 * uy, l1 * ux + l3 * uy, l0 * vx + l2 * vy, l1 * vx + l3 * vy);
  const s1 = axes[0], s2 = axes[1];
  if (!(s2 > DEGENERATE_REL * s1) || !Number.isFinite(s1)) return null;
  const flip = det < 0;
  const sw = flip ? !sweep : sweep;
  if (s1 - s2 <= circleRel * s1) {
    const r = (s1 + s2) / 2;
    return { rx: r, ry: r, phiDeg: 0, largeArc, sweep: sw };
  }
  let phiOut = axes[2] / DEG;
  if (phiOut >= 180) phiOut -= 180; // rounding at the π end of [0, π)
  return { rx: s1, ry: s2, phiDeg: phiOut, largeArc, sweep: sw };
}
