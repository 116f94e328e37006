/**
 * Style sheets and `style` attributes → declarations, parsed by css-tree
 * (npm; CSS Syntax 3 error recovery: a bad declaration or rule is dropped,
 * the rest kept). Selectors are parsed by css-what (npm, through
 * ./selectors.ts); this module only walks the trees those libraries build.
 *
 * Hostile sheets: the total sheet size, the rule count and each selector's
 * complexity are capped (STYLE_LIMITS), with a one-line error naming the
 * value. Nothing is fetched: `@import` and other at-rules are skipped with a
 * warning, and a `url()` in a value is only ever kept as text.
 */
import { parseCss as parse } from './cssTree.js';
import { generateCss as generate } from './cssTree.js';
import type { CssNode, Declaration } from 'css-tree';
import { SvgInputError } from '../errors.js';
import { isProp, type PropName } from './properties.js';
import { parseSelectorList, type ParsedSelector } from './selectors.js';

/** One declaration of a computed property. */
export interface Decl {
  prop: PropName;
  value: string;
  important: boolean;
}

/** One rule: its selectors (each with its specificity) and its declarations of computed properties. */
export interface Rule {
  selectors: ParsedSelector[];
  decls: Decl[];
  /** Position among all rules of the document, in document order. */
  order: number;
}

/** Caps on style sheets (hostile input; REFERENCES.md §7 spirit: bounded work for any input). */
export const STYLE_LIMITS = Object.freeze({
  /** Characters of all `<style>` sheets together. */
  maxSheetChars: 4 * 2 ** 20,
  /** Rules (selector lists with a block) over all sheets. */
  maxRules: 20_000,
  /** Simple selectors and combinators in one selector. */
  maxSelectorParts: 64,
  /** Selectors in one rule's list. */
  maxSelectorsPerRule: 256,
  /** Selector tests (elements × selectors) the matching may run. */
  maxMatchTests: 50_000_000,
});

/** Caps as given to the functions below (tests pass smaller ones). */
export type StyleLimits = typeof STYLE_LIMITS;

function declsOf(list: Iterable<CssNode>, warnings: Set<string>): Decl[] {
  const out: Decl[] = [];
  for (const node of list) {
    if (node.type !== 'Declaration') continue;
    const d = node as Declaration;
    const prop = d.property.toLowerCase();
    if (!isProp(prop)) continue;
    let value = d.value.type === 'Raw' ? d.value.value : '';
    // A comment inside a value is whitespace (CSS Syntax 3 §4.3.2): let css-tree tokenise it away.
    if (value.includes('/*')) value = withoutComments(value);
    if (/url\(\s*['"]?(?!#)/i.test(value)) warnings.add(`an external url() in a style (${prop}: ${value.trim().slice(0, 60)}) is not fetched`);
    out.push({ prop, value, important: d.important !== false });
  }
  return out;
}

/** A value with its comments removed by css-tree; hostile nesting (beyond the parser's stack) leaves it as written, to be refused by its property. */
function withoutComments(value: string): string {
  try {
    return generate(parse(value, { context: 'value', onParseError: () => {} }));
  } catch {
    return value;
  }
}

const declCache = new Map<string, { decls: Decl[]; notes: string[] }>();
const DECL_CACHE_MAX = 4096;

/**
 * The declarations of computed properties in a `style` attribute, in order
 * (the same text is parsed once: print files repeat a few styles many times;
 * its warnings are given again to each document that has it).
 */
export function parseStyleAttribute(text: string, warnings: Set<string>): Decl[] {
  let hit = declCache.get(text);
  if (hit === undefined) {
    const notes = new Set<string>();
    const ast = parse(text, { context: 'declarationList', parseValue: false, onParseError: () => {} });
    const decls = 'children' in ast && ast.children ? declsOf(ast.children, notes) : [];
    if (declCache.size >= DECL_CACHE_MAX) declCache.clear();
    hit = { decls, notes: [...notes] };
    declCache.set(text, hit);
  }
  for (const n of hit.notes) warnings.add(n);
  return hit.decls;
}

/**
 * Parse the sheets of one document (in document order) into rules.
 * @throws SvgInputError when a cap in `limits` is exceeded
 */
export function parseSheets(sheets: readonly string[], warnings: Set<string>, limits: StyleLimits = STYLE_LIMITS): Rule[] {
  let chars = 0;
  for (const s of sheets) chars += s.length;
  if (chars > limits.maxSheetChars) {
    throw new SvgInputError(`style sheets too large: ${chars} characters (limit ${limits.maxSheetChars})`);
  }
  const rules: Rule[] = [];
  for (const text of sheets) {
    const ast = parse(text, { parseValue: false, parseRulePrelude: false, parseAtrulePrelude: false, onParseError: () => {} });
    if (!('children' in ast) || !ast.children) continue;
    for (const node of ast.children) {
      if (node.type === 'Atrule') {
        const name = node.name.toLowerCase();
        const what = node.prelude && node.prelude.type === 'Raw' ? ` ${node.prelude.value.trim().slice(0, 80)}` : '';
        warnings.add(name === 'import'
          ? `@import${what} in a style sheet is not fetched (its rules are not applied)`
          : `@${name}${what} in a style sheet is not applied (only plain rules are)`);
        continue;
      }
      if (node.type !== 'Rule' || node.prelude.type !== 'Raw') continue;
      if (rules.length >= limits.maxRules) {
        throw new SvgInputError(`style sheets have too many rules: more than ${limits.maxRules}`);
      }
      const selectors = parseSelectorList(node.prelude.value, limits);
      if (selectors === null) {
        warnings.add(`a style rule with an unsupported selector (${node.prelude.value.trim().slice(0, 60)}) is ignored`);
        continue;
      }
      const decls = declsOf(node.block.children, warnings);
      if (decls.length > 0) rules.push({ selectors, decls, order: rules.length });
    }
  }
  return rules;
}
