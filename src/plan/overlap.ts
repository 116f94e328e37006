/**
 * Double lines: the parts of a contour that an earlier contour of the same group
 * already draws are cut out, so each line is drawn once.
 *
 * Method [derived]: every segment of every contour goes into a static R-tree
 * (flatbush). Contours are taken longest first (a short line lying on a long
 * one goes whole, rather than cutting the long one in two), ties in input order;
 * for each segment PQ of the current contour, the kept parts of earlier contours' segments near it that run
 * within 15° of parallel each cover an interval of PQ: the part of PQ beside them
 * within `distance` (src/plan/beside.ts). Covered intervals are merged along the
 * contour's arc length; an interval is removed when it covers the whole contour,
 * or is at least `minEnd` long at an open contour's end, or at least `minInner`
 * long elsewhere (cutting a contour in two costs a pen lift, so only a long
 * stretch is worth it; a shallow crossing covers a short one). Exact duplicates,
 * reversed duplicates and collinear partial overlaps of lines all reduce to this;
 * so do co-circular arcs, as their flattened chords run parallel within one
 * flattening step; and a grid of squares drawn as separate closed paths keeps each
 * inner edge once (the first square that draws it keeps it). Removed parts lie
 * within `distance` of kept lines.
 */
import Flatbush from 'flatbush';
import { segmentBesideSegment } from './beside.js';

/** Segments turning more than this against the kept line are crossings, not double lines (15°). */
const MAX_SIN = Math.sin((15 * Math.PI) / 180);

/** A polyline to de-duplicate, mm (stride 2). */
export interface Polyline {
  xy: Float64Array;
  closed: boolean;
}

/** A kept piece of input contour `from`; `whole` when nothing of that contour was removed. */
export interface OverlapPiece extends Polyline {
  from: number;
  whole: boolean;
}

export interface OverlapResult {
  /** Kept pieces, in input order. */
  pieces: OverlapPiece[];
  /** Length removed (mm). */
  removedLength: number;
  /** Input contours that lost something. */
  touched: number;
}

/**
 * Remove double lines from one group's contours.
 * @param contours in drawing order (of two equally long, the earlier one keeps its lines)
 * @param distance how close a line must run to a kept one to count as the same line (mm)
 * @param minEnd shortest stretch removed at an open contour's end (mm)
 * @param minInner shortest stretch removed elsewhere (mm)
 */
