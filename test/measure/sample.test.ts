import { describe, expect, it } from 'vitest';
import { svgPathProperties } from 'svg-path-properties';
import { OP_A, OP_C, OP_L, OP_M, OP_Q, OP_Z, type PathData } from '../../src/svg/pathTypes.js';
import { ARC_ELLIPSE, ARC_LINE, ARC_OMITTED, SampleBuffer, endpointToCenter, samplePath } from '../../src/measure/sample.js';

/** Builds flat path data and the equivalent absolute `d` text side by side (no parser needed). */
function path() {
  const ops: number[] = [], args: number[] = [], d: string[] = [];
  const api = {
    M(x: number, y: number) { ops.push(OP_M); args.push(x, y); d.push(`M${x} ${y}`); return api; },
    L(x: number, y: number) { ops.push(OP_L); args.push(x, y); d.push(`L${x} ${y}`); return api; },
    C(...v: number[]) { ops.push(OP_C); args.push(...v); d.push(`C${v.join(' ')}`); return api; },
    Q(...v: number[]) { ops.push(OP_Q); args.push(...v); d.push(`Q${v.join(' ')}`); return api; },
    A(...v: number[]) { ops.push(OP_A); args.push(...v); d.push(`A${v.join(' ')}`); return api; },
    Z() { ops.push(OP_Z); d.push('Z'); return api; },
    data(): PathData { return { ops: Uint8Array.from(ops), args: Float64Array.from(args) }; },
    text(): string { return d.join(' '); },
  };
  return api;
}

const ID = Float64Array.of(1, 0, 0, 1, 0, 0);
const DEG = 180 / Math.PI;

function conv(x1: number, y1: number, rx: number, ry: number, phi: number, fA: number, fS: number, x2: number, y2: number) {
  const out = new Float64Array(7);
  const kind = endpointToCenter(out, x1, y1, rx, ry, phi, fA, fS, x2, y2);
  return { kind, cx: out[0], cy: out[1], rx: out[2], ry: out[3], th1: out[5] * DEG, dth: out[6] * DEG };
}

/** Brute-force distance from a point to a polyline (kept here, independent of hausdorff.ts). */
function distToPolyline(px: number, py: number, pl: Float64Array): number {
  let best = Infinity;
  for (let i = 0; i + 3 < pl.length; i += 2) {
    const ax = pl[i], ay = pl[i + 1], dx = pl[i + 2] - ax, dy = pl[i + 3] - ay;
    const l2 = dx * dx + dy * dy;
    const t = l2 > 0 ? Math.min(1, Math.max(0, ((px - ax) * dx + (py - ay) * dy) / l2)) : 0;
    best = Math.min(best, Math.hypot(px - ax - t * dx, py - ay - t * dy));
  }
  return best;
}

