/**
 * Exact shapes come back exact, and a refit of the fitter's own output changes
 * nothing (issue 10). A polyline sampled from a circle has its vertices on
 * the circle, so the circle is within the sampling sagitta r(1 − cos(π/n)) of
 * it (the sagitta of a chord: REFERENCES.md §6, common practice); its fit must
 * be the whole circle as two arcs (SVG cannot draw a full turn in one arc,
 * SVG 2 §9.5 F.6.2) on that circle: radius and centre within 0.1·tolerance +
 * the sagitta, starting at the contour's first vertex. Measurements by the
 * independent check (src/measure/polylineDeviation.ts). Shapes are our own
 * test data, seeded.
 */
import { describe, expect, it } from 'vitest';
import { fitPolyline } from '../../src/fit/fitPolyline.js';
import { fitContour } from '../../src/fit/fitContour.js';
import { arcGeometry, type Segment } from '../../src/fit/segment.js';
import { deviationOf } from './measure.js';
import { rng, roundedRect } from './shapes.js';

/** Points along the fitted segments, chords at most `step` (mm), end to end; closed: the start is not repeated. */
function sampleSegments(segs: Segment[], closed: boolean, step: number): Float64Array {
  const out: number[] = [segs[0].x0, segs[0].y0];
  segs.forEach((s, k) => {
    const g = arcGeometry(s);
    const len = g ? Math.abs(g.sweep) * g.r : Math.hypot(s.x1 - s.x0, s.y1 - s.y0);
    const m = Math.max(1, Math.ceil(len / step));
    const a0 = g ? Math.atan2(s.y0 - g.cy, s.x0 - g.cx) : 0;
    for (let i = 1; i <= m; i++) {
      if (closed && k === segs.length - 1 && i === m) break;
      if (i === m) out.push(s.x1, s.y1);
      else if (g) out.push(g.cx + g.r * Math.cos(a0 + (g.sweep * i) / m), g.cy + g.r * Math.sin(a0 + (g.sweep * i) / m));
      else out.push(s.x0 + ((s.x1 - s.x0) * i) / m, s.y0 + ((s.y1 - s.y0) * i) / m);
    }
  });
  return Float64Array.from(out);
}

describe('exact shapes come back exact', () => {
  it('a polyline sampled from a circle is 2 arcs on that circle, from its first vertex', () => {
    for (let seed = 1; seed <= 60; seed++) {
      const next = rng(700 + seed);
      const tol = [0.01, 0.05, 0.1][seed % 3];
      const r = 0.5 + 100 * next() ** 2, a0 = 6.28 * next();
      // Sampled so the chords stay within half the tolerance of the circle (a polygon beyond that is not a circle at this tolerance).
      const nMin = Math.ceil(Math.PI / Math.acos(1 - (0.5 * tol) / r));
      const n = Math.max(8, nMin + Math.floor(300 * next()));
      const sag = r * (1 - Math.cos(Math.PI / n));
      const cx = 200 * next() - 100, cy = 200 * next() - 100;
      const xy = new Float64Array(2 * n);
      for (let i = 0; i < n; i++) {
        xy[2 * i] = cx + r * Math.cos(a0 + (2 * Math.PI * i) / n);
        xy[2 * i + 1] = cy + r * Math.sin(a0 + (2 * Math.PI * i) / n);
      }
      const f = fitPolyline(xy, { tolerance: tol, closed: true });
      const what = `seed ${seed}: r ${r.toFixed(3)}, n ${n}, tol ${tol}`;
      expect(f.segments.length, what).toBe(2);
      for (const s of f.segments) {
        const g = arcGeometry(s);
        expect(g, what).not.toBeNull();
        expect(Math.abs(g!.r - r), what).toBeLessThanOrEqual(0.1 * tol + sag);
        expect(Math.hypot(g!.cx - cx, g!.cy - cy), what).toBeLessThanOrEqual(0.1 * tol + sag);
      }
      // The pierce point stays (to rounding: the arcs start at the first vertex's foot on the fitted circle).
      expect(Math.hypot(f.segments[0].x0 - xy[0], f.segments[0].y0 - xy[1]), what).toBeLessThanOrEqual(1e-9 * (1 + r));
      expect(deviationOf(xy, true, f.segments, tol).max, what).toBeLessThanOrEqual(tol);
    }
  });

  it('a circle sampled and rounded to 0.0001 mm (as written in a file) is 2 arcs on its circle', () => {
    for (let seed = 1; seed <= 40; seed++) {
      const next = rng(750 + seed);
      const tol = [0.02, 0.05, 0.1][seed % 3];
      const r = 1 + 40 * next(), n = Math.max(24, Math.ceil(Math.PI / Math.acos(1 - (0.3 * tol) / r)) + Math.floor(400 * next()));
      const sag = r * (1 - Math.cos(Math.PI / n));
      const xy = new Float64Array(2 * n);
      for (let i = 0; i < n; i++) {
        xy[2 * i] = Math.round((50 + r * Math.cos((2 * Math.PI * i) / n)) * 1e4) / 1e4;
        xy[2 * i + 1] = Math.round((50 + r * Math.sin((2 * Math.PI * i) / n)) * 1e4) / 1e4;
      }
      const f = fitPolyline(xy, { tolerance: tol, closed: true });
      const what = `seed ${seed}: r ${r.toFixed(3)}, n ${n}, tol ${tol}`;
      expect(f.segments.length, what).toBe(2);
      // The rounding moves each vertex by up to √2/2·1e-4 mm (REFERENCES.md §10.3 C1c allows that much).
      for (const s of f.segments) expect(Math.abs(arcGeometry(s)!.r - r), what).toBeLessThanOrEqual(0.1 * tol + sag + 1e-4);
      expect(Math.hypot(f.segments[0].x0 - xy[0], f.segments[0].y0 - xy[1]), what).toBeLessThanOrEqual(1e-4);
    }
  });

  it('the arcs of a line/arc composition keep their radius (rounded rectangles, fillet radius 0.5–10 mm)', () => {
    for (let seed = 1; seed <= 20; seed++) {
      const next = rng(800 + seed);
      const tol = [0.01, 0.05, 0.1][seed % 3];
      const rf = 0.5 + 9.5 * next(), step = 0.05 + 0.3 * next();
      const xy = roundedRect(30 + 20 * next(), 25 + 10 * next(), rf, step);
      const f = fitPolyline(xy, { tolerance: tol, closed: true });
      const arcs = f.segments.map(arcGeometry).filter((g) => g !== null);
      expect(arcs.length, `seed ${seed}`).toBe(4);
      // The corner arcs are sampled with chords of at most `step`: sagitta ≤ step²/(8 rf).
      for (const g of arcs) expect(Math.abs(g!.r - rf), `seed ${seed}`).toBeLessThanOrEqual(0.1 * tol + (step * step) / (8 * rf));
      expect([f.segments[0].x0, f.segments[0].y0]).toEqual([xy[0], xy[1]]);
    }
  });
});

