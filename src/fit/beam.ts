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
import {
  LINE_PIECE, makePiece, NO_PIECE, PIECE_FIELDS, PIECE_TX, PIECE_TY, pieceFrom, STEP_ARGS, STEP_BP, STEP_BQ, STEP_BR, STEP_EX, STEP_EY, STEP_QX, STEP_QY, STEP_TOL,
  tryPiece, type Piece,
} from './piece.js';
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
  /** Its children short of the last vertex: records [c0, c1) of the child store, once expanded. */
  c0: number;
  c1: number;
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

/**
 * How a search must end: `point`, at the last vertex with any tangent (an open
 * end or a corner); `seam`, at the last vertex (the seam, = the start) with the
 * start tangent of its own seed; `line`, tangent to the straight run that
 * follows, the line through (px, py) with unit direction (dx, dy), touching it
 * at a parameter in [tMin, tMax] (the run's extent). One shape for all three
 * (the line's fields are 0 for the others), so the search's code sees one kind
 * of object.
 */
export interface SearchEnd {
  kind: 'point' | 'seam' | 'line';
  px: number;
  py: number;
  dx: number;
  dy: number;
  tMin: number;
  tMax: number;
}

/** A search end at the last vertex: `point` (any tangent) or `seam` (the start tangent). */
export function endAt(kind: 'point' | 'seam'): SearchEnd {
  return { kind, px: 0, py: 0, dx: 0, dy: 0, tMin: 0, tMax: 0 };
}

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

/**
 * The children of one level, as flat records rather than objects: most fitting
 * knots are never kept, and making a node and a piece for each was most of the
 * fitter's allocation. A record is a piece record (./piece.ts) followed by the
 * knot, the piece kind, the tangent error at the knot and the parent's number.
 */
const C_B = PIECE_FIELDS, C_KIND = PIECE_FIELDS + 1, C_ERR = PIECE_FIELDS + 2, C_PARENT = PIECE_FIELDS + 3;
const CHILD_FIELDS = PIECE_FIELDS + 4;

class ChildStore {
  rec = new Float64Array(CHILD_FIELDS * 256);
  count = 0;

  /** Offset of a new record (growing the store when full). */
  reserve(): number {
    if ((this.count + 1) * CHILD_FIELDS > this.rec.length) {
      const bigger = new Float64Array(this.rec.length * 2);
      bigger.set(this.rec);
      this.rec = bigger;
    }
    return this.count * CHILD_FIELDS;
  }
}

/** One store and one argument block per thread: the search never runs inside itself. */
const store = new ChildStore();
const stepArgs = new Float64Array(STEP_ARGS);

function seedNode(p: SearchParams, tx: number, ty: number): Node {
  // Seed motor 1 + n (n: the tangent turned by −90°); its bivector part is (−tx, −ty, 0).
  return {
    a: p.start, qx: p.qx, qy: p.qy, bp: -tx, bq: -ty, br: 0, tx, ty, t0x: tx, t0y: ty,
    level: 0, parent: null, piece: null, piece2: null, c0: 0, c1: 0, reach: p.start, err: 0,
  };
}

/** How far the last piece's tangent at knot b turns from the vertex path's direction there (sine). */
function tangentError(pts: Float64Array, b: number, tx: number, ty: number, p: SearchParams): number {
  const lo = Math.max(p.start, b - 1), hi = Math.min(p.last, b + 1);
  const ex = pts[2 * hi] - pts[2 * lo], ey = pts[2 * hi + 1] - pts[2 * lo + 1];
  const el = len2(ex, ey);
  return el > 0 ? Math.abs(tx * ey - ty * ex) / el : 0;
}

function childNode(parent: Node, piece: Piece, piece2: Piece | null, b: number, p: SearchParams): Node {
  const last = piece2 ?? piece;
  return {
    a: b, qx: last.x1, qy: last.y1, bp: last.mp, bq: last.mq, br: last.mr, tx: last.tx, ty: last.ty,
    t0x: parent.t0x, t0y: parent.t0y, level: parent.level + (piece2 ? 2 : 1), parent, piece, piece2, c0: 0, c1: 0,
    reach: b, err: tangentError(p.pts, b, last.tx, last.ty, p),
  };
}

