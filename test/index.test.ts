/** The library entry (src/index.ts): what a Node script imports from 'arcspline', and that it works as documented. */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import * as api from '../src/index.js';
import {
  DEFAULT_OPTIONS, OPTION_DOCS, OptionError, SvgInputError, VERSION, arcGeometry, compareSvg, fitPolyline,
  measureDeviation, parsePathData, parseToleranceText, refitSvg, resolveOptions, type FileReport, type Options,
} from '../src/index.js';

const ROOT = fileURLToPath(new URL('..', import.meta.url));

describe('the library entry', () => {
  it('exports the documented functions and values', () => {
    for (const name of ['refitSvg', 'resolveOptions', 'parseToleranceText', 'fitPolyline', 'fitContour', 'arcGeometry', 'measureDeviation', 'compareSvg', 'parsePathData']) {
      expect(typeof (api as Record<string, unknown>)[name], name).toBe('function');
    }
    expect(Object.isFrozen(DEFAULT_OPTIONS)).toBe(true);
    expect(Object.keys(OPTION_DOCS).sort()).toEqual(Object.keys(DEFAULT_OPTIONS).sort());
    expect(VERSION).toBe(JSON.parse(readFileSync(`${ROOT}package.json`, 'utf8')).version);
  });

  it('package.json points its "exports" at the compiled entry', () => {
    const pkg = JSON.parse(readFileSync(`${ROOT}package.json`, 'utf8'));
    expect(pkg.exports['.'].import).toBe('./dist/src/index.js');
    expect(pkg.exports['.'].types).toBe('./dist/src/index.d.ts');
  });

  it('the README example: refit a string with the CLI options object, get the text and the report', () => {
    const svg = readFileSync(`${ROOT}samples/bracket.svg`, 'utf8');
    const opts: Partial<Options> = { tolerance: parseToleranceText('0.05mm') };
    const { text, report } = refitSvg(svg, opts, 'bracket.svg');
    const r: FileReport = report;
    expect(r.file).toBe('bracket.svg');
    expect(r.toleranceMm).toBe(0.05);
    expect(r.totals.withinTolerance).toBe(true);
    expect(r.totals.maxDeviation).toBeLessThanOrEqual(0.05);
    expect(text.length).toBeLessThan(svg.length);
    // The independent comparison agrees that the output is within the tolerance.
    expect(compareSvg(svg, text, { tolerance: 0.05 }).totals.withinTolerance).toBe(true);
  });

  it('refuses bad input with the exported error types', () => {
    expect(() => refitSvg('<svg', {})).toThrow(SvgInputError);
    expect(() => refitSvg('<svg xmlns="http://www.w3.org/2000/svg"/>', { tolerance: 0 })).toThrow(OptionError);
    expect(() => resolveOptions({ cornerAngle: 200 })).toThrow(OptionError);
    // CSS Values 3 §5.2: 1in = 25.4mm = 96px.
    expect(parseToleranceText('0.002in')).toBeCloseTo(0.0508, 12);
    expect(parseToleranceText('96px')).toBeCloseTo(25.4, 12);
  });

  it('fitPolyline: a finely sampled circle comes back as arcs of its radius', () => {
    const n = 720, R = 25;
    const xy = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      xy[2 * i] = R * Math.cos((2 * Math.PI * i) / n);
      xy[2 * i + 1] = R * Math.sin((2 * Math.PI * i) / n);
    }
    const fit = fitPolyline(xy, { tolerance: 0.01, closed: true });
    expect(fit.segments.length).toBeLessThanOrEqual(4);
    for (const s of fit.segments) {
      const g = arcGeometry(s);
      expect(g).not.toBeNull();
      // Chords of a sampled circle lie inside it by the sagitta R(1 - cos(π/n)) (closed form), far below 0.01 mm.
      expect(Math.abs(g!.r - R)).toBeLessThan(0.01);
      expect(Math.hypot(g!.cx, g!.cy)).toBeLessThan(0.01);
    }
  });

  it('measureDeviation: zero for a path against itself, the offset for a shifted copy', () => {
    const I = new Float64Array([1, 0, 0, 1, 0, 0]);
    const a = parsePathData('M0 0L100 0');
    const dev = measureDeviation(a, I, a, I, 0.1)!;
    expect(dev.max).toBeLessThan(1e-3);
    const b = parsePathData('M0 0.05L100 0.05');
    // Parallel segments 0.05 apart: the distance is 0.05 everywhere (closed form); the bound may overestimate by ≤ 0.5 % of the tolerance.
    const d2 = measureDeviation(a, I, b, I, 0.1)!;
    expect(d2.max).toBeGreaterThanOrEqual(0.05 - 1e-9);
    expect(d2.max).toBeLessThan(0.05 + 0.0005 + 1e-9);
  });
});
