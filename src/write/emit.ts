/**
 * Replay the fitter's segments (mm) into a sink in an element's local user
 * units, choosing the written numbers so that what a reader reconstructs stays
 * within the rounding bound of the fitted geometry.
 *
 * Every number handed to the sink is already rounded as it will be written
 * (coordinates to `digits`, radii to as few extra places as needed), so a
 * {@link RecordingSink} sees exactly what a {@link PathWriter} writes.
 *
 * Arcs. A circle (r, r, 0) maps through the linear part of mmToLocal to an
 * ellipse (REFERENCES.md §5.2, ../geom/ellipseImage.ts); flags follow F.6.4
 * (largeArc = |sweep| > π, sweep flag = sweep > 0), flipped by a mirroring
 * matrix. A reader rebuilds the centre from the *rounded* end points and
 * radii (F.6.5), which is ill-conditioned near a semicircle: the centre sits
 * √(r² − c²/4) off the chord, so a radius rounded by ε moves it by about
 * √(c·ε) (r = 10, 2 decimals: 0.45 instead of 0.007). Therefore:
 * 1. the radius is chosen for the rounded end points, putting the reader's
 *    centre at the foot of the true centre on the chord's bisector;
 * 2. it is rounded up where needed so the written chord never exceeds the
 *    written diameter (Λ ≤ 1, F.6.6: no reader has to enlarge it);
 * 3. the reader's arc is rebuilt (../geom/arcCenter.ts) and sampled; while it
 *    is off by more than {@link writtenArcErrorBound}, the radius gets another
 *    decimal (up to digits + EXTRA_RADIUS_DIGITS), then the arc is halved.
 * An arc of a full turn, or whose rounded ends coincide (a reader would drop
 * it, F.6.2), is written as two halves.
 */
import type { PathSink } from './sink.js';
import type { Matrix } from '../svg/matrixTypes.js';
import { arcGeometry, type Segment } from '../fit/segment.js';
import { transformArcShape, type ArcShape } from '../geom/ellipseImage.js';
import { ARC_CENTER_LENGTH, ARC_ELLIPSE, arcToCenterInto } from '../geom/arcCenter.js';
import { applyX, applyY, invert } from '../svg/matrix.js';
import { MAX_DIGITS, angleDigits, roundTo } from './numbers.js';
import { writtenRoundingMm } from '../budget.js';

/** A sweep within this many radians of 2π counts as a full turn and is split. */
export const FULL_TURN_EPS = 1e-9;
/** Most decimals a radius gets beyond `digits`; PathWriter's default radiusDigits matches. */
export const EXTRA_RADIUS_DIGITS = 6;
/** Most times an arc is halved because its written form is off by too much. */
export const MAX_SPLIT_DEPTH = 4;

/** One fitted contour: segments in mm, end to end. */
export interface EmitContour {
  segments: Segment[];
  closed: boolean;
}

/** What {@link emitSegments} did. */
export interface EmitStats {
  lines: number;
  arcs: number;
  /** Arcs halved (full turns, coinciding rounded ends, or too far off). */
  splits: number;
  /** Arcs of at most a half turn whose rounded ends coincide: nothing written (they lie within the rounding). */
  dropped: number;
  /** Arcs written as a line because the matrix flattens them. */
  degenerate: number;
  /** Arcs written although still off by more than the bound after MAX_SPLIT_DEPTH halvings. */
  overBound: number;
}

/**
 * Largest distance (local user units) between a written arc as a reader draws
 * it and the fitted arc, when coordinates have `digits` decimals: the budget's
 * rounding bound (src/budget.ts), which this writer enforces arc by arc.
 */
export function writtenArcErrorBound(digits: number): number {
  return writtenRoundingMm(digits, 1);
}

const DEG = Math.PI / 180;
const TWO_PI = 2 * Math.PI;
const SAMPLES = 32;

/** Smallest value with `dr` decimals that is ≥ v. */
function ceilTo(v: number, dr: number): number {
  const p = Math.pow(10, dr);
  let c = roundTo(Math.ceil(v * p) / p, dr);
  if (c < v) c = roundTo(c + 1 / p, dr);
  return c;
}

/** F.6.6.2 √Λ for the written numbers (> 1: a reader must enlarge the radii). */
function sqrtLambda(x1: number, y1: number, x2: number, y2: number, rx: number, ry: number, rotDeg: number): number {
  const c = Math.cos(rotDeg * DEG), s = Math.sin(rotDeg * DEG);
  const hx = (x1 - x2) / 2, hy = (y1 - y2) / 2;
  return Math.hypot((c * hx + s * hy) / rx, (-s * hx + c * hy) / ry);
}

class Emitter {
  readonly stats: EmitStats = { lines: 0, arcs: 0, splits: 0, dropped: 0, degenerate: 0, overBound: 0 };
  private curX = 0;
  private curY = 0;
  private readonly bound: number;
  private readonly rec = new Float64Array(ARC_CENTER_LENGTH);

