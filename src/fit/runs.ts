/**
 * Straight runs: edges of the thinned polyline that stand for input that is
 * straight to within a small fraction of the tolerance (CAD and mesh exports,
 * the straight sides of text and parts). They become single lines, and the
 * curved stretches between them are fitted to meet them tangentially, so a
 * rounded rectangle comes back as four lines and four arcs.
 */
import { RUN_END_SLACK_SHARE, RUN_MIN_LENGTH_TOLERANCES, RUN_STRAIGHTNESS_SHARE } from '../budget.js';

/** A straight run on the thinned edge j → j+1: the line through (px, py) with unit direction (dx, dy). */
export interface Run {
  j: number;
  px: number;
  py: number;
  dx: number;
  dy: number;
  /** Where the straight part ends, as a parameter along (dx, dy) from (px, py). */
  tEnd: number;
}

/** Shortest run, in tolerances; how straight a run's input vertices lie, as a fraction of the tolerance (src/budget.ts). */
const RUN_MIN_LENGTH = RUN_MIN_LENGTH_TOLERANCES;
const RUN_STRAIGHTNESS = RUN_STRAIGHTNESS_SHARE;
/** How far a run's outer quarters may stray from its line, as a fraction of the tolerance (src/budget.ts). */
const RUN_END_SLACK = RUN_END_SLACK_SHARE;

/** Interior input vertices needed to call a run of several input edges straight. */
const RUN_MIN_VERTICES = 8;
/** How much longer than each neighbouring thinned edge a run must be. */
const RUN_CONTRAST = 3;

function edgeLength(clean: Float64Array, coarse: number[], j: number): number {
  const mc = coarse.length;
  const i0 = coarse[((j % mc) + mc) % mc], i1 = coarse[(((j + 1) % mc) + mc) % mc];
  return Math.hypot(clean[2 * i1] - clean[2 * i0], clean[2 * i1 + 1] - clean[2 * i0 + 1]);
}

function longerThanNeighbours(clean: Float64Array, coarse: number[], j: number, closed: boolean, len: number): boolean {
  const mc = coarse.length;
  if (closed || j > 0) {
    if (len < RUN_CONTRAST * edgeLength(clean, coarse, j - 1)) return false;
  }
  if (closed || j + 2 < mc) {
    if (len < RUN_CONTRAST * edgeLength(clean, coarse, j + 1)) return false;
  }
  return true;
}

/**
 * Find the straight runs among the thinned edges.
 * @param clean the distinct input vertices (flat), m of them
 * @param coarse indices into clean of the thinned vertices, ascending
 * @param closed whether the last thinned vertex joins back to the first
 */
export function findRuns(clean: Float64Array, m: number, coarse: number[], closed: boolean, tol: number): Run[] {
  const mc = coarse.length;
  const runs: Run[] = [];
  const edges = closed ? mc : mc - 1;
  for (let j = 0; j < edges; j++) {
    const i0 = coarse[j], i1 = coarse[(j + 1) % mc];
    const ax = clean[2 * i0], ay = clean[2 * i0 + 1], bx = clean[2 * i1], by = clean[2 * i1 + 1];
    const len = Math.hypot(bx - ax, by - ay);
    if (!(len >= RUN_MIN_LENGTH * tol)) continue;
    // Much longer than the edges beside it: a chord of a curve is about as long as its neighbours.
    if (!longerThanNeighbours(clean, coarse, j, closed, len)) continue;
    // A run is one input edge, or enough input vertices to show it is straight (a few can line up by chance in a noisy trace).
    const count = (i1 - i0 + m) % m;
    if (count > 1 && count < RUN_MIN_VERTICES + 1) continue;
    const at = (s: number): number => (i0 + s) % m;
    // The run's line through two vertices a quarter in from either end (its ends may already lie on the bends).
    let px = ax, py = ay, dx = (bx - ax) / len, dy = (by - ay) / len;
    if (count > 1) {
      const f = at(Math.round(count / 4)), l = at(Math.round((3 * count) / 4));
      const fx = clean[2 * f], fy = clean[2 * f + 1];
      const ll = Math.hypot(clean[2 * l] - fx, clean[2 * l + 1] - fy);
      px = fx;
      py = fy;
      dx = (clean[2 * l] - fx) / ll;
      dy = (clean[2 * l + 1] - fy) / ll;
    }
    const off = (k: number): number => Math.abs((clean[2 * k] - px) * dy - (clean[2 * k + 1] - py) * dx);
    // Every interior input vertex of the middle half (walking round the wrap of a closed contour) lies on
    // that line; towards the ends the thinned edge may reach a little way into the bends (up to the
    // thinning's own bound), where the straight part ends (found below).
    let straight = true, noise = 0;
    for (let s = 1; s < count && straight; s++) {
      const d = off(at(s));
      const middle = s >= count / 4 && s <= (3 * count) / 4;
      if (d > (middle ? RUN_STRAIGHTNESS : RUN_END_SLACK) * tol) straight = false;
      if (middle && d > noise) noise = d;
    }
    if (!straight) continue;
    // The straight part ends where the input leaves the line by more than its own noise: walk out from the middle.
    const limit = Math.min(RUN_STRAIGHTNESS * tol, Math.max(4 * noise, 1e-9 * tol));
    let endS = Math.round((3 * count) / 4);
    while (endS < count && off(at(endS + 1)) <= limit) endS++;
    const endK = count > 1 ? at(endS) : i1;
    const tEnd = (clean[2 * endK] - px) * dx + (clean[2 * endK + 1] - py) * dy;
    runs.push({ j, px, py, dx, dy, tEnd });
  }
  return runs;
}
