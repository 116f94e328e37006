/**
 * Style resolution for the drawing model, behind one function: the reader's
 * computed style (the CSS cascade of src/svg/style/: presentation
 * attributes, `<style>` sheets, the `style` attribute, `!important`,
 * inheritance) as the model carries it.
 */
import type { GeometryElement } from '../svg/documentTypes.js';
import type { ElementStyle } from '../svg/style/elementStyle.js';
import type { DrawingStyle } from './drawing.js';
import { signedArea } from '../geom/area.js';

/**
 * The drawing style of an element where it stands (or of one of its copies, given that copy's computed style).
 * @param el the read element
 * @param style a computed style to use instead of the element's own (a copy's: `el.copies[k].style`)
 */
export function resolveStyle(el: GeometryElement, style: ElementStyle = el.style): DrawingStyle {
  return { stroke: style.stroke, fill: style.fill, strokeWidthMm: style.strokeWidthMm, fillRule: style.fillRule };
}

/** Below this enclosed area (mm²) a contour paints no fill: a nanometre square, far under any tolerance. */
const NO_AREA_MM2 = 1e-9;

/**
 * Whether an element's fill paints anything: its fill is not `none` and some contour encloses area. The fill
 * closes an open subpath implicitly (SVG 2 §13.3), so a single segment (a `<line>`, or `M a L b`) or a run of
 * collinear points paints none whatever its fill: such geometry is stroke only to the path plan.
 * @param fill the computed fill
 * @param contours the element's contours in mm
 */
export function paintsFill(fill: string, contours: readonly { xy: Float64Array }[]): boolean {
  if (fill === 'none') return false;
  // The subpath closed back to its start, as the fill closes it.
  for (const c of contours) if (Math.abs(signedArea(c.xy)) > NO_AREA_MM2) return true;
  return false;
}
