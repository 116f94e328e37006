/**
 * The path plan, pure: contours in mm in, contours in drawing order and the
 * plan's statistics out. Between reading and fitting; it acts only on stroke-only
 * (unfilled) contours, within groups of equal stroke colour, and passes filled
 * contours through untouched in their place.
 *
 * Per group, in the order the groups first appear:
 * 1. double lines (src/plan/overlap.ts): parts drawn by an earlier contour are cut out;
 * 2. join (src/plan/join.ts): open contours whose ends meet become one;
 * 3. order (src/plan/order.ts): sequence, direction and entry point for short travel,
 *    with holes first (src/plan/nesting.ts) when asked.
 * A group's contours are written where its first contour stood, so the document's
 * filled shapes and the colours' sequence keep their painting order.
 */
import { removeOverlaps } from './overlap.js';
import { joinOpen } from './join.js';
import { orderContours } from './order.js';
import { nestingParents } from './nesting.js';
import type { PlanContour, PlanSettings, PlanSource, PlannedContour, PlanStats } from './types.js';

/** The plan's result. */
export interface PlanResult {
  contours: PlannedContour[];
  stats: PlanStats;
}

/** A contour inside the plan, with the input contours it draws and the order it first appeared in. */
interface Work {
  xy: Float64Array;
  closed: boolean;
  sources: PlanSource[];
  slack: number;
  rank: number;
}

/**
 * Plan the drawing order of a document's contours.
 * @param input contours in document (painting) order, mm
 * @param s settings; every distance in mm
 */
export function planContours(input: readonly PlanContour[], s: PlanSettings): PlanResult {
  const t0 = performance.now();
  const groups = new Map<string, number[]>();
  input.forEach((c, i) => {
    if (c.filled || c.xy.length < 2) return;
    const g = groups.get(c.group);
    if (g) g.push(i);
    else groups.set(c.group, [i]);
  });
  const stats: PlanStats = {
    travelBefore: travelOf(input, s.start),
    travelAfter: 0,
    piercesBefore: input.filter((c) => c.xy.length >= 2).length,
    piercesAfter: 0,
    contoursJoined: 0,
    doubleLength: 0,
    doubleContours: 0,
    ms: 0,
  };
  const out: PlannedContour[] = [];
  let at: readonly [number, number] | null = s.start;
  for (let i = 0; i < input.length; i++) {
    const c = input[i];
    const g = c.filled || c.xy.length < 2 ? null : groups.get(c.group)!;
    if (g === null) out.push({ xy: c.xy, closed: c.closed, group: c.group, filled: c.filled, sources: [c.source], slack: 0 });
    else if (g[0] === i) {
      for (const w of planGroup(input, g, s, at, stats)) {
        out.push({ xy: w.xy, closed: w.closed, group: c.group, filled: false, sources: w.sources, slack: w.slack });
      }
    } else continue;
    const last = out[out.length - 1];
    if (last && last.xy.length >= 2) at = exitOf(last);
  }
  stats.travelAfter = travelOf(out, s.start);
  stats.piercesAfter = out.filter((c) => c.xy.length >= 2).length;
  stats.ms = performance.now() - t0;
  return { contours: out, stats };
}

