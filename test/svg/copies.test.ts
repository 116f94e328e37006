import { describe, expect, it } from 'vitest';
import { readSvg } from '../../src/svg/document.js';
import { refitSvg } from '../../src/refit.js';
import { compareSvg } from '../../src/measure/compare.js';

const NS = 'xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="200mm" height="200mm" viewBox="0 0 200 200"';
/** A 20 mm circle as four cubics, flattened to a dense polyline (our own test data). */
function ring(cx: number, cy: number, r: number): string {
  const pts: string[] = [];
  for (let i = 0; i < 400; i++) {
    const a = (2 * Math.PI * i) / 400;
    pts.push(`${(cx + r * Math.cos(a)).toFixed(4)} ${(cy + r * Math.sin(a)).toFixed(4)}`);
  }
  return `M${pts.join(' L')}Z`;
}
const scaleOf = (svg: string, id: string): number => readSvg(svg, { assumedMmPerUnit: 1 }).elements.find((e) => e.id === id)!.copyScale;

describe('copyScale: how much larger a <use> copy draws an element (S2 §5.6: the use transform, then translate(x, y))', () => {
  it('a plain element has 1; a use that only moves it (x, y, translate) leaves 1; smaller copies leave 1', () => {
    expect(scaleOf(`<svg ${NS}><path id="p" d="${ring(20, 20, 5)}"/></svg>`, 'p')).toBe(1);
    expect(scaleOf(`<svg ${NS}><path id="p" d="${ring(20, 20, 5)}"/><use href="#p" x="50" y="7" transform="translate(3 4)"/></svg>`, 'p')).toBeCloseTo(1, 12);
    expect(scaleOf(`<svg ${NS}><path id="p" d="${ring(20, 20, 5)}"/><use href="#p" transform="scale(0.5)"/></svg>`, 'p')).toBe(1);
  });

  it('scale(3) gives 3; scale(2 5) gives 5 (the largest singular value, how far a length can stretch)', () => {
    expect(scaleOf(`<svg ${NS}><path id="p" d="${ring(20, 20, 5)}"/><use xlink:href="#p" transform="scale(3)"/></svg>`, 'p')).toBeCloseTo(3, 12);
    expect(scaleOf(`<svg ${NS}><path id="p" d="${ring(20, 20, 5)}"/><use href="#p" transform="scale(2 5)"/></svg>`, 'p')).toBeCloseTo(5, 12);
  });

  it('through a referenced group, relative to the group\'s parent; along a chain of uses the factors multiply', () => {
    const svg = `<svg ${NS}><g transform="scale(2)"><g id="a"><path id="p" d="${ring(20, 20, 5)}"/></g></g>` +
      '<g id="b"><use href="#a" transform="scale(1.5)"/></g><use href="#b" transform="scale(4)"/></svg>';
    // #a stands in a system scaled 2: the first use draws it at 1.5 (root units) instead of 2, a factor 0.75;
    // the second draws that copy 4× larger again: 0.75 × 4 = 3.
    expect(scaleOf(svg, 'p')).toBeCloseTo(3, 12);
  });

  it('a use inside its own target draws nothing (circular reference) and counts for nothing', () => {
    expect(scaleOf(`<svg ${NS}><g id="g"><path id="p" d="${ring(20, 20, 5)}"/><use href="#g" transform="scale(9)"/></g></svg>`, 'p')).toBe(1);
  });

  it('a use that resizes a referenced nested <svg> (S2 §5.6: its width and height replace the svg\'s) scales its content by the viewBox map', () => {
    const svg = `<svg ${NS}><svg id="s" width="50" height="50" viewBox="0 0 50 50"><path id="p" d="${ring(20, 20, 5)}"/></svg>` +
      '<use href="#s" width="150" height="150"/></svg>';
    const el = readSvg(svg, { assumedMmPerUnit: 1 }).elements.find((e) => e.id === 'p')!;
    expect(el.rewritable).toBe(true);
    // viewBox 50 wide shown 150 wide: 3 (S2 §8.2, uniform xMidYMid meet).
    expect(el.copyScale).toBeCloseTo(3, 12);
    // Without width and height the use keeps the viewport: a plain copy.
    expect(scaleOf(svg.replace(' width="150" height="150"', ''), 'p')).toBeCloseTo(1, 12);
  });

  it('a cycle through two uses is not bounded: the element is left as written, with the reason', () => {
    const svg = `<svg ${NS}><g id="a"><path id="p" d="${ring(20, 20, 5)}"/><use href="#b"/></g><g id="b"><use href="#a" transform="scale(2)"/></g></svg>`;
    const el = readSvg(svg, { assumedMmPerUnit: 1 }).elements.find((e) => e.id === 'p')!;
    expect(el.rewritable).toBe(false);
    expect(el.reason).toMatch(/drawn again by <use> at a scale that cannot be bounded \(a cycle of uses/);
  });
});

describe('the tolerance holds in a copy drawn 3× larger', () => {
  it('measured on the copy itself (the use written out as a transformed path): within the tolerance', () => {
    const tol = 0.1;
    const d = ring(20, 20, 8);
    const input = `<svg ${NS}><path id="p" fill="none" stroke="#000" d="${d}"/><use href="#p" transform="translate(60 0) scale(3)"/></svg>`;
    const r = refitSvg(input, { tolerance: tol });
    expect(r.report.elements[0].kept).toBe(false);
    expect(r.report.warnings.some((w) => /drawn again larger by <use> \(up to 3×/.test(w))).toBe(true);
    const written = /<path id="p"[^>]* d="([^"]*)"/.exec(r.text)![1];
    // The copy as a plain element with the use's transform, before and after; measured by compareSvg.
    const copy = (path: string): string => `<svg ${NS}><path id="p" transform="translate(60 0) scale(3)" d="${path}"/></svg>`;
    const c = compareSvg(copy(d), copy(written), { tolerance: tol });
    expect(c.pairs[0].deviation.max).toBeLessThanOrEqual(tol);
    // Without the factor the same fit would have used the whole tolerance where it stands, 3× that in the copy.
    expect(r.report.elements[0].deviation!.max).toBeLessThanOrEqual(tol / 3);
  });
});
