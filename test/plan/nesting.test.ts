import { describe, expect, it } from 'vitest';
import { nestingParents, windingNumber } from '../../src/plan/nesting.js';
import { signedArea } from '../../src/geom/area.js';

const square = (x0: number, y0: number, x1: number, y1: number, cw = false): Float64Array =>
  cw ? Float64Array.of(x0, y0, x0, y1, x1, y1, x1, y0) : Float64Array.of(x0, y0, x1, y0, x1, y1, x0, y1);

describe('winding and area', () => {
  // Check values P5 of the shared references §11.5 (winding numbers), computed there independently.
  it('gives the reference winding numbers', () => {
    expect(windingNumber(square(0, 0, 10, 10), 5, 5)).toBe(1);
    expect(windingNumber(square(0, 0, 10, 10, true), 5, 5)).toBe(-1);
    expect(windingNumber(square(0, 0, 10, 10), 15, 5)).toBe(0);
    const twice = new Float64Array([...square(0, 0, 10, 10), ...square(0, 0, 10, 10)]);
    expect(windingNumber(twice, 5, 5)).toBe(2);
    // Pentagram: vertices of a regular pentagon taken every second one; its centre has winding 2.
    const star = new Float64Array(10);
    for (let k = 0; k < 5; k++) {
      const a = Math.PI / 2 + (4 * Math.PI * k) / 5;
      star[2 * k] = Math.cos(a);
      star[2 * k + 1] = Math.sin(a);
    }
    expect(Math.abs(windingNumber(star, 0, 0))).toBe(2);
  });

  it('gives the shoelace area of a square', () => {
    expect(signedArea(square(0, 0, 10, 10))).toBe(100);
    expect(signedArea(square(0, 0, 10, 10, true))).toBe(-100);
  });
});

describe('nestingParents', () => {
  // Check values P6 of the shared references §11.5: outer 0–100, hole 10–40 (CW), island 20–30 in the
  // hole, hole2 60–90 → island→hole→outer, hole2→outer.
  it('finds the reference nesting forest', () => {
    const cs = [
      { xy: square(0, 0, 100, 100), closed: true },
      { xy: square(10, 10, 40, 40, true), closed: true },
      { xy: square(20, 20, 30, 30), closed: true },
      { xy: square(60, 60, 90, 90, true), closed: true },
      { xy: Float64Array.of(65, 65, 80, 80), closed: false },
      { xy: Float64Array.of(200, 200, 210, 210), closed: false },
    ];
    expect(Array.from(nestingParents(cs))).toEqual([-1, 0, 1, 0, 3, -1]);
  });
});
