/**
 * Join: open contours whose ends meet become one contour, closed when its own ends
 * meet, so a ring drawn as 720 separate lines is fitted as one closed contour.
 *
 * Method [derived; the endpoint graph as in any graph-theory text, from memory]:
 * the ends are points in a k-d tree; every pair of ends of different contours
 * closer than the join distance is a candidate; candidates are matched greedily,
 * nearest first and, among equally near ones, the straightest continuation first
 * (greedy matching), each end used once. Matched ends link the contours into chains
 * and cycles, which are walked and concatenated, reversing contours as needed. At
 * a junction of three or more ends the straightest pair continues and the other
 * ends start or stop chains. A chain whose ends meet, with at least three vertices
 * and length over twice the join distance, is closed.
 */
import { PointTree } from './pointTree.js';

/** An open polyline to join, mm (stride 2), with what it stands for. */
export interface JoinInput<S> {
  xy: Float64Array;
  sources: S[];
}

/** A joined contour: `gap` is the widest gap between joined ends (mm). */
export interface Joined<S> {
  xy: Float64Array;
  closed: boolean;
  sources: S[];
  gap: number;
}

/** Ends closer than this are the same point (mm: a nanometre, far below any machine's step). */
const SAME = 1e-6;

/** Candidates looked at per end: enough for any real junction, bounded for a star of many lines through one point. */
const PER_END = 8;

/**
 * Join open polylines whose ends are within `distance` (mm).
 * @returns the contours (joined or not, in the order of their first input piece) and how many inputs were absorbed
 */
export function joinOpen<S>(pieces: readonly JoinInput<S>[], distance: number): { contours: Joined<S>[]; joined: number } {
  const n = pieces.length;
  const ends = new Float64Array(4 * n);
  const dirs = new Float64Array(4 * n);
  const joinable = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const xy = pieces[i].xy, m = xy.length;
    ends.set([xy[0], xy[1], xy[m - 2], xy[m - 1]], 4 * i);
    if (m < 4) continue;
    joinable[i] = 1;
    // Unit directions pointing out of the piece at each end.
    outward(dirs, 4 * i, xy[0], xy[1], xy, 2, 2);
    outward(dirs, 4 * i + 2, xy[m - 2], xy[m - 1], xy, m - 4, -2);
  }
  const partner = new Int32Array(2 * n).fill(-1);
  if (distance > 0 && n > 1) matchEnds(ends, dirs, joinable, distance, partner);
  const contours: Joined<S>[] = [];
  const used = new Uint8Array(n);
  const owner = new Int32Array(n);
  const walk = (startEnd: number): Joined<S> => {
    const out: number[] = [];
    const sources: S[] = [];
    let gap = 0;
    let e = startEnd;
    for (;;) {
      const i = e >> 1;
      used[i] = 1;
      owner[i] = contours.length;
      appendPiece(out, pieces[i].xy, (e & 1) === 1);
      sources.push(...pieces[i].sources);
      const next = partner[e ^ 1];
      if (next < 0 || used[next >> 1]) break;
      gap = Math.max(gap, Math.hypot(ends[2 * (e ^ 1)] - ends[2 * next], ends[2 * (e ^ 1) + 1] - ends[2 * next + 1]));
      e = next;
    }
    return { xy: Float64Array.from(out), closed: false, sources, gap };
  };
  // Chains start at an end without partner; what remains afterwards are cycles.
  for (let i = 0; i < n; i++) {
    if (used[i]) continue;
    const free = partner[2 * i] < 0 ? 2 * i : partner[2 * i + 1] < 0 ? 2 * i + 1 : -1;
    if (free >= 0) contours.push(walk(free));
  }
  for (let i = 0; i < n; i++) if (!used[i]) contours.push(walk(2 * i));
  for (const c of contours) closeIfMeets(c, distance);
  // Keep the order of each contour's first input piece, so output follows input.
  const order = contours.map((_, k) => k);
  const firstPiece = new Int32Array(contours.length).fill(n);
  for (let i = 0; i < n; i++) firstPiece[owner[i]] = Math.min(firstPiece[owner[i]], i);
  order.sort((a, b) => firstPiece[a] - firstPiece[b]);
  return { contours: order.map((k) => contours[k]), joined: n - contours.length };
}

function outward(dirs: Float64Array, at: number, x: number, y: number, xy: Float64Array, from: number, step: number): void {
  // The first vertex away from the end, so a repeated vertex does not give a zero direction.
  for (let k = from; k >= 0 && k < xy.length; k += step) {
    const dx = x - xy[k], dy = y - xy[k + 1];
    const l = Math.hypot(dx, dy);
    if (l > 0) {
      dirs[at] = dx / l;
      dirs[at + 1] = dy / l;
      return;
    }
  }
}

/** Greedy matching of ends: nearest first, then straightest; writes partner[end] (end 2i = start of piece i, 2i+1 = its end). */
function matchEnds(ends: Float64Array, dirs: Float64Array, joinable: Uint8Array, distance: number, partner: Int32Array): void {
  const tree = new PointTree(ends);
  const ids = new Int32Array(PER_END + 1), d2 = new Float64Array(PER_END + 1);
  const a: number[] = [], b: number[] = [], key: number[] = [], straight: number[] = [];
  // Distances are ranked in steps of a quarter of the join distance: within a step, straighter wins.
  const step = distance / 4;
  for (let p = 0; p < ends.length >> 1; p++) {
    if (!joinable[p >> 1]) continue;
    const found = tree.nearestK(ends[2 * p], ends[2 * p + 1], PER_END + 1, distance, (q) => q > p && (q >> 1) !== (p >> 1) && joinable[q >> 1] === 1, ids, d2);
    for (let k = 0; k < found; k++) {
      const q = ids[k];
      a.push(p);
      b.push(q);
      key.push(Math.floor(Math.sqrt(d2[k]) / step));
      straight.push(dirs[2 * p] * dirs[2 * q] + dirs[2 * p + 1] * dirs[2 * q + 1]);
    }
  }
  const order = a.map((_, i) => i);
  order.sort((i, j) => key[i] - key[j] || straight[i] - straight[j] || a[i] - a[j] || b[i] - b[j]);
  for (const i of order) {
    const p = a[i], q = b[i];
    if (partner[p] >= 0 || partner[q] >= 0) continue;
    partner[p] = q;
    partner[q] = p;
  }
}

/** Append a piece (reversed when asked), skipping its first vertex when it repeats the last one written. */
function appendPiece(out: number[], xy: Float64Array, reversed: boolean): void {
  const nv = xy.length >> 1;
  for (let k = 0; k < nv; k++) {
    const v = reversed ? nv - 1 - k : k;
    const x = xy[2 * v], y = xy[2 * v + 1];
    const m = out.length;
    if (m >= 2 && Math.abs(out[m - 2] - x) <= SAME && Math.abs(out[m - 1] - y) <= SAME) continue;
    out.push(x, y);
  }
}

function closeIfMeets<S>(c: Joined<S>, distance: number): void {
  const xy = c.xy, m = xy.length;
  if (m < 6) return;
  const gap = Math.hypot(xy[m - 2] - xy[0], xy[m - 1] - xy[1]);
  if (gap > distance) return;
  let len = 0;
  for (let k = 2; k < m; k += 2) len += Math.hypot(xy[k] - xy[k - 2], xy[k + 1] - xy[k - 1]);
  if (len <= 2 * distance) return;
  c.closed = true;
  c.gap = Math.max(c.gap, gap);
  if (gap <= SAME) c.xy = xy.slice(0, m - 2);
}