/** The node of child record `o` of the store, under `parent`. */
function storedNode(o: number, parent: Node, p: SearchParams): Node {
  const rec = store.rec;
  const b = rec[o + C_B];
  return childNode(parent, pieceFrom(rec, o, rec[o + C_KIND], parent.a, b, parent.qx, parent.qy), null, b, p);
}

/**
 * Try every knot after `n` as the end of its next piece; the ones that fit
 * short of the last vertex become records of the store (tagged `parentNo`),
 * one that reaches the last vertex is offered as a terminal.
 */
function expand(n: Node, parentNo: number, p: SearchParams, onTerminal: (t: Node) => void): void {
  const { pts, last, tol } = p;
  let fails = 0, lineAlive = true, reach = n.a;
  let terminal: Node | null = null;
  n.c0 = store.count;
  const g = stepArgs;
  g[STEP_BP] = n.bp;
  g[STEP_BQ] = n.bq;
  g[STEP_BR] = n.br;
  g[STEP_QX] = n.qx;
  g[STEP_QY] = n.qy;
  g[STEP_TOL] = tol;
  for (let b = n.a + 1; b <= last; b++) {
    const ex = pts[2 * b], ey = pts[2 * b + 1];
    const o = store.reserve();
    const rec = store.rec;
    g[STEP_EX] = ex;
    g[STEP_EY] = ey;
    let kind = tryPiece(rec, o, pts, n.a, b, g);
    if (kind !== NO_PIECE && b === last && p.end.kind !== 'point') {
      const tx = rec[o + PIECE_TX], ty = rec[o + PIECE_TY];
      const dot = tx * n.t0x + ty * n.t0y, cr = tx * n.t0y - ty * n.t0x;
      if (!(dot > 0 && Math.abs(cr) <= TANGENT_EPS)) kind = NO_PIECE;
    }
    if (kind !== NO_PIECE) {
      reach = b;
      if (b === last) {
        if (p.end.kind !== 'line') terminal = childNode(n, pieceFrom(rec, o, kind, n.a, b, n.qx, n.qy), null, b, p);
      } else {
        pushChild(o, b, kind, parentNo, p);
      }
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
          const lo = store.reserve();
          g[STEP_EX] = fx;
          g[STEP_EY] = fy;
          const lk = tryPiece(store.rec, lo, pts, n.a, b, g);
          if (lk === LINE_PIECE) {
            reach = b;
            pushChild(lo, b, lk, parentNo, p);
          } else if (lk === NO_PIECE) {
            lineAlive = false;
          }
        }
      } else if (proj > 0) {
        lineAlive = false;
      }
    }
    if (fails > MAX_FAILS && !lineAlive) break;
  }
  n.c1 = store.count;
  n.reach = reach;
  // Closing moves (a biarc, or a fillet onto the next straight run) reach at most
  // about two pieces ahead: only try them near the end.
  if (p.end.kind !== 'point' && last - n.a <= 3 * (reach - n.a) + 4) closingMoves(n, p, onTerminal);
  if (terminal) onTerminal(terminal);
}

