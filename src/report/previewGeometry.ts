/**
 * Geometry pieces of the preview picture (./preview.ts): bounds in mm, and
 * SVG markup for one element, either whole (the original, one neutral path;
 * a kept element, one dashed path) or split into one sub-path per segment kind (the result: arcs, lines and
 * Bézier curves in their own colours) plus its knots.
 *
 * Markup is drawn in mm: each element's path data stays in its own user units
 * under a `g transform="matrix(toMm)"`, so arcs are drawn exactly by the
 * renderer. Stroke widths are given in screen px and divided by the element's
 * scale, so lines look the same under any transform.
 */
import { OP_A, OP_ARGS, OP_C, OP_L, OP_M, OP_Q, OP_Z, type PathData } from '../svg/pathTypes.js';
import type { Matrix } from '../svg/matrixTypes.js';
import { ARC_ELLIPSE, endpointToCenter } from '../measure/sample.js';

/** An axis-aligned box in mm: [minX, minY, maxX, maxY]; empty when minX > maxX. */
export type Box = [number, number, number, number];

/** A box containing nothing. */
export function emptyBox(): Box {
  return [Infinity, Infinity, -Infinity, -Infinity];
}

function addPoint(box: Box, m: Matrix, x: number, y: number): void {
  const X = m[0] * x + m[2] * y + m[4], Y = m[1] * x + m[3] * y + m[5];
  if (X < box[0]) box[0] = X;
  if (Y < box[1]) box[1] = Y;
  if (X > box[2]) box[2] = X;
  if (Y > box[3]) box[3] = Y;
}

/**
 * Grow `box` (mm) to hold the path: all end and control points (a Bézier lies
 * in their hull) and, for an arc, the points of its mapped ellipse that are
 * extreme in x or y and lie within its sweep (centre form by S11 F.6.5).
 */
export function addPathBounds(box: Box, p: PathData, toMm: Matrix): Box {
  const arc = new Float64Array(7);
  let k = 0, cx = 0, cy = 0, sx = 0, sy = 0;
  for (let s = 0; s < p.ops.length; s++) {
    const op = p.ops[s], a = p.args;
    if (op === OP_Z) {
      cx = sx;
      cy = sy;
    } else if (op === OP_A) {
      const x = a[k + 5], y = a[k + 6];
      if (endpointToCenter(arc, cx, cy, a[k], a[k + 1], a[k + 2], a[k + 3], a[k + 4], x, y) === ARC_ELLIPSE) addArcExtremes(box, toMm, arc);
      addPoint(box, toMm, x, y);
      cx = x;
      cy = y;
    } else {
      const n = OP_ARGS[op];
      for (let i = 0; i < n; i += 2) addPoint(box, toMm, a[k + i], a[k + i + 1]);
      cx = a[k + n - 2];
      cy = a[k + n - 1];
      if (op === OP_M) {
        sx = cx;
        sy = cy;
      }
    }
    k += OP_ARGS[op];
  }
  return box;
}

/**
 * Add the x- and y-extreme points of an arc in centre form
 * `c = [cx, cy, rx, ry, phi, theta1, dTheta]` (user units) mapped by `m`:
 * the image is c' + E·(cos t, sin t) with E = L·R(phi)·diag(rx, ry), so x is
 * extreme where tan t = E01/E00 and y where tan t = E11/E10.
 */
function addArcExtremes(box: Box, m: Matrix, c: Float64Array): void {
  const cp = Math.cos(c[4]), sp = Math.sin(c[4]);
  const e00 = (m[0] * cp + m[2] * sp) * c[2], e01 = (-m[0] * sp + m[2] * cp) * c[3];
  const e10 = (m[1] * cp + m[3] * sp) * c[2], e11 = (-m[1] * sp + m[3] * cp) * c[3];
  const t1 = c[5], dt = c[6];
  const lo = Math.min(t1, t1 + dt), hi = Math.max(t1, t1 + dt);
  for (const base of [Math.atan2(e01, e00), Math.atan2(e11, e10)]) {
    for (let j = -3; j <= 3; j++) {
      const t = base + j * Math.PI;
      if (t < lo || t > hi) continue;
      const ex = c[2] * Math.cos(t), ey = c[3] * Math.sin(t);
      addPoint(box, m, cp * ex - sp * ey + c[0], sp * ex + cp * ey + c[1]); // S11 F.6.3.1
    }
  }
}

/** Whether two boxes overlap. */
export function boxesMeet(a: Box, b: Box): boolean {
  return a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3];
}

/** Square root of |det|: the element's mean scale, for stroke widths. */
function meanScale(m: Matrix): number {
  const s = Math.sqrt(Math.abs(m[0] * m[3] - m[1] * m[2]));
  return s > 0 && Number.isFinite(s) ? s : 1;
}

const num = (v: number): string => String(+v.toPrecision(12));
const mat = (m: Matrix): string => `matrix(${Array.from(m, num).join(' ')})`;

