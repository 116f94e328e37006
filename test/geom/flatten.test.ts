import { describe, expect, it } from 'vitest';
import { flattenPath, type FlattenStats } from '../../src/geom/flatten.js';
import { cubicFlatness, quadFlatness, stepsForFlatness } from '../../src/geom/bezier.js';
import { arcToCenter } from '../../src/geom/arcCenter.js';
import { OP_A, OP_C, OP_L, OP_M, OP_Q, OP_Z, OP_ARGS, type PathData } from '../../src/svg/pathTypes.js';
import type { Contour } from '../../src/geom/contour.js';
import { rng } from '../rng.js';

// ---- helpers (independent of the code under test) ----

/** Flat path data from [op, ...args] rows (no text parsing involved). */
function path(rows: number[][]): PathData {
  const ops: number[] = [];
  const args: number[] = [];
  for (const [op, ...a] of rows) {
    if (a.length !== OP_ARGS[op]) throw new Error(`bad row ${op}`);
    ops.push(op);
    args.push(...a);
  }
  return { ops: Uint8Array.from(ops), args: Float64Array.from(args) };
}

const I = Float64Array.of(1, 0, 0, 1, 0, 0);
const m6 = (a: number, b: number, c: number, d: number, e: number, f: number): Float64Array =>
  Float64Array.of(a, b, c, d, e, f);


type Pt = [number, number];
type Curve = (t: number) => Pt;

/** de Casteljau evaluation of a Bézier of any degree (common practice). */
function deCasteljau(pts: Pt[], t: number): Pt {
  const p = pts.map((q) => [q[0], q[1]] as Pt);
  for (let r = p.length - 1; r > 0; r--) {
    for (let i = 0; i < r; i++) {
      p[i] = [p[i][0] + t * (p[i + 1][0] - p[i][0]), p[i][1] + t * (p[i + 1][1] - p[i][1])];
    }
  }
  return p[0];
}

function mapPt(m: Float64Array, p: Pt): Pt {
  return [m[0] * p[0] + m[2] * p[1] + m[4], m[1] * p[0] + m[3] * p[1] + m[5]];
}

function distSeg(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / l2 : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(px - ax - t * dx, py - ay - t * dy);
}

/** Distance from p to the curve restricted to t in [t0, t1]: scan, then golden-section refinement (≥ the true distance). */
function distCurve(curve: Curve, px: number, py: number, t0: number, t1: number, samples = 24): number {
  const f = (t: number): number => {
    const q = curve(t);
    return Math.hypot(q[0] - px, q[1] - py);
  };
  let bi = 0, bd = Infinity;
  for (let i = 0; i <= samples; i++) {
    const d = f(t0 + ((t1 - t0) * i) / samples);
    if (d < bd) { bd = d; bi = i; }
  }
  const h = (t1 - t0) / samples;
  let lo = Math.max(t0, t0 + (bi - 1) * h), hi = Math.min(t1, t0 + (bi + 1) * h);
  const g = (Math.sqrt(5) - 1) / 2;
  for (let it = 0; it < 60; it++) {
    const a = hi - g * (hi - lo), b = lo + g * (hi - lo);
    if (f(a) < f(b)) hi = b; else lo = a;
  }
  return Math.min(bd, f((lo + hi) / 2));
}

/**
 * Two-way measured deviation between a one-segment open contour and the exact
 * curve. Both searches look only near the matching parameter window (vertex i
 * of m + 1 stands for t = i/m), so each measured distance is at least the true
 * one: the check can only be stricter than the claim it verifies.
 */
