import { describe, expect, it } from 'vitest';
import {
  ARC_CENTER_LENGTH, ARC_ELLIPSE, ARC_LINE, ARC_OMITTED,
  arcFromCenter, arcToCenter, arcToCenterInto, type ArcCenter,
} from '../../src/geom/arcCenter.js';
import { rng } from '../rng.js';

const DEG = Math.PI / 180;

/** Convert and insist on the ellipse case. */
function center(
  x1: number, y1: number, rx: number, ry: number, phi: number,
  fA: 0 | 1, fS: 0 | 1, x2: number, y2: number,
): ArcCenter {
  const c = arcToCenter(x1, y1, rx, ry, phi, fA === 1, fS === 1, x2, y2);
  if (c === null || c.kind !== 'arc') throw new Error('expected an arc');
  return c;
}

/** Difference of two angles in degrees, folded into (−180, 180]. */
function angleDiffDeg(aRad: number, bDeg: number): number {
  let d = (aRad / DEG - bDeg) % 360;
  if (d > 180) d -= 360;
  if (d <= -180) d += 360;
  return d;
}

describe('arcToCenter: check values', () => {
  it('A1 semicircle, sweep 1: centre (1,0), θ1 = 180°, Δθ = +180°', () => {
    // W3C SVG 1.1 F.6.5, F.6.6 (REFERENCES.md §1.4 A1)
    const c = center(0, 0, 1, 1, 0, 0, 1, 2, 0);
    expect(c.cx).toBeCloseTo(1, 12);
    expect(c.cy).toBeCloseTo(0, 12);
    expect(c.rx).toBe(1); // Λ = 1: no scaling
    expect(c.ry).toBe(1);
    expect(c.theta1 / DEG).toBeCloseTo(180, 10);
    expect(c.dtheta / DEG).toBeCloseTo(180, 10);
  });

  it('A2 semicircle, sweep 0: Δθ = −180°', () => {
    // W3C SVG 1.1 F.6.5 step 4 sign rule (REFERENCES.md §1.4 A2)
    const c = center(0, 0, 1, 1, 0, 0, 0, 2, 0);
    expect(c.cx).toBeCloseTo(1, 12);
    expect(c.cy).toBeCloseTo(0, 12);
    expect(angleDiffDeg(c.theta1, 180)).toBeCloseTo(0, 10);
    expect(c.dtheta / DEG).toBeCloseTo(-180, 10);
  });

  it('A3 radii too small: Λ = 4 scales radii to 2', () => {
    // W3C SVG 1.1 F.6.6 step 3 (REFERENCES.md §1.4 A3)
    const c = center(0, 0, 1, 1, 0, 0, 1, 4, 0);
    expect(c.rx).toBeCloseTo(2, 12);
    expect(c.ry).toBeCloseTo(2, 12);
    expect(c.cx).toBeCloseTo(2, 12);
    expect(c.cy).toBeCloseTo(0, 12);
    expect(c.dtheta / DEG).toBeCloseTo(180, 10);
  });

  it('A4 negative radii are taken as absolute values', () => {
    // W3C SVG 1.1 F.6.6 step 2 (REFERENCES.md §1.4 A4)
    const c = center(0, 0, -5, -5, 0, 0, 1, 10, 0);
    expect(c.rx).toBeCloseTo(5, 12);
    expect(c.ry).toBeCloseTo(5, 12);
    expect(c.cx).toBeCloseTo(5, 12);
    expect(c.cy).toBeCloseTo(0, 12);
    expect(c.dtheta / DEG).toBeCloseTo(180, 10);
  });

  it('A5 a zero radius is a straight line', () => {
    // W3C SVG 1.1 F.6.6 step 1 (REFERENCES.md §1.4 A5)
    expect(arcToCenter(0, 0, 0, 5, 0, false, true, 10, 0)).toEqual({ kind: 'line' });
    expect(arcToCenter(0, 0, 5, 0, 0, false, true, 10, 0)).toEqual({ kind: 'line' });
  });

  // W3C SVG 1.1 F.6.5; centres from the four-arc figure of SVG 1.1 §8.3.8 (REFERENCES.md §1.4 A6a–d)
  const a6: Array<[string, 0 | 1, 0 | 1, number, number, number, number]> = [
    ['A6a', 0, 0, 225, 75, 180, -90],
    ['A6b', 0, 1, 125, 125, -90, 90],
    ['A6c', 1, 0, 125, 125, -90, -270],
    ['A6d', 1, 1, 225, 75, 180, 270],
  ];
  for (const [id, fA, fS, cx, cy, t1, dt] of a6) {
    it(`${id} M125 75 A100 50 0 ${fA} ${fS} 225 125`, () => {
      const c = center(125, 75, 100, 50, 0, fA, fS, 225, 125);
      expect(c.rx).toBe(100); // Λ = 0.5 ≤ 1: radii kept
      expect(c.ry).toBe(50);
      expect(c.cx).toBeCloseTo(cx, 10);
      expect(c.cy).toBeCloseTo(cy, 10);
      expect(angleDiffDeg(c.theta1, t1)).toBeCloseTo(0, 9);
      expect(c.dtheta / DEG).toBeCloseTo(dt, 9);
    });
  }

  it('A7 rotated ellipse, large arc, sweep 0', () => {
    // W3C SVG 1.1 F.6.5 (REFERENCES.md §1.4 A7)
    const c = center(0, 0, 50, 25, 30, 1, 0, 60, 40);
    expect(c.rx).toBe(50); // Λ = 0.5264617 ≤ 1
    expect(c.cx).toBeCloseTo(17.657042, 5);
    expect(c.cy).toBeCloseTo(32.575498, 5);
    expect(c.theta1 / DEG).toBeCloseTo(-129.167078, 5);
    expect(c.dtheta / DEG).toBeCloseTo(-266.966294, 5);
    expect(c.phi / DEG).toBeCloseTo(30, 12);
  });

  it('A7b the complementary arc shares the centre', () => {
    // W3C SVG 1.1 F.6.5 (REFERENCES.md §1.4 A7b)
    const c = center(0, 0, 50, 25, 30, 0, 1, 60, 40);
    expect(c.cx).toBeCloseTo(17.657042, 5);
    expect(c.cy).toBeCloseTo(32.575498, 5);
    expect(c.theta1 / DEG).toBeCloseTo(-129.167078, 5);
    expect(c.dtheta / DEG).toBeCloseTo(93.033706, 5);
  });

  it('A8 coincident endpoints: segment omitted', () => {
    // W3C SVG 1.1 F.6.2, SVG 2 §9.5.1 (REFERENCES.md §1.4 A8)
    expect(arcToCenter(5, 5, 10, 10, 0, true, true, 5, 5)).toBeNull();
    const out = new Float64Array(ARC_CENTER_LENGTH);
    expect(arcToCenterInto(out, 5, 5, 10, 10, 0, true, true, 5, 5)).toBe(ARC_OMITTED);
    // Omission is tested before the zero radius (F.6.6 step order: F.6.2 first).
    expect(arcToCenter(5, 5, 0, 10, 0, true, true, 5, 5)).toBeNull();
  });

  it('A9 a 1e-9 chord with fA = 1 is a near-full circle, not omitted', () => {
    // W3C SVG 1.1 F.6.2 exact-equality rule (REFERENCES.md §1.4 A9)
    const c = center(0, 0, 10, 10, 0, 1, 1, 0, 1e-9);
    expect(c.cx).toBeCloseTo(10, 6);
    expect(c.cy).toBeCloseTo(0, 6);
    expect(c.dtheta / DEG).toBeCloseTo(360, 5);
    expect(c.dtheta).toBeLessThan(2 * Math.PI);
    // and the small one is tiny
    const s = center(0, 0, 10, 10, 0, 0, 1, 0, 1e-9);
    expect(Math.abs(s.dtheta)).toBeLessThan(1e-9);
    expect(s.dtheta).toBeGreaterThan(0);
  });

  it('beyond the spec: infinite radii and an underflowing chord are lines, never NaN', () => {
    // project decision (not in the spec): the limit of an ever larger radius is the chord
    expect(arcToCenter(0, 0, Infinity, 5, 0, false, true, 10, 0)).toEqual({ kind: 'line' });
    expect(arcToCenter(0, 0, Number.NaN, 5, 0, false, true, 10, 0)).toEqual({ kind: 'line' });
    expect(arcToCenter(0, 0, 1e300, 1e300, 0, true, true, 0, 1e-320)).toEqual({ kind: 'line' });
  });

  it('φ is taken modulo 360° (F.6.2)', () => {
    // W3C SVG 1.1 F.6.2 (REFERENCES.md §1.1)
    const a = center(0, 0, 50, 25, 30, 1, 0, 60, 40);
    for (const phi of [390, -330, 750]) {
      const b = center(0, 0, 50, 25, phi, 1, 0, 60, 40);
      expect(b.cx).toBeCloseTo(a.cx, 9);
      expect(b.cy).toBeCloseTo(a.cy, 9);
      expect(b.dtheta).toBeCloseTo(a.dtheta, 9);
      expect(b.phi).toBeCloseTo(a.phi, 9);
    }
  });

  it('the flat variant writes the same numbers', () => {
    const out = new Float64Array(ARC_CENTER_LENGTH);
    expect(arcToCenterInto(out, 0, 0, 50, 25, 30, true, false, 60, 40)).toBe(ARC_ELLIPSE);
    const c = center(0, 0, 50, 25, 30, 1, 0, 60, 40);
    expect(Array.from(out)).toEqual([c.cx, c.cy, c.rx, c.ry, c.phi, c.theta1, c.dtheta]);
    expect(arcToCenterInto(out, 0, 0, 0, 5, 0, false, true, 10, 0)).toBe(ARC_LINE);
  });
});

