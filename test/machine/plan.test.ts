/**
 * The path plan in machine output (src/machine/plan.ts through refitToMachine):
 * the written G-code is read by gcode-toolpath and the DXF by dxf-parser
 * (npm, general-purpose readers, not our writers' code); expected counts and
 * lengths come from geometry, the formula named at each check; the report
 * validates with ajv (npm, JSON Schema 2020-12).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Ajv2020 } from 'ajv/dist/2020.js';
import Toolpath from 'gcode-toolpath';
import DxfParserModule from 'dxf-parser';
import { refitToMachine } from '../../src/refitMachine.js';
import { rng } from '../rng.js';

const schema = JSON.parse(readFileSync(new URL('../../schema/report.schema.json', import.meta.url), 'utf8'));
const validate = new Ajv2020({ allErrors: true, strict: true }).compile(schema);
const valid = (r: unknown): boolean => validate(JSON.parse(JSON.stringify(r))) as boolean;
const DxfParser = DxfParserModule as unknown as new () => { parseSync(t: string): any };

const doc = (body: string): string => `<svg xmlns="http://www.w3.org/2000/svg" width="200mm" height="200mm" viewBox="0 0 200 200">\n${body}</svg>\n`;
const ring = (k: number, n = 720, r = 50): [string, string] => [(100 + r * Math.cos((2 * Math.PI * k) / n)).toFixed(4), (100 + r * Math.sin((2 * Math.PI * k) / n)).toFixed(4)];

interface Read { arcs: number; lines: number; travels: { x0: number; y0: number; x: number; y: number }[] }
/** What gcode-toolpath reads: drawing arcs and lines, and travel moves (G0) with their ends, machine mm. */
function readGcode(text: string): Read {
  const out: Read = { arcs: 0, lines: 0, travels: [] };
  new Toolpath({
    addLine: (modal, v1, v2) => {
      if (v1.x === v2.x && v1.y === v2.y) return;
      if (modal.motion === 'G0') out.travels.push({ x0: v1.x, y0: v1.y, x: v2.x, y: v2.y });
      else out.lines++;
    },
    addArcCurve: () => { out.arcs++; },
  }).loadFromStringSync(text);
  return out;
}
const travelOf = (r: Read): number => r.travels.reduce((s, t) => s + Math.hypot(t.x - t.x0, t.y - t.y0), 0);