function measure(c: Contour, curve: Curve): number {
  const xy = c.xy, m = xy.length / 2 - 1;
  let worst = 0;
  const samples = Math.max(3000, 8 * m);
  for (let i = 0; i <= samples; i++) {
    const t = i / samples;
    const q = curve(t);
    const k = Math.min(m - 1, Math.floor(t * m));
    let d = Infinity;
    for (let j = Math.max(0, k - 1); j <= Math.min(m - 1, k + 1); j++) {
      d = Math.min(d, distSeg(q[0], q[1], xy[2 * j], xy[2 * j + 1], xy[2 * j + 2], xy[2 * j + 3]));
    }
    worst = Math.max(worst, d);
  }
  for (let i = 0; i < m; i++) {
    for (const s of [0.5, 0.25, 0.75, 0.1, 0.9]) {
      const px = xy[2 * i] + s * (xy[2 * i + 2] - xy[2 * i]);
      const py = xy[2 * i + 1] + s * (xy[2 * i + 3] - xy[2 * i + 1]);
      worst = Math.max(worst, distCurve(curve, px, py, Math.max(0, (i - 1) / m), Math.min(1, (i + 2) / m)));
    }
  }
  return worst;
}

function randomMatrix(r: () => number, kind: number): Float64Array {
  const a = r() * 2 * Math.PI;
  const c = Math.cos(a), s = Math.sin(a);
  const sx = 0.2 + r() * 3, sy = 0.2 + r() * 3, k = r() * 2 - 1;
  const tx = r() * 200 - 100, ty = r() * 200 - 100;
  switch (kind % 4) {
    case 0: return m6(sx * c, sx * s, -sx * s, sx * c, tx, ty); // similarity
    case 1: return m6(sx * c, sx * s, -sy * s, sy * c, tx, ty); // rotation · non-uniform scale
    case 2: return m6(sx, 0, k * sx, sy, tx, ty); // skew
    default: return m6(-sx * c, -sx * s, -sy * s, sy * c, tx, ty); // mirror
  }
}

// ---- tests ----

describe('bezier flatness bound', () => {
  it('(3/4)·max second difference / n² bounds a cubic (Filip et al. 1986; common practice)', () => {
    const r = rng(4);
    for (let i = 0; i < 200; i++) {
      const pts: Pt[] = [0, 1, 2, 3].map(() => [r() * 100, r() * 100] as Pt);
      const flat = cubicFlatness(...(pts.flat() as [number, number, number, number, number, number, number, number]));
      const n = stepsForFlatness(flat, 0.05);
      expect(flat / (n * n)).toBeLessThanOrEqual(0.05);
      if (n > 1) expect(flat / ((n - 1) * (n - 1))).toBeGreaterThan(0.05); // fewest steps
      const contour: Contour = { xy: new Float64Array(2 * (n + 1)), closed: false };
      for (let j = 0; j <= n; j++) contour.xy.set(deCasteljau(pts, j / n), 2 * j);
      expect(measure(contour, (t) => deCasteljau(pts, t))).toBeLessThanOrEqual(flat / (n * n));
    }
  });

  it('quadratic constant is |P0 − 2P1 + P2| / 4 and is attained by a parabola at n = 1', () => {
    // linear-interpolation error of a parabola: h²/8·|f''| exactly at mid-parameter (common practice)
    expect(quadFlatness(0, 0, 5, 10, 10, 0)).toBeCloseTo(5, 12);
    const pts: Pt[] = [[0, 0], [5, 10], [10, 0]];
    expect(deCasteljau(pts, 0.5)[1]).toBeCloseTo(5, 12);
    // its exact cubic form (degree elevation, common practice) has the same constant
    const r = rng(5);
    for (let i = 0; i < 50; i++) {
      const [x0, y0, x1, y1, x2, y2] = [r(), r(), r(), r(), r(), r()].map((v) => v * 100);
      const c = cubicFlatness(x0, y0, x0 + (2 / 3) * (x1 - x0), y0 + (2 / 3) * (y1 - y0),
        x2 + (2 / 3) * (x1 - x2), y2 + (2 / 3) * (y1 - y2), x2, y2);
      expect(c).toBeCloseTo(quadFlatness(x0, y0, x1, y1, x2, y2), 10);
    }
  });
});

