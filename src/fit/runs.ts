/**
 * Straight runs: edges of the thinned polyline that stand for input that is
 * straight to within a small fraction of the tolerance (CAD and mesh exports,
 * the straight sides of text and parts). They become single lines, and the
 * curved stretches between them are fitted to meet them tangentially, so a
 * rounded rectangle comes back as four lines and four arcs.
 */

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

/** Shortest run, in tolerances. */
const RUN_MIN_LENGTH = 4;
/** Input vertices of a run lie this close to its line, as a fraction of the tolerance. */
const RUN_STRAIGHTNESS = 0.02;

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
    // The run's line: through its first and last interior input vertex when they span most of it
    // (its end vertices may already lie on the bends), else the chord.
    const count = (i1 - i0 + m) % m;
    let px = ax, py = ay, dx = (bx - ax) / len, dy = (by - ay) / len;
    if (count >= 3) {
      const fi = (i0 + 1) % m, li = (i0 + count - 1) % m;
      const fx = clean[2 * fi], fy = clean[2 * fi + 1], lx = clean[2 * li], ly = clean[2 * li + 1];
      const l = Math.hypot(lx - fx, ly - fy);
      if (l >= 0.5 * len) {
        px = fx;
        py = fy;
        dx = (lx - fx) / l;
        dy = (ly - fy) / l;
      }
    }
    // Every interior input vertex (walking round the wrap of a closed contour) lies on that line.
    let straight = true;
    for (let s = 1; s < count && straight; s++) {
      const k = (i0 + s) % m;
      if (Math.abs((clean[2 * k] - px) * dy - (clean[2 * k + 1] - py) * dx) > RUN_STRAIGHTNESS * tol) straight = false;
    }
    if (!straight) continue;
    // The straight part ends at the end vertex if that lies on the line, else at the last interior vertex.
    const onLine = (k: number): boolean => Math.abs((clean[2 * k] - px) * dy - (clean[2 * k + 1] - py) * dx) <= RUN_STRAIGHTNESS * tol;
    const endK = onLine(i1) || count < 2 ? i1 : (i0 + count - 1) % m;
    const tEnd = (clean[2 * endK] - px) * dx + (clean[2 * endK + 1] - py) * dy;
    runs.push({ j, px, py, dx, dy, tEnd });
  }
  return runs;
}
