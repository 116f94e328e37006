/**
 * Flatten parsed path data through a matrix into contours (polylines in mm)
 * with a proven maximum deviation.
 *
 * Guarantee: for every segment, every point of the true curve after the
 * matrix is within `maxError` of the polyline piece that stands for it, and
 * every polyline point is within `maxError` of the curve (each bound pairs
 * points at the same parameter, so it holds both ways).
 * - Lines are copied as vertices (error 0).
 * - Cubic / quadratic Béziers: control points mapped first (affine maps
 *   commute with Bézier evaluation), quadratics degree-elevated to cubics,
 *   then n uniform steps from the second-difference bound in ./bezier.ts.
 * - Elliptical arcs: centre form in user units (./arcCenter.ts, with the
 *   F.6.2 / F.6.6 rules), mapped as P(θ) = M·c + E·(cosθ, sinθ) with
 *   E = L·R(φ)·diag(rx, ry) (REFERENCES.md §5.2). A chord spanning parameter
 *   δ deviates by at most σ1·(1 − cos(δ/2)): on the pre-image unit circle an
 *   arc point and the chord point with the same tangential coordinate differ
 *   by (1 − cos(δ/2)) along one direction, which E stretches by at most σ1
 *   (the sagitta, REFERENCES.md §6, on the largest semi-axis). Valid for δ ≤ π;
 *   we also cap δ at π/2.
 *
 * The bounds are exact-arithmetic statements; evaluating the vertices in
 * doubles adds rounding of order 1e-16 × the coordinate size on top.
 *
 * Topology: consecutive exactly equal vertices are dropped; OP_Z closes the
 * contour (the first vertex is not repeated); a subpath with fewer than two
 * distinct vertices yields nothing (an M alone, or only zero-length pieces).
 * `corners` lists the joins of two source segments whose tangents differ by
 * more than 1°, unless both are straight (line–line joins are the fitter's to
 * judge); the start and end of an open contour are never listed. They are
 * candidates: the fitter keeps one as a corner unless it sits among joins of
 * pieces shorter than its tolerance's scale and turns less than its corner
 * angle there (src/fit/fitPolyline.ts).
 */
import type { PathData } from '../svg/pathTypes.js';
import { OP_A, OP_C, OP_L, OP_M, OP_Q, OP_Z } from '../svg/pathTypes.js';
import type { Matrix } from '../svg/matrixTypes.js';
import type { Contour } from './contour.js';
import { ARC_CENTER_LENGTH, ARC_ELLIPSE, ARC_LINE, ARC_OMITTED, arcToCenterInto } from './arcCenter.js';
import { cubicFlatness, stepsForFlatness, MAX_CURVE_STEPS } from './bezier.js';
import { maxSemiAxis } from './ellipseImage.js';

/** Optional record of what flattening proved, filled by {@link flattenPath}. */
export interface FlattenStats {
  /** Per returned contour (same order), the largest deviation bound of any of its pieces, mm (0 for straight lines only). */
  bounds: number[];
}

/** Joins whose tangents turn by more than this are listed in `corners`. */
export const CORNER_DEG = 1;
const COS_CORNER = Math.cos((CORNER_DEG * Math.PI) / 180);
/** Largest parameter step on an arc, radians (at least 4 chords per full turn). */
const MAX_ARC_STEP = Math.PI / 2;

const NONE = 0, STRAIGHT = 1, CURVED = 2;

/**
 * Largest vertex coordinate accepted, as a multiple of maxError (2^40). A
 * vertex is evaluated with a few roundings of 2^-53 × its size; at 2^40 ×
 * maxError that is about maxError / 2000, so the proven bound still holds to
 * within 0.05 %. Larger (or non-finite) coordinates are refused: past that,
 * the differences the fitter and the report take can lose all precision or
 * overflow (1e308 - -1e308 = Infinity).
 */
export const COORD_LIMIT_FACTOR = 2 ** 40;
/**
 * The contour being built: its vertices and corners, the join state and the
 * achieved bound. Every helper takes it as an explicit argument, so nothing
 * passes through module state; its growing buffers are reused by the next
 * call (each contour is copied out with slice()).
 */
class Build {
  /** The current call's coordinate limit, mm (set by flattenPath). */
  limit = Infinity;
  xy = new Float64Array(4096);
  /** Doubles used in xy. */
  len = 0;
  cornerBuf = new Uint32Array(256);
  nCorners = 0;
  /** End tangent of the last non-degenerate piece. */
  prevKind = NONE; ptx = 0; pty = 0;
  /** Start tangent of the first piece. */
  firstKind = NONE; ftx = 0; fty = 0;
  bound = 0;
  /** Centre form of the current arc (arcToCenterInto's out-parameter). */
  readonly arc = new Float64Array(ARC_CENTER_LENGTH);
}
/** A finished call's Build, lent to the next one (single-threaded; a call that throws just drops it). */
let spare: Build | null = null;

