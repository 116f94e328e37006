/**
 * viewBox, preserveAspectRatio and the root element's size → a matrix from
 * root user units to millimetres (REFERENCES.md §4).
 */
import type { Matrix } from './matrixTypes.js';
import { matrix, multiply } from './matrix.js';
import { parseNumberList, skipWsp } from './numbers.js';
import { mmPerPx, parseLength, pxPerUnit } from './units.js';

/** A viewBox as [x, y, width, height] in user units. */
export type ViewBox = [number, number, number, number];

/** preserveAspectRatio: `align` is 'none' or one of the nine xM?YM? keywords. */
export interface AspectRatio {
  align: string;
  /** true for `slice`, false for `meet` (the default). */
  slice: boolean;
}

const ALIGNS = new Set([
  'none', 'xMinYMin', 'xMidYMin', 'xMaxYMin', 'xMinYMid', 'xMidYMid',
  'xMaxYMid', 'xMinYMax', 'xMidYMax', 'xMaxYMax',
]);

/**
 * Parse a viewBox: four numbers separated by whitespace and/or a comma.
 * @returns [x, y, w, h], or `null` for bad syntax, non-finite values or a
 *   negative width/height (S2 §8.6: an error, the viewBox is ignored).
 *   A zero width or height is returned as is: S2 §8.6 says the element is
 *   then not rendered, which {@link viewBoxTransform} expresses as a zero
 *   (non-invertible) matrix; callers may also test `w === 0 || h === 0`.
 */
export function parseViewBox(text: string): ViewBox | null {
  const { values, errorAt } = parseNumberList(text);
  if (errorAt >= 0 || values.length !== 4) return null;
  for (const v of values) if (!Number.isFinite(v)) return null;
  if (values[2] < 0 || values[3] < 0) return null;
  return [values[0], values[1], values[2], values[3]];
}

/**
 * Parse preserveAspectRatio: `defer? <align> <meetOrSlice>?` (S2 §8.7; the
 * SVG 1.1 `defer` keyword is tolerated and ignored). Keywords are
 * case-sensitive. An invalid value is ignored, giving the initial value
 * `xMidYMid meet`; so does `undefined`.
 */
export function parsePreserveAspectRatio(text: string | undefined): AspectRatio {
  const dflt: AspectRatio = { align: 'xMidYMid', slice: false };
  if (text === undefined) return dflt;
  const words = text.trim().split(/[\x20\x09\x0a\x0c\x0d]+/);
  if (words[0] === 'defer') words.shift();
  if (words.length < 1 || words.length > 2 || !ALIGNS.has(words[0])) return dflt;
  if (words.length === 2 && words[1] !== 'meet' && words[1] !== 'slice') return dflt;
  return { align: words[0], slice: words[1] === 'slice' };
}

/**
 * The transform from viewBox coordinates to the viewport box (S2 §8.2
 * `#ComputingAViewportsTransform`): translate(tx, ty)·scale(sx, sy).
 * A zero viewBox width or height yields the zero matrix (nothing rendered).
 * @param vb viewBox [x, y, w, h]
 * @param par preserveAspectRatio
 * @param ex viewport x, in the parent's user units (0 for the root)
 * @param ey viewport y
 * @param ew viewport width (> 0)
 * @param eh viewport height (> 0)
 */
export function viewBoxTransform(
  vb: readonly number[], par: AspectRatio, ex: number, ey: number, ew: number, eh: number,
): Matrix {
  const [vx, vy, vw, vh] = vb;
  if (!(vw > 0) || !(vh > 0)) return matrix(0, 0, 0, 0, 0, 0);
  let sx = ew / vw;
  let sy = eh / vh;
  const align = par.align;
  if (align !== 'none') {
    const s = par.slice ? Math.max(sx, sy) : Math.min(sx, sy);
    sx = s;
    sy = s;
  }
  let tx = ex - vx * sx;
  let ty = ey - vy * sy;
  if (align !== 'none') {
    const xa = align.slice(1, 4); // Min | Mid | Max
    const ya = align.slice(5, 8);
    if (xa === 'Mid') tx += (ew - vw * sx) / 2;
    else if (xa === 'Max') tx += ew - vw * sx;
    if (ya === 'Mid') ty += (eh - vh * sy) / 2;
    else if (ya === 'Max') ty += eh - vh * sy;
  }
  return matrix(sx, 0, 0, sy, tx, ty);
}

/** Result of {@link rootToMm}. */
export interface RootFrame {
  /** Root user units → millimetres (origin at the viewport's top-left corner). */
  matrix: Matrix;
  /** True when the file's width/height state a physical size. */
  physical: boolean;
  /** Width that x-like percentages in the root user space refer to, user units. */
  viewportW: number;
  /** Height that y-like percentages refer to, user units. */
  viewportH: number;
  /** The page (the root viewport) in mm, width and height: where a machine file's origin is put. */
  pageMm: [number, number];
  /** Assumptions made or attributes ignored, or null. */
  warning: string | null;
}

/**
 * CSS default size of a replaced element with no intrinsic size, 300×150 px
 * (CSS 2.1 §10.3.2 / §10.6.2; value from memory). Used only to give
 * percentages something to refer to when nothing else does.
 */
