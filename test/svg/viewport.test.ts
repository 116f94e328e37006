import { describe, expect, it } from 'vitest';
import {
  assumedSizeText, parsePreserveAspectRatio, parseViewBox, rootToMm, viewBoxTransform,
} from '../../src/svg/viewport.js';
import { applyX, applyY } from '../../src/svg/matrix.js';
import type { Matrix } from '../../src/svg/matrixTypes.js';

const PX_MM = 25.4 / 96;

function close(m: Matrix, expected: number[], digits = 9): void {
  for (let i = 0; i < 6; i++) expect(m[i], `entry ${i}`).toBeCloseTo(expected[i], digits);
}

describe('parseViewBox (S2 §8.6)', () => {
  it('four numbers, whitespace and/or comma', () => {
    expect(parseViewBox('0 0 100 50')).toEqual([0, 0, 100, 50]);
    expect(parseViewBox(' -10,5.5, 1e2 ,50 ')).toEqual([-10, 5.5, 100, 50]);
    expect(parseViewBox('0 0 0 50')).toEqual([0, 0, 0, 50]); // zero kept: "not rendered" is the caller's
  });
  it('negative size, wrong count, junk → null', () => {
    // W3C SVG 2 §8.6: negative width or height is an error (REFERENCES.md §4.2)
    for (const bad of ['0 0 -1 50', '0 0 100 -50', '0 0 100', '0 0 100 50 5', '0 0 100 50px', '', '0,,0 1 1', '0 0 1 1,']) {
      expect(parseViewBox(bad), bad).toBeNull();
    }
  });
});

describe('parsePreserveAspectRatio (S2 §8.7)', () => {
  it('defaults, keywords, defer tolerated', () => {
    expect(parsePreserveAspectRatio(undefined)).toEqual({ align: 'xMidYMid', slice: false });
    expect(parsePreserveAspectRatio('none')).toEqual({ align: 'none', slice: false });
    expect(parsePreserveAspectRatio(' xMinYMax  slice ')).toEqual({ align: 'xMinYMax', slice: true });
    expect(parsePreserveAspectRatio('defer xMaxYMin meet')).toEqual({ align: 'xMaxYMin', slice: false });
  });
  it('invalid → initial value', () => {
    for (const bad of ['', 'xmidymid', 'xMidYMid cover', 'meet', 'xMidYMid meet slice']) {
      expect(parsePreserveAspectRatio(bad), bad).toEqual({ align: 'xMidYMid', slice: false });
    }
  });
});

