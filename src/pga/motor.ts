/**
 * Motor logarithm, power and the read-out of arc geometry. Trigonometry lives
 * here only: constructing arcs (./arcStep.ts) needs none, sampling along an arc
 * and writing SVG flags do.
 */
import type { Motor, Point } from './layout.js';

/** Below this |e12| (for a normalised motor) the motor is treated as a translation. */
export const TRANSLATION_EPS = 1e-15;

/**
 * Logarithm of a normalised motor: the bivector φ·Ĉ (rotation) or the
 * translation bivector (ideal). Written to a point layout [e01, e02, e12].
 * Its direction is the centre point of the rotation, or an ideal point for a translation.
 */
export function motorLog(out: Point, m: Motor): Point {
  const s = m[0], p = m[1], q = m[2], r = m[3];
  if (Math.abs(r) <= TRANSLATION_EPS * Math.abs(s)) {
    out[0] = p / s;
    out[1] = q / s;
    out[2] = 0;
    return out;
  }
  const phi = Math.atan2(r, s); // half angle, signed by the e12 part
  const k = phi / r;
  out[0] = p * k;
  out[1] = q * k;
  out[2] = r * k;
  return out;
}

/** Power R^t of a normalised motor: exp(t·log R). Translations scale linearly. */
export function motorPow(out: Motor, m: Motor, t: number): Motor {
  const s = m[0], p = m[1], q = m[2], r = m[3];
  if (Math.abs(r) <= TRANSLATION_EPS * Math.abs(s)) {
    out[0] = 1;
    out[1] = (t * p) / s;
    out[2] = (t * q) / s;
    out[3] = 0;
    return out;
  }
  const phi = Math.atan2(r, s);
  const k = Math.sin(t * phi) / r; // sin(tφ) times the unit bivector B / r
  out[0] = Math.cos(t * phi);
  out[1] = p * k;
  out[2] = q * k;
  out[3] = r * k;
  return out;
}

/** True when the motor is a translation (its logarithm is an ideal point). */
export function isTranslation(m: Motor): boolean {
  return Math.abs(m[3]) <= TRANSLATION_EPS * Math.abs(m[0]);
}

/**
 * Signed sweep angle (radians) of the arc traced by R^t, t in [0, 1], for a
 * normalised rotation motor: positive from +x towards +y (SVG sweep-flag 1).
 */
export function motorSweep(m: Motor): number {
  return rotorSweep(m[0], m[3]);
}

/*
 * The same read-outs from a motor's scalar parts s + p·e01 + q·e02 + r·e12, for
 * the fitter's flat records and pieces (which hold the four numbers, not a
 * Motor array). The centre is the logarithm's point normalised, (−q/r, p/r);
 * r must not be 0 (a translation has no centre).
 */

/** Sweep (radians, SVG sweep-flag 1 positive) of a normalised rotation motor from its scalar and e12 parts. */
export function rotorSweep(s: number, r: number): number {
  return -2 * Math.atan2(r, s);
}

/** x of a rotation motor's centre. */
export function rotorCentreX(q: number, r: number): number {
  return -q / r;
}

/** y of a rotation motor's centre. */
export function rotorCentreY(p: number, r: number): number {
  return p / r;
}
