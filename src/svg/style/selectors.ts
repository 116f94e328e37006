/**
 * Selectors: parsed by css-what and matched by css-select (both npm) through
 * a small adapter over the reader's element table: a node is a one-field
 * handle `{ i }` (document index; an object so that css-select can cache
 * descendant results in its WeakMap, which keeps `a b` linear on deep
 * nesting), and its links are the parent array the reader records anyway
 * plus child lists built once: no DOM is built.
 *
 * Specificity follows Selectors 4 §17: (ids, classes + attributes +
 * pseudo-classes, types + pseudo-elements); `:is()`, `:not()` and `:has()`
 * count their most specific argument, `:where()` nothing. It is packed as
 * a·2¹⁶ + b·2⁸ + c, each part capped at 255.
 */
import { parse as parseSelector, type Selector } from 'css-what';
import { compile, type Options } from 'css-select';
import { SvgInputError } from '../errors.js';
import type { StyleLimits } from './sheet.js';

/** One selector of a rule's list. */
export interface ParsedSelector {
  tokens: Selector[];
  /** Packed specificity (module header). */
  specificity: number;
}

/** The reader's elements, as the matcher sees them (document order). */
export interface ElementTable {
  /** Parent's document index, −1 for the root. */
  parent: ArrayLike<number>;
  /** Local name (prefix removed). */
  name: readonly string[];
  /** Attributes by qualified name, as the XML parser gave them. */
  attrs: readonly Record<string, string>[];
}

type Spec = [number, number, number];
/** css-select's adapter type (not exported by name). */
type Adapter<N, E extends N> = NonNullable<Options<N, E>['adapter']>;

function specOf(tokens: readonly Selector[]): Spec {
  const s: Spec = [0, 0, 0];
  for (const t of tokens) {
    switch (t.type) {
      case 'tag':
        s[2]++;
        break;
      case 'pseudo-element':
        s[2]++;
        break;
      case 'attribute':
        // css-what marks the `#x` shorthand with ignoreCase 'quirks'; `[id=x]` is an attribute selector.
        if (t.name === 'id' && t.action === 'equals' && t.ignoreCase === 'quirks') s[0]++;
        else s[1]++;
        break;
      case 'pseudo': {
        if (t.name === 'where') break;
        if ((t.name === 'is' || t.name === 'not' || t.name === 'has' || t.name === 'matches') && Array.isArray(t.data)) {
          let best: Spec = [0, 0, 0];
          for (const arg of t.data) {
            const a = specOf(arg);
            if (a[0] > best[0] || (a[0] === best[0] && (a[1] > best[1] || (a[1] === best[1] && a[2] > best[2])))) best = a;
          }
          s[0] += best[0];
          s[1] += best[1];
          s[2] += best[2];
        } else {
          s[1]++;
        }
        break;
      }
      default:
        break;
    }
  }
  return s;
}

/** Simple selectors and combinators in `tokens`, nested arguments included. */
function partsOf(tokens: readonly Selector[]): number {
  let n = 0;
  for (const t of tokens) {
    n++;
    if (t.type === 'pseudo' && Array.isArray(t.data)) for (const arg of t.data) n += partsOf(arg);
  }
  return n;
}

function hasPseudoElement(tokens: readonly Selector[]): boolean {
  return tokens.some((t) => t.type === 'pseudo-element');
}

/**
 * A rule's selector list, or null when css-what cannot parse it (CSS: an
 * invalid selector drops the whole rule). Selectors with a pseudo-element
 * style generated boxes, not the element: they are left out.
 * @throws SvgInputError when the list or one selector exceeds the caps
 */
export function parseSelectorList(text: string, limits: StyleLimits): ParsedSelector[] | null {
  if (text.length > limits.maxSelectorParts * 64) {
    throw new SvgInputError(`style sheet selector too long: ${text.length} characters (${text.slice(0, 40)}…)`);
  }
  let list: Selector[][];
  try {
    list = parseSelector(text);
  } catch {
    return null;
  }
  if (list.length > limits.maxSelectorsPerRule) {
    throw new SvgInputError(`style rule has too many selectors: ${list.length} (limit ${limits.maxSelectorsPerRule})`);
  }
  const out: ParsedSelector[] = [];
  for (const tokens of list) {
    const parts = partsOf(tokens);
    if (parts > limits.maxSelectorParts) {
      throw new SvgInputError(`style sheet selector too complex: ${parts} parts (limit ${limits.maxSelectorParts}) in "${text.trim().slice(0, 60)}"`);
    }
    if (hasPseudoElement(tokens)) continue;
    const [a, b, c] = specOf(tokens);
    out.push({ tokens, specificity: Math.min(a, 255) * 65536 + Math.min(b, 255) * 256 + Math.min(c, 255) });
  }
  return out;
}

/** A node of the adapter: the element's document index. */
export interface Handle {
  readonly i: number;
}

/** The css-select adapter over an element table, with the handles of its elements (by document index). */
export function tableAdapter(t: ElementTable): { adapter: Adapter<Handle, Handle>; handles: Handle[]; maxChildren: number } {
  const n = t.name.length;
  const handles: Handle[] = new Array(n);
  for (let i = 0; i < n; i++) handles[i] = { i };
  const children: Handle[][] = Array.from({ length: n }, () => []);
  const prev: (Handle | null)[] = new Array(n).fill(null);
  const roots: Handle[] = n > 0 ? [handles[0]] : [];
  let maxChildren = 1;
  for (let i = 1; i < n; i++) {
    const kids = children[t.parent[i]];
    prev[i] = kids.length > 0 ? kids[kids.length - 1] : null;
    kids.push(handles[i]);
    if (kids.length > maxChildren) maxChildren = kids.length;
  }
  const adapter: Adapter<Handle, Handle> = {
    isTag: (node: Handle): node is Handle => true,
    getAttributeValue: (e, name) => t.attrs[e.i][name],
    getChildren: (node) => children[node.i],
    getName: (e) => t.name[e.i],
    getParent: (e) => (t.parent[e.i] >= 0 ? handles[t.parent[e.i]] : null),
    getSiblings: (node) => (t.parent[node.i] >= 0 ? children[t.parent[node.i]] : roots),
    prevElementSibling: (node) => prev[node.i],
    getText: () => '',
    hasAttrib: (e, name) => t.attrs[e.i][name] !== undefined,
    removeSubsets: (nodes) => nodes,
  };
  return { adapter, handles, maxChildren };
}

/**
 * Elements one test of this selector may visit beyond the element itself, per
 * unit of `maxChildren`: 1 when it scans siblings (`~`, or a pseudo-class
 * such as :nth-child or :last-child), else 0 (ancestor walks are cached).
 */
export function scansSiblings(sel: ParsedSelector): boolean {
  const scan = (tokens: readonly Selector[]): boolean => tokens.some((t) =>
    t.type === 'sibling' || (t.type === 'pseudo' && (Array.isArray(t.data) ? t.data.some(scan) : true)));
  return scan(sel.tokens);
}

/** A compiled test: does the element match? Null when css-select refuses the selector. */
export function compileSelector(sel: ParsedSelector, adapter: Adapter<Handle, Handle>): ((e: Handle) => boolean) | null {
  try {
    return compile<Handle, Handle>([sel.tokens], { adapter, xmlMode: true });
  } catch {
    return null;
  }
}
