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
 * Indices of the vertices to keep, ascending. The first and last index of every
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
    let lo = -Infinity, hi = Infinity;
    let refX = 0, refY = 0, haveRef = false;
    let dmax = 0;
    let lastValid = anchor + 1;
    for (let k = anchor + 1; k < n; k++) {
      const ik = order[k];
      const vx = xy[2 * ik] - ax, vy = xy[2 * ik + 1] - ay;
      const d = Math.sqrt(vx * vx + vy * vy);
      if (d > delta) {
        let alpha = 0;
        if (!haveRef) {
          refX = vx / d;
          refY = vy / d;
          haveRef = true;
        } else {
          alpha = Math.atan2(refX * vy - refY * vx, refX * vx + refY * vy);
        }
        if (alpha >= lo && alpha <= hi && d >= dmax) lastValid = k;
        const beta = Math.asin(delta / d);
        if (alpha - beta > lo) lo = alpha - beta;
        if (alpha + beta < hi) hi = alpha + beta;
        if (d > dmax) dmax = d;
      } else if (d >= dmax && k === anchor + 1) {
        lastValid = k;
      }
      // The wedge closed, or a point that must stay a vertex: end the segment here at the latest.
      if (lo > hi || (anchors !== null && anchors[k] === 1)) break;
    }
    keep[kept++] = lastValid;
    anchor = lastValid;
  }
  return keep.subarray(0, kept);
}