describe('viewBoxTransform and rootToMm check values (REFERENCES.md §4.2)', () => {
  it('V1: 100mm × 50mm, viewBox 0 0 100 50 → 1 user unit = 1 mm', () => {
    // CV3 §5.2 + S2 §8.2 (V1): sx = sy = 3.7795276
    const vt = viewBoxTransform([0, 0, 100, 50], parsePreserveAspectRatio(undefined), 0, 0, 100 / PX_MM, 50 / PX_MM);
    expect(vt[0]).toBeCloseTo(3.7795276, 7);
    expect(vt[3]).toBeCloseTo(3.7795276, 7);
    const r = rootToMm('100mm', '50mm', '0 0 100 50', undefined, 99);
    close(r.matrix, [1, 0, 0, 1, 0, 0], 12);
    expect(r.physical).toBe(true);
    expect(r.warning).toBeNull();
    expect([r.viewportW, r.viewportH]).toEqual([100, 50]);
  });

  it('V2: 4in × 2in, viewBox 0 0 400 100, default → s = 0.96, t = (0,48), 1 uu = 0.254 mm', () => {
    // S2 §8.2 (V2)
    const vt = viewBoxTransform([0, 0, 400, 100], parsePreserveAspectRatio(undefined), 0, 0, 384, 192);
    close(vt, [0.96, 0, 0, 0.96, 0, 48]);
    const r = rootToMm('4in', '2in', '0 0 400 100', undefined, 99);
    close(r.matrix, [0.254, 0, 0, 0.254, 0, 48 * PX_MM]);
  });

  it('V3: same, xMidYMid slice → s = 1.92, t = (−192, 0), 1 uu = 0.508 mm', () => {
    // S2 §8.2 (V3)
    close(viewBoxTransform([0, 0, 400, 100], parsePreserveAspectRatio('xMidYMid slice'), 0, 0, 384, 192),
      [1.92, 0, 0, 1.92, -192, 0]);
    const r = rootToMm('4in', '2in', '0 0 400 100', 'xMidYMid slice', 99);
    expect(r.matrix[0]).toBeCloseTo(0.508, 12);
  });

  it('V4: same, none → sx = 0.96, sy = 1.92; 0.254 mm (x) vs 0.508 mm (y)', () => {
    // S2 §8.2 (V4)
    close(viewBoxTransform([0, 0, 400, 100], parsePreserveAspectRatio('none'), 0, 0, 384, 192),
      [0.96, 0, 0, 1.92, 0, 0]);
    const r = rootToMm('4in', '2in', '0 0 400 100', 'none', 99);
    close(r.matrix, [0.254, 0, 0, 0.508, 0, 0], 12);
  });

  it('V5: same, xMinYMax meet → s = 0.96, t = (0, 96)', () => {
    // S2 §8.2 (V5)
    close(viewBoxTransform([0, 0, 400, 100], parsePreserveAspectRatio('xMinYMax meet'), 0, 0, 384, 192),
      [0.96, 0, 0, 0.96, 0, 96]);
  });

  it('V6/V7: 300×200 and 150×200 px over viewBox 0 0 1500 1000, none', () => {
    // W3C SVG 2 §8.6 examples (V6, V7)
    const none = parsePreserveAspectRatio('none');
    close(viewBoxTransform([0, 0, 1500, 1000], none, 0, 0, 300, 200), [0.2, 0, 0, 0.2, 0, 0], 15);
    close(viewBoxTransform([0, 0, 1500, 1000], none, 0, 0, 150, 200), [0.1, 0, 0, 0.2, 0, 0], 15);
    const r = rootToMm('300px', '200px', '0 0 1500 1000', 'none', 99);
    close(r.matrix, [0.2 * PX_MM, 0, 0, 0.2 * PX_MM, 0, 0], 15);
  });

  it('V8: 100×100 px, viewBox 50 50 100 100 → scale 1, translate(−50, −50)', () => {
    // S2 §8.2 (V8)
    const vt = viewBoxTransform([50, 50, 100, 100], parsePreserveAspectRatio(undefined), 0, 0, 100, 100);
    close(vt, [1, 0, 0, 1, -50, -50], 15);
    expect([applyX(vt, 50, 50), applyY(vt, 50, 50)]).toEqual([0, 0]);
  });

  it('V9: no viewBox, width="100" → 1 uu = 1 px = 0.2645833 mm, physical', () => {
    // S2 §8.3 (unitless = px) + CV3 (V9)
    const r = rootToMm('100', undefined, undefined, undefined, 99);
    expect(r.matrix[0]).toBeCloseTo(0.2645833, 7);
    expect(r.matrix[3]).toBeCloseTo(0.2645833, 7);
    expect(r.physical).toBe(true);
    expect(r.viewportW).toBe(100);
  });

  it('nested viewport: e-x/e-y offset is included in the translate (S2 §8.8)', () => {
    const vt = viewBoxTransform([0, 0, 10, 10], parsePreserveAspectRatio(undefined), 5, 7, 20, 20);
    close(vt, [2, 0, 0, 2, 5, 7], 15);
  });

  it('zero-sized viewBox → zero matrix (not rendered)', () => {
    close(viewBoxTransform([0, 0, 0, 10], parsePreserveAspectRatio(undefined), 0, 0, 10, 10), [0, 0, 0, 0, 0, 0]);
    const r = rootToMm('10mm', '10mm', '0 0 10 0', undefined, 1);
    close(r.matrix, [0, 0, 0, 0, 0, 0]);
    expect(r.warning).toMatch(/nothing is rendered/);
  });
});

