/** The comparison table (src/report/compareTable.ts): both directions per pair, the unpaired, the verdict, singular counts. */
import { describe, expect, it } from 'vitest';
import { compareSvg } from '../../src/measure/compare.js';
import { formatComparison } from '../../src/report/compareTable.js';

const doc = (body: string, size = 'width="100mm" height="100mm" viewBox="0 0 100 100"'): string =>
  `<svg xmlns="http://www.w3.org/2000/svg" ${size}>${body}</svg>`;

describe('formatComparison', () => {
  it('formats a table with both directions and the verdict', () => {
    const c = compareSvg(doc('<circle id="c" cx="50" cy="50" r="20"/><path d="M0 90H9"/>'), doc('<circle id="c" cx="50" cy="50" r="20.2"/>'), { tolerance: 0.1 });
    const s = formatComparison(c, { color: false }, { a: 'a.svg', b: 'b.svg' });
    expect(s).not.toMatch(/\x1b\[/);
    expect(s).toContain('a.svg (A) against b.svg (B)');
    expect(s).toMatch(/\nc\s+c\s+id\s+0\.2\d*\s+0\.2\d*\s+0\.2\d*\s.*OVER/);
    expect(s).toContain('only in A: path#2');
    expect(s).toContain('NOT within tolerance');
    // One pair: singular ("1 pair", not "1 pairs").
    expect(s).toMatch(/\n1 pair, 1 over 0\.1 mm/);
    expect(formatComparison(c, { color: true })).toMatch(/\x1b\[31m/);
  });

  it('says when pairs by order are not counted (elements merged: the whole drawing decides)', () => {
    // Two halves of one line against the whole line: the order pair is 50 mm apart, the drawings coincide.
    const c = compareSvg(doc('<path d="M0 10H50"/><path d="M50 10H100"/>'), doc('<path d="M0 10H100"/>'), { tolerance: 0.1 });
    const s = formatComparison(c, { color: false });
    expect(c.totals.withinTolerance).toBe(true);
    expect(s).toMatch(/1 pair, 1 over 0\.1 mm, largest 50 mm \(1 paired by order only, not counted: 1 element left unpaired, so the whole drawing decides\): within tolerance/);
  });
});
