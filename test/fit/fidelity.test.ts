/**
 * Seeded property tests of the fitter on the kinds of input that real drawings
 * bring (issue 10): noisy and grid-snapped polylines, tiny islands, U-turns,
 * near-semicircles and float noise in the scale. Each asserts the fitter's own
 * output is within its tolerance by the independent measurement
 * (src/measure/polylineDeviation.ts), and that a lines-only input never comes
 * out with more pieces than it went in with, nor more than a lines-only
 * thinning at the same tolerance (src/fit/prefilter.ts; less the measurement's
 * own overestimate, LINES_SHARE). Shapes are our own
 * test data from a seeded generator (test/rng.ts), so a failure reproduces.
 */
import { describe, expect, it } from 'vitest';
import { fitPolyline, LINES_SHARE } from '../../src/fit/fitPolyline.js';
import { thinWithin } from '../../src/fit/prefilter.js';
import { deviationOf } from './measure.js';
import { mapXY, rng } from './shapes.js';

/** Fit, then check the measured deviation and the piece counts. */
function checkFit(xy: Float64Array, closed: boolean, tol: number, what: string): number {
  const r = fitPolyline(xy, { tolerance: tol, closed });
  const n = xy.length >> 1;
  const inputPieces = closed ? n : n - 1;
  expect(r.segments.length, `${what}: pieces`).toBeGreaterThan(0);
  const dev = deviationOf(xy, closed, r.segments, tol).max;
  expect(dev, `${what}: deviation`).toBeLessThanOrEqual(tol);
  expect(r.segments.length, `${what}: no more pieces than the input`).toBeLessThanOrEqual(inputPieces);
  const thinned = thinWithin(xy, n, closed, LINES_SHARE * tol, null).length - 1;
  expect(r.segments.length, `${what}: no more than a thinning`).toBeLessThanOrEqual(thinned);
  return r.segments.length;
}

/** A smooth closed blob: radius R modulated by a few random harmonics, n vertices. */
function blob(next: () => number, R: number, n: number): Float64Array {
  const h = [1, 2, 3].map((k) => [k + 1, (next() * R) / (4 * (k + 1)), next() * 6.28]);
  const xy = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const t = (2 * Math.PI * i) / n;
    let r = R;
    for (const [k, a, p] of h) r += a * Math.cos(k * t + p);
    xy[2 * i] = r * Math.cos(t);
    xy[2 * i + 1] = r * Math.sin(t);
  }
  return xy;
}

