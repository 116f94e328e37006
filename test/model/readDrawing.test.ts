/** A whole document as a drawing model, for writers in mm. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fitDrawing, readDrawing } from '../../src/model/readDrawing.js';
import { arcGeometry } from '../../src/fit/segment.js';

const bracket = readFileSync(new URL('../../samples/bracket.svg', import.meta.url), 'utf8');

describe('readDrawing', () => {
  it('models every drawn element, exact shapes included, with a rounding budget in mm', () => {
    const d = readDrawing(bracket, { tolerance: '0.05mm' });
    expect(d.elements.map((e) => e.id)).toEqual(['outline', 'hole-left', 'hole-right', 'slot', 'slot-2', 'leaf', 'vein']);
    expect(d.skipped).toEqual([]);
    // mm output at 0.05 mm: 3·√2·½·10^−3 = 0.0021 mm ≤ 5 % of 0.05 mm, and 2 decimals would give 0.021 mm.
    for (const e of d.elements) expect(e.budget.digits).toBe(3);
  });

  it('fits a circle into arcs on that circle, within the tolerance', () => {
    // The sample's hole: <circle cx="20" cy="20" r="2.5"/> in a 120 mm wide viewBox of 120 units (1 unit = 1 mm).
    const d = readDrawing(bracket, { tolerance: 0.05 });
    const hole = fitDrawing(d, 30).find((f) => f.element.id === 'hole-left')!;
    expect(hole.element.group).toBe('cut');
    // Its style comes from <g id="cut" fill="none" stroke="#d00" stroke-width="0.1">, 1 unit = 1 mm.
    expect(hole.element.style).toMatchObject({ stroke: '#dd0000', fill: 'none' });
    expect(hole.element.style.strokeWidthMm).toBeCloseTo(0.1, 12);
    const segs = hole.contours[0].segments;
    expect(segs.length).toBeGreaterThan(0);
    for (const s of segs) {
      const g = arcGeometry(s)!;
      expect(g).not.toBeNull();
      expect(Math.abs(g.r - 2.5)).toBeLessThanOrEqual(0.05);
      expect(Math.hypot(g.cx - 20, g.cy - 20)).toBeLessThanOrEqual(0.05);
    }
  });

  it('lists elements not drawn where they stand as skipped, with the reader\'s message', () => {
    const d = readDrawing('<svg xmlns="http://www.w3.org/2000/svg" width="10mm" height="10mm"><defs><path id="x" d="M0 0L5 5"/></defs></svg>');
    expect(d.skipped).toEqual([{ index: 2, id: 'x', name: 'path', reason: 'not-drawn', message: expect.stringMatching(/defs/) }]);
  });
});

describe('readDrawing: copies drawn by use (S2 §5.5, §5.6)', () => {
  const doc = `<svg xmlns="http://www.w3.org/2000/svg" width="200mm" height="200mm" viewBox="0 0 200 200">
    <defs><path id="p" d="M0 0 C 10 0 10 10 20 10"/></defs>
    <symbol id="s" viewBox="0 0 10 10"><path id="q" d="M0 0 L 5 5"/></symbol>
    <use href="#p" stroke="#f00"/><use href="#p" transform="translate(50 0)" stroke="#00f"/>
    <use href="#s" x="100" y="100" width="40" height="40"/>
  </svg>`;

  it('an element in defs is modelled once, not drawn in place, with a copy per use and each copy\'s style', () => {
    const d = readDrawing(doc, { tolerance: 0.05 });
    const p = d.elements.find((e) => e.id === 'p')!;
    expect(p.inPlace).toBe(false);
    expect(p.copies.map((c) => [Array.from(c.map), c.style.stroke])).toEqual([
      [[1, 0, 0, 1, 0, 0], '#ff0000'], [[1, 0, 0, 1, 50, 0], '#0000ff'],
    ]);
  });

  it('a symbol copy maps its viewBox onto the use\'s size: 10 units onto 40 mm is a scale of 4 (S2 §8.2)', () => {
    const q = readDrawing(doc, { tolerance: 0.05 }).elements.find((e) => e.id === 'q')!;
    expect(q.copies.map((c) => Array.from(c.map))).toEqual([[4, 0, 0, 4, 100, 100]]);
  });
});
