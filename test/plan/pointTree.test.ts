import { describe, expect, it } from 'vitest';
import { PointTree } from '../../src/plan/pointTree.js';
import { rng } from '../rng.js';

// Checked against brute force over all points (the definition of nearest), seeded.
function randomPoints(n: number, seed: number, clustered = false): Float64Array {
  const r = rng(seed);
  const xy = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    // Clustered: most points in a 1 mm square, a few far away, and exact duplicates.
    const far = clustered && i % 50 === 0;
    xy[2 * i] = clustered ? (far ? 300 * r() : r()) : 300 * r();
    xy[2 * i + 1] = clustered ? (far ? 300 * r() : r()) : 300 * r();
    if (clustered && i % 7 === 3) {
      xy[2 * i] = xy[2 * i - 2];
      xy[2 * i + 1] = xy[2 * i - 1];
    }
  }
  return xy;
}

const d2 = (xy: Float64Array, i: number, x: number, y: number): number => (xy[2 * i] - x) ** 2 + (xy[2 * i + 1] - y) ** 2;

describe('PointTree', () => {
  for (const clustered of [false, true]) {
    it(`nearest with removal matches brute force (${clustered ? 'clustered, duplicates' : 'uniform'})`, () => {
      const xy = randomPoints(2000, 5, clustered);
      const tree = new PointTree(xy);
      const alive = new Uint8Array(2000).fill(1);
      const r = rng(9);
      for (let q = 0; q < 1500; q++) {
        const x = clustered ? r() : 300 * r(), y = clustered ? r() : 300 * r();
        const got = tree.nearest(x, y);
        let best = Infinity;
        for (let i = 0; i < 2000; i++) if (alive[i]) best = Math.min(best, d2(xy, i, x, y));
        expect(d2(xy, got, x, y)).toBe(best);
        tree.remove(got);
        alive[got] = 0;
        if (q % 3 === 0) {
          // Restore an earlier removed point now and then.
          const back = Math.floor(r() * 2000);
          tree.restore(back);
          alive[back] = 1;
        }
      }
    });
  }

  it('k nearest within a radius, with a filter, match brute force', () => {
    const xy = randomPoints(3000, 11);
    const tree = new PointTree(xy);
    const ids = new Int32Array(10), ds = new Float64Array(10);
    const r = rng(3);
    for (let q = 0; q < 300; q++) {
      const x = 300 * r(), y = 300 * r();
      const found = tree.nearestK(x, y, 10, 12, (id) => id % 3 !== 0, ids, ds);
      const brute = Array.from({ length: 3000 }, (_, i) => i)
        .filter((i) => i % 3 !== 0 && d2(xy, i, x, y) <= 144)
        .map((i) => d2(xy, i, x, y))
        .sort((a, b) => a - b)
        .slice(0, 10);
      expect(found).toBe(brute.length);
      expect(Array.from(ds.subarray(0, found))).toEqual(brute);
    }
  });

  it('gives -1 when every point is removed', () => {
    const tree = new PointTree(Float64Array.of(1, 1, 2, 2));
    tree.remove(0);
    tree.remove(1);
    tree.remove(1);
    expect(tree.nearest(0, 0)).toBe(-1);
    tree.restore(1);
    expect(tree.nearest(0, 0)).toBe(1);
  });
});
