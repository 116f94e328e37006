/**
 * Which part of a segment runs beside another segment: the points of PQ that
 * project onto AB (between its ends) and lie within r of its line. Both
 * conditions are linear in PQ's parameter, so the part is one interval [textbook].
 * A strip with square ends, not the round-ended set of all points within r: a line
 * that continues past the end of a kept one is not cut short by r, so a partial
 * overlap removes exactly the overlap.
 */

/**
 * The parameter interval of P + t·(Q − P), t in [0, 1], that runs beside segment AB within `r` (mm).
 * Writes t0, t1 to `out` and returns true, or returns false when no part does.
 */
export function segmentBesideSegment(
  out: Float64Array,
  px: number, py: number, qx: number, qy: number,
  ax: number, ay: number, bx: number, by: number,
  r: number,
): boolean {
  const lx = bx - ax, ly = by - ay;
  const len = Math.sqrt(lx * lx + ly * ly);
  if (!(len > 0)) return false;
  const ux = lx / len, uy = ly / len;
  const wx = px - ax, wy = py - ay, dx = qx - px, dy = qy - py;
  let lo = 0, hi = 1;
  // along(t) = along0 + t·alongD in [0, len]; across(t) = across0 + t·acrossD in [-r, r].
  const along0 = wx * ux + wy * uy, alongD = dx * ux + dy * uy;
  const across0 = ux * wy - uy * wx, acrossD = ux * dy - uy * dx;
  for (let c = 0; c < 2; c++) {
    const v0 = c === 0 ? along0 : across0, dv = c === 0 ? alongD : acrossD;
    const min = c === 0 ? 0 : -r, max = c === 0 ? len : r;
    if (dv === 0) {
      if (v0 < min || v0 > max) return false;
      continue;
    }
    let s0 = (min - v0) / dv, s1 = (max - v0) / dv;
    if (s0 > s1) {
      const s = s0;
      s0 = s1;
      s1 = s;
    }
    if (s0 > lo) lo = s0;
    if (s1 < hi) hi = s1;
  }
  if (!(lo <= hi)) return false;
  out[0] = lo;
  out[1] = hi;
  return true;
}
