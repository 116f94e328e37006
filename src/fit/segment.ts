/**
 * The fitter's output: one tangent-continuous piece of the spline.
 *
 * Every segment carries the motor that produced it (built by the rotor step,
 * ../pga/arcStep.ts): the piece is the orbit R^t·P0·R̃^t, t in [0, 1]. Centre,
 * radius and sweep are read off the motor only for writing and measuring.
 */
import { TRANSLATION_EPS, motorSweep, rotorCentreX, rotorCentreY } from '../pga/motor.js';

export interface Segment {
  /** 'arc' (rotation motor) or 'line' (translation motor). */
  kind: 'arc' | 'line';
  /** Normalised motor [1, e01, e02, e12] taking (x0, y0) to (x1, y1). */
  motor: Float64Array;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  /** First and last input vertex index this piece stands for (for closed contours i1 < i0 means it wraps). */
  i0: number;
  i1: number;
}

/** Circle read-out of an arc segment, in the contour's coordinates (mm). */
export interface ArcGeometry {
  cx: number;
  cy: number;
  r: number;
  /** Signed sweep in radians, positive from +x towards +y (SVG sweep-flag 1). |sweep| < 2π. */
  sweep: number;
}

/** Read centre, radius and sweep off an arc segment's motor. Returns null for a line. */
export function arcGeometry(seg: Segment): ArcGeometry | null {
  const m = seg.motor;
  const s = m[0], p = m[1], q = m[2], r = m[3];
  if (seg.kind === 'line' || Math.abs(r) <= TRANSLATION_EPS * Math.abs(s)) return null;
  const cx = rotorCentreX(q, r), cy = rotorCentreY(p, r);
  return { cx, cy, r: Math.hypot(seg.x0 - cx, seg.y0 - cy), sweep: motorSweep(m) };
}
