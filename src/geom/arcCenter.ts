/**
 * SVG elliptical arcs: endpoint form ↔ centre form.
 *
 * Endpoint form is what path data holds (P1, rx, ry, φ, fA, fS, P2); centre
 * form is the parametric ellipse
 *
 *     P(θ) = R(φ)·(rx·cosθ, ry·sinθ) + (cx, cy),   θ from θ1 to θ1 + Δθ
 *
 * (W3C SVG 1.1 F.6.3.1, SVG 2 B.2.2; REFERENCES.md §1). The out-of-range rules
 * of F.6.2 / F.6.6 are applied before converting, in this order: coincident
 * endpoints → segment omitted; a zero radius → straight line; negative radii →
 * absolute values; radii too small → scaled up uniformly.
 *
 * Flat layout used by {@link arcToCenterInto}: `out = [cx, cy, rx, ry, phi,
 * theta1, dtheta]` (ARC_CENTER_LENGTH = 7), angles in radians, radii corrected.
 */

/** Centre form of an arc that is drawn as an arc. Angles in radians, same units as the input otherwise. */
export interface ArcCenter {
  kind: 'arc';
  cx: number;
  cy: number;
  /** Corrected radii (absolute, scaled up when too small), > 0. */
  rx: number;
  ry: number;
  /** x-axis rotation in radians, in [0, 2π) after taking φ modulo 360°. */
  phi: number;
  /** Start parameter θ1 in radians, in (−π, π]. */
  theta1: number;
  /** Signed parameter sweep Δθ in radians, in (−2π, 2π); > 0 iff the sweep flag is set. */
  dtheta: number;
}

/** The arc has a zero radius and is drawn as a straight line from P1 to P2 (F.6.6 step 1). */
export interface ArcAsLine {
  kind: 'line';
}

/**
 * What an arc command draws: `null` when the segment is omitted (P1 = P2
 * exactly, F.6.2), `{ kind: 'line' }` for a zero radius, else the centre form.
 */
export type ArcConversion = ArcCenter | ArcAsLine | null;

/** Status codes of {@link arcToCenterInto}. */
export const ARC_OMITTED = 0;
export const ARC_LINE = 1;
export const ARC_ELLIPSE = 2;

/** Length of the flat centre-form record written by {@link arcToCenterInto}. */
export const ARC_CENTER_LENGTH = 7;

const TWO_PI = 2 * Math.PI;
const DEG = Math.PI / 180;
const AS_LINE: ArcAsLine = Object.freeze({ kind: 'line' }) as ArcAsLine;

/**
 * Endpoint → centre conversion (W3C SVG 1.1 F.6.5 with F.6.2 / F.6.6 first)
 * into a flat record, allocation-free for hot loops.
 *
 * @param out receives [cx, cy, rx, ry, phi, theta1, dtheta] (radians) when the result is ARC_ELLIPSE; untouched otherwise
 * @param phiDeg x-axis rotation in degrees, any value (taken modulo 360)
 * @returns ARC_OMITTED (endpoints exactly equal), ARC_LINE (a radius is 0; also, beyond the
 *   spec, a non-finite radius or a chord that underflows next to the radii) or ARC_ELLIPSE
 */