describe('flattenPath: proven bound under random matrices', () => {
  const cases = ['cubic', 'quad', 'arc'] as const;
  for (const kind of cases) {
    it(`${kind}s stay within maxError both ways (seeded)`, () => {
      const r = rng(kind.length * 1000 + 7);
      let worstRatio = 0;
      let count = 0;
      for (let i = 0; i < 60; i++) {
        const M = randomMatrix(r, i);
        const e = [0.5, 0.05, 0.005][i % 3];
        const p0: Pt = [r() * 100 - 50, r() * 100 - 50];
        let rows: number[][];
        let curve: Curve;
        if (kind === 'cubic') {
          const ctl: Pt[] = [p0, [r() * 100 - 50, r() * 100 - 50], [r() * 100 - 50, r() * 100 - 50], [r() * 100 - 50, r() * 100 - 50]];
          rows = [[OP_M, ...p0], [OP_C, ...ctl[1], ...ctl[2], ...ctl[3]]];
          curve = (t) => mapPt(M, deCasteljau(ctl, t));
        } else if (kind === 'quad') {
          const ctl: Pt[] = [p0, [r() * 100 - 50, r() * 100 - 50], [r() * 100 - 50, r() * 100 - 50]];
          rows = [[OP_M, ...p0], [OP_Q, ...ctl[1], ...ctl[2]]];
          curve = (t) => mapPt(M, deCasteljau(ctl, t));
        } else {
          const p2: Pt = [r() * 100 - 50, r() * 100 - 50];
          const rx = 1 + r() * 40, ry = 1 + r() * 40, phi = r() * 360;
          const fA = r() < 0.5 ? 1 : 0, fS = r() < 0.5 ? 1 : 0;
          rows = [[OP_M, ...p0], [OP_A, rx, ry, phi, fA, fS, ...p2]];
          const c = arcToCenter(p0[0], p0[1], rx, ry, phi, fA === 1, fS === 1, p2[0], p2[1]);
          if (c === null || c.kind !== 'arc') throw new Error('expected an arc');
          // W3C SVG 1.1 F.6.3.1: P(θ) = R(φ)·(rx cosθ, ry sinθ) + c
          curve = (t) => {
            const th = c.theta1 + t * c.dtheta;
            const x = c.rx * Math.cos(th), y = c.ry * Math.sin(th);
            return mapPt(M, [Math.cos(c.phi) * x - Math.sin(c.phi) * y + c.cx, Math.sin(c.phi) * x + Math.cos(c.phi) * y + c.cy]);
          };
        }
        const stats: FlattenStats = { bounds: [] };
        const out = flattenPath(path(rows), M, e, stats);
        expect(out.length).toBe(1);
        expect(stats.bounds[0]).toBeLessThanOrEqual(e);
        const d = measure(out[0], curve);
        // measured deviation ≤ the bound the flattener claims ≤ maxError (1e-9 relative slack for rounding)
        expect(d).toBeLessThanOrEqual(stats.bounds[0] * (1 + 1e-9) + 1e-12);
        worstRatio = Math.max(worstRatio, d / e);
        count++;
      }
      expect(count).toBe(60);
      // The bound is not absurdly loose: some case uses a fair share of the budget.
      expect(worstRatio).toBeGreaterThan(kind === 'arc' ? 0.9 : 0.5);
    });
  }
});

describe('flattenPath: singular matrix', () => {
  it('curves mapped onto a line still meet the bound', () => {
    const M = m6(1, 2, 2, 4, 3, -1); // det = 0: everything lands on one line
    const ctl: Pt[] = [[0, 0], [30, 40], [60, -20], [10, 10]];
    const [c] = flattenPath(path([[OP_M, 0, 0], [OP_C, 30, 40, 60, -20, 10, 10]]), M, 0.01);
    expect(measure(c, (t) => mapPt(M, deCasteljau(ctl, t)))).toBeLessThanOrEqual(0.01);
    const a = arcToCenter(0, 0, 20, 10, 30, true, false, 15, 5);
    if (a === null || a.kind !== 'arc') throw new Error('expected an arc');
    const stats: FlattenStats = { bounds: [] };
    const [d] = flattenPath(path([[OP_M, 0, 0], [OP_A, 20, 10, 30, 1, 0, 15, 5]]), M, 0.01, stats);
    // W3C SVG 1.1 F.6.3.1 evaluation
    const arcAt: Curve = (t) => {
      const th = a.theta1 + t * a.dtheta, x = a.rx * Math.cos(th), y = a.ry * Math.sin(th);
      return mapPt(M, [Math.cos(a.phi) * x - Math.sin(a.phi) * y + a.cx, Math.sin(a.phi) * x + Math.cos(a.phi) * y + a.cy]);
    };
    expect(measure(d, arcAt)).toBeLessThanOrEqual(stats.bounds[0] * (1 + 1e-9));
    expect(stats.bounds[0]).toBeLessThanOrEqual(0.01);
  });
});

