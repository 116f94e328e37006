/**
 * What a new user runs into: `measure` listed in --help as a subcommand with
 * the shared flags, a length with a space before its unit, --table in a
 * batch, and the summary line counting commands as the table does.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { EXIT_OK, EXIT_USAGE } from '../../src/cli/exitCodes.js';
import { checkSpacedUnits, LENGTH_UNITS } from '../../src/cli/spacedUnits.js';
import { parseToleranceText } from '../../src/options.js';
import { run, scratch, SMALL } from './helpers.js';

const BRACKET_PATH = new URL('../../samples/bracket.svg', import.meta.url).pathname;

let dir = '', cleanup = (): void => undefined;
const at = (...p: string[]): string => join(dir, ...p);
beforeEach(() => ({ dir, cleanup } = scratch()));
afterEach(() => cleanup());

describe('measure is a subcommand', () => {
  it('is listed in --help and has its own help with the shared flags, declared once', async () => {
    const top = await run(['--help']);
    expect(top.code).toBe(EXIT_OK);
    expect(top.stdout).toMatch(/^Commands:\n {2}measure \[options\] <a> <b> +measure how far two SVG drawings/m);
    const own = await run(['measure', '--help']);
    expect(own.code).toBe(EXIT_OK);
    expect(own.stdout).toMatch(/^Usage: arcspline measure \[options\] <a> <b>/);
    // The same option lines as the refit's own (one declaration): flag, meaning and default.
    for (const flag of ['-t, --tolerance <length>', '--unitless-size <length>', '--max-input <MB>']) {
      const line = (text: string): string => text.replace(/\n {20,}/g, ' ').split('\n').find((l) => l.includes(flag))!.replace(/\s+/g, ' ');
      expect(line(own.stdout), flag).toBe(line(top.stdout));
    }
    expect(own.stdout).toContain('--json');
    expect(own.stdout).not.toContain('--in-place');
  });

  it('takes its flags after the subcommand, units included, and refuses the refit-only ones', async () => {
    writeFileSync(at('a.svg'), SMALL);
    const r = await run(['measure', at('a.svg'), at('a.svg'), '-t', '0.01in', '--json']);
    expect(r.code, r.stderr).toBe(EXIT_OK);
    expect(JSON.parse(r.stdout).toleranceMm).toBeCloseTo(0.254, 12); // CSS Values 3 §5.2: 1in = 25.4mm
    const bad = await run(['measure', at('a.svg'), at('a.svg'), '--in-place']);
    expect(bad.code).toBe(EXIT_USAGE);
    expect(bad.stderr).toMatch(/^arcspline: unknown option '--in-place' \(arcspline measure --help shows the usage\)\n$/);
  });
});

describe('a length with a space before its unit', () => {
  it('-t 0.1 mm gives one line saying to write 0.1mm, and reads nothing', async () => {
    for (const args of [[BRACKET_PATH, '-t', '0.1', 'mm', '-o', at('o.svg')], ['-t0.1', 'mm', BRACKET_PATH], ['--tolerance=0.1', 'MM', BRACKET_PATH], ['measure', BRACKET_PATH, BRACKET_PATH, '-t', '0.1', 'mm']]) {
      const r = await run(args);
      expect(r.code, args.join(' ')).toBe(EXIT_USAGE);
      expect(r.stderr.trimEnd().split('\n'), args.join(' ')).toHaveLength(1);
      expect(r.stderr).toMatch(/^arcspline: (-t|--tolerance) 0\.1 (mm|MM): write the number and its unit together, as (-t|--tolerance) 0\.1(mm|MM)\n$/);
    }
    expect(existsSync(at('o.svg'))).toBe(false);
    expect(() => checkSpacedUnits(['--unitless-size', '1', 'px', 'a.svg'])).toThrow(/as --unitless-size 1px/);
    // A file that happens to follow a number elsewhere is fine.
    expect(() => checkSpacedUnits(['-t', '0.1mm', 'in.svg', '--digits', '3', 'mm.svg'])).not.toThrow();
    // A directory that really is called `in` is an input, as written.
    const cwd = process.cwd();
    mkdirSync(at('in'));
    try {
      process.chdir(dir);
      expect(() => checkSpacedUnits(['-t', '0.1', 'in', '-o', 'out'])).not.toThrow();
      expect(() => checkSpacedUnits(['-t', '0.1', 'mm', '-o', 'out'])).toThrow(/-t 0\.1mm/);
    } finally {
      process.chdir(cwd);
    }
    // Every unit the check knows is one the tolerance parser takes.
    for (const u of LENGTH_UNITS) expect(parseToleranceText(`1${u}`), u).toBeGreaterThan(0);
  });
});

describe('--table in a batch, and counts that agree', () => {
  it('prints each file\'s table in a batch', async () => {
    mkdirSync(at('in'));
    writeFileSync(at('in', 'a.svg'), SMALL);
    writeFileSync(at('in', 'b.svg'), SMALL.replace('id="c"', 'id="other"'));
    const r = await run([at('in'), '-o', at('out'), '--table']);
    expect(r.code, r.stderr).toBe(EXIT_OK);
    expect(r.stderr.match(/^element +cmds +by kind/gm)).toHaveLength(2);
    expect(r.stderr).toMatch(/^c +\d+ /m);
    expect(r.stderr).toMatch(/^other +\d+ /m);
    expect((await run([at('in'), '-o', at('out2'), '--table', '-q'])).stderr).not.toMatch(/element +cmds/);
  });

  it('the summary line counts the same commands as the table and the report (samples/bracket.svg keeps two circles)', async () => {
    const r = await run([BRACKET_PATH, '-o', at('o.svg'), '--table', '--report', at('r.json')]);
    expect(r.code).toBe(EXIT_OK);
    const report = JSON.parse(readFileSync(at('r.json'), 'utf8'));
    const total = report.totals.commandsBefore;
    const summary = /: (\d+) of (\d+) commands → (\d+) segments/.exec(r.stderr)!;
    const table = /total: .*; (\d+) commands → (\d+) arcs \+ (\d+) lines/.exec(r.stderr)!;
    expect(Number(summary[2])).toBe(total);
    expect(Number(table[1])).toBe(total);
    expect(Number(summary[3])).toBe(Number(table[2]) + Number(table[3]));
    // The part replaced: the commands of the rewritten elements.
    let replaced = 0;
    for (const e of report.elements) if (!e.kept) for (const k in e.commandsBefore) replaced += e.commandsBefore[k];
    expect(Number(summary[1])).toBe(replaced);
    expect(replaced).toBeLessThan(total);
  });
});

describe('options this run does not use are named, not ignored silently', () => {
  it('plan options without --plan, machine options with SVG output, --no-backup without --in-place: one warning each', async () => {
    writeFileSync(join(dir, 'a.svg'), SMALL);
    const r = await run([join(dir, 'a.svg'), '-o', join(dir, 'b.svg'), '--holes-first', '--join-distance', '1mm', '--profile', 'pen-z', '--no-backup', '-q']);
    expect(r.code).toBe(EXIT_OK);
    expect(r.stderr).toContain('arcspline: warning: --holes-first, --join-distance act only with --plan, which is not given: ignored');
    expect(r.stderr).toContain('arcspline: warning: --profile acts only on G-code or DXF output');
    expect(r.stderr).toContain('arcspline: warning: --no-backup acts only with --in-place: ignored');
    const used = await run([join(dir, 'a.svg'), '-o', join(dir, 'c.gcode'), '--plan', '--holes-first', '--profile', 'pen-z', '-q']);
    expect(used.stderr).not.toContain('warning: --');
  });
});
