/**
 * The path plan inside the refit (option plan): the cases as SVG files,
 * written in plan order, measured as groups, reported and schema-valid.
 * Expected counts and lengths come from geometry (formula named at each check);
 * the report validates with ajv (npm, JSON Schema 2020-12).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { refitSvg } from '../src/refit.js';
import { refitToMachine } from '../src/refitMachine.js';
import { compareSvg } from '../src/measure/compare.js';
import { OptionError } from '../src/options.js';
import { parsePathData } from '../src/svg/pathData.js';
import type { FileReport } from '../src/report/types.js';
import { rng } from './rng.js';

const schema = JSON.parse(readFileSync(new URL('../schema/report.schema.json', import.meta.url), 'utf8'));
const validate = new Ajv2020({ allErrors: true, strict: true }).compile(schema);
const valid = (r: FileReport): boolean => validate(JSON.parse(JSON.stringify(r))) as boolean;

const doc = (body: string): string => `<svg xmlns="http://www.w3.org/2000/svg" width="200mm" height="200mm" viewBox="0 0 200 200">\n${body}</svg>\n`;
const ring = (k: number, n = 720, r = 50): [string, string] => [(100 + r * Math.cos((2 * Math.PI * k) / n)).toFixed(4), (100 + r * Math.sin((2 * Math.PI * k) / n)).toFixed(4)];
/** The `d` of every path written, in document order. */
const paths = (svg: string): string[] => [...svg.matchAll(/<path\b[^>]*\bd="([^"]*)"/g)].map((m) => m[1]);
/** Drawing commands of path data (every command but M). */
const drawing = (d: string): number => Array.from(parsePathData(d).ops).filter((op) => op !== 0).length;

