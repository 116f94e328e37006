/**
 * The mark a rewritten element carries: `data-arcspline-tolerance="0.1"`, the
 * most (in mm on the machine) its geometry may now be from the geometry it had
 * before arcspline first rewrote it. A later run reads it back: within the
 * same or a smaller tolerance the element is kept as written (a second run
 * changes nothing, so a nightly in-place job cannot walk the geometry away);
 * within a larger one it is refitted within the difference only, and the mark
 * becomes the new tolerance, so the distance to the first original stays
 * within what the user asked for (Hausdorff distance obeys the triangle
 * inequality).
 *
 * `data-*` attributes are valid on every SVG 2 element (SVG 2 §1.9, custom
 * data attributes) and are ignored by renderers; editors keep them.
 */

/** The attribute's name. */
export const MARK_ATTR = 'data-arcspline-tolerance';

/**
 * The tolerance a previous run recorded on an element, mm; null when it carries no readable mark.
 * @param attrs the element's attributes by qualified name
 */
export function readMark(attrs: Readonly<Record<string, string>>): number | null {
  const v = attrs[MARK_ATTR];
  if (v === undefined) return null;
  const n = Number(v.trim());
  return v.trim() !== '' && Number.isFinite(n) && n > 0 ? n : null;
}

/** The mark's text for a tolerance in mm: six significant digits, rounded up so it never understates. */
export function formatMark(tolMm: number): string {
  const p = 10 ** (5 - Math.floor(Math.log10(tolMm)));
  return String(Math.ceil(tolMm * p - 1e-9) / p);
}