describe('fitted output stays within the tolerance on real-world kinds of input', () => {
  it('noisy closed and open polylines (noise up to the tolerance)', () => {
    for (let seed = 1; seed <= 40; seed++) {
      const next = rng(seed);
      const tol = [0.02, 0.05, 0.1][seed % 3];
      const base = blob(next, 2 + 20 * next(), 40 + Math.floor(300 * next()));
      const amp = tol * (0.2 + 1.5 * next());
      const xy = base.map((v) => v + amp * (next() - 0.5));
      checkFit(xy, true, tol, `noisy closed seed ${seed}`);
      checkFit(xy.slice(0, Math.max(4, (xy.length >> 2) * 2)), false, tol, `noisy open seed ${seed}`);
    }
  });

  it('polylines snapped to a coarse grid (grid 2–20 tolerances)', () => {
    for (let seed = 1; seed <= 40; seed++) {
      const next = rng(100 + seed);
      const tol = [0.02, 0.05, 0.1][seed % 3];
      const grid = tol * (2 + 18 * next());
      const base = blob(next, 20 * grid + 30 * grid * next(), 30 + Math.floor(120 * next()));
      const snapped: number[] = [];
      for (let i = 0; i < base.length; i += 2) {
        const x = Math.round(base[i] / grid) * grid, y = Math.round(base[i + 1] / grid) * grid;
        const m = snapped.length;
        if (m > 0 && snapped[m - 2] === x && snapped[m - 1] === y) continue;
        snapped.push(x, y);
      }
      checkFit(Float64Array.from(snapped), true, tol, `grid seed ${seed}`);
      checkFit(Float64Array.from(snapped.slice(0, snapped.length >> 1)), false, tol, `grid open seed ${seed}`);
    }
  });

  it('islands of 3–8 vertices a few tolerances across', () => {
    for (let seed = 1; seed <= 200; seed++) {
      const next = rng(200 + seed);
      const tol = [0.02, 0.05, 0.1][seed % 3];
      const n = 3 + Math.floor(6 * next());
      const size = tol * (1 + 15 * next());
      const xy = new Float64Array(2 * n);
      for (let i = 0; i < n; i++) {
        const a = (2 * Math.PI * (i + 0.6 * next())) / n, r = size * (0.4 + next());
        xy[2 * i] = 100 + r * Math.cos(a);
        xy[2 * i + 1] = 50 + r * Math.sin(a);
      }
      checkFit(xy, true, tol, `island seed ${seed}`);
    }
  });

  it('U-turns: two corners close together between long sides', () => {
    for (let seed = 1; seed <= 60; seed++) {
      const next = rng(300 + seed);
      const tol = [0.02, 0.05, 0.1][seed % 3];
      const gap = tol * (2 + 20 * next()), len = 2 + 10 * next();
      const a1 = (80 + 20 * next()) * (Math.PI / 180), a2 = (80 + 20 * next()) * (Math.PI / 180);
      // Along +x, turn by a1, a short gap, turn by a2, back along about −x; sampled every step.
      const step = tol * (0.5 + 3 * next());
      const pts: number[] = [];
      const walk = (x0: number, y0: number, dir: number, l: number): [number, number] => {
        const k = Math.max(1, Math.round(l / step));
        for (let i = 1; i <= k; i++) pts.push(x0 + (l * i * Math.cos(dir)) / k, y0 + (l * i * Math.sin(dir)) / k);
        return [x0 + l * Math.cos(dir), y0 + l * Math.sin(dir)];
      };
      pts.push(0, 0);
      let [x, y] = walk(0, 0, 0, len);
      [x, y] = walk(x, y, a1, gap);
      walk(x, y, a1 + a2, len);
      checkFit(Float64Array.from(pts), false, tol, `U-turn seed ${seed}`);
    }
  });

  it('near-semicircles, open and closed with their chord', () => {
    for (let seed = 1; seed <= 60; seed++) {
      const next = rng(400 + seed);
      const tol = [0.02, 0.05, 0.1][seed % 3];
      const r = tol * (3 + 200 * next()), sweep = Math.PI * (0.9 + 0.2 * next());
      const n = 8 + Math.floor(100 * next());
      const xy = new Float64Array(2 * (n + 1));
      for (let i = 0; i <= n; i++) {
        xy[2 * i] = 10 + r * Math.cos((sweep * i) / n);
        xy[2 * i + 1] = -5 + r * Math.sin((sweep * i) / n);
      }
      checkFit(xy, false, tol, `semicircle open seed ${seed}`);
      checkFit(xy, true, tol, `semicircle closed seed ${seed}`);
    }
  });

  it('float noise in the scale does not change the outcome (0.1 vs 0.10000000000000002)', () => {
    for (let seed = 1; seed <= 30; seed++) {
      const next = rng(500 + seed);
      const tol = [0.02, 0.05, 0.1][seed % 3];
      const base = blob(next, 20 + 200 * next(), 60 + Math.floor(200 * next())).map((v) => Math.round(v * 100) / 10);
      const a = checkFit(mapXY(base, 0.1, 0, 0, 0.1, 3, 4), true, tol, `scale 0.1 seed ${seed}`);
      const b = checkFit(mapXY(base, 0.1 + 2 ** -56, 0, 0, 0.1 + 2 ** -56, 3, 4), true, tol, `scale 0.1+ε seed ${seed}`);
      // Same drawing up to 1e-17 relative: the piece count may differ by a knot choice, never by much.
      expect(Math.abs(a - b), `scale noise seed ${seed}`).toBeLessThanOrEqual(Math.max(1, 0.05 * a));
    }
  });
});

describe('tangent breaks in the source at the tolerance scale', () => {
  it('200 joins of 0.005–0.05 mm pieces with 2–5° breaks do not become 200 pieces', () => {
    const next = rng(600);
    // A circle arc of radius 5 mm drawn as 200 short pieces between points on the circle, each piece bent
    // at its middle by 1–2.5° alternately out and in, so every join breaks the tangent by 2–5°.
    const pts: number[] = [5, 0];
    const corners: number[] = [];
    let a = 0;
    for (let p = 0; p < 200; p++) {
      const l = 0.005 + 0.045 * next(), a1 = a + l / 5;
      const bend = (((1 + 1.5 * next()) * Math.PI) / 180) * (p % 2 ? 1 : -1);
      const am = 0.5 * (a + a1), rm = 5 * Math.cos(0.5 * (a1 - a)) + 0.5 * l * Math.tan(bend);
      pts.push(rm * Math.cos(am), rm * Math.sin(am), 5 * Math.cos(a1), 5 * Math.sin(a1));
      corners.push(pts.length / 2 - 1);
      a = a1;
    }
    corners.pop();
    const xy = Float64Array.from(pts);
    for (const tol of [0.02, 0.05]) {
      const r = fitPolyline(xy, { tolerance: tol, closed: false, corners });
      expect(deviationOf(xy, false, r.segments, tol).max).toBeLessThanOrEqual(tol);
      // About 5.5 mm of a 5 mm radius: one arc, two at most (lines alone need 4 at 0.05 mm, 7 at 0.02 mm).
      expect(r.segments.length, `tol ${tol}`).toBeLessThanOrEqual(2);
    }
  });

  it('a sharp join between long pieces stays a corner', () => {
    // Two 10 mm lines meeting at 90°, the join listed as a source break: one corner, two lines.
    const xy = new Float64Array([0, 0, 5, 0, 10, 0, 10, 5, 10, 10]);
    const r = fitPolyline(xy, { tolerance: 0.05, closed: false, corners: [2] });
    expect(r.corners).toContain(2);
    expect(r.segments.length).toBe(2);
  });
});