describe('flattenPath: vertex counts against the chord formula', () => {
  // REFERENCES.md §6 chord approximation: n = ⌈π / acos(1 − e/r)⌉, check values 71/23/223/71
  const table: Array<[number, number, number]> = [[10, 0.01, 71], [10, 0.1, 23], [100, 0.01, 223], [1, 0.001, 71]];
  for (const [R, e, expected] of table) {
    it(`circle r = ${R} at e = ${e}: about ${expected} vertices`, () => {
      expect(Math.ceil(Math.PI / Math.acos(1 - e / R))).toBe(expected); // the formula itself
      const two = path([[OP_M, R, 0], [OP_A, R, R, 0, 0, 1, -R, 0], [OP_A, R, R, 0, 0, 1, R, 0], [OP_Z]]);
      const c2 = flattenPath(two, I, e);
      expect(c2.length).toBe(1);
      expect(c2[0].closed).toBe(true);
      const n2 = c2[0].xy.length / 2;
      // two half-circles each round up: at most 1 more than the whole-circle count
      expect(n2).toBeGreaterThanOrEqual(expected);
      expect(n2).toBeLessThanOrEqual(expected + 1);
      // the same circle drawn at half size and scaled 2× by the matrix
      const half = path([[OP_M, R / 2, 0], [OP_A, R / 2, R / 2, 0, 0, 1, -R / 2, 0], [OP_A, R / 2, R / 2, 0, 0, 1, R / 2, 0], [OP_Z]]);
      expect(flattenPath(half, m6(2, 0, 0, 2, 3, 4), e)[0].xy.length / 2).toBe(n2);
    });
  }

  it('F3: 4-Bézier circle r = 50 at 1e-4 has every vertex at radius in [50, 50.0137]', () => {
    // REFERENCES.md §6 F3; κ = 0.5522847498 (SM), max radial error 2.7253e-4·r
    const R = 50, h = 0.5522847498 * R;
    const p = path([
      [OP_M, R, 0],
      [OP_C, R, h, h, R, 0, R],
      [OP_C, -h, R, -R, h, -R, 0],
      [OP_C, -R, -h, -h, -R, 0, -R],
      [OP_C, h, -R, R, -h, R, 0],
      [OP_Z],
    ]);
    const [c] = flattenPath(p, I, 1e-4);
    const n = c.xy.length / 2;
    let lo = Infinity, hi = 0;
    for (let i = 0; i < n; i++) {
      const rr = Math.hypot(c.xy[2 * i], c.xy[2 * i + 1]);
      lo = Math.min(lo, rr);
      hi = Math.max(hi, rr);
    }
    expect(lo).toBeGreaterThanOrEqual(50 - 1e-9);
    expect(hi).toBeLessThanOrEqual(50.0137);
    // Count vs the exact circle at the same e (REFERENCES.md §6: 1571): the uniform
    // cubic bound costs about 1.06× (1664 vertices).
    const exact = Math.ceil(Math.PI / Math.acos(1 - 1e-4 / R));
    expect(exact).toBe(1571);
    expect(n).toBeGreaterThanOrEqual(exact);
    expect(n).toBeLessThanOrEqual(1.1 * exact);
    expect(c.corners?.length).toBe(0); // tangent-continuous joins
  });
});

