/**
 * Style resolution for the drawing model, behind one function so that a full
 * CSS cascade can replace it without touching its callers.
 *
 * For now: the element's own presentation attributes, overridden by its
 * `style` attribute declarations (CSS Style Attributes; SVG 2 §6.4: a style
 * declaration wins over a presentation attribute). Inherited values from
 * ancestors and style sheets are not seen yet.
 */
import type { Matrix } from '../svg/matrixTypes.js';
import { lengthToUser, viewportDiagonal } from '../svg/units.js';
import type { DrawingStyle } from './drawing.js';

/** The style attribute's `name: value` declarations (last wins), names lower case. */
function styleDeclarations(style: string | undefined): Map<string, string> {
  const out = new Map<string, string>();
  if (!style) return out;
  for (const part of style.split(';')) {
    const colon = part.indexOf(':');
    if (colon < 0) continue;
    const name = part.slice(0, colon).trim().toLowerCase();
    const value = part.slice(colon + 1).replace(/!important\s*$/i, '').trim();
    if (name && value) out.set(name, value);
  }
  return out;
}

/**
 * The drawing style of an element.
 * @param attrs attribute values by qualified name
 * @param toMm the element's user units → mm (for the stroke width)
 * @param viewportW nearest viewport width in user units (percent stroke widths)
 * @param viewportH nearest viewport height in user units
 */
export function resolveStyle(attrs: Readonly<Record<string, string>>, toMm: Matrix, viewportW: number, viewportH: number): DrawingStyle {
  const decl = styleDeclarations(attrs.style);
  const get = (name: string): string | null => decl.get(name) ?? attrs[name]?.trim() ?? null;
  const width = get('stroke-width');
  let strokeWidthMm: number | null = null;
  if (width !== null) {
    const user = lengthToUser(width, viewportDiagonal(viewportW, viewportH), NaN);
    // A length scales by the square root of the area scale where the matrix is not uniform (a mean, for reporting).
    if (Number.isFinite(user)) strokeWidthMm = user * Math.sqrt(Math.abs(toMm[0] * toMm[3] - toMm[1] * toMm[2]));
  }
  return { stroke: get('stroke'), fill: get('fill'), strokeWidthMm };
}
