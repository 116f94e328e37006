import { describe, expect, it } from 'vitest';
import { joinOpen } from '../../src/plan/join.js';
import { rng } from '../rng.js';

const ringLines = (n: number, r: number, cx = 100, cy = 100): Float64Array[] =>
  Array.from({ length: n }, (_, k) => {
    const a = (2 * Math.PI * k) / n, b = (2 * Math.PI * (k + 1)) / n;
    return Float64Array.of(cx + r * Math.cos(a), cy + r * Math.sin(a), cx + r * Math.cos(b), cy + r * Math.sin(b));
  });
const perimeter = (xy: Float64Array, closed: boolean): number => {
  let l = 0;
  const n = xy.length >> 1;
  for (let k = 1; k < (closed ? n + 1 : n); k++) l += Math.hypot(xy[2 * (k % n)] - xy[2 * k - 2], xy[2 * (k % n) + 1] - xy[2 * k - 1]);
  return l;
};

describe('joinOpen', () => {
  it('joins a ring of 720 lines into one closed contour', () => {
    const res = joinOpen(ringLines(720, 50).map((xy, k) => ({ xy, sources: [k] })), 0.1);
    expect(res.contours).toHaveLength(1);
    expect(res.joined).toBe(719);
    const c = res.contours[0];
    expect(c.closed).toBe(true);
    expect(c.xy.length / 2).toBe(720);
    // Perimeter of a regular 720-gon of circumradius 50: 720 · 2r · sin(π/720) (chord length).
    expect(perimeter(c.xy, true)).toBeCloseTo(720 * 100 * Math.sin(Math.PI / 720), 9);
    expect(c.sources).toHaveLength(720);
    expect(c.gap).toBeLessThan(1e-9);
  });

  it('joins the same ring given as shuffled, randomly reversed pieces', () => {
    const r = rng(4);
    const pieces = ringLines(720, 50).map((xy, k) => ({ xy: r() < 0.5 ? Float64Array.of(xy[2], xy[3], xy[0], xy[1]) : xy, sources: [k] }));
    for (let i = pieces.length - 1; i > 0; i--) {
      const j = Math.floor(r() * (i + 1));
      [pieces[i], pieces[j]] = [pieces[j], pieces[i]];
    }
    const res = joinOpen(pieces, 0.1);
    expect(res.contours).toHaveLength(1);
    expect(res.contours[0].closed).toBe(true);
    expect(perimeter(res.contours[0].xy, true)).toBeCloseTo(720 * 100 * Math.sin(Math.PI / 720), 9);
    expect(new Set(res.contours[0].sources).size).toBe(720);
  });

  it('continues straight through a T junction and stops the branch', () => {
    const res = joinOpen([Float64Array.of(-10, 0, 0, 0), Float64Array.of(0, 10, 0, 0), Float64Array.of(0, 0, 10, 0)].map((xy, k) => ({ xy, sources: [k] })), 0.1);
    expect(res.contours.map((c) => perimeter(c.xy, c.closed)).sort((a, b) => a - b)).toEqual([10, 20]);
    expect(res.joined).toBe(1);
  });

  it('bridges a gap within the join distance and reports it; leaves a wider one', () => {
    const near = joinOpen([Float64Array.of(0, 0, 10, 0), Float64Array.of(10.06, 0, 20, 0)].map((xy, k) => ({ xy, sources: [k] })), 0.1);
    expect(near.contours).toHaveLength(1);
    expect(near.contours[0].gap).toBeCloseTo(0.06, 12);
    const far = joinOpen([Float64Array.of(0, 0, 10, 0), Float64Array.of(10.2, 0, 20, 0)].map((xy, k) => ({ xy, sources: [k] })), 0.1);
    expect(far.contours).toHaveLength(2);
    expect(far.joined).toBe(0);
  });

  it('closes four sides of a square but not a short hairpin', () => {
    const sq = [[0, 0, 10, 0], [10, 0, 10, 10], [10, 10, 0, 10], [0, 10, 0, 0]].map((a, k) => ({ xy: Float64Array.from(a), sources: [k] }));
    const res = joinOpen(sq, 0.1);
    expect(res.contours).toHaveLength(1);
    expect(res.contours[0].closed).toBe(true);
    expect(res.contours[0].xy.length).toBe(8);
    const hairpin = joinOpen([{ xy: Float64Array.of(0, 0, 0.05, 0, 0, 0.01), sources: [0] }], 0.1);
    expect(hairpin.contours[0].closed).toBe(false);
  });
});
