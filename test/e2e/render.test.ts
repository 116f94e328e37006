/**
 * The rendering helper itself: the distance transform against brute force,
 * the band rule on drawn shapes, and the sharp/librsvg scale facts the
 * end-to-end tests rely on (render.ts header).
 */
import { describe, expect, it } from 'vitest';
import { compareRasters, distanceToMarked, pxPerRootUnit, renderSvg, svgSize } from './render.js';
import { seeded } from './scenarios.js';

describe('distanceToMarked', () => {
  it('equals the brute-force Euclidean distance on seeded random masks', () => {
    const rnd = seeded(7);
    for (let trial = 0; trial < 20; trial++) {
      const w = 1 + Math.floor(rnd() * 23), h = 1 + Math.floor(rnd() * 17);
      const mask = new Uint8Array(w * h);
      for (let i = 0; i < mask.length; i++) mask[i] = rnd() < 0.04 ? 1 : 0;
      mask[Math.floor(rnd() * mask.length)] = 1;
      const d = distanceToMarked(mask, w, h);
      for (let i = 0; i < mask.length; i++) {
        let best = Infinity;
        for (let j = 0; j < mask.length; j++) {
          if (mask[j]) best = Math.min(best, Math.hypot((i % w) - (j % w), Math.floor(i / w) - Math.floor(j / w)));
        }
        expect(d[i]).toBeCloseTo(best, 9);
      }
    }
  });

  it('is huge everywhere when nothing is marked', () => {
    const d = distanceToMarked(new Uint8Array(12), 4, 3);
    for (const v of d) expect(v).toBeGreaterThan(1e9);
  });
});

const square = (x: number, extra = ''): string =>
  `<svg xmlns="http://www.w3.org/2000/svg" width="100" height="100"><rect x="${x}" y="20" width="40" height="40" fill="#000"/>${extra}</svg>`;

describe('compareRasters', () => {
  it('allows a 1 px shift within a 2.5 px band, refuses a 5 px shift', async () => {
    const a = await renderSvg(square(20), 72);
    expect(compareRasters(a, a, { bandPx: 0 }).differing).toBe(0);
    const one = compareRasters(a, await renderSvg(square(21), 72), { bandPx: 2.5 });
    expect(one.differing).toBeGreaterThan(0);
    expect(one.outsideBand).toBe(0);
    const five = compareRasters(a, await renderSvg(square(25), 72), { bandPx: 2.5 });
    expect(five.outsideBand).toBeGreaterThan(0);
  });

  it("catches a thin stroke that moved whole with near: 'each', not with 'either'", async () => {
    const line = (x: number): string => square(20, `<rect x="${x}" y="70" width="1" height="25" fill="#000"/>`);
    const a = await renderSvg(line(70), 72), b = await renderSvg(line(80), 72);
    expect(compareRasters(a, b, { bandPx: 2.5 }).outsideBand).toBeGreaterThan(0);
    expect(compareRasters(a, b, { bandPx: 2.5, near: 'either' }).outsideBand).toBe(0);
  });
});

describe('sharp/librsvg scale facts (measured, sharp 0.35.5)', () => {
  const root = (attrs: string): string => `<svg xmlns="http://www.w3.org/2000/svg" ${attrs}><rect width="1" height="1"/></svg>`;
  it('a user unit is D/72 px', async () => {
    expect(await svgSize(root('width="200" height="80"'), 72)).toEqual({ width: 200, height: 80 });
    expect(await svgSize(root('width="200" height="80"'), 144)).toEqual({ width: 400, height: 160 });
  });
  it('physical units are D²/72 px per inch, CSS-correct (96 px per inch at D/72 px per unit) only at D = 96', async () => {
    expect((await svgSize(root('width="2in" height="1in"'), 72)).width).toBe(144);
    // CSS Values 3 §5.2: 1in = 96px; at D = 96 a user unit is 4/3 px, so 2in = 192·4/3 = 256 px.
    expect((await svgSize(root('width="2in" height="1in"'), 96)).width).toBe(256);
  });
  it('pxPerRootUnit follows preserveAspectRatio', () => {
    const r = { width: 200, height: 100, rgba: new Uint8Array(0) };
    expect(pxPerRootUnit(r, 72, [0, 0, 100, 100], 'xMidYMid', false)).toEqual([1, 1]);
    expect(pxPerRootUnit(r, 72, [0, 0, 100, 100], 'xMidYMid', true)).toEqual([2, 2]);
    expect(pxPerRootUnit(r, 72, [0, 0, 100, 100], 'none', false)).toEqual([2, 1]);
    expect(pxPerRootUnit(r, 144, null, 'xMidYMid', false)).toEqual([2, 2]);
  });
});
