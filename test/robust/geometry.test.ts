/**
 * Issue 6, item 3: broken geometry through refitSvg. Nothing may throw
 * except SvgInputError; every element that is rewritten has a measured
 * deviation within the tolerance; an element that cannot be handled is kept
 * byte for byte. The parser's own error rules (S2 §9.5.4) are pinned in
 * test/svg/pathData.test.ts, arcs' out-of-range rules in test/geom/arcCenter.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { refitSvg, type RefitResult } from '../../src/refit.js';

const NS = 'xmlns="http://www.w3.org/2000/svg"';
const TOL = 0.1;
/** 100 mm square, 1 user unit = 1 mm. */
const wrap = (body: string): string => `<svg ${NS} width="100mm" height="100mm" viewBox="0 0 100 100">${body}</svg>`;
const CIRCLE = 'M10 50C10 27.9 27.9 10 50 10C72.1 10 90 27.9 90 50C90 72.1 72.1 90 50 90C27.9 90 10 72.1 10 50Z';

/** refitSvg plus the invariant every test here relies on. */
function refit(text: string): RefitResult {
  const r = refitSvg(text, { tolerance: TOL });
  for (const e of r.report.elements) {
    if (!e.kept) {
      expect(e.deviation, `element ${e.index}`).not.toBeNull();
      expect(e.deviation!.max, `element ${e.index}`).toBeLessThanOrEqual(TOL);
    }
  }
  if (r.report.totals.rewritten === 0) expect(r.text).toBe(text);
  return r;
}

describe('broken path data', () => {
  it('an error midway: the valid part is kept and refitted, a warning names the element and offset', () => {
    const d = `${CIRCLE} M0 0 L5 5 X 1 2`;
    const r = refit(wrap(`<g id="layer"><path id="p" d="${d}"/></g>`));
    expect(r.report.totals.rewritten).toBe(1);
    expect(r.report.warnings).toContain(`<path id="p"> (element 2): path data error at offset ${d.indexOf('X')}: unexpected "X" at offset ${d.indexOf('X')}; the part before it is kept`);
    // S2 §9.5.4: the part before the error is rendered, so it is what we write (the circle and the line).
    expect(r.report.elements[0].segmentsAfter.arcs).toBeGreaterThan(0);
  });

  for (const [what, d] of [
    ['NaN', 'M0 0 L NaN 5 L 10 10'],
    ['Infinity', 'M0 0 L Infinity 5 L 10 10'],
    ['a number that overflows (1e999)', 'M0 0 L 1e999 5 L 10 10'],
  ] as const) {
    it(`${what} in a coordinate is a path data error; nothing drawable is left, the file is unchanged`, () => {
      const text = wrap(`<path d="${d}"/>`);
      const r = refit(text);
      expect(r.report.warnings.join()).toMatch(/path data error at offset 7/);
      expect(r.text).toBe(text);
    });
  }

  it('1e308 coordinates (finite, but overflowing any difference) leave the element as written', () => {
    for (const d of ['M0 0 L 1e308 0 L 1e308 1e308 Z', 'M0 0 C 1e308 0 1e308 1e308 0 1e308', 'M0 0 A 1e308 1e308 0 0 1 1e308 0', 'M-1e308 0 A 1e308 1e308 0 0 1 1e308 0']) {
      const text = wrap(`<path d="${d}"/><path d="${CIRCLE}"/>`);
      const r = refit(text);
      expect(r.report.elements[0].kept).toBe(true);
      expect(r.report.elements[0].keptReason).toMatch(/^cannot flatten: /);
      // The rest of the file is still refitted.
      expect(r.report.elements[1].kept).toBe(false);
    }
  });

  it('empty d and d="none" draw nothing and leave the file unchanged', () => {
    for (const d of ['', '   ', 'none']) refit(wrap(`<path d="${d}"/><path/>`));
  });

  it('arcs with zero or negative radii: a line and |r| (W3C SVG 1.1 F.6.6 steps 1-2)', () => {
    const text = wrap('<path d="M10 10 A 0 5 0 0 1 50 50 A -20 -20 0 0 1 90 10"/>');
    const r = refit(text);
    // Read as a line and a half circle of radius 28.28 (the second arc is too small, radius 20 for a chord
    // of 56.6: scaled up, F.6.6 step 3), which the refit cannot shorten: kept as written.
    expect(r.report.elements[0].reason).toBe('no-shorter');
    expect(r.text).toBe(text);
    // At a tolerance the half circle's sagitta cannot take, still as written, never over.
    expect(refit(text).report.totals.withinTolerance).toBe(true);
  });

  it('an arc whose endpoints coincide is omitted (F.6.2); zero-length segments vanish', () => {
    const r = refit(wrap('<path d="M10 10 A 20 20 0 1 1 10 10 L10 10 C10 10 10 10 10 10 Q10 10 10 10 L 50 50"/>'));
    expect(r.text).toContain('d="M10 10 50 50"');
  });

  it('thousands of repeated points', () => {
    const r = refit(wrap(`<path d="M10 10 ${'L 10 10 '.repeat(5000)}L 20 20 ${'L 20 20 '.repeat(5000)}"/>` +
      `<path d="${CIRCLE.replace('M10 50', `M10 50 ${'L10 50 '.repeat(3000)}`)}"/>`));
    expect(r.report.elements[0].kept).toBe(false);
    expect(r.text).toContain('d="M10 10 20 20"');
    expect(r.report.elements[1].kept).toBe(false);
  });

  it('a polyline with an odd number of coordinates drops the last one, with a warning (S2 §10.6)', () => {
    const r = refit(wrap('<polyline points="0 0 10 10 20 0 30"/>'));
    expect(r.report.warnings.join()).toMatch(/odd number of coordinates \(7\), the last one dropped/);
    // Its two lines are already no more than a refit needs: kept as written (readers drop the last number too).
    expect(r.report.elements[0].reason).toBe('no-shorter');
  });
});

