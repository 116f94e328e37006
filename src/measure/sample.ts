/**
 * The report's own sampler: turns path data into polylines in mm straight
 * from the curve formulas, with a proven bound on how far the polyline can be
 * from the true curve. Shares no code with the fitter or with
 * ../geom/flatten.ts on purpose — the report checks them, so it must not
 * inherit their mistakes.
 *
 * Output layout: one `Float64Array` of x,y pairs (mm) per drawn subpath; a
 * closed subpath repeats its first point at the end. A subpath that draws
 * nothing (a lone moveto, or only omitted arcs) is left out.
 *
 * Sources: Bézier pieces are evaluated in Bernstein form; arcs are converted
 * endpoint → centre by W3C SVG 1.1 F.6.5 with the radius correction of F.6.6
 * and evaluated by F.6.3.1, in user units, and only then mapped by the matrix.
 */
import { OP_A, OP_ARGS, OP_C, OP_L, OP_M, OP_Q, OP_Z, type PathData } from '../svg/pathTypes.js';
import type { Matrix } from '../svg/matrixTypes.js';

export interface SampledPath {
  /** mm, x,y pairs, one array per drawn subpath (closed ones repeat the first point at the end). */
  polylines: Float64Array[];
  /**
   * mm: the two-sided Hausdorff distance between each true curve piece and its
   * chords is at most this, for every piece (lines are exact, 0).
   */
  errorBound: number;
}

/** `endpointToCenter` result kinds. */
export const ARC_OMITTED = 0;
export const ARC_LINE = 1;
export const ARC_ELLIPSE = 2;

/** Refuse to sample a single piece into more points than this (a sign of a bad spacing). */
const MAX_PIECE_SAMPLES = 50_000_000;

/**
 * SVG 1.1 F.6.5 endpoint → centre conversion with the F.6.2/F.6.6 out-of-range
 * rules, in the arc's own user units. Writes
 * `out = [cx, cy, rx, ry, phi (rad), theta1 (rad), dTheta (rad)]` (radii
 * corrected) when the result is `ARC_ELLIPSE`; returns `ARC_OMITTED` when the
 * endpoints coincide exactly and `ARC_LINE` when a radius is 0.
 * Flags: any non-zero value counts as 1 (F.6.2).
 */
export function endpointToCenter(
  out: Float64Array, x1: number, y1: number, rxIn: number, ryIn: number, phiDeg: number,
  fA: number, fS: number, x2: number, y2: number,
): number {
  if (x1 === x2 && y1 === y2) return ARC_OMITTED; // F.6.2: exact equality, as the spec says
  let rx = Math.abs(rxIn), ry = Math.abs(ryIn); // F.6.6.1
  if (rx === 0 || ry === 0) return ARC_LINE; // F.6.6 step 1
  const phi = ((phiDeg % 360) * Math.PI) / 180;
  const cos = Math.cos(phi), sin = Math.sin(phi);
  const hx = (x1 - x2) / 2, hy = (y1 - y2) / 2;
  const x1p = cos * hx + sin * hy; // F.6.5.1
  const y1p = -sin * hx + cos * hy;
  const lambda = (x1p * x1p) / (rx * rx) + (y1p * y1p) / (ry * ry); // F.6.6.2
  if (lambda > 1) {
    const s = Math.sqrt(lambda);
    rx *= s;
    ry *= s;
  }
  const rx2 = rx * rx, ry2 = ry * ry;
  const den = rx2 * y1p * y1p + ry2 * x1p * x1p;
  // After the scale-up the radicand is 0 in exact arithmetic: clamp rounding below 0.
  let k = Math.sqrt(Math.max(0, (rx2 * ry2 - den) / den)); // F.6.5.2
  if ((fA !== 0) === (fS !== 0)) k = -k;
  const cxp = (k * rx * y1p) / ry, cyp = (-k * ry * x1p) / rx;
  const ux = (x1p - cxp) / rx, uy = (y1p - cyp) / ry;
  const vx = (-x1p - cxp) / rx, vy = (-y1p - cyp) / ry;
  const theta1 = Math.atan2(uy, ux); // F.6.5.5 via atan2 of (cross, dot)
  let dTheta = Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy); // F.6.5.6
  if (fS === 0 && dTheta > 0) dTheta -= 2 * Math.PI;
  else if (fS !== 0 && dTheta < 0) dTheta += 2 * Math.PI;
  out[0] = cos * cxp - sin * cyp + (x1 + x2) / 2; // F.6.5.3
  out[1] = sin * cxp + cos * cyp + (y1 + y2) / 2;
  out[2] = rx;
  out[3] = ry;
  out[4] = phi;
  out[5] = theta1;
  out[6] = dTheta;
  return ARC_ELLIPSE;
}

