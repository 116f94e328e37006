import { describe, expect, it } from 'vitest';
import { buildSegmentIndex, directedDistance, distPointSegment, hausdorff } from '../../src/measure/hausdorff.js';
import { rng } from '../rng.js';

const F = (...v: number[]) => Float64Array.from(v);


function circle(r: number, n: number, phase = 0, cx = 0, cy = 0): Float64Array {
  const out = new Float64Array(2 * (n + 1));
  for (let i = 0; i <= n; i++) {
    const t = phase + (2 * Math.PI * (i % n)) / n;
    out[2 * i] = cx + r * Math.cos(t);
    out[2 * i + 1] = cy + r * Math.sin(t);
  }
  return out;
}

/** v within [x − tol, x + tol]. */
function expectCloseBound(v: number, x: number, tol: number): void {
  expect(v).toBeGreaterThanOrEqual(x - tol);
  expect(v).toBeLessThanOrEqual(x + tol);
}

describe('distPointSegment', () => {
  it('projects inside, clamps at the ends, treats a zero-length segment as a point', () => {
    expect(distPointSegment(5, 3, 0, 0, 10, 0)).toBe(3);
    expect(distPointSegment(13, 4, 0, 0, 10, 0)).toBe(5); // 3-4-5 triangle past the end
    expect(distPointSegment(-3, -4, 0, 0, 10, 0)).toBe(5);
    expect(distPointSegment(4, 4, 1, 0, 1, 0)).toBe(5);
  });
});

