import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fitPolyline } from '../../src/fit/fitPolyline.js';
import { arcGeometry, type Segment } from '../../src/fit/segment.js';
import { circle, mapXY, reversed, rng, roundedRect, slot } from './shapes.js';
import { deviationOf } from './measure.js';
import { ellipse, sine, spiral } from '../../bench/curves.js';

/** Unit tangents at the start and end of a segment, read off its circle. */
function tangents(s: Segment): [number, number, number, number] {
  const g = arcGeometry(s);
  if (!g) {
    const l = Math.hypot(s.x1 - s.x0, s.y1 - s.y0);
    const t: [number, number] = [(s.x1 - s.x0) / l, (s.y1 - s.y0) / l];
    return [t[0], t[1], t[0], t[1]];
  }
  const sg = g.sweep > 0 ? 1 : -1;
  return [(-sg * (s.y0 - g.cy)) / g.r, (sg * (s.x0 - g.cx)) / g.r, (-sg * (s.y1 - g.cy)) / g.r, (sg * (s.x1 - g.cx)) / g.r];
}

/** Dot product of the tangents at each joint (closed: including the seam). */
function jointDots(segs: Segment[], closed: boolean): number[] {
  const out: number[] = [];
  const n = closed ? segs.length : segs.length - 1;
  for (let k = 0; k < n; k++) {
    const a = tangents(segs[k]), b = tangents(segs[(k + 1) % segs.length]);
    out.push(a[2] * b[0] + a[3] * b[1]);
  }
  return out;
}

const kinds = (segs: Segment[]): string => segs.map((s) => (s.kind === 'arc' ? 'a' : 'l')).join('');

describe('exact primitives come back with exactly their pieces', () => {
  for (const tol of [0.01, 0.05, 0.2]) {
    it(`rounded rectangle → 4 lines + 4 arcs, circle → 2 arcs, slot → 2 lines + 2 arcs (tol ${tol} mm)`, () => {
      const cases: [Float64Array, number, number][] = [
        [roundedRect(60, 40, 8, 0.2), 4, 4],
        [circle(5, -3, 50, 2000), 2, 0],
        [slot(40, 6, 0.2), 2, 2],
      ];
      for (const [xy, arcs, lines] of cases) {
        const r = fitPolyline(xy, { tolerance: tol, closed: true });
        expect(r.segments.filter((s) => s.kind === 'arc').length).toBe(arcs);
        expect(r.segments.filter((s) => s.kind === 'line').length).toBe(lines);
        expect(deviationOf(xy, true, r.segments, tol).max).toBeLessThanOrEqual(tol);
        // Tangent-continuous everywhere, the seam included.
        for (const d of jointDots(r.segments, true)) expect(d).toBeGreaterThan(1 - 1e-9);
      }
    });
  }

  it('a circle of radius R sampled as a polyline comes back on radius R (F1: one circle, two SVG arcs)', () => {
    const r = fitPolyline(circle(0, 0, 50, 4000), { tolerance: 0.05, closed: true });
    expect(r.segments.length).toBe(2);
    for (const s of r.segments) expect(arcGeometry(s)!.r).toBeCloseTo(50, 3);
  });
});

describe('invariance under rigid motions, reversal and scale', () => {
  const shapes: [string, Float64Array, boolean][] = [
    ['rounded rectangle', roundedRect(60, 40, 8, 0.2), true],
    ['slot', slot(40, 6, 0.2), true],
    ['sine', sine().xy, false],
    ['ellipse', ellipse().xy, true],
  ];
  for (const [name, xy, closed] of shapes) {
    it(`${name}: same count rotated by 90° steps, mirrored, reversed, moved 1e6 away, scaled 1000× (tolerance scaled)`, () => {
      const tol = 0.05;
      const base = fitPolyline(xy, { tolerance: tol, closed }).segments.length;
      const variants = [
        mapXY(xy, 0, 1, -1, 0, 0, 0), mapXY(xy, -1, 0, 0, -1, 0, 0), mapXY(xy, 0, -1, 1, 0, 0, 0),
        mapXY(xy, -1, 0, 0, 1, 0, 0), reversed(xy), mapXY(xy, 1, 0, 0, 1, 1e6, -1e6),
      ];
      for (const v of variants) {
        const r = fitPolyline(v, { tolerance: tol, closed });
        expect(r.segments.length).toBe(base);
        expect(deviationOf(v, closed, r.segments, tol).max).toBeLessThanOrEqual(tol);
      }
      const big = fitPolyline(mapXY(xy, 1000, 0, 0, 1000, 0, 0), { tolerance: 1000 * tol, closed });
      expect(big.segments.length).toBe(base);
      const small = fitPolyline(mapXY(xy, 1e-3, 0, 0, 1e-3, 0, 0), { tolerance: 1e-3 * tol, closed });
      expect(small.segments.length).toBe(base);
    });
  }
});

