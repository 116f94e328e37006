/**
 * Round trip on our own scenario drawings (test/e2e/scenarios.ts): refit at
 * 0.05 mm, render input and output at 20 px/mm and compare outside the band,
 * and check every rewritten element's reported deviation against an
 * independent sampling with svg-path-properties (npm).
 */
import Flatbush from 'flatbush';
import { svgPathProperties } from 'svg-path-properties';
import { describe, expect, it } from 'vitest';
import { refitSvg } from '../../src/refit.js';
import { readSvg, type GeometryElement } from '../../src/svg/document.js';
import { DEFAULT_OPTIONS } from '../../src/options.js';
import type { Matrix } from '../../src/svg/matrixTypes.js';
import { compareRasters, renderSvg } from './render.js';
import { cadPlate, PAGE_W, SCENARIOS } from './scenarios.js';

const TOLERANCE = 0.05; // mm
const PX_PER_MM = 20;
/** Antialiasing allowance beside the tolerance band, px (common practice). */
const AA_PX = 1.5;
const MAX_FRACTION_OUTSIDE = 0.001;
/** Arc-length step of the independent sampling, mm (after the element's transform). */
const STEP_MM = 0.02;
/** Search radius of the nearest-segment query, mm; a farther point counts as this far. */
const SEARCH_MM = 8 * TOLERANCE;

/** Sampled geometry in mm: points, and chords between consecutive samples of one part. */
interface Sampled {
  xy: Float64Array;
  /** Chords as pairs of point indices. */
  chords: Uint32Array;
  /** Farthest a curve point between samples lies from the polyline, mm: the sampling's resolution. */
  sagitta: number;
  /** Longest chord, mm: a distance measured at the samples can miss up to half of it. */
  maxChord: number;
}

/**
 * Sample path data with svg-path-properties (npm `svg-path-properties`, its
 * `getParts()` and each part's `getPointAtLength`), map through `toMm`.
 * Sampling in user units at STEP_MM / (largest scale) keeps chords ≤ STEP_MM in mm.
 */
function sampleWithLibrary(d: string, toMm: Matrix, scale: number): Sampled {
  const parts = new svgPathProperties(d).getParts();
  const step = STEP_MM / scale;
  const pts: number[] = [];
  const chords: number[] = [];
  const allMids: number[] = [];
  const mx = (x: number, y: number): number => toMm[0] * x + toMm[2] * y + toMm[4];
  const my = (x: number, y: number): number => toMm[1] * x + toMm[3] * y + toMm[5];
  for (const part of parts) {
    if (!(part.length > 0)) continue;
    const n = Math.max(1, Math.ceil(part.length / step));
    const first = pts.length >> 1;
    const mids: number[] = [];
    for (let i = 0; i <= n; i++) {
      const p = part.getPointAtLength((part.length * i) / n);
      pts.push(mx(p.x, p.y), my(p.x, p.y));
      if (i === 0) continue;
      chords.push(first + i - 1, first + i);
      const m = part.getPointAtLength((part.length * (i - 0.5)) / n);
      mids.push(mx(m.x, m.y), my(m.x, m.y));
    }
    allMids.push(...mids);
  }
  let maxChord = 0;
  for (let k = 0; k < chords.length; k += 2) {
    const i = chords[k], j = chords[k + 1];
    maxChord = Math.max(maxChord, Math.hypot(pts[2 * j] - pts[2 * i], pts[2 * j + 1] - pts[2 * i + 1]));
  }
  const out: Sampled = { xy: Float64Array.from(pts), chords: Uint32Array.from(chords), sagitta: 0, maxChord };
  // Resolution: how far curve points between samples (at mid-length) lie from the polyline.
  // The library's length-to-point inversion is only approximate along the curve (steps vary
  // by up to ~0.03 mm for cubics), but its points are on the curve, so this stays small.
  out.sagitta = directed({ xy: Float64Array.from(allMids), chords: new Uint32Array(0), sagitta: 0, maxChord: 0 }, out);
  return out;
}

function distToChord(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / l2 : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(px - ax - t * dx, py - ay - t * dy);
}

