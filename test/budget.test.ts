import { describe, expect, it } from 'vitest';
import { FLATTEN_SHARE, MIN_FIT_SHARE, ROUNDING_SHARE, splitTolerance, writtenRoundingMm } from '../src/budget.js';
import { roundingErrorMm } from '../src/write/numbers.js';

describe('splitTolerance', () => {
  it('splits the whole tolerance and no more (triangle inequality: the shares add up to it)', () => {
    for (const mmPerUnit of [1, 25.4 / 96, 25.4, 1000]) {
      for (const tol of [1, 0.1, 0.05, 0.01]) {
        for (const curved of [true, false]) {
          const b = splitTolerance(tol, { curved, mmPerUnit });
          expect(b.flattenMm + b.roundMm + b.fitMm).toBeCloseTo(tol, 12);
          expect(b.flattenMm).toBe(curved ? FLATTEN_SHARE * tol : 0);
          // The fewest digits whose written bound fits the rounding share.
          expect(b.roundMm).toBeLessThanOrEqual(ROUNDING_SHARE * tol);
          if (b.digits > 0) expect(writtenRoundingMm(b.digits - 1, mmPerUnit)).toBeGreaterThan(ROUNDING_SHARE * tol);
          expect(b.fits).toBe(true);
        }
      }
    }
  });

  it('gives hand-checked digits', () => {
    // CSS px, 0.1 mm: 3·√2·½·10^−d·0.26458 ≤ 0.005 → d = 3 (0.00056); d = 2 gives 0.0056 > 0.005.
    expect(splitTolerance(0.1, { curved: true, mmPerUnit: 25.4 / 96 }).digits).toBe(3);
    // mm output (a G-code or DXF writer), 0.05 mm: 2.1213·10^−d ≤ 0.0025 → d = 3 (0.00212).
    const mm = splitTolerance(0.05, { curved: false, mmPerUnit: 1 });
    expect(mm.digits).toBe(3);
    expect(mm.roundMm).toBeCloseTo(3 * roundingErrorMm(3, 1), 15);
  });

  it('says when fixed digits leave the fit too little', () => {
    // 1 decimal in mm: 3·√2·½·0.1 = 0.212 mm of rounding, more than half of 0.1 mm.
    const b = splitTolerance(0.1, { curved: true, mmPerUnit: 1, digits: 1 });
    expect(b.digits).toBe(1);
    expect(b.fitMm).toBeLessThan(MIN_FIT_SHARE * 0.1);
    expect(b.fits).toBe(false);
  });

  it('refuses a tolerance that is not a positive number, naming it', () => {
    expect(() => splitTolerance(-1, { curved: true, mmPerUnit: 1 })).toThrow(/-1/);
  });
});