export function removeOverlaps(contours: readonly Polyline[], distance: number, minEnd: number, minInner: number): OverlapResult {
  const n = contours.length;
  const base = new Uint32Array(n + 1);
  for (let c = 0; c < n; c++) base[c + 1] = base[c] + segmentCount(contours[c]);
  const segs = base[n];
  const pieces: OverlapPiece[] = [];
  if (segs === 0) {
    contours.forEach((p, c) => pieces.push({ xy: p.xy, closed: p.closed, from: c, whole: true }));
    return { pieces, removedLength: 0, touched: 0 };
  }
  const index = new Flatbush(segs);
  const owner = new Uint32Array(segs);
  const startLen = new Float64Array(segs);
  for (let c = 0; c < n; c++) {
    const { xy } = contours[c];
    const nv = xy.length >> 1;
    let s = 0;
    for (let k = 0, h = base[c]; h < base[c + 1]; k++, h++) {
      const j = (k + 1) % nv;
      const ax = xy[2 * k], ay = xy[2 * k + 1], bx = xy[2 * j], by = xy[2 * j + 1];
      index.add(Math.min(ax, bx), Math.min(ay, by), Math.max(ax, bx), Math.max(ay, by));
      owner[h] = c;
      startLen[h] = s;
      s += Math.hypot(bx - ax, by - ay);
    }
  }
  index.finish();
  // Kept arc-length intervals per contour (flat pairs, not wrapping), null when kept whole.
  const kept: (Float64Array | null)[] = new Array<Float64Array | null>(n).fill(null);
  const t = new Float64Array(2);
  let removedLength = 0, touched = 0;
  const total = new Float64Array(n);
  for (let c = 0; c < n; c++) if (base[c + 1] > base[c]) total[c] = startLen[base[c + 1] - 1] + segLength(contours[c].xy, base[c + 1] - 1 - base[c], contours[c].xy.length >> 1);
  const order = Array.from({ length: n }, (_, c) => c).sort((a, b) => total[b] - total[a] || a - b);
  const rank = new Int32Array(n);
  order.forEach((c, k) => (rank[c] = k));
  const byContour: OverlapPiece[][] = contours.map(() => []);
  for (const c of order) {
    const { xy, closed } = contours[c];
    const nv = xy.length >> 1;
    const covered: number[] = [];
    const L = total[c];
    for (let k = 0, h = base[c]; h < base[c + 1]; k++, h++) {
      const j = (k + 1) % nv;
      const px = xy[2 * k], py = xy[2 * k + 1], qx = xy[2 * j], qy = xy[2 * j + 1];
      const len = Math.hypot(qx - px, qy - py);
      const hits = index.search(Math.min(px, qx) - distance, Math.min(py, qy) - distance, Math.max(px, qx) + distance, Math.max(py, qy) + distance, (i) => rank[owner[i]] < rank[c]);
      const local: number[] = [];
      for (const hit of hits) {
        const o = owner[hit];
        const oxy = contours[o].xy, onv = oxy.length >> 1, ok = hit - base[o], oj = (ok + 1) % onv;
        const ax = oxy[2 * ok], ay = oxy[2 * ok + 1], bx = oxy[2 * oj], by = oxy[2 * oj + 1];
        const olen = Math.hypot(bx - ax, by - ay);
        if (len > 0 && olen > 0 && Math.abs((qx - px) * (by - ay) - (qy - py) * (bx - ax)) > MAX_SIN * len * olen) continue;
        const ranges = keptRanges(kept[o], startLen[hit], olen);
        for (let i = 0; i < ranges.length; i += 2) {
          const u0 = ranges[i], u1 = ranges[i + 1];
          if (segmentBesideSegment(t, px, py, qx, qy, ax + u0 * (bx - ax), ay + u0 * (by - ay), ax + u1 * (bx - ax), ay + u1 * (by - ay), distance)) {
            local.push(startLen[h] + t[0] * len, startLen[h] + t[1] * len);
          }
        }
      }
      mergeInto(covered, local);
    }
    const removed = chooseRemoved(covered, L, closed, minEnd, minInner);
    if (removed.length === 0) {
      byContour[c].push({ xy, closed, from: c, whole: true });
      continue;
    }
    touched++;
    const keep = complement(removed, L, closed);
    let keptLen = 0;
    const flat: number[] = [];
    for (let i = 0; i < keep.length; i += 2) {
      keptLen += keep[i + 1] - keep[i];
      const piece = extract(xy, closed, startLen, base[c], keep[i], keep[i + 1], L);
      if (piece.length >= 4) byContour[c].push({ xy: piece, closed: false, from: c, whole: false });
      // Stored unwrapped for later queries.
      if (keep[i + 1] > L) flat.push(keep[i], L, 0, keep[i + 1] - L);
      else flat.push(keep[i], keep[i + 1]);
    }
    kept[c] = Float64Array.from(flat);
    removedLength += L - keptLen;
  }
  for (const list of byContour) pieces.push(...list);
  return { pieces, removedLength, touched };
}

function segmentCount(p: Polyline): number {
  const nv = p.xy.length >> 1;
  if (nv < 2) return 0;
  return p.closed ? nv : nv - 1;
}

function segLength(xy: Float64Array, k: number, nv: number): number {
  const j = (k + 1) % nv;
  return Math.hypot(xy[2 * j] - xy[2 * k], xy[2 * j + 1] - xy[2 * k + 1]);
}

const WHOLE = [0, 1];

/** The kept parameter ranges (pairs in [0, 1]) of a segment starting at arc length s0 with length len. */
function keptRanges(kept: Float64Array | null, s0: number, len: number): number[] {
  if (kept === null) return WHOLE;
  const out: number[] = [];
  const s1 = s0 + len;
  for (let i = 0; i < kept.length; i += 2) {
    const a = Math.max(kept[i], s0), b = Math.min(kept[i + 1], s1);
    if (a <= b && len > 0) out.push((a - s0) / len, (b - s0) / len);
    else if (a <= b) out.push(0, 1);
  }
  return out;
}

