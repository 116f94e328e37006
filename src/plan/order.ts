/**
 * Order: the sequence, direction and entry point of one group's contours that
 * shortens pen-up travel.
 *
 * The problem is a generalized travelling-salesman path: each contour is a
 * cluster of possible entries (the two ends of an open contour, each leaving at
 * the other end; any vertex of a closed contour, leaving where it entered), one
 * entry per cluster is visited (the generalized TSP for contours with a choice of
 * entry point, from memory). Method:
 * 1. construction: greedy matching of contour ends (src/plan/greedy.ts); with holes
 *    first, nearest neighbour over every entry point in a k-d tree
 *    (src/plan/pointTree.ts), removing a contour's entries once it is drawn (O(log n)
 *    a step) and adding a container's entries only once everything inside it is
 *    drawn (precedence constraints for nested contours);
 * 2. improvement: 2-opt and Or-opt over neighbour lists (src/plan/improve.ts);
 * 3. each closed contour is re-entered at its best vertex given its neighbours in
 *    the order (moving its start point), and steps 2–3 run once more.
 */
import { PointTree } from './pointTree.js';
import { improve } from './improve.js';
import { greedyOrder, type EntryPoints } from './greedy.js';
import { Tour, dist } from './tour.js';

/** A contour to order, mm (stride 2). */
export interface OrderItem {
  xy: Float64Array;
  closed: boolean;
}

/** The order: `seq` lists item indices in drawing order; an open item with `reversed` set is drawn backwards; a closed one starts at vertex `entry`. */
export interface OrderResult {
  seq: Int32Array;
  reversed: Uint8Array;
  entry: Int32Array;
}

export interface OrderSettings {
  /** Where the job starts (mm), or null for anywhere. */
  start: readonly [number, number] | null;
  /** The container each item must come before (-1: none), or null for no constraint. */
  parents: Int32Array | null;
}

/** Entries of a closed contour offered to the construction (evenly spaced); the best vertex is chosen exactly afterwards. */
const CLOSED_ENTRIES = 32;
/** Candidate neighbours per end. */
const NEIGHBOURS = 8;
/** Improvement rounds (each followed by re-choosing the closed contours' entries). */
const ROUNDS = 2;

/** Order one group's contours. */
export function orderContours(items: readonly OrderItem[], settings: OrderSettings): OrderResult {
  const n = items.length;
  const t = new Tour(n);
  if (settings.start) {
    t.sx = settings.start[0];
    t.sy = settings.start[1];
  }
  const entry = new Int32Array(n);
  if (settings.parents) t.setParents(settings.parents);
  if (settings.parents) construct(items, t, entry);
  else {
    const single = items.map((it) => it.closed || it.xy.length < 4);
    greedyOrder(entryPoints(items), single, t, entry, (i, v) => setEnds(items, t, i, v));
  }
  const limits = { maxSpan: 50_000, maxMoves: 100 * n + 1000 };
  for (let round = 0; round < ROUNDS && n > 1; round++) {
    improve(t, candidates(t, items), 2 * NEIGHBOURS, limits);
    if (!chooseEntries(items, t, entry)) break;
  }
  const reversed = new Uint8Array(n);
  for (let i = 0; i < n; i++) reversed[i] = items[i].closed ? 0 : t.rev[i];
  return { seq: t.seq.slice(), reversed, entry };
}

function setEnds(items: readonly OrderItem[], t: Tour, i: number, entryVertex: number): void {
  const xy = items[i].xy, m = xy.length;
  if (items[i].closed) {
    t.ax[i] = t.bx[i] = xy[2 * entryVertex];
    t.ay[i] = t.by[i] = xy[2 * entryVertex + 1];
  } else {
    t.ax[i] = xy[0];
    t.ay[i] = xy[1];
    t.bx[i] = xy[m - 2];
    t.by[i] = xy[m - 1];
  }
}

/** Entry points: both ends of an open contour, up to CLOSED_ENTRIES vertices evenly spaced of a closed one. */
function entryPoints(items: readonly OrderItem[]): EntryPoints {
  const n = items.length;
  const first = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) {
    const nv = items[i].xy.length >> 1;
    first[i + 1] = first[i] + (items[i].closed ? Math.min(nv, CLOSED_ENTRIES) : Math.min(nv, 2));
  }
  const pts = new Float64Array(2 * first[n]);
  const owner = new Int32Array(first[n]);
  const vertex = new Int32Array(first[n]);
  for (let i = 0; i < n; i++) {
    const xy = items[i].xy, nv = xy.length >> 1, m = first[i + 1] - first[i];
    for (let k = 0; k < m; k++) {
      const v = items[i].closed ? Math.floor((k * nv) / m) : k === 0 ? 0 : nv - 1;
      const p = first[i] + k;
      pts[2 * p] = xy[2 * v];
      pts[2 * p + 1] = xy[2 * v + 1];
      owner[p] = i;
      vertex[p] = v;
    }
  }
  return { pts, first, owner, vertex };
}