function push(b: Build, x: number, y: number): void {
  // Written so that NaN fails too.
  if (!(Math.abs(x) <= b.limit && Math.abs(y) <= b.limit)) {
    throw new RangeError(`a point maps to (${x}, ${y}) mm, beyond ±${b.limit.toPrecision(3)} mm, where double precision cannot keep the tolerance`);
  }
  if (b.len > 0 && b.xy[b.len - 2] === x && b.xy[b.len - 1] === y) return;
  if (b.len + 2 > b.xy.length) {
    const next = new Float64Array(b.xy.length * 2);
    next.set(b.xy);
    b.xy = next;
  }
  b.xy[b.len] = x;
  b.xy[b.len + 1] = y;
  b.len += 2;
}

function markCorner(b: Build, index: number): void {
  if (b.nCorners === b.cornerBuf.length) {
    const next = new Uint32Array(b.cornerBuf.length * 2);
    next.set(b.cornerBuf);
    b.cornerBuf = next;
  }
  b.cornerBuf[b.nCorners++] = index;
}

/** True when the turn from tangent a to tangent b exceeds CORNER_DEG (a zero tangent never marks). */
function isBreak(ax: number, ay: number, bx: number, by: number): boolean {
  return ax * bx + ay * by < COS_CORNER * Math.hypot(ax, ay) * Math.hypot(bx, by);
}

/** Record the join at the current last vertex before a piece of `kind` with start tangent (tx, ty) adds vertices. */
function join(b: Build, kind: number, tx: number, ty: number): void {
  if (b.prevKind === NONE) {
    b.firstKind = kind;
    b.ftx = tx;
    b.fty = ty;
  } else if ((b.prevKind === CURVED || kind === CURVED) && isBreak(b.ptx, b.pty, tx, ty)) {
    markCorner(b, b.len / 2 - 1);
  }
}

function begin(b: Build, x: number, y: number): void {
  b.len = 0;
  b.nCorners = 0;
  b.prevKind = NONE;
  b.firstKind = NONE;
  b.bound = 0;
  push(b, x, y);
}

function finish(b: Build, out: Contour[], closed: boolean, stats: FlattenStats | undefined): void {
  let corner0 = false;
  if (closed && b.len >= 4) {
    const fx = b.xy[0], fy = b.xy[1];
    const lx = b.xy[b.len - 2], ly = b.xy[b.len - 1];
    if (lx === fx && ly === fy) {
      b.len -= 2;
    } else {
      // The closing line is a piece of its own: join at the last vertex.
      const tx = fx - lx, ty = fy - ly;
      join(b, STRAIGHT, tx, ty);
      b.prevKind = STRAIGHT;
      b.ptx = tx;
      b.pty = ty;
    }
    corner0 = (b.prevKind === CURVED || b.firstKind === CURVED) && isBreak(b.ptx, b.pty, b.ftx, b.fty);
  }
  if (b.len >= 4) {
    const corners = new Uint32Array(b.nCorners + (corner0 ? 1 : 0));
    // Vertex 0 comes first to keep the list ascending.
    if (corner0) corners[0] = 0;
    corners.set(b.cornerBuf.subarray(0, b.nCorners), corner0 ? 1 : 0);
    out.push({ xy: b.xy.slice(0, b.len), closed, corners });
    if (stats) stats.bounds.push(b.bound);
  }
  b.len = 0;
}

/**
 * Flatten path data into contours in millimetres with a proven deviation bound.
 *
 * @param p parsed path data (absolute, user units; see ../svg/pathTypes.ts)
 * @param toMm user units → mm matrix [a b c d e f] (any affine map, mirrors and singular maps included)
 * @param maxError largest allowed distance between the mapped curve and the polyline, mm, > 0
 * @param stats optional; receives the bound actually achieved per contour
 * @returns one contour per subpath that has at least two distinct vertices
 * @throws RangeError for a non-positive maxError, an unknown opcode, a curve that would need more than MAX_CURVE_STEPS vertices,
 *   or a vertex that is not finite or lies farther than COORD_LIMIT_FACTOR × maxError from the origin
 */