describe('flattenPath: topology', () => {
  const xyOf = (c: Contour): number[] => Array.from(c.xy);

  it('removes consecutive duplicates and closes without repeating the first vertex', () => {
    const a = flattenPath(path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_L, 10, 0], [OP_L, 10, 10], [OP_Z]]), I, 0.1);
    expect(a.length).toBe(1);
    expect(a[0].closed).toBe(true);
    expect(xyOf(a[0])).toEqual([0, 0, 10, 0, 10, 10]);
    const b = flattenPath(path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_L, 10, 10], [OP_L, 0, 0], [OP_Z]]), I, 0.1);
    expect(xyOf(b[0])).toEqual([0, 0, 10, 0, 10, 10]);
  });

  it('a closed contour of two vertices stays; an M alone, M Z and zero-length pieces yield nothing', () => {
    const a = flattenPath(path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_Z]]), I, 0.1);
    expect(a.map(xyOf)).toEqual([[0, 0, 10, 0]]);
    expect(a[0].closed).toBe(true);
    expect(flattenPath(path([[OP_M, 5, 5]]), I, 0.1)).toEqual([]);
    expect(flattenPath(path([[OP_M, 5, 5], [OP_Z]]), I, 0.1)).toEqual([]);
    expect(flattenPath(path([[OP_M, 5, 5], [OP_L, 5, 5], [OP_C, 5, 5, 5, 5, 5, 5]]), I, 0.1)).toEqual([]);
    const c = flattenPath(path([[OP_M, 0, 0], [OP_L, 1, 0], [OP_M, 5, 5], [OP_M, 6, 6], [OP_L, 7, 6]]), I, 0.1);
    expect(c.map(xyOf)).toEqual([[0, 0, 1, 0], [6, 6, 7, 6]]);
    expect(c.every((k) => !k.closed)).toBe(true);
  });

  it('after Z a drawing command starts a new subpath at the subpath start', () => {
    // SVG 1.1 §8.3.3 closepath (REFERENCES.md §2.1)
    const a = flattenPath(path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_L, 10, 10], [OP_Z], [OP_L, 0, -10]]), I, 0.1);
    expect(a.map(xyOf)).toEqual([[0, 0, 10, 0, 10, 10], [0, 0, 0, -10]]);
    expect(a.map((k) => k.closed)).toEqual([true, false]);
  });

  it('omitted arcs are dropped and zero-radius arcs are lines', () => {
    // W3C SVG 1.1 F.6.2 / F.6.6 step 1 (REFERENCES.md §1.4 A5, A8)
    const a = flattenPath(path([[OP_M, 0, 0], [OP_A, 5, 5, 0, 1, 1, 0, 0], [OP_L, 10, 0]]), I, 0.1);
    expect(a.map(xyOf)).toEqual([[0, 0, 10, 0]]);
    const b = flattenPath(path([[OP_M, 0, 0], [OP_A, 0, 5, 0, 0, 1, 10, 0]]), I, 0.1);
    expect(b.map(xyOf)).toEqual([[0, 0, 10, 0]]);
  });

  it('applies the matrix to lines', () => {
    const [c] = flattenPath(path([[OP_M, 1, 1], [OP_L, 2, 3]]), m6(1, 2, 3, 4, 5, 6), 0.1);
    expect(xyOf(c)).toEqual([1 + 3 + 5, 2 + 4 + 6, 2 + 9 + 5, 4 + 12 + 6]);
  });

  it('rejects a bad tolerance and an absurd step count with the value in the message', () => {
    const p = path([[OP_M, 0, 0], [OP_Q, 1e6, 1e6, 2e6, 0]]);
    expect(() => flattenPath(p, I, 0)).toThrow(/got 0/);
    expect(() => flattenPath(p, I, Number.NaN)).toThrow(RangeError);
    expect(() => flattenPath(p, I, 1e-9)).toThrow(/steps/);
    const bad: PathData = { ops: Uint8Array.of(OP_M, 9), args: Float64Array.of(0, 0) };
    expect(() => flattenPath(bad, I, 0.1)).toThrow(/opcode 9/);
  });
});