/** Largest singular value of the 2×2 matrix [a c; b d] (columns are images of x and y). */
function sigmaMax(a: number, b: number, c: number, d: number): number {
  const s = a * a + b * b + c * c + d * d;
  const det = a * d - b * c;
  return Math.sqrt((s + Math.sqrt(Math.max(0, s * s - 4 * det * det))) / 2);
}

/**
 * Reusable storage for {@link samplePath}: with one, the polylines it returns
 * are views into `data` (valid until the same buffer is passed again), so a
 * measurement in steady state allocates no sample arrays.
 */
export class SampleBuffer {
  /** mm, x,y pairs of all subpaths of the last call, one after another. */
  data = new Float64Array(1024);
  /** Doubles in use. */
  n = 0;

  /** Make room for `points` more points. */
  reserve(points: number): void {
    const need = this.n + 2 * points;
    if (need <= this.data.length) return;
    const next = new Float64Array(Math.max(need, 2 * this.data.length));
    next.set(this.data.subarray(0, this.n));
    this.data = next;
  }
}

function pieceCount(n: number, what: string): number {
  if (!(n <= MAX_PIECE_SAMPLES)) throw new RangeError(`${what} needs ${n} samples (limit ${MAX_PIECE_SAMPLES}); spacing or chord error too small`);
  return Math.max(1, n);
}

/**
 * Sample path data into polylines in mm.
 *
 * Sample counts per piece (h = parameter step, L = linear part of `toMm`):
 * - line: ⌈length/spacing⌉ chords, exact;
 * - quadratic/cubic Bézier: |B''| ≤ M with M = 2|L·Δ²P| (quadratic) or
 *   6·max|L·Δ²P_i| (cubic), so each chord is within M·h²/8 of its piece
 *   (linear-interpolation error); h is chosen so that this is ≤ `chordError`
 *   and each chord is at most `spacing` long (|B'| ≤ n·max|L·ΔP_i|);
 * - arc: the image is an ellipse with largest semi-axis σ1 (largest singular
 *   value of L·R(φ)·diag(rx, ry)); a chord over parameter step h < π is within
 *   the sagitta σ1·(1 − cos(h/2)) of its piece; h ≤ π/2, chosen so that this
 *   is ≤ `chordError` and each chord at most `spacing` long.
 * `errorBound` is the largest bound actually reached (≤ chordError).
 *
 * @param p path data in the element's user units
 * @param toMm user units → mm matrix, applied after evaluation
 * @param spacing mm, longest chord allowed (> 0)
 * @param chordError mm, target bound on curve-to-chord distance (> 0); default spacing/8
 * @param into optional reusable storage; the polylines are then views into it
 *   (see {@link SampleBuffer}), otherwise arrays of their own
 */