export function flattenPath(p: PathData, toMm: Matrix, maxError: number, stats?: FlattenStats): Contour[] {
  if (!(maxError > 0) || !Number.isFinite(maxError)) {
    throw new RangeError(`maxError must be a positive number of mm, got ${maxError}`);
  }
  const b = spare ?? new Build();
  spare = null;
  b.limit = maxError * COORD_LIMIT_FACTOR;
  const ma = toMm[0], mb = toMm[1], mc = toMm[2], md = toMm[3], me = toMm[4], mf = toMm[5];
  const ops = p.ops, args = p.args;
  const out: Contour[] = [];
  // Current and subpath-start points, in user units (u*) and mm (q*).
  let ux = 0, uy = 0, sx = 0, sy = 0;
  let qx = me, qy = mf, sqx = me, sqy = mf;
  let k = 0;
  begin(b, qx, qy);
  for (let i = 0; i < ops.length; i++) {
    const op = ops[i];
    if (op === OP_L) {
      const x = args[k], y = args[k + 1];
      k += 2;
      const nx = ma * x + mc * y + me, ny = mb * x + md * y + mf;
      ux = x;
      uy = y;
      const tx = nx - qx, ty = ny - qy;
      if (tx === 0 && ty === 0) continue;
      if (b.prevKind === CURVED || b.prevKind === NONE) join(b, STRAIGHT, tx, ty);
      push(b, nx, ny);
      b.prevKind = STRAIGHT;
      b.ptx = tx;
      b.pty = ty;
      qx = nx;
      qy = ny;
    } else if (op === OP_M) {
      finish(b, out, false, stats);
      ux = sx = args[k];
      uy = sy = args[k + 1];
      k += 2;
      qx = sqx = ma * ux + mc * uy + me;
      qy = sqy = mb * ux + md * uy + mf;
      begin(b, qx, qy);
    } else if (op === OP_C) {
      const x1 = ma * args[k] + mc * args[k + 1] + me, y1 = mb * args[k] + md * args[k + 1] + mf;
      const x2 = ma * args[k + 2] + mc * args[k + 3] + me, y2 = mb * args[k + 2] + md * args[k + 3] + mf;
      ux = args[k + 4];
      uy = args[k + 5];
      k += 6;
      const x3 = ma * ux + mc * uy + me, y3 = mb * ux + md * uy + mf;
      bezier3(b, qx, qy, x1, y1, x2, y2, x3, y3, maxError);
      qx = x3;
      qy = y3;
    } else if (op === OP_Q) {
      const x1 = ma * args[k] + mc * args[k + 1] + me, y1 = mb * args[k] + md * args[k + 1] + mf;
      ux = args[k + 2];
      uy = args[k + 3];
      k += 4;
      const x2 = ma * ux + mc * uy + me, y2 = mb * ux + md * uy + mf;
      // Degree elevation to a cubic is exact, keeps the end tangents' directions
      // and gives the same flatness constant |P0 − 2P1 + P2|/4 (see ./bezier.ts).
      bezier3(b, qx, qy, qx + (2 / 3) * (x1 - qx), qy + (2 / 3) * (y1 - qy),
        x2 + (2 / 3) * (x1 - x2), y2 + (2 / 3) * (y1 - y2), x2, y2, maxError);
      qx = x2;
      qy = y2;
    } else if (op === OP_A) {
      const x = args[k + 5], y = args[k + 6];
      const status = arcToCenterInto(b.arc, ux, uy, args[k], args[k + 1], args[k + 2],
        args[k + 3] !== 0, args[k + 4] !== 0, x, y);
      k += 7;
      if (status === ARC_OMITTED) continue; // omitted (F.6.2): the current point stays
      ux = x;
      uy = y;
      const nx = ma * x + mc * y + me, ny = mb * x + md * y + mf;
      const tx = nx - qx, ty = ny - qy;
      if (status === ARC_LINE) {
        if (tx === 0 && ty === 0) continue;
        join(b, STRAIGHT, tx, ty);
        push(b, nx, ny);
        b.prevKind = STRAIGHT;
        b.ptx = tx;
        b.pty = ty;
      } else if (status === ARC_ELLIPSE) {
        ellipse(b, ma, mb, mc, md, me, mf, nx, ny, maxError);
      }
      qx = nx;
      qy = ny;
    } else if (op === OP_Z) {
      finish(b, out, true, stats);
      ux = sx;
      uy = sy;
      qx = sqx;
      qy = sqy;
      // A command after Z other than M starts a new subpath at the same point.
      begin(b, qx, qy);
    } else {
      throw new RangeError(`unknown path opcode ${op} at segment ${i}`);
    }
  }
  finish(b, out, false, stats);
  spare = b;
  return out;
}

