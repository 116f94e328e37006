/**
 * The structure corpus (../shared/corpus/structure, read in place: 77 files of
 * the resvg test suite on style sheets, the style attribute, symbol and use,
 * with the suite's reference renderings).
 *
 * 1. Every file goes through refitSvg at 0.05 mm; the output re-parses, stays
 *    within the tolerance, and renders (sharp) like the input outside the
 *    tolerance band around edges (the same check as corpus.test.ts).
 * 2. The reader agrees with the reference renderer on what is drawn: the
 *    reader's own view (every geometry element it says is drawn where it
 *    stands, and every copy a use draws, each with its computed matrix, fill,
 *    stroke, stroke-width and fill-rule, nothing else) is written as a plain
 *    SVG, rendered with sharp, and compared with the reference PNG within a
 *    small band. Files whose picture needs what the reader does not compute
 *    (opacity, gradients) are listed in NOT_MODELLED with the reason.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { SaxesParser } from 'saxes';
import { describe, expect, it } from 'vitest';
import { refitSvg } from '../../src/refit.js';
import { readSvg, type ElementStyle, type GeometryElement } from '../../src/svg/document.js';
import type { Matrix } from '../../src/svg/matrixTypes.js';
import { DEFAULT_OPTIONS } from '../../src/options.js';
import { compareRasters, overWhite, readPng, renderSvg, svgSize } from './render.js';
import { CORPUS_STRUCTURE as ROOT, structureCorpusSkip } from '../sharedCorpus.js';

const SKIP = structureCorpusSkip();
const TOLERANCE = 0.05; // mm
/** Antialiasing allowance, px (as corpus.test.ts; common practice). */
const AA_PX = 1.5;
const MAX_FRACTION_OUTSIDE = 0.001;
/** Against the reference PNG (another renderer): antialiasing plus one px, and a coarse colour threshold (as corpus.test.ts). */
const REF_BAND_PX = AA_PX + 1;
const REF_DIFF = 64;

/**
 * Files whose reference picture depends on what the reader does not compute, so
 * the reader's view (solid paints, no opacity) cannot match it; the refit and
 * rendering check (1) still runs on them.
 */
const OPACITY = 'group or paint opacity';
const NOT_MODELLED: Readonly<Record<string, string>> = {
  'resvg/tests/structure/symbol/opacity-on-symbol-with-viewBox.svg': OPACITY,
  'resvg/tests/structure/symbol/opacity-on-symbol.svg': OPACITY,
  'resvg/tests/structure/symbol/opacity-on-use-and-symbol.svg': OPACITY,
  'resvg/tests/structure/symbol/opacity-on-use.svg': OPACITY,
  'resvg/tests/structure/use/complex-style-resolving-order.svg': `a gradient paint and ${OPACITY}`,
  'resvg/tests/structure/use/fill-opacity-inheritance.svg': OPACITY,
  'resvg/tests/structure/use/indirect-recursive-2.svg': OPACITY,
  'resvg/tests/structure/use/indirect-recursive-3.svg': OPACITY,
  'resvg/tests/structure/use/opacity-inheritance.svg': OPACITY,
  'resvg/tests/structure/use/stroke-opacity-inheritance.svg': OPACITY,
  'resvg/tests/structure/style/external-CSS.svg': 'the reference fetched an external sheet (@import); arcspline never fetches',
  'resvg/tests/structure/use/xlink-to-an-external-file.svg': 'the reference drew text from an external file; arcspline never fetches',
};

interface Row { svg: string; png: string }

function manifest(): Row[] {
  return readFileSync(join(ROOT, 'MANIFEST.tsv'), 'utf8').trim().split(/\r?\n/).slice(1).map((l) => {
    const [svg, png] = l.split('\t');
    return { svg, png };
  });
}

function parses(text: string): Record<string, string> {
  const p = new SaxesParser({ xmlns: false });
  let root: Record<string, string> | null = null;
  p.on('opentag', (t) => { root ??= { ...(t.attributes as Record<string, string>) }; });
  p.write(text).close();
  if (!root) throw new Error('no root');
  return root;
}

const GEOMETRY_ATTRS = ['d', 'x', 'y', 'width', 'height', 'rx', 'ry', 'cx', 'cy', 'r', 'x1', 'y1', 'x2', 'y2', 'points', 'pathLength'];
const esc = (s: string): string => s.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;');

/** One shape of the reader's view: the element's geometry attributes under its matrix, painted with its computed style. */
function shape(el: GeometryElement, ctm: Matrix, st: ElementStyle): string {
  const geo = GEOMETRY_ATTRS.filter((a) => el.attrs[a] !== undefined).map((a) => `${a}="${esc(el.attrs[a])}"`).join(' ');
  const paint = (p: string): string => (p.startsWith('url(') ? (p.split(' ')[1] ?? 'none') : p);
  return `<${el.name} ${geo} transform="matrix(${Array.from(ctm).join(' ')})" fill="${paint(st.fill)}" stroke="${paint(st.stroke)}" ` +
    `stroke-width="${st.strokeWidth}" fill-rule="${st.fillRule}"${st.vectorEffect === 'non-scaling-stroke' ? ' vector-effect="non-scaling-stroke"' : ''}/>`;
}

