/**
 * The per-contour choice: the spline, straight moves or the original pieces,
 * whichever is cheapest within the tolerance, checked by the independent
 * measurement (src/measure/polylineDeviation.ts). Shapes are our own test data
 * (./shapes.ts, seeded).
 */
import { describe, expect, it } from 'vitest';
import { fitContour } from '../../src/fit/fitContour.js';
import { thinWithin } from '../../src/fit/prefilter.js';
import { LINES_SHARE } from '../../src/fit/fitPolyline.js';
import { circle, rng, roundedRect } from './shapes.js';
import { deviationOf } from './measure.js';

describe('fitContour', () => {
  it('a sampled circle comes back as the spline of 2 arcs', () => {
    const r = fitContour(circle(5, 5, 20, 360), { tolerance: 0.05, closed: true });
    expect(r.choice).toBe('spline');
    expect(r.pieces).toBe(2);
    expect(r.deviation).toBeLessThanOrEqual(0.05);
  });

  it('the original is kept when it has no more pieces (a circle written as 2 arcs stays as written)', () => {
    const r = fitContour(circle(5, 5, 20, 360), { tolerance: 0.05, closed: true, originalPieces: 2 });
    expect(r.choice).toBe('original');
    expect(r.segments).toBeNull();
    // A rounded rectangle written as 4 lines + 4 arcs: the refit has 8 too, so the input is kept.
    expect(fitContour(roundedRect(60, 40, 8, 0.2), { tolerance: 0.05, closed: true, originalPieces: 8 }).choice).toBe('original');
    // Written as 12 Béziers, the refit's 8 win.
    expect(fitContour(roundedRect(60, 40, 8, 0.2), { tolerance: 0.05, closed: true, originalPieces: 12 }).choice).toBe('spline');
  });

  it('a zigzag at the tolerance scale comes back as straight moves, no more than the thinning', () => {
    const next = rng(7);
    const xy = new Float64Array(400);
    for (let i = 0; i < 200; i++) {
      xy[2 * i] = 0.3 * i;
      xy[2 * i + 1] = (i % 2) * 0.2 + 0.05 * next();
    }
    const r = fitContour(xy, { tolerance: 0.05, closed: false });
    expect(r.pieces).toBeLessThanOrEqual(thinWithin(xy, 200, false, LINES_SHARE * 0.05, null).length - 1);
    expect(r.choice).toBe('lines');
    expect(deviationOf(xy, false, r.segments!, 0.05).max).toBeLessThanOrEqual(0.05);
  });

  it('random contours: the choice is within the tolerance and never more pieces than input, lines or original', () => {
    for (let seed = 1; seed <= 60; seed++) {
      const next = rng(900 + seed);
      const tol = [0.02, 0.05, 0.1][seed % 3];
      const n = 3 + Math.floor(80 * next());
      const xy = new Float64Array(2 * n);
      const R = tol * (2 + 100 * next());
      for (let i = 0; i < n; i++) {
        const a = (2 * Math.PI * i) / n, r = R * (1 + 0.2 * Math.sin(3 * a)) + tol * 2 * (next() - 0.5);
        xy[2 * i] = r * Math.cos(a);
        xy[2 * i + 1] = r * Math.sin(a);
      }
      const original = Math.floor(n * next()) + 1;
      const r = fitContour(xy, { tolerance: tol, closed: true, originalPieces: original });
      expect(r.pieces, `seed ${seed}`).toBeLessThanOrEqual(Math.min(n, original, thinWithin(xy, n, true, LINES_SHARE * tol, null).length - 1));
      if (r.segments) expect(deviationOf(xy, true, r.segments, tol).max, `seed ${seed}`).toBeLessThanOrEqual(tol);
    }
  });
});
