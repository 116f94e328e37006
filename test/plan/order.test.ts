import { describe, expect, it } from 'vitest';
import { orderContours, type OrderItem } from '../../src/plan/order.js';
import { travelLowerBound } from '../../src/plan/bound.js';
import { nestingParents } from '../../src/plan/nesting.js';
import { rng } from '../rng.js';

/** Travel of an order: from each contour's exit to the next one's entry (mm), computed here from the result alone. */
function travel(items: readonly OrderItem[], seq: Int32Array, reversed: Uint8Array, entry: Int32Array, start: [number, number] | null = null): number {
  let t = 0;
  let at = start;
  for (const i of seq) {
    const xy = items[i].xy, m = xy.length >> 1;
    const inV = items[i].closed ? entry[i] : reversed[i] ? m - 1 : 0;
    const outV = items[i].closed ? entry[i] : reversed[i] ? 0 : m - 1;
    if (at) t += Math.hypot(xy[2 * inV] - at[0], xy[2 * inV + 1] - at[1]);
    at = [xy[2 * outV], xy[2 * outV + 1]];
  }
  return t;
}

/** The textbook nearest-neighbour construction by brute force, every vertex of a closed contour an entry: its travel (mm). */
function nearestNeighbour(items: readonly OrderItem[]): number {
  const n = items.length, done = new Uint8Array(n);
  let x = items[0].xy[0], y = items[0].xy[1], t = 0;
  for (let k = 0; k < n; k++) {
    let bi = -1, bd = Infinity, bv = 0;
    for (let i = 0; i < n; i++) {
      if (done[i]) continue;
      const xy = items[i].xy, m = xy.length >> 1;
      for (const v of items[i].closed ? Array.from({ length: m }, (_, q) => q) : [0, m - 1]) {
        const d = Math.hypot(xy[2 * v] - x, xy[2 * v + 1] - y);
        if (d < bd) [bd, bi, bv] = [d, i, v];
      }
    }
    done[bi] = 1;
    if (k > 0) t += bd;
    const xy = items[bi].xy, m = xy.length >> 1;
    const out = items[bi].closed ? bv : bv === 0 ? m - 1 : 0;
    [x, y] = [xy[2 * out], xy[2 * out + 1]];
  }
  return t;
}

const strokes = (n: number, len: number, seed: number): OrderItem[] => {
  const r = rng(seed);
  return Array.from({ length: n }, () => {
    const x = 300 * r(), y = 300 * r(), a = 2 * Math.PI * r(), l = len * (0.5 + r());
    return { xy: Float64Array.of(x, y, x + l * Math.cos(a), y + l * Math.sin(a)), closed: false };
  });
};

