/**
 * Start tangents to try where the spline is free to start (an open end or a
 * corner) or at a closed contour's seam. The beam search keeps whichever lets
 * the spline go farthest.
 */

/**
 * Tangent at P0 of the circle through P0, A and B, oriented towards A. Falls back
 * to the direction of B when the three points are collinear. Null when A = P0.
 */
export function circleTangent(x0: number, y0: number, ax: number, ay: number, bx: number, by: number): [number, number] | null {
  const ux = ax - x0, uy = ay - y0, wx = bx - x0, wy = by - y0;
  const uu = ux * ux + uy * uy, ww = wx * wx + wy * wy;
  if (!(uu > 0)) return null;
  const cr = ux * wy - uy * wx;
  let tx: number, ty: number;
  if (Math.abs(cr) <= 1e-12 * Math.sqrt(uu * ww)) {
    tx = ux;
    ty = uy;
  } else {
    // Centre relative to P0 (circle through the origin: 2c·u = |u|², 2c·w = |w|²); the tangent is perpendicular to it.
    const cx = (uu * wy - ww * uy) / (2 * cr), cy = (ww * ux - uu * wx) / (2 * cr);
    tx = -cy;
    ty = cx;
    if (tx * ux + ty * uy < 0) {
      tx = -tx;
      ty = -ty;
    }
  }
  const l = Math.hypot(tx, ty);
  return l > 0 ? [tx / l, ty / l] : null;
}

/** Candidate start tangents at vertex a of pts (vertices a..last ahead of it). */
export function openSeeds(pts: Float64Array, a: number, last: number, qx: number, qy: number): number[][] {
  const out: number[][] = [];
  const add = (t: [number, number] | null): void => {
    if (!t) return;
    for (const o of out) if (Math.abs(o[0] - t[0]) < 1e-12 && Math.abs(o[1] - t[1]) < 1e-12) return;
    out.push(t);
  };
  const span = last - a;
  const ks: number[] = [];
  for (let k = 1; k < span; k *= 2) ks.push(k);
  if (span >= 1) ks.push(span);
  for (const k of ks) {
    const bx = pts[2 * (a + k)], by = pts[2 * (a + k) + 1];
    const l = Math.hypot(bx - qx, by - qy);
    if (l > 0) add([(bx - qx) / l, (by - qy) / l]);
    if (k >= 2) {
      const h = a + (k >> 1);
      add(circleTangent(qx, qy, pts[2 * h], pts[2 * h + 1], bx, by));
    }
  }
  return out;
}

/**
 * Candidate tangents at the seam of a closed piece whose pts run P0, P1, …,
 * P_{m−1}, P0 (m distinct vertices): circles through P_{−k}, P0, P_k.
 */
export function seamSeeds(pts: Float64Array, m: number): number[][] {
  const out: number[][] = [];
  const x0 = pts[0], y0 = pts[1];
  for (let k = 1; 2 * k < m; k *= 2) {
    const t = circleTangent(x0, y0, pts[2 * k], pts[2 * k + 1], pts[2 * (m - k)], pts[2 * (m - k) + 1]);
    if (t) out.push(t);
  }
  // One-sided chords too: exact where the seam is the end of a straight run.
  for (let k = 1; 2 * k < m; k *= 4) {
    for (const [ax, ay, bx, by] of [
      [x0, y0, pts[2 * k], pts[2 * k + 1]],
      [pts[2 * (m - k)], pts[2 * (m - k) + 1], x0, y0],
    ]) {
      const l = Math.hypot(bx - ax, by - ay);
      if (l > 0) out.push([(bx - ax) / l, (by - ay) / l]);
    }
  }
  if (out.length === 0 && m >= 2) {
    const l = Math.hypot(pts[2] - x0, pts[3] - y0);
    if (l > 0) out.push([(pts[2] - x0) / l, (pts[3] - y0) / l]);
  }
  return out;
}
