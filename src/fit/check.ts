/**
 * Does one candidate piece stay inside the tolerance band of the vertices it
 * stands for? No allocation: this is the fitter's inner loop (the `…In` forms
 * take their numbers in an argument block).
 *
 * A piece passes when every vertex k in [a, b] lies within `tol` of the piece
 * (and, for an arc, inside its angular sector or within `tol` of an end), no
 * edge between them dips further than `tol` inside the circle, the arc is no
 * longer than the vertex path allows (so the path runs along all of it rather
 * than sitting at its ends), and, on a small circle or for more than half a
 * turn, the path turns about the centre the way the arc does (so it cannot
 * take the short way round while the arc goes the long way). The vertex path
 * then runs continuously through the sector from one end to the other, so
 * every point of the piece is within `tol` of the path too (two-sided).
 */


/** √(x² + y²): Math.hypot guards against overflow we cannot meet here, and costs several times more. */
export const len2 = (x: number, y: number): number => Math.sqrt(x * x + y * y);

/** Distance from (px, py) to the segment (ax, ay)–(bx, by). */
export function distPointSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / l2 : 0;
  if (t < 0) t = 0;
  else if (t > 1) t = 1;
  const ex = ax + t * dx - px, ey = ay + t * dy - py;
  return Math.sqrt(ex * ex + ey * ey);
}

/**
 * Slots of an argument block: the hot calls pass their numbers in a
 * Float64Array, since a number passed to a call that is not inlined is boxed
 * on the heap, and the search makes millions of these calls.
 */
export const FIT_CX = 0, FIT_CY = 1, FIT_R = 2, FIT_SWEEP = 3, FIT_QX = 4, FIT_QY = 5, FIT_EX = 6, FIT_EY = 7, FIT_TOL = 8;
/** Numbers in an argument block. */
export const FIT_ARGS = 9;

const block = new Float64Array(FIT_ARGS);

/** Put a piece's ends and the tolerance into an argument block (the slots a line check reads). */
export function setEnds(g: Float64Array, qx: number, qy: number, ex: number, ey: number, tol: number): void {
  g[FIT_QX] = qx;
  g[FIT_QY] = qy;
  g[FIT_EX] = ex;
  g[FIT_EY] = ey;
  g[FIT_TOL] = tol;
}

/** Line piece (qx, qy)–(ex, ey) against vertices a..b of pts. */
export function lineFits(pts: Float64Array, a: number, b: number, qx: number, qy: number, ex: number, ey: number, tol: number): boolean {
  setEnds(block, qx, qy, ex, ey, tol);
  return lineFitsIn(pts, a, b, block);
}

/** `lineFits` with its numbers in an argument block (FIT_QX … FIT_TOL). */
export function lineFitsIn(pts: Float64Array, a: number, b: number, g: Float64Array): boolean {
  const qx = g[FIT_QX], qy = g[FIT_QY], ex = g[FIT_EX], ey = g[FIT_EY], tol = g[FIT_TOL];
  for (let k = a; k <= b; k++) {
    if (distPointSegment(pts[2 * k], pts[2 * k + 1], qx, qy, ex, ey) > tol) return false;
  }
  return true;
}

/**
 * Arc piece about (cx, cy) with radius r from (qx, qy) sweeping `sweep` radians
 * (positive from +x towards +y) to (ex, ey), against vertices a..b of pts.
 */
export function arcFits(
  pts: Float64Array, a: number, b: number,
  cx: number, cy: number, r: number, sweep: number,
  qx: number, qy: number, ex: number, ey: number, tol: number,
): boolean {
  block[FIT_CX] = cx;
  block[FIT_CY] = cy;
  block[FIT_R] = r;
  block[FIT_SWEEP] = sweep;
  setEnds(block, qx, qy, ex, ey, tol);
  return arcFitsIn(pts, a, b, block);
}