/** Colours and widths used to draw (widths in px of the current view). */
export interface Ink {
  original: string;
  arc: string;
  line: string;
  curve: string;
  knot: string;
  /** Elements written back unchanged (kept), drawn dashed in this colour. */
  kept: string;
  originalWidth: number;
  resultWidth: number;
  knotRadius: number;
}

/** The original element as one thin neutral path. `pxPerMm` is the scale of the view. */
export function originalMarkup(p: PathData, toMm: Matrix, ink: Ink, pxPerMm: number): string {
  const w = ink.originalWidth / pxPerMm / meanScale(toMm);
  return `<g transform="${mat(toMm)}"><path d="${pathText(p)}" fill="none" stroke="${ink.original}" stroke-width="${num(w)}" stroke-linejoin="round"/></g>`;
}

/**
 * An element written back as it was (kept): its own path, dashed, in the kept
 * colour and as wide as a result, so it reads neither as the neutral original
 * nor as refitted arcs and lines. Dash lengths in px of the view.
 */
export function keptMarkup(p: PathData, toMm: Matrix, ink: Ink, pxPerMm: number): string {
  const unit = 1 / pxPerMm / meanScale(toMm);
  return `<g transform="${mat(toMm)}"><path d="${pathText(p)}" fill="none" stroke="${ink.kept}" stroke-width="${num(ink.resultWidth * unit)}" ` +
    `stroke-dasharray="${num(6 * unit)} ${num(4 * unit)}" stroke-linejoin="round"/></g>`;
}

/** Path data as absolute text (numbers to 12 significant digits). */
function pathText(p: PathData): string {
  const out: string[] = [];
  const letters = 'MLCQAZ';
  let k = 0;
  for (let s = 0; s < p.ops.length; s++) {
    const op = p.ops[s], n = OP_ARGS[op];
    let t = letters[op];
    for (let i = 0; i < n; i++) t += `${i === 0 ? '' : ' '}${num(p.args[k + i])}`;
    out.push(t);
    k += n;
  }
  return out.join('');
}

/**
 * The result element split by segment kind: every segment becomes its own
 * `M x0 y0 <segment>` sub-path in the arc, line or curve path; a closing line
 * of non-zero length counts as a line. Knots (segment end points) are dots in
 * mm, outside the transform, so they stay round.
 * @returns markup and the number of segments of each kind
 */
export function resultMarkup(
  p: PathData, toMm: Matrix, ink: Ink, pxPerMm: number, knots: boolean,
): { svg: string; arcs: number; lines: number; curves: number } {
  const arcs: string[] = [], lines: string[] = [], curves: string[] = [];
  const dots: string[] = [];
  const r = ink.knotRadius / pxPerMm;
  const dot = (x: number, y: number): void => {
    if (!knots) return;
    dots.push(`<circle cx="${num(toMm[0] * x + toMm[2] * y + toMm[4])}" cy="${num(toMm[1] * x + toMm[3] * y + toMm[5])}" r="${num(r)}"/>`);
  };
  let k = 0, cx = 0, cy = 0, sx = 0, sy = 0;
  for (let s = 0; s < p.ops.length; s++) {
    const op = p.ops[s], a = p.args, n = OP_ARGS[op];
    const from = `M${num(cx)} ${num(cy)}`;
    if (op === OP_M) {
      sx = cx = a[k];
      sy = cy = a[k + 1];
      dot(cx, cy);
    } else if (op === OP_Z) {
      // Its end is the subpath's start, which has its dot already.
      if (cx !== sx || cy !== sy) lines.push(`${from}L${num(sx)} ${num(sy)}`);
      cx = sx;
      cy = sy;
    } else {
      const args: string[] = [];
      for (let i = 0; i < n; i++) args.push(num(a[k + i]));
      if (op === OP_A) arcs.push(`${from}A${args.join(' ')}`);
      else if (op === OP_L) lines.push(`${from}L${args.join(' ')}`);
      else if (op === OP_C || op === OP_Q) curves.push(`${from}${op === OP_C ? 'C' : 'Q'}${args.join(' ')}`);
      cx = a[k + n - 2];
      cy = a[k + n - 1];
      dot(cx, cy);
    }
    k += n;
  }
  const w = num(ink.resultWidth / pxPerMm / meanScale(toMm));
  const stroke = (d: string[], colour: string): string =>
    d.length === 0 ? '' : `<path d="${d.join('')}" fill="none" stroke="${colour}" stroke-width="${w}" stroke-linecap="round"/>`;
  const svg = `<g transform="${mat(toMm)}">${stroke(curves, ink.curve)}${stroke(lines, ink.line)}${stroke(arcs, ink.arc)}</g>` +
    (dots.length > 0 ? `<g fill="${ink.knot}">${dots.join('')}</g>` : '');
  return { svg, arcs: arcs.length, lines: lines.length, curves: curves.length };
}