/** Farthest any sample of `a` lies from the chords of `b` (mm), capped at SEARCH_MM. */
function directed(a: Sampled, b: Sampled): number {
  const nc = b.chords.length >> 1;
  const index = new Flatbush(Math.max(1, nc));
  for (let k = 0; k < nc; k++) {
    const i = b.chords[2 * k], j = b.chords[2 * k + 1];
    const x0 = b.xy[2 * i], y0 = b.xy[2 * i + 1], x1 = b.xy[2 * j], y1 = b.xy[2 * j + 1];
    index.add(Math.min(x0, x1), Math.min(y0, y1), Math.max(x0, x1), Math.max(y0, y1));
  }
  if (nc === 0) index.add(0, 0, 0, 0);
  index.finish();
  let worst = 0;
  for (let p = 0; p < a.xy.length; p += 2) {
    const x = a.xy[p], y = a.xy[p + 1];
    let best = SEARCH_MM;
    for (const k of index.search(x - SEARCH_MM, y - SEARCH_MM, x + SEARCH_MM, y + SEARCH_MM)) {
      if (k >= nc) continue;
      const i = b.chords[2 * k], j = b.chords[2 * k + 1];
      const dd = distToChord(x, y, b.xy[2 * i], b.xy[2 * i + 1], b.xy[2 * j], b.xy[2 * j + 1]);
      if (dd < best) best = dd;
    }
    if (best > worst) worst = best;
  }
  return worst;
}

/** An element's geometry as path data text: `d` itself, or the path equivalent of a polyline/polygon (S2 §10.6, §10.7). */
function pathText(el: GeometryElement): string {
  if (el.name === 'path') return el.attrs.d ?? '';
  if (el.name === 'polyline') return `M${el.attrs.points}`;
  if (el.name === 'polygon') return `M${el.attrs.points}Z`;
  throw new Error(`scenario uses <${el.name}>, not handled by the cross-check`);
}

function maxScaleOf(m: Matrix): number {
  // Largest singular value of [a c; b d] (closed form).
  const [a, b, c, d] = m;
  const s = a * a + b * b + c * c + d * d;
  const q = Math.sqrt(Math.max(0, s * s - 4 * (a * d - b * c) ** 2));
  return Math.sqrt((s + q) / 2);
}

/** Density at which sharp renders a physical-size root at `pxPerMm` (librsvg: px per inch = D²/72; see render.ts). */
const DENSITY = Math.sqrt(PX_PER_MM * 72 * 25.4);

