import { describe, expect, it } from 'vitest';
import {
  applyX, applyY, determinant, identityMatrix, invert, isSimilarity, matrix,
  maxScale, minScale, multiply, transformBuffer,
} from '../../src/svg/matrix.js';
import { rng } from '../rng.js';


function randomMatrix(r: () => number) {
  return matrix(r() * 4 - 2, r() * 4 - 2, r() * 4 - 2, r() * 4 - 2, r() * 200 - 100, r() * 200 - 100);
}

describe('matrix basics', () => {
  it('identity and constructor', () => {
    expect(Array.from(identityMatrix())).toEqual([1, 0, 0, 1, 0, 0]);
    expect(Array.from(matrix(1, 2, 3, 4, 5, 6))).toEqual([1, 2, 3, 4, 5, 6]);
  });

  it('applies matrix(a b c d e f) as (a·x + c·y + e, b·x + d·y + f)', () => {
    // W3C SVG 1.1 §7.6 / CT1 mathematical description (REFERENCES.md §5.1)
    const m = matrix(1, 2, 3, 4, 5, 6);
    expect(applyX(m, 10, 100)).toBe(1 * 10 + 3 * 100 + 5);
    expect(applyY(m, 10, 100)).toBe(2 * 10 + 4 * 100 + 6);
  });

  it('multiply: a·b maps a point by b first', () => {
    // CT1 transform-function-lists (REFERENCES.md §5.1, T6): translate(10,20) scale(2) on (1,1) → (12,22)
    const t = matrix(1, 0, 0, 1, 10, 20);
    const s = matrix(2, 0, 0, 2, 0, 0);
    const ts = multiply(identityMatrix(), t, s);
    expect([applyX(ts, 1, 1), applyY(ts, 1, 1)]).toEqual([12, 22]);
    const st = multiply(identityMatrix(), s, t);
    expect([applyX(st, 1, 1), applyY(st, 1, 1)]).toEqual([22, 42]);
  });

  it('multiply agrees with mapping twice, and is aliasing-safe, inputs unmodified', () => {
    const r = rng(7);
    for (let k = 0; k < 50; k++) {
      const a = randomMatrix(r), b = randomMatrix(r);
      const a0 = Array.from(a), b0 = Array.from(b);
      const ab = multiply(new Float64Array(6), a, b);
      expect(Array.from(a)).toEqual(a0);
      expect(Array.from(b)).toEqual(b0);
      const x = r() * 10, y = r() * 10;
      const bx = applyX(b, x, y), by = applyY(b, x, y);
      expect(applyX(ab, x, y)).toBeCloseTo(applyX(a, bx, by), 9);
      expect(applyY(ab, x, y)).toBeCloseTo(applyY(a, bx, by), 9);
      const a1 = Float64Array.from(a);
      expect(Array.from(multiply(a1, a1, b))).toEqual(Array.from(ab));
      const b1 = Float64Array.from(b);
      expect(Array.from(multiply(b1, a, b1))).toEqual(Array.from(ab));
      const sq = multiply(new Float64Array(6), a, a);
      const a2 = Float64Array.from(a);
      expect(Array.from(multiply(a2, a2, a2))).toEqual(Array.from(sq));
    }
  });

  it('determinant of matrix(1 2 3 4) is -2', () => {
    // KURBO affine.rs svd test (REFERENCES.md §5.2 T7)
    expect(determinant(matrix(1, 2, 3, 4, 0, 0))).toBe(-2);
  });
});

