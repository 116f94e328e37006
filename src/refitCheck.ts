/**
 * The written document read again, for what measuring each element's path
 * data alone cannot see: how the document styles and places the rewritten
 * element. Style sheet rules match by element name, so a `<polyline>` written
 * as a `<path>` can gain or lose a rule (a `transform`, a `display`, a
 * stroke); and a baked transform written as an attribute loses to a CSS
 * `transform` on the element. Each rewritten element must come back drawn,
 * with the same paint, through the matrix its path data was written for.
 */
import { readSvg, type SvgDocument } from './svg/document.js';
import type { Matrix } from './svg/matrixTypes.js';
import type { Options } from './options.js';

/** Whether two matrices agree to rounding (relative to their largest entry). */
function sameMatrix(a: Matrix, b: Matrix): boolean {
  let scale = 0;
  for (let i = 0; i < 6; i++) scale = Math.max(scale, Math.abs(a[i]), Math.abs(b[i]));
  const eps = 1e-9 * scale + 1e-12;
  for (let i = 0; i < 6; i++) if (!(Math.abs(a[i] - b[i]) <= eps)) return false;
  return true;
}

/** Whether the written document must be read again: style sheets apply, or transforms were baked. */
export function needsRecheck(doc: SvgDocument, opts: Options): boolean {
  return doc.styleSheets === true || opts.bakeTransforms;
}

/**
 * The rewritten elements the written document styles or places otherwise than the fit assumed.
 * @param out the written document
 * @param doc the document as read
 * @param rewritten document indices of the rewritten elements
 * @returns their indices whose rewrite must be put back; all of them when the written document cannot be
 *   paired element for element with the original
 */
export function restyledElements(out: string, doc: SvgDocument, rewritten: readonly number[], opts: Options): Set<number> {
  const bad = new Set<number>();
  if (rewritten.length === 0) return bad;
  let again: SvgDocument;
  try {
    again = readSvg(out, { assumedMmPerUnit: opts.assumedMmPerUnit, maxInputChars: Math.max(opts.maxInputBytes, out.length) });
  } catch {
    for (const i of rewritten) bad.add(i);
    return bad;
  }
  const before = new Map(doc.elements.map((e) => [e.index, e]));
  const after = new Map(again.elements.map((e) => [e.index, e]));
  for (const i of rewritten) {
    const a = before.get(i), b = after.get(i);
    // The path data was written for the element's own frame, or the root's when baking.
    const expected = opts.bakeTransforms ? doc.rootToMm : a?.toMm;
    if (!a || !b || !expected || !b.rewritable || b.name !== 'path' ||
      b.style.stroke !== a.style.stroke || b.style.fill !== a.style.fill || !sameMatrix(b.toMm, expected)) bad.add(i);
  }
  return bad;
}