  constructor(
    private readonly sink: PathSink,
    private readonly m: Matrix,
    private readonly inv: Matrix,
    private readonly digits: number,
  ) {
    // Checked at SAMPLES + 1 points only: keep 10 % back for the error between samples.
    this.bound = 0.9 * writtenArcErrorBound(digits);
  }

  moveTo(x: number, y: number): void {
    this.curX = roundTo(applyX(this.m, x, y), this.digits);
    this.curY = roundTo(applyY(this.m, x, y), this.digits);
    this.sink.moveTo(this.curX, this.curY);
  }

  lineTo(x: number, y: number): void {
    this.curX = roundTo(applyX(this.m, x, y), this.digits);
    this.curY = roundTo(applyY(this.m, x, y), this.digits);
    this.sink.lineTo(this.curX, this.curY);
    this.stats.lines++;
  }

  closePath(startX: number, startY: number): void {
    this.sink.closePath();
    this.curX = startX;
    this.curY = startY;
  }

  get current(): [number, number] {
    return [this.curX, this.curY];
  }

  private split(cx: number, cy: number, r: number, a0: number, sw: number, x1: number, y1: number, depth: number): void {
    this.stats.splits++;
    const am = a0 + sw / 2;
    this.arc(cx, cy, r, a0, sw / 2, cx + r * Math.cos(am), cy + r * Math.sin(am), depth + 1);
    this.arc(cx, cy, r, am, sw / 2, x1, y1, depth + 1);
  }

  /** Circle arc in mm: centre, radius, start angle a0 and signed sweep (rad), end point (x1, y1). */
  arc(cx: number, cy: number, r: number, a0: number, sw: number, x1: number, y1: number, depth: number): void {
    const d = this.digits;
    if (Math.abs(sw) >= TWO_PI - FULL_TURN_EPS) return this.split(cx, cy, r, a0, sw, x1, y1, depth);
    const wx = roundTo(applyX(this.m, x1, y1), d), wy = roundTo(applyY(this.m, x1, y1), d);
    if (wx === this.curX && wy === this.curY) {
      // A reader drops an arc with equal ends (F.6.2). Past a half turn that
      // loses real geometry; up to a half turn the arc lies inside the circle
      // on its (sub-rounding) chord, so writing nothing is within the rounding.
      if (Math.abs(sw) > Math.PI) return this.split(cx, cy, r, a0, sw, x1, y1, depth);
      this.stats.dropped++;
      return;
    }
    const shape = transformArcShape(this.m, r, r, 0, Math.abs(sw) > Math.PI, sw > 0);
    if (shape === null) {
      this.stats.degenerate++;
      this.curX = wx;
      this.curY = wy;
      this.sink.lineTo(wx, wy);
      return;
    }
    const s = this.idealScale(shape, applyX(this.m, cx, cy), applyY(this.m, cx, cy), wx, wy);
    let best: [number, number, number] | null = null;
    let bestErr = Infinity;
    for (let dr = d; dr <= Math.min(d + EXTRA_RADIUS_DIGITS, MAX_DIGITS); dr++) {
      let rxw = roundTo(s * shape.rx, dr), ryw = roundTo(s * shape.ry, dr);
      let rot = rxw === ryw ? 0 : roundTo(shape.phiDeg, angleDigits(dr, rxw));
      // Λ ≤ 1: the written diameter covers the written chord.
      for (let t = 0; t < 4 && rxw > 0 && ryw > 0; t++) {
        const L = sqrtLambda(this.curX, this.curY, wx, wy, rxw, ryw, rot);
        if (L <= 1) break;
        rxw = ceilTo(rxw * L, dr);
        ryw = ceilTo(ryw * L, dr);
        rot = rxw === ryw ? 0 : roundTo(shape.phiDeg, angleDigits(dr, rxw));
      }
      if (!(rxw > 0 && ryw > 0)) continue;
      const err = this.readerError(rxw, ryw, rot, shape, wx, wy, cx, cy, r, a0, sw);
      if (err < bestErr) {
        bestErr = err;
        best = [rxw, ryw, rot];
      }
      if (err <= this.bound) break;
    }
    if (bestErr > this.bound && depth < MAX_SPLIT_DEPTH) return this.split(cx, cy, r, a0, sw, x1, y1, depth);
    if (best === null) {
      // No positive radius at any precision: the arc is far below the rounding; a line is as good.
      this.stats.degenerate++;
      best = [0, 0, 0];
    } else if (bestErr > this.bound) {
      this.stats.overBound++;
    }
    if (best[0] === 0) this.sink.lineTo(wx, wy);
    else {
      this.sink.arcTo(best[0], best[1], best[2], shape.largeArc, shape.sweep, wx, wy);
      this.stats.arcs++;
    }
    this.curX = wx;
    this.curY = wy;
  }

