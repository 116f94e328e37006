import { describe, expect, it } from 'vitest';
import { idealPoint, line, point, pointX, pointY } from '../../src/pga/layout.js';
import {
  addPoints, innerPointLine, join, meet, mulLines, mulMotors, normalizeMotor, normalizePoint, reverseMotor, sandwich,
} from '../../src/pga/ops.js';
import { motorLog, motorPow, motorSweep, rotorCentreX, rotorCentreY, rotorSweep } from '../../src/pga/motor.js';
import { fromLine, fromMotor, fromPoint, gp, grade, join as gjoin, lineOf, motorOf, pointOf, reverse } from './blades.js';
import { rng } from '../fit/shapes.js';

const close = (a: ArrayLike<number>, b: ArrayLike<number>, eps = 1e-12): void => {
  expect(a.length).toBe(b.length);
  for (let i = 0; i < a.length; i++) expect(Math.abs(a[i] - b[i])).toBeLessThanOrEqual(eps * (1 + Math.abs(b[i])));
};

describe('kernel against textbook coordinate geometry', () => {
  it('the join of two points is the line through them (two-point form of a line, common geometry)', () => {
    // ../shared/PGA.md check values: point(1,2) ∨ point(4,6) = −4 e1 + 3 e2 − 2 e0; (0,0) ∨ (1,0) = e2.
    close(join(new Float64Array(3), point(1, 2), point(4, 6)), line(-4, 3, -2));
    close(join(new Float64Array(3), point(0, 0), point(1, 0)), line(0, 1, 0));
    close(join(new Float64Array(3), point(0, 0), point(0, 1)), line(-1, 0, 0));
    // Two-point form: (y2 − y1)(x − x1) − (x2 − x1)(y − y1) = 0 vanishes at both points.
    const l = join(new Float64Array(3), point(-3.5, 7), point(2.25, -1));
    for (const [x, y] of [[-3.5, 7], [2.25, -1]]) expect(Math.abs(l[1] * x + l[2] * y + l[0])).toBeLessThan(1e-12);
  });

  it('point · line is the perpendicular through the point; (P + Q) · (P ∨ Q) is the chord bisector', () => {
    // PGA.md: (point(0,0) + point(2,0)) · (point(0,0) ∨ point(2,0)) = 4 e1 − 4 e0, the line x = 1.
    const p = point(0, 0), q = point(2, 0);
    const bis = innerPointLine(new Float64Array(3), addPoints(new Float64Array(3), p, q), join(new Float64Array(3), p, q));
    close(bis, line(4, 0, -4));
    // Perpendicular through (3, 1) to the line x + 2y − 4 = 0 has direction (1, 2) (common geometry: normal of ax + by + c).
    const perp = innerPointLine(new Float64Array(3), point(3, 1), line(1, 2, -4));
    expect(Math.abs(perp[1] * 3 + perp[2] * 1 + perp[0])).toBeLessThan(1e-12); // passes through the point
    // It runs along (1, 2), the given line's normal: its own normal (a, b) is perpendicular to that.
    expect(Math.abs(perp[1] * 1 + perp[2] * 2)).toBeLessThan(1e-12);
  });

  it('the meet of two chord bisectors is the circumcentre (circle through three points, common geometry)', () => {
    const A = [1, 1], B = [7, 3], C = [2, 8];
    const bis = (u: number[], v: number[]): Float64Array => {
      const pu = point(u[0], u[1]), pv = point(v[0], v[1]);
      return innerPointLine(new Float64Array(3), addPoints(new Float64Array(3), pu, pv), join(new Float64Array(3), pu, pv));
    };
    const c = meet(new Float64Array(3), bis(A, B), bis(B, C));
    // Determinant formula for the circumcentre.
    const d = 2 * (A[0] * (B[1] - C[1]) + B[0] * (C[1] - A[1]) + C[0] * (A[1] - B[1]));
    const s = (p: number[]): number => p[0] * p[0] + p[1] * p[1];
    const ux = (s(A) * (B[1] - C[1]) + s(B) * (C[1] - A[1]) + s(C) * (A[1] - B[1])) / d;
    const uy = (s(A) * (C[0] - B[0]) + s(B) * (A[0] - C[0]) + s(C) * (B[0] - A[0])) / d;
    expect(pointX(c)).toBeCloseTo(ux, 12);
    expect(pointY(c)).toBeCloseTo(uy, 12);
  });

  it('a rotor rotates a point about a centre like the rotation matrix (common geometry)', () => {
    // cos(θ/2) + sin(θ/2)·C rotates about C by −θ (PGA.md); the rotation matrix gives c + R(−θ)(p − c).
    const cx = 2, cy = -1, th = 0.7;
    const C = point(cx, cy);
    const m = new Float64Array([Math.cos(th / 2), Math.sin(th / 2) * C[0], Math.sin(th / 2) * C[1], Math.sin(th / 2) * C[2]]);
    const out = sandwich(new Float64Array(3), m, point(5, 3));
    const a = -th, dx = 5 - cx, dy = 3 - cy;
    expect(pointX(out)).toBeCloseTo(cx + Math.cos(a) * dx - Math.sin(a) * dy, 12);
    expect(pointY(out)).toBeCloseTo(cy + Math.sin(a) * dx + Math.cos(a) * dy, 12);
    // PGA.md check: point(1,0) about the origin by θ = 90° goes to (0, −1).
    const q = sandwich(new Float64Array(3), new Float64Array([Math.SQRT1_2, 0, 0, Math.SQRT1_2]), point(1, 0));
    expect(pointX(q)).toBeCloseTo(0, 15);
    expect(pointY(q)).toBeCloseTo(-1, 15);
  });

  it('translations: 1 + 0.5 e01 moves (1,0) to (0,0); 1 + 0.5 e02 moves it to (1,−1) (PGA.md check values)', () => {
    const a = sandwich(new Float64Array(3), new Float64Array([1, 0.5, 0, 0]), point(1, 0));
    close([pointX(a), pointY(a)], [0, 0]);
    const b = sandwich(new Float64Array(3), new Float64Array([1, 0, 0.5, 0]), point(1, 0));
    close([pointX(b), pointY(b)], [1, -1]);
  });

  it('the product of two lines through a point rotates by twice their angle; of parallel lines translates by twice their distance', () => {
    const m = normalizeMotor(new Float64Array(4), mulLines(new Float64Array(4), line(1, 0, 0), line(Math.cos(0.3), Math.sin(0.3), 0)))!;
    expect(Math.abs(motorSweep(m))).toBeCloseTo(0.6, 12);
    const t = normalizeMotor(new Float64Array(4), mulLines(new Float64Array(4), line(1, 0, 0), line(1, 0, -2)))!;
    const p = sandwich(new Float64Array(3), t, point(0, 0));
    expect(Math.hypot(pointX(p), pointY(p))).toBeCloseTo(4, 12);
  });
});

