/**
 * The cascade as SVG 2 applies it (SVG 2 §6.2–6.4, CSS Cascade 4 §6–7), for
 * the properties in ./properties.ts. Lowest to highest:
 *   1. presentation attributes (author origin, specificity 0, before every rule);
 *   2. sheet rules, by specificity, then order (./selectors.ts, ./sheet.ts);
 *   3. the `style` attribute;
 *   4. `!important` sheet declarations (by specificity, then order), then
 *      `!important` in the `style` attribute.
 * Then each property not set inherits (if it is inherited) or takes its
 * initial value; `inherit`, `initial` and `unset` do as CSS says.
 *
 * A style with nothing declared on the element is shared: every such child
 * of one parent gets the same object, so a deep file of bare groups
 * allocates nothing here.
 */
import { PROPERTIES, PROP_NAMES, wideKeyword, type PropName } from './properties.js';
import type { Decl } from './sheet.js';

/** Computed values (normalised text, see ./properties.ts) of one element. */
export type ComputedValues = Readonly<Record<PropName, string>>;

/** An element's computed style, and whether its `transform` came from CSS (else the attribute's syntax applies). */
export interface Computed {
  values: ComputedValues;
  transformIsCss: boolean;
  /** The style of a child that declares nothing (created on first use). */
  bare?: Computed;
}

const INITIAL: ComputedValues = Object.freeze(
  Object.fromEntries(PROP_NAMES.map((p) => [p, PROPERTIES[p].initial])) as Record<PropName, string>,
);

/** The root's parent: every property at its initial value. */
export const ROOT_PARENT: Computed = Object.freeze({ values: INITIAL, transformIsCss: false }) as Computed;

function bareChild(parent: Computed): Computed {
  if (parent.bare !== undefined) return parent.bare;
  const v = { ...parent.values };
  for (const p of PROP_NAMES) if (!PROPERTIES[p].inherited) v[p] = INITIAL[p];
  const c: Computed = { values: v, transformIsCss: false };
  if (!Object.isFrozen(parent)) parent.bare = c;
  return c;
}

type Winner = { value: string; css: boolean };

/**
 * Check a declared value: a CSS-wide keyword, or a valid value (normalised).
 * @param checkCssTransform validates a CSS transform value (its grammar needs the viewport; see ./cssTransform.ts)
 */
function accept(d: Decl, css: boolean, checkCssTransform: (v: string) => boolean): Winner | null {
  const wide = wideKeyword(d.value);
  if (wide !== null) return { value: wide, css };
  if (d.prop === 'transform') {
    // The attribute's own errors are reported where the matrix is built (src/svg/document.ts).
    if (css && !checkCssTransform(d.value)) return null;
    return { value: d.value.trim(), css };
  }
  const key = `${d.prop}:${d.value}`;
  let v = parsed.get(key);
  if (v === undefined) {
    v = PROPERTIES[d.prop].parse(d.value);
    if (parsed.size >= PARSED_MAX) parsed.clear();
    parsed.set(key, v);
  }
  return v === null ? null : { value: v, css };
}

/** Checked values by "property:text": a drawing repeats a few paints many times. */
const parsed = new Map<string, string | null>();
const PARSED_MAX = 4096;

/**
 * The computed style of one element.
 * @param parent the parent's computed style (ROOT_PARENT for the root)
 * @param attrs the element's attributes (presentation attributes are read from them)
 * @param sheet matched sheet declarations, already in cascade order (./match.ts), or undefined
 * @param inline the `style` attribute's declarations, or null
 * @param checkCssTransform see {@link accept}
 */
export function computeStyle(
  parent: Computed, attrs: Record<string, string>, sheet: readonly Decl[] | undefined, inline: readonly Decl[] | null,
  checkCssTransform: (v: string) => boolean,
): Computed {
  let won: Partial<Record<PropName, Winner>> | null = null;
  for (const p of PROP_NAMES) {
    const a = attrs[p];
    if (a === undefined) continue;
    const w = accept({ prop: p, value: a, important: false }, false, checkCssTransform);
    if (w !== null) (won ??= {})[p] = w;
  }
  const apply = (list: readonly Decl[] | null | undefined, important: boolean): void => {
    if (!list) return;
    for (const d of list) {
      if (d.important !== important) continue;
      const w = accept(d, true, checkCssTransform);
      if (w !== null) (won ??= {})[d.prop] = w;
    }
  };
  apply(sheet, false);
  apply(inline, false);
  apply(sheet, true);
  apply(inline, true);
  if (won === null) return bareChild(parent);
  const v = {} as Record<PropName, string>;
  let transformIsCss = false;
  for (const p of PROP_NAMES) {
    const def = PROPERTIES[p];
    const w: Winner | undefined = won[p];
    let kw = w === undefined ? 'unset' : w.value;
    if (kw === 'unset') kw = def.inherited ? 'inherit' : 'initial';
    if (kw === 'inherit') v[p] = parent.values[p];
    else if (kw === 'initial') v[p] = INITIAL[p];
    else {
      v[p] = kw;
      if (p === 'transform') transformIsCss = w!.css;
    }
  }
  if (v.transform === 'none') transformIsCss = false;
  if (won.transform?.value === 'inherit') transformIsCss = parent.transformIsCss;
  return { values: v, transformIsCss };
}

/** A paint's used value: `currentcolor` → the element's colour. */
export function usedPaint(paint: string, color: string): string {
  return paint === 'currentcolor' ? color : paint;
}
