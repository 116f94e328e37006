/** Seeded generators for the plan benchmark: random strokes, and a drawing of outlines with hatching. */
import type { PlanContour } from '../src/plan/types.js';
// The tests' seeded generator (mulberry32), so the bench's cases are the tests' cases for one seed.
import { rng } from '../test/rng.js';

/** `n` straight strokes in a `side` × `side` mm square, random direction, length uniform in [lo, hi] mm. */
export function randomStrokes(n: number, lo: number, hi: number, seed: number, side = 300): PlanContour[] {
  const r = rng(seed);
  return Array.from({ length: n }, (_, i) => {
    const x = side * r(), y = side * r(), a = 2 * Math.PI * r(), l = lo + (hi - lo) * r();
    return { xy: Float64Array.of(x, y, x + l * Math.cos(a), y + l * Math.sin(a)), closed: false, group: '#000', filled: false, source: { element: i, subpath: 0 } };
  });
}

/**
 * A drawing as an exporter writes it: shapes (circles and squares, 64-gon outlines) in rows, each
 * followed by its hatching (lines 1 mm apart at 45°, every one drawn in the same direction, as many
 * exporters do), the outline drawn again at the end as a second pass (a double line).
 */
export function hatchedDrawing(seed: number, shapes = 40): PlanContour[] {
  const r = rng(seed);
  const out: PlanContour[] = [];
  const add = (xy: number[], closed: boolean): void => {
    out.push({ xy: Float64Array.from(xy), closed, group: '#000', filled: false, source: { element: out.length, subpath: 0 } });
  };
  for (let s = 0; s < shapes; s++) {
    const cx = 25 + 50 * (s % 6) + 5 * r(), cy = 25 + 50 * Math.floor(s / 6) + 5 * r(), rad = 10 + 10 * r();
    const circle = s % 2 === 0;
    const outline: number[] = [];
    for (let k = 0; k < 64; k++) {
      const a = (2 * Math.PI * k) / 64;
      if (circle) outline.push(cx + rad * Math.cos(a), cy + rad * Math.sin(a));
      else {
        // A square of half side rad traced by 64 points (16 a side).
        const side = k >> 4, u = (k % 16) / 16 * 2 - 1;
        const [x, y] = side === 0 ? [u, -1] : side === 1 ? [1, u] : side === 2 ? [-u, 1] : [-1, -u];
        outline.push(cx + rad * x, cy + rad * y);
      }
    }
    add(outline, true);
    // Hatching at 45°: lines x − y = c clipped to the shape (circle: chord; square: the diagonal band).
    for (let c = -2 * rad + 0.5; c < 2 * rad; c += 1) {
      const ux = Math.SQRT1_2, uy = Math.SQRT1_2; // direction along the hatch line
      const px = cx + (c / 2), py = cy - (c / 2); // foot of the line on the centre's normal
      let t0: number, t1: number;
      const off = Math.abs(c) * Math.SQRT1_2;
      if (circle) {
        if (off >= rad) continue;
        const h = Math.sqrt(rad * rad - off * off);
        t0 = -h;
        t1 = h;
      } else {
        // Inside |x|, |y| ≤ rad: the parameter range where both coordinates stay in the square.
        t0 = -Infinity;
        t1 = Infinity;
        for (const [p, u, q] of [[px - cx, ux, rad], [py - cy, uy, rad]]) {
          const a = (-q - p) / u, b = (q - p) / u;
          t0 = Math.max(t0, Math.min(a, b));
          t1 = Math.min(t1, Math.max(a, b));
        }
        if (!(t1 > t0)) continue;
      }
      add([px + t0 * ux, py + t0 * uy, px + t1 * ux, py + t1 * uy], false);
    }
    add(outline, true);
  }
  return out;
}
