/**
 * `measure` draws every copy: a deviation that is small where the element
 * stands but magnified in a copy drawn by `<use>` (S2 §5.5, §5.6) is measured
 * where the copy is.
 */
import { describe, expect, it } from 'vitest';
import { compareSvg } from '../../src/measure/compare.js';

const NS = 'xmlns="http://www.w3.org/2000/svg" width="200mm" height="200mm" viewBox="0 0 200 200"';
const doc = (dx: number, use: string): string =>
  `<svg ${NS}><symbol id="s" viewBox="0 0 50 50"><path id="p" d="M${5 + dx} 5 L45 5"/></symbol>${use}</svg>`;

describe('compareSvg measures every copy', () => {
  it('a shift of 0.02 user units in a symbol drawn 4× larger is 0.08 mm in the copy: over 0.05 mm', () => {
    const c = compareSvg(doc(0, '<use href="#s"/>'), doc(0.02, '<use href="#s"/>'), { tolerance: 0.05 });
    expect(c.pairs).toHaveLength(1);
    // The line end moves along the line: the Hausdorff distance is the shift (0.02 × 4 mm), within the sampling bound.
    expect(c.pairs[0].deviation.max).toBeGreaterThan(0.075);
    expect(c.totals.withinTolerance).toBe(false);
  });

  it('two uses: the worse copy counts; no use: nothing is drawn, nothing compared', () => {
    const two = '<use href="#s" width="50" height="50"/><use href="#s" transform="translate(0 100)"/>';
    const c = compareSvg(doc(0, two), doc(0.02, two), { tolerance: 0.05 });
    expect(c.pairs[0].deviation.max).toBeGreaterThan(0.075);
    expect(compareSvg(doc(0, ''), doc(0.02, ''), { tolerance: 0.05 }).pairs).toHaveLength(0);
  });
});
