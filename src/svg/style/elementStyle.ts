/**
 * The computed style a geometry element carries out of the reader: what it
 * is painted with, for the drawing model, the path plan, the machine writers
 * and the report (colours as `#rrggbb`, ./colour.ts).
 */
import type { Matrix } from '../matrixTypes.js';
import { determinant } from '../matrix.js';
import { parseLength, pxPerUnit, viewportDiagonal } from '../units.js';
import { usedPaint, type Computed } from './cascade.js';

/** Computed style of one geometry element (SVG 2 ch. 13; values normalised as in src/svg/style/properties.ts). */
export interface ElementStyle {
  /** `none`, `#rrggbb`, `#rrggbbaa` (alpha below 1), `url(#id)` with an optional fallback, `context-fill` or `context-stroke`. */
  fill: string;
  /** As `fill`. */
  stroke: string;
  /** Stroke width in the element's user units. */
  strokeWidth: number;
  /** Stroke width in mm on the machine (user units × √|det| of the element's map to mm, or of the root's with non-scaling-stroke). */
  strokeWidthMm: number;
  fillRule: 'nonzero' | 'evenodd';
  /** `visible`, `hidden` or `collapse`. */
  visibility: string;
  /** `none`, `non-scaling-stroke`, … (SVG 2 §13.8). */
  vectorEffect: string;
}

/**
 * The element style from a computed style.
 * @param toMm element user units → mm; @param rootToMm root user units → mm
 * @param vpW, vpH nearest viewport, user units (percentages of stroke-width)
 */
export function elementStyle(c: Computed, toMm: Matrix, rootToMm: Matrix, vpW: number, vpH: number): ElementStyle {
  const v = c.values;
  const len = parseLength(v['stroke-width']);
  let sw = 1;
  if (len !== null) sw = len.unit === '%' ? (len.value / 100) * viewportDiagonal(vpW, vpH) : len.value * (pxPerUnit(len.unit) ?? 1);
  const frame = v['vector-effect'] === 'non-scaling-stroke' ? rootToMm : toMm;
  return {
    fill: usedPaint(v.fill, v.color),
    stroke: usedPaint(v.stroke, v.color),
    strokeWidth: sw,
    strokeWidthMm: sw * Math.sqrt(Math.abs(determinant(frame))),
    fillRule: v['fill-rule'] === 'evenodd' ? 'evenodd' : 'nonzero',
    visibility: v.visibility,
    vectorEffect: v['vector-effect'],
  };
}
