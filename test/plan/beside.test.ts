import { describe, expect, it } from 'vitest';
import { segmentBesideSegment } from '../../src/plan/beside.js';
import { rng } from '../rng.js';

/** Whether (x, y) projects onto AB between its ends and lies within r of its line (the definition, by vectors). */
function beside(x: number, y: number, c: number[], r: number): boolean {
  const lx = c[6] - c[4], ly = c[7] - c[5], len = Math.hypot(lx, ly);
  const along = ((x - c[4]) * lx + (y - c[5]) * ly) / len;
  const across = ((y - c[5]) * lx - (x - c[4]) * ly) / len;
  return along >= 0 && along <= len && Math.abs(across) <= r;
}

describe('segmentBesideSegment', () => {
  it('matches dense sampling of the definition on random pairs', () => {
    const r = rng(21);
    const out = new Float64Array(2);
    const N = 2000;
    let nonEmpty = 0;
    for (let trial = 0; trial < 400; trial++) {
      const c = Array.from({ length: 8 }, () => 10 * r());
      const rad = 0.2 + 3 * r();
      const hit = segmentBesideSegment(out, c[0], c[1], c[2], c[3], c[4], c[5], c[6], c[7], rad);
      let lo = Infinity, hi = -Infinity;
      for (let k = 0; k <= N; k++) {
        const t = k / N;
        if (beside(c[0] + t * (c[2] - c[0]), c[1] + t * (c[3] - c[1]), c, rad)) {
          lo = Math.min(lo, t);
          hi = Math.max(hi, t);
        }
      }
      if (lo > hi) {
        // Sampling can miss a sliver narrower than a step.
        if (hit) expect(out[1] - out[0]).toBeLessThan(2 / N);
        continue;
      }
      nonEmpty++;
      expect(hit).toBe(true);
      expect(out[0]).toBeCloseTo(lo, 2);
      expect(out[1]).toBeCloseTo(hi, 2);
    }
    expect(nonEmpty).toBeGreaterThan(50);
  });

  it('gives the overlap of parallel segments exactly (closed form)', () => {
    const out = new Float64Array(2);
    // PQ from x = -5 to 15 at height 0.3 beside AB from 0 to 10 (r = 0.5): x in [0, 10], t in [5/20, 15/20].
    expect(segmentBesideSegment(out, -5, 0.3, 15, 0.3, 0, 0, 10, 0, 0.5)).toBe(true);
    expect(out[0]).toBeCloseTo(5 / 20, 12);
    expect(out[1]).toBeCloseTo(15 / 20, 12);
    // Reversed direction: same part, parameters mirrored.
    segmentBesideSegment(out, 15, -0.3, -5, -0.3, 0, 0, 10, 0, 0.5);
    expect(out[0]).toBeCloseTo(5 / 20, 12);
    expect(out[1]).toBeCloseTo(15 / 20, 12);
    expect(segmentBesideSegment(out, -5, 0.6, 15, 0.6, 0, 0, 10, 0, 0.5)).toBe(false);
    // Crossing at 90° through the middle of AB: the part within r of its line, 2r long of a 20 long PQ.
    segmentBesideSegment(out, 5, -10, 5, 10, 0, 0, 10, 0, 0.5);
    expect((out[1] - out[0]) * 20).toBeCloseTo(1, 12);
  });
});