describe('refitToMachine with the plan', () => {
  it('writes a ring of 720 <line> elements as one closed contour of 2 arcs in G-code', () => {
    const lines = Array.from({ length: 720 }, (_, k) => {
      const [x1, y1] = ring(k), [x2, y2] = ring(k + 1);
      return `  <line x1="${x1}" y1="${y1}" x2="${x2}" y2="${y2}" stroke="red" fill="none"/>\n`;
    }).join('');
    const r = refitToMachine(doc(lines), { format: 'gcode', plan: true, tolerance: 0.1 });
    const read = readGcode(r.text);
    // One circle: one travel to its start, then the whole turn as two arcs (NIST RS274NGC: a full turn split, our writer's rule).
    expect([read.travels.length, read.arcs, read.lines]).toEqual([1, 2, 0]);
    const p = r.report.plan!;
    expect([p.piercesBefore, p.piercesAfter, p.contoursJoined, p.groups]).toEqual([720, 1, 719, 1]);
    expect(r.report.machine!.checked).toBe(true);
    expect(r.report.totals.rewritten).toBe(720);
    expect(r.report.elements.every((e) => e.planGroup === '#ff0000' && e.deviation!.max <= 0.1)).toBe(true);
    expect(valid(r.report)).toBe(true);
    // Without the plan each element is fitted alone: 720 straight moves (a single line cannot become an arc).
    const plain = readGcode(refitToMachine(doc(lines), { format: 'gcode', tolerance: 0.1 }).text);
    expect([plain.arcs, plain.lines]).toEqual([0, 720]);
  });

  it('keeps each inner edge of a grid of squares once in DXF', () => {
    // n × n squares of side s: the grid has (n+1) lines of length n·s each way, 2n(n+1)s in all (counting the grid
    // graph's edges); without the plan every square draws its own 4s, 4n²s in all.
    const n = 4, s = 10;
    let body = '';
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) body += `  <rect x="${20 + i * s}" y="${20 + j * s}" width="${s}" height="${s}" fill="none" stroke="blue"/>\n`;
    const lineLength = (text: string): { count: number; length: number; other: number } => {
      const es: any[] = new DxfParser().parseSync(text).entities;
      const lines = es.filter((e) => e.type === 'LINE');
      const length = lines.reduce((t, e) => t + Math.hypot(e.vertices[1].x - e.vertices[0].x, e.vertices[1].y - e.vertices[0].y), 0);
      return { count: lines.length, length, other: es.length - lines.length };
    };
    const planned = refitToMachine(doc(body), { format: 'dxf', plan: true, tolerance: 0.1 });
    const a = lineLength(planned.text);
    expect(a.other).toBe(0);
    expect(a.length).toBeCloseTo(2 * n * (n + 1) * s, 6);
    // At most one LINE per unit edge of the grid, 2n(n+1); at least one per grid line, 2(n+1).
    expect(a.count).toBeLessThanOrEqual(2 * n * (n + 1));
    expect(a.count).toBeGreaterThanOrEqual(2 * (n + 1));
    expect(planned.report.plan!.doubleLinesMm).toBeCloseTo(2 * n * (n - 1) * s, 6);
    expect(planned.report.machine!.checked).toBe(true);
    for (const e of planned.report.elements) expect(e.deviation!.max).toBeLessThanOrEqual(0.1);
    const b = lineLength(refitToMachine(doc(body), { format: 'dxf', tolerance: 0.1 }).text);
    expect([b.count, b.length]).toEqual([4 * n * n, 4 * n * n * s]);
  });

  it('cuts holes before their part in G-code with holesFirst', () => {
    // The part (a square) comes first in the file; its two holes, and a separate washer with its own hole, after.
    const body = '  <path d="M20 20H120V120H20Z" fill="none" stroke="#000"/>\n  <circle cx="150" cy="150" r="20" fill="none" stroke="#000"/>\n' +
      '  <circle cx="50" cy="50" r="10" fill="none" stroke="#000"/>\n  <circle cx="90" cy="90" r="10" fill="none" stroke="#000"/>\n' +
      '  <circle cx="150" cy="150" r="5" fill="none" stroke="#000"/>\n';
    const r = refitToMachine(doc(body), { format: 'gcode', plan: true, holesFirst: true, tolerance: 0.1 });
    expect(r.report.machine!.checked).toBe(true);
    // Each G0 ends at a contour's start (machine Y = 200 − page y, lower-left origin): which contour it is.
    const which = readGcode(r.text).travels.map((t) => {
      const x = t.x, y = 200 - t.y;
      if (Math.hypot(x - 50, y - 50) < 10.01) return 'hole1';
      if (Math.hypot(x - 90, y - 90) < 10.01) return 'hole2';
      if (Math.hypot(x - 150, y - 150) < 5.01) return 'washerHole';
      if (Math.hypot(x - 150, y - 150) < 20.01) return 'washer';
      return 'part';
    });
    expect(which).toHaveLength(5);
    expect(which.indexOf('hole1')).toBeLessThan(which.indexOf('part'));
    expect(which.indexOf('hole2')).toBeLessThan(which.indexOf('part'));
    expect(which.indexOf('washerHole')).toBeLessThan(which.indexOf('washer'));
  });

  it('shortens travel on a shuffled soup of strokes, and the time estimate follows', () => {
    const r0 = rng(11);
    let body = '';
    for (let k = 0; k < 300; k++) {
      const x = 10 + 180 * r0(), y = 10 + 180 * r0(), a = 2 * Math.PI * r0();
      body += `  <path d="M${x.toFixed(3)} ${y.toFixed(3)}l${(3 * Math.cos(a)).toFixed(3)} ${(3 * Math.sin(a)).toFixed(3)}" fill="none" stroke="#000"/>\n`;
    }
    const plain = refitToMachine(doc(body), { format: 'gcode', tolerance: 0.1 });
    const r = refitToMachine(doc(body), { format: 'gcode', plan: true, tolerance: 0.1 });
    const p = r.report.plan!;
    expect(p.travelAfterMm).toBeLessThan(p.travelBeforeMm / 3);
    // The travel the reader finds in the file (G0 moves, from the origin) is the plan's figure, and the file's without
    // the plan is its "before" (to the file's 3 decimals per move).
    expect(travelOf(readGcode(r.text))).toBeCloseTo(p.travelAfterMm, 0);
    expect(travelOf(readGcode(plain.text))).toBeCloseTo(p.travelBeforeMm, 0);
    expect(r.report.machine!.seconds).toBeLessThan(plain.report.machine!.seconds);
    expect(r.report.machine!.checked).toBe(true);
  });

  it('never interleaves colours, and filled shapes keep their place', () => {
    const colours = ['red', 'blue', 'red', 'blue', 'red'];
    const body = colours.map((c, k) => `  <path d="M${10 + 30 * k} 10V100" fill="none" stroke="${c}"/>\n`).join('') +
      '  <path d="M10 150H60V190Z" fill="#0f0" stroke="#0f0"/>\n  <path d="M180 10V100" fill="none" stroke="blue"/>\n';
    const g = refitToMachine(doc(body), { format: 'gcode', plan: true, tolerance: 0.1 });
    expect(g.report.machine!.checked).toBe(true);
    // Our element comments name each element's stroke: the sequence of groups as written.
    const seq = [...g.text.matchAll(/\(element \d+ .* stroke (#[0-9a-f]{6})\)/g)].map((m) => m[1]);
    expect(seq).toEqual(['#ff0000', '#0000ff', '#00ff00']);
    const dxf = new DxfParser().parseSync(refitToMachine(doc(body), { format: 'dxf', plan: true, tolerance: 0.1 }).text);
    const layers = dxf.entities.map((e: any) => e.layer as string).filter((l: string, i: number, a: string[]) => i === 0 || a[i - 1] !== l);
    expect(layers).toEqual(['STROKE_FF0000', 'STROKE_0000FF', 'STROKE_00FF00']);
  });

  it('writes a group over the tolerance unplanned, with a warning', () => {
    // A join across a 0.5 mm gap (join distance 1 mm) bridges it 0.25 mm from the drawing (half the gap), over 0.1 mm.
    const body = '  <path d="M0 0L50 0" stroke="#000" fill="none"/>\n  <path d="M50.5 0L100 0" stroke="#000" fill="none"/>\n';
    const r = refitToMachine(doc(body), { format: 'gcode', plan: true, tolerance: 0.1, joinDistance: 1 });
    expect(r.report.warnings.join(' ')).toMatch(/plan: the #000000 group measured 0\.25\d* mm/);
    expect(r.report.plan!.groups).toBe(0);
    expect(r.report.machine!.checked).toBe(true);
    expect(readGcode(r.text).travels).toHaveLength(2);
    expect(r.report.elements.every((e) => e.planGroup === undefined && e.status === 'refitted')).toBe(true);
  });
});
