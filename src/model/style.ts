/**
 * Style resolution for the drawing model, behind one function so that a full
 * CSS cascade can replace it without touching its callers.
 *
 * For now: presentation attributes overridden by `style` attribute
 * declarations (SVG 2 §6.7), on the element or inherited from its ancestors
 * (src/svg/presentation.ts). Style sheets are not seen yet.
 */
import type { Matrix } from '../svg/matrixTypes.js';
import { lengthToUser, viewportDiagonal } from '../svg/units.js';
import type { DrawingStyle } from './drawing.js';
import { declaredStyle } from '../svg/presentation.js';

/**
 * The drawing style of an element.
 * @param attrs attribute values by qualified name
 * @param inherited stroke, fill and stroke-width as the ancestors set them
 * @param toMm the element's user units → mm (for the stroke width)
 * @param viewportW nearest viewport width in user units (percent stroke widths)
 * @param viewportH nearest viewport height in user units
 */
export function resolveStyle(
  attrs: Readonly<Record<string, string>>, inherited: Readonly<Record<string, string>>, toMm: Matrix, viewportW: number, viewportH: number,
): DrawingStyle {
  const own = declaredStyle(attrs);
  const get = (name: string): string | null => own?.[name] ?? inherited[name] ?? null;
  const width = get('stroke-width');
  let strokeWidthMm: number | null = null;
  if (width !== null) {
    const user = lengthToUser(width, viewportDiagonal(viewportW, viewportH), NaN);
    // A length scales by the square root of the area scale where the matrix is not uniform (a mean, for reporting).
    if (Number.isFinite(user)) strokeWidthMm = user * Math.sqrt(Math.abs(toMm[0] * toMm[3] - toMm[1] * toMm[2]));
  }
  return { stroke: get('stroke'), fill: get('fill'), strokeWidthMm };
}
