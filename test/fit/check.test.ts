import { describe, expect, it } from 'vitest';
import { arcFits } from '../../src/fit/check.js';
import { fitPolyline } from '../../src/fit/fitPolyline.js';
import { deviationOf } from './measure.js';
import { rng } from '../rng.js';

describe('arcFits: the long way round a small circle', () => {
  // Circle r = 0.1 about the origin; q at 120°, e at 60°, and the path between them is the chord (y = r sin 60°).
  const r = 0.1, tol = 0.04;
  const q: [number, number] = [r * Math.cos((2 * Math.PI) / 3), r * Math.sin((2 * Math.PI) / 3)];
  const e: [number, number] = [r * Math.cos(Math.PI / 3), r * Math.sin(Math.PI / 3)];
  const pts = new Float64Array([...q, ...e]);

  it('refuses the 300° arc: its lowest point (0, −r) is r (1 + cos 30°) ≈ 0.187 from the chord', () => {
    // Elementary geometry: the chord lies at height r sin 60°, the arc passes through (0, −r).
    expect(r * (1 + Math.sin(Math.PI / 3))).toBeGreaterThan(tol);
    expect(arcFits(pts, 0, 1, 0, 0, r, (5 * Math.PI) / 3, q[0], q[1], e[0], e[1], tol)).toBe(false);
  });

  it('keeps the 60° arc the short way: its sagitta r (1 − cos 30°) ≈ 0.013 is under the tolerance', () => {
    expect(r * (1 - Math.cos(Math.PI / 6))).toBeLessThan(tol);
    expect(arcFits(pts, 0, 1, 0, 0, r, -Math.PI / 3, q[0], q[1], e[0], e[1], tol)).toBe(true);
  });
});

describe('a traced circle whose pixel steps are the size of the tolerance', () => {
  // Our own scenario: a 3 mm hole traced at 12 pixels per mm (about 300 dpi), vertices on the pixel grid
  // give or take a quarter pixel. Half a pixel (0.042 mm) is nearly the tolerance, so the fit has to follow
  // the steps with small arcs; none of them may go the long way round (found on samples/coaster.svg).
  it('stays within the tolerance by the independent measurement', () => {
    const rand = rng(7);
    const px = 12, n = 300;
    const xy = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      const a = (-2 * Math.PI * i) / n;
      xy[2 * i] = Math.round((50 + 3 * Math.cos(a)) * px) / px + ((rand() - 0.5) * 0.5) / px;
      xy[2 * i + 1] = Math.round((14 + 3 * Math.sin(a)) * px) / px + ((rand() - 0.5) * 0.5) / px;
    }
    for (const tol of [0.04, 0.05, 0.06]) {
      const fit = fitPolyline(xy, { tolerance: tol, closed: true });
      const dev = deviationOf(xy, true, fit.segments, tol);
      expect(dev.max, `tol ${tol}`).toBeLessThanOrEqual(tol);
    }
  });
});