/** Append a cubic's vertices after the current last vertex (x0, y0), control points in mm. */
function bezier3(
  b: Build, x0: number, y0: number, x1: number, y1: number,
  x2: number, y2: number, x3: number, y3: number, maxError: number,
): void {
  if (x0 === x1 && x1 === x2 && x2 === x3 && y0 === y1 && y1 === y2 && y2 === y3) return;
  const flat = cubicFlatness(x0, y0, x1, y1, x2, y2, x3, y3);
  const n = stepsForFlatness(flat, maxError);
  const kind = flat > 0 ? CURVED : STRAIGHT;
  // End tangents, falling back along the control polygon when handles vanish.
  let sx = x1 - x0, sy = y1 - y0;
  if (sx === 0 && sy === 0) { sx = x2 - x0; sy = y2 - y0; }
  if (sx === 0 && sy === 0) { sx = x3 - x0; sy = y3 - y0; }
  let ex = x3 - x2, ey = y3 - y2;
  if (ex === 0 && ey === 0) { ex = x3 - x1; ey = y3 - y1; }
  if (ex === 0 && ey === 0) { ex = x3 - x0; ey = y3 - y0; }
  join(b, kind, sx, sy);
  for (let i = 1; i < n; i++) {
    const t = i / n, s = 1 - t;
    const b0 = s * s * s, b1 = 3 * s * s * t, b2 = 3 * s * t * t, b3 = t * t * t;
    push(b, b0 * x0 + b1 * x1 + b2 * x2 + b3 * x3, b0 * y0 + b1 * y1 + b2 * y2 + b3 * y3);
  }
  push(b, x3, y3);
  b.prevKind = kind;
  b.ptx = ex;
  b.pty = ey;
  const e = flat / (n * n);
  if (e > b.bound) b.bound = e;
}

/**
 * Append the vertices of the arc in `arc` (centre form, user units) mapped
 * by the matrix, ending exactly at the mapped end point (nx, ny).
 */
function ellipse(
  b: Build, ma: number, mb: number, mc: number, md: number, me: number, mf: number,
  nx: number, ny: number, maxError: number,
): void {
  const cx = b.arc[0], cy = b.arc[1], rx = b.arc[2], ry = b.arc[3], phi = b.arc[4], t1 = b.arc[5], dt = b.arc[6];
  const cosP = Math.cos(phi), sinP = Math.sin(phi);
  // E = L·R(φ)·diag(rx, ry): columns (ea, eb) and (ec, ed).
  const ux = rx * cosP, uy = rx * sinP, vx = -ry * sinP, vy = ry * cosP;
  const ea = ma * ux + mc * uy, eb = mb * ux + md * uy;
  const ec = ma * vx + mc * vy, ed = mb * vx + md * vy;
  const ccx = ma * cx + mc * cy + me, ccy = mb * cx + md * cy + mf;
  const s1 = maxSemiAxis(ea, eb, ec, ed);
  const span = Math.abs(dt);
  // Largest step δ with σ1·(1 − cos(δ/2)) = σ1·2·sin²(δ/4) ≤ maxError (no cancellation near 0).
  const ratio = maxError / s1;
  let step = ratio >= 0.5 ? MAX_ARC_STEP : 4 * Math.asin(Math.sqrt(ratio / 2));
  if (!(step <= MAX_ARC_STEP)) step = MAX_ARC_STEP;
  let n = Math.max(1, Math.ceil(span / step));
  let e = 0;
  for (;;) {
    const q = Math.sin(span / n / 4);
    e = 2 * s1 * q * q;
    if (e <= maxError || !(n < MAX_CURVE_STEPS)) break;
    n++; // rounding in asin/ceil
  }
  if (!(n <= MAX_CURVE_STEPS)) {
    throw new RangeError(`an arc would need ${n} steps to stay within ${maxError} (semi-axis ${s1})`);
  }
  const sign = dt < 0 ? -1 : 1;
  const c0 = Math.cos(t1), s0 = Math.sin(t1);
  join(b, CURVED, sign * (ec * c0 - ea * s0), sign * (ed * c0 - eb * s0));
  for (let i = 1; i < n; i++) {
    const t = t1 + (dt * i) / n;
    const c = Math.cos(t), s = Math.sin(t);
    push(b, ccx + ea * c + ec * s, ccy + eb * c + ed * s);
  }
  push(b, nx, ny);
  const t2 = t1 + dt;
  const c2 = Math.cos(t2), s2 = Math.sin(t2);
  b.prevKind = CURVED;
  b.ptx = sign * (ec * c2 - ea * s2);
  b.pty = sign * (ed * c2 - eb * s2);
  if (e > b.bound) b.bound = e;
}