/** Nearest-neighbour construction over all entry points, holding a container back until its contents are drawn. */
function construct(items: readonly OrderItem[], t: Tour, entry: Int32Array): void {
  const n = items.length;
  const { pts, first, owner, vertex } = entryPoints(items);
  const tree = new PointTree(pts);
  const pending = new Int32Array(n);
  const par = t.parent;
  const drop = (i: number): void => {
    for (let p = first[i]; p < first[i + 1]; p++) tree.remove(p);
  };
  if (par) {
    for (let i = 0; i < n; i++) if (par[i] >= 0) pending[par[i]]++;
    for (let i = 0; i < n; i++) if (pending[i] > 0) drop(i);
  }
  let cx = t.sx, cy = t.sy;
  const placed = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    let p = -1;
    if (cx === cx) p = tree.nearest(cx, cy);
    else {
      // No start point: the first contour that may go first.
      for (let i = 0; i < n && p < 0; i++) if (!placed[i] && pending[i] === 0) p = first[i];
    }
    if (p < 0) throw new Error(`plan order: no contour left to draw after ${k} of ${n} (containment must be a forest)`);
    const i = owner[p], v = vertex[p];
    placed[i] = 1;
    drop(i);
    t.seq[k] = i;
    t.pos[i] = k;
    entry[i] = items[i].closed ? v : 0;
    setEnds(items, t, i, entry[i]);
    t.rev[i] = !items[i].closed && v !== 0 ? 1 : 0;
    cx = t.exitX(k);
    cy = t.exitY(k);
    if (par && par[i] >= 0 && --pending[par[i]] === 0) {
      for (let q = first[par[i]]; q < first[par[i] + 1]; q++) tree.restore(q);
    }
  }
}

/** Up to 2·NEIGHBOURS candidate items per item: the items nearest to either of its ends. */
function candidates(t: Tour, items: readonly OrderItem[]): Int32Array {
  const n = t.n, k = 2 * NEIGHBOURS;
  const pts = new Float64Array(4 * n);
  for (let i = 0; i < n; i++) pts.set([t.ax[i], t.ay[i], t.bx[i], t.by[i]], 4 * i);
  const tree = new PointTree(pts);
  const cand = new Int32Array(n * k).fill(-1);
  // Twice as many points as items wanted: an item's two ends are often both among the nearest.
  const ids = new Int32Array(2 * NEIGHBOURS), d2 = new Float64Array(2 * NEIGHBOURS);
  for (let i = 0; i < n; i++) {
    let filled = 0;
    const ends = items[i].closed ? 1 : 2;
    for (let e = 0; e < ends; e++) {
      const found = tree.nearestK(pts[4 * i + 2 * e], pts[4 * i + 2 * e + 1], 2 * NEIGHBOURS, Infinity, (p) => p >> 1 !== i && !(items[p >> 1].closed && (p & 1) === 1), ids, d2);
      const stop = filled + NEIGHBOURS;
      for (let m = 0; m < found && filled < stop; m++) {
        const c = ids[m] >> 1;
        let dup = false;
        for (let r = 0; r < filled; r++) if (cand[i * k + r] === c) dup = true;
        if (!dup) cand[i * k + filled++] = c;
      }
    }
  }
  return cand;
}

/** Re-enter each closed contour at the vertex nearest its neighbours in the order; true when any entry moved. */
function chooseEntries(items: readonly OrderItem[], t: Tour, entry: Int32Array): boolean {
  let moved = false;
  for (let k = 0; k < t.n; k++) {
    const i = t.seq[k];
    if (!items[i].closed) continue;
    const px = t.exitX(k - 1), py = t.exitY(k - 1), qx = t.entryX(k + 1), qy = t.entryY(k + 1);
    const xy = items[i].xy;
    let best = entry[i], bestCost = dist(px, py, xy[2 * best], xy[2 * best + 1]) + dist(xy[2 * best], xy[2 * best + 1], qx, qy);
    for (let v = 0; v < xy.length >> 1; v++) {
      const c = dist(px, py, xy[2 * v], xy[2 * v + 1]) + dist(xy[2 * v], xy[2 * v + 1], qx, qy);
      if (c < bestCost - 1e-12) {
        bestCost = c;
        best = v;
      }
    }
    if (best !== entry[i]) {
      entry[i] = best;
      setEnds(items, t, i, best);
      moved = true;
    }
  }
  return moved;
}