  /**
   * Radius scale s (written radii = s·shape radii) whose F.6.5 centre for the
   * rounded end points is the foot of the true centre on the chord's bisector.
   * Worked in the frame where the true ellipse is the unit circle at the origin.
   */
  private idealScale(shape: ArcShape, clx: number, cly: number, wx: number, wy: number): number {
    const c = Math.cos(shape.phiDeg * DEG), sn = Math.sin(shape.phiDeg * DEG);
    const nx = (px: number, py: number): number => (c * (px - clx) + sn * (py - cly)) / shape.rx;
    const ny = (px: number, py: number): number => (-sn * (px - clx) + c * (py - cly)) / shape.ry;
    const q0x = nx(this.curX, this.curY), q0y = ny(this.curX, this.curY);
    const q1x = nx(wx, wy), q1y = ny(wx, wy);
    const hx = (q0x - q1x) / 2, hy = (q0y - q1y) / 2;
    const a = Math.hypot(hx, hy);
    // F.6.5.2: the centre is midpoint + sgn·√(s² − a²)·(hy, −hx)/a, sgn = + iff fA ≠ fS.
    const sgn = shape.largeArc !== shape.sweep ? 1 : -1;
    const k = -sgn * (((q0x + q1x) / 2) * hy - ((q0y + q1y) / 2) * hx) / a;
    return k > 0 ? Math.hypot(k, a) : a;
  }

  /**
   * Largest local distance from the arc a reader draws for the written numbers
   * to the fitted arc, over SAMPLES + 1 points: each sample is mapped to mm, its
   * nearest point on the fitted circle mapped back (an upper bound on the
   * distance to the ellipse). The midpoint must also lie within the fitted
   * sweep, so an arc drawn the wrong way round cannot pass.
   */
  private readerError(
    rxw: number, ryw: number, rot: number, shape: ArcShape, wx: number, wy: number,
    cx: number, cy: number, r: number, a0: number, sw: number,
  ): number {
    const o = this.rec, m = this.m, inv = this.inv;
    if (arcToCenterInto(o, this.curX, this.curY, rxw, ryw, rot, shape.largeArc, shape.sweep, wx, wy) !== ARC_ELLIPSE) return Infinity;
    const ecx = o[0], ecy = o[1], erx = o[2], ery = o[3], cp = Math.cos(o[4]), sp = Math.sin(o[4]);
    let worst = 0;
    for (let i = 0; i <= SAMPLES; i++) {
      const th = o[5] + (o[6] * i) / SAMPLES;
      const ex = erx * Math.cos(th), ey = ery * Math.sin(th);
      const px = cp * ex - sp * ey + ecx, py = sp * ex + cp * ey + ecy;
      const mx = applyX(inv, px, py) - cx, my = applyY(inv, px, py) - cy;
      const dist = Math.hypot(mx, my);
      if (dist === 0) return Infinity;
      const qx = cx + (r * mx) / dist, qy = cy + (r * my) / dist;
      worst = Math.max(worst, Math.hypot(px - applyX(m, qx, qy), py - applyY(m, qx, qy)));
      if (i === SAMPLES / 2) {
        // Angle of the midpoint from the start direction, measured the way the sweep turns.
        let t = Math.atan2(Math.sin(a0) * mx - Math.cos(a0) * my, Math.cos(a0) * mx + Math.sin(a0) * my);
        t = sw > 0 ? -t : t;
        if (t < 0) t += TWO_PI;
        if (Math.abs(t - Math.abs(sw) / 2) > Math.abs(sw) / 4 + 1e-6) return Infinity;
      }
    }
    return worst;
  }
}

/**
 * Write fitted contours into a sink in local user units.
 *
 * @param sink receives absolute, already rounded coordinates (local user units)
 * @param contours fitted segments in mm, each contour end to end; a closed
 *   contour ends with closePath, its last segment drawn explicitly unless it is
 *   a line (Z draws that one)
 * @param mmToLocal maps mm to the element's user units (invertible)
 * @param opts.digits decimal places of the written coordinates
 * @returns counts of what was written, split or dropped
 */
export function emitSegments(
  sink: PathSink,
  contours: readonly EmitContour[],
  mmToLocal: Matrix,
  opts: { digits: number },
): EmitStats {
  const inv = invert(new Float64Array(6), mmToLocal);
  if (inv === null) throw new RangeError(`mmToLocal is not invertible: [${Array.from(mmToLocal).join(' ')}]`);
  if (!Number.isInteger(opts.digits) || opts.digits < 0 || opts.digits > MAX_DIGITS) {
    throw new RangeError(`digits must be an integer in [0, ${MAX_DIGITS}], got ${opts.digits}`);
  }
  const e = new Emitter(sink, mmToLocal, inv, opts.digits);
  for (const contour of contours) {
    const segs = contour.segments;
    if (segs.length === 0) continue;
    e.moveTo(segs[0].x0, segs[0].y0);
    const [sx, sy] = e.current;
    for (let k = 0; k < segs.length; k++) {
      const seg = segs[k];
      const g = arcGeometry(seg);
      if (g === null) {
        if (!(contour.closed && k === segs.length - 1)) e.lineTo(seg.x1, seg.y1);
      } else {
        e.arc(g.cx, g.cy, g.r, Math.atan2(seg.y0 - g.cy, seg.x0 - g.cx), g.sweep, seg.x1, seg.y1, 0);
      }
    }
    if (contour.closed) e.closePath(sx, sy);
  }
  return e.stats;
}
