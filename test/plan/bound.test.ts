import { describe, expect, it } from 'vitest';
import { travelLowerBound, type BoundInput } from '../../src/plan/bound.js';
import { rng } from '../rng.js';

/**
 * Prim's algorithm over all pairs of contours with d(P, Q) = the shortest distance between their
 * entry points (textbook O(n²) minimum spanning tree), the independent check of the Delaunay route.
 */
function primBound(cs: readonly BoundInput[]): number {
  const pts = cs.map((c) => {
    const nv = c.xy.length >> 1;
    const vs = c.closed ? Array.from({ length: nv }, (_, v) => v) : nv > 1 ? [0, nv - 1] : [0];
    return vs.map((v) => [c.xy[2 * v], c.xy[2 * v + 1]]);
  });
  const d = (a: number, b: number): number => {
    let m = Infinity;
    for (const p of pts[a]) for (const q of pts[b]) m = Math.min(m, Math.hypot(p[0] - q[0], p[1] - q[1]));
    return m;
  };
  const n = cs.length, inTree = new Uint8Array(n), best = new Float64Array(n).fill(Infinity);
  best[0] = 0;
  let total = 0;
  for (let k = 0; k < n; k++) {
    let u = -1;
    for (let i = 0; i < n; i++) if (!inTree[i] && (u < 0 || best[i] < best[u])) u = i;
    inTree[u] = 1;
    total += best[u];
    for (let i = 0; i < n; i++) if (!inTree[i]) best[i] = Math.min(best[i], d(u, i));
  }
  return total;
}

function mixed(n: number, seed: number): BoundInput[] {
  const r = rng(seed);
  const out: BoundInput[] = [];
  for (let i = 0; i < n; i++) {
    const x = 100 * r(), y = 100 * r();
    if (i % 3 === 0) {
      // A closed polygon of 3–9 vertices.
      const m = 3 + Math.floor(7 * r()), rad = 1 + 5 * r();
      out.push({ xy: Float64Array.from({ length: 2 * m }, (_, k) => (k % 2 ? y + rad * Math.sin((2 * Math.PI * (k >> 1)) / m) : x + rad * Math.cos((2 * Math.PI * (k >> 1)) / m))), closed: true });
    } else if (i % 3 === 1) {
      out.push({ xy: Float64Array.of(x, y, x + 3 * r(), y + 3 * r(), x + 6 * r(), y), closed: false });
    } else out.push({ xy: Float64Array.of(x, y), closed: false });
  }
  return out;
}

describe('travelLowerBound', () => {
  it('equals Prim over all pairs on mixed contours', () => {
    for (const seed of [1, 2, 3]) {
      const cs = mixed(150, seed);
      expect(travelLowerBound(cs)).toBeCloseTo(primBound(cs), 9);
    }
  });

  it('handles collinear points, duplicates across contours and a lone contour', () => {
    const line = [0, 5, 2, 9].map((x): BoundInput => ({ xy: Float64Array.of(x, 0), closed: false }));
    // Sorted along the line: 0, 2, 5, 9 → 2 + 3 + 4 = 9 (the chain is the tree of collinear points).
    expect(travelLowerBound(line)).toBe(9);
    const dup: BoundInput[] = [
      { xy: Float64Array.of(0, 0, 10, 0), closed: false },
      { xy: Float64Array.of(10, 0, 10, 10), closed: false },
      { xy: Float64Array.of(20, 20, 30, 20), closed: false },
    ];
    // The first two share (10, 0); the third is nearest from (10, 10) to (20, 20): √200.
    expect(travelLowerBound(dup)).toBeCloseTo(Math.sqrt(200), 12);
    expect(travelLowerBound([dup[0]])).toBe(0);
  });
});
