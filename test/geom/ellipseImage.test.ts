import { describe, expect, it } from 'vitest';
import { semiAxesInto, maxSemiAxis, transformArcShape, type ArcShape } from '../../src/geom/ellipseImage.js';
import { arcToCenter, arcFromCenter, type ArcCenter } from '../../src/geom/arcCenter.js';
import { rng } from '../rng.js';

const DEG = Math.PI / 180;

function m6(a: number, b: number, c: number, d: number, e: number, f: number): Float64Array {
  return Float64Array.of(a, b, c, d, e, f);
}

function shape(r: ArcShape | null): ArcShape {
  if (r === null) throw new Error('expected a shape');
  return r;
}

function arc(c: ReturnType<typeof arcToCenter>): ArcCenter {
  if (c === null || c.kind !== 'arc') throw new Error('expected an arc');
  return c;
}

describe('semiAxesInto', () => {
  it('T7 SVD of matrix(1 2 3 4)', () => {
    // kurbo affine.rs test `svd` (REFERENCES.md §5.2 T7)
    const out = semiAxesInto(new Float64Array(3), 1, 2, 3, 4);
    expect(out[0]).toBeCloseTo(5.4649857042190427, 13);
    expect(out[1]).toBeCloseTo(0.36596619062625782, 13);
    expect(out[2]).toBeCloseTo(0.95691013360780001, 13);
    expect(out[0] * out[1]).toBeCloseTo(2, 12); // |det| = 2
    expect(maxSemiAxis(1, 2, 3, 4)).toBe(out[0]);
  });
});

describe('transformArcShape: check values', () => {
  const M = m6(1, 2, 3, 4, 5, 6);

  it('T8 circle r = 5 under matrix(1 2 3 4 5 6)', () => {
    // REFERENCES.md §5.2 recipe, T8
    const s = shape(transformArcShape(M, 5, 5, 0, false, true));
    expect(s.rx).toBeCloseTo(27.324929, 6);
    expect(s.ry).toBeCloseTo(1.829831, 6);
    expect(s.phiDeg).toBeCloseTo(54.826912, 6);
    expect(s.sweep).toBe(false); // det = −2 < 0: sweep flipped
  });

  it('T9 M10 0 A10 10 0 0 1 0 10 under matrix(1 2 3 4 5 6)', () => {
    // REFERENCES.md §5.2 recipe, T9: M15 26 A54.649857 3.659662 54.826912 0 0 35 46, centre (5,6)
    const s = shape(transformArcShape(M, 10, 10, 0, false, true));
    expect(s.rx).toBeCloseTo(54.649857, 6);
    expect(s.ry).toBeCloseTo(3.659662, 6);
    expect(s.phiDeg).toBeCloseTo(54.826912, 6);
    expect(s.largeArc).toBe(false);
    expect(s.sweep).toBe(false);
    const c = arc(arcToCenter(15, 26, s.rx, s.ry, s.phiDeg, s.largeArc, s.sweep, 35, 46));
    expect(c.cx).toBeCloseTo(5, 9);
    expect(c.cy).toBeCloseTo(6, 9);
  });

  it('T10 circle r = 10 under scale(2, 1)', () => {
    // REFERENCES.md §5.2, T10
    const s = shape(transformArcShape(m6(2, 0, 0, 1, 0, 0), 10, 10, 0, true, true));
    expect(s.rx).toBeCloseTo(20, 12);
    expect(s.ry).toBeCloseTo(10, 12);
    expect(s.phiDeg).toBeCloseTo(0, 12);
    expect(s.sweep).toBe(true);
    expect(s.largeArc).toBe(true);
  });

  it('T11 unit circle under skewX(45): golden-ratio axes', () => {
    // REFERENCES.md §5.2, T11
    const s = shape(transformArcShape(m6(1, 0, Math.tan(45 * DEG), 1, 0, 0), 1, 1, 0, false, true));
    expect(s.rx).toBeCloseTo(1.618034, 6);
    expect(s.ry).toBeCloseTo(0.618034, 6);
    expect(s.phiDeg).toBeCloseTo(31.717474, 6);
    expect(s.sweep).toBe(true);
  });

  it('T12 unit circle under rotate(30) scale(3, 1)', () => {
    // REFERENCES.md §5.2, T12; rotate(30)·scale(3,1) = matrix(3cos30 3sin30 −sin30 cos30 0 0)
    const c = Math.cos(30 * DEG), s30 = Math.sin(30 * DEG);
    const s = shape(transformArcShape(m6(3 * c, 3 * s30, -s30, c, 0, 0), 1, 1, 0, false, false));
    expect(s.rx).toBeCloseTo(3, 12);
    expect(s.ry).toBeCloseTo(1, 12);
    expect(s.phiDeg).toBeCloseTo(30, 10);
    expect(s.sweep).toBe(false);
  });

  it('T13 scale(1, −1) keeps radii and fA, inverts fS', () => {
    // REFERENCES.md §5.2 step 4, T13
    for (const fA of [false, true]) {
      for (const fS of [false, true]) {
        const s = shape(transformArcShape(m6(1, 0, 0, -1, 0, 0), 50, 25, 30, fA, fS));
        expect(s.rx).toBeCloseTo(50, 12);
        expect(s.ry).toBeCloseTo(25, 12);
        expect(s.phiDeg).toBeCloseTo(150, 10); // the mirror of a 30° axis
        expect(s.largeArc).toBe(fA);
        expect(s.sweep).toBe(!fS);
      }
    }
  });

  it('a singular map is degenerate (null)', () => {
    // REFERENCES.md §5.2 step 5
    expect(transformArcShape(m6(1, 2, 2, 4, 0, 0), 3, 2, 10, false, true)).toBeNull();
    expect(transformArcShape(m6(0, 0, 0, 0, 1, 1), 3, 2, 10, false, true)).toBeNull();
  });

  it('near-equal radii become a circle with φ = 0', () => {
    // REFERENCES.md §5.2 step 7
    const rot = m6(Math.cos(0.3), Math.sin(0.3), -Math.sin(0.3), Math.cos(0.3), 7, 8);
    const s = shape(transformArcShape(rot, 4, 4 * (1 + 1e-12), 33, true, false));
    expect(s.rx).toBe(s.ry);
    expect(s.rx).toBeCloseTo(4, 10);
    expect(s.phiDeg).toBe(0);
    // but a real ellipse stays one
    const e = shape(transformArcShape(rot, 4, 4.01, 33, true, false));
    expect(e.rx).toBeGreaterThan(e.ry);
  });
});

