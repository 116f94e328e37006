/**
 * Fix found by the hostile-input suite (issue 6): the endpoint → centre
 * conversion overflowed to NaN for radii or endpoints near 1e308.
 */
import { describe, expect, it } from 'vitest';
import { arcToCenter } from '../../src/geom/arcCenter.js';

describe('arcToCenter near the double range', () => {
  it('a half circle of radius 1e308 has a finite centre (W3C SVG 1.1 F.6.5)', () => {
    // From (0,0) to (1e308, 0) with r = 1e308: chord = r, so the centre is at
    // (r/2, ±r·√3/2) (equilateral triangle; values derived, not measured).
    const a = arcToCenter(0, 0, 1e308, 1e308, 0, false, true, 1e308, 0);
    expect(a?.kind).toBe('arc');
    if (a?.kind !== 'arc') return;
    expect(a.cx / 1e308).toBeCloseTo(0.5, 12);
    expect(Math.abs(a.cy) / 1e308).toBeCloseTo(Math.sqrt(3) / 2, 12);
    expect(Number.isFinite(a.theta1) && Number.isFinite(a.dtheta)).toBe(true);
  });

  it('endpoints at ±1e308 do not overflow the half chord', () => {
    // Half circle through (−1e308, 0) and (1e308, 0): radius 1e308, centre at the origin.
    const a = arcToCenter(-1e308, 0, 1e308, 1e308, 0, false, true, 1e308, 0);
    expect(a?.kind).toBe('arc');
    if (a?.kind !== 'arc') return;
    expect(a.cx).toBeCloseTo(0, 0);
    expect(a.rx).toBe(1e308);
    expect(Math.abs(a.dtheta)).toBeCloseTo(Math.PI, 12);
  });
});
