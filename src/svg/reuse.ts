/**
 * After the reader's pass: which geometry a `<use>` draws, how much larger
 * (the copy factor that divides its tolerance) and where every copy is, with
 * its style there (./copies.ts has the geometry of copies). Geometry in defs
 * or a symbol that a drawn use draws becomes rewritable; one whose copies
 * cannot be bounded is left as written, with the reason.
 */
import type { Matrix } from './matrixTypes.js';
import { determinant, multiply } from './matrix.js';
import { CopyRecorder, MAX_CHAIN } from './copies.js';
import type { ElementCopy, GeometryElement } from './documentTypes.js';
import { ROOT_PARENT, type Computed } from './style/cascade.js';
import { elementStyle } from './style/elementStyle.js';

/** The copies of an element that has none (shared, frozen). */
export const NO_COPIES: ElementCopy[] = Object.freeze([]) as unknown as ElementCopy[];

/** What restyling a copy needs from the reader. */
export interface Restyler {
  /** Parent document index of every element (−1 for the root). */
  parent: ArrayLike<number>;
  /** Computed style of each `<use>` element, by document index. */
  useStyle: ReadonlyMap<number, Computed>;
  /** The cascade for the element at `pos` under the given parent style. */
  restyle: (pos: number, parent: Computed) => Computed;
}

function invertible(m: Matrix): boolean {
  const d = determinant(m);
  return d !== 0 && Number.isFinite(d);
}

/**
 * Set `copyScale`, `drawnByUse`, `copies` (and `rewritable`/`reason` where
 * reuse changes them) on every element.
 * @param rootToMm root user units → mm
 * @returns a warning when not every copy could be listed (the copy factor still bounds them all), else null
 */
export function placeCopies(elements: GeometryElement[], copies: CopyRecorder, r: Restyler, rootToMm: Matrix): string | null {
  const positions = elements.map((e) => e.index);
  const scales = copies.scales(positions, rootToMm);
  const drawn = copies.drawnByUse(positions);
  elements.forEach((e, i) => {
    // Geometry in defs or a symbol that a drawn <use> draws is refitted (its copies bound its tolerance below).
    if (!e.rewritable && drawn[i] && Number.isFinite(scales[i]) && invertible(e.toMm)) {
      e.rewritable = true;
      e.reason = null;
      e.drawnByUse = true;
    }
    e.copyScale = scales[i];
    if (!Number.isFinite(scales[i]) && e.rewritable) {
      e.rewritable = false;
      e.reason = `drawn again by <use> at a scale that cannot be bounded (a cycle of uses, a chain of more than ${MAX_CHAIN}, or a singular copy)`;
    }
  });
  const { places: placed, truncated } = copies.copiesOf(positions, MAX_COPIES_EACH, MAX_COPIES);
  const copyStyle = (pos: number, target: number, use: number): Computed => {
    const chain: number[] = [];
    for (let a = pos; a >= 0; a = r.parent[a]) {
      chain.push(a);
      if (a === target) break;
    }
    let c = r.useStyle.get(use) ?? ROOT_PARENT;
    for (let k = chain.length - 1; k >= 0; k--) c = r.restyle(chain[k], c);
    return c;
  };
  elements.forEach((e, i) => {
    if (placed[i].length === 0) return;
    e.copies = placed[i].map((p) => {
      const ctm = multiply(new Float64Array(6), p.map, e.ctm);
      const toMm = multiply(new Float64Array(6), rootToMm, ctm);
      const style = elementStyle(copyStyle(e.index, p.target, p.use), toMm, rootToMm, e.viewportW, e.viewportH);
      return { ctm, toMm, style, use: p.use, clips: p.clips };
    });
  });
  return truncated
    ? `uses draw more copies than are listed (at most ${MAX_COPIES_EACH} per element, ${MAX_COPIES} in all): the rest are kept within the tolerance by the copy factor but not measured one by one`
    : null;
}

/** Copies listed per element, and over the document (uses nested to multiply copies are hostile input). */
const MAX_COPIES_EACH = 4096;
const MAX_COPIES = 100_000;

/**
 * Every place an element is drawn, as its map to mm: where it stands (unless
 * only a use draws it), then each copy in the order of `copies`.
 */
export function drawnPlaces(el: GeometryElement): Matrix[] {
  const out = el.drawnByUse ? [] : [el.toMm];
  for (const c of el.copies) out.push(c.toMm);
  return out;
}
