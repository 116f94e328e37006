import { describe, expect, it } from 'vitest';
import { planContours } from '../../src/plan/plan.js';
import type { PlanContour, PlanSettings } from '../../src/plan/types.js';
import { rng } from '../rng.js';

/**
 * The plan loses nothing and adds nothing: on random line soups full of duplicates, reversed and partial
 * overlaps and shared ends, every point of the input lies within the plan's slack of the planned lines and
 * every planned point within it of the input (a two-sided distance, by brute force over dense samples).
 */
const S: PlanSettings = { join: true, overlaps: true, order: true, holesFirst: false, joinDistance: 0.1, overlapDistance: 0.05, start: [0, 0] };

function segmentsOf(cs: readonly { xy: Float64Array; closed: boolean }[]): number[][] {
  const out: number[][] = [];
  for (const c of cs) {
    const n = c.xy.length >> 1;
    for (let k = 0; k + 1 < (c.closed ? n + 1 : n); k++) {
      const j = (k + 1) % n;
      out.push([c.xy[2 * k], c.xy[2 * k + 1], c.xy[2 * j], c.xy[2 * j + 1]]);
    }
  }
  return out;
}

function pointSegment(px: number, py: number, s: number[]): number {
  const [ax, ay, bx, by] = s;
  const lx = bx - ax, ly = by - ay, ll = lx * lx + ly * ly;
  const t = ll > 0 ? Math.max(0, Math.min(1, ((px - ax) * lx + (py - ay) * ly) / ll)) : 0;
  return Math.hypot(ax + t * lx - px, ay + t * ly - py);
}

/** Largest distance from samples along `from` (every 0.02 mm) to the nearest segment of `to`. */
function directed(from: number[][], to: number[][]): number {
  let worst = 0;
  for (const [ax, ay, bx, by] of from) {
    const steps = Math.max(1, Math.ceil(Math.hypot(bx - ax, by - ay) / 0.02));
    for (let k = 0; k <= steps; k++) {
      const x = ax + ((bx - ax) * k) / steps, y = ay + ((by - ay) * k) / steps;
      let best = Infinity;
      for (const s of to) best = Math.min(best, pointSegment(x, y, s));
      worst = Math.max(worst, best);
    }
  }
  return worst;
}

describe('plan coverage', () => {
  for (const seed of [1, 2, 3]) {
    it(`keeps a random lattice soup within its slack both ways (seed ${seed})`, () => {
      const r = rng(seed);
      const input: PlanContour[] = [];
      // Lines between neighbouring points of a 4 × 4 lattice of 10 mm, some continued to the next point
      // (partial overlaps), some reversed, each end moved by up to 0.02 mm.
      for (let i = 0; i < 60; i++) {
        const x = 10 * Math.floor(4 * r()), y = 10 * Math.floor(4 * r());
        const [dx, dy] = [[10, 0], [0, 10], [10, 10]][Math.floor(3 * r())];
        const m = r() < 0.3 ? 2 : 1;
        const jit = (): number => 0.04 * (r() - 0.5);
        const a = [x + jit(), y + jit()], b = [x + m * dx + jit(), y + m * dy + jit()];
        const xy = r() < 0.5 ? [...a, ...b] : [...b, ...a];
        input.push({ xy: Float64Array.from(xy), closed: false, group: 'k', filled: false, source: { element: i, subpath: 0 } });
      }
      const { contours, stats } = planContours(input, S);
      const slack = Math.max(...contours.map((c) => c.slack));
      expect(slack).toBeLessThanOrEqual(S.overlapDistance);
      const a = segmentsOf(input), b = segmentsOf(contours);
      // 0.02 mm sample spacing adds at most 0.01 mm to a directed distance.
      expect(directed(a, b)).toBeLessThanOrEqual(slack + 0.01);
      expect(directed(b, a)).toBeLessThanOrEqual(slack + 0.01);
      expect(stats.doubleLength).toBeGreaterThan(0);
      expect(stats.piercesAfter).toBeLessThan(stats.piercesBefore);
      // Every input contour is accounted for: drawn by a planned contour, or removed as a double line.
      const drawn = new Set(contours.flatMap((c) => c.sources.map((s) => s.element)));
      expect(drawn.size + stats.doubleContours).toBeGreaterThanOrEqual(input.length);
    });
  }
});
