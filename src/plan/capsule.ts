/**
 * Which part of a segment lies within a distance of another segment: the line
 * through PQ meets the capsule (the points within r of AB; a convex set: a
 * rectangle and two discs, the Minkowski sum of AB and a disc) in one interval
 * [textbook: the intersection of a line with a convex set is an interval].
 */

/**
 * The parameter interval of P + t·(Q − P), t in [0, 1], within distance `r` (mm) of segment AB.
 * Writes t0, t1 to `out` and returns true, or returns false when no part is that close.
 */
export function segmentNearSegment(
  out: Float64Array,
  px: number, py: number, qx: number, qy: number,
  ax: number, ay: number, bx: number, by: number,
  r: number,
): boolean {
  const dx = qx - px, dy = qy - py;
  const dd = dx * dx + dy * dy;
  if (dd === 0) {
    // A point: all of it or nothing.
    if (pointSegmentDist2(px, py, ax, ay, bx, by) > r * r) return false;
    out[0] = 0;
    out[1] = 1;
    return true;
  }
  let lo = Infinity, hi = -Infinity;
  // The two discs: |P − C + t·D|² ≤ r².
  for (let e = 0; e < 2; e++) {
    const cx = e === 0 ? ax : bx, cy = e === 0 ? ay : by;
    const ex = px - cx, ey = py - cy;
    const b = ex * dx + ey * dy;
    const c = ex * ex + ey * ey - r * r;
    const disc = b * b - dd * c;
    if (disc < 0) continue;
    const s = Math.sqrt(disc);
    const t0 = (-b - s) / dd, t1 = (-b + s) / dd;
    if (t0 < lo) lo = t0;
    if (t1 > hi) hi = t1;
  }
  // The rectangle: 0 ≤ along ≤ |AB| and |across| ≤ r, both linear in t.
  const lx = bx - ax, ly = by - ay;
  const len = Math.sqrt(lx * lx + ly * ly);
  if (len > 0) {
    const ux = lx / len, uy = ly / len;
    const wx = px - ax, wy = py - ay;
    let a0 = -Infinity, a1 = Infinity;
    const along0 = wx * ux + wy * uy, alongD = dx * ux + dy * uy;
    const across0 = ux * wy - uy * wx, acrossD = ux * dy - uy * dx;
    [a0, a1] = clampLinear(a0, a1, along0, alongD, 0, len);
    if (a0 <= a1) [a0, a1] = clampLinear(a0, a1, across0, acrossD, -r, r);
    if (a0 <= a1) {
      if (a0 < lo) lo = a0;
      if (a1 > hi) hi = a1;
    }
  }
  if (lo < 0) lo = 0;
  if (hi > 1) hi = 1;
  if (!(lo <= hi)) return false;
  out[0] = lo;
  out[1] = hi;
  return true;
}

/** Narrow [t0, t1] to where v0 + t·dv lies in [min, max]. */
function clampLinear(t0: number, t1: number, v0: number, dv: number, min: number, max: number): [number, number] {
  if (dv === 0) return v0 >= min && v0 <= max ? [t0, t1] : [1, 0];
  let s0 = (min - v0) / dv, s1 = (max - v0) / dv;
  if (s0 > s1) {
    const t = s0;
    s0 = s1;
    s1 = t;
  }
  return [Math.max(t0, s0), Math.min(t1, s1)];
}

/** Squared distance from point P to segment AB (mm²). */
export function pointSegmentDist2(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const lx = bx - ax, ly = by - ay;
  const ll = lx * lx + ly * ly;
  let t = ll > 0 ? ((px - ax) * lx + (py - ay) * ly) / ll : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  const ex = ax + t * lx - px, ey = ay + t * ly - py;
  return ex * ex + ey * ey;
}