function planGroup(input: readonly PlanContour[], members: number[], s: PlanSettings, at: readonly [number, number] | null, stats: PlanStats): Work[] {
  let work: Work[] = members.map((i, rank) => ({ xy: input[i].xy, closed: input[i].closed, sources: [input[i].source], slack: 0, rank }));
  if (s.overlaps) {
    // Covered stretches shorter than these stay: a shallow crossing (at 15° it covers 2d / sin 15° ≈ 7.7 d), not a line drawn twice.
    const d = s.overlapDistance;
    const res = removeOverlaps(work, d, 4 * d, 20 * d);
    stats.doubleLength += res.removedLength;
    stats.doubleContours += res.touched;
    const slack = res.touched > 0 ? s.overlapDistance : 0;
    work = res.pieces.map((p) => ({ xy: p.xy, closed: p.closed, sources: work[p.from].sources, slack, rank: work[p.from].rank }));
  }
  if (s.join) {
    const open = work.filter((w) => !w.closed && w.xy.length >= 4);
    const rest = work.filter((w) => w.closed || w.xy.length < 4);
    const res = joinOpen(open.map((w, k) => ({ xy: w.xy, sources: [k] })), s.joinDistance);
    stats.contoursJoined += res.joined;
    const joined = res.contours.map((j) => ({
      xy: j.xy,
      closed: j.closed,
      sources: j.sources.flatMap((k) => open[k].sources),
      slack: j.sources.reduce((m, k) => Math.max(m, open[k].slack), j.gap / 2),
      rank: j.sources.reduce((m, k) => Math.min(m, open[k].rank), Infinity),
    }));
    work = [...rest, ...joined].sort((a, b) => a.rank - b.rank);
  }
  const parents = s.holesFirst ? nestingParents(work) : null;
  if (s.order) {
    const r = orderContours(work, { start: at, parents });
    return Array.from(r.seq, (i) => {
      const w = work[i];
      const xy = w.closed ? rotate(w.xy, r.entry[i]) : r.reversed[i] ? reversePairs(w.xy) : w.xy;
      return { ...w, xy };
    });
  }
  return parents ? childrenFirst(work, parents) : work;
}

/** Stable order with every contour before its container (depth-first: a contour's unplaced children go first). */
function childrenFirst(work: Work[], parents: Int32Array): Work[] {
  const kids: number[][] = work.map(() => []);
  parents.forEach((p, i) => {
    if (p >= 0) kids[p].push(i);
  });
  const done = new Uint8Array(work.length);
  const out: Work[] = [];
  const visit = (i: number): void => {
    // Iterative, so a deep nesting cannot overflow the stack.
    const stack: [number, number][] = [[i, 0]];
    while (stack.length) {
      const top = stack[stack.length - 1];
      const [j, k] = top;
      if (k < kids[j].length) {
        top[1]++;
        if (!done[kids[j][k]]) stack.push([kids[j][k], 0]);
      } else {
        stack.pop();
        if (!done[j]) {
          done[j] = 1;
          out.push(work[j]);
        }
      }
    }
  };
  for (let i = 0; i < work.length; i++) if (!done[i]) visit(i);
  return out;
}

/** Where drawing a contour ends: the last vertex of an open one, the first of a closed one. */
function exitOf(c: { xy: Float64Array; closed: boolean }): [number, number] {
  const m = c.closed ? 2 : c.xy.length;
  return [c.xy[m - 2], c.xy[m - 1]];
}

/**
 * Pen-up travel of contours drawn in the given order, each from its first vertex (mm): from each contour's
 * exit to the next one's first vertex, and from `start` to the first when given.
 */
export function travelOf(contours: readonly { xy: Float64Array; closed: boolean }[], start: readonly [number, number] | null = null): number {
  let t = 0;
  let at: readonly [number, number] | null = start;
  for (const c of contours) {
    if (c.xy.length < 2) continue;
    if (at) t += Math.hypot(c.xy[0] - at[0], c.xy[1] - at[1]);
    at = exitOf(c);
  }
  return t;
}

function rotate(xy: Float64Array, v: number): Float64Array {
  if (v === 0) return xy;
  const out = new Float64Array(xy.length);
  out.set(xy.subarray(2 * v));
  out.set(xy.subarray(0, 2 * v), xy.length - 2 * v);
  return out;
}

function reversePairs(xy: Float64Array): Float64Array {
  const out = new Float64Array(xy.length);
  for (let i = 0, j = xy.length - 2; j >= 0; i += 2, j -= 2) {
    out[i] = xy[j];
    out[i + 1] = xy[j + 1];
  }
  return out;
}