/** Keep the piece record at `o` (just reserved) as a child at knot b. */
function pushChild(o: number, b: number, kind: number, parentNo: number, p: SearchParams): void {
  const rec = store.rec;
  rec[o + C_B] = b;
  rec[o + C_KIND] = kind;
  rec[o + C_ERR] = tangentError(p.pts, b, rec[o + PIECE_TX], rec[o + PIECE_TY], p);
  rec[o + C_PARENT] = parentNo;
  store.count++;
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
      const piece = t >= tl ? makePiece(pts, n.a, last, n.bp, n.bq, n.br, n.qx, n.qy, ex, ey, tol) : filletShort(n, pts, last, ex, ey, tol);
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

/**
 * A fillet from node n touching the run's line at (ex, ey) before the run's
 * first vertex P_last. It stands for vertices a..last−1 and for the edge
 * P_{last−1}→P_last up to F, the point of that edge nearest the touch point
 * (the run's line takes the edge on from there): so it is checked against
 * P_a … P_{last−1}, F, with F within tol of the touch point. Checking it
 * against P_{last−1} alone let a fillet cut the corner of that edge.
 */
function filletShort(n: Node, pts: Float64Array, last: number, ex: number, ey: number, tol: number): Piece | null {
  if (last - 1 < n.a) return null;
  const ax = pts[2 * last - 2], ay = pts[2 * last - 1], bx = pts[2 * last], by = pts[2 * last + 1];
  const dx = bx - ax, dy = by - ay, l2 = dx * dx + dy * dy;
  const u = l2 > 0 ? Math.min(1, Math.max(0, ((ex - ax) * dx + (ey - ay) * dy) / l2)) : 0;
  const fx = ax + u * dx, fy = ay + u * dy;
  if (len2(ex - fx, ey - fy) > tol) return null;
  const m = last - n.a;
  const sub = new Float64Array(2 * m + 2);
  sub.set(pts.subarray(2 * n.a, 2 * last));
  sub[2 * m] = fx;
  sub[2 * m + 1] = fy;
  const piece = makePiece(sub, 0, m, n.bp, n.bq, n.br, n.qx, n.qy, ex, ey, tol);
  if (!piece) return null;
  piece.a = n.a;
  piece.b = last - 1;
  return piece;
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
  let best: Node | null = null;
  let farthest: Node | null = null;
  const onTerminal = (t: Node): void => {
    if (!best || t.level < best.level) best = t;
  };
  store.count = 0;
  // Arrays built by push only: one kind of array throughout (map makes another, and its readers deoptimize).
  let frontier: Node[] = [];
  for (const t of p.seeds) frontier.push(seedNode(p, t[0], t[1]));
  for (let i = 0; i < frontier.length; i++) expand(frontier[i], i, p, onTerminal);
  let expanded = frontier;
  const order: number[] = [];
  while (frontier.length > 0) {
    const level = frontier[0].level;
    if (best && (best as Node).level <= level + 1) break;
    // The children of this level, farthest knot first, best tangent first within a knot.
    order.length = 0;
    let far = -1;
    for (const n of frontier) {
      for (let i = n.c0; i < n.c1; i++) {
        const o = i * CHILD_FIELDS;
        if (far < 0 || store.rec[o + C_B] > store.rec[far + C_B]) far = o;
        order.push(o);
      }
    }
    const rec = store.rec;
    if (far >= 0 && (!farthest || rec[far + C_B] > farthest.a)) farthest = storedNode(far, expanded[rec[far + C_PARENT]], p);
    order.sort((u, v) => rec[v + C_B] - rec[u + C_B] || rec[u + C_ERR] - rec[v + C_ERR]);
    // At most PER_KNOT per knot vertex, and the first CANDIDATES × width of those.
    const limit = Math.ceil(CANDIDATES * p.width);
    const cand: Node[] = [];
    for (let i = 0, run = 0; i < order.length && cand.length < limit; i++) {
      run = i > 0 && rec[order[i] + C_B] === rec[order[i - 1] + C_B] ? run + 1 : 0;
      if (run < PER_KNOT) cand.push(storedNode(order[i], expanded[rec[order[i] + C_PARENT]], p));
    }
    // The unkept children are forgotten: the store is refilled by the candidates' children.
    store.count = 0;
    for (let i = 0; i < cand.length; i++) expand(cand[i], i, p, onTerminal);
    // Records name their parents by number in `cand`; rank a copy.
    expanded = cand;
    frontier = cand.slice().sort((u, v) => v.reach - u.reach || v.a - u.a || u.err - v.err).slice(0, p.width);
  }
  if (best) return { pieces: collect(best), complete: true };
  return { pieces: farthest ? collect(farthest) : [], complete: false };
}
