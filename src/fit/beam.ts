/**
 * Knot selection by beam search over the rotor spline.
 *
 * The spline is fixed by its start tangent and its knots: each next arc is the
 * rotor step through the next knot (the construction of a G1 arc spline that
 * crosses the curve at its knots; cf. Meek & Walton, "Approximating smooth planar
 * curves by arc splines", JCAM 59 (1995), and the minimum-arc formulation of
 * Maier, "Optimal arc spline approximation", CAGD 31 (2014)). We search, level by
 * level (one level per piece), over knots at input vertices and at projections
 * onto the current tangent (which is how straight runs start and end exactly).
 * At each level the candidates are ranked by how far their own next piece can
 * reach (a one-step look-ahead), and the best `width` are kept. The first level
 * that reaches the end gives the piece count.
 */
import { makePiece, type Piece } from './piece.js';
import { len2 } from './check.js';
import { biarcClosure, TANGENT_EPS } from './closure.js';


interface Node {
  a: number;
  qx: number;
  qy: number;
  bp: number;
  bq: number;
  br: number;
  tx: number;
  ty: number;
  t0x: number;
  t0y: number;
  level: number;
  parent: Node | null;
  /** The piece from the parent to here, and a second one when a biarc closed the contour. */
  piece: Piece | null;
  piece2: Piece | null;
  children: Node[] | null;
  reach: number;
  err: number;
}

export interface SearchResult {
  pieces: Piece[];
  /** False when the search could not reach the end; pieces then lead as far as it got. */
  complete: boolean;
}

/** Consecutive failed knots after which a piece is taken to have reached its limit. */
const MAX_FAILS = 3;
/** Candidates kept per knot vertex (different tangents). */
const PER_KNOT = 2;
/** Candidates expanded per level, as a multiple of the beam width (each is ranked by its own reach). */
const CANDIDATES = 2;

/** How a search must end. */
export type SearchEnd =
  /** At the last vertex, with any tangent (an open end or a corner). */
  | { kind: 'point' }
  /** At the last vertex (the seam, = the start) with the start tangent of its own seed. */
  | { kind: 'seam' }
  /**
   * Tangent to the straight run that follows: the line through (px, py) with unit
   * direction (dx, dy), touching it at a parameter in [tMin, tMax] (the run's extent).
   */
  | { kind: 'line'; px: number; py: number; dx: number; dy: number; tMin: number; tMax: number };

export interface SearchParams {
  pts: Float64Array;
  /** Index of the start vertex and the last vertex. */
  start: number;
  last: number;
  /** Start point (the start vertex, or a point within tol of it). */
  qx: number;
  qy: number;
  /** Start tangents to try (unit vectors). */
  seeds: number[][];
  end: SearchEnd;
  tol: number;
  width: number;
}

function seedNode(p: SearchParams, tx: number, ty: number): Node {
  // Seed motor 1 + n (n: the tangent turned by −90°); its bivector part is (−tx, −ty, 0).
  return {
    a: p.start, qx: p.qx, qy: p.qy, bp: -tx, bq: -ty, br: 0, tx, ty, t0x: tx, t0y: ty,
    level: 0, parent: null, piece: null, piece2: null, children: null, reach: p.start, err: 0,
  };
}

function childNode(parent: Node, piece: Piece, piece2: Piece | null, b: number, p: SearchParams): Node {
  const last = piece2 ?? piece;
  const pts = p.pts;
  const lo = Math.max(p.start, b - 1), hi = Math.min(p.last, b + 1);
  const ex = pts[2 * hi] - pts[2 * lo], ey = pts[2 * hi + 1] - pts[2 * lo + 1];
  const el = len2(ex, ey);
  const err = el > 0 ? Math.abs(last.tx * ey - last.ty * ex) / el : 0;
  return {
    a: b, qx: last.x1, qy: last.y1, bp: last.mp, bq: last.mq, br: last.mr, tx: last.tx, ty: last.ty,
    t0x: parent.t0x, t0y: parent.t0y, level: parent.level + (piece2 ? 2 : 1), parent, piece, piece2, children: null, reach: b, err,
  };
}

function expand(n: Node, p: SearchParams, onTerminal: (t: Node) => void): void {
  const { pts, last, tol } = p;
  const children: Node[] = [];
  let fails = 0, lineAlive = true;
  for (let b = n.a + 1; b <= last; b++) {
    const ex = pts[2 * b], ey = pts[2 * b + 1];
    let piece = makePiece(pts, n.a, b, n.bp, n.bq, n.br, n.qx, n.qy, ex, ey, tol);
    if (piece && b === last && p.end.kind !== 'point') {
      const dot = piece.tx * n.t0x + piece.ty * n.t0y, cr = piece.tx * n.t0y - piece.ty * n.t0x;
      if (!(dot > 0 && Math.abs(cr) <= TANGENT_EPS)) piece = null;
    }
    if (piece) {
      children.push(childNode(n, piece, null, b, p));
      fails = 0;
    } else if (++fails > MAX_FAILS && !lineAlive) {
      break;
    }
    if (lineAlive && b < last) {
      // A straight piece along the current tangent, ending at P_b's foot on it.
      const proj = (ex - n.qx) * n.tx + (ey - n.qy) * n.ty;
      const fx = n.qx + proj * n.tx, fy = n.qy + proj * n.ty;
      const off = len2(ex - fx, ey - fy);
      if (proj > 0 && off <= tol) {
        if (off > 0) {
          const lp = makePiece(pts, n.a, b, n.bp, n.bq, n.br, n.qx, n.qy, fx, fy, tol);
          if (lp && lp.kind === 'line') children.push(childNode(n, lp, null, b, p));
          else if (!lp) lineAlive = false;
        }
      } else if (proj > 0) {
        lineAlive = false;
      }
    }
    if (fails > MAX_FAILS && !lineAlive) break;
  }
  let reach = n.a;
  for (const c of children) if (c.a > reach) reach = c.a;
  n.children = children;
  n.reach = reach;
  // Closing moves (a biarc, or a fillet onto the next straight run) reach at most
  // about two pieces ahead: only try them near the end.
  if (p.end.kind !== 'point' && last - n.a <= 3 * (reach - n.a) + 4) closingMoves(n, p, onTerminal);
  if (p.end.kind !== 'line') for (const c of children) if (c.a === last) onTerminal(c);
}

