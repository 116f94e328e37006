/**
 * The written document read again. A type selector matches by element name (Selectors 4 §5.1), so a
 * polyline written as a path gains or loses a sheet's rules; a `transform` attribute is a presentation
 * attribute, below any CSS declaration in the cascade (SVG 2 §6.6, CSS Transforms 1 §5), so a baked
 * transform attribute loses to a CSS transform on the element. Each case is measured against the original
 * by compareSvg (src/measure), which reads both documents whole.
 */
import { describe, expect, it } from 'vitest';
import { refitSvg } from '../src/refit.js';
import { compareSvg } from '../src/measure/compare.js';

// A half circle of radius 30 mm sampled at 61 points: a polyline worth refitting (our own scenario).
const pts = Array.from({ length: 61 }, (_, k) => {
  const a = (Math.PI * k) / 60;
  return `${(50 + 30 * Math.cos(a)).toFixed(3)},${(50 + 30 * Math.sin(a)).toFixed(3)}`;
}).join(' ');
const svg = (inner: string): string => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">${inner}</svg>`;
const WAVE = 'M 10 50 C 20 10, 40 10, 50 50 C 60 90, 80 90, 90 50';

describe('the written document read again', () => {
  it.each([
    ['a rule for the old name (polyline) would be lost', svg(`<style>polyline{transform: translate(10px,0px)}</style><polyline points="${pts}" fill="none" stroke="red"/>`), {}],
    ['a rule for the new name (path) would be gained', svg(`<style>path{transform: translate(10px,0px)}</style><polyline points="${pts}" fill="none" stroke="red"/>`), {}],
    ['a CSS transform would win over the baked attribute', svg(`<g transform="translate(5 5)"><path style="transform: translate(20px,0px)" transform="scale(0.5)" d="${WAVE}"/></g>`), { bakeTransforms: true }],
  ])('%s: the element is put back as written, with the reason', (_, input, o) => {
    const r = refitSvg(input, { tolerance: 0.05, ...o });
    expect(r.report.elements.map((e) => e.reason)).toEqual(['restyled']);
    expect(r.report.elements[0].status).toBe('reverted');
    expect(r.text).toBe(input);
    expect(r.report.warnings.some((w) => w.includes('put back as written'))).toBe(true);
  });

  it('class rules that do not depend on the name leave the refit in place, within the tolerance', () => {
    const input = svg(`<style>.c{fill:none;stroke:#f00}</style><polyline class="c" points="${pts}"/>`);
    const r = refitSvg(input, { tolerance: 0.05 });
    expect(r.report.elements[0].status).toBe('refitted');
    expect(compareSvg(input, r.text, { tolerance: 0.05 }).whole!.max).toBeLessThanOrEqual(0.05);
  });
});