describe('round trip on our own scenarios at 0.05 mm', () => {
  for (const [name, build] of Object.entries(SCENARIOS)) {
    describe(name, () => {
      const input = build();
      const res = refitSvg(input, { tolerance: TOLERANCE }, name);
      const read = (text: string) => readSvg(text, { assumedMmPerUnit: DEFAULT_OPTIONS.assumedMmPerUnit });

      it('rewrites its elements within the tolerance', () => {
        const { totals, elements } = res.report;
        expect(elements.filter((e) => e.keptReason?.startsWith('measured')).map((e) => e.keptReason)).toEqual([]);
        // Every element is rewritten, or kept because its lines and arcs are already no more than a refit needs.
        expect(elements.filter((e) => e.status !== 'refitted' && e.reason !== 'no-shorter').map((e) => e.id)).toEqual([]);
        expect(totals.rewritten).toBeGreaterThan(0);
        expect(totals.withinTolerance).toBe(true);
        expect(totals.maxDeviation).toBeLessThanOrEqual(TOLERANCE);
        expect(totals.segmentsAfter.arcs).toBeGreaterThan(0);
      });

      it('renders like the input at 20 px/mm, except within the tolerance band', async () => {
        const a = await renderSvg(input, DENSITY);
        const b = await renderSvg(res.text, DENSITY);
        const pxPerMm = a.width / PAGE_W;
        expect(Math.abs(pxPerMm - PX_PER_MM)).toBeLessThan(0.05);
        const bandPx = TOLERANCE * pxPerMm + AA_PX;
        const cmp = compareRasters(a, b, { bandPx });
        console.log(`${name}: ${cmp.differing} px differ, ${cmp.outsideBand} outside the ${bandPx.toFixed(2)} px band (worst ${cmp.worstDistancePx.toFixed(2)} px)`);
        expect(cmp.fractionOutside).toBeLessThanOrEqual(MAX_FRACTION_OUTSIDE);
      });

      it('agrees with svg-path-properties on every rewritten element', () => {
        const before = read(input).elements;
        const after = new Map(read(res.text).elements.map((e) => [e.index, e]));
        let checked = 0;
        const worstLine: string[] = [];
        for (const rep of res.report.elements) {
          if (rep.kept || !rep.deviation) continue;
          const orig = before.find((e) => e.index === rep.index) as GeometryElement;
          const out = after.get(rep.index) as GeometryElement;
          expect(out.name).toBe('path');
          const sa = sampleWithLibrary(pathText(orig), orig.toMm, maxScaleOf(orig.toMm));
          const sb = sampleWithLibrary(out.attrs.d ?? '', out.toMm, maxScaleOf(out.toMm));
          const resolution = sa.sagitta + sb.sagitta;
          const h = Math.max(directed(sb, sa), directed(sa, sb));
          const what = `${rep.name}#${rep.id}: sampled ${h.toExponential(3)} mm, reported ${rep.deviation.max.toExponential(3)} mm, resolution ${resolution.toExponential(2)} mm, chords ≤ ${Math.max(sa.maxChord, sb.maxChord).toExponential(2)} mm`;
          // Every written sample within the tolerance of the original, and the other way round.
          expect(h, what).toBeLessThanOrEqual(TOLERANCE + resolution);
          // The report is an upper bound (src/measure/measure.ts) overstated by at most 0.5 % of the
          // tolerance; sampling can miss up to half the longest chord of the true value.
          expect(h, what).toBeLessThanOrEqual(rep.deviation.max + resolution);
          const missed = Math.max(sa.maxChord, sb.maxChord) / 2;
          expect(rep.deviation.max, what).toBeLessThanOrEqual(h + resolution + missed + 0.005 * TOLERANCE);
          checked++;
          worstLine.push(what);
        }
        expect(checked).toBe(res.report.totals.rewritten);
        console.log(`${name}:\n  ${worstLine.join('\n  ')}`);
      });
    });
  }
});

/** Move the plate of the CAD scenario by `dx` mm, as a stand-in for a wrong refit. */
function shifted(text: string, dx: number): string {
  const moved = text.replace('<path id="plate"', `<path id="plate" transform="translate(${dx} 0)"`);
  if (moved === text) throw new Error('plate not found');
  return moved;
}

describe('the round-trip checks can fail', () => {
  const input = cadPlate();
  it('a shift of 6 px (0.3 mm) is outside the band; 0.8 px (0.04 mm) is inside', async () => {
    const a = await renderSvg(input, DENSITY);
    const bandPx = TOLERANCE * (a.width / PAGE_W) + AA_PX;
    const far = compareRasters(a, await renderSvg(shifted(input, 0.3), DENSITY), { bandPx });
    expect(far.fractionOutside).toBeGreaterThan(MAX_FRACTION_OUTSIDE);
    const near = compareRasters(a, await renderSvg(shifted(input, 0.04), DENSITY), { bandPx });
    expect(near.differing).toBeGreaterThan(0);
    expect(near.outsideBand).toBe(0);
  });

  it('svg-path-properties sampling sees a 0.3 mm shift as 0.3 mm', () => {
    const el = (text: string) => readSvg(text, { assumedMmPerUnit: DEFAULT_OPTIONS.assumedMmPerUnit }).elements[0];
    const a = el(input), b = el(shifted(input, 0.3));
    const sa = sampleWithLibrary(pathText(a), a.toMm, 1), sb = sampleWithLibrary(pathText(b), b.toMm, 1);
    const h = Math.max(directed(sa, sb), directed(sb, sa));
    // Horizontal shift of an outline with vertical sides: the distance is the shift itself.
    expect(Math.abs(h - 0.3)).toBeLessThanOrEqual(sa.sagitta + sb.sagitta + 1e-9);
  });
});