describe('arcFromCenter: check values', () => {
  it('A10 quarter of an axis-aligned ellipse', () => {
    // W3C SVG 1.1 F.6.4 (REFERENCES.md §1.4 A10)
    const e = arcFromCenter(0, 0, 10, 5, 0, 0, 90 * DEG);
    expect(e.x1).toBeCloseTo(10, 12);
    expect(e.y1).toBeCloseTo(0, 12);
    expect(e.x2).toBeCloseTo(0, 12);
    expect(e.y2).toBeCloseTo(5, 12);
    expect(e.largeArc).toBe(false);
    expect(e.sweep).toBe(true);
  });

  it('A11 same, rotated 90°', () => {
    // W3C SVG 1.1 F.6.4 (REFERENCES.md §1.4 A11)
    const e = arcFromCenter(0, 0, 10, 5, 90 * DEG, 0, 90 * DEG);
    expect(e.x1).toBeCloseTo(0, 12);
    expect(e.y1).toBeCloseTo(10, 12);
    expect(e.x2).toBeCloseTo(-5, 12);
    expect(e.y2).toBeCloseTo(0, 12);
    expect(e.largeArc).toBe(false);
    expect(e.sweep).toBe(true);
  });

  it('A12 negative large sweep', () => {
    // W3C SVG 1.1 F.6.4 (REFERENCES.md §1.4 A12)
    const e = arcFromCenter(100, 100, 20, 10, 0, 90 * DEG, -270 * DEG);
    expect(e.x1).toBeCloseTo(100, 12);
    expect(e.y1).toBeCloseTo(110, 12);
    expect(e.x2).toBeCloseTo(80, 12);
    expect(e.y2).toBeCloseTo(100, 12);
    expect(e.largeArc).toBe(true);
    expect(e.sweep).toBe(false);
  });

  it('A13 round trip centre → endpoints → centre', () => {
    // W3C SVG 1.1 F.6.4 ↔ F.6.5 (REFERENCES.md §1.4 A13)
    const e = arcFromCenter(3, -2, 7, 4, 25 * DEG, 40 * DEG, 250 * DEG);
    expect(e.x1).toBeCloseTo(6.773289, 6);
    expect(e.y1).toBeCloseTo(2.596464, 6);
    expect(e.x2).toBeCloseTo(6.758354, 6);
    expect(e.y2).toBeCloseTo(-4.394795, 6);
    expect(e.largeArc).toBe(true);
    expect(e.sweep).toBe(true);
    const c = center(e.x1, e.y1, 7, 4, 25, 1, 1, e.x2, e.y2);
    expect(c.cx).toBeCloseTo(3, 9);
    expect(c.cy).toBeCloseTo(-2, 9);
    expect(c.rx).toBeCloseTo(7, 9);
    expect(c.ry).toBeCloseTo(4, 9);
    expect(c.theta1 / DEG).toBeCloseTo(40, 8);
    expect(c.dtheta / DEG).toBeCloseTo(250, 8);
  });

  it('|Δθ| = 180° exactly gives fA = 0 (F.6.4.3)', () => {
    // W3C SVG 1.1 F.6.4.3 (REFERENCES.md §1.3)
    expect(arcFromCenter(0, 0, 1, 1, 0, 0, Math.PI).largeArc).toBe(false);
    expect(arcFromCenter(0, 0, 1, 1, 0, 0, -Math.PI).sweep).toBe(false);
  });
});