describe('lines, corners and degenerate input', () => {
  it('exactly collinear input is one line, never a huge-radius arc', () => {
    const xy = new Float64Array(2000);
    for (let i = 0; i < 1000; i++) {
      xy[2 * i] = 0.37 * i;
      xy[2 * i + 1] = -0.11 * i + 5;
    }
    const r = fitPolyline(xy, { tolerance: 0.01 });
    expect(kinds(r.segments)).toBe('l');
    expect(r.segments[0].x0).toBe(0);
    expect(r.segments[0].y1).toBeCloseTo(-0.11 * 999 + 5, 9);
  });

  it('a square traced with jitter below the tolerance keeps its four sharp corners and four lines', () => {
    const rand = rng(5);
    const pts: number[] = [];
    const side = (x0: number, y0: number, x1: number, y1: number): void => {
      for (let i = 0; i < 200; i++) {
        const t = i / 200;
        pts.push(x0 + t * (x1 - x0) + (rand() - 0.5) * 0.02, y0 + t * (y1 - y0) + (rand() - 0.5) * 0.02);
      }
    };
    side(0, 0, 40, 0);
    side(40, 0, 40, 40);
    side(40, 40, 0, 40);
    side(0, 40, 0, 0);
    const xy = Float64Array.from(pts);
    const tol = 0.1;
    const r = fitPolyline(xy, { tolerance: tol, closed: true });
    expect(r.corners.length).toBe(4);
    expect(kinds(r.segments)).toBe('llll');
    expect(deviationOf(xy, true, r.segments, tol).max).toBeLessThanOrEqual(tol);
    // Corners stay sharp: the turn at every joint is about 90°.
    for (const d of jointDots(r.segments, true)) expect(Math.abs(d)).toBeLessThan(0.05);
  });

  it('0, 1 or 2 points, repeated points, zero-length segments and spikes do not crash', () => {
    expect(fitPolyline(new Float64Array(0), { tolerance: 0.1 }).segments).toEqual([]);
    expect(fitPolyline(new Float64Array([1, 2]), { tolerance: 0.1 }).segments).toEqual([]);
    expect(kinds(fitPolyline(new Float64Array([0, 0, 3, 4]), { tolerance: 0.1 }).segments)).toBe('l');
    const rep = new Float64Array(2 * 3000).fill(7);
    expect(fitPolyline(rep, { tolerance: 0.1, closed: true }).segments).toEqual([]);
    const zero = new Float64Array([0, 0, 0, 0, 5, 0, 5, 0, 5, 0, 10, 0]);
    expect(kinds(fitPolyline(zero, { tolerance: 0.1 }).segments)).toBe('l');
    // Back and forth: a spike out and back along the same line.
    const spike = new Float64Array([0, 0, 10, 0, 20, 0, 10, 0, 0, 0, 0, 10]);
    const rs = fitPolyline(spike, { tolerance: 0.1 });
    expect(deviationOf(spike, false, rs.segments, 0.1).max).toBeLessThanOrEqual(0.1);
    expect(() => fitPolyline(new Float64Array([0, 0, NaN, 1]), { tolerance: 0.1 })).toThrow(/not finite/);
    expect(() => fitPolyline(new Float64Array([0, 0, 1, 1]), { tolerance: 0 })).toThrow(/tolerance/);
  });
});