/** The reader's view of a document as a plain SVG of the same frame (module header, 2). */
function readersView(text: string, root: Record<string, string>): string {
  const doc = readSvg(text, { assumedMmPerUnit: DEFAULT_OPTIONS.assumedMmPerUnit });
  const items: { order: number; sub: number; svg: string }[] = [];
  const defs: string[] = [];
  let clipCount = 0;
  for (const el of doc.elements) {
    if (el.reason === null && !el.drawnByUse) items.push({ order: el.index, sub: 0, svg: shape(el, el.ctm, el.style) });
    for (const c of el.copies) {
      if (c.style.visibility !== 'visible') continue;
      // Each viewport the copy is drawn through clips it: nested groups, one clip each.
      let svg = shape(el, c.ctm, c.style);
      for (const k of c.clips) {
        const id = `clip${clipCount++}`;
        defs.push(`<clipPath id="${id}" clipPathUnits="userSpaceOnUse"><rect x="${k.rect[0]}" y="${k.rect[1]}" width="${k.rect[2]}" height="${k.rect[3]}" transform="matrix(${Array.from(k.toRoot).join(' ')})"/></clipPath>`);
        svg = `<g clip-path="url(#${id})">${svg}</g>`;
      }
      items.push({ order: c.use, sub: el.index, svg });
    }
  }
  items.sort((a, b) => a.order - b.order || a.sub - b.sub);
  const frame = ['viewBox', 'width', 'height', 'preserveAspectRatio'].filter((a) => root[a] !== undefined).map((a) => `${a}="${esc(root[a])}"`).join(' ');
  return `<svg xmlns="http://www.w3.org/2000/svg" ${frame}><defs>${defs.join('')}</defs>${items.map((i) => i.svg).join('')}</svg>`;
}

describe.skipIf(SKIP !== null)('structure corpus', () => {
  const rows = SKIP === null ? manifest() : [];

  it('lists 77 files, each with its reference PNG', () => {
    expect(rows.length).toBe(77);
    for (const r of rows) expect(existsSync(join(ROOT, r.svg)) && existsSync(join(ROOT, r.png)), r.svg).toBe(true);
  });

  for (const row of rows) {
    it(`${row.svg}: refit within the band`, async () => {
      const text = readFileSync(join(ROOT, row.svg), 'utf8');
      const res = refitSvg(text, { tolerance: TOLERANCE }, row.svg);
      parses(res.text);
      expect(res.report.totals.withinTolerance).toBe(true);
      expect(res.report.totals.maxDeviation).toBeLessThanOrEqual(TOLERANCE);
      if (res.report.totals.rewritten === 0) {
        expect(res.text === text, 'untouched file must be byte-identical').toBe(true);
        return;
      }
      // 200 × 200 user units at the assumed mm per unit; 500 px a side as the references.
      const at72 = await svgSize(text, 72);
      const density = (72 * 500) / Math.max(at72.width, at72.height);
      const a = await renderSvg(text, density), b = await renderSvg(res.text, density);
      const pxPerMm = a.width / (at72.width * DEFAULT_OPTIONS.assumedMmPerUnit);
      const bandPx = TOLERANCE * pxPerMm + AA_PX;
      const cmp = compareRasters(a, b, { bandPx });
      expect(cmp.fractionOutside, `${cmp.outsideBand} px differ outside the ${bandPx.toFixed(2)} px band`).toBeLessThanOrEqual(MAX_FRACTION_OUTSIDE);
    });

    const skip = NOT_MODELLED[row.svg];
    it.skipIf(skip !== undefined)(`${row.svg}: the reader draws what the reference shows${skip ? ` (not modelled: ${skip})` : ''}`, async () => {
      const text = readFileSync(join(ROOT, row.svg), 'utf8');
      const view = readersView(text, parses(text));
      const ref = overWhite(await readPng(join(ROOT, row.png)));
      const at72 = await svgSize(view, 72);
      const mine = overWhite(await renderSvg(view, (72 * ref.width) / Math.max(1, at72.width)));
      expect([mine.width, mine.height]).toEqual([ref.width, ref.height]);
      const cmp = compareRasters(mine, ref, { bandPx: REF_BAND_PX, diffThreshold: REF_DIFF });
      expect(cmp.fractionOutside, `${cmp.outsideBand} px differ from the reference outside the band, worst at ${cmp.worstAt}`).toBeLessThanOrEqual(MAX_FRACTION_OUTSIDE);
    });
  }
});