describe('transformArcShape: centre and midpoint under seeded random maps', () => {

  it('centre maps to M·centre, mapped midpoint is the new arc midpoint (< 1e-9 relative)', () => {
    // REFERENCES.md §5.2 "numerically verified" paragraph
    const r = rng(777);
    let mirrored = 0, tooSmall = 0;
    for (let i = 0; i < 3000; i++) {
      const M = m6(r() * 4 - 2, r() * 4 - 2, r() * 4 - 2, r() * 4 - 2, r() * 100 - 50, r() * 100 - 50);
      const det = M[0] * M[3] - M[1] * M[2];
      if (Math.abs(det) < 0.05) continue;
      if (det < 0) mirrored++;
      const x1 = r() * 100 - 50, y1 = r() * 100 - 50, x2 = r() * 100 - 50, y2 = r() * 100 - 50;
      // radii from very small (scaled up by F.6.6) to large
      const rx = 1 + r() * 60, ry = 1 + r() * 60, phiDeg = r() * 720 - 360;
      const fA = r() < 0.5, fS = r() < 0.5;
      const c0 = arc(arcToCenter(x1, y1, rx, ry, phiDeg, fA, fS, x2, y2));
      if (c0.rx > rx * (1 + 1e-12)) tooSmall++;
      const s = shape(transformArcShape(M, rx, ry, phiDeg, fA, fS));
      const X = (x: number, y: number): number => M[0] * x + M[2] * y + M[4];
      const Y = (x: number, y: number): number => M[1] * x + M[3] * y + M[5];
      const c1 = arc(arcToCenter(X(x1, y1), Y(x1, y1), s.rx, s.ry, s.phiDeg, s.largeArc, s.sweep, X(x2, y2), Y(x2, y2)));
      const scale = Math.max(s.rx, 1);
      expect(Math.abs(c1.cx - X(c0.cx, c0.cy)) / scale).toBeLessThan(1e-9);
      expect(Math.abs(c1.cy - Y(c0.cx, c0.cy)) / scale).toBeLessThan(1e-9);
      // midpoints of both arcs (F.6.4 evaluation at θ1 + Δθ/2)
      const m0 = arcFromCenter(c0.cx, c0.cy, c0.rx, c0.ry, c0.phi, c0.theta1 + c0.dtheta / 2, 0);
      const m1 = arcFromCenter(c1.cx, c1.cy, c1.rx, c1.ry, c1.phi, c1.theta1 + c1.dtheta / 2, 0);
      expect(Math.hypot(m1.x1 - X(m0.x1, m0.y1), m1.y1 - Y(m0.x1, m0.y1)) / scale).toBeLessThan(1e-9);
      expect(Math.abs(c1.dtheta)).toBeCloseTo(Math.abs(c0.dtheta), 7);
    }
    // the sample really covers mirrors and out-of-range radii
    expect(mirrored).toBeGreaterThan(500);
    expect(tooSmall).toBeGreaterThan(100);
  });
});
