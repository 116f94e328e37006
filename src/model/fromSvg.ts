/**
 * From a read SVG element to the drawing model: its geometry parsed, flattened
 * into contours in mm within the budget's share, its style and group.
 */
import type { GeometryElement } from '../svg/document.js';
import { parsePathData } from '../svg/pathData.js';
import { shapeToPath } from '../svg/shapes.js';
import { applyX, applyY, invert, multiply } from '../svg/matrix.js';
import { OP_A, OP_ARGS, OP_C, OP_M, OP_Q, OP_Z, type ParsedPath, type PathData } from '../svg/pathTypes.js';
import { flattenPath } from '../geom/flatten.js';
import { splitTolerance } from '../budget.js';
import { elementTag } from '../report/table.js';
import type { OutcomeReason } from '../report/types.js';
import type { DrawingContour, DrawingCopy, DrawingElement } from './drawing.js';
import { resolveStyle } from './style.js';

/** Parse an element's geometry as path data (shapes through their equivalent path); problems go to `warnings`. */
export function readGeometry(el: GeometryElement, warnings: string[]): ParsedPath | null {
  if (el.name === 'path') {
    const p = parsePathData(el.attrs.d ?? '');
    if (p.error) warnings.push(`${elementTag(el)}: path data error at offset ${p.error.offset}: ${p.error.message}; the part before it is kept`);
    return p;
  }
  const s = shapeToPath(el.name, (a) => el.attrs[a], el.viewportW, el.viewportH);
  if (s.error) warnings.push(`${elementTag(el)}: ${s.error}`);
  return s.path;
}

/** True when the path data has Bézier or elliptical arc segments. */
export function hasCurves(p: PathData): boolean {
  for (let i = 0; i < p.ops.length; i++) if (p.ops[i] === OP_C || p.ops[i] === OP_Q || p.ops[i] === OP_A) return true;
  return false;
}

/** Start points of subpaths that draw something but never leave their start point (user units, flat x,y). */
export function pointSubpaths(p: PathData): number[] {
  const out: number[] = [];
  let sx = 0, sy = 0, draws = false, still = true, open = false;
  const finish = (): void => {
    if (open && draws && still) out.push(sx, sy);
  };
  let j = 0;
  for (let i = 0; i < p.ops.length; i++) {
    const op = p.ops[i], n = OP_ARGS[op];
    if (op === OP_M) {
      finish();
      sx = p.args[j];
      sy = p.args[j + 1];
      draws = false;
      still = true;
      open = true;
    } else {
      draws = true;
      // Every point the segment names (control points too; an arc's radii and flags are not points).
      const first = op === OP_A ? 5 : 0;
      for (let k = first; k + 1 < n; k += 2) if (p.args[j + k] !== sx || p.args[j + k + 1] !== sy) still = false;
    }
    j += n;
  }
  finish();
  return out;
}

/** The element's copies as maps from its contours in mm to the copy's, with each copy's style. */
function copiesOf(el: GeometryElement): DrawingCopy[] {
  if (el.copies.length === 0) return [];
  const back = invert(new Float64Array(6), el.toMm);
  if (back === null) return [];
  return el.copies.map((c) => ({ map: multiply(new Float64Array(6), c.toMm, back), style: resolveStyle(el, c.style) }));
}

/** Pieces a subpath draws: every segment, and a Z when it draws a closing line (its current point is not the start). */
export function drawnPieces(p: PathData): number {
  let n = 0, j = 0, sx = 0, sy = 0, cx = 0, cy = 0;
  for (let i = 0; i < p.ops.length; i++) {
    const op = p.ops[i], k = OP_ARGS[op];
    if (op === OP_M) {
      sx = cx = p.args[j];
      sy = cy = p.args[j + 1];
    } else if (op === OP_Z) {
      if (cx !== sx || cy !== sy) n++;
      cx = sx;
      cy = sy;
    } else {
      n++;
      cx = p.args[j + k - 2];
      cy = p.args[j + k - 1];
    }
    j += k;
  }
  return n;
}

/**
 * Flatten path data one subpath (moveto to moveto) at a time, so each contour knows the subpath it came
 * from (DrawingContour.source); a stretch that makes more than one contour (drawing on after a Z without a
 * moveto) has no source.
 */
function flattenWithSources(p: PathData, toMm: Float64Array, maxError: number): DrawingContour[] {
  const out: DrawingContour[] = [];
  let i0 = 0, j0 = 0, j = 0;
  const flush = (i1: number): void => {
    if (i1 <= i0) return;
    const path: PathData = { ops: p.ops.subarray(i0, i1), args: p.args.subarray(j0, j) };
    const cs: DrawingContour[] = flattenPath(path, toMm, maxError);
    if (cs.length === 1 && path.ops[0] === OP_M) cs[0].source = { path, pieces: drawnPieces(path) };
    out.push(...cs);
  };
  for (let i = 0; i < p.ops.length; i++) {
    if (p.ops[i] === OP_M && i > i0) {
      flush(i);
      i0 = i;
      j0 = j;
    }
    j += OP_ARGS[p.ops[i]];
  }
  flush(p.ops.length);
  return out;
}

/** Why an element cannot enter the model: a reason code and a message for people. */
export interface NotModelled {
  reason: OutcomeReason;
  message: string;
}

/**
 * Build the drawing-model element of an SVG element.
 * @param p its parsed geometry (readGeometry)
 * @param tolMm its tolerance in mm (the file's over its copies' enlargement)
 * @param writtenMmPerUnit mm per user unit of the coordinates it will be written in (budget for rounding)
 * @param digits fixed decimals, or null to derive them from the budget
 */
export function drawingElementFromSvg(
  el: GeometryElement, p: ParsedPath, tolMm: number, writtenMmPerUnit: number, digits: number | null,
): DrawingElement | NotModelled {
  const curved = hasCurves(p);
  const budget = splitTolerance(tolMm, { curved, mmPerUnit: writtenMmPerUnit, digits });
  if (!budget.fits) return { reason: 'too-few-digits', message: `too few decimals (${budget.digits}) for the tolerance` };
  let contours: DrawingContour[];
  try {
    contours = flattenWithSources(p, el.toMm, curved ? budget.flattenMm : tolMm);
  } catch (e) {
    return { reason: 'cannot-flatten', message: `cannot flatten: ${(e as Error).message}` };
  }
  const pts = pointSubpaths(p);
  const points = new Float64Array(pts.length);
  for (let i = 0; i < pts.length; i += 2) {
    points[i] = applyX(el.toMm, pts[i], pts[i + 1]);
    points[i + 1] = applyY(el.toMm, pts[i], pts[i + 1]);
  }
  return {
    index: el.index, id: el.id, name: el.name, group: el.group,
    style: resolveStyle(el),
    inPlace: !el.drawnByUse,
    copies: copiesOf(el),
    contours, points, curved, toleranceMm: tolMm, budget,
  };
}
