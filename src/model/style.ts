/**
 * Style resolution for the drawing model, behind one function: the reader's
 * computed style (the CSS cascade of src/svg/style/: presentation
 * attributes, `<style>` sheets, the `style` attribute, `!important`,
 * inheritance) as the model carries it.
 */
import type { GeometryElement } from '../svg/documentTypes.js';
import type { ElementStyle } from '../svg/style/elementStyle.js';
import type { DrawingStyle } from './drawing.js';

/**
 * The drawing style of an element where it stands (or of one of its copies, given that copy's computed style).
 * @param el the read element
 * @param style a computed style to use instead of the element's own (a copy's: `el.copies[k].style`)
 */
export function resolveStyle(el: GeometryElement, style: ElementStyle = el.style): DrawingStyle {
  return { stroke: style.stroke, fill: style.fill, strokeWidthMm: style.strokeWidthMm, fillRule: style.fillRule };
}
