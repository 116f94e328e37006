/**
 * Linear-time vertex thinning with a guaranteed bound, run before arc fitting so
 * the fitter works on hundreds of vertices instead of millions.
 *
 * From an anchor A the algorithm keeps the wedge of directions in which a ray
 * from A passes within `delta` of every point seen so far (the cone-intersection
 * method of Sklansky & Gonzalez, "Fast polygonal approximation of digitized
 * curves", Pattern Recognition 12 (1980)). A point E may end the segment when its
 * direction lies in the wedge of all earlier points and it is the farthest from A
 * so far; then every earlier point lies within `delta` of the segment A–E, every
 * edge does too (the delta-neighbourhood of a segment is convex), and the input
 * path covers A–E within `delta` (it runs continuously from A to E inside that
 * neighbourhood). So the kept polyline is within `delta` of the input both ways.
 */

/**
 * Indices of the vertices to keep, in walking order. The walk covers vertices
 * 0..n−1 and, for a closed contour, returns to vertex 0 (which then ends the
 * list). The ends and every vertex listed in `anchors` are always kept.
 * Exactly repeated vertices are never candidates, so they drop out.
 * @param xy flat x,y pairs
 * @param delta bound in the units of xy
 * @param anchors vertex indices (ascending) that must be kept, or null
 */
export function thinWithin(xy: Float64Array, n: number, closed: boolean, delta: number, anchors: ArrayLike<number> | null): Int32Array {
  const steps = closed ? n + 1 : n;
  let keep = new Int32Array(Math.min(Math.max(steps, 1), 1024));
  let kept = 0;
  if (n === 0) return keep.subarray(0, 0);
  const push = (v: number): void => {
    if (kept === keep.length) {
      const grown = new Int32Array(Math.min(steps, keep.length * 2));
      grown.set(keep);
      keep = grown;
    }
    keep[kept++] = v;
  };
  push(0);
  let nextAnchor = 0;
  const anchorCount = anchors ? anchors.length : 0;
  let anchor = 0;
  while (anchor < steps - 1) {
    const ia = anchor === n ? 0 : anchor;
    const ax = xy[2 * ia], ay = xy[2 * ia + 1];
    while (nextAnchor < anchorCount && (anchors as ArrayLike<number>)[nextAnchor] <= anchor) nextAnchor++;
    const stopAt = nextAnchor < anchorCount ? (anchors as ArrayLike<number>)[nextAnchor] : steps;
    // The wedge is kept as its two boundary directions (unit vectors), lo clockwise of hi;
    // it is always narrower than 180°, so cross-product signs order directions in it.
    let loX = 0, loY = 0, hiX = 0, hiY = 0, open = false;
    let dmax = 0;
    let lastValid = anchor + 1;
    for (let k = anchor + 1; k < steps; k++) {
      const ik = k === n ? 0 : k;
      const vx = xy[2 * ik] - ax, vy = xy[2 * ik + 1] - ay;
      const d = Math.sqrt(vx * vx + vy * vy);
      if (d > delta) {
        const ux = vx / d, uy = vy / d;
        const sn = delta / d, cs = Math.sqrt(1 - sn * sn);
        if (!open) {
          loX = ux * cs + uy * sn;
          loY = uy * cs - ux * sn;
          hiX = ux * cs - uy * sn;
          hiY = uy * cs + ux * sn;
          open = true;
          if (d >= dmax) lastValid = k;
        } else {
          // A point behind the wedge ends the segment (conservative: never wrong, only less thinning).
          if ((loX + hiX) * ux + (loY + hiY) * uy <= 0) break;
          const inside = loX * uy - loY * ux >= 0 && ux * hiY - uy * hiX >= 0;
          if (inside && d >= dmax) lastValid = k;
          const lx = ux * cs + uy * sn, ly = uy * cs - ux * sn; // u turned by −β
          const hx = ux * cs - uy * sn, hy = uy * cs + ux * sn; // u turned by +β
          if (loX * ly - loY * lx > 0) {
            loX = lx;
            loY = ly;
          }
          if (hx * hiY - hy * hiX > 0) {
            hiX = hx;
            hiY = hy;
          }
          if (loX * hiY - loY * hiX < 0) break;
        }
        if (d > dmax) dmax = d;
      } else if (k === anchor + 1) {
        lastValid = k;
      }
      // A vertex that must stay ends the segment here at the latest.
      if (k === stopAt) break;
    }
    push(lastValid === n ? 0 : lastValid);
    anchor = lastValid;
  }
  return keep.subarray(0, kept);
}
