import { describe, expect, it } from 'vitest';
import { refitSvg } from '../src/refit.js';
import { compareSvg } from '../src/measure/compare.js';
import { readSvg } from '../src/svg/document.js';
import { parsePathData } from '../src/svg/pathData.js';
import { OP_A, OP_ARGS } from '../src/svg/pathTypes.js';

/** A dense polyline circle (our own test data) inside a group scaled 2 × 1: an ellipse on the machine. */
function doc(): string {
  const pts: string[] = [];
  for (let i = 0; i < 720; i++) {
    const a = (2 * Math.PI * i) / 720;
    pts.push(`${(20 + 10 * Math.cos(a)).toFixed(4)},${(20 + 10 * Math.sin(a)).toFixed(4)}`);
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" width="80mm" height="40mm" viewBox="0 0 80 40">
<g transform="scale(2 1)"><polygon id="p" points="${pts.join(' ')}"/></g>
</svg>`;
}

/** rx, ry of every arc command of the element with this id in a document. */
function arcRadii(svg: string, id: string): [number, number][] {
  const el = readSvg(svg, { assumedMmPerUnit: 1 }).elements.find((e) => e.id === id)!;
  const p = parsePathData(el.attrs.d);
  const out: [number, number][] = [];
  for (let i = 0, j = 0; i < p.ops.length; j += OP_ARGS[p.ops[i]], i++) if (p.ops[i] === OP_A) out.push([p.args[j], p.args[j + 1]]);
  return out;
}

describe('coordinates of the written arcs', () => {
  const tol = 0.05;
  it('by default arcs stay in the element\'s own units: elliptical there under scale(2 1), exact on the machine (REFERENCES.md §5.2)', () => {
    const r = refitSvg(doc(), { tolerance: tol });
    const radii = arcRadii(r.text, 'p');
    expect(radii.length).toBeGreaterThan(0);
    // The fitted arcs are circles in mm; under the inverse of scale(2 1) they are ellipses with rx = ry / 2.
    expect(radii.some(([rx, ry]) => Math.abs(rx - ry) > 1e-3 * ry)).toBe(true);
    expect(r.report.totals.maxDeviation).toBeLessThanOrEqual(tol);
    expect(compareSvg(doc(), r.text, { tolerance: tol }).totals.withinTolerance).toBe(true);
  });

  it('--bake-transforms writes circular arcs (rx = ry) in root units, with the ancestors undone by the element', () => {
    const r = refitSvg(doc(), { tolerance: tol, bakeTransforms: true });
    const radii = arcRadii(r.text, 'p');
    expect(radii.length).toBeGreaterThan(0);
    for (const [rx, ry] of radii) expect(rx).toBeCloseTo(ry, 9);
    expect(r.text).toMatch(/<path id="p" [^>]*transform="matrix\(0\.5 0 0 1 0 0\)"/);
    expect(compareSvg(doc(), r.text, { tolerance: tol }).totals.withinTolerance).toBe(true);
  });
});

describe('geometry that is not rewritten is said so', () => {
  it('one warning line counts the untouched elements by reason, and the report lists each (defs: SVG 1.1 §5.3.2, the defs element, section number from memory: never rendered in place)', () => {
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="10mm" height="10mm" viewBox="0 0 10 10">
<defs><path id="a" d="M0 0 C 1 1 2 1 3 0"/></defs><g transform="scale(0)"><path d="M0 0 C 1 1 2 1 3 0"/></g><path d="M0 0 C 1 1 2 1 3 0"/></svg>`;
    const r = refitSvg(svg, { tolerance: 0.05 });
    const line = r.report.warnings.find((w) => w.includes('left as written'));
    expect(line).toMatch(/^2 geometry elements left as written: inside <defs>.*; singular transform/);
    expect(r.text).toContain('<defs><path id="a" d="M0 0 C 1 1 2 1 3 0"/></defs>');
    // And each of them is an entry of the report, kept, with its reason, in document order.
    expect(r.report.elements.map((e) => [e.index, e.kept])).toEqual([[2, true], [4, true], [5, false]]);
    const [defs, singular] = r.report.elements;
    expect(defs.id).toBe('a');
    expect(defs.keptReason).toMatch(/inside <defs>/);
    expect(defs.commandsBefore).toEqual({ M: 1, C: 1 });
    expect(defs.deviation).toBeNull();
    expect(defs.segmentsAfter).toEqual({ arcs: 0, lines: 0 });
    expect(singular.keptReason).toMatch(/singular transform/);
    expect(r.report.totals).toMatchObject({ elements: 3, rewritten: 1, kept: 2, withinTolerance: true });
  });
});