describe('refitSvg with the plan', () => {
  it('writes a ring of 720 <line> elements as one path of two arcs', () => {
    // No fill="none" on them, as lines are written: a line has no interior and is never filled (SVG 1.1 §9.5).
    const lines = Array.from({ length: 720 }, (_, k) => {
      const [x1, y1] = ring(k), [x2, y2] = ring(k + 1);
      return `  <line x1="${x1}" y1="${y1}" x2="${x2}" y2="${y2}" stroke="red"/>\n`;
    }).join('');
    const r = refitSvg(doc(lines), { plan: true, tolerance: 0.1 });
    expect(r.text).not.toContain('<line');
    const ds = paths(r.text);
    expect(ds).toHaveLength(1);
    expect(ds[0]).not.toMatch(/[LlHhVv]/);
    // The whole ring, two half turns on its circle (the polygon's vertices lie on r = 50).
    const counts = parsePathData(ds[0]).counts;
    expect((counts.A ?? 0) + (counts.a ?? 0)).toBe(2);
    const p = r.report.plan!;
    expect([p.piercesBefore, p.piercesAfter, p.contoursJoined, p.doubleLinesMm]).toEqual([720, 1, 719, 0]);
    expect(r.report.totals.withinTolerance).toBe(true);
    expect(r.report.totals.rewritten).toBe(720);
    expect(valid(r.report)).toBe(true);
    // Without the plan (the default) the same file keeps its 720 exact lines.
    expect(refitSvg(doc(lines), { tolerance: 0.1 }).text).toBe(doc(lines));
  });

  it('joins a soup of 720 subpaths "M a L b" in one element', () => {
    const r0 = rng(3);
    const subs = Array.from({ length: 720 }, (_, k) => (r0() < 0.5 ? [ring(k), ring(k + 1)] : [ring(k + 1), ring(k)]));
    for (let i = subs.length - 1; i > 0; i--) {
      const j = Math.floor(r0() * (i + 1));
      [subs[i], subs[j]] = [subs[j], subs[i]];
    }
    const d = subs.map(([a, b]) => `M${a[0]} ${a[1]}L${b[0]} ${b[1]}`).join('');
    // The initial fill (black) paints nothing here: every subpath is one segment, closed back on itself it encloses
    // no area (SVG 2 §13.3: the fill closes open subpaths), so the element counts as stroke only.
    const r = refitSvg(doc(`  <path d="${d}" stroke="#000"/>\n`), { plan: true, tolerance: 0.1 });
    const ds = paths(r.text);
    expect(ds).toHaveLength(1);
    expect(parsePathData(ds[0]).counts.M ?? 0).toBe(1);
    expect(r.report.plan!.piercesAfter).toBe(1);
    expect(r.report.totals.withinTolerance).toBe(true);
  });

  it('cuts each edge of a grid of squares once', () => {
    // n × n <rect> of side s, stroke only: 2n(n−1)s of shared edges removed (counting the grid graph's edges).
    const n = 4, s = 10;
    let body = '';
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) body += `  <rect x="${20 + i * s}" y="${20 + j * s}" width="${s}" height="${s}" fill="none" stroke="blue"/>\n`;
    const r = refitSvg(doc(body), { plan: true, tolerance: 0.1 });
    const p = r.report.plan!;
    expect(p.doubleLinesMm).toBeCloseTo(2 * n * (n - 1) * s, 6);
    expect(p.piercesAfter).toBeLessThan(n * n);
    // Euler: 4(n−1) odd vertices need at least 2(n−1) strokes.
    expect(p.piercesAfter).toBeGreaterThanOrEqual(2 * (n - 1));
    expect(r.report.totals.withinTolerance).toBe(true);
    // A removed edge is measured as covered by the kept one: every square's report carries the group's deviation.
    for (const e of r.report.elements) expect(e.deviation!.max).toBeLessThanOrEqual(0.1);
    expect(valid(r.report)).toBe(true);
  });

  it('keeps colours apart and leaves filled shapes where they are, byte for byte', () => {
    const filled = '  <path d="M10 10L60 10L60 60Z" fill="#0f0"/>\n';
    // The filled triangle is painted after the lines (a fill painted between two members splits their group: the
    // next test).
    const body = '  <path d="M0 0L50 0" stroke="red" fill="none"/>\n' +
      '  <path d="M0 0L50 0" stroke="blue" fill="none"/>\n  <path d="M50 0L100 0" stroke="red" fill="none"/>\n' + filled;
    const r = refitSvg(doc(body), { plan: true, tolerance: 0.1 });
    expect(r.text).toContain(filled);
    // The red lines join (they meet at (50,0)) into one path; the blue duplicate of a red line stays: other colour.
    expect(r.text.match(/stroke="red"/g)).toHaveLength(1);
    expect(r.text.match(/stroke="blue"/g)).toHaveLength(1);
    expect(r.report.plan!.doubleLinesMm).toBe(0);
    expect(r.report.plan!.contoursJoined).toBe(1);
    // Painting order: the red group is written where its first element stood, before the filled triangle.
    expect(r.text.indexOf('stroke="red"')).toBeLessThan(r.text.indexOf(filled));
  });

  it('removes a reversed and a partial double line and measures them as covered', () => {
    const body = '  <path d="M0 10L100 10" stroke="#000" fill="none"/>\n  <path d="M100 10L0 10" stroke="#000" fill="none"/>\n' +
      '  <path d="M50 10.02L150 10.02" stroke="#000" fill="none"/>\n';
    const r = refitSvg(doc(body), { plan: true, tolerance: 0.1 });
    // Reversed duplicate: 100 mm; partial overlap of [50,150] with [0,100]: 50 mm (interval arithmetic).
    expect(r.report.plan!.doubleLinesMm).toBeCloseTo(150, 6);
    // What is left joins across the 0.02 mm step into one path: a line, the step, a line at most.
    const ds = paths(r.text);
    expect(ds).toHaveLength(1);
    expect(drawing(ds[0])).toBeLessThanOrEqual(3);
    for (const e of r.report.elements) {
      expect(e.status).toBe('refitted');
      expect(e.deviation!.max).toBeLessThanOrEqual(0.1);
    }
  });

  it('cuts nested circles from the inside out with holes first', () => {
    const body = [40, 30, 20, 10].map((rad) => `  <circle cx="100" cy="100" r="${rad}" fill="none" stroke="#000"/>\n`).join('');
    const r = refitSvg(doc(body), { plan: true, holesFirst: true, tolerance: 0.1 });
    const starts = paths(r.text).map((d) => {
      const p = parsePathData(d);
      return Math.hypot(p.args[0] - 100, p.args[1] - 100);
    });
    expect(starts.map((v) => Math.round(v))).toEqual([10, 20, 30, 40]);
  });

  it('keeps an id on the path that draws its element, wherever the order puts it', () => {
    // The square named "part" comes first in the file, but the small circle near the origin is drawn first.
    const body = '  <path id="part" d="M100 100H180V180H100Z" fill="none" stroke="#000"/>\n  <circle cx="10" cy="10" r="3" fill="none" stroke="#000"/>\n';
    const r = refitSvg(doc(body), { plan: true, tolerance: 0.1 });
    const tags = [...r.text.matchAll(/<path\b[^>]*>/g)].map((m) => m[0]);
    expect(tags).toHaveLength(2);
    expect(tags[0]).not.toContain('id=');
    expect(tags[1]).toContain('id="part"');
  });

  it('falls back to refitting one by one when a group measures over the tolerance', () => {
    // A join across a 0.5 mm gap (join distance 1 mm) draws a bridge whose middle is 0.25 mm from the drawing
    // (half the gap, Pythagoras-free: it lies on the line between the two ends), over the 0.1 mm tolerance.
    const body = '  <path d="M0 0L50 0" stroke="#000" fill="none"/>\n  <path d="M50.5 0L100 0" stroke="#000" fill="none"/>\n';
    const r = refitSvg(doc(body), { plan: true, tolerance: 0.1, joinDistance: 1 });
    expect(r.report.plan!.groups).toBe(0);
    expect(r.report.plan!.contoursJoined).toBe(0);
    expect(r.report.warnings.join(' ')).toMatch(/plan: the #000000 1 mm at element 1 group measured 0\.25\d* mm/);
    expect(r.report.totals.withinTolerance).toBe(true);
    expect(r.report.elements.every((e) => e.planGroup === undefined)).toBe(true);
  });

  it('never joins or moves geometry across a different drawing context (parent group, dashes, markers, opacity)', () => {
    // Touching red lines, one dashed inside a translucent group: one contour would draw both alike, so they stay apart.
    const body = '  <g opacity="0.2"><line x1="0" y1="20" x2="25" y2="20" stroke="red" stroke-dasharray="2 1"/></g>\n' +
      '  <line x1="25" y1="20" x2="50" y2="20" stroke="red"/>\n  <line x1="50" y1="20" x2="75" y2="20" stroke="red" marker-end="url(#m)"/>\n';
    const r = refitSvg(doc(body), { plan: true, tolerance: 0.1 });
    expect(r.report.plan!.contoursJoined).toBe(0);
    expect(r.text).toMatch(/<g opacity="0.2"><(path|line)[^>]*stroke-dasharray="2 1"/);
    expect(r.text.match(/marker-end=/g)).toHaveLength(1);
    expect(r.report.totals.withinTolerance).toBe(true);
  });

  it('keeps painting order (never across a fill drawn between) and never writes into a symbol a <use> draws', () => {
    // Two touching red lines with a white filled rect painted between them: joined, one would move under the rect.
    const fill = '  <line x1="0" y1="20" x2="25" y2="20" stroke="red"/>\n  <rect x="20" y="10" width="20" height="20" fill="white"/>\n' +
      '  <line x1="25" y1="20" x2="50" y2="20" stroke="red"/>\n';
    const r = refitSvg(doc(fill), { plan: true, tolerance: 0.1 });
    expect(r.report.plan!.contoursJoined).toBe(0);
    const at = (s: string): number => r.text.indexOf(s);
    expect(at('<rect')).toBeGreaterThan(0);
    expect(r.text.slice(at('<rect')).match(/<(path|line)\b/g)).toHaveLength(1);
    // A blue circle inside a symbol drawn by <use>, and blue lines at the root: the lines stay at the root.
    const sym = '  <symbol id="s" viewBox="0 0 10 10"><circle cx="5" cy="5" r="4" fill="none" stroke="blue"/></symbol>\n' +
      '  <use href="#s" x="60" y="60" width="10" height="10"/>\n' +
      '  <line x1="50" y1="10" x2="80" y2="10" stroke="blue"/>\n  <line x1="80" y1="10" x2="80" y2="30" stroke="blue"/>\n';
    const q = refitSvg(doc(sym), { plan: true, tolerance: 0.1 });
    const inside = q.text.slice(q.text.indexOf('<symbol'), q.text.indexOf('</symbol>'));
    expect(inside).not.toMatch(/M50 10/);
    expect(compareSvg(doc(sym), q.text, { tolerance: 0.1 }).whole!.max).toBeLessThanOrEqual(0.1);
  });

  it('a second planning run changes nothing, and planning a refitted file keeps within the tolerance of the first original', () => {
    // Two stroke-only Bézier paths of our own; the refit mark (src/write/refitMark.ts) carries what a run spent.
    const body = '  <path d="M 10 50 C 20 10, 40 10, 50 50 C 60 90, 80 90, 90 50" fill="none" stroke="black"/>\n' +
      '  <path d="M 10 80 C 30 60, 60 100, 90 80" fill="none" stroke="black"/>\n';
    const first = refitSvg(doc(body), { plan: true, tolerance: 0.05 });
    expect(first.text).toContain('data-arcspline-tolerance="0.05"');
    expect(refitSvg(first.text, { plan: true, tolerance: 0.05 }).text).toBe(first.text);
    // Refitted without the plan, then planned three times: the marked elements are not planned again.
    let text = refitSvg(doc(body), { tolerance: 0.05 }).text;
    for (let k = 0; k < 3; k++) text = refitSvg(text, { plan: true, tolerance: 0.05 }).text;
    const c = compareSvg(doc(body), text, { tolerance: 0.05 });
    expect(c.whole!.max).toBeLessThanOrEqual(0.05);
  });

  it('refuses the plan with baked transforms, naming the options; machine output takes it', () => {
    expect(() => refitSvg(doc(''), { plan: true, bakeTransforms: true })).toThrow(OptionError);
    expect(() => refitSvg(doc(''), { plan: true, bakeTransforms: true })).toThrow(/plan and bakeTransforms/);
    expect(() => refitSvg(doc(''), { plan: true, joinDistance: -1 })).toThrow(/joinDistance.*-1/);
    // Machine output takes the plan (more in test/machine/plan.test.ts): two red lines meeting end to end, one pierce.
    const m = refitToMachine(doc('  <path d="M0 0L50 0" stroke="red" fill="none"/>\n  <path d="M50 0L100 0" stroke="red" fill="none"/>\n'), { plan: true, format: 'gcode' });
    expect([m.report.plan!.piercesBefore, m.report.plan!.piercesAfter]).toEqual([2, 1]);
  });
});