describe('flattenPath: corners', () => {
  it('line–line joins are never marked; tangent-continuous curve joins are not marked', () => {
    const a = flattenPath(path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_L, 10, 10], [OP_L, 0, 10], [OP_Z]]), I, 0.1);
    expect(Array.from(a[0].corners ?? [])).toEqual([]);
    const b = flattenPath(path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_Q, 20, 0, 20, 10]]), I, 0.1);
    expect(Array.from(b[0].corners ?? [])).toEqual([]);
  });

  it('a line into a curve at 90° marks the join vertex', () => {
    const [c] = flattenPath(path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_Q, 10, 10, 20, 10]]), I, 0.1);
    expect(Array.from(c.corners ?? [])).toEqual([1]);
  });

  it('the threshold is 1°', () => {
    for (const [deg, marked] of [[0.5, false], [2, true]] as const) {
      const a = (deg * Math.PI) / 180;
      const p = path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_C, 10 + Math.cos(a), Math.sin(a), 15, 5, 20, 20]]);
      const [c] = flattenPath(p, I, 0.1);
      expect(Array.from(c.corners ?? [])).toEqual(marked ? [1] : []);
    }
  });

  it('rounded slot: arcs tangent to lines give no corners; reversed arcs give two', () => {
    const smooth = path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_A, 5, 5, 0, 0, 1, 10, 10], [OP_L, 0, 10], [OP_Z]]);
    expect(Array.from(flattenPath(smooth, I, 0.01)[0].corners ?? [])).toEqual([]);
    const rough = path([[OP_M, 0, 0], [OP_L, 10, 0], [OP_A, 5, 5, 0, 0, 0, 10, 10], [OP_L, 0, 10], [OP_Z]]);
    const [c] = flattenPath(rough, I, 0.01);
    const n = c.xy.length / 2;
    // join line→arc at vertex 1, arc→line at vertex n − 2 (the arc's end, before (0,10))
    expect(Array.from(c.corners ?? [])).toEqual([1, n - 2]);
    expect(c.xy[2 * (n - 2)]).toBe(10);
    expect(c.xy[2 * (n - 2) + 1]).toBe(10);
  });

  it('closing joins: vertex 0 and the last vertex of a half-disc', () => {
    const p = path([[OP_M, 10, 0], [OP_A, 10, 10, 0, 0, 1, -10, 0], [OP_Z]]);
    for (const M of [I, m6(1, 0, 0, -1, 0, 0), m6(2, 0, 0.5, 1, 7, 7)]) {
      const [c] = flattenPath(p, M, 0.01);
      const n = c.xy.length / 2;
      expect(c.closed).toBe(true);
      expect(Array.from(c.corners ?? [])).toEqual([0, n - 1]);
    }
  });
});

describe('flattenPath: performance', () => {
  it('1,000,000 line segments flatten to one contour of every vertex', () => {
    const N = 1_000_000;
    const ops = new Uint8Array(N + 1);
    const args = new Float64Array(2 * (N + 1));
    ops[0] = OP_M;
    const r = rng(99);
    for (let i = 1; i <= N; i++) {
      ops[i] = OP_L;
      args[2 * i] = r() * 1000;
      args[2 * i + 1] = r() * 1000;
    }
    const p: PathData = { ops, args };
    const M = m6(0.26, 0, 0, 0.26, 1, 2);
    // Its speed is benchmarked (npm run bench: the pipeline's flatten stage), not timed here.
    const out = flattenPath(p, M, 0.01);
    expect(out.length).toBe(1);
    expect(out[0].xy.length).toBe(2 * (N + 1));
    // The last vertex is the last point through M = [0.26 0 0 0.26 1 2].
    expect(out[0].xy[2 * N]).toBeCloseTo(0.26 * args[2 * N] + 1, 9);
    expect(out[0].xy[2 * N + 1]).toBeCloseTo(0.26 * args[2 * N + 1] + 2, 9);
  });
});