describe('kernel against a generic blade product', () => {
  const r = rng(7);
  const rnd = (): number => 4 * r() - 2;
  it('join, inner product, line product, motor product and sandwich agree on random inputs', () => {
    for (let k = 0; k < 200; k++) {
      const P = new Float64Array([rnd(), rnd(), rnd()]), Q = new Float64Array([rnd(), rnd(), rnd()]);
      const L1 = new Float64Array([rnd(), rnd(), rnd()]), L2 = new Float64Array([rnd(), rnd(), rnd()]);
      const M1 = new Float64Array([rnd(), rnd(), rnd(), rnd()]), M2 = new Float64Array([rnd(), rnd(), rnd(), rnd()]);
      close(join(new Float64Array(3), P, Q), lineOf(gjoin(fromPoint(P), fromPoint(Q))), 1e-12);
      close(innerPointLine(new Float64Array(3), P, L1), lineOf(grade(gp(fromPoint(P), fromLine(L1)), 1)), 1e-12);
      close(mulLines(new Float64Array(4), L1, L2), motorOf(gp(fromLine(L1), fromLine(L2))), 1e-12);
      close(mulMotors(new Float64Array(4), M1, M2), motorOf(gp(fromMotor(M1), fromMotor(M2))), 1e-12);
      close(sandwich(new Float64Array(3), M1, P), pointOf(gp(gp(fromMotor(M1), fromPoint(P)), reverse(fromMotor(M1)))), 1e-11);
      close(meet(new Float64Array(3), L1, L2), pointOf(grade(gp(fromLine(L1), fromLine(L2)), 2)), 1e-12);
    }
  });

  it('operations are safe when out aliases an input, and leave their inputs alone', () => {
    const P = point(1, 2), Q = point(-3, 4);
    const want = join(new Float64Array(3), P, Q);
    const Pc = P.slice();
    const l = join(P, P, Q); // out aliases the first input
    close(l, want);
    const M = new Float64Array([0.8, 0.1, -0.2, 0.6]);
    const X = point(2, 1);
    const w = sandwich(new Float64Array(3), M, X);
    close(sandwich(X, M, X), w);
    close(Pc, point(1, 2)); // the copy we kept is unchanged by the calls above
    const m2 = M.slice();
    mulMotors(m2, m2, M);
    close(m2, mulMotors(new Float64Array(4), M, M));
  });
});

