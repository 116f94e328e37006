/** Style resolution for the drawing model: the reader's computed style (the CSS cascade, src/svg/style/). */
import { describe, expect, it } from 'vitest';
import { paintsFill, resolveStyle } from '../../src/model/style.js';
import { readSvg } from '../../src/svg/document.js';

const PX = 25.4 / 96; // CSS Values 3 §5.2: 1px = 1/96 in
const first = (body: string, size = 'width="100px" height="100px" viewBox="0 0 100 100"') =>
  readSvg(`<svg xmlns="http://www.w3.org/2000/svg" ${size}>${body}</svg>`, { assumedMmPerUnit: 1 }).elements[0];

describe('resolveStyle', () => {
  it('a style declaration wins over presentation attributes (SVG 2 §6.4); colours come normalised', () => {
    const s = resolveStyle(first('<path stroke="blue" fill="none" stroke-width="2" style="stroke: #f00 ; fill:none" d="M0 0H1"/>'));
    expect(s).toEqual({ stroke: '#ff0000', fill: 'none', strokeWidthMm: 2 * PX, fillRule: 'nonzero' });
  });

  it('gives the stroke width in mm on the machine, the element scale applied', () => {
    // 1mm = 96/25.4 user units at CSS px, and back: exactly 1 mm (CSS Values 3 §5.2).
    expect(resolveStyle(first('<path stroke-width="1mm" d="M0 0H1"/>')).strokeWidthMm).toBeCloseTo(1, 12);
    // Under scale(2) in mm units: 0.5 → 1 mm.
    expect(resolveStyle(first('<path transform="scale(2)" style="stroke-width:0.5" d="M0 0H1"/>', 'width="100mm" height="100mm" viewBox="0 0 100 100"')).strokeWidthMm).toBeCloseTo(1, 12);
  });

  it('takes what the element does not set from its ancestors, and class rules from a sheet (SVG 2 §13.2, §13.5; §6.4)', () => {
    const s = resolveStyle(first('<style>.c{stroke:#00f}</style><g class="c" fill="none"><path fill="red" d="M0 0H1"/></g>'));
    expect(s).toMatchObject({ stroke: '#0000ff', fill: '#ff0000' });
  });

  it('what nothing sets takes the initial value: fill black, stroke none, width 1 (SVG 2 §13.2, §13.5)', () => {
    expect(resolveStyle(first('<path d="M0 0H1"/>'))).toEqual({ stroke: 'none', fill: '#000000', strokeWidthMm: PX, fillRule: 'nonzero' });
    expect(resolveStyle(first('<path stroke-width="thick" d="M0 0H1"/>')).strokeWidthMm).toBeCloseTo(PX, 12);
  });
});

describe('paintsFill', () => {
  const xy = (...v: number[]): { xy: Float64Array } => ({ xy: Float64Array.from(v) });
  it('a segment or a collinear run encloses no area: nothing to fill (SVG 1.1 §9.5: a line is never filled)', () => {
    expect(paintsFill('#000000', [xy(0, 0, 10, 0)])).toBe(false);
    expect(paintsFill('#000000', [xy(0, 0, 1, 1, 2, 2, 3, 3)])).toBe(false);
  });
  it('an open triangle is filled closed (SVG 2 §13.3); its area by the shoelace formula is 50 mm²', () => {
    expect(paintsFill('#000000', [xy(0, 0, 10, 0), xy(0, 0, 10, 0, 10, 10)])).toBe(true);
    expect(paintsFill('none', [xy(0, 0, 10, 0, 10, 10)])).toBe(false);
  });
});
