/**
 * Hostile style sheets: every cap gives one clear line naming the value
 * (src/svg/style/sheet.ts STYLE_LIMITS), and nothing is ever fetched
 * (@import, external url() stay unresolved, with a warning).
 */
import { describe, expect, it } from 'vitest';
import { readSvg } from '../../src/svg/document.js';
import { refitSvg } from '../../src/refit.js';
import { SvgInputError } from '../../src/svg/errors.js';
import { STYLE_LIMITS } from '../../src/svg/style/sheet.js';

const NS = 'xmlns="http://www.w3.org/2000/svg"';
const read = (body: string) => readSvg(`<svg ${NS} viewBox="0 0 100 100">${body}</svg>`, { assumedMmPerUnit: 1 });
const refused = (body: string): string => {
  try {
    read(body);
  } catch (e) {
    expect(e).toBeInstanceOf(SvgInputError);
    expect((e as Error).message.split('\n')).toHaveLength(1);
    return (e as Error).message;
  }
  throw new Error('not refused');
};

describe('caps on style sheets', () => {
  it('sheets larger than the cap are refused, naming the size', () => {
    const big = `.a{fill:red}${' '.repeat(STYLE_LIMITS.maxSheetChars)}`;
    expect(refused(`<style>${big}</style><path d="M0 0L1 1"/>`)).toMatch(/style sheets too large: \d+ characters \(limit 4194304\)/);
  });

  it('too many rules', () => {
    const rules = Array.from({ length: STYLE_LIMITS.maxRules + 1 }, (_, i) => `.c${i}{fill:red}`).join('');
    expect(refused(`<style>${rules}</style>`)).toMatch(/too many rules: more than 20000/);
  });

  it('a selector with too many parts, flat or nested in :is()', () => {
    expect(refused(`<style>${'g '.repeat(STYLE_LIMITS.maxSelectorParts + 1)}{fill:red}</style>`)).toMatch(/selector too complex: \d+ parts \(limit 64\)/);
    const nested = `${':is('.repeat(70)}g${')'.repeat(70)}`;
    expect(refused(`<style>${nested}{fill:red}</style>`)).toMatch(/selector too complex/);
  });

  it('a rule list with too many selectors, and too much matching work (selectors × elements)', () => {
    const list = Array.from({ length: STYLE_LIMITS.maxSelectorsPerRule + 1 }, (_, i) => `.s${i}`).join(',');
    expect(refused(`<style>${list}{fill:red}</style>`)).toMatch(/too many selectors: 257 \(limit 256\)/);
    const rules = Array.from({ length: 19_000 }, (_, i) => `.c${i}{fill:red}`).join('');
    expect(refused(`<style>${rules}</style>${'<g/>'.repeat(3000)}`)).toMatch(/too costly to match: 19000 selectors × 3002 elements/);
  });

  it('100 000 nested groups under descendant selectors are matched (ancestor results are cached), the path styled', () => {
    const depth = 100_000;
    const text = `<style>g g path{stroke:red} .a .b{fill:none}</style>${'<g class="a">'.repeat(depth)}<path class="b" d="M0 0L1 1"/>${'</g>'.repeat(depth)}`;
    const [p] = read(text).elements;
    expect(p.style).toMatchObject({ stroke: '#ff0000', fill: 'none' });
  });

  it('a selector that scans siblings on a very wide group is refused as too costly', () => {
    const text = `<style>g ~ path{fill:red}</style><g>${'<path d="M0 0L1 1"/>'.repeat(8000)}</g>`;
    expect(refused(text)).toMatch(/too costly to match: 1 selectors that scan siblings × 8003 elements × 8000 siblings/);
  });

  it('functions nested 200 000 deep in a CSS transform, transform-origin or a commented value are refused as invalid values, with a warning', () => {
    const deep = 'a('.repeat(200_000);
    const doc = read(`<rect style="transform:${deep}"/><rect style="transform:scale(2);transform-origin:${deep}"/><rect style="fill:red/*x*/${deep}"/>`);
    expect(doc.elements.map((e) => Array.from(e.ctm))).toEqual([[1, 0, 0, 1, 0, 0], [2, 0, 0, 2, 0, 0], [1, 0, 0, 1, 0, 0]]);
    expect(doc.warnings.some((w) => /CSS transform ignored: not a transform list/.test(w))).toBe(true);
    expect(doc.warnings.some((w) => /transform-origin .* not understood/.test(w))).toBe(true);
  });

  it('broken CSS is recovered as browsers do: the bad rule or declaration dropped, the rest applied', () => {
    const doc = read('<style>.a{fill:green; stroke:} }} .b{{ .c{fill:red</style><rect class="a"/>');
    expect(doc.elements[0].style.fill).toBe('#008000');
  });
});

describe('nothing is fetched', () => {
  it('@import is not applied, with a warning', () => {
    const doc = read('<style>@import url("http://example.invalid/x.css"); rect{stroke:blue}</style><rect fill="green"/>');
    expect(doc.elements[0].style).toMatchObject({ fill: '#008000', stroke: '#0000ff' });
    expect(doc.warnings.some((w) => /@import .* is not fetched/.test(w))).toBe(true);
  });

  it('an external url() paint stays a reference, with a warning; the refit still goes through', () => {
    const text = `<svg ${NS} viewBox="0 0 100 100"><style>path{fill:url(http://example.invalid/p.svg#g) red}</style><path d="M0 0C10 0 20 10 20 20"/></svg>`;
    const doc = readSvg(text, { assumedMmPerUnit: 1 });
    expect(doc.elements[0].style.fill).toBe('url(http://example.invalid/p.svg#g) #ff0000');
    expect(doc.warnings.some((w) => /external url\(\) .* is not fetched/.test(w))).toBe(true);
    expect(() => refitSvg(text, { tolerance: 0.05 })).not.toThrow();
  });

  it('an external url() in a style attribute warns in every document that has it (parsed once, warned each time)', () => {
    const body = '<path style="fill:url(http://example.invalid/a.svg#p)" d="M0 0L1 1"/>';
    for (let k = 0; k < 2; k++) expect(read(body).warnings.some((w) => /external url\(\) .* is not fetched/.test(w))).toBe(true);
  });

  it('an xml-stylesheet processing instruction is never fetched', () => {
    const doc = readSvg(`<?xml-stylesheet href="http://example.invalid/a.css"?><svg ${NS}><rect/></svg>`, { assumedMmPerUnit: 1 });
    expect(doc.warnings.some((w) => /xml-stylesheet ignored/.test(w))).toBe(true);
  });
});
