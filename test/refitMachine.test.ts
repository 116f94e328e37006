/**
 * Machine output through the pipeline: the report validates against
 * schema/report.schema.json (ajv, npm), every element is measured on the file
 * read back by an independent reader (gcode-toolpath / dxf-parser, npm), exact
 * shapes are written as arcs, and the page's physical size puts the origin.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Ajv2020 } from 'ajv/dist/2020.js';
import DxfParserModule from 'dxf-parser';
import { refitToMachine } from '../src/refitMachine.js';
import { OptionError } from '../src/options.js';

const schema = JSON.parse(readFileSync(new URL('../schema/report.schema.json', import.meta.url), 'utf8'));
const validate = new Ajv2020({ allErrors: true, strict: true }).compile(schema);
const sample = (f: string): string => readFileSync(new URL(`../samples/${f}`, import.meta.url), 'utf8');
const DxfParser = DxfParserModule as unknown as new () => { parseSync(t: string): any };

describe('refitToMachine', () => {
  it.each(['gcode', 'dxf'] as const)('bracket.svg as %s: every element refitted and measured within 0.1 mm; the report validates', (format) => {
    const r = refitToMachine(sample('bracket.svg'), { format }, 'bracket.svg');
    expect(validate(JSON.parse(JSON.stringify(r.report))), JSON.stringify(validate.errors)).toBe(true);
    expect(r.report.machine?.format).toBe(format);
    expect(r.report.machine?.checked).toBe(true);
    expect(r.report.totals.withinTolerance).toBe(true);
    for (const e of r.report.elements) {
      expect(e.status).toBe('refitted');
      expect(e.deviation!.max).toBeLessThanOrEqual(0.1);
    }
    // The two circles (exact shapes, kept as written in SVG output) are written as arcs here.
    expect(r.report.elements.filter((e) => e.name === 'circle').every((e) => e.segmentsAfter.arcs > 0)).toBe(true);
    expect(r.report.machine!.seconds).toBeGreaterThan(0);
    expect(r.report.machine!.straight.moves).toBeGreaterThan(r.report.machine!.moves.lines + r.report.machine!.moves.arcs);
  });

  it('the origin: the bracket page is 80 mm high, so page y = 5 is machine Y = 75 (lower-left) or −5 (upper-left)', () => {
    // bracket.svg: width 120mm height 80mm, outline's top edge at y = 5 from x = 13 to 107.
    const low = refitToMachine(sample('bracket.svg'), { format: 'dxf' }).text;
    const up = refitToMachine(sample('bracket.svg'), { format: 'dxf', machineOrigin: 'upper-left' }).text;
    const ys = (t: string): number[] => new DxfParser().parseSync(t).entities.filter((e: any) => e.type === 'LINE').flatMap((e: any) => e.vertices.map((v: any) => v.y));
    expect(ys(low)).toContain(75);
    expect(ys(up)).toContain(-5);
    expect(Math.max(...ys(up))).toBeLessThanOrEqual(0);
  });

  it('colours become layers; a stroke colour with its own profile power is written with it', () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="50mm" height="50mm" viewBox="0 0 50 50">' +
      '<circle cx="25" cy="25" r="20" fill="none" stroke="red"/><path d="M5 5 L45 5" stroke="#000"/></svg>';
    const dxf = new DxfParser().parseSync(refitToMachine(svg, { format: 'dxf' }).text);
    expect(Object.keys(dxf.tables.layer.layers).sort()).toEqual(['STROKE_000000', 'STROKE_FF0000']);
    const profile = JSON.stringify({ toolOn: ['M4 S{power}'], toolOff: ['M5'], colours: { '#ff0000': { power: 250 } } });
    const g = refitToMachine(svg, { format: 'gcode', machineProfile: profile }).text;
    expect(g).toContain('M4 S250');
    expect(g).toContain('M4 S1000');
  });

  it('refuses SVG as the format and a bad profile, with one line naming it', () => {
    expect(() => refitToMachine(sample('icons/heart.svg'), { format: 'svg' })).toThrow(/gcode or dxf/);
    expect(() => refitToMachine(sample('icons/heart.svg'), { format: 'gcode', machineProfile: 'plasma' })).toThrow(OptionError);
    expect(() => refitToMachine(sample('icons/heart.svg'), { format: 'gcode', machineProfile: '{"workFeed": -1}' })).toThrow(/"workFeed"/);
  });

  it('fewer than 3 decimals are refused; an element that cannot be written fails the file', () => {
    expect(() => refitToMachine(sample('icons/target.svg'), { format: 'gcode', digits: 2 })).toThrow(/at least 3/);
    // 3 decimals cannot hold 0.002 mm: the budget leaves no room for the fit, the elements are not written.
    const r = refitToMachine(sample('icons/target.svg'), { format: 'gcode', digits: 3, tolerance: 0.002 });
    expect(r.report.machine!.checked).toBe(false);
    expect(r.report.totals.withinTolerance).toBe(false);
    expect(r.report.warnings.join('\n')).toMatch(/not written to the G-code file: too few decimals/);
  });
});

describe('point marks', () => {
  it('subpaths that draw only a point are left out of the file and of the proof, with a warning', () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="50mm" height="50mm" viewBox="0 0 50 50">' +
      '<path d="M10 10 Z M20 20 L30 20"/><path d="M5 5 Z"/></svg>';
    const r = refitToMachine(svg, { format: 'gcode' });
    expect(r.report.machine!.checked).toBe(true);
    expect(r.report.elements.map((e) => e.status)).toEqual(['refitted', 'reverted']);
    expect(r.report.elements[1].keptReason).toMatch(/only point marks/);
    expect(r.report.warnings).toContain('2 point marks (subpaths that draw only a point) are not written to the G-code file');
    expect(r.text).toContain('\nG1 X30 Y30 F1200\n');
  });
});
