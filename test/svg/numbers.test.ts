import { describe, expect, it } from 'vitest';
import { parseNumberList, scanNumber, skipCommaWsp, type NumberScan } from '../../src/svg/numbers.js';
import { rng } from '../rng.js';


function scan(s: string, i = 0): NumberScan | null {
  const out: NumberScan = { value: 0, end: 0 };
  return scanNumber(s, i, out) ? out : null;
}

describe('scanNumber', () => {
  it('greedy tokens (S2 §9.3.9)', () => {
    expect(scan('100-200')).toEqual({ value: 100, end: 3 });
    expect(scan('0.6.5')).toEqual({ value: 0.6, end: 3 });
    expect(scan('0.6.5', 3)).toEqual({ value: 0.5, end: 5 });
    expect(scan('23.')).toEqual({ value: 23, end: 3 });
    expect(scan('1e')).toEqual({ value: 1, end: 1 });
    expect(scan('1e+')).toEqual({ value: 1, end: 1 });
    expect(scan('1em')).toEqual({ value: 1, end: 1 });
    expect(scan('-1.5E-3x')).toEqual({ value: -0.0015, end: 7 });
    expect(Object.is(scan('-0')!.value, -0)).toBe(true);
    for (const bad of ['', '.', '-', '+.', 'e5', ',1', ' 1']) expect(scan(bad), bad).toBeNull();
  });

  it('equals Number() on random decimal strings (seeded)', () => {
    const r = rng(42);
    for (let k = 0; k < 20000; k++) {
      const intLen = Math.floor(r() * 20);
      const fracLen = Math.floor(r() * 20);
      let t = r() < 0.3 ? '-' : r() < 0.1 ? '+' : '';
      for (let i = 0; i < intLen; i++) t += String(Math.floor(r() * 10));
      if (fracLen > 0 || intLen === 0) {
        t += '.';
        for (let i = 0; i < Math.max(fracLen, intLen === 0 ? 1 : 0); i++) t += String(Math.floor(r() * 10));
      }
      if (r() < 0.3) t += (r() < 0.5 ? 'e' : 'E') + (r() < 0.5 ? '-' : '') + String(Math.floor(r() * 330));
      const got = scan(t);
      expect(got, t).not.toBeNull();
      expect(got!.end, t).toBe(t.length);
      expect(Object.is(got!.value, Number(t)), `${t}: ${got!.value} vs ${Number(t)}`).toBe(true);
    }
  });
});

describe('lists', () => {
  it('parseNumberList: whitespace and single commas', () => {
    expect(parseNumberList(' 1,2 3 ,4\n5')).toEqual({ values: [1, 2, 3, 4, 5], errorAt: -1 });
    expect(parseNumberList('1,,2')).toEqual({ values: [1], errorAt: 2 });
    expect(parseNumberList('1 2,')).toEqual({ values: [1, 2], errorAt: 4 });
    expect(parseNumberList('1 x')).toEqual({ values: [1], errorAt: 2 });
    expect(parseNumberList('')).toEqual({ values: [], errorAt: -1 });
  });
  it('skipCommaWsp skips at most one comma', () => {
    expect(skipCommaWsp(' , ,', 0)).toBe(3);
    expect(skipCommaWsp('x', 0)).toBe(0);
  });
});
