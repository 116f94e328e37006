/**
 * The command line with machine output: the format from the output name or
 * --format, profiles by name or file, the origin, batches, and the refusals.
 * G-code is read back here by gcode-toolpath and DXF by dxf-parser (npm,
 * general-purpose readers).
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import Toolpath from 'gcode-toolpath';
import DxfParserModule from 'dxf-parser';
import { EXIT_OK, EXIT_USAGE } from '../../src/cli/main.js';
import { formatOfOutputName } from '../../src/cli/args.js';
import type { FileReport } from '../../src/report/types.js';
import { FILE_REPORT_KEYS, MACHINE_KEYS, run, scratch } from './helpers.js';

const DxfParser = DxfParserModule as unknown as new () => { parseSync(t: string): any };
const BRACKET_PATH = new URL('../../samples/bracket.svg', import.meta.url).pathname;
const HEART_PATH = new URL('../../samples/icons/heart.svg', import.meta.url).pathname;

let dir = '';
let cleanup = (): void => undefined;
beforeEach(() => ({ dir, cleanup } = scratch()));
afterEach(() => cleanup());
const at = (name: string): string => join(dir, name);

function arcsRead(gcode: string): number {
  let n = 0;
  new Toolpath({ addArcCurve: () => void n++ }).loadFromStringSync(gcode);
  return n;
}

describe('machine output from the command line', () => {
  it('-o part.gcode writes G-code with arcs, the report carries `machine`, the summary the estimated time', async () => {
    const r = await run([BRACKET_PATH, '-o', at('part.gcode'), '--report', at('r.json')]);
    expect(r.code).toBe(EXIT_OK);
    const g = readFileSync(at('part.gcode'), 'utf8');
    expect(g).toMatch(/^\(arcspline .*laser profile/);
    expect(g).toContain('\nG21 G90 G17 G94\n');
    expect(arcsRead(g)).toBeGreaterThan(10);
    const report = JSON.parse(readFileSync(at('r.json'), 'utf8')) as FileReport;
    expect(Object.keys(report).sort()).toEqual([...FILE_REPORT_KEYS, 'machine'].sort());
    expect(Object.keys(report.machine!).sort()).toEqual([...MACHINE_KEYS].sort());
    expect(report.bytesOut).toBe(Buffer.byteLength(g));
    expect(r.stderr).toMatch(/bracket\.svg: G-code \d+ lines \(\d+ arcs, \d+ lines, \d+ travels\) from 7 elements, read back: max deviation [\d.]+ mm ≤ 0\.1 mm, est\. [\d.]+ s \(as \d+ straight moves [\d.]+ s, profile laser\)/);
  });

  it('--plan with -o part.gcode plans the file: the report carries `plan`, the summary its figures', async () => {
    // Three strokes of one colour meeting end to end: joined into one contour, one pierce (our own scenario).
    writeFileSync(at('zig.svg'), '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">' +
      '<path d="M10 10L50 10" fill="none" stroke="#000"/><path d="M90 50L50 10" fill="none" stroke="#000"/><path d="M90 50L90 90" fill="none" stroke="#000"/></svg>');
    const r = await run([at('zig.svg'), '--plan', '-o', at('zig.gcode'), '--report', at('r.json')]);
    expect(r.code).toBe(EXIT_OK);
    const report = JSON.parse(readFileSync(at('r.json'), 'utf8')) as FileReport;
    expect([report.plan!.piercesBefore, report.plan!.piercesAfter, report.plan!.contoursJoined]).toEqual([3, 1, 2]);
    expect(r.stderr).toMatch(/zig\.svg: G-code .* profile laser\); plan: travel [\d.]+ mm → [\d.]+ mm, 3 → 1 pierce, 2 joined/);
  });

  it('.nc and .ngc are G-code, .dxf is DXF; --format dxf to standard output', async () => {
    expect([formatOfOutputName('a.NC'), formatOfOutputName('a.ngc'), formatOfOutputName('a.dxf'), formatOfOutputName('a.svgz'), formatOfOutputName('a.txt')])
      .toEqual(['gcode', 'gcode', 'dxf', 'svg', null]);
    const r = await run([HEART_PATH, '--format', 'dxf', '-o', '-']);
    expect(r.code).toBe(EXIT_OK);
    const d = new DxfParser().parseSync(r.stdout);
    expect(d.header.$INSUNITS).toBe(4);
    expect(d.entities.some((e: any) => e.type === 'ARC')).toBe(true);
  });

  it('a profile from a JSON file, and the upper-left origin', async () => {
    writeFileSync(at('pen.json'), JSON.stringify({ name: 'my-pen', toolOn: ['G1 Z-0.5 F300'], toolOff: ['G0 Z3'], end: ['M2'], workFeed: 2000 }));
    const r = await run([HEART_PATH, '-o', at('h.gcode'), '--profile', at('pen.json'), '--origin', 'upper-left']);
    expect(r.code).toBe(EXIT_OK);
    const g = readFileSync(at('h.gcode'), 'utf8');
    expect(g).toContain('my-pen profile');
    expect(g).toContain('\nG1 Z-0.5 F300\n');
    expect(g).toMatch(/ F2000\n/);
    expect(g).toContain("origin at the page's upper-left corner");
    // Upper-left: the drawing lies at negative Y.
    for (const m of g.matchAll(/^G[0-3] X-?[\d.]+ Y(-?[\d.]+)/gm)) expect(Number(m[1])).toBeLessThanOrEqual(0);
  });

  it('a batch with --format writes .dxf files mirroring the tree', async () => {
    mkdirSync(at('in/sub'), { recursive: true });
    writeFileSync(at('in/a.svg'), readFileSync(HEART_PATH));
    writeFileSync(at('in/sub/b.svg'), readFileSync(HEART_PATH));
    const r = await run([at('in'), '-o', at('out'), '--format', 'dxf']);
    expect(r.code).toBe(EXIT_OK);
    expect(readdirSync(at('out')).sort()).toEqual(['a.dxf', 'sub']);
    expect(readdirSync(at('out/sub'))).toEqual(['b.dxf']);
    expect(new DxfParser().parseSync(readFileSync(at('out/sub/b.dxf'), 'utf8')).entities.length).toBeGreaterThan(0);
  });

  it.each([
    [['--format', 'gcode', '-o', 'x.dxf'], /--format gcode and the output name .*x\.dxf \(dxf\) disagree/],
    [['--in-place', '--format', 'gcode'], /--in-place rewrites SVG files/],
    [['-o', 'x.gcode', '--preview', 'p.png'], /--preview draws SVG output/],
    [['-o', 'x.gcode', '--profile', 'plasma'], /"plasma" is neither a built-in profile \(laser, pen-z, pen-servo\) nor a readable file/],
    [['-o', 'x.gcode', '--origin', 'middle'], /machineOrigin must be lower-left or upper-left, got middle/],
    [['-o', 'x.gcode', '--format', 'pdf'], /format must be one of svg, gcode, dxf, got pdf/],
  ])('refuses %j with one line', async (flags, message) => {
    const r = await run([HEART_PATH, ...flags.map((f) => (/^x\.|^p\.png$/.test(f) ? at(f) : f))]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.stderr).toMatch(message);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('a bad profile file names the field', async () => {
    writeFileSync(at('bad.json'), '{"workFeed": "fast"}');
    const r = await run([HEART_PATH, '-o', at('x.gcode'), '--profile', at('bad.json')]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.stderr).toMatch(/bad\.json: profile field "workFeed" must be a number/);
  });
});