/** Merge sorted-or-not intervals `add` into the sorted disjoint list `into` (flat pairs). */
function mergeInto(into: number[], add: number[]): void {
  if (add.length === 0) return;
  const pairs: [number, number][] = [];
  for (let i = 0; i < into.length; i += 2) pairs.push([into[i], into[i + 1]]);
  for (let i = 0; i < add.length; i += 2) pairs.push([add[i], add[i + 1]]);
  pairs.sort((a, b) => a[0] - b[0]);
  into.length = 0;
  for (const [a, b] of pairs) {
    const m = into.length;
    if (m > 0 && a <= into[m - 1] + 1e-9) into[m - 1] = Math.max(into[m - 1], b);
    else into.push(a, b);
  }
}

/** The covered intervals long enough to remove; on a closed contour the ones at 0 and L join across the seam. */
function chooseRemoved(covered: number[], L: number, closed: boolean, minEnd: number, minInner: number): number[] {
  if (covered.length === 0 || !(L > 0)) return [];
  const eps = 1e-9 * (1 + L);
  let sum = 0;
  for (let i = 0; i < covered.length; i += 2) sum += covered[i + 1] - covered[i];
  if (sum >= L - eps) return [0, L];
  const iv = covered.slice();
  if (closed && iv.length >= 4 && iv[0] <= eps && iv[iv.length - 1] >= L - eps) {
    // Wraps: [last.lo, L + first.hi], stored past L.
    const hi = iv[1];
    iv.splice(0, 2);
    iv[iv.length - 1] = L + hi;
  }
  const out: number[] = [];
  for (let i = 0; i < iv.length; i += 2) {
    const atEnd = !closed && (iv[i] <= eps || iv[i + 1] >= L - eps);
    if (iv[i + 1] - iv[i] >= (atEnd ? minEnd : minInner)) out.push(iv[i], iv[i + 1]);
  }
  return out;
}

/** What is left of [0, L] (closed: of the circle of length L) after the removed intervals. */
function complement(removed: number[], L: number, closed: boolean): number[] {
  if (removed.length === 2 && removed[0] === 0 && removed[1] === L) return [];
  const out: number[] = [];
  if (!closed) {
    let at = 0;
    for (let i = 0; i < removed.length; i += 2) {
      if (removed[i] > at) out.push(at, removed[i]);
      at = removed[i + 1];
    }
    if (at < L) out.push(at, L);
    return out;
  }
  // Closed: from the end of each removed interval to the start of the next, around the seam.
  const m = removed.length / 2;
  for (let i = 0; i < m; i++) {
    const a = removed[2 * i + 1];
    const b = removed[2 * ((i + 1) % m)] + (i + 1 === m ? L : 0);
    if (b > a) {
      if (a >= L) out.push(a - L, b - L);
      else out.push(a, b);
    }
  }
  return out;
}

/** The polyline between arc lengths s0 < s1 of a contour (s1 may pass L on a closed contour). */
function extract(xy: Float64Array, closed: boolean, startLen: Float64Array, base: number, s0: number, s1: number, L: number): Float64Array {
  const nv = xy.length >> 1;
  const segs = closed ? nv : nv - 1;
  const out: number[] = [];
  const point = (s: number): void => {
    const w = closed && s > L ? s - L : s;
    let k = upper(startLen, base, segs, w);
    if (k >= segs) k = segs - 1;
    const j = (k + 1) % nv;
    const len = Math.hypot(xy[2 * j] - xy[2 * k], xy[2 * j + 1] - xy[2 * k + 1]);
    const u = len > 0 ? Math.min(1, Math.max(0, (w - startLen[base + k]) / len)) : 0;
    out.push(xy[2 * k] + u * (xy[2 * j] - xy[2 * k]), xy[2 * k + 1] + u * (xy[2 * j + 1] - xy[2 * k + 1]));
  };
  point(s0);
  // Vertices strictly inside (s0, s1); vertex v sits at arc length startLen (L for the last), a closed contour may go round once.
  const laps = closed ? 2 : 1;
  for (let lap = 0; lap < laps; lap++) {
    for (let v = 1; v <= segs; v++) {
      const at = (v < segs ? startLen[base + v] : L) + lap * L;
      if (at > s0 && at < s1) out.push(xy[2 * (v % nv)], xy[2 * (v % nv) + 1]);
    }
  }
  point(s1);
  return Float64Array.from(out);
}

/** Index of the segment containing arc length s (the last whose start is ≤ s). */
function upper(startLen: Float64Array, base: number, segs: number, s: number): number {
  let lo = 0, hi = segs - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (startLen[base + mid] <= s) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}