describe('directedDistance', () => {
  it('a line against a parallel line at distance 3: exactly 3 both ways', () => {
    const a = [F(0, 0, 10, 0)], b = [F(0, 3, 4, 3, 10, 3)];
    const h = hausdorff(a, b, 1e-9);
    expect(h.ab.max).toBeGreaterThanOrEqual(3);
    expect(h.ab.max).toBeLessThanOrEqual(3 + 1e-9);
    expect(h.ba.max).toBeCloseTo(3, 9);
    expect(h.ab.mean).toBe(3);
  });

  it('a shorter parallel line: the far corner decides one direction (sqrt(2² + 3²))', () => {
    const a = [F(0, 0, 10, 0)], b = [F(2, 3, 8, 3)];
    const h = hausdorff(a, b, 1e-9);
    expect(h.ab.max).toBeGreaterThanOrEqual(Math.sqrt(13));
    expect(h.ab.max).toBeLessThanOrEqual(Math.sqrt(13) + 1e-9);
    expect(h.ba.max).toBeCloseTo(3, 9);
    expect(h.max).toBe(h.ab.max);
  });

  it('is an upper bound between samples: a segment whose ends touch b but whose middle is 1 away', () => {
    // b = two isolated points; the segment of a joins them, so its vertices are at distance 0.
    const a = [F(-1, 0, 1, 0)], b = [F(-1, 0), F(1, 0)];
    const d = directedDistance(a, b, buildSegmentIndex(b), 1e-6);
    expect(d.max).toBeGreaterThanOrEqual(1);
    expect(d.max).toBeLessThanOrEqual(1 + 1e-6);
    expect(d.mean).toBe(0);
  });

  it('concentric circles r=10 and r=10.5: 0.5 up to the polygon gaps, both directions', () => {
    const n = 2000;
    const a = [circle(10, n)], b = [circle(10.5, n, 0.37 * (2 * Math.PI / n))];
    const h = hausdorff(a, b, 1e-9);
    // Polygon to polygon: the exact values lie between Δr and Δr + the sagitta on the larger radius
    // (s = r − sqrt(r² − (c/2)²), REFERENCES.md §6).
    const sag = 10.5 * (1 - Math.cos(Math.PI / n));
    for (const d of [h.ab, h.ba]) {
      expect(d.max).toBeGreaterThanOrEqual(0.5 - sag);
      expect(d.max).toBeLessThanOrEqual(0.5 + sag + 1e-9);
    }
  });

  it('seeded random polylines: never below a dense brute-force value, never above it by more than resolution + step/2', () => {
    const rand = rng(12345);
    for (let trial = 0; trial < 20; trial++) {
      const mk = (k: number) => { const v = new Float64Array(2 * k); for (let i = 0; i < v.length; i++) v[i] = rand() * 10; return v; };
      const a = [mk(8)], b = [mk(12), mk(3)];
      const res = 1e-4;
      const d = directedDistance(a, b, buildSegmentIndex(b), res);
      // brute force: every segment of a sampled at step ≤ 1e-3, each point against every segment of b
      let dense = 0, step = 0;
      const pa = a[0];
      for (let i = 0; i + 3 < pa.length; i += 2) {
        const len = Math.hypot(pa[i + 2] - pa[i], pa[i + 3] - pa[i + 1]);
        const k = Math.max(1, Math.ceil(len / 1e-3));
        step = Math.max(step, len / k);
        for (let j = 0; j <= k; j++) {
          const x = pa[i] + ((pa[i + 2] - pa[i]) * j) / k, y = pa[i + 1] + ((pa[i + 3] - pa[i + 1]) * j) / k;
          let best = Infinity;
          for (const pb of b) for (let m = 0; m + 3 < pb.length; m += 2) best = Math.min(best, distPointSegment(x, y, pb[m], pb[m + 1], pb[m + 2], pb[m + 3]));
          dense = Math.max(dense, best);
        }
      }
      expect(d.max).toBeGreaterThanOrEqual(dense - 1e-12);
      expect(d.max).toBeLessThanOrEqual(dense + step / 2 + res);
      // worst spot is a vertex of a whose own distance is within the segment length of the maximum
      expect(Number.isFinite(d.worstX)).toBe(true);
    }
  });

  it('seeded random walks with many short segments (hinted grid queries, pruned intervals): bounded by brute force both ways', () => {
    const rand = rng(777);
    const walk = (n: number, x: number, y: number, step: number) => {
      const v = new Float64Array(2 * n);
      for (let i = 0; i < n; i++) { v[2 * i] = x; v[2 * i + 1] = y; x += (rand() - 0.5) * step; y += (rand() - 0.3) * step; }
      return v;
    };
    const a = [walk(300, 0, 0, 0.2), walk(50, 3, 1, 0.5)], b = [walk(3000, 0.1, 0, 0.03), walk(20, 5, 5, 1)];
    const res = 1e-5;
    const d = directedDistance(a, b, buildSegmentIndex(b), res);
    let dense = 0, step = 0, sum = 0, count = 0;
    for (const pa of a) {
      for (let i = 0; i + 3 < pa.length; i += 2) {
        const len = Math.hypot(pa[i + 2] - pa[i], pa[i + 3] - pa[i + 1]);
        const k = Math.max(1, Math.ceil(len / 0.01));
        step = Math.max(step, len / k);
        for (let j = 0; j <= k; j++) {
          const x = pa[i] + ((pa[i + 2] - pa[i]) * j) / k, y = pa[i + 1] + ((pa[i + 3] - pa[i + 1]) * j) / k;
          let best = Infinity;
          for (const pb of b) for (let m = 0; m + 3 < pb.length; m += 2) best = Math.min(best, distPointSegment(x, y, pb[m], pb[m + 1], pb[m + 2], pb[m + 3]));
          dense = Math.max(dense, best);
          if (j === 0) { sum += best; count++; }
          if (j === k && i + 4 === pa.length) { sum += best; count++; } // last vertex (walks are open)
        }
      }
    }
    expect(d.max).toBeGreaterThanOrEqual(dense - 1e-12);
    expect(d.max).toBeLessThanOrEqual(dense + step / 2 + res);
    expect(d.samples).toBe(count);
    expect(d.mean).toBeCloseTo(sum / count, 10); // vertex distances are exact, not just bounded
  });

  it('far-apart shapes stay fast: circles 5 mm apart, 1e5 points', () => {
    const a = [circle(100, 100_000)], b = [circle(105, 50_000, 1e-6)];
    const t0 = performance.now();
    const d = directedDistance(a, b, buildSegmentIndex(b), 1e-5);
    const ms = performance.now() - t0;
    console.log(`directedDistance far apart, 1e5 → 5e4 points: ${ms.toFixed(0)} ms`);
    expectCloseBound(d.max, 5, 105 * (1 - Math.cos(Math.PI / 50_000)) + 1e-5);
    expect(ms).toBeLessThan(10000); // was minutes with plain box queries (~0.4 s idle with the grid too)
  });

  it('empty sides: nothing to measure from → 0; nothing to measure to → Infinity', () => {
    expect(directedDistance([], [F(0, 0, 1, 1)]).max).toBe(0);
    expect(directedDistance([F(0, 0, 1, 1)], []).max).toBe(Infinity);
  });

  it('is fast: a million points against half a million', () => {
    const a = [circle(100, 1_000_000)], b = [circle(100.01, 500_000, 1e-6)];
    const t0 = performance.now();
    const d = directedDistance(a, b, buildSegmentIndex(b), 1e-5);
    const ms = performance.now() - t0;
    console.log(`directedDistance 1e6 → 5e5 points: ${ms.toFixed(0)} ms (checksum ${d.max.toFixed(6)})`);
    expect(d.max).toBeCloseTo(0.01, 4);
    // ~0.9 s on an idle 2-core box. The limit guards against a quadratic blow-up (which would take
    // minutes), not a benchmark: the machines running tests are shared and loaded.
    expect(ms).toBeLessThan(20000);
  });
});
