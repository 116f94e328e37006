import { describe, expect, it } from 'vitest';
import { OP_A, OP_C, OP_L, OP_M, OP_Q, OP_Z, type PathData } from '../../src/svg/pathTypes.js';
import { measureDeviation } from '../../src/measure/measure.js';

/** Flat path data from absolute commands (test builder; no parser needed). */
function path() {
  const ops: number[] = [], args: number[] = [];
  const api = {
    M(x: number, y: number) { ops.push(OP_M); args.push(x, y); return api; },
    L(x: number, y: number) { ops.push(OP_L); args.push(x, y); return api; },
    C(...v: number[]) { ops.push(OP_C); args.push(...v); return api; },
    Q(...v: number[]) { ops.push(OP_Q); args.push(...v); return api; },
    A(...v: number[]) { ops.push(OP_A); args.push(...v); return api; },
    Z() { ops.push(OP_Z); return api; },
    data(): PathData { return { ops: Uint8Array.from(ops), args: Float64Array.from(args) }; },
  };
  return api;
}

const ID = Float64Array.of(1, 0, 0, 1, 0, 0);
/** The measurement may overstate by at most 2·(eA + eB) + resolution = 0.5 % of the tolerance (measure.ts header). */
const SLACK = 0.005;

/** Circle of radius r about (cx, cy) as two arcs (S2 §10.3 style decomposition). */
function arcCircle(r: number, cx = 0, cy = 0): PathData {
  return path().M(cx + r, cy).A(r, r, 0, 0, 1, cx - r, cy).A(r, r, 0, 0, 1, cx + r, cy).Z().data();
}

function expectBetween(v: number, lo: number, hi: number): void {
  expect(v).toBeGreaterThanOrEqual(lo);
  expect(v).toBeLessThanOrEqual(hi);
}