/** `arcFits` with its numbers in an argument block (all FIT_ slots). */
export function arcFitsIn(pts: Float64Array, a: number, b: number, g: Float64Array): boolean {
  const cx = g[FIT_CX], cy = g[FIT_CY], r = g[FIT_R], sweep = g[FIT_SWEEP];
  const qx = g[FIT_QX], qy = g[FIT_QY], ex = g[FIT_EX], ey = g[FIT_EY], tol = g[FIT_TOL];
  const ux = qx - cx, uy = qy - cy, vx = ex - cx, vy = ey - cy;
  const sgn = sweep < 0 ? -1 : 1;
  const large = Math.abs(sweep) > Math.PI;
  const inner = r - tol;
  let prevX = 0, prevY = 0, path = 0;
  for (let k = a; k <= b; k++) {
    const px = pts[2 * k], py = pts[2 * k + 1];
    if (k > a) path += len2(px - prevX, py - prevY);
    const wx = px - cx, wy = py - cy;
    const d = Math.sqrt(wx * wx + wy * wy);
    if (Math.abs(d - r) > tol) return false;
    // Sector test without trigonometry: w lies after the start and before the end, turning the sweep's way.
    const afterStart = sgn * (ux * wy - uy * wx) >= 0, beforeEnd = sgn * (wx * vy - wy * vx) >= 0;
    const inSector = large ? afterStart || beforeEnd : afterStart && beforeEnd;
    if (!inSector) {
      // Outside the sector: acceptable only near an end of the arc.
      const dq = len2(px - qx, py - qy), de = len2(px - ex, py - ey);
      if (dq > tol && de > tol) return false;
    }
    if (k > a && inner > 0) {
      // The edge's closest approach to the centre must not dip below r − tol.
      const dx = px - prevX, dy = py - prevY;
      const l2 = dx * dx + dy * dy;
      if (l2 > 0) {
        const t = ((cx - prevX) * dx + (cy - prevY) * dy) / l2;
        if (t > 0 && t < 1) {
          const fx = prevX + t * dx - cx, fy = prevY + t * dy - cy;
          if (fx * fx + fy * fy < inner * inner) return false;
        }
      }
    }
    prevX = px;
    prevY = py;
  }
  // The vertices must run along the whole arc, not sit near its two ends while it goes round:
  // its length, shortened to the inner edge of the band, cannot exceed the path's by more than the ends' slack.
  // The path is counted from the arc's start to the first vertex and from the last vertex to its end too.
  path += len2(pts[2 * a] - qx, pts[2 * a + 1] - qy) + len2(ex - prevX, ey - prevY);
  if (!(r * Math.abs(sweep) * (1 - (2 * tol) / r) <= path + 2 * tol)) return false;
  // On a small circle a chord can stay inside the band and still cut across the part of the circle the
  // arc leaves out: for an arc of more than half a turn when r ≤ 7.5 tol (a chord over the left-out angle
  // 2π − |sweep| comes within r·cos(π − |sweep|/2) of the centre), for any arc when r is under about
  // 2.5 tol. The path could then go the short way round while the arc goes the long way (seen on traced
  // input whose pixel steps are the size of the tolerance), so there the path must turn about the centre
  // the way the arc does.
  return !(large || r < 4 * tol) || Math.abs(turnAbout(pts, a, b, cx, cy, qx, qy, ex, ey) - sweep) < Math.PI;
}

/** The angle the path q, P_a … P_b, e turns through about (cx, cy), radians (positive from +x towards +y). */
function turnAbout(pts: Float64Array, a: number, b: number, cx: number, cy: number, qx: number, qy: number, ex: number, ey: number): number {
  let turn = 0, px = qx - cx, py = qy - cy;
  for (let k = a; k <= b + 1; k++) {
    const wx = (k > b ? ex : pts[2 * k]) - cx, wy = (k > b ? ey : pts[2 * k + 1]) - cy;
    turn += Math.atan2(px * wy - py * wx, px * wx + py * wy);
    px = wx;
    py = wy;
  }
  return turn;
}