describe('commands counted before the refit', () => {
  it('polyline and polygon count as their equivalent path: M, then L per further point, Z for a polygon (SVG 2 §10.6, §10.7)', () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="20mm" height="20mm" viewBox="0 0 20 20">' +
      '<polyline id="pl" points="0,0 5,1 10,3 15,6"/><polygon id="pg" points="1,1 9,1 9,9 1,9"/><circle id="c" cx="10" cy="10" r="4"/></svg>';
    const r = refitSvg(svg, { tolerance: 0.1 });
    const by = (id: string) => r.report.elements.find((e) => e.id === id)!.commandsBefore;
    expect(by('pl')).toEqual({ M: 1, L: 3 });
    expect(by('pg')).toEqual({ M: 1, L: 3, Z: 1 });
    expect(by('c')).toEqual({ circle: 1 });
    expect(r.report.totals.commandsBefore).toBe(4 + 5 + 1);
  });
});

describe('a drawing that wiggles by about the tolerance is said so', () => {
  // Our own scenario: a 3 mm hole traced at 12 pixels per mm, its vertices on the pixel grid give or take a
  // quarter pixel; half a pixel (0.042 mm) is nearly a 0.05 mm tolerance.
  const pts: string[] = [];
  let s = 7;
  const rand = (): number => ((s = (s * 1664525 + 1013904223) >>> 0) / 2 ** 32);
  for (let i = 0; i < 300; i++) {
    const a = (-2 * Math.PI * i) / 300;
    const x = Math.round((10 + 3 * Math.cos(a)) * 12) / 12 + ((rand() - 0.5) * 0.5) / 12;
    const y = Math.round((10 + 3 * Math.sin(a)) * 12) / 12 + ((rand() - 0.5) * 0.5) / 12;
    pts.push(`${x.toFixed(3)},${y.toFixed(3)}`);
  }
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="20mm" height="20mm" viewBox="0 0 20 20"><path id="hole" d="M${pts.join(' ')}Z"/></svg>`;

  it('at 0.05 mm it needs more pieces than straight moves: one warning names the element and both counts', () => {
    const r = refitSvg(svg, { tolerance: 0.05 });
    const e = r.report.elements[0];
    expect(e.kept).toBe(false);
    expect(e.segmentsAfter.arcs + e.segmentsAfter.lines).toBeGreaterThan(e.straightMovesNeeded);
    const w = r.report.warnings.filter((l) => /wiggles by about the tolerance/.test(l));
    expect(w).toHaveLength(1);
    expect(w[0]).toContain(`<path id="hole"> (element 1): ${e.segmentsAfter.arcs + e.segmentsAfter.lines} against ${e.straightMovesNeeded}`);
  });

  it('at 0.2 mm, above the pixel size, it comes back as a few arcs and no such warning', () => {
    const r = refitSvg(svg, { tolerance: 0.2 });
    const e = r.report.elements[0];
    expect(e.segmentsAfter.arcs + e.segmentsAfter.lines).toBeLessThanOrEqual(4);
    expect(r.report.warnings.filter((l) => /wiggles/.test(l))).toEqual([]);
  });
});