describe('measureDeviation', () => {
  it('one chord vs the circle arc over it: the sagitta r − sqrt(r² − (c/2)²) = 2 for r=10, c=12', () => {
    // Sagitta of a chord (common geometry; REFERENCES.md §6 check r=10, c=12 → s=2).
    const tol = 0.1;
    const arc = path().M(-6, -8).A(10, 10, 0, 0, 1, 6, -8).data();
    const chord = path().M(-6, -8).L(6, -8).data();
    const d = measureDeviation(arc, ID, chord, ID, tol)!;
    expectBetween(d.originalToResult, 2, 2 + SLACK * tol);
    expectBetween(d.resultToOriginal, 2, 2 + SLACK * tol); // chord midpoint (0,−8) is 10 − 8 = 2 from the circle
    expect(d.max).toBe(Math.max(d.originalToResult, d.resultToOriginal));
    expect(Math.abs(d.worstMm[0])).toBeLessThan(0.3); // the worst spot is over the middle of the chord
  });

  it('a circle against a concentric circle: the difference of radii, both directions', () => {
    const tol = 0.05;
    const d = measureDeviation(arcCircle(10), ID, arcCircle(10.3), ID, tol)!;
    expectBetween(d.originalToResult, 0.3, 0.3 + SLACK * tol);
    expectBetween(d.resultToOriginal, 0.3, 0.3 + SLACK * tol);
    expect(d.mean).toBeCloseTo(0.3, 4);
  });

  it('same circles rotated 30°, translated far away and mirrored: same deviation', () => {
    const tol = 0.05, c = Math.cos(Math.PI / 6), s = Math.sin(Math.PI / 6);
    const m = Float64Array.of(c, s, s, -c, 1e4, -2e4); // rotation · reflection + translation: an isometry
    const d = measureDeviation(arcCircle(10), m, arcCircle(10.3), m, tol)!;
    expectBetween(d.max, 0.3, 0.3 + SLACK * tol);
  });

  it('a circle r=10 under scale(2,1) against the ellipse A20 10 written untransformed: 0 (REFERENCES.md §5.2 T10)', () => {
    const tol = 0.01;
    const ellipse = path().M(20, 0).A(20, 10, 0, 0, 1, -20, 0).A(20, 10, 0, 0, 1, 20, 0).Z().data();
    const d = measureDeviation(arcCircle(10), Float64Array.of(2, 0, 0, 1, 0, 0), ellipse, ID, tol)!;
    expectBetween(d.max, 0, SLACK * tol);
    // and the same circle untransformed is a full 10 mm from the ellipse's far ends
    expectBetween(measureDeviation(arcCircle(10), ID, ellipse, ID, tol)!.resultToOriginal, 10, 10 + SLACK * tol);
  });

  it('a line against a parallel line: their distance; worst spot mapped back to user units', () => {
    const tol = 0.01;
    const orig = path().M(0, 0).L(10, 0).data();
    // written in units of 2 mm (writtenToMm = scale(2)), 0.05 mm away
    const written = path().M(0, 0.025).L(5, 0.025).data();
    const d = measureDeviation(orig, ID, written, Float64Array.of(2, 0, 0, 2, 0, 0), tol)!;
    expectBetween(d.originalToResult, 0.05, 0.05 + SLACK * tol);
    expectBetween(d.resultToOriginal, 0.05, 0.05 + SLACK * tol);
    expect(d.mean).toBeCloseTo(0.05, 12);
    // the worst spot lies on one of the two lines, and in user units it is the mm spot halved
    expect(d.worstMm[1] === 0 || Math.abs(d.worstMm[1] - 0.05) < 1e-12).toBe(true);
    expect(d.worstUser[0]).toBeCloseTo(d.worstMm[0] / 2, 12);
    expect(d.worstUser[1]).toBeCloseTo(d.worstMm[1] / 2, 12);
  });

  it('four-cubic circle (handle 0.5522847498·r) vs the true circle: 2.7253e-4·r both ways', () => {
    // Max radial error of the standard Bézier circle: +2.7253e-4·r (REFERENCES.md §6, SM / Bézier-circle literature).
    const r = 10, k = 0.5522847498 * r, tol = 1e-3;
    const bez = path().M(r, 0)
      .C(r, k, k, r, 0, r).C(-k, r, -r, k, -r, 0).C(-r, -k, -k, -r, 0, -r).C(k, -r, r, -k, r, 0).Z().data();
    const d = measureDeviation(bez, ID, arcCircle(r), ID, tol)!;
    expect(Math.abs(d.originalToResult - 2.7253e-4 * r)).toBeLessThanOrEqual(1e-6 * r);
    expect(Math.abs(d.resultToOriginal - 2.7253e-4 * r)).toBeLessThanOrEqual(1e-6 * r);
    // The worst spot: where the first quarter's radial error peaks, found here by dense evaluation
    // (t ≈ 0.2113, at ≈ 19.44°; by symmetry also 90° − that), in every quarter.
    let peak = 0, peakAng = 0;
    for (let i = 0; i <= 100000; i++) {
      const t = i / 100000, u = 1 - t;
      const x = u * u * u * r + 3 * u * u * t * r + 3 * u * t * t * k, y = 3 * u * u * t * k + 3 * u * t * t * r + t * t * t * r;
      if (Math.hypot(x, y) > peak) { peak = Math.hypot(x, y); peakAng = Math.atan2(y, x); }
    }
    expect(peak - r).toBeCloseTo(2.7253e-4 * r, 8);
    const off = ((Math.atan2(d.worstMm[1], d.worstMm[0]) % (Math.PI / 2)) + Math.PI / 2) % (Math.PI / 2);
    expect(Math.min(Math.abs(off - peakAng), Math.abs(off - (Math.PI / 2 - peakAng)))).toBeLessThan(0.01);
  });

  it('a path against itself reversed: 0 within the error bounds', () => {
    const tol = 0.02;
    const fwd = path().M(0, 0).L(10, 2).Q(20, -5, 25, 5).C(30, 15, 20, 25, 10, 20).A(8, 5, 30, 1, 0, 0, 10).Z().data();
    const rev = path().M(0, 0).L(0, 10).A(8, 5, 30, 1, 1, 10, 20).C(20, 25, 30, 15, 25, 5).Q(20, -5, 10, 2).Z().data();
    const d = measureDeviation(fwd, ID, rev, ID, tol)!;
    expectBetween(d.max, 0, SLACK * tol);
    // and a genuine change is seen: move one control point by 1
    const bent = path().M(0, 0).L(0, 10).A(8, 5, 30, 1, 1, 10, 20).C(20, 25, 31, 15, 25, 5).Q(20, -5, 10, 2).Z().data();
    expect(measureDeviation(fwd, ID, bent, ID, tol)!.max).toBeGreaterThan(0.1);
  });

  it('coarsens under a sample cap and stays an upper bound', () => {
    const tol = 0.001;
    const d = measureDeviation(arcCircle(50), ID, arcCircle(50.2), ID, tol, 2000)!;
    expect(d.originalToResult).toBeGreaterThanOrEqual(0.2);
    expect(d.resultToOriginal).toBeGreaterThanOrEqual(0.2);
    expect(d.max).toBeLessThan(0.3); // looser, still meaningful
  });

  it('null when a side draws nothing; rejects a bad tolerance', () => {
    expect(measureDeviation(path().M(1, 1).data(), ID, arcCircle(1), ID, 0.1)).toBeNull();
    expect(() => measureDeviation(arcCircle(1), ID, arcCircle(1), ID, 0)).toThrow(/got 0/);
  });
});