export function samplePath(p: PathData, toMm: Matrix, spacing: number, chordError = spacing / 8, into?: SampleBuffer): SampledPath {
  if (!(spacing > 0) || !Number.isFinite(spacing)) throw new RangeError(`spacing must be a positive number of mm, got ${spacing}`);
  if (!(chordError > 0) || !Number.isFinite(chordError)) throw new RangeError(`chordError must be a positive number of mm, got ${chordError}`);
  const ma = toMm[0], mb = toMm[1], mc = toMm[2], md = toMm[3], me = toMm[4], mf = toMm[5];
  const { ops, args } = p;
  const out = into ?? new SampleBuffer();
  out.n = 0;
  // Subpaths as [start, end) ranges of `out.data` (doubles); turned into arrays at the end.
  const ranges: number[] = [];
  const arc = new Float64Array(7);
  let errorBound = 0;
  let open = false, drew = false, begin = 0;
  let startX = 0, startY = 0, curX = 0, curY = 0; // user units

  let k = 0;
  for (let s = 0; s < ops.length; s++) {
    const op = ops[s];
    const i = k;
    k += OP_ARGS[op];
    if (op === OP_M) {
      if (open && drew) ranges.push(begin, out.n);
      open = false;
      curX = args[i];
      curY = args[i + 1];
    } else if (op === OP_Z) {
      if (open) {
        // Already back at the start: the closing line has zero length, add no duplicate point.
        if (curX !== startX || curY !== startY || !drew) {
          sampleLine(out, ma * curX + mc * curY + me, mb * curX + md * curY + mf, ma * startX + mc * startY + me, mb * startX + md * startY + mf, spacing);
          drew = true;
        }
        curX = startX;
        curY = startY;
        if (drew) ranges.push(begin, out.n);
      }
      open = false;
      continue;
    }
    if (!open) {
      // A subpath starts at a moveto (so `M p Z` draws the point p), or at the old start with a
      // drawing command right after Z; the points of one that draws nothing are overwritten.
      open = true;
      drew = false;
      out.n = begin = ranges.length > 0 ? ranges[ranges.length - 1] : 0;
      out.reserve(1);
      out.data[out.n++] = ma * curX + mc * curY + me;
      out.data[out.n++] = mb * curX + md * curY + mf;
      startX = curX;
      startY = curY;
    }
    if (op === OP_M) continue;
    if (op === OP_L) {
      const x = args[i], y = args[i + 1];
      sampleLine(out, ma * curX + mc * curY + me, mb * curX + md * curY + mf, ma * x + mc * y + me, mb * x + md * y + mf, spacing);
      drew = true;
      curX = x;
      curY = y;
    } else if (op === OP_C || op === OP_Q) {
      const cubic = op === OP_C;
      const x0 = curX, y0 = curY, x1 = args[i], y1 = args[i + 1];
      const x2 = args[i + 2], y2 = args[i + 3];
      const x3 = cubic ? args[i + 4] : x2, y3 = cubic ? args[i + 5] : y2;
      // Bounds on |B'| and |B''| in mm, from mapped control-point differences.
      let speed: number, accel: number;
      if (cubic) {
        speed = 3 * Math.max(lenL(x1 - x0, y1 - y0), lenL(x2 - x1, y2 - y1), lenL(x3 - x2, y3 - y2));
        accel = 6 * Math.max(lenL(x0 - 2 * x1 + x2, y0 - 2 * y1 + y2), lenL(x1 - 2 * x2 + x3, y1 - 2 * y2 + y3));
      } else {
        speed = 2 * Math.max(lenL(x1 - x0, y1 - y0), lenL(x2 - x1, y2 - y1));
        accel = 2 * lenL(x0 - 2 * x1 + x2, y0 - 2 * y1 + y2);
      }
      const n = pieceCount(Math.max(Math.ceil(Math.sqrt(accel / (8 * chordError))), Math.ceil(speed / spacing)), 'Bézier');
      out.reserve(n);
      const d = out.data;
      let o = out.n;
      for (let j = 1; j < n; j++) {
        const t = j / n, u = 1 - t;
        let x: number, y: number;
        if (cubic) {
          const b0 = u * u * u, b1 = 3 * u * u * t, b2 = 3 * u * t * t, b3 = t * t * t;
          x = b0 * x0 + b1 * x1 + b2 * x2 + b3 * x3;
          y = b0 * y0 + b1 * y1 + b2 * y2 + b3 * y3;
        } else {
          const b0 = u * u, b1 = 2 * u * t, b2 = t * t;
          x = b0 * x0 + b1 * x1 + b2 * x2;
          y = b0 * y0 + b1 * y1 + b2 * y2;
        }
        d[o++] = ma * x + mc * y + me;
        d[o++] = mb * x + md * y + mf;
      }
      d[o++] = ma * x3 + mc * y3 + me;
      d[o++] = mb * x3 + md * y3 + mf;
      out.n = o;
      drew = true;
      errorBound = Math.max(errorBound, accel / (8 * n * n));
      curX = x3;
      curY = y3;
    } else if (op === OP_A) {
      const x2 = args[i + 5], y2 = args[i + 6];
      const kind = endpointToCenter(arc, curX, curY, args[i], args[i + 1], args[i + 2], args[i + 3], args[i + 4], x2, y2);
      if (kind === ARC_LINE) {
        sampleLine(out, ma * curX + mc * curY + me, mb * curX + md * curY + mf, ma * x2 + mc * y2 + me, mb * x2 + md * y2 + mf, spacing);
        drew = true;
      } else if (kind === ARC_ELLIPSE) {
        const cx = arc[0], cy = arc[1], rx = arc[2], ry = arc[3], th1 = arc[5], dth = arc[6];
        const cp = Math.cos(arc[4]), sp = Math.sin(arc[4]);
        // E = L·R(φ)·diag(rx, ry); its columns are the images of the semi-axes.
        const sigma = sigmaMax((ma * cp + mc * sp) * rx, (mb * cp + md * sp) * rx, (-ma * sp + mc * cp) * ry, (-mb * sp + md * cp) * ry);
        const hErr = chordError < sigma ? 2 * Math.acos(1 - chordError / sigma) : Math.PI / 2;
        const span = Math.abs(dth);
        const n = pieceCount(Math.max(Math.ceil(span / Math.min(hErr, Math.PI / 2)), Math.ceil((sigma * span) / spacing)), 'arc');
        out.reserve(n);
        const d = out.data;
        let o = out.n;
        for (let j = 1; j < n; j++) {
          const th = th1 + (dth * j) / n;
          const ex = rx * Math.cos(th), ey = ry * Math.sin(th);
          const x = cp * ex - sp * ey + cx, y = sp * ex + cp * ey + cy; // F.6.3.1
          d[o++] = ma * x + mc * y + me;
          d[o++] = mb * x + md * y + mf;
        }
        d[o++] = ma * x2 + mc * y2 + me; // the formula's end point is P2
        d[o++] = mb * x2 + md * y2 + mf;
        out.n = o;
        drew = true;
        const q = Math.sin(span / n / 4);
        errorBound = Math.max(errorBound, sigma * 2 * q * q); // 1 − cos(h/2) = 2 sin²(h/4), no cancellation
      }
      curX = x2;
      curY = y2;
    } else {
      throw new RangeError(`unknown path opcode ${op} at segment ${s}`);
    }
  }
  if (open && drew) ranges.push(begin, out.n);
  const polylines: Float64Array[] = [];
  for (let r = 0; r < ranges.length; r += 2) {
    polylines.push(into ? out.data.subarray(ranges[r], ranges[r + 1]) : out.data.slice(ranges[r], ranges[r + 1]));
  }
  return { polylines, errorBound };

  function lenL(dx: number, dy: number): number {
    return Math.hypot(ma * dx + mc * dy, mb * dx + md * dy);
  }
}

/** Append the line (x0, y0)→(x1, y1) (mm) in ⌈length/spacing⌉ chords, without its first point. */
function sampleLine(out: SampleBuffer, x0: number, y0: number, x1: number, y1: number, spacing: number): void {
  const dx = x1 - x0, dy = y1 - y0;
  const n = pieceCount(Math.ceil(Math.sqrt(dx * dx + dy * dy) / spacing), 'line');
  out.reserve(n);
  const d = out.data;
  let o = out.n;
  for (let i = 1; i < n; i++) {
    const t = i / n;
    d[o++] = x0 + dx * t;
    d[o++] = y0 + dy * t;
  }
  d[o++] = x1;
  d[o++] = y1;
  out.n = o;
}

/** Total number of points in a sampled path (for work caps). */
export function sampleCount(s: SampledPath): number {
  let n = 0;
  for (const pl of s.polylines) n += pl.length >> 1;
  return n;
}