describe('seeded property tests: always within the tolerance, measured independently', () => {
  it('random smooth closed curves (sums of harmonics)', () => {
    const rand = rng(2026);
    for (let k = 0; k < 12; k++) {
      const n = 3000, a = [rand(), rand(), rand()], ph = [rand(), rand(), rand()];
      const xy = new Float64Array(2 * n);
      for (let i = 0; i < n; i++) {
        const t = (2 * Math.PI * i) / n;
        const r = 30 + 6 * a[0] * Math.sin(2 * t + 6 * ph[0]) + 3 * a[1] * Math.sin(5 * t + 6 * ph[1]) + a[2] * Math.cos(9 * t + 6 * ph[2]);
        xy[2 * i] = r * Math.cos(t);
        xy[2 * i + 1] = r * Math.sin(t);
      }
      const tol = [0.01, 0.05, 0.2][k % 3];
      const r = fitPolyline(xy, { tolerance: tol, closed: true });
      expect(deviationOf(xy, true, r.segments, tol).max).toBeLessThanOrEqual(tol);
      for (const d of jointDots(r.segments, true)) expect(d).toBeGreaterThan(1 - 1e-9);
    }
  });

  it('random compositions of lines and arcs, and noisy traces of them', () => {
    const rand = rng(99);
    for (let k = 0; k < 12; k++) {
      const pts: number[] = [0, 0];
      let x = 0, y = 0, h = 0;
      const noise = k % 2 ? 0.02 : 0;
      for (let p = 0; p < 8; p++) {
        if (rand() < 0.5) {
          const len = 5 + 20 * rand();
          for (let i = 1; i <= len / 0.1; i++) pts.push(x + Math.cos(h) * i * 0.1, y + Math.sin(h) * i * 0.1);
          x += Math.cos(h) * Math.floor(len / 0.1) * 0.1;
          y += Math.sin(h) * Math.floor(len / 0.1) * 0.1;
        } else {
          const r = 3 + 20 * rand(), turn = (rand() - 0.5) * 3, sg = turn > 0 ? 1 : -1;
          const cx = x - sg * r * Math.sin(h), cy = y + sg * r * Math.cos(h);
          const a0 = Math.atan2(y - cy, x - cx), steps = Math.ceil((Math.abs(turn) * r) / 0.1);
          for (let i = 1; i <= steps; i++) {
            const a = a0 + (turn * i) / steps;
            pts.push(cx + r * Math.cos(a), cy + r * Math.sin(a));
          }
          x = pts[pts.length - 2];
          y = pts[pts.length - 1];
          h += turn;
        }
      }
      for (let i = 0; i < pts.length; i++) pts[i] += (rand() - 0.5) * 2 * noise;
      const xy = Float64Array.from(pts);
      const tol = 0.1;
      const r = fitPolyline(xy, { tolerance: tol });
      expect(deviationOf(xy, false, r.segments, tol).max).toBeLessThanOrEqual(tol);
    }
  });
});

describe('benchmark curves: segment counts only tighten', () => {
  const expected = JSON.parse(readFileSync(new URL('./expected.json', import.meta.url), 'utf8'));
  for (const c of [ellipse(), sine(), spiral()]) {
    for (const tol of [0.01, 0.05]) {
      it(`${c.name} at ${tol} mm: at most ${expected[c.name][tol]} pieces (ceiling ${expected.ceiling[c.name][tol]}), within tolerance`, () => {
        const r = fitPolyline(c.xy, { tolerance: tol, closed: c.closed });
        const n = r.segments.length;
        expect(n).toBeLessThanOrEqual(expected[c.name][tol]);
        if (n < expected[c.name][tol]) console.log(`${c.name} ${tol}: ${n} beats the recorded ${expected[c.name][tol]}: tighten test/fit/expected.json`);
        expect(deviationOf(c.xy, c.closed, r.segments, tol).max).toBeLessThanOrEqual(tol);
      });
    }
  }
});