describe('invert', () => {
  it('m·m⁻¹ = identity for random matrices, in place too', () => {
    const r = rng(11);
    for (let k = 0; k < 50; k++) {
      const m = randomMatrix(r);
      const inv = invert(new Float64Array(6), m);
      expect(inv).not.toBeNull();
      const p = multiply(new Float64Array(6), m, inv!);
      const id = [1, 0, 0, 1, 0, 0];
      // tolerance scaled by condition: random entries in [-2,2] can be badly conditioned
      const tol = 1e-9 * maxScale(m) / Math.max(minScale(m), 1e-12) * 100;
      for (let i = 0; i < 6; i++) expect(Math.abs(p[i] - id[i])).toBeLessThan(tol);
      const inPlace = Float64Array.from(m);
      expect(Array.from(invert(inPlace, inPlace)!)).toEqual(Array.from(inv!));
    }
  });

  it('returns null for singular and non-finite matrices, leaving out untouched', () => {
    const out = matrix(9, 9, 9, 9, 9, 9);
    expect(invert(out, matrix(1, 2, 2, 4, 0, 0))).toBeNull();
    expect(invert(out, matrix(0, 0, 0, 0, 1, 1))).toBeNull();
    expect(invert(out, matrix(NaN, 0, 0, 1, 0, 0))).toBeNull();
    expect(invert(out, matrix(1, 0, 0, 1, Infinity, 0))).toBeNull();
    expect(invert(out, matrix(1e-320, 0, 0, 1e-320, 0, 0))).toBeNull(); // det underflows to 0
    expect(Array.from(out)).toEqual([9, 9, 9, 9, 9, 9]);
  });

  it('inverts a known matrix exactly: translate(10,20) scale(2)', () => {
    const inv = invert(new Float64Array(6), matrix(2, 0, 0, 2, 10, 20))!;
    expect(Array.from(inv, (v) => v + 0)).toEqual([0.5, 0, 0, 0.5, -5, -10]);
  });
});

describe('transformBuffer', () => {
  it('maps pairs like applyX/applyY, in place allowed', () => {
    const m = matrix(1, 2, 3, 4, 5, 6);
    const xy = Float64Array.from([0, 0, 1, 0, 0, 1, 2.5, -3]);
    const out = transformBuffer(new Float64Array(8), m, xy);
    for (let i = 0; i < 8; i += 2) {
      expect(out[i]).toBe(applyX(m, xy[i], xy[i + 1]));
      expect(out[i + 1]).toBe(applyY(m, xy[i], xy[i + 1]));
    }
    const same = transformBuffer(xy, m, xy);
    expect(same).toBe(xy);
    expect(Array.from(xy)).toEqual(Array.from(out));
  });
});

describe('scales and similarity', () => {
  it('singular values of matrix(1 2 3 4)', () => {
    // KURBO affine.rs svd test (REFERENCES.md §5.2 T7)
    const m = matrix(1, 2, 3, 4, 5, 6);
    expect(maxScale(m)).toBeCloseTo(5.4649857042190427, 12);
    expect(minScale(m)).toBeCloseTo(0.36596619062625782, 12);
  });

  it('skewX(45): σ = golden ratio and its inverse', () => {
    // REFERENCES.md §5.2 T11 (unit circle under skewX(45) → rx 1.618034, ry 0.618034)
    const m = matrix(1, 0, 1, 1, 0, 0);
    expect(maxScale(m)).toBeCloseTo((1 + Math.sqrt(5)) / 2, 12);
    expect(minScale(m)).toBeCloseTo((Math.sqrt(5) - 1) / 2, 12);
    expect(isSimilarity(m, 1e-9)).toBe(false);
  });

  it('rotation·uniform scale·reflection is a similarity; non-uniform scale is not', () => {
    const r = rng(3);
    for (let k = 0; k < 20; k++) {
      const t = r() * 2 * Math.PI, s = 0.1 + r() * 10;
      const rot = matrix(s * Math.cos(t), s * Math.sin(t), -s * Math.sin(t), s * Math.cos(t), r() * 50, r() * 50);
      expect(isSimilarity(rot, 1e-9)).toBe(true);
      expect(maxScale(rot)).toBeCloseTo(s, 10);
      expect(minScale(rot)).toBeCloseTo(s, 10);
      const mirrored = multiply(new Float64Array(6), rot, matrix(1, 0, 0, -1, 0, 0));
      expect(isSimilarity(mirrored, 1e-9)).toBe(true);
      expect(determinant(mirrored)).toBeLessThan(0);
    }
    expect(isSimilarity(matrix(2, 0, 0, 1, 0, 0), 1e-9)).toBe(false);
    expect(isSimilarity(matrix(2, 0, 0, 2.0001, 0, 0), 1e-3)).toBe(true);
    expect(isSimilarity(matrix(0, 0, 0, 0, 0, 0), 1e-9)).toBe(false);
  });

  it('minScale of a singular matrix is 0', () => {
    expect(minScale(matrix(1, 2, 2, 4, 0, 0))).toBe(0);
    expect(maxScale(matrix(1, 2, 2, 4, 0, 0))).toBeCloseTo(5, 12);
  });
});
