import { describe, expect, it } from 'vitest';
import { SegmentGrid, distPointSegment } from '../../src/measure/segmentGrid.js';
import { rng } from '../rng.js';


/** Brute force over every segment (kept here, independent of the grid). */
function brute(polylines: Float64Array[], px: number, py: number): number {
  let best = Infinity;
  for (const pl of polylines) {
    if (pl.length === 2) best = Math.min(best, distPointSegment(px, py, pl[0], pl[1], pl[0], pl[1]));
    for (let i = 0; i + 3 < pl.length; i += 2) best = Math.min(best, distPointSegment(px, py, pl[i], pl[i + 1], pl[i + 2], pl[i + 3]));
  }
  return best;
}

function walk(rand: () => number, n: number, step: number, x = 0, y = 0): Float64Array {
  const v = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) { v[2 * i] = x; v[2 * i + 1] = y; x += (rand() - 0.5) * step; y += (rand() - 0.5) * step; }
  return v;
}

describe('SegmentGrid', () => {
  it('nearest and nearestFrom (any hint) agree exactly with brute force, inside and far outside the grid', () => {
    const rand = rng(4242);
    const g = new SegmentGrid();
    for (let trial = 0; trial < 30; trial++) {
      // short steps, a few long jumps and an isolated point: uneven density on purpose
      const shape = [walk(rand, 200 + trial * 20, 0.3), walk(rand, 5, 20, 10, -5), Float64Array.of(rand() * 50, rand() * 50)];
      expect(g.build(shape)).toBe(true);
      for (let q = 0; q < 100; q++) {
        const far = q % 10 === 0 ? 200 : 1;
        const px = (rand() - 0.3) * 30 * far, py = (rand() - 0.3) * 30 * far;
        const want = brute(shape, px, py);
        expect(g.nearest(px, py)).toBe(want);
        expect(g.distTo(px, py, g.hit)).toBe(want); // `hit` names a segment at that distance
        expect(g.nearestFrom(px, py, Math.floor(rand() * g.count))).toBe(want);
        expect(g.distTo(px, py, g.hit)).toBe(want);
      }
    }
  });

  it('degenerate shapes: one point, coincident points, a horizontal line', () => {
    const g = new SegmentGrid();
    expect(g.build([Float64Array.of(3, 4)])).toBe(true);
    expect(g.nearest(0, 0)).toBe(5); // 3-4-5 triangle
    expect(g.build([Float64Array.of(1, 1, 1, 1, 1, 1)])).toBe(true);
    expect(g.nearest(1, 4)).toBe(3);
    expect(g.build([Float64Array.of(0, 0, 10, 0, 20, 0)])).toBe(true);
    expect(g.nearest(15, -2)).toBe(2);
    expect(g.nearestFrom(15, -2, 0)).toBe(2);
    expect(g.nearest(-3, 4)).toBe(5);
    // a segment so short that 1/len² overflows counts as its first point (no NaN)
    expect(distPointSegment(3, 4, 0, 0, 1e-170, 0)).toBe(5);
    expect(g.build([Float64Array.of(0, 0, 1e-170, 0)])).toBe(true);
    expect(g.nearest(3, 4)).toBe(5);
    expect(g.nearestFrom(3, 4, 0)).toBe(5);
  });

  it('nothing to index: build is false; reuse keeps answers of the latest shape only', () => {
    const g = new SegmentGrid();
    expect(g.build([])).toBe(false);
    expect(g.build([new Float64Array(0)])).toBe(false);
    g.build([Float64Array.of(0, 0, 100, 0)]);
    g.build([Float64Array.of(0, 10, 1, 10)]);
    expect(g.count).toBe(1);
    expect(g.nearest(50, 0)).toBeCloseTo(Math.hypot(49, 10), 12);
  });

  it('keeps the cell count linear in the segments, and makes the cells finer for a dense part in a sparse extent', () => {
    const g = new SegmentGrid();
    const cluster = walk(rng(9), 5000, 0.001, 500, 500);
    g.build([Float64Array.of(0, 0), cluster, Float64Array.of(1000, 1000)]); // far outliers around a dense walk
    // at most 64 cells per segment (the sparse budget) plus the edge rows: memory stays linear
    expect(g.nx * g.ny).toBeLessThanOrEqual(64 * g.count + 2 * Math.sqrt(64 * g.count) + 1);
    // the first layout (≤ 4 cells per segment) would have cells of 1000/sqrt(4·5000) ≈ 7 mm, all of the cluster in one
    expect(g.cell).toBeLessThan(1000 / Math.sqrt(4 * g.count) / 2);
    expect(g.nearest(0, 1)).toBe(1);
    expect(g.nearest(999, 1000)).toBe(1);
    // an even shape keeps the small budget
    const ring = new Float64Array(2 * 2001);
    for (let i = 0; i <= 2000; i++) { ring[2 * i] = 20 * Math.cos(i * Math.PI / 1000); ring[2 * i + 1] = 20 * Math.sin(i * Math.PI / 1000); }
    g.build([ring]);
    expect(g.nx * g.ny).toBeLessThanOrEqual(4 * g.count + 2 * Math.sqrt(4 * g.count) + 1);
  });
});