describe('transforms and structure', () => {
  it('a singular transform (matrix of zeros): the element is not rewritten (CT1: not displayed)', () => {
    const text = wrap(`<g transform="matrix(0 0 0 0 0 0)"><path d="${CIRCLE}"/></g><path transform="scale(0 1)" d="${CIRCLE}"/>`);
    const r = refit(text);
    expect(r.text).toBe(text);
    expect(r.report.totals.rewritten).toBe(0);
  });

  it('a mirroring transform: rewritten in its own coordinates, within the tolerance', () => {
    const text = wrap(`<g transform="scale(-1 1) translate(-100 0)"><path d="${CIRCLE}"/></g><path transform="matrix(1 0 0 -1 0 100)" d="${CIRCLE}"/>`);
    const r = refit(text);
    expect(r.report.totals.rewritten).toBe(2);
    expect(r.text).toContain('<g transform="scale(-1 1) translate(-100 0)"><path d="M');
  });

  it('100 000 nested groups: no stack overflow, the path inside is refitted', () => {
    const n = 100_000;
    const r = refit(wrap(`${'<g>'.repeat(n)}<path d="${CIRCLE}"/>${'</g>'.repeat(n)}`));
    expect(r.report.totals.rewritten).toBe(1);
    expect(r.report.elements[0].ancestors.startsWith('svg > … > g')).toBe(true);
  }, 60_000);

  it('a use that references its own ancestor: no hang, the use is left as is (S2 §5 circular reference)', () => {
    const text = wrap(`<g id="g"><path d="${CIRCLE}"/><use href="#g"/><use xlink:href="#g" xmlns:xlink="http://www.w3.org/1999/xlink"/></g><use id="u" href="#u"/>`);
    const t0 = performance.now();
    const r = refit(text);
    expect(performance.now() - t0).toBeLessThan(5000);
    expect(r.report.totals.rewritten).toBe(1);
    expect(r.text).toContain('<use href="#g"/><use xlink:href="#g" xmlns:xlink="http://www.w3.org/1999/xlink"/></g><use id="u" href="#u"/>');
  });
});

describe('outlines far from the origin', () => {
  // A 26 km closed outline (1e8 user units of 0.2645 mm) once made the sampler throw
  // ("line needs 500000000 samples") out of refitSvg; now the element is kept with a reason.
  it('a 26 km outline is measured or kept, never a RangeError out of refitSvg', () => {
    const text = `<svg ${NS}><path d="M0 0 L 1e8 0 L 1e8 1e8 L 0 1e8 C -10 1e8 -10 0 0 0"/></svg>`;
    const r = refitSvg(text, { tolerance: TOL });
    expect(r.report.elements).toHaveLength(1);
  });
});