describe('rootToMm decisions', () => {
  it('no physical size: assumed mm per unit from the viewBox corner, with a warning', () => {
    const r = rootToMm(undefined, undefined, '10 20 200 100', undefined, 0.5);
    close(r.matrix, [0.5, 0, 0, 0.5, -5, -10], 15);
    expect(r.physical).toBe(false);
    expect(r.warning).toMatch(/assuming 0.5 mm per user unit \(set it with --unitless-size, or the library option assumedMmPerUnit\)/);
    expect([r.viewportW, r.viewportH]).toEqual([200, 100]);
    const pct = rootToMm('100%', 'auto', '0 0 200 100', undefined, 0.25);
    close(pct.matrix, [0.25, 0, 0, 0.25, 0, 0], 15);
    expect(pct.physical).toBe(false);
    const bare = rootToMm(undefined, undefined, undefined, undefined, 2);
    close(bare.matrix, [2, 0, 0, 2, 0, 0], 15);
    expect(bare.physical).toBe(false);
    expect(bare.warning).not.toBeNull();
  });

  it('no physical size at the CSS px default: the size is rounded and named as 1 CSS px', () => {
    // 1 CSS px = 25.4/96 mm = 0.264583… mm (CSS Values 3 §5.2).
    const r = rootToMm(undefined, undefined, '0 0 10 10', undefined, 25.4 / 96);
    expect(r.warning).toContain('assuming 0.2646 mm (1 CSS px) per user unit');
    expect(r.warning).not.toContain('0.26458333');
    expect(assumedSizeText(1 / 3)).toBe('0.3333 mm');
  });

  it('one dimension given with a viewBox: the other follows the viewBox ratio', () => {
    const r = rootToMm('100mm', undefined, '0 0 200 100', undefined, 99);
    close(r.matrix, [0.5, 0, 0, 0.5, 0, 0], 12);
    expect(r.physical).toBe(true);
    const h = rootToMm('auto', '25mm', '0 0 200 100', undefined, 99);
    close(h.matrix, [0.25, 0, 0, 0.25, 0, 0], 12);
  });

  it('bad attributes are ignored with a warning', () => {
    const r = rootToMm('-5mm', '10mm', '0 0 -1 1', undefined, 99);
    expect(r.warning).toMatch(/viewBox="0 0 -1 1" is invalid/);
    expect(r.warning).toMatch(/width="-5mm" is not positive/);
    close(r.matrix, [PX_MM, 0, 0, PX_MM, 0, 0], 15);
    expect(rootToMm('wide', '10', undefined, undefined, 1).warning).toMatch(/width="wide" is not a length/);
  });

  it('preserveAspectRatio is ignored without a viewBox (S2 §8.7)', () => {
    const a = rootToMm('10mm', '20mm', undefined, 'none', 99);
    const b = rootToMm('10mm', '20mm', undefined, 'xMaxYMax slice', 99);
    expect(Array.from(a.matrix)).toEqual(Array.from(b.matrix));
  });
});

describe('the page in mm (the root viewport; machine output puts its origin at a corner)', () => {
  it('physical sizes in mm and in (CSS) inches, 1in = 25.4 mm (CSS Values 3 §5.2)', () => {
    expect(rootToMm('120mm', '80mm', '0 0 120 80', undefined, 1).pageMm.map((v) => +v.toFixed(9))).toEqual([120, 80]);
    expect(rootToMm('2in', '1in', undefined, undefined, 1).pageMm.map((v) => +v.toFixed(9))).toEqual([50.8, 25.4]);
    // One size given, the other from the viewBox's aspect ratio.
    expect(rootToMm('100mm', undefined, '0 0 200 50', undefined, 1).pageMm.map((v) => +v.toFixed(9))).toEqual([100, 25]);
  });
  it('no physical size: the viewBox at the assumed size; a zero viewBox is an empty page', () => {
    expect(rootToMm(undefined, undefined, '10 20 200 100', undefined, 0.5).pageMm).toEqual([100, 50]);
    expect(rootToMm('10mm', '10mm', '0 0 0 10', undefined, 1).pageMm).toEqual([0, 0]);
  });
});
