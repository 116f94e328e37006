import { describe, expect, it } from 'vitest';
import { angleDigits, digitsForRounding, formatNumber, roundTo, roundingErrorMm } from '../../src/write/numbers.js';

describe('formatNumber', () => {
  it('drops trailing zeros, a trailing dot and the leading zero', () => {
    // Leading-zero-free and signed forms are numbers in W3C SVG 1.1 §8.3.9 grammar (REFERENCES.md §2.4 P3).
    expect(formatNumber(0.5, 3)).toBe('.5');
    expect(formatNumber(-0.5, 3)).toBe('-.5');
    expect(formatNumber(12.5, 3)).toBe('12.5');
    expect(formatNumber(12, 3)).toBe('12');
    expect(formatNumber(12.0004, 3)).toBe('12');
    expect(formatNumber(100, 0)).toBe('100');
    expect(formatNumber(0.9996, 3)).toBe('1');
    expect(formatNumber(-0.9996, 3)).toBe('-1');
  });

  it('never writes -0', () => {
    expect(formatNumber(-0, 2)).toBe('0');
    expect(formatNumber(-0.0001, 2)).toBe('0');
    expect(formatNumber(-0.004, 2)).toBe('0');
    expect(formatNumber(-0.006, 2)).toBe('-.01');
  });

  it('avoids exponent notation at both ends of the range', () => {
    // Number.prototype.toString would give "1e-7" and "1e+21" (ECMAScript Number::toString, from memory).
    expect(formatNumber(1e-7, 10)).toBe('.0000001');
    expect(formatNumber(-1e-7, 7)).toBe('-.0000001');
    expect(formatNumber(1e-7, 6)).toBe('0');
    expect(formatNumber(1e21, 3)).toBe('1000000000000000000000');
    expect(formatNumber(-2.5e22, 2)).toBe('-25000000000000000000000');
    for (const v of [1e-7, 3e-9, 1e21, 123456789012345680000, -2.5e22, 1.7976931348623157e308]) {
      expect(formatNumber(v, 12)).not.toMatch(/e/i);
      if (Math.abs(v) >= 1) expect(Number(formatNumber(v, 12))).toBe(v); // reads back as the same double
    }
  });

  it('reads back to the rounded value', () => {
    let seed = 7;
    const rnd = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    for (let i = 0; i < 2000; i++) {
      const v = (rnd() - 0.5) * Math.pow(10, Math.floor(rnd() * 12) - 4);
      const d = Math.floor(rnd() * 8);
      const t = formatNumber(v, d);
      expect(Math.abs(Number(t) - v)).toBeLessThanOrEqual(0.5 * Math.pow(10, -d) * (1 + 1e-9) + Math.abs(v) * 1e-15);
      expect(t).not.toMatch(/\.$|\.\d*0$|^-?0\d|^-0$/);
      expect(roundTo(Number(t), d)).toBe(Number(t));
    }
  });

  it('rejects bad input with the value in the message', () => {
    expect(() => formatNumber(NaN, 2)).toThrow(/NaN/);
    expect(() => formatNumber(Infinity, 2)).toThrow(/Infinity/);
    expect(() => formatNumber(1, 2.5)).toThrow(/2\.5/);
    expect(() => formatNumber(1, -1)).toThrow(/-1/);
  });
});

describe('digitsForRounding', () => {
  it('keeps the rounding of a point within the allowance, with the fewest decimals', () => {
    const units = [1, 25.4 / 96, 25.4, 0.001, 1000]; // mm, CSS px, in, µm, m (CSS Values 3 §5.2, REFERENCES.md §4.1)
    for (const mmPerUnit of units) {
      for (const tol of [1, 0.1, 0.05, 0.01, 0.001]) {
        const d = digitsForRounding(tol / 20, mmPerUnit);
        expect(roundingErrorMm(d, mmPerUnit)).toBeLessThanOrEqual(tol / 20);
        if (d > 0) expect(roundingErrorMm(d - 1, mmPerUnit)).toBeGreaterThan(tol / 20);
      }
    }
  });

  it('gives hand-checked values', () => {
    // 0.1 mm at CSS px: √2·½·10^−2·0.2646 = 0.00187 ≤ 0.005, at 1 decimal 0.0187 > 0.005.
    expect(digitsForRounding(0.1 / 20, 25.4 / 96)).toBe(2);
    // 0.1 mm in mm units: 10^−d·0.7071 ≤ 0.005 → d = 3 (0.000707), d = 2 gives 0.00707.
    expect(digitsForRounding(0.1 / 20, 1)).toBe(3);
    // metres: 1 user unit = 1000 mm; 0.01 mm tolerance → 0.0005 mm / (0.7071·1000) → d = 7.
    expect(digitsForRounding(0.01 / 20, 1000)).toBe(7);
    expect(digitsForRounding(1000 / 20, 1)).toBe(0);
  });

  it('bounds the displacement of a rounded point (checked by rounding points)', () => {
    const d = digitsForRounding(0.05 / 20, 25.4 / 96);
    const bound = roundingErrorMm(d, 25.4 / 96);
    let seed = 99;
    const rnd = (): number => ((seed = (seed * 48271) % 2147483647) / 2147483647);
    let worst = 0;
    for (let i = 0; i < 5000; i++) {
      const x = rnd() * 1000, y = rnd() * 1000;
      worst = Math.max(worst, Math.hypot(roundTo(x, d) - x, roundTo(y, d) - y) * (25.4 / 96));
    }
    expect(worst).toBeLessThanOrEqual(bound);
    expect(worst).toBeGreaterThan(bound * 0.8); // the bound is nearly reached, so it is not loose
  });

  it('rejects non-positive input', () => {
    expect(() => digitsForRounding(0 / 20, 1)).toThrow(/0/);
    expect(() => digitsForRounding(0.1 / 20, -2)).toThrow(/-2/);
  });
});

describe('angleDigits', () => {
  it('keeps the point motion of a rounded rotation within half a unit of the length digits', () => {
    for (const r of [0.5, 1, 57, 100, 12345]) {
      for (const dl of [0, 2, 4]) {
        const k = angleDigits(dl, r);
        expect(r * (Math.PI / 180) * 0.5 * Math.pow(10, -k)).toBeLessThanOrEqual(0.5 * Math.pow(10, -dl) * (1 + 1e-12));
      }
    }
  });
});
