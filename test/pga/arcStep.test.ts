import { describe, expect, it } from 'vitest';
import { point, pointX, pointY } from '../../src/pga/layout.js';
import { sandwich } from '../../src/pga/ops.js';
import { motorPow, motorSweep } from '../../src/pga/motor.js';
import { arcStep, arcStepScalar, seedMotor } from '../../src/pga/arcStep.js';
import { rng } from '../fit/shapes.js';

/** Apply R^t to P and return Euclidean coordinates. */
function orbit(m: Float64Array, p: Float64Array, t: number): [number, number] {
  const q = sandwich(new Float64Array(3), motorPow(new Float64Array(4), m, t), p);
  return [pointX(q), pointY(q)];
}

/** Unit tangent of the orbit at t (central difference). */
function tangent(m: Float64Array, p: Float64Array, t: number): [number, number] {
  const h = 1e-6;
  const [x0, y0] = orbit(m, p, t - h), [x1, y1] = orbit(m, p, t + h);
  const l = Math.hypot(x1 - x0, y1 - y0);
  return [(x1 - x0) / l, (y1 - y0) / l];
}

describe('the rotor arc step', () => {
  it('the seed with normal (0, −1) gives start tangent (1, 0) (PGA.md check value)', () => {
    // Tangent (1, 0): the seed's ideal point is the normal (0, −1).
    const seed = seedMotor(new Float64Array(4), 1, 0);
    const m = arcStep(new Float64Array(4), seed, point(0, 0), point(3, 1))!;
    const [tx, ty] = tangent(m, point(0, 0), 1e-5);
    expect(tx).toBeCloseTo(1, 4);
    expect(ty).toBeCloseTo(0, 4);
  });

  it('each step maps P_i exactly onto P_i+1 and continues the previous tangent (dot +1 at every knot)', () => {
    const r = rng(11);
    const pts: [number, number][] = [[0, 0]];
    for (let i = 1; i < 8; i++) pts.push([pts[i - 1][0] + 1 + r(), pts[i - 1][1] + 2 * r() - 1]);
    let prev = seedMotor(new Float64Array(4), 1, 0);
    let prevEnd: [number, number] = [1, 0];
    for (let i = 0; i + 1 < pts.length; i++) {
      const P = point(...pts[i]), Q = point(...pts[i + 1]);
      const m = arcStep(new Float64Array(4), prev, P, Q)!;
      const [ex, ey] = orbit(m, P, 1);
      expect(ex).toBeCloseTo(pts[i + 1][0], 12);
      expect(ey).toBeCloseTo(pts[i + 1][1], 12);
      const [sx, sy] = tangent(m, P, 1e-5);
      if (i > 0) expect(sx * prevEnd[0] + sy * prevEnd[1]).toBeCloseTo(1, 6);
      prevEnd = tangent(m, P, 1 - 1e-5);
      prev = m;
    }
  });

  it('points on one circle give that circle: sweep and midpoint (circle through a chord, common geometry)', () => {
    const R = 10;
    const at = (a: number): Float64Array => point(R * Math.cos(a), R * Math.sin(a));
    const seed = seedMotor(new Float64Array(4), 0, 1); // tangent at (10, 0) of the counter-clockwise circle
    const m = arcStep(new Float64Array(4), seed, at(0), at(1.2))!;
    expect(motorSweep(m)).toBeCloseTo(1.2, 12);
    const [mx, my] = orbit(m, at(0), 0.5);
    expect(Math.hypot(mx, my)).toBeCloseTo(R, 12);
    expect(Math.atan2(my, mx)).toBeCloseTo(0.6, 12);
  });

  it('the largest distance of the arc from its chord is the sagitta s = r − sqrt(r² − (c/2)²) (common geometry)', () => {
    // r = 10, c = 12 gives s = 2 (REFERENCES.md §6 check values).
    const P = point(0, 0), Q = point(12, 0);
    // Start tangent such that the circle through P and Q has r = 10: angle between chord and tangent = asin(c / 2r).
    const a = Math.asin(12 / 20);
    const s = seedMotor(new Float64Array(4), Math.cos(a), -Math.sin(a));
    const m = arcStep(new Float64Array(4), s, P, Q)!;
    let far = 0;
    for (let k = 0; k <= 1000; k++) far = Math.max(far, Math.abs(orbit(m, P, k / 1000)[1]));
    expect(far).toBeCloseTo(10 - Math.sqrt(100 - 36), 5);
  });

  it('a chord along the tangent gives a translation (a line), and line → arc → line stays continuous', () => {
    const seed = seedMotor(new Float64Array(4), 1, 0);
    const m = arcStep(new Float64Array(4), seed, point(0, 0), point(5, 0))!;
    expect(Math.abs(m[3])).toBeLessThan(1e-15);
    const arc = arcStep(new Float64Array(4), m, point(5, 0), point(7, 2))!; // quarter circle about (5, 2)
    expect(motorSweep(arc)).toBeCloseTo(Math.PI / 2, 12);
    const back = arcStep(new Float64Array(4), arc, point(7, 2), point(7, 6))!;
    expect(Math.abs(back[3])).toBeLessThan(1e-12);
  });

  it('the scalar form equals the object form', () => {
    const r = rng(3);
    let prev = seedMotor(new Float64Array(4), 0, 1);
    for (let k = 0; k < 100; k++) {
      const xi = 10 * r(), yi = 10 * r(), xj = 10 * r(), yj = 10 * r();
      const a = arcStep(new Float64Array(4), prev, point(xi, yi), point(xj, yj))!;
      const b = new Float64Array(4);
      expect(arcStepScalar(b, 0, prev[1], prev[2], prev[3], xi, yi, xj, yj)).toBe(true);
      for (let i = 0; i < 4; i++) expect(b[i]).toBeCloseTo(a[i], 12);
      prev = a;
    }
  });
});
