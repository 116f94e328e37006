/**
 * The CSS properties arcspline computes, with their initial value, whether
 * they inherit, and how a specified value is checked and normalised (values
 * from SVG 2 ch. 13 "Painting" and §8.5 "The transform property", CSS
 * Display 3, CSS Transforms 1; the tables there say which inherit).
 *
 * Values are kept as normalised text: a paint is `none`, `#rrggbb` (or
 * `#rrggbbaa`), `currentcolor` until computed, or a `url(#id)` reference; a
 * keyword is lower-case. An invalid value gives null: the declaration is
 * ignored (CSS Syntax 3 §8; SVG 2 §6.7 for presentation attributes).
 * `transform` is checked where its syntax is known (src/svg/style/cssTransform.ts
 * for CSS, src/svg/transform.ts for the attribute).
 */
import { normaliseColour } from './colour.js';
import { parseLength } from '../units.js';

/** The properties computed for every element. */
export type PropName =
  | 'display' | 'visibility' | 'fill' | 'stroke' | 'stroke-width' | 'fill-rule' | 'transform' | 'transform-origin'
  | 'vector-effect' | 'color' | 'overflow';

interface PropDef {
  inherited: boolean;
  initial: string;
  /** Normalised value, or null when invalid. */
  parse: (v: string) => string | null;
}

const keyword = (allowed: readonly string[]) => (v: string): string | null => {
  const k = v.trim().toLowerCase();
  return allowed.includes(k) ? k : null;
};

/** CSS Display 3 §2: the keywords `display` takes (only `none` changes what arcspline does). */
const DISPLAY = [
  'inline', 'block', 'list-item', 'inline-block', 'table', 'inline-table', 'table-row-group', 'table-header-group',
  'table-footer-group', 'table-row', 'table-column-group', 'table-column', 'table-cell', 'table-caption', 'none',
  'flex', 'inline-flex', 'grid', 'inline-grid', 'contents', 'run-in', 'flow', 'flow-root',
];

/** SVG 2 §13.2: `<paint>` = none | <color> | <url> [none | <color>]? | context-fill | context-stroke. */
function parsePaint(v: string): string | null {
  const t = v.trim();
  const k = t.toLowerCase();
  if (k === 'none' || k === 'context-fill' || k === 'context-stroke' || k === 'currentcolor') return k;
  if (k.startsWith('url(')) {
    const close = t.indexOf(')');
    if (close < 0) return null;
    const ref = t.slice(4, close).trim().replace(/^(['"])(.*)\1$/, '$2');
    const rest = t.slice(close + 1).trim();
    const fallback = rest === '' ? '' : parsePaint(rest);
    if (fallback === null || fallback.startsWith('url(')) return null;
    return `url(${ref})${fallback ? ` ${fallback}` : ''}`;
  }
  return normaliseColour(t);
}

/** `<length-percentage> | <number>`, not negative (SVG 2 §13.5.2 stroke-width); kept as written, lower-case unit. */
function parseStrokeWidth(v: string): string | null {
  const len = parseLength(v);
  if (len === null || !(len.value >= 0)) return null;
  return `${len.value}${len.unit}`;
}

/** The property table. */
export const PROPERTIES: Readonly<Record<PropName, PropDef>> = Object.freeze({
  display: { inherited: false, initial: 'inline', parse: keyword(DISPLAY) },
  visibility: { inherited: true, initial: 'visible', parse: keyword(['visible', 'hidden', 'collapse']) },
  fill: { inherited: true, initial: '#000000', parse: parsePaint },
  stroke: { inherited: true, initial: 'none', parse: parsePaint },
  'stroke-width': { inherited: true, initial: '1', parse: parseStrokeWidth },
  'fill-rule': { inherited: true, initial: 'nonzero', parse: keyword(['nonzero', 'evenodd']) },
  // Checked by the caller, who knows which syntax applies (attribute or CSS).
  transform: { inherited: false, initial: 'none', parse: (v: string) => (v.trim() === '' ? null : v.trim()) },
  // CT1 §8.1: initial 0 0 for SVG elements; checked where the viewport is known (./cssTransform.ts).
  'transform-origin': { inherited: false, initial: '0 0', parse: (v: string) => (v.trim() === '' ? null : v.trim()) },
  'vector-effect': { inherited: false, initial: 'none', parse: keyword(['none', 'non-scaling-stroke', 'non-scaling-size', 'non-rotation', 'fixed-position']) },
  // Only elements that make a viewport use it, and SVG 2's user-agent sheet (§16.1) makes all of those but the root hidden.
  overflow: { inherited: false, initial: 'hidden', parse: keyword(['visible', 'hidden', 'scroll', 'auto', 'clip']) },
  color: { inherited: true, initial: '#000000', parse: (v: string) => normaliseColour(v) },
});

/** Property names, in a fixed order (the index of a property in a computed style). */
export const PROP_NAMES = Object.keys(PROPERTIES) as PropName[];

/** Whether `name` is one of the computed properties. */
export function isProp(name: string): name is PropName {
  return Object.prototype.hasOwnProperty.call(PROPERTIES, name);
}

/** CSS Cascade 4 §7.3: the keywords every property takes. */
export type WideKeyword = 'inherit' | 'initial' | 'unset';

/** The CSS-wide keyword `v` names (revert counts as unset: there is no user-agent or user origin here), or null. */
export function wideKeyword(v: string): WideKeyword | null {
  const k = v.trim().toLowerCase();
  if (k === 'inherit' || k === 'initial' || k === 'unset') return k;
  if (k === 'revert' || k === 'revert-layer') return 'unset';
  return null;
}
