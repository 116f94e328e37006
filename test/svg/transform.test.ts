import { describe, expect, it } from 'vitest';
import { parseTransform } from '../../src/svg/transform.js';
import { applyX, applyY } from '../../src/svg/matrix.js';
import type { Matrix } from '../../src/svg/matrixTypes.js';

function ok(text: string): Matrix {
  const r = parseTransform(text);
  expect(r.error).toBeNull();
  return r.matrix;
}

function at(m: Matrix, x: number, y: number): [number, number] {
  return [applyX(m, x, y), applyY(m, x, y)];
}

function close(m: Matrix, expected: number[], digits = 12): void {
  expect(m.length).toBe(6);
  for (let i = 0; i < 6; i++) expect(m[i]).toBeCloseTo(expected[i], digits);
}

describe('parseTransform check values (REFERENCES.md §5.1)', () => {
  it('T1 translate(10) → matrix(1 0 0 1 10 0)', () => {
    // W3C SVG 1.1 §7.6, CT1 (REFERENCES.md §5.2 T1): ty defaults to 0
    expect(Array.from(ok('translate(10)'))).toEqual([1, 0, 0, 1, 10, 0]);
  });

  it('T2 scale(2) → matrix(2 0 0 2 0 0)', () => {
    // W3C SVG 1.1 §7.6, CT1 (T2): sy defaults to sx
    expect(Array.from(ok('scale(2)'))).toEqual([2, 0, 0, 2, 0, 0]);
  });

  it('T3 rotate(90) maps (1,0) to (0,1)', () => {
    // W3C SVG 1.1 §7.6 (T3): positive angle is clockwise on screen (y down)
    const p = at(ok('rotate(90)'), 1, 0);
    expect(p[0]).toBeCloseTo(0, 15);
    expect(p[1]).toBeCloseTo(1, 15);
  });

  it('T4 rotate(90 10 0) = matrix(0 1 -1 0 10 -10); (20,0) → (10,10)', () => {
    // W3C SVG 1.1 §7.6 (T4): rotate about a centre
    const m = ok('rotate(90 10 0)');
    close(m, [0, 1, -1, 0, 10, -10]);
    const p = at(m, 20, 0);
    expect(p[0]).toBeCloseTo(10, 12);
    expect(p[1]).toBeCloseTo(10, 12);
  });

  it('T5 skewX(45) on (0,10) → (10,10); skewY(45) on (10,0) → (10,10)', () => {
    // CT1 mathematical description (T5)
    const a = at(ok('skewX(45)'), 0, 10);
    expect(a[0]).toBeCloseTo(10, 12);
    expect(a[1]).toBeCloseTo(10, 12);
    const b = at(ok('skewY(45)'), 10, 0);
    expect(b[0]).toBeCloseTo(10, 12);
    expect(b[1]).toBeCloseTo(10, 12);
  });

  it('T6 translate(10,20) scale(2) on (1,1) → (12,22); reversed → (22,42)', () => {
    // CT1 transform-function-lists (T6): the list equals nested groups
    expect(at(ok('translate(10,20) scale(2)'), 1, 1)).toEqual([12, 22]);
    expect(at(ok('scale(2) translate(10,20)'), 1, 1)).toEqual([22, 42]);
  });
});

