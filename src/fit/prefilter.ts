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
 * Positions (into `order`) of the vertices to keep, ascending. The first and last index of every
 * run between `anchors` (and the ends) are always kept.
 * @param xy flat x,y pairs
 * @param order vertex indices to walk, in order (lets a closed contour pass its wrap-around)
 * @param delta bound in the units of xy
 * @param anchors flags per position in `order`: 1 = must be kept
 */
export function thinWithin(xy: Float64Array, order: Int32Array, delta: number, anchors: Uint8Array | null): Int32Array {
  const n = order.length;
  const keep = new Int32Array(Math.max(n, 1));
  let kept = 0;
  if (n === 0) return keep.subarray(0, 0);
  keep[kept++] = 0;
  let anchor = 0;
  while (anchor < n - 1) {
    const ia = order[anchor];
    const ax = xy[2 * ia], ay = xy[2 * ia + 1];
    // The wedge is kept as its two boundary directions (unit vectors), lo clockwise of hi;
    // it is always narrower than 180°, so cross-product signs order directions in it.
    let loX = 0, loY = 0, hiX = 0, hiY = 0, open = false;
    let dmax = 0;
    let lastValid = anchor + 1;
    for (let k = anchor + 1; k < n; k++) {
      const ik = order[k];
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
      if (anchors !== null && anchors[k] === 1) break;
    }
    keep[kept++] = lastValid;
    anchor = lastValid;
  }
  return keep.subarray(0, kept);
}