describe('orderContours', () => {
  it('visits every contour once and travels between the spanning-tree bound and 1.3 times it', () => {
    // Bound: travel ≥ minimum spanning tree of the contours (textbook). On random points 2-opt + Or-opt
    // tours come out near 1.14 × the tree (shared references §11.5, P2); 1.3 leaves room for open strokes.
    for (const [len, seed] of [[0.05, 1], [2, 2]] as const) {
      const items = strokes(2000, len, seed);
      const r = orderContours(items, { start: null, parents: null });
      expect(new Set(r.seq).size).toBe(2000);
      const t = travel(items, r.seq, r.reversed, r.entry);
      const b = travelLowerBound(items);
      expect(t).toBeGreaterThanOrEqual(b);
      expect(t / b).toBeLessThan(1.3);
    }
  });

  it('reverses an open contour when that is shorter', () => {
    // From (0,0): 0→10, then the second line drawn 20→30 (given 30→20), then 40→50: 10 + 10 = 20 mm of travel.
    const items = [[0, 0, 10, 0], [30, 0, 20, 0], [40, 0, 50, 0]].map((a) => ({ xy: Float64Array.from(a), closed: false }));
    const r = orderContours(items, { start: [0, 0], parents: null });
    expect(Array.from(r.seq)).toEqual([0, 1, 2]);
    expect(Array.from(r.reversed)).toEqual([0, 1, 0]);
    expect(travel(items, r.seq, r.reversed, r.entry, [0, 0])).toBe(20);
  });

  it('enters a closed contour at its best vertex', () => {
    // A square given from its far corner (20,20): entered at (10,10), nearest the start (0,0) and the next line at (30,10).
    const items = [
      { xy: Float64Array.of(20, 20, 10, 20, 10, 10, 20, 10), closed: true },
      { xy: Float64Array.of(30, 10, 40, 10), closed: false },
    ];
    const r = orderContours(items, { start: [0, 0], parents: null });
    expect(Array.from(r.seq)).toEqual([0, 1]);
    // Vertex 3 (20,10) gives √500 + 10 = 32.4; vertex 2 (10,10) gives √200 + 20 = 34.1: the best is vertex 3.
    expect(r.entry[0]).toBe(3);
    expect(travel(items, r.seq, r.reversed, r.entry, [0, 0])).toBeCloseTo(Math.sqrt(500) + 10, 12);
  });

  it('keeps every contour before its container with holes first', () => {
    // 60 parts in a 10 × 6 layout, each an outer square with two holes and an island in one hole, given outer first.
    const items: OrderItem[] = [];
    const sq = (x: number, y: number, s: number): OrderItem => ({ xy: Float64Array.of(x, y, x + s, y, x + s, y + s, x, y + s), closed: true });
    const r = rng(8);
    for (let p = 0; p < 60; p++) {
      const x = 30 * (p % 10) + 3 * r(), y = 30 * Math.floor(p / 10) + 3 * r();
      items.push(sq(x, y, 25), sq(x + 2, y + 2, 10), sq(x + 5, y + 5, 3), sq(x + 14, y + 14, 8));
    }
    const parents = nestingParents(items);
    expect(parents.filter((p) => p >= 0).length).toBe(180);
    const res = orderContours(items, { start: [0, 0], parents });
    const pos = new Int32Array(items.length);
    res.seq.forEach((i, k) => (pos[i] = k));
    parents.forEach((p, i) => {
      if (p >= 0) expect(pos[i]).toBeLessThan(pos[p]);
    });
    // Unconstrained, the same job puts some container first (the construction meets outer squares first).
    const free = orderContours(items, { start: [0, 0], parents: null });
    const freePos = new Int32Array(items.length);
    free.seq.forEach((i, k) => (freePos[i] = k));
    expect(Array.from(parents).some((p, i) => p >= 0 && freePos[i] > freePos[p])).toBe(true);
  });
});

describe('orderContours on mixed and degenerate input', () => {
  it('orders closed polygons, open polylines and single points together', () => {
    const r = rng(31);
    const items: OrderItem[] = [];
    for (let i = 0; i < 1500; i++) {
      const x = 200 * r(), y = 200 * r();
      if (i % 3 === 0) {
        const m = 3 + Math.floor(60 * r()), rad = 0.5 + 3 * r();
        items.push({ xy: Float64Array.from({ length: 2 * m }, (_, k) => (k % 2 ? y + rad * Math.sin((2 * Math.PI * (k >> 1)) / m) : x + rad * Math.cos((2 * Math.PI * (k >> 1)) / m))), closed: true });
      } else if (i % 3 === 1) items.push({ xy: Float64Array.of(x, y, x + 2 * r(), y + 2 * r(), x + 4 * r(), y), closed: false });
      else items.push({ xy: Float64Array.of(x, y), closed: false });
    }
    const nn = nearestNeighbour(items);
    for (const start of [null, [0, 0]] as const) {
      const res = orderContours(items, { start, parents: null });
      expect(new Set(res.seq).size).toBe(items.length);
      const t = travel(items, res.seq, res.reversed, res.entry);
      // The spanning-tree bound (textbook) holds for any order. It is loose here (a closed contour is left where it
      // was entered, the tree may touch it at two vertices), so the order is held against nearest neighbour instead.
      expect(t).toBeGreaterThanOrEqual(travelLowerBound(items));
      expect(t).toBeLessThan(0.85 * nn);
    }
  });

  it('copes with every contour at the same point', () => {
    const items = Array.from({ length: 300 }, (_, i): OrderItem => (i % 2 ? { xy: Float64Array.of(5, 5), closed: false } : { xy: Float64Array.of(5, 5, 5, 5), closed: false }));
    const res = orderContours(items, { start: [0, 0], parents: null });
    expect(new Set(res.seq).size).toBe(300);
    expect(travel(items, res.seq, res.reversed, res.entry, [0, 0])).toBeCloseTo(Math.hypot(5, 5), 12);
  });
});