export function arcToCenterInto(
  out: Float64Array,
  x1: number, y1: number, rx: number, ry: number, phiDeg: number,
  largeArc: boolean, sweep: boolean, x2: number, y2: number,
): number {
  // F.6.2: exact equality, as the spec says; a tolerance would turn a tiny
  // near-full arc (REFERENCES §1.4 A9) into nothing.
  if (x1 === x2 && y1 === y2) return ARC_OMITTED;
  if (rx === 0 || ry === 0) return ARC_LINE;
  // Not in the spec: an infinite (or NaN) radius is taken as its limit, a line.
  if (!Number.isFinite(rx) || !Number.isFinite(ry)) return ARC_LINE;
  rx = Math.abs(rx);
  ry = Math.abs(ry);
  let phi = (phiDeg % 360) * DEG;
  if (phi < 0) phi += TWO_PI;
  const cosP = Math.cos(phi), sinP = Math.sin(phi);

  // Step 1 (F.6.5.1): midpoint-centred, rotated by −φ.
  // Halve before subtracting: (1e308 − −1e308) / 2 would overflow.
  const hx = x1 / 2 - x2 / 2, hy = y1 / 2 - y2 / 2;
  const x1p = cosP * hx + sinP * hy;
  const y1p = -sinP * hx + cosP * hy;

  // F.6.6.2: Λ = x1'²/rx² + y1'²/ry² = L². hypot keeps L from underflowing
  // for a chord that is tiny next to the radii.
  const L = Math.hypot(x1p / rx, y1p / ry);
  // Step 2 (F.6.5.2): the radicand (rx²ry² − rx²y1'² − ry²x1'²)/(rx²y1'² + ry²x1'²)
  // equals (1 − Λ)/Λ, which is written so it cannot go negative by rounding.
  // Not in the spec: a chord below double resolution next to the radii
  // (L underflows to 0) has no computable centre; draw the chord.
  if (L === 0) return ARC_LINE;
  let k = 0;
  if (L >= 1) {
    // Radii too small (or exactly enough): scale up; the radicand is 0 (clamped).
    rx *= L;
    ry *= L;
  } else {
    k = Math.sqrt((1 - L) * (1 + L)) / L;
    if (largeArc === sweep) k = -k;
  }
  // k·(y1'/ry) and k·(x1'/rx) are at most 1 in size (|y1'/ry| ≤ Λ^½, k ≤ √(1−Λ)/Λ^½),
  // so this order cannot overflow where k·rx·y1' would (radii near 1e308).
  const cxp = k === 0 ? 0 : k * (y1p / ry) * rx;
  const cyp = k === 0 ? 0 : -k * (x1p / rx) * ry;

  // Step 3 (F.6.5.3).
  const cx = cosP * cxp - sinP * cyp + (x1 / 2 + x2 / 2);
  const cy = sinP * cxp + cosP * cyp + (y1 / 2 + y2 / 2);

  // Step 4 (F.6.5.4–6) with atan2 instead of ±acos.
  const ux = (x1p - cxp) / rx, uy = (y1p - cyp) / ry;
  const vx = (-x1p - cxp) / rx, vy = (-y1p - cyp) / ry;
  let theta1 = Math.atan2(uy, ux);
  // atan2(−0, −1) = −π; keep θ1 in (−π, π] whatever the sign of a zero.
  if (theta1 === -Math.PI) theta1 = Math.PI;
  let dtheta = Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
  // The flag fixes the direction; a sweep of exactly 0 only happens through
  // rounding on a near-full arc, where the large-arc flag says which one.
  if (sweep) {
    if (dtheta < 0 || (dtheta === 0 && largeArc)) dtheta += TWO_PI;
  } else if (dtheta > 0 || (dtheta === 0 && largeArc)) {
    dtheta -= TWO_PI;
  }

  out[0] = cx;
  out[1] = cy;
  out[2] = rx;
  out[3] = ry;
  out[4] = phi;
  out[5] = theta1;
  out[6] = dtheta;
  return ARC_ELLIPSE;
}

const scratch = new Float64Array(ARC_CENTER_LENGTH);

/**
 * Endpoint → centre conversion of one SVG arc command (W3C SVG 1.1 F.6.5,
 * out-of-range rules F.6.2 / F.6.6 applied first).
 *
 * @param x1 current point (user units), likewise y1
 * @param rx radii as written (any sign; 0 means a line), likewise ry
 * @param phiDeg x-axis rotation in degrees
 * @param x2 end point, likewise y2
 * @returns null when the segment is omitted (P1 = P2 exactly), `{ kind: 'line' }`
 *   for a zero radius, else the centre form with corrected radii and angles in radians
 */
export function arcToCenter(
  x1: number, y1: number, rx: number, ry: number, phiDeg: number,
  largeArc: boolean, sweep: boolean, x2: number, y2: number,
): ArcConversion {
  const status = arcToCenterInto(scratch, x1, y1, rx, ry, phiDeg, largeArc, sweep, x2, y2);
  if (status === ARC_OMITTED) return null;
  if (status === ARC_LINE) return AS_LINE;
  return {
    kind: 'arc',
    cx: scratch[0], cy: scratch[1], rx: scratch[2], ry: scratch[3],
    phi: scratch[4], theta1: scratch[5], dtheta: scratch[6],
  };
}

/** Endpoint form of an arc given in centre form (W3C SVG 1.1 F.6.4). */
export interface ArcEndpoints {
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  /** F.6.4.3: |Δθ| > 180°. */
  largeArc: boolean;
  /** F.6.4.4: Δθ > 0. */
  sweep: boolean;
}

/**
 * Centre → endpoint conversion (W3C SVG 1.1 F.6.4). |Δθ| = 2π cannot be
 * written as one command (the endpoints coincide); the caller splits it.
 *
 * @param phi x-axis rotation in radians
 * @param theta1 start parameter in radians
 * @param dtheta signed parameter sweep in radians
 */
export function arcFromCenter(
  cx: number, cy: number, rx: number, ry: number,
  phi: number, theta1: number, dtheta: number,
): ArcEndpoints {
  const cosP = Math.cos(phi), sinP = Math.sin(phi);
  const theta2 = theta1 + dtheta;
  const ax = rx * Math.cos(theta1), ay = ry * Math.sin(theta1);
  const bx = rx * Math.cos(theta2), by = ry * Math.sin(theta2);
  return {
    x1: cosP * ax - sinP * ay + cx,
    y1: sinP * ax + cosP * ay + cy,
    x2: cosP * bx - sinP * by + cx,
    y2: sinP * bx + cosP * by + cy,
    largeArc: Math.abs(dtheta) > Math.PI,
    sweep: dtheta > 0,
  };
}
