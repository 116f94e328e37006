/**
 * Which sheet declarations apply to which element: every selector of every
 * rule tested against every element (css-select through ./selectors.ts), then,
 * per element, the matched rules sorted by specificity and then document
 * order (CSS Cascade 4 §6.4), flattened into one declaration list that
 * ./cascade.ts applies in that order.
 */
import { SvgInputError } from '../errors.js';
import type { Decl, Rule, StyleLimits } from './sheet.js';
import { STYLE_LIMITS } from './sheet.js';
import { compileSelector, scansSiblings, tableAdapter, type ElementTable } from './selectors.js';

/**
 * Per element (document index), its matched sheet declarations in cascade order, or undefined.
 * @throws SvgInputError when the matching work (elements × selectors, times the
 *   largest sibling count for selectors that scan siblings) exceeds `limits.maxMatchTests`
 */
export function matchRules(table: ElementTable, rules: readonly Rule[], warnings: Set<string>, limits: StyleLimits = STYLE_LIMITS): (Decl[] | undefined)[] {
  const n = table.name.length;
  const { adapter, handles, maxChildren } = tableAdapter(table);
  let selectors = 0, scanning = 0;
  for (const r of rules) {
    selectors += r.selectors.length;
    for (const s of r.selectors) if (scansSiblings(s)) scanning++;
  }
  if (n * selectors > limits.maxMatchTests) {
    throw new SvgInputError(`style sheets too costly to match: ${selectors} selectors × ${n} elements (limit ${limits.maxMatchTests} tests)`);
  }
  if (n * scanning * maxChildren > limits.maxMatchTests) {
    throw new SvgInputError(`style sheets too costly to match: ${scanning} selectors that scan siblings × ${n} elements × ${maxChildren} siblings (limit ${limits.maxMatchTests})`);
  }
  const hits: ({ spec: number; order: number; decls: Decl[] }[] | undefined)[] = new Array(n);
  for (const rule of rules) {
    for (const sel of rule.selectors) {
      const test = compileSelector(sel, adapter);
      if (test === null) {
        warnings.add(`a style rule with an unsupported selector is ignored`);
        continue;
      }
      for (let i = 0; i < n; i++) {
        if (!test(handles[i])) continue;
        (hits[i] ??= []).push({ spec: sel.specificity, order: rule.order, decls: rule.decls });
      }
    }
  }
  const out: (Decl[] | undefined)[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const h = hits[i];
    if (h === undefined) continue;
    h.sort((a, b) => a.spec - b.spec || a.order - b.order);
    out[i] = h.length === 1 ? h[0].decls : h.flatMap((x) => x.decls);
  }
  return out;
}
