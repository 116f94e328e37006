/**
 * The straight-move alternative to a fitted spline: the input thinned within
 * the tolerance (./prefilter.ts, a vertex subset proven within the bound both
 * ways) and written as lines. A contour whose spline would need more pieces
 * than this gets these lines instead, so a fit is never worse than lines.
 */
import { thinWithin } from './prefilter.js';
import type { Segment } from './segment.js';

/**
 * Lines through a vertex subset of `xy` within `delta` of it (two-sided).
 * A closed contour's last line returns to vertex 0.
 * @param xy flat x,y pairs (mm)
 * @param delta bound (mm)
 */
export function thinnedLines(xy: Float64Array, closed: boolean, delta: number): Segment[] {
  const n = xy.length >> 1;
  if (n < 2) return [];
  const kept = thinWithin(xy, n, closed, delta, null);
  const out: Segment[] = [];
  for (let j = 0; j + 1 < kept.length; j++) {
    const a = kept[j], b = kept[j + 1];
    const x0 = xy[2 * a], y0 = xy[2 * a + 1], x1 = xy[2 * b], y1 = xy[2 * b + 1];
    if (x0 === x1 && y0 === y1) continue;
    // The translation motor taking (x0, y0) to (x1, y1): 1 − ½(Δx e01 + Δy e02), as the rotor step writes a line.
    out.push({ kind: 'line', motor: Float64Array.of(1, -0.5 * (x1 - x0), -0.5 * (y1 - y0), 0), x0, y0, x1, y1, i0: a, i1: b });
  }
  return out;
}
