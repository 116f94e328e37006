/** One element's refit: statuses and reason codes, and the counts of what was written (closing lines drawn by Z included). */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { svgPathProperties } from 'svg-path-properties';
import { SaxesParser } from 'saxes';
import { refitSvg } from '../src/refit.js';
import { closingLines } from '../src/refitElement.js';
import type { FittedElement } from '../src/model/drawing.js';

const bracket = readFileSync(new URL('../samples/bracket.svg', import.meta.url), 'utf8');

/** Path data by id, read back by the XML parser. */
function pathData(text: string): Map<string, string> {
  const out = new Map<string, string>();
  const sax = new SaxesParser();
  sax.on('opentag', (t) => {
    if (t.name === 'path' && typeof t.attributes.id === 'string') out.set(t.attributes.id, String(t.attributes.d));
  });
  sax.write(text).close();
  return out;
}

describe('counts of what was written', () => {
  it('count the straight pieces a reader draws, closing lines by Z included (svg-path-properties as the reader)', () => {
    const r = refitSvg(bracket, {}, 'bracket.svg');
    const d = pathData(r.text);
    for (const e of r.report.elements.filter((x) => x.status === 'refitted')) {
      // svg-path-properties (npm, a general-purpose path measuring library) splits the path into drawn parts;
      // a straight part is as long as its chord, an arc longer.
      const parts = new svgPathProperties(d.get(e.id!)!).getParts().filter((p) => p.length > 1e-9);
      const straight = parts.filter((p) => Math.abs(p.length - Math.hypot(p.end.x - p.start.x, p.end.y - p.start.y)) <= 1e-9 * p.length);
      expect(e.segmentsAfter.lines, e.id!).toBe(straight.length);
      expect(e.segmentsAfter.arcs + e.segmentsAfter.lines, e.id!).toBe(parts.length);
    }
    // The sample's outline: five straight moves, one of them the long closing Z.
    expect(r.report.elements.find((e) => e.id === 'outline')!.segmentsAfter.lines).toBe(5);
  });

  it('closingLines counts closed contours that end with a line, not those that end with an arc', () => {
    const line = { x0: 0, y0: 0, x1: 1, y1: 0, motor: new Float64Array([1, 0, 0, 0]), i0: 0, i1: 1 };
    const fitted = (closed: boolean): FittedElement => ({
      element: null as unknown as FittedElement['element'],
      contours: [{ contour: { xy: new Float64Array(0), closed }, choice: 'spline', segments: [line as never], straightMovesNeeded: 1, outcome: { status: 'refitted', reason: null } }],
    });
    expect(closingLines(fitted(true))).toBe(1);
    expect(closingLines(fitted(false))).toBe(0);
  });
});

describe('statuses and reasons', () => {
  it('mark each element refitted, kept or reverted with a code, and the message does not repeat "kept"', () => {
    const r = refitSvg(bracket, {}, 'bracket.svg');
    const hole = r.report.elements.find((e) => e.id === 'hole-left')!;
    expect([hole.status, hole.reason, hole.kept]).toEqual(['kept', 'exact-shape', true]);
    expect(hole.keptReason).not.toMatch(/kept/);
    const outline = r.report.elements.find((e) => e.id === 'outline')!;
    expect([outline.status, outline.reason, outline.kept, outline.keptReason]).toEqual(['refitted', null, false, null]);
  });

  it('not drawn where it stands, singular, too few digits, no shorter: each its own code', () => {
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">
      <defs><path id="d" d="M0 0C10 10 20 10 30 0"/></defs>
      <g transform="scale(0)"><path id="s" d="M0 0C10 10 20 10 30 0"/></g>
      <path id="l" d="M0 0L10 0"/>
      <path id="c" d="M0 50C10 60 20 60 30 50"/></svg>`;
    const byId = (r: ReturnType<typeof refitSvg>, id: string) => r.report.elements.find((e) => e.id === id)!;
    const r = refitSvg(svg);
    expect([byId(r, 'd').status, byId(r, 'd').reason]).toEqual(['kept', 'not-drawn']);
    expect([byId(r, 's').status, byId(r, 's').reason]).toEqual(['kept', 'not-drawn']);
    expect([byId(r, 'l').status, byId(r, 'l').reason]).toEqual(['kept', 'no-shorter']);
    expect(byId(r, 'c').status).toBe('refitted');
    // 0 decimals in mm units: rounding alone may move a point 0.7 mm, far over 0.1 mm.
    const few = refitSvg(svg, { digits: 0 });
    expect([byId(few, 'c').status, byId(few, 'c').reason]).toEqual(['kept', 'too-few-digits']);
    expect(few.report.totals.withinTolerance).toBe(true);
  });
});
