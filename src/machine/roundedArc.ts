/**
 * An arc between two already rounded end points, as both machine writers
 * place it: the fitted centre is moved onto the bisector of the rounded
 * chord, m + ((C − m)·n)·n, so that both written ends lie on the written
 * circle (G-code readers check |r_start − r_end|; DXF stores one radius).
 */

/** Where the arc's centre goes and its radius, in the writer's units (mm). */
export interface RoundedArc {
  ox: number;
  oy: number;
  r: number;
}

/**
 * The arc from (sx, sy) to (ex, ey) about a centre near (cx, cy), or null when it is flatter than `q`
 * (its sagitta is at most q: a line draws it within the rounding already spent).
 * @param ccw counter-clockwise in the writer's frame (Y up)
 * @param q the rounding step's bound, mm
 */
export function arcOnRoundedChord(sx: number, sy: number, ex: number, ey: number, cx: number, cy: number, ccw: boolean, q: number): RoundedArc | null {
  const mx = (sx + ex) / 2, my = (sy + ey) / 2;
  const ux = ex - sx, uy = ey - sy, c = Math.hypot(ux, uy);
  const nx = -uy / c, ny = ux / c;
  const t = (cx - mx) * nx + (cy - my) * ny;
  const r = Math.hypot(c / 2, t);
  // Sagitta: a counter-clockwise arc with its centre left of the chord (t > 0) is the short one.
  if ((ccw === t > 0 ? r - Math.abs(t) : r + Math.abs(t)) <= q) return null;
  return { ox: mx + t * nx, oy: my + t * ny, r };
}
