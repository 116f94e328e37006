/**
 * A closed contour starts where the drawing starts it (the pierce point of a
 * cut), as near as its knots allow: the fitted pieces are turned round so the
 * first starts at the knot nearest the contour's first vertex. A smooth
 * closed contour has its seam there already (./stretches.ts), so it starts
 * exactly at that vertex; a contour with corners or straight runs starts at
 * its nearest knot. Splitting a piece there instead would cost a piece (and
 * make the count depend on where the drawing starts its contour).
 */
import type { Segment } from './segment.js';

/**
 * The pieces of a closed contour (end to end, the last ending at the first's
 * start) turned round so the first starts at the knot nearest (px, py).
 */
export function startAt(segs: Segment[], px: number, py: number): Segment[] {
  let best = 0, bestD = Infinity;
  for (let k = 0; k < segs.length; k++) {
    const d = Math.hypot(segs[k].x0 - px, segs[k].y0 - py);
    if (d < bestD) {
      bestD = d;
      best = k;
    }
  }
  return best === 0 ? segs : segs.slice(best).concat(segs.slice(0, best));
}