describe('round trips over seeded random arcs', () => {

  it('centre → endpoints → centre recovers every parameter', () => {
    const r = rng(12345);
    for (let i = 0; i < 2000; i++) {
      const cx = (r() - 0.5) * 200, cy = (r() - 0.5) * 200;
      const rx = 0.1 + r() * 50, ry = 0.1 + r() * 50;
      const phi = r() * 2 * Math.PI;
      const t1 = (r() * 2 - 1) * Math.PI * 0.999;
      let dt = (r() * 2 - 1) * 2 * Math.PI * 0.98;
      if (Math.abs(dt) < 0.05) dt = 0.05;
      const e = arcFromCenter(cx, cy, rx, ry, phi, t1, dt);
      const c = arcToCenter(e.x1, e.y1, rx, ry, phi / DEG, e.largeArc, e.sweep, e.x2, e.y2);
      if (c === null || c.kind !== 'arc') throw new Error('expected an arc');
      const scale = Math.max(rx, ry);
      expect(Math.abs(c.cx - cx)).toBeLessThan(1e-8 * scale + 1e-9);
      expect(Math.abs(c.cy - cy)).toBeLessThan(1e-8 * scale + 1e-9);
      expect(Math.abs(c.dtheta - dt)).toBeLessThan(1e-7);
      expect(Math.abs(angleDiffDeg(c.theta1, t1 / DEG))).toBeLessThan(1e-5);
      expect(c.dtheta > 0).toBe(e.sweep);
    }
  });
});
