/**
 * Greedy matching construction of the order (the greedy edge heuristic for the
 * travelling salesman: take the shortest remaining edge that keeps every degree at
 * most two and closes no cycle; from memory, as in Johnson and McGeoch's survey of
 * TSP heuristics), adapted to contours: an edge joins an end of one contour to an
 * end of another; an open contour's two ends take one edge each; a closed contour
 * takes two edges at the same vertex (it is entered and left there). Candidate edges
 * are the k nearest entry points of other contours (k-d tree), so it runs in
 * O(n log n). The fragments left are chained nearest end first from the start.
 * It starts 2-opt/Or-opt from a shorter order than nearest neighbour does.
 */
import { PointTree } from './pointTree.js';
import type { Tour } from './tour.js';

/** Entry points of the items: `first[i]..first[i+1]` in `pts`, with their item and vertex. */
export interface EntryPoints {
  pts: Float64Array;
  first: Int32Array;
  owner: Int32Array;
  vertex: Int32Array;
}

/** Candidate edges per entry point: five nearest of other contours (eight gave no shorter orders on the benchmark). */
const K = 5;

/**
 * Build the order in `t` (seq, pos, rev) and each item's entry vertex.
 * @param closed per item: entered and left at one vertex (a closed contour, or a single point)
 */
export function greedyOrder(e: EntryPoints, closed: ArrayLike<boolean>, t: Tour, entry: Int32Array, setEnds: (i: number, v: number) => void): void {
  const n = t.n, np = e.owner.length;
  const tree = new PointTree(e.pts);
  // Candidate edges between points of different items.
  const ea = new Int32Array(np * K), eb = new Int32Array(np * K), el = new Float64Array(np * K);
  let m = 0;
  const ids = new Int32Array(K), d2 = new Float64Array(K);
  for (let p = 0; p < np; p++) {
    const i = e.owner[p];
    const found = tree.nearestK(e.pts[2 * p], e.pts[2 * p + 1], K, Infinity, (q) => q > p && e.owner[q] !== i, ids, d2);
    for (let k = 0; k < found; k++, m++) {
      ea[m] = p;
      eb[m] = ids[k];
      el[m] = d2[k];
    }
  }
  const order = new Uint32Array(m).map((_, k) => k);
  order.sort((x, y) => el[x] - el[y]);
  // Links: up to two per item, as the point used on this item.
  const linkPt = new Int32Array(2 * n).fill(-1);
  const linkTo = new Int32Array(2 * n).fill(-1);
  const deg = new Uint8Array(n);
  const uf = new Int32Array(n).map((_, i) => i);
  const find = (i: number): number => {
    while (uf[i] !== i) i = uf[i] = uf[uf[i]];
    return i;
  };
  // Whether item i can take an edge at point p.
  const free = (i: number, p: number): boolean => {
    if (closed[i]) return deg[i] === 0 || (deg[i] === 1 && e.vertex[linkPt[2 * i]] === e.vertex[p]);
    // An open item's end takes one edge: the other link, if any, must be at the other end.
    return deg[i] === 0 || (deg[i] === 1 && e.vertex[linkPt[2 * i]] !== e.vertex[p]);
  };
  for (const k of order) {
    const p = ea[k], q = eb[k], i = e.owner[p], j = e.owner[q];
    if (!free(i, p) || !free(j, q)) continue;
    const ri = find(i), rj = find(j);
    if (ri === rj) continue;
    uf[ri] = rj;
    linkPt[2 * i + deg[i]] = p;
    linkTo[2 * i + deg[i]++] = q;
    linkPt[2 * j + deg[j]] = q;
    linkTo[2 * j + deg[j]++] = p;
  }
  // Chain the fragments: from the current point to the nearest free end of a fragment not yet drawn.
  const endTree = new PointTree(e.pts);
  for (let p = 0; p < np; p++) {
    const i = e.owner[p];
    // A fragment may start at an item with fewer than two links, at a point that is not in use.
    const usable = deg[i] < 2 && (deg[i] === 0 || (closed[i] ? e.vertex[linkPt[2 * i]] === e.vertex[p] : e.vertex[linkPt[2 * i]] !== e.vertex[p]));
    if (!usable) endTree.remove(p);
  }
  let cx = t.sx, cy = t.sy, k = 0;
  while (k < n) {
    let p = cx === cx ? endTree.nearest(cx, cy) : -1;
    if (p < 0) for (let q = 0; q < np && p < 0; q++) if (endTree.has(q)) p = q;
    if (p < 0) throw new Error(`plan order: greedy chaining found no fragment end after ${k} of ${n}`);
    // Walk the fragment from p.
    let i = e.owner[p], inPt = p, prev = -1;
    for (;;) {
      for (let q = e.first[i]; q < e.first[i + 1]; q++) endTree.remove(q);
      const v = e.vertex[inPt];
      entry[i] = closed[i] ? v : 0;
      setEnds(i, entry[i]);
      t.rev[i] = !closed[i] && v !== 0 ? 1 : 0;
      t.seq[k] = i;
      t.pos[i] = k++;
      // The link that does not lead back.
      let next = -1;
      for (let s = 0; s < deg[i]; s++) if (e.owner[linkTo[2 * i + s]] !== prev) next = s;
      if (next < 0) break;
      prev = i;
      inPt = linkTo[2 * i + next];
      i = e.owner[inPt];
    }
    cx = t.exitX(k - 1);
    cy = t.exitY(k - 1);
  }
}