describe('endpointToCenter (W3C SVG 1.1 F.6.5 / F.6.6, REFERENCES.md §1.4)', () => {
  it('A1: semicircle, sweep 1', () => {
    const r = conv(0, 0, 1, 1, 0, 0, 1, 2, 0);
    expect(r.kind).toBe(ARC_ELLIPSE);
    expect(r.cx).toBeCloseTo(1, 12); expect(r.cy).toBeCloseTo(0, 12);
    expect(r.rx).toBe(1);
    expect(Math.abs(r.th1)).toBeCloseTo(180, 10); // ±180 are the same angle
    expect(r.dth).toBeCloseTo(180, 10);
  });
  it('A2: semicircle, sweep 0', () => {
    const r = conv(0, 0, 1, 1, 0, 0, 0, 2, 0);
    expect(r.cx).toBeCloseTo(1, 12);
    expect(r.dth).toBeCloseTo(-180, 10);
  });
  it('A3: radii too small are scaled by sqrt(Λ)=2', () => {
    const r = conv(0, 0, 1, 1, 0, 0, 1, 4, 0);
    expect(r.rx).toBeCloseTo(2, 12); expect(r.ry).toBeCloseTo(2, 12);
    expect(r.cx).toBeCloseTo(2, 12); expect(r.dth).toBeCloseTo(180, 10);
  });
  it('A4: negative radii use their absolute values', () => {
    const r = conv(0, 0, -5, -5, 0, 0, 1, 10, 0);
    expect(r.rx).toBe(5); expect(r.cx).toBeCloseTo(5, 12); expect(r.dth).toBeCloseTo(180, 10);
  });
  it('A5: a zero radius is a line', () => {
    expect(conv(0, 0, 0, 5, 0, 0, 1, 10, 0).kind).toBe(ARC_LINE);
  });
  it('A8: coincident endpoints are omitted; A9: a 1e-9 chord is not', () => {
    expect(conv(5, 5, 10, 10, 0, 1, 1, 5, 5).kind).toBe(ARC_OMITTED);
    const r = conv(0, 0, 10, 10, 0, 1, 1, 0, 1e-9);
    expect(r.kind).toBe(ARC_ELLIPSE);
    expect(r.cx).toBeCloseTo(10, 6); expect(r.dth).toBeCloseTo(360, 5);
  });
  it('A6a–d: the four flag cases of M125,75 A100,50 0 ?,? 225,125', () => {
    const cases: [number, number, number, number, number, number][] = [
      [0, 0, 225, 75, 180, -90], [0, 1, 125, 125, -90, 90], [1, 0, 125, 125, -90, -270], [1, 1, 225, 75, 180, 270],
    ];
    for (const [fA, fS, cx, cy, th1, dth] of cases) {
      const r = conv(125, 75, 100, 50, 0, fA, fS, 225, 125);
      expect(r.cx).toBeCloseTo(cx, 9); expect(r.cy).toBeCloseTo(cy, 9);
      expect(r.th1).toBeCloseTo(th1, 9); expect(r.dth).toBeCloseTo(dth, 9);
      expect(r.rx).toBe(100); // Λ = 0.5 ≤ 1: radii kept
    }
  });
  it('A7 / A7b: rotated ellipse', () => {
    const r = conv(0, 0, 50, 25, 30, 1, 0, 60, 40);
    expect(r.cx).toBeCloseTo(17.657042, 5); expect(r.cy).toBeCloseTo(32.575498, 5);
    expect(r.th1).toBeCloseTo(-129.167078, 5); expect(r.dth).toBeCloseTo(-266.966294, 5);
    const s = conv(0, 0, 50, 25, 30, 0, 1, 60, 40);
    expect(s.cx).toBeCloseTo(17.657042, 5); expect(s.th1).toBeCloseTo(-129.167078, 5);
    expect(s.dth).toBeCloseTo(93.033706, 5);
  });
});

