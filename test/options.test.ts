/** The options module: defaults, units in tolerance text, unknown keys refused with a suggestion. */
import { describe, expect, it } from 'vitest';
import { closestOption, DEFAULT_OPTIONS, OptionError, resolveOptions, type ArcsplineOptions } from '../src/options.js';
import { refitSvg } from '../src/refit.js';

const SVG = '<svg xmlns="http://www.w3.org/2000/svg" width="10mm" height="10mm" viewBox="0 0 10 10"><path d="M1 1C3 5 7 5 9 1"/></svg>';

describe('resolveOptions', () => {
  it('takes a tolerance with a unit as the CLI does (CSS Values 3 §5.2: 1in = 25.4mm = 96px)', () => {
    expect(resolveOptions({ tolerance: '0.05mm' }).tolerance).toBe(0.05);
    expect(resolveOptions({ tolerance: '0.002in' }).tolerance).toBeCloseTo(0.0508, 12);
    expect(resolveOptions({ tolerance: '0.1' }).tolerance).toBe(0.1);
    expect(refitSvg(SVG, { tolerance: '0.05mm' }).report.toleranceMm).toBe(0.05);
    expect(() => resolveOptions({ tolerance: '0.05 furlong' })).toThrow(/0\.05 furlong/);
  });

  it('refuses an unknown key, naming it and the closest known option', () => {
    const typo = { tolerence: 0.01 } as unknown as ArcsplineOptions;
    expect(() => resolveOptions(typo)).toThrow(OptionError);
    expect(() => resolveOptions(typo)).toThrow('unknown option "tolerence"; did you mean "tolerance"?');
    expect(() => refitSvg(SVG, typo)).toThrow(/did you mean "tolerance"/);
    expect(() => resolveOptions({ cornerangle: 20 } as unknown as ArcsplineOptions)).toThrow(/did you mean "cornerAngle"/);
    // Nothing near: the known options are listed instead.
    expect(() => resolveOptions({ zzzzzzzzzzzz: 1 } as unknown as ArcsplineOptions)).toThrow(/known options: tolerance, cornerAngle/);
    expect(closestOption('digit')).toBe('digits');
    expect(closestOption('colour')).toBeNull();
  });

  it('a flag must be a boolean, and null is not a default (a plain JavaScript caller gets a clear error)', () => {
    expect(() => resolveOptions({ plan: 'yes' } as unknown as ArcsplineOptions)).toThrow('plan must be true or false, got yes');
    expect(() => resolveOptions({ planJoin: null } as unknown as ArcsplineOptions)).toThrow('planJoin must be true or false, got null');
    expect(() => resolveOptions({ tolerance: null } as unknown as ArcsplineOptions)).toThrow(/tolerance must be a positive number of mm, got null/);
    // Options whose value may be null take it.
    expect(resolveOptions({ digits: null, joinDistance: null })).toMatchObject({ digits: null, joinDistance: null });
  });

  it('refuses a tolerance below 0.1 µm by name (it once crashed the measurement or wrote an empty program)', () => {
    expect(() => resolveOptions({ tolerance: 1e-6 })).toThrow(/tolerance 0.000001 mm is below 0.0001 mm/);
    expect(() => resolveOptions({ tolerance: '0.00001mm' })).toThrow(OptionError);
    expect(resolveOptions({ tolerance: 1e-4 }).tolerance).toBe(1e-4);
  });

  it('fills every left-out field from DEFAULT_OPTIONS (a partial object is the input type)', () => {
    const input: ArcsplineOptions = {};
    expect(resolveOptions(input)).toEqual(DEFAULT_OPTIONS);
    expect(resolveOptions({ digits: 0, bakeTransforms: false }).digits).toBe(0);
    expect(resolveOptions({ tolerance: undefined }).tolerance).toBe(DEFAULT_OPTIONS.tolerance);
  });
});
