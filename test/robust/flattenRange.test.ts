/**
 * Fix found by the hostile-input suite (issue 6): flattening let Infinity and
 * NaN vertices through (1e308 coordinates, overflowing transforms), which then
 * crashed the fitter or the report with a RangeError out of refitSvg.
 */
import { describe, expect, it } from 'vitest';
import { COORD_LIMIT_FACTOR, flattenPath } from '../../src/geom/flatten.js';
import { parsePathData } from '../../src/svg/pathData.js';
import { identityMatrix } from '../../src/svg/matrix.js';

describe('flattenPath refuses coordinates beyond the double-precision range of the tolerance', () => {
  it('throws a RangeError (refitSvg then keeps the element) instead of returning Infinity/NaN vertices', () => {
    const id = identityMatrix();
    const huge = parsePathData('M0 0 L 1e308 0 L 1e308 1e308 Z');
    expect(() => flattenPath(huge, id, 0.1)).toThrow(/beyond ±1\.10e\+11 mm/);
    // A transform that overflows finite input to Infinity is caught the same way.
    const m = new Float64Array([1e300, 0, 0, 1e300, 0, 0]);
    expect(() => flattenPath(parsePathData('M0 0 L 1e10 0'), m, 0.1)).toThrow(RangeError);
    // Just inside the limit is fine.
    const lim = 0.1 * COORD_LIMIT_FACTOR;
    const ok = flattenPath(parsePathData(`M0 0 L ${lim} 0 L ${lim} ${lim}`), id, 0.1);
    expect(ok).toHaveLength(1);
  });
});