/** Terminal moves for a seam or a following straight run. */
function closingMoves(n: Node, p: SearchParams, onTerminal: (t: Node) => void): void {
  const { pts, last, tol } = p;
  const end = p.end;
  if (end.kind === 'seam') {
    const pair = biarcClosure(pts, n.a, last, n.bp, n.bq, n.br, n.qx, n.qy, n.tx, n.ty, pts[2 * last], pts[2 * last + 1], n.t0x, n.t0y, tol);
    if (pair) onTerminal(childNode(n, pair[0], pair[1], last, p));
    return;
  }
  if (end.kind !== 'line') return;
  // The fillet: the arc continuing the node's tangent that touches the run's line.
  const { px, py, dx, dy } = end;
  const cr = n.tx * dy - n.ty * dx, dot = n.tx * dx + n.ty * dy;
  if (Math.abs(cr) > 1e-12 || dot < 0) {
    // Both turn directions can reach the line; the wrong one gives r ≤ 0 or misses the run.
    for (const sg of cr >= 0 ? [1, -1] : [-1, 1]) {
      // Unit normals towards the centre at the start (of T) and at the end (of D).
      const ux = -sg * n.ty + sg * dy, uy = sg * n.tx - sg * dx;
      const den = ux * dy - uy * dx;
      const r = den !== 0 ? ((px - n.qx) * dy - (py - n.qy) * dx) / den : NaN;
      if (!(r > 0) || !Number.isFinite(r)) continue;
      const ex = n.qx + r * ux, ey = n.qy + r * uy;
      const t = (ex - px) * dx + (ey - py) * dy;
      if (t < end.tMin || t > end.tMax) continue;
      // The run's first vertex is covered by the arc when the touch point lies beyond it.
      const tl = (pts[2 * last] - px) * dx + (pts[2 * last + 1] - py) * dy;
      const upTo = t >= tl ? last : last - 1;
      const piece = upTo >= n.a ? makePiece(pts, n.a, upTo, n.bp, n.bq, n.br, n.qx, n.qy, ex, ey, tol) : null;
      if (piece) {
        onTerminal(childNode(n, piece, null, last, p));
        break;
      }
    }
  } else {
    // Already running along the line: done if on it.
    const off = Math.abs((n.qx - px) * dy - (n.qy - py) * dx);
    if (off <= 1e-9 * tol) onTerminal({ ...n });
  }
  // Or a biarc onto the run's first vertex (projected onto the run) with the run's direction.
  const tl = (pts[2 * last] - px) * dx + (pts[2 * last + 1] - py) * dy;
  const fx = px + tl * dx, fy = py + tl * dy;
  const pair = biarcClosure(pts, n.a, last, n.bp, n.bq, n.br, n.qx, n.qy, n.tx, n.ty, fx, fy, dx, dy, tol);
  if (pair) onTerminal(childNode(n, pair[0], pair[1], last, p));
}

function collect(end: Node): Piece[] {
  const out: Piece[] = [];
  for (let n: Node | null = end; n; n = n.parent) {
    if (n.piece2) out.push(n.piece2);
    if (n.piece) out.push(n.piece);
  }
  return out.reverse();
}

/** Search the fewest pieces from the start to the last vertex. */
export function searchSpline(p: SearchParams): SearchResult {
  const seeds = p.seeds;
  let best: Node | null = null;
  let farthest: Node | null = null;
  const onTerminal = (t: Node): void => {
    if (!best || t.level < best.level) best = t;
  };
  let frontier: Node[] = seeds.map((t) => seedNode(p, t[0], t[1]));
  for (const n of frontier) expand(n, p, onTerminal);
  while (frontier.length > 0) {
    const level = frontier[0].level;
    if (best && (best as Node).level <= level + 1) break;
    // The children of this level, farthest knot first, best tangent first within a knot.
    const all: Node[] = [];
    for (const n of frontier) {
      for (const c of n.children ?? []) {
        if (c.a === p.last || c.level !== level + 1) continue;
        if (!farthest || c.a > farthest.a) farthest = c;
        all.push(c);
      }
    }
    // Unkept children must die young: drop the expanded lists of this level.
    for (const n of frontier) n.children = null;
    all.sort((u, v) => v.a - u.a || u.err - v.err);
    // At most PER_KNOT per knot vertex, and the first CANDIDATES × width of those.
    const limit = Math.ceil(CANDIDATES * p.width);
    const cand: Node[] = [];
    for (let i = 0, run = 0; i < all.length && cand.length < limit; i++) {
      run = i > 0 && all[i].a === all[i - 1].a ? run + 1 : 0;
      if (run < PER_KNOT) cand.push(all[i]);
    }
    for (const c of cand) expand(c, p, onTerminal);
    cand.sort((u, v) => v.reach - u.reach || v.a - u.a || u.err - v.err);
    frontier = cand.slice(0, p.width);
  }
  if (best) return { pieces: collect(best), complete: true };
  return { pieces: farthest ? collect(farthest) : [], complete: false };
}