describe('normalise, reverse, logarithm and power', () => {
  it('normalising a zero-weight element gives null, never NaN', () => {
    expect(normalizeMotor(new Float64Array(4), new Float64Array([0, 1, 2, 0]))).toBeNull();
    expect(normalizePoint(new Float64Array(3), idealPoint(1, 0))).toBeNull();
    expect(normalizeMotor(new Float64Array(4), new Float64Array([NaN, 0, 0, 1]))).toBeNull();
    const p = normalizePoint(new Float64Array(3), new Float64Array([6, -4, 2]))!;
    close([pointX(p), pointY(p)], [2, 3]);
  });

  it('R^½ applied twice is R; R^0 is the identity; the logarithm of a rotation is its centre', () => {
    const m = normalizeMotor(new Float64Array(4), new Float64Array([0.3, 1.2, -0.7, 0.9]))!;
    const h = motorPow(new Float64Array(4), m, 0.5);
    close(mulMotors(new Float64Array(4), h, h), m, 1e-12);
    close(motorPow(new Float64Array(4), m, 0), [1, 0, 0, 0], 1e-15);
    const lg = motorLog(new Float64Array(3), m);
    // The centre C = (−q/r, p/r) of the layout note is the direction of the logarithm.
    expect(-lg[1] / lg[2]).toBeCloseTo(-m[2] / m[3], 12);
    expect(lg[0] / lg[2]).toBeCloseTo(m[1] / m[3], 12);
    // The scalar read-outs the fitter uses agree: the logarithm's point normalised, and the motor's sweep.
    expect(rotorCentreX(m[2], m[3])).toBeCloseTo(-lg[1] / lg[2], 12);
    expect(rotorCentreY(m[1], m[3])).toBeCloseTo(lg[0] / lg[2], 12);
    expect(rotorSweep(m[0], m[3])).toBe(motorSweep(m));
    // The centre is the fixed point of the rotation (sandwiching it returns it).
    const c = sandwich(new Float64Array(3), m, point(rotorCentreX(m[2], m[3]), rotorCentreY(m[1], m[3])));
    close([pointX(c), pointY(c)], [rotorCentreX(m[2], m[3]), rotorCentreY(m[1], m[3])], 1e-12);
    // The reverse undoes the motor: M·M̃ = 1 for a normalised motor.
    close(mulMotors(new Float64Array(4), m, reverseMotor(new Float64Array(4), m)), [1, 0, 0, 0], 1e-12);
  });

  it('the logarithm of a translation is an ideal point; its power scales the move', () => {
    const t = new Float64Array([1, -1.5, 2, 0]); // translation by (3, −4)
    const lg = motorLog(new Float64Array(3), t);
    expect(lg[2]).toBe(0);
    const half = sandwich(new Float64Array(3), motorPow(new Float64Array(4), t, 0.5), point(0, 0));
    close([pointX(half), pointY(half)], [1.5, -2]);
  });
});
