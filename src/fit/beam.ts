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
import { biarcClosure, TANGENT_EPS } from './closure.js';
import { openSeeds, seamSeeds } from './seeds.js';

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

export interface SearchParams {
  pts: Float64Array;
  /** Index of the start vertex and the last vertex. */
  start: number;
  last: number;
  /** Start point (the start vertex, or a point within tol of it). */
  qx: number;
  qy: number;
  /** pts[last] is pts[start] again and the spline must close with the seam's tangent. */
  closed: boolean;
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

function childNode(parent: Node, piece: Piece, piece2: Piece | null, b: number, p: SearchParams, next = b): Node {
  const last = piece2 ?? piece;
  const pts = p.pts;
  const lo = Math.max(p.start, b - 1), hi = Math.min(p.last, b + 1);
  const ex = pts[2 * hi] - pts[2 * lo], ey = pts[2 * hi + 1] - pts[2 * lo + 1];
  const el = Math.hypot(ex, ey);
  const err = el > 0 ? Math.abs(last.tx * ey - last.ty * ex) / el : 0;
  return {
    a: next, qx: last.x1, qy: last.y1, bp: last.mp, bq: last.mq, br: last.mr, tx: last.tx, ty: last.ty,
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
    if (piece && p.closed && b === last) {
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
      const off = Math.hypot(ex - fx, ey - fy);
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
    if (b + 1 < last) fillet(n, b, p, children);
    if (fails > MAX_FAILS && !lineAlive) break;
  }
  let reach = n.a;
  for (const c of children) if (c.a > reach) reach = c.a;
  n.children = children;
  n.reach = reach;
  // A biarc closes at most about two pieces' reach: only try it near the end.
  if (p.closed && last - n.a <= 3 * (reach - n.a) + 4) {
    const pair = biarcClosure(pts, n.a, last, n.bp, n.bq, n.br, n.qx, n.qy, n.tx, n.ty, n.t0x, n.t0y, tol);
    if (pair) onTerminal(childNode(n, pair[0], pair[1], last, p));
  }
  for (const c of children) if (c.a === last) onTerminal(c);
}

/** Edges at least this many tolerances long are straight runs worth meeting exactly. */
const LONG_EDGE = 8;

/**
 * The arc from the node's knot, continuing its tangent, that ends exactly
 * tangent to the long edge b → b+1 and on it (a fillet), so that the straight
 * run after it can be one line. The child stands for vertices up to b; the next
 * piece starts on the edge.
 */
function fillet(n: Node, b: number, p: SearchParams, children: Node[]): void {
  const pts = p.pts;
  const bx = pts[2 * b], by = pts[2 * b + 1];
  let dx = pts[2 * b + 2] - bx, dy = pts[2 * b + 3] - by;
  const len = Math.hypot(dx, dy);
  if (!(len >= LONG_EDGE * p.tol)) return;
  dx /= len;
  dy /= len;
  const cr = n.tx * dy - n.ty * dx;
  if (Math.abs(cr) < 1e-9) return; // parallel: a line child covers it
  const sg = cr > 0 ? 1 : -1;
  // Unit normals towards the centre at the start (of T) and at the end (of D).
  const nx = -sg * n.ty, ny = sg * n.tx, mx = -sg * dy, my = sg * dx;
  const ux = nx - mx, uy = ny - my;
  const den = ux * dy - uy * dx;
  if (den === 0) return;
  const r = ((bx - n.qx) * dy - (by - n.qy) * dx) / den;
  if (!(r > 0) || !Number.isFinite(r)) return;
  const ex = n.qx + r * ux, ey = n.qy + r * uy;
  const t = (ex - bx) * dx + (ey - by) * dy;
  if (t < 0 || t >= len) return;
  const piece = makePiece(pts, n.a, b, n.bp, n.bq, n.br, n.qx, n.qy, ex, ey, p.tol);
  if (piece) children.push(childNode(n, piece, null, b, p, b + 1));
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
  const seeds = p.closed ? seamSeeds(p.pts, p.last) : openSeeds(p.pts, p.start, p.last, p.qx, p.qy);
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
    const byKnot = new Map<number, Node[]>();
    for (const n of frontier) {
      for (const c of n.children ?? []) {
        if (c.a === p.last || c.level !== level + 1) continue;
        if (!farthest || c.a > farthest.a) farthest = c;
        const list = byKnot.get(c.a);
        if (!list) byKnot.set(c.a, [c]);
        else {
          list.push(c);
          if (list.length > PER_KNOT) {
            list.sort((u, v) => u.err - v.err);
            list.length = PER_KNOT;
          }
        }
      }
    }
    // Unkept children must die young: drop the expanded lists of this level.
    for (const n of frontier) n.children = null;
    let cand: Node[] = [];
    for (const list of byKnot.values()) for (const c of list) cand.push(c);
    cand.sort((u, v) => v.a - u.a || u.err - v.err);
    if (cand.length > 2 * p.width) cand = cand.slice(0, 2 * p.width);
    for (const c of cand) expand(c, p, onTerminal);
    cand.sort((u, v) => v.reach - u.reach || v.a - u.a || u.err - v.err);
    frontier = cand.slice(0, p.width);
  }
  if (best) return { pieces: collect(best), complete: true };
  return { pieces: farthest ? collect(farthest) : [], complete: false };
}
