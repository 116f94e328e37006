import { describe, expect, it } from 'vitest';
import { removeOverlaps, type Polyline } from '../../src/plan/overlap.js';

const D = 0.05;
const run = (cs: Polyline[]) => removeOverlaps(cs, D, 4 * D, 20 * D);
const line = (...xy: number[]): Polyline => ({ xy: Float64Array.from(xy), closed: false });
const length = (p: Polyline): number => {
  let l = 0;
  const n = p.xy.length >> 1;
  for (let k = 1; k < (p.closed ? n + 1 : n); k++) {
    const i = k % n;
    l += Math.hypot(p.xy[2 * i] - p.xy[2 * k - 2], p.xy[2 * i + 1] - p.xy[2 * k - 1]);
  }
  return l;
};
/** An arc of radius r about (cx, cy) from a0 to a1 (radians), flattened into m chords. */
const arc = (cx: number, cy: number, r: number, a0: number, a1: number, m: number): Polyline => ({
  xy: Float64Array.from({ length: 2 * (m + 1) }, (_, k) => {
    const a = a0 + ((a1 - a0) * (k >> 1)) / m;
    return k % 2 ? cy + r * Math.sin(a) : cx + r * Math.cos(a);
  }),
  closed: false,
});

describe('removeOverlaps', () => {
  it('removes exact and reversed duplicates whole', () => {
    const res = run([line(0, 0, 100, 0), line(0, 0, 100, 0), line(100, 0, 0, 0)]);
    expect(res.pieces).toHaveLength(1);
    expect(res.removedLength).toBeCloseTo(200, 9);
    expect(res.touched).toBe(2);
  });

  it('removes exactly the overlap of collinear and of parallel partial overlaps', () => {
    // (50,0)–(150,0) after (0,0)–(100,0): overlap 50 (interval arithmetic on the x axis); what is left runs 100 → 150.
    const res = run([line(0, 0, 100, 0), line(50, 0, 150, 0)]);
    expect(res.removedLength).toBeCloseTo(50, 9);
    expect(Array.from(res.pieces[1].xy)).toEqual([100, 0, 150, 0]);
    // A parallel line 0.03 mm off (within D), reversed, overlapping 30..70 inside a longer one: the middle 40 goes.
    const mid = run([line(0, 0, 100, 0), line(70, 0.03, 30, 0.03)]);
    expect(mid.removedLength).toBeCloseTo(40, 9);
    expect(mid.pieces).toHaveLength(1);
    // A polyline of length 40 running along one side of a square of perimeter 40 drawn first: its middle 10 goes
    // and it splits into two pieces of 15 (interval arithmetic along the x axis).
    const square = { xy: Float64Array.of(0, 0, 10, 0, 10, 10, 0, 10), closed: true };
    const split = run([square, line(-15, 0.01, 0, 0.01, 10, 0.01, 25, 0.01)]);
    expect(split.removedLength).toBeCloseTo(10, 9);
    expect(split.pieces.filter((p) => p.from === 1).map(length)).toEqual([expect.closeTo(15, 9), expect.closeTo(15, 9)]);
  });

  it('removes a short line lying on a long one whole, whichever comes first', () => {
    // (30,0)–(60,0) lies on (0,0)–(100,0): 30 mm removed, the long line stays in one piece.
    for (const cs of [[line(30, 0, 60, 0), line(0, 0, 100, 0)], [line(0, 0, 100, 0), line(60, 0, 30, 0)]]) {
      const res = run(cs);
      expect(res.removedLength).toBeCloseTo(30, 9);
      expect(res.pieces).toHaveLength(1);
      expect(length(res.pieces[0])).toBeCloseTo(100, 9);
    }
  });

  it('keeps crossing lines, shallow ones included', () => {
    expect(run([line(0, 0, 100, 0), line(50, -50, 50, 50)]).removedLength).toBe(0);
    // 10° through the middle: the part within D of the kept line is 2D / sin 10° ≈ 11.5 D, under the 20 D kept for inner stretches.
    const a = (10 * Math.PI) / 180;
    expect(run([line(0, 0, 100, 0), line(50 - 40 * Math.cos(a), -40 * Math.sin(a), 50 + 40 * Math.cos(a), 40 * Math.sin(a))]).removedLength).toBe(0);
  });

  it('removes the co-circular part of two arcs flattened differently', () => {
    // Arc 0°–180° and arc 90°–270° of radius 20: they share 90°–180°, r·π/2 = 31.4 mm of arc (s = rθ),
    // here the second arc's chords over that quarter (64 and 50 chords per half circle).
    const res = run([arc(0, 0, 20, 0, Math.PI, 64), arc(0, 0, 20, Math.PI / 2, (3 * Math.PI) / 2, 50)]);
    const chords = 25 * 2 * 20 * Math.sin(Math.PI / 100); // 25 chords of angle π/50: 2r·sin(θ/2) each
    expect(res.removedLength).toBeGreaterThan(chords - 0.05);
    expect(res.removedLength).toBeLessThan(chords + 0.05);
    expect(res.pieces.filter((p) => p.from === 1).map(length)[0]).toBeCloseTo(chords, 1);
  });

  it('keeps each edge of a grid of squares drawn as closed paths once', () => {
    // n × n squares of side s: drawn 4n²s, unique edges 2n(n+1)s, removed 2n(n−1)s (counting edges of the grid graph).
    const n = 4, s = 10;
    const squares: Polyline[] = [];
    for (let j = 0; j < n; j++) {
      for (let i = 0; i < n; i++) {
        const x = i * s, y = j * s;
        squares.push({ xy: Float64Array.of(x, y, x + s, y, x + s, y + s, x, y + s), closed: true });
      }
    }
    const res = run(squares);
    expect(res.removedLength).toBeCloseTo(2 * n * (n - 1) * s, 9);
    const kept = res.pieces.reduce((t, p) => t + length(p), 0);
    expect(kept).toBeCloseTo(2 * n * (n + 1) * s, 9);
    // Every unit edge's midpoint lies on exactly one kept segment.
    const mids: [number, number][] = [];
    for (let j = 0; j <= n; j++) for (let i = 0; i < n; i++) mids.push([(i + 0.5) * s, j * s], [j * s, (i + 0.5) * s]);
    for (const [mx, my] of mids) {
      let on = 0;
      for (const p of res.pieces) {
        const m = p.xy.length >> 1;
        for (let k = 0; k < (p.closed ? m : m - 1); k++) {
          const q = (k + 1) % m;
          const [ax, ay, bx, by] = [p.xy[2 * k], p.xy[2 * k + 1], p.xy[2 * q], p.xy[2 * q + 1]];
          const cross = (bx - ax) * (my - ay) - (by - ay) * (mx - ax);
          const dot = (mx - ax) * (bx - ax) + (my - ay) * (by - ay);
          if (Math.abs(cross) < 1e-9 && dot > 0 && dot < (bx - ax) ** 2 + (by - ay) ** 2) on++;
        }
      }
      expect(on, `edge at ${mx}, ${my}`).toBe(1);
    }
  });
});
