import { describe, expect, it } from 'vitest';
import { svgPathProperties } from 'svg-path-properties';
import Flatbush from 'flatbush';
import { emitSegments, writtenArcErrorBound, type EmitContour } from '../../src/write/emit.js';
import { PathWriter } from '../../src/write/pathWriter.js';
import { RecordingSink, type PathCommand } from '../../src/write/recorder.js';
import { arcGeometry, type Segment } from '../../src/fit/segment.js';
import { matrix, multiply } from '../../src/svg/matrix.js';
import { parsePathData } from '../../src/svg/pathData.js';
import type { Matrix } from '../../src/svg/matrixTypes.js';

/** Seeded generator (Park–Miller minimal standard, common practice). */
function rng(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

/** Arc segment about (cx, cy), radius r, from angle a0 through signed sweep sw (rad). Motor per src/pga/layout.ts header. */
function arcSeg(cx: number, cy: number, r: number, a0: number, sw: number): Segment {
  const s = Math.cos(sw / 2), e12 = -Math.sin(sw / 2);
  return {
    kind: 'arc', motor: Float64Array.of(s, cy * e12, -cx * e12, e12),
    x0: cx + r * Math.cos(a0), y0: cy + r * Math.sin(a0),
    x1: cx + r * Math.cos(a0 + sw), y1: cy + r * Math.sin(a0 + sw), i0: 0, i1: 0,
  };
}

function lineSeg(x0: number, y0: number, x1: number, y1: number): Segment {
  return { kind: 'line', motor: Float64Array.of(1, -(x1 - x0) / 2, -(y1 - y0) / 2, 0), x0, y0, x1, y1, i0: 0, i1: 0 };
}

const IDENTITY = matrix(1, 0, 0, 1, 0, 0);

function record(contours: EmitContour[], m: Matrix, digits: number): RecordingSink {
  const s = new RecordingSink();
  emitSegments(s, contours, m, { digits });
  return s;
}

function arcs(s: RecordingSink): Extract<PathCommand, { op: 'A' }>[] {
  return s.commands.filter((c): c is Extract<PathCommand, { op: 'A' }> => c.op === 'A');
}

describe('test helpers', () => {
  it('build motors that arcGeometry reads back', () => {
    const g = arcGeometry(arcSeg(3, -2, 5, 0.3, -2.5));
    expect(g).not.toBeNull();
    expect(g!.cx).toBeCloseTo(3, 12);
    expect(g!.cy).toBeCloseTo(-2, 12);
    expect(g!.r).toBeCloseTo(5, 12);
    expect(g!.sweep).toBeCloseTo(-2.5, 12);
    expect(arcGeometry(lineSeg(0, 0, 1, 1))).toBeNull();
  });
});

describe('emitSegments', () => {
  it('writes a full circle as two arcs', () => {
    // An arc with equal end points is omitted (W3C SVG 1.1 F.6.2, REFERENCES.md §1.4 A8),
    // so a circle needs two commands (S11 F.6.4 note, REFERENCES.md §1.3).
    const circle = arcSeg(0, 0, 10, 0, 2 * Math.PI - 1e-12);
    const s = record([{ segments: [circle], closed: true }], IDENTITY, 2);
    expect(s.commands.map((c) => c.op)).toEqual(['M', 'A', 'A', 'Z']);
    const [a1, a2] = arcs(s);
    expect([a1.x, a1.y, a2.x, a2.y]).toEqual([-10, 0, 10, 0]);
    expect(a1.largeArc || a2.largeArc).toBe(false);
    // The text, read by svg-path-properties (npm), has the circle's length 2π·10 (its arcs are
    // approximated by 300 chords, hence 1e-3).
    const w = new PathWriter({ digits: 2 });
    emitSegments(w, [{ segments: [circle], closed: true }], IDENTITY, { digits: 2 });
    expect(new svgPathProperties(w.toString()).getTotalLength()).toBeCloseTo(20 * Math.PI, 2);
  });

  it('splits an arc whose rounded ends coincide, and drops a tiny one', () => {
    const nearFull = arcSeg(0, 0, 10, 0, 2 * Math.PI - 1e-4); // chord 1e-3 < rounding step 1e-2
    const s = record([{ segments: [nearFull], closed: false }], IDENTITY, 2);
    expect(s.count('A')).toBe(2);
    const tiny = arcSeg(0, 0, 10, 0, 1e-4);
    const t = record([{ segments: [tiny], closed: false }], IDENTITY, 2);
    expect(t.count('A')).toBe(0);
  });

  it('flips the sweep flag under a mirroring matrix, keeps the large-arc flag', () => {
    // REFERENCES.md §5.2 T13: under scale(1,−1) radii are kept, fS inverted, fA kept.
    for (const sw of [Math.PI / 2, -Math.PI / 2, 1.5 * Math.PI, -1.5 * Math.PI]) {
      const seg = arcSeg(5, 5, 10, 0.4, sw);
      const plain = arcs(record([{ segments: [seg], closed: false }], IDENTITY, 3))[0];
      const mirrored = arcs(record([{ segments: [seg], closed: false }], matrix(1, 0, 0, -1, 0, 0), 3))[0];
      expect(plain.sweep).toBe(sw > 0); // F.6.4.4
      expect(plain.largeArc).toBe(Math.abs(sw) > Math.PI); // F.6.4.3
      expect(mirrored.sweep).toBe(!plain.sweep);
      expect(mirrored.largeArc).toBe(plain.largeArc);
      expect(mirrored.rx).toBeCloseTo(plain.rx, 2);
    }
  });

  it('turns circles into the ellipse of a non-uniform scale', () => {
    // REFERENCES.md §5.2 T10: circle r=10 under scale(2,1) → rx=20, ry=10, φ=0, sweep kept.
    const seg = arcSeg(0, 0, 10, 0.25, 1.2);
    const a = arcs(record([{ segments: [seg], closed: false }], matrix(2, 0, 0, 1, 0, 0), 3))[0];
    expect(a.rx).toBeCloseTo(20, 2);
    expect(a.ry).toBeCloseTo(10, 2);
    expect(a.rotation).toBe(0);
    expect(a.sweep).toBe(true);
  });

  it('replaces a closing line by Z but draws a closing arc', () => {
    const square = [lineSeg(0, 0, 10, 0), lineSeg(10, 0, 10, 10), lineSeg(10, 10, 0, 10), lineSeg(0, 10, 0, 0)];
    expect(record([{ segments: square, closed: true }], IDENTITY, 1).commands.map((c) => c.op)).toEqual(['M', 'L', 'L', 'L', 'Z']);
    const d = [lineSeg(0, 10, 0, -10), arcSeg(0, 0, 10, -Math.PI / 2, Math.PI)];
    expect(record([{ segments: d, closed: true }], IDENTITY, 1).commands.map((c) => c.op)).toEqual(['M', 'L', 'A', 'Z']);
  });

  it('never writes a radius too small for its written chord (Λ ≤ 1, F.6.6.2)', () => {
    const r = rng(5);
    for (let i = 0; i < 300; i++) {
      const seg = arcSeg(r() * 100, r() * 100, 0.5 + r() * 50, r() * 6, (r() < 0.5 ? -1 : 1) * (Math.PI + (r() - 0.5) * 0.02));
      const s = record([{ segments: [seg], closed: false }], IDENTITY, 2);
      const m = s.commands[0] as { x: number; y: number };
      let px = m.x, py = m.y;
      for (const a of arcs(s)) {
        expect(Math.hypot(a.x - px, a.y - py) / 2).toBeLessThanOrEqual(a.rx * (1 + 1e-12));
        px = a.x;
        py = a.y;
      }
    }
  });

  it('keeps a near-semicircle within the rounding bound (a radius rounded at the coordinate digits would not)', () => {
    // r = 10, sweep 177.5°: the centre is 0.22 off the chord; at 2 decimals the nearest radii put it 0 or 0.45 off.
    const seg = arcSeg(0.003, 0.004, 10, 0.1, Math.PI - 0.044);
    const w = new PathWriter({ digits: 2 });
    emitSegments(w, [{ segments: [seg], closed: false }], IDENTITY, { digits: 2 });
    const props = new svgPathProperties(w.toString());
    const len = props.getTotalLength();
    let worst = 0;
    for (let i = 0; i <= 200; i++) {
      const p = props.getPointAtLength((len * i) / 200);
      worst = Math.max(worst, Math.abs(Math.hypot(p.x - 0.003, p.y - 0.004) - 10));
    }
    expect(worst).toBeLessThanOrEqual(writtenArcErrorBound(2));
  });
});

describe('emitSegments: random contours read back by svg-path-properties', () => {
  /** Distance from (px, py) to the polyline through xy, exact up to `reach`; Infinity beyond it. */
  function polylineDistance(xy: number[]): (px: number, py: number, reach: number) => number {
    const n = xy.length / 2 - 1;
    const index = new Flatbush(n);
    for (let i = 0; i < n; i++) {
      const ax = xy[2 * i], ay = xy[2 * i + 1], bx = xy[2 * i + 2], by = xy[2 * i + 3];
      index.add(Math.min(ax, bx), Math.min(ay, by), Math.max(ax, bx), Math.max(ay, by));
    }
    index.finish();
    return (px, py, reach) => {
      let best = Infinity;
      for (const k of index.search(px - reach, py - reach, px + reach, py + reach)) {
        const i = 2 * k;
        const ax = xy[i], ay = xy[i + 1], dx = xy[i + 2] - ax, dy = xy[i + 3] - ay;
      const l2 = dx * dx + dy * dy;
      const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / l2));
        best = Math.min(best, Math.hypot(px - ax - t * dx, py - ay - t * dy));
      }
      return best;
    };
  }

  const cases: [string, Matrix][] = [
    ['identity', IDENTITY],
    ['px per mm', matrix(96 / 25.4, 0, 0, 96 / 25.4, 3, -7)],
    ['rotated mirror', multiply(new Float64Array(6), matrix(Math.cos(0.7), Math.sin(0.7), -Math.sin(0.7), Math.cos(0.7), 40, 2), matrix(1, 0, 0, -1, 0, 0))],
    ['non-uniform', matrix(2, 0, 0, 0.75, 0, 0)],
    ['skew', matrix(1, 0, Math.tan(0.5), 1, 0, 0)],
  ];

  for (const [name, m] of cases) {
    for (const digits of [0, 1, 2, 3]) {
      it(`${name}, ${digits} decimals: written path within the rounding bound of the arcs`, () => {
        const r = rng(31 + digits * 7 + name.length * 101);
        const contours: EmitContour[] = [];
        const truth: number[][] = [];
        for (let c = 0; c < 4; c++) {
          const segs: Segment[] = [];
          let x = r() * 40, y = r() * 40, dir = r() * 6.283;
          for (let k = 0; k < 6; k++) {
            if (r() < 0.25) {
              const len = 1 + r() * 10;
              segs.push(lineSeg(x, y, x + len * Math.cos(dir), y + len * Math.sin(dir)));
            } else {
              const rad = 0.5 + r() * 20;
              const pick = r();
              const mag = pick < 0.2 ? Math.PI + (r() - 0.5) * 0.05 : pick < 0.3 ? 2 * Math.PI - r() * 0.05 : 0.1 + r() * 5.5;
              const sw = (r() < 0.5 ? -1 : 1) * mag;
              // tangent-continuous: centre to the left (sw > 0) or right of the direction
              const nx = -Math.sin(dir) * Math.sign(sw), ny = Math.cos(dir) * Math.sign(sw);
              const cx = x + rad * nx, cy = y + rad * ny;
              segs.push(arcSeg(cx, cy, rad, Math.atan2(y - cy, x - cx), sw));
              dir += sw;
            }
            const last = segs[segs.length - 1];
            x = last.x1;
            y = last.y1;
          }
          contours.push({ segments: segs, closed: false });
          // dense samples of the true geometry, mapped to local units
          const pts: number[] = [];
          for (const s of segs) {
            const g = arcGeometry(s);
            const n = g ? 2000 : 2;
            for (let i = 0; i <= n; i++) {
              let px: number, py: number;
              if (g) {
                const a = Math.atan2(s.y0 - g.cy, s.x0 - g.cx) + (g.sweep * i) / n;
                px = g.cx + g.r * Math.cos(a);
                py = g.cy + g.r * Math.sin(a);
              } else {
                px = s.x0 + ((s.x1 - s.x0) * i) / n;
                py = s.y0 + ((s.y1 - s.y0) * i) / n;
              }
              pts.push(m[0] * px + m[2] * py + m[4], m[1] * px + m[3] * py + m[5]);
            }
          }
          truth.push(pts);
        }
        const all = new PathWriter({ digits });
        expect(emitSegments(all, contours, m, { digits }).overBound).toBe(0);
        expect(parsePathData(all.toString()).error).toBeNull();
        // sub-sample chord error of the truth polyline: r·(Δθ)²/8 with Δθ ≤ 2π/2000, local r ≤ 2·20.5
        const slack = 41 * Math.pow((2 * Math.PI) / 2000, 2) / 8 + 1e-9;
        const bound = writtenArcErrorBound(digits) + slack; // local units, whatever the matrix
        for (let c = 0; c < 4; c++) {
          // Each contour on its own, read back by svg-path-properties (npm, an independent SVG path reader).
          const w = new PathWriter({ digits });
          emitSegments(w, [contours[c]], m, { digits });
          const props = new svgPathProperties(w.toString());
          const len = props.getTotalLength();
          const written: number[] = [];
          const n = 3000;
          for (let i = 0; i <= n; i++) {
            const p = props.getPointAtLength((len * i) / n);
            written.push(p.x, p.y);
          }
          // written → truth (every written point near the fit) …
          const toTruth = polylineDistance(truth[c]), toWritten = polylineDistance(written);
          let worst = 0;
          for (let i = 0; i < written.length; i += 2) worst = Math.max(worst, toTruth(written[i], written[i + 1], 2 * bound));
          // … and truth → written (nothing dropped); the written samples are len/3000 apart.
          let back = 0;
          for (let i = 0; i < truth[c].length; i += 10) back = Math.max(back, toWritten(truth[c][i], truth[c][i + 1], 2 * bound + len / 3000));
          expect(worst).toBeLessThanOrEqual(bound);
          expect(back).toBeLessThanOrEqual(bound + len / 3000);
        }
      });
    }
  }
});