describe('idempotence: refitting the fitter\'s own output changes nothing', () => {
  const shapes: [string, Float64Array, boolean][] = [];
  const next = rng(950);
  for (let k = 0; k < 6; k++) {
    const n = 400, xy = new Float64Array(2 * n);
    const a = [next(), next(), next()];
    for (let i = 0; i < n; i++) {
      const t = (2 * Math.PI * i) / n, r = 20 + 3 * a[0] * Math.sin(2 * t) + 2 * a[1] * Math.cos(3 * t + a[2]);
      xy[2 * i] = r * Math.cos(t);
      xy[2 * i + 1] = r * Math.sin(t);
    }
    shapes.push([`blob ${k}`, xy, true]);
  }
  shapes.push(['rounded rectangle', roundedRect(40, 30, 5, 0.2), true]);
  for (const tol of [0.02, 0.1]) {
    it(`a refit of its own output is kept as it is unless fewer pieces do (4 passes, tol ${tol} mm)`, () => {
      for (const [name, xy, closed] of shapes) {
        const first = fitPolyline(xy, { tolerance: tol, closed }).segments;
        let segs = first, changes = 0;
        for (let pass = 2; pass <= 5; pass++) {
          // The output, drawn again finely, with its own piece count as the original's: it is kept unless a
          // refit needs fewer pieces (the search can do better on its own smoother output), so a run of
          // refits stops changing after a few passes and cannot walk away.
          const again = fitContour(sampleSegments(segs, closed, tol / 4), { tolerance: tol, closed, originalPieces: segs.length });
          if (again.choice === 'original') continue;
          changes++;
          expect(again.pieces, `${name}, pass ${pass}`).toBeLessThan(segs.length);
          segs = again.segments!;
        }
        expect(changes, name).toBeLessThanOrEqual(2);
        // The last pass changed nothing.
        expect(fitContour(sampleSegments(segs, closed, tol / 4), { tolerance: tol, closed, originalPieces: segs.length }).choice, name).toBe('original');
        // The fitter alone on its own output starts where it started (its piece count may differ by one
        // either way: the knot search is not a fixed point, which is why the contour keeps its original).
        const refit = fitPolyline(sampleSegments(first, closed, tol / 4), { tolerance: tol, closed }).segments;
        expect(Math.hypot(refit[0].x0 - first[0].x0, refit[0].y0 - first[0].y0), name).toBeLessThanOrEqual(1e-9);
      }
    });
  }
});