const DEFAULT_W = 300;
const DEFAULT_H = 150;

/** "0.2646 mm (1 CSS px)": a user-unit size as a person reads it, to 4 significant digits. */
export function assumedSizeText(mmPerUnit: number): string {
  const mm = `${+mmPerUnit.toPrecision(4)} mm`;
  return Math.abs(mmPerUnit - mmPerPx) <= 1e-12 * mmPerPx ? `${mm} (1 CSS px)` : mm;
}

/** An absolute root width/height in px, or null (missing, `auto`, %, ≤ 0 or bad). */
function absolutePx(attr: string | undefined, name: string, notes: string[]): number | null {
  if (attr === undefined) return null;
  const len = parseLength(attr);
  if (len === null) {
    if (attr.trim() !== 'auto') notes.push(`${name}="${attr}" is not a length, ignored`);
    return null;
  }
  if (len.unit === '%') return null;
  const px = len.value * (pxPerUnit(len.unit) as number);
  if (!(px > 0)) {
    notes.push(`${name}="${attr}" is not positive, ignored`);
    return null;
  }
  return px;
}

/**
 * The matrix from the root `<svg>` user units to millimetres.
 *
 * Decisions (REFERENCES.md §4 leaves them to us):
 * - width and height both absolute (unitless = px, S2 §8.3): viewport of that
 *   size, viewBox mapped by {@link viewBoxTransform}, then px → mm (CV3).
 * - only one of them absolute and a viewBox present: the other follows from
 *   the viewBox aspect ratio (common practice, the intrinsic ratio of the
 *   drawing); still physical.
 * - no viewBox and at least one absolute: 1 user unit = 1 px (S2 §8.3, V9);
 *   physical. A missing dimension takes the 300×150 default for percentages.
 * - neither absolute (missing, `auto`, %): no physical size. The viewBox (or,
 *   without one, the user space itself) is taken at `assumedMmPerUnit` mm per
 *   user unit with the origin at the viewBox corner, and a warning is returned.
 * - a viewBox with zero width or height: zero matrix (S2 §8.6: not rendered).
 * - preserveAspectRatio only matters with a viewBox (S2 §8.7).
 *
 * @param assumedMmPerUnit mm per user unit when no physical size is stated
 */
export function rootToMm(
  widthAttr: string | undefined, heightAttr: string | undefined,
  viewBoxAttr: string | undefined, parAttr: string | undefined, assumedMmPerUnit: number,
): RootFrame {
  const notes: string[] = [];
  let vb: ViewBox | null = null;
  if (viewBoxAttr !== undefined && skipWsp(viewBoxAttr, 0) < viewBoxAttr.length) {
    vb = parseViewBox(viewBoxAttr);
    if (vb === null) notes.push(`viewBox="${viewBoxAttr}" is invalid, ignored`);
  }
  const par = parsePreserveAspectRatio(parAttr);
  let w = absolutePx(widthAttr, 'width', notes);
  let h = absolutePx(heightAttr, 'height', notes);
  const warn = (): string | null => (notes.length ? notes.join('; ') : null);
  const pxToMm = matrix(mmPerPx, 0, 0, mmPerPx, 0, 0);

  if (vb !== null && (vb[2] === 0 || vb[3] === 0)) {
    notes.push('viewBox has zero width or height: nothing is rendered (SVG 2 §8.6)');
    return { matrix: matrix(0, 0, 0, 0, 0, 0), physical: w !== null || h !== null, viewportW: 0, viewportH: 0, pageMm: [0, 0], warning: warn() };
  }
  if (w === null && h === null) {
    const k = assumedMmPerUnit;
    notes.push(`no physical size stated (width/height missing, auto or %): assuming ${assumedSizeText(k)} per user unit ` +
      '(set it with --unitless-size, or the library option assumedMmPerUnit)');
    if (vb !== null) {
      return { matrix: matrix(k, 0, 0, k, -vb[0] * k, -vb[1] * k), physical: false, viewportW: vb[2], viewportH: vb[3], pageMm: [vb[2] * k, vb[3] * k], warning: warn() };
    }
    return { matrix: matrix(k, 0, 0, k, 0, 0), physical: false, viewportW: DEFAULT_W, viewportH: DEFAULT_H, pageMm: [DEFAULT_W * k, DEFAULT_H * k], warning: warn() };
  }
  if (vb === null) {
    const pw = w ?? DEFAULT_W, ph = h ?? DEFAULT_H;
    return { matrix: pxToMm, physical: true, viewportW: pw, viewportH: ph, pageMm: [pw * mmPerPx, ph * mmPerPx], warning: warn() };
  }
  if (w === null) w = (h as number) * (vb[2] / vb[3]);
  if (h === null) h = w * (vb[3] / vb[2]);
  const m = multiply(pxToMm, pxToMm, viewBoxTransform(vb, par, 0, 0, w, h));
  return { matrix: m, physical: true, viewportW: vb[2], viewportH: vb[3], pageMm: [w * mmPerPx, h * mmPerPx], warning: warn() };
}
