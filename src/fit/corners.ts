/**
 * Corner detection that noise below the tolerance cannot fool.
 *
 * The turn at a vertex is measured between chords reaching a distance L back and
 * forward (L several tolerances, so jitter within the band moves each chord's
 * direction by only a few degrees). A smooth bend's turn grows with L while a
 * corner's does not, so the part of the turn concentrated at the vertex is
 * estimated as 2·turn(L) − turn(2L) (exact for a corner between straight or
 * circular pieces). A corner is a vertex where that concentrated turn exceeds the
 * threshold and the turn at L is the largest within L on either side.
 */

function walk(xy: Float64Array, n: number, closed: boolean, i: number, dir: number, dist: number): number {
  const x = xy[2 * i], y = xy[2 * i + 1];
  const d2 = dist * dist;
  let j = i;
  for (let step = 1; step < n; step++) {
    let k = i + dir * step;
    if (closed) k = ((k % n) + n) % n;
    else if (k < 0 || k >= n) break;
    j = k;
    const dx = xy[2 * k] - x, dy = xy[2 * k + 1] - y;
    if (dx * dx + dy * dy >= d2) break;
  }
  return j;
}

function turnAt(xy: Float64Array, n: number, closed: boolean, i: number, dist: number): number {
  const b = walk(xy, n, closed, i, -1, dist), f = walk(xy, n, closed, i, 1, dist);
  if (b === i || f === i) return 0;
  const x = xy[2 * i], y = xy[2 * i + 1];
  const ux = x - xy[2 * b], uy = y - xy[2 * b + 1], vx = xy[2 * f] - x, vy = xy[2 * f + 1] - y;
  return Math.abs(Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy));
}

/**
 * The part of the turn at vertex i concentrated there, radians: 2·turn(L) − turn(2L)
 * over chords of length L = `scale` (see the header).
 */
export function concentratedTurn(xy: Float64Array, closed: boolean, i: number, scale: number): number {
  const n = xy.length >> 1;
  return 2 * turnAt(xy, n, closed, i, scale) - turnAt(xy, n, closed, i, 2 * scale);
}

/**
 * Vertex indices (ascending) that are sharp corners.
 * @param scale the chord length L (mm), a few tolerances
 * @param angle threshold in radians
 */
export function findCorners(xy: Float64Array, closed: boolean, scale: number, angle: number): number[] {
  const n = xy.length >> 1;
  if (n < 3) return [];
  const turn = new Float64Array(n);
  for (let i = 0; i < n; i++) turn[i] = turnAt(xy, n, closed, i, scale);
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    const t = turn[i];
    if (t < angle) continue;
    if (2 * t - turnAt(xy, n, closed, i, 2 * scale) < angle) continue;
    // Non-maximum suppression within the chord length on both sides (ties go to the first).
    const x = xy[2 * i], y = xy[2 * i + 1];
    let isMax = true;
    for (const dir of [-1, 1]) {
      for (let step = 1; step < n && isMax; step++) {
        let k = i + dir * step;
        if (closed) k = ((k % n) + n) % n;
        else if (k < 0 || k >= n) break;
        if (k === i) break;
        const dx = xy[2 * k] - x, dy = xy[2 * k + 1] - y;
        if (dx * dx + dy * dy > scale * scale) break;
        if (turn[k] > t || (turn[k] === t && (dir < 0))) isMax = false;
      }
    }
    if (isMax) out.push(i);
  }
  return out;
}