describe('samplePath', () => {
  it('a circle of radius 10 as two arcs: every sample on the circle, chord error = sagitta on r', () => {
    const p = path().M(10, 0).A(10, 10, 0, 0, 1, -10, 0).A(10, 10, 0, 0, 1, 10, 0).Z().data();
    const s = samplePath(p, ID, 1, 0.01);
    expect(s.polylines.length).toBe(1);
    const pl = s.polylines[0];
    for (let i = 0; i < pl.length; i += 2) expect(Math.hypot(pl[i], pl[i + 1])).toBeCloseTo(10, 12);
    // Sagitta s = r − sqrt(r² − (c/2)²) (REFERENCES.md §6) for the longest chord must match the bound.
    let cmax = 0;
    for (let i = 0; i + 3 < pl.length; i += 2) cmax = Math.max(cmax, Math.hypot(pl[i + 2] - pl[i], pl[i + 3] - pl[i + 1]));
    expect(s.errorBound).toBeLessThanOrEqual(0.01);
    expect(s.errorBound).toBeCloseTo(10 - Math.sqrt(100 - (cmax / 2) ** 2), 10);
    // Chord count from REFERENCES.md §6: a full circle with e/r = 0.001 needs ⌈π/acos(1 − 0.001)⌉ = 71 chords.
    const chords = pl.length / 2 - 1;
    expect(chords).toBe(2 * Math.ceil(Math.PI / 2 / Math.acos(1 - 0.001)));
    expect(chords).toBeGreaterThanOrEqual(71);
    expect(chords).toBeLessThanOrEqual(72);
  });

  it('chords are no longer than the spacing', () => {
    const p = path().M(0, 0).L(10, 0).C(15, 0, 15, 10, 10, 10).Q(0, 20, 0, 0).A(3, 2, 20, 1, 0, 5, -5).data();
    const s = samplePath(p, ID, 0.25, 0.05);
    const pl = s.polylines[0];
    for (let i = 0; i + 3 < pl.length; i += 2) expect(Math.hypot(pl[i + 2] - pl[i], pl[i + 3] - pl[i + 1])).toBeLessThanOrEqual(0.25 + 1e-12);
  });

  it('circle r=5 under scale(2,1): samples lie on the ellipse (10, 5) (REFERENCES.md §5.2 T10)', () => {
    const r = 5;
    const p = path().M(r, 0).A(r, r, 0, 0, 1, -r, 0).A(r, r, 0, 0, 1, r, 0).Z().data();
    const s = samplePath(p, Float64Array.of(2, 0, 0, 1, 0, 0), 0.5, 0.001);
    const pl = s.polylines[0];
    for (let i = 0; i < pl.length; i += 2) expect((pl[i] / (2 * r)) ** 2 + (pl[i + 1] / r) ** 2).toBeCloseTo(1, 12);
    // The bound uses the largest semi-axis 2r: check the mid-chord gap to the ellipse directly.
    let worst = 0;
    for (let i = 0; i + 3 < pl.length; i += 2) {
      const mx = (pl[i] + pl[i + 2]) / 2, my = (pl[i + 1] + pl[i + 3]) / 2;
      // radial gap to the ellipse along the ray from the centre (an upper bound of the normal gap)
      const k = 1 / Math.sqrt((mx / (2 * r)) ** 2 + (my / r) ** 2);
      worst = Math.max(worst, (k - 1) * Math.hypot(mx, my));
    }
    expect(worst).toBeLessThanOrEqual(s.errorBound * (1 + 1e-9));
    expect(s.errorBound).toBeLessThanOrEqual(0.001);
  });

  it('Bézier chord error stays within the second-derivative bound (dense check)', () => {
    const p = path().M(0, 0).C(30, 40, -20, 40, 10, 0).Q(50, -30, 20, 10).data();
    const m = Float64Array.of(1.5, 0.4, -0.7, 0.9, 3, -2);
    const s = samplePath(p, m, 1, 0.02);
    expect(s.errorBound).toBeLessThanOrEqual(0.02);
    // Evaluate the curves at 4000 parameters by de Casteljau (a different formula from the sampler's Bernstein sums).
    const lerp = (a: number, b: number, t: number) => a + (b - a) * t;
    let worst = 0;
    for (let j = 0; j <= 4000; j++) {
      const t = j / 4000;
      const ax = lerp(lerp(0, 30, t), lerp(30, -20, t), t), bx = lerp(lerp(30, -20, t), lerp(-20, 10, t), t);
      const ay = lerp(lerp(0, 40, t), lerp(40, 40, t), t), by = lerp(lerp(40, 40, t), lerp(40, 0, t), t);
      const cx = lerp(ax, bx, t), cy = lerp(ay, by, t);
      const qx = lerp(lerp(10, 50, t), lerp(50, 20, t), t), qy = lerp(lerp(0, -30, t), lerp(-30, 10, t), t);
      for (const [x, y] of [[cx, cy], [qx, qy]]) {
        worst = Math.max(worst, distToPolyline(m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5], s.polylines[0]));
      }
    }
    expect(worst).toBeLessThanOrEqual(s.errorBound);
    expect(worst).toBeGreaterThan(s.errorBound / 20); // the bound is not wildly loose
  });

  it('subpaths: lone moveto dropped, Z closes by repeating the start, a command after Z restarts there', () => {
    const p = path().M(100, 100).M(0, 0).L(4, 0).L(4, 3).Z().L(0, 5).data();
    const s = samplePath(p, ID, 10);
    expect(s.polylines.length).toBe(2);
    expect(Array.from(s.polylines[0])).toEqual([0, 0, 4, 0, 4, 3, 0, 0]);
    expect(Array.from(s.polylines[1])).toEqual([0, 0, 0, 5]);
    expect(s.errorBound).toBe(0);
  });

  it('an arc with coincident endpoints draws nothing; a zero radius draws a line (F.6.2, F.6.6 step 1)', () => {
    expect(samplePath(path().M(5, 5).A(10, 10, 0, 1, 1, 5, 5).data(), ID, 1).polylines.length).toBe(0);
    const s = samplePath(path().M(0, 0).A(0, 5, 0, 0, 1, 10, 0).data(), ID, 5);
    expect(Array.from(s.polylines[0])).toEqual([0, 0, 5, 0, 10, 0]);
  });

  it('does not modify its inputs', () => {
    const p = path().M(0, 0).C(1, 2, 3, 4, 5, 6).A(3, 2, 10, 0, 1, 9, 9).data();
    const m = Float64Array.of(2, 0.5, -0.3, 1, 4, 5);
    const ops = p.ops.slice(), args = p.args.slice(), mm = m.slice();
    samplePath(p, m, 0.1);
    expect(p.ops).toEqual(ops); expect(p.args).toEqual(args); expect(m).toEqual(mm);
  });

  it('matches svg-path-properties getPointAtLength on paths with every command (identity)', () => {
    // svg-path-properties (npm, general-purpose path measuring library) as the outside reference.
    const paths = [
      path().M(10, 10).L(60, 20).Q(90, 60, 50, 80).C(20, 100, 0, 60, 15, 40).A(20, 10, 30, 1, 0, 70, 70).Z(),
      path().M(0, 0).A(25, 25, 0, 0, 1, 50, 0).A(25, 25, 0, 1, 1, 0, 0.5).L(-10, 30).C(-10, 60, 40, 60, 40, 30),
      path().M(5, 5).C(100, 0, -50, 0, 45, 50).Q(10, 90, 80, 80).A(30, 60, -45, 0, 0, 20, 120).A(5, 5, 0, 0, 1, 30, 120),
    ];
    for (const b of paths) {
      const s = samplePath(b.data(), ID, 0.5, 1e-4);
      const ref = new svgPathProperties(b.text());
      const total = ref.getTotalLength();
      const pl = s.polylines[0];
      let worst = 0;
      for (let j = 0; j <= 400; j++) {
        const q = ref.getPointAtLength((total * j) / 400);
        worst = Math.max(worst, distToPolyline(q.x, q.y, pl));
      }
      // the library measures length numerically; its points lie on the curve to about 1e-3 here
      console.log("spp worst", worst);
      expect(worst).toBeLessThan(2e-3);
      let len = 0;
      for (let i = 0; i + 3 < pl.length; i += 2) len += Math.hypot(pl[i + 2] - pl[i], pl[i + 3] - pl[i + 1]);
      expect(len / total).toBeCloseTo(1, 3);
    }
  });

  it('into a reusable buffer: the same numbers, as views that the next call overwrites', () => {
    const buf = new SampleBuffer();
    buf.data = new Float64Array(4); // force growth on the way
    const p = path().M(100, 100).M(0, 0).L(4, 0).C(6, 0, 6, 3, 4, 3).Z().M(9, 9).L(9, 20).A(3, 2, 10, 0, 1, 15, 15).data();
    const m = Float64Array.of(2, 0.5, -0.3, 1, 4, 5);
    const own = samplePath(p, m, 0.3, 0.01), lent = samplePath(p, m, 0.3, 0.01, buf);
    expect(lent.errorBound).toBe(own.errorBound);
    expect(lent.polylines.map((x) => Array.from(x))).toEqual(own.polylines.map((x) => Array.from(x)));
    expect(lent.polylines.every((x) => x.buffer === buf.data.buffer)).toBe(true);
    const first = lent.polylines[0][0];
    samplePath(path().M(-1, -1).L(1, 1).data(), ID, 1, 0.1, buf);
    expect(lent.polylines[0][0]).not.toBe(first); // views, not copies: valid only until the next call
  });

  it('rejects a non-positive spacing with the bad value in the message', () => {
    expect(() => samplePath(path().M(0, 0).L(1, 1).data(), ID, 0)).toThrow(/got 0/);
  });
});
