import { describe, expect, it } from 'vitest';
import { lengthToUser, mmPerPx, parseLength, pxPerUnit, viewportDiagonal } from '../../src/svg/units.js';

describe('absolute units (CSS Values 3 §5.2, REFERENCES.md §4.1 table)', () => {
  // [unit, px, mm] — CV3 §5.2 #absolute-lengths (REFERENCES.md §4.1)
  const table: Array<[string, number, number]> = [
    ['in', 96, 25.4],
    ['cm', 37.795275590551, 10],
    ['mm', 3.779527559055, 1],
    ['Q', 0.944881889764, 0.25],
    ['pt', 1.333333333333, 0.352777777778],
    ['pc', 16, 4.233333333333],
    ['px', 1, 0.264583333333],
  ];
  for (const [unit, px, mm] of table) {
    it(`1${unit} = ${px} px = ${mm} mm`, () => {
      const u = lengthToUser(`1${unit}`, 0, NaN);
      expect(u).toBeCloseTo(px, 11);
      expect(u * mmPerPx).toBeCloseTo(mm, 11);
      // unit identifiers are case-insensitive (CV3 §5.2)
      expect(lengthToUser(`1${unit.toUpperCase()}`, 0, NaN)).toBe(u);
      expect(lengthToUser(`1${unit.toLowerCase()}`, 0, NaN)).toBe(u);
    });
  }

  it('mmPerPx = 25.4/96 (CV3 §5.2: 1in = 96px = 25.4mm)', () => {
    expect(mmPerPx).toBeCloseTo(0.2645833333333, 12);
  });

  it('pxPerUnit knows the table and rejects % and unknown units', () => {
    expect(pxPerUnit('IN')).toBe(96);
    expect(pxPerUnit('%')).toBeUndefined();
    expect(pxPerUnit('furlong')).toBeUndefined();
    expect(pxPerUnit('constructor')).toBeUndefined();
  });
});

describe('parseLength', () => {
  it('reads number and unit', () => {
    expect(parseLength('10')).toEqual({ value: 10, unit: '' });
    expect(parseLength(' 2.5mm ')).toEqual({ value: 2.5, unit: 'mm' });
    expect(parseLength('1e2PX')).toEqual({ value: 100, unit: 'px' });
    expect(parseLength('-.5in')).toEqual({ value: -0.5, unit: 'in' });
    expect(parseLength('50%')).toEqual({ value: 50, unit: '%' });
    expect(parseLength('1em')).toEqual({ value: 1, unit: 'em' });
    expect(parseLength('3ex')).toEqual({ value: 3, unit: 'ex' });
    expect(parseLength('4q')).toEqual({ value: 4, unit: 'q' });
  });

  it('rejects non-lengths', () => {
    for (const bad of ['', 'auto', 'mm', '10 mm', '10furlong', '10%%', '1e', '10,5', '1e400', '5px 6px']) {
      expect(parseLength(bad), bad).toBeNull();
    }
  });
});

describe('lengthToUser', () => {
  it('em/ex use the documented 16px/8px assumption (not from a standard)', () => {
    expect(lengthToUser('2em', 0, NaN)).toBe(32);
    expect(lengthToUser('2ex', 0, NaN)).toBe(16);
  });

  it('percentages of the given base, fallback for missing or invalid', () => {
    expect(lengthToUser('50%', 300, 0)).toBe(150);
    expect(lengthToUser(undefined, 300, 7)).toBe(7);
    expect(lengthToUser('auto', 300, 7)).toBe(7);
    expect(lengthToUser('', 300, 7)).toBe(7);
  });

  it('U1: r="1%" in a 4000×2000 viewport = 31.6228', () => {
    // W3C SVG 2 §8.9 #Units example (REFERENCES.md §3 U1): % of sqrt(w²+h²)/sqrt(2)
    const d = viewportDiagonal(4000, 2000);
    expect(d).toBeCloseTo(Math.sqrt(4000 ** 2 + 2000 ** 2) / Math.SQRT2, 9);
    expect(lengthToUser('1%', d, NaN)).toBeCloseTo(31.6228, 4);
  });
});
