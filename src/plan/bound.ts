/**
 * A lower bound on pen-up travel: the minimum spanning tree over the contours,
 * the distance between two contours taken as the shortest distance between their
 * entry points (the ends of an open contour, every vertex of a closed one).
 *
 * Why it bounds [textbook: deleting one edge of a tour leaves a spanning path]:
 * the travel moves of any plan connect the contours in a path that spans them,
 * and each move is at least the distance between the two contours it connects,
 * so no plan travels less than the spanning tree.
 *
 * Method: the minimum distance between two point sets is realised by a Delaunay
 * edge (the circle on the closest cross pair as diameter holds no other point,
 * else a shorter cross pair exists; such Gabriel edges are Delaunay edges), so
 * Kruskal's algorithm over the Delaunay edges (delaunator), with each contour's
 * points joined up front at zero cost, gives the exact tree. Collinear input has no
 * triangles; its tree joins neighbours in sorted order.
 */
import Delaunator from 'delaunator';

/** A contour, mm (stride 2). */
export interface BoundInput {
  xy: Float64Array;
  closed: boolean;
}

/** The spanning-tree lower bound on the travel between the given contours (mm). */
export function travelLowerBound(contours: readonly BoundInput[]): number {
  let count = 0;
  for (const c of contours) count += entryCount(c);
  if (contours.length < 2) return 0;
  const pts = new Float64Array(2 * count);
  const owner = new Uint32Array(count);
  let at = 0;
  contours.forEach((c, i) => {
    const nv = c.xy.length >> 1;
    if (nv === 0) return;
    const put = (v: number): void => {
      pts[2 * at] = c.xy[2 * v];
      pts[2 * at + 1] = c.xy[2 * v + 1];
      owner[at++] = i;
    };
    if (c.closed) for (let v = 0; v < nv; v++) put(v);
    else {
      put(0);
      if (nv > 1) put(nv - 1);
    }
  });
  const parent = new Int32Array(contours.length).map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) i = parent[i] = parent[parent[i]];
    return i;
  };
  let comps = contours.filter((c) => c.xy.length >= 2).length;
  const union = (a: number, b: number): boolean => {
    const ra = find(a), rb = find(b);
    if (ra === rb) return false;
    parent[ra] = rb;
    comps--;
    return true;
  };
  // Equal points of different contours are at distance 0 (the triangulation keeps only one of them).
  const sorted = new Uint32Array(count).map((_, i) => i);
  sorted.sort((i, j) => pts[2 * i] - pts[2 * j] || pts[2 * i + 1] - pts[2 * j + 1]);
  for (let k = 1; k < count; k++) {
    const i = sorted[k - 1], j = sorted[k];
    if (pts[2 * i] === pts[2 * j] && pts[2 * i + 1] === pts[2 * j + 1]) union(owner[i], owner[j]);
  }
  const ea: number[] = [], eb: number[] = [];
  const tri = count >= 3 ? new Delaunator(pts) : null;
  if (tri && tri.triangles.length > 0) {
    const { triangles, halfedges } = tri;
    for (let e = 0; e < triangles.length; e++) {
      if (e < halfedges[e]) continue; // each inner edge once; hull edges have halfedge -1
      const a = triangles[e], b = triangles[e % 3 === 2 ? e - 2 : e + 1];
      if (owner[a] !== owner[b]) {
        ea.push(a);
        eb.push(b);
      }
    }
  } else {
    for (let k = 1; k < count; k++) {
      ea.push(sorted[k - 1]);
      eb.push(sorted[k]);
    }
  }
  const len = new Float64Array(ea.length);
  for (let k = 0; k < ea.length; k++) len[k] = Math.hypot(pts[2 * ea[k]] - pts[2 * eb[k]], pts[2 * ea[k] + 1] - pts[2 * eb[k] + 1]);
  const order = new Uint32Array(ea.length).map((_, k) => k);
  order.sort((i, j) => len[i] - len[j]);
  let total = 0;
  for (let k = 0; k < order.length && comps > 1; k++) {
    const e = order[k];
    if (union(owner[ea[e]], owner[eb[e]])) total += len[e];
  }
  return total;
}

function entryCount(c: BoundInput): number {
  const nv = c.xy.length >> 1;
  return c.closed ? nv : Math.min(nv, 2);
}