describe('parseTransform grammar', () => {
  it('matrix(a b c d e f) is taken as written', () => {
    // W3C SVG 1.1 §7.6: matrix(a b c d e f) maps (x,y) → (ax+cy+e, bx+dy+f)
    expect(Array.from(ok('matrix(1 2 3 4 5 6)'))).toEqual([1, 2, 3, 4, 5, 6]);
    expect(Array.from(ok('matrix(1,2,3,4,5,6)'))).toEqual([1, 2, 3, 4, 5, 6]);
    expect(Array.from(ok('matrix( 1 , 2 ,3, 4 ,5 ,6 )'))).toEqual([1, 2, 3, 4, 5, 6]);
  });

  it('accepts compact numbers, exponents and whitespace before "("', () => {
    // greedy number rule shared with path data (S2 §9.3.9); SVG 1.1 grammar allows wsp* before "("
    expect(Array.from(ok('translate(10-5)'))).toEqual([1, 0, 0, 1, 10, -5]);
    expect(Array.from(ok('translate (1e1,.5)'))).toEqual([1, 0, 0, 1, 10, 0.5]);
    expect(Array.from(ok('\n\t translate(1)  \n'))).toEqual([1, 0, 0, 1, 1, 0]);
  });

  it('functions may be separated by commas, whitespace or nothing', () => {
    const expected = Array.from(ok('translate(10,20) scale(2)'));
    expect(Array.from(ok('translate(10,20),scale(2)'))).toEqual(expected);
    expect(Array.from(ok('translate(10,20)scale(2)'))).toEqual(expected);
    expect(Array.from(ok('translate(10,20) , scale(2)'))).toEqual(expected);
  });

  it('scale with two values, rotate(0), empty string and none', () => {
    expect(Array.from(ok('scale(2 3)'))).toEqual([2, 0, 0, 3, 0, 0]);
    expect(Array.from(ok('rotate(0)'))).toEqual([1, 0, 0, 1, 0, 0]);
    expect(Array.from(ok(''))).toEqual([1, 0, 0, 1, 0, 0]);
    expect(Array.from(ok('  '))).toEqual([1, 0, 0, 1, 0, 0]);
    expect(Array.from(ok('none'))).toEqual([1, 0, 0, 1, 0, 0]);
  });

  it('rotate(α cx cy) equals translate(cx cy) rotate(α) translate(-cx -cy)', () => {
    // W3C SVG 1.1 §7.6 (REFERENCES.md §5.1)
    const a = ok('rotate(33 7 -4)');
    const b = ok('translate(7 -4) rotate(33) translate(-7 4)');
    close(a, Array.from(b));
  });

  it('rotate by non-multiples of 90 uses cos/sin of degrees', () => {
    const t = (30 * Math.PI) / 180;
    close(ok('rotate(30)'), [Math.cos(t), Math.sin(t), -Math.sin(t), Math.cos(t), 0, 0], 15);
    close(ok('rotate(-270)'), [0, 1, -1, 0, 0, 0], 15);
  });

  it('skewX(30) uses tan of degrees', () => {
    close(ok('skewX(30)'), [1, 0, Math.tan(Math.PI / 6), 1, 0, 0], 15);
    close(ok('skewY(-45)'), [1, -1, 0, 1, 0, 0], 15);
  });
});

describe('parseTransform errors: whole list ignored → identity', () => {
  const bad: Array<[string, RegExp]> = [
    ['translate(10', /missing "\)"/],
    ['translate(10) scale(1 2 3)', /scale\(\) takes 1 or 2 arguments, got 3/],
    ['rotate(1 2)', /rotate\(\) takes 1 or 3/],
    ['matrix(1 2 3 4 5)', /takes 6/],
    ['translate()', /got 0/],
    ['shift(3)', /unknown function "shift"/],
    ['Translate(3)', /unknown function/],
    ['constructor(1)', /unknown function/],
    ['translate(10px)', /expected a number/],
    ['translate 10', /expected "\("/],
    ['translate(1,)', /comma before/],
    [',translate(1)', /leading comma/],
    ['translate(1),', /trailing separator/],
    ['skewX(90)', /not finite/],
    ['scale(1e400)', /out of range/],
  ];
  for (const [text, re] of bad) {
    it(`"${text}"`, () => {
      const r = parseTransform(text);
      expect(r.error).toMatch(re);
      expect(r.error).toMatch(/offset \d+/);
      expect(Array.from(r.matrix)).toEqual([1, 0, 0, 1, 0, 0]);
    });
  }

  it('reports the offset of the bad function', () => {
    expect(parseTransform('translate(1) shift(3)').error).toMatch(/offset 13/);
  });
});
