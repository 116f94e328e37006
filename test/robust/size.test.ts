/**
 * Issue 6, item 4: size. A million subpaths and 50 MB attributes complete (or
 * are refused clearly) within a stated memory bound. The 200 MB case is
 * covered by checkInputSize in notSvg.test.ts (a fake size, nothing allocated)
 * and measured by hand in docs/ROBUSTNESS.md.
 */
import { describe, expect, it } from 'vitest';
import { refitSvg } from '../../src/refit.js';

const NS = 'xmlns="http://www.w3.org/2000/svg"';
const wrap = (body: string): string => `<svg ${NS} width="100mm" height="100mm" viewBox="0 0 100 100">${body}</svg>`;
const CIRCLE = 'M10 50C10 27.9 27.9 10 50 10C72.1 10 90 27.9 90 50C90 72.1 72.1 90 50 90C27.9 90 10 72.1 10 50Z';
const MiB = 2 ** 20;

/** Run f, return its result and the growth of resident memory, MiB (a lower bound of the peak: GC may run in between). */
function withRss<T>(f: () => T): { value: T; mib: number } {
  const r0 = process.memoryUsage().rss;
  const value = f();
  return { value, mib: (process.memoryUsage().rss - r0) / MiB };
}

describe('size', () => {
  it('a path with a million subpaths (M x y l 1 0 repeated, 12 MB) completes within 2 GiB', () => {
    // Measured by hand: about 18 s and +1.1 GB RSS on the shared 2-core machine (docs/ROBUSTNESS.md).
    const text = wrap(`<path d="${'M 1 2 l 1 0 '.repeat(1_000_000)}"/>`);
    const { value: r, mib } = withRss(() => refitSvg(text));
    expect(r.report.elements).toHaveLength(1);
    expect(r.report.elements[0].commandsBefore).toEqual({ M: 1_000_000, l: 1_000_000 });
    // Straight lines only and nothing shorter: the file comes back unchanged.
    expect(r.text).toBe(text);
    expect(mib).toBeLessThan(2048);
  }, 240_000);

  it('a 50 MB non-geometry attribute is carried through untouched; the path beside it is refitted', () => {
    const junk = 'a'.repeat(50 * MiB);
    const text = wrap(`<path data-blob="${junk}" d="${CIRCLE}"/>`);
    const { value: r, mib } = withRss(() => refitSvg(text));
    expect(r.report.totals.rewritten).toBe(1);
    expect(r.text.length).toBeGreaterThan(50 * MiB);
    expect(r.text.slice(0, 200)).toBe(text.slice(0, 200));
    expect(mib).toBeLessThan(1024);
  }, 120_000);

  it('a 50 MB d: one 50-million-digit number is a path data error, the part before it is refitted', () => {
    const text = wrap(`<path d="${CIRCLE} L ${'1'.repeat(50 * MiB)} 0"/>`);
    const r = refitSvg(text);
    expect(r.report.warnings.join()).toMatch(/path data error at offset \d+: number out of range/);
    expect(r.report.totals.rewritten).toBe(1);
  }, 120_000);

  it('a 50 MB d of whitespace around a circle is refitted', () => {
    const text = wrap(`<path d="${' '.repeat(25 * MiB)}${CIRCLE}${' '.repeat(25 * MiB)}"/>`);
    const r = refitSvg(text);
    expect(r.report.totals.rewritten).toBe(1);
    expect(r.text.length).toBeLessThan(1000);
  }, 120_000);
});
