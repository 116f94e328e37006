/** From a read SVG element to the drawing model: contours in mm, group, style, point subpaths, budget. */
import { describe, expect, it } from 'vitest';
import { readSvg } from '../../src/svg/document.js';
import { drawingElementFromSvg, readGeometry } from '../../src/model/fromSvg.js';
import { fitElement } from '../../src/model/fit.js';
import type { DrawingElement } from '../../src/model/drawing.js';

// 200 user units across 100 mm: 0.5 mm per unit.
const DOC = `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 200 200">
  <g id="layer-cut"><g><path id="p" stroke="red" style="fill:none" d="M0 0H20V20H0Z M50 50Z"/></g></g>
  <path id="top" d="M0 100C0 150 100 150 100 100"/>
</svg>`;

function model(id: string, tol = 0.1): DrawingElement {
  const doc = readSvg(DOC, { assumedMmPerUnit: 1 });
  const el = doc.elements.find((e) => e.id === id)!;
  const m = drawingElementFromSvg(el, readGeometry(el, [])!, tol, 0.5, null);
  if (!('contours' in m)) throw new Error(m.message);
  return m;
}

describe('drawingElementFromSvg', () => {
  it('gives contours in mm with the element, its nearest named group and its style', () => {
    const m = model('p');
    expect([m.index, m.id, m.name, m.group]).toEqual([3, 'p', 'path', 'layer-cut']);
    // Computed: red is #ff0000 (CSS Color 4 §6.1); stroke-width 1 user unit at 0.5 mm per unit (100mm over a viewBox 200 wide).
    expect(m.style).toEqual({ stroke: '#ff0000', fill: 'none', strokeWidthMm: 0.5, fillRule: 'nonzero' });
    expect(m.contours).toHaveLength(1);
    expect(m.contours[0].closed).toBe(true);
    // The square of 20 units is 10 mm on a side.
    expect(Array.from(m.contours[0].xy).slice(0, 8)).toEqual([0, 0, 10, 0, 10, 10, 0, 10]);
    // `M50 50Z` draws a point: kept as a point, in mm.
    expect(Array.from(m.points)).toEqual([25, 25]);
    expect(m.curved).toBe(false);
    expect(m.budget.flattenMm).toBe(0);
  });

  it('flattens curves within the budget share and fits them within the fit share', () => {
    const m = model('top');
    expect(m.group).toBeNull();
    expect(m.curved).toBe(true);
    expect(m.budget.flattenMm + m.budget.roundMm + m.budget.fitMm).toBeCloseTo(0.1, 12);
    const f = fitElement(m, 30);
    expect(f.contours).toHaveLength(1);
    expect(f.contours[0].segments.length).toBeGreaterThan(0);
    expect(f.contours[0].outcome).toEqual({ status: 'refitted', reason: null });
  });
});
