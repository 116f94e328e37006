/**
 * A whole SVG document as a drawing model, for writers other than the SVG
 * one (G-code, DXF, a path plan): every element drawn where it stands, exact
 * shapes included, its contours in mm; elements that cannot be modelled are
 * listed with their reason.
 */
import { resolveOptions, type ArcsplineOptions } from '../options.js';
import { readSvg } from '../svg/document.js';
import type { OutcomeReason } from '../report/types.js';
import type { DrawingElement, FittedElement } from './drawing.js';
import { drawingElementFromSvg, readGeometry } from './fromSvg.js';
import { fitElement } from './fit.js';

/** An element left out of the model, with why. */
export interface SkippedElement {
  index: number;
  id: string | null;
  name: string;
  reason: OutcomeReason;
  message: string;
}

/** A document as the model sees it. */
export interface Drawing {
  /** Elements with geometry, in document order. */
  elements: DrawingElement[];
  skipped: SkippedElement[];
  /** The reader's warnings and each element's geometry warnings. */
  warnings: string[];
}

/**
 * Read an SVG document into the drawing model.
 * @param text the whole document
 * @param options as for refitSvg (tolerance, cornerAngle, assumedMmPerUnit, digits, maxInputBytes are used)
 * @param writtenMmPerUnit mm per unit of the coordinates the caller will write (1 for a writer in mm); sets the rounding budget
 * @throws SvgInputError for input that is not a readable SVG document; OptionError for a bad option
 */
export function readDrawing(text: string, options: ArcsplineOptions = {}, writtenMmPerUnit = 1): Drawing {
  const opts = resolveOptions(options);
  const doc = readSvg(text, { assumedMmPerUnit: opts.assumedMmPerUnit, maxInputChars: opts.maxInputBytes });
  const out: Drawing = { elements: [], skipped: [], warnings: doc.warnings.slice() };
  for (const el of doc.elements) {
    const ref = { index: el.index, id: el.id, name: el.name };
    if (!el.rewritable) {
      out.skipped.push({ ...ref, reason: 'not-drawn', message: el.reason ?? 'not rewritable' });
      continue;
    }
    const p = readGeometry(el, out.warnings);
    if (!p || p.ops.length === 0) continue;
    const m = drawingElementFromSvg(el, p, opts.tolerance / Math.max(1, el.copyScale), writtenMmPerUnit, opts.digits);
    if ('contours' in m) out.elements.push(m);
    else out.skipped.push({ ...ref, reason: m.reason, message: m.message });
  }
  return out;
}

/** Fit every element of a drawing (turns sharper than `cornerAngle` degrees stay corners). */
export function fitDrawing(d: Drawing, cornerAngle: number): FittedElement[] {
  return d.elements.map((el) => fitElement(el, cornerAngle));
}
