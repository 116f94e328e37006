import { describe, expect, it, beforeEach, afterEach } from 'vitest';
import { existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SaxesParser } from 'saxes';
import { EXIT_INTERNAL, EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE } from '../../src/cli/main.js';
import { SAFETY_CAUTION } from '../../src/cli/help.js';
import { DEFAULT_OPTIONS } from '../../src/options.js';
import { refitSvg } from '../../src/refit.js';
import type { FileReport } from '../../src/report/types.js';
import { DEVIATION_KEYS, ELEMENT_FITTED_KEYS, ELEMENT_KEYS, FILE_REPORT_KEYS, run, scratch, SMALL, TOTALS_KEYS } from './helpers.js';

const BRACKET_PATH = new URL('../../samples/bracket.svg', import.meta.url).pathname;
const BRACKET = readFileSync(BRACKET_PATH, 'utf8');

/** Well-formedness checked by saxes, a general-purpose XML parser, independently of our reader. */
function wellFormed(xml: string): boolean {
  const p = new SaxesParser({ xmlns: true });
  let ok = true;
  p.on('error', () => (ok = false));
  p.write(xml).close();
  return ok;
}

let dir = '';
let cleanup = (): void => undefined;
beforeEach(() => ({ dir, cleanup } = scratch()));
afterEach(() => cleanup());
const at = (name: string): string => join(dir, name);

describe('the acceptance form: INPUT -o OUTPUT --tolerance 0.05mm --report REPORT', () => {
  it('writes an SVG that re-parses and a report with every field of FileReport', async () => {
    const r = await run([BRACKET_PATH, '-o', at('out.svg'), '--tolerance', '0.05mm', '--report', at('report.json')]);
    expect(r.stderr).not.toMatch(/error/i);
    expect(r.code).toBe(EXIT_OK);
    expect(r.stdout).toBe('');
    const out = readFileSync(at('out.svg'), 'utf8');
    expect(wellFormed(out)).toBe(true);
    expect(out).toMatch(/<path[^>]* d="M[^"]*A/); // arcs were written
    expect(out.length).toBeLessThan(BRACKET.length / 4);
    const report = JSON.parse(readFileSync(at('report.json'), 'utf8')) as FileReport;
    expect(Object.keys(report).sort()).toEqual([...FILE_REPORT_KEYS].sort());
    expect(Object.keys(report.totals).sort()).toEqual([...TOTALS_KEYS].sort());
    expect(report.elements.length).toBeGreaterThan(0);
    for (const e of report.elements) {
      expect(Object.keys(e).sort()).toEqual([...(e.contours ? ELEMENT_FITTED_KEYS : ELEMENT_KEYS)].sort());
      // One outcome per subpath of a fitted element; a refitted element has at least one refitted subpath.
      if (e.contours && e.status === 'refitted') expect(e.contours.some((c) => c.status === 'refitted')).toBe(true);
    }
    expect(report.elements.some((e) => e.contours !== undefined)).toBe(true);
    const measured = report.elements.find((e) => e.deviation !== null)!;
    expect(Object.keys(measured.deviation!).sort()).toEqual([...DEVIATION_KEYS].sort());
    expect(report.toleranceMm).toBe(0.05);
    expect(report.totals.maxDeviation).toBeLessThanOrEqual(0.05);
    expect(report.bytesIn).toBe(Buffer.byteLength(BRACKET));
    expect(report.bytesOut).toBe(Buffer.byteLength(out));
    expect(report.file).toBe(BRACKET_PATH);
    // Pretty JSON, two spaces.
    expect(readFileSync(at('report.json'), 'utf8').split('\n')[1]).toMatch(/^ {2}"tool": "arcspline",$/);
    // Only the two files asked for: no temporary file left beside them.
    expect(readdirSync(dir).sort()).toEqual(['out.svg', 'report.json']);
    // The input is never modified.
    expect(readFileSync(BRACKET_PATH, 'utf8')).toBe(BRACKET);
  });

  it('maps flags onto the very options object the library takes (same text as refitSvg)', async () => {
    const flags = ['--tolerance', '0.2mm', '--corner-angle', '45', '--digits', '4', '--shapes-as-paths', '--unitless-size', '1px'];
    const r = await run([BRACKET_PATH, '-o', at('out.svg'), ...flags]);
    const lib = refitSvg(BRACKET, { tolerance: 0.2, cornerAngle: 45, digits: 4, shapesAsPaths: true, assumedMmPerUnit: 25.4 / 96 });
    expect(r.code).toBe(lib.report.totals.withinTolerance ? EXIT_OK : EXIT_TOLERANCE);
    expect(readFileSync(at('out.svg'), 'utf8')).toBe(lib.text);
    expect(lib.text).not.toBe(refitSvg(BRACKET).text); // the flags did change something
  });

  it('prints one summary line: commands and segments before and after, deviation, bytes', async () => {
    const r = await run([BRACKET_PATH, '-o', at('out.svg'), '-t', '0.05']);
    const lines = r.stderr.trimEnd().split('\n');
    // One summary line; the rest, if any, the report's warnings (the sample's Bézier vein grows into 3 lines).
    expect(lines.slice(1).every((l) => /^\S*bracket\.svg: warning: /.test(l))).toBe(true);
    expect(lines[0]).toMatch(
      /^\S*bracket\.svg: \d+ (?:of \d+ )?commands → \d+ segments \(\d+ arcs, \d+ lines\) in \d+ of \d+ elements, max deviation [\d.e-]+ mm ≤ 0\.05 mm, 32\.5 kB → [\d.]+ kB$/,
    );
    // --quiet drops the summary line; warnings still go to standard error.
    expect((await run([BRACKET_PATH, '-o', at('q.svg'), '--quiet'])).stderr.split('\n').filter((l) => l && !/: warning: /.test(l))).toEqual([]);
  });
});

describe('standard input and output', () => {
  it('reads - and writes the SVG to standard output', async () => {
    const r = await run(['-', '-o', '-'], { stdin: SMALL });
    expect(r.code).toBe(EXIT_OK);
    expect(r.stdout).toBe(refitSvg(SMALL).text);
    expect(wellFormed(r.stdout)).toBe(true);
    expect(r.stderr).toMatch(/^<stdin>: /);
  });

  it('without -o writes the SVG to standard output when it is not a terminal', async () => {
    const r = await run(['-'], { stdin: SMALL });
    expect(r.code).toBe(EXIT_OK);
    expect(r.stdout).toBe(refitSvg(SMALL).text);
  });

  it('without -o refuses a terminal, but -o - prints there anyway', async () => {
    const r = await run(['-'], { stdin: SMALL, isTTY: true });
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/terminal.*-o FILE/);
    expect((await run(['-', '-o', '-'], { stdin: SMALL, isTTY: true })).code).toBe(EXIT_OK);
  });

  it('--report - writes the JSON report to standard output, the SVG to its file', async () => {
    const r = await run(['-', '-o', at('o.svg'), '--report', '-'], { stdin: SMALL });
    expect(r.code).toBe(EXIT_OK);
    const rep = JSON.parse(r.stdout) as FileReport;
    expect(rep.tool).toBe('arcspline');
    expect(rep.file).toBeNull();
    expect(existsSync(at('o.svg'))).toBe(true);
  });

  it('refuses -o - with --report -, and --report - with the SVG defaulting to standard output', async () => {
    for (const args of [['-', '-o', '-', '--report', '-'], ['-', '--report', '-']]) {
      const r = await run(args, { stdin: SMALL });
      expect(r.code).toBe(EXIT_USAGE);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(/both go to standard output/);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    }
  });

  it('keeps a byte-order mark, so an unchanged file comes back byte for byte', async () => {
    const text = '\ufeff<svg xmlns="http://www.w3.org/2000/svg" width="10mm" height="10mm"><path d="M0 0L5 5"/></svg>';
    const r = await run(['-'], { stdin: text });
    expect(r.code).toBe(EXIT_OK);
    expect(r.stdoutBytes.equals(Buffer.from(text, 'utf8'))).toBe(true);
  });
});

describe('tolerance units (CSS Values 3 §5.2 absolute lengths: 1in = 2.54cm = 25.4mm = 72pt = 96px)', () => {
  async function toleranceOf(text: string): Promise<number> {
    const r = await run(['-', '-o', at('t.svg'), '--report', '-', '--tolerance', text], { stdin: SMALL });
    expect(r.code).toBe(EXIT_OK);
    return (JSON.parse(r.stdout) as FileReport).toleranceMm;
  }
  it('0.05mm = 0.005cm = 0.001968503937in = 0.1417322835pt = 0.188976378px = 0.05 (bare number is mm)', async () => {
    for (const t of ['0.05mm', '0.005cm', '0.001968503937in', '0.1417322835pt', '0.188976378px', '0.05', '0.05MM']) {
      expect(Math.abs((await toleranceOf(t)) - 0.05), t).toBeLessThan(1e-9);
    }
    // 0.0019685in is 0.05 mm rounded to five significant inch digits: 0.04999990 mm.
    expect(Math.abs((await toleranceOf('0.0019685in')) - 0.05)).toBeLessThan(2e-7);
  });

  it('without --tolerance the library default applies (the CLI adds none)', async () => {
    const r = await run(['-', '-o', at('t.svg'), '--report', '-'], { stdin: SMALL });
    expect((JSON.parse(r.stdout) as FileReport).toleranceMm).toBe(DEFAULT_OPTIONS.tolerance);
  });

  it('a bad tolerance is exit 2 with one line naming the value, and no output', async () => {
    for (const bad of ['0.05furlong', 'abc', '-1mm', '0', '']) {
      const r = await run([BRACKET_PATH, '-o', at('x.svg'), '--tolerance', bad]);
      expect(r.code, bad).toBe(EXIT_USAGE);
      expect(r.stderr).toContain(`"${bad}"`);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).not.toMatch(/\n\s+at /);
      expect(existsSync(at('x.svg'))).toBe(false);
    }
  });

  it('other option values are checked by the library rules and named', async () => {
    for (const [flag, bad] of [['--corner-angle', '200'], ['--corner-angle', 'x'], ['--digits', '2.5'], ['--digits', '13'], ['--unitless-size', '0'], ['--unitless-size', 'big']]) {
      const r = await run([BRACKET_PATH, '-o', at('x.svg'), flag, bad]);
      expect(r.code, `${flag} ${bad}`).toBe(EXIT_USAGE);
      expect(r.stderr).toContain(flag);
      expect(r.stderr).toContain(bad);
    }
  });
});

describe('stderr: warnings and colour', () => {
  it('prints each warning of the report on its own line, prefixed by the file name', async () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100"><path d="M10 50C10 20 90 20 90 50 X 3"/></svg>';
    writeFileSync(at('w.svg'), svg);
    const r = await run([at('w.svg'), '-o', at('o.svg')]);
    const report = refitSvg(svg).report;
    expect(report.warnings.length).toBeGreaterThan(0);
    const lines = r.stderr.trimEnd().split('\n');
    expect(lines.filter((l) => l.startsWith(`${at('w.svg')}: warning: `))).toHaveLength(report.warnings.length);
    // --quiet drops the summary but not the warnings.
    const q = await run([at('w.svg'), '-o', at('o.svg'), '-q']);
    expect(q.stderr.trimEnd().split('\n')).toHaveLength(report.warnings.length);
  });

  it('colours only a terminal, and never with NO_COLOR set', async () => {
    const esc = '\x1b[';
    expect((await run(['-'], { stdin: SMALL, stderrIsTTY: true })).stderr).toContain(esc);
    expect((await run(['-'], { stdin: SMALL, stderrIsTTY: true, env: { NO_COLOR: '1' } })).stderr).not.toContain(esc);
    expect((await run(['-'], { stdin: SMALL, stderrIsTTY: false })).stderr).not.toContain(esc);
  });
});

describe('--help and --version', () => {
  it('--help prints the options with library defaults, the safety caution and the exit codes', async () => {
    const r = await run(['--help']);
    expect(r.code).toBe(EXIT_OK);
    const flat = r.stdout.replace(/\s+/g, ' ');
    expect(flat).toContain(SAFETY_CAUTION);
    expect(flat).toContain('arcspline changes geometry.');
    for (const [code, word] of [[EXIT_OK, 'every element'], [EXIT_TOLERANCE, 'the tolerance was not met'], [EXIT_USAGE, 'usage or input error'], [EXIT_INTERNAL, 'internal error']] as const) {
      expect(r.stdout).toMatch(new RegExp(`^ {2}${code} {2}${word}`, 'm'));
    }
    expect(flat).toContain(`(default: ${DEFAULT_OPTIONS.tolerance} mm)`);
    expect(flat).toContain(`(default: ${DEFAULT_OPTIONS.cornerAngle} degrees)`);
    expect(flat).toMatch(/kerf/);
    expect(flat).toContain('--tolerance 0.05mm --report');
    expect([EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE, EXIT_INTERNAL]).toEqual([0, 1, 2, 3]);
  });

  it('--version prints the package version', async () => {
    const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
    const r = await run(['--version']);
    expect(r.code).toBe(EXIT_OK);
    expect(r.stdout).toBe(`${pkg.version}\n`);
  });
});

describe('--plan from the command line', () => {
  it('writes the planned SVG, the plan in the report and a plan part in the summary line', async () => {
    const r = await run([BRACKET_PATH, '-o', at('out.svg'), '--plan', '--report', at('report.json')]);
    expect(r.code).toBe(EXIT_OK);
    const report = JSON.parse(readFileSync(at('report.json'), 'utf8')) as FileReport;
    expect(Object.keys(report).sort()).toEqual([...FILE_REPORT_KEYS, 'plan'].sort());
    // The sample's cut and engrave groups are stroke only: both are planned, travel from the origin gets shorter.
    expect(report.plan!.groups).toBe(2);
    expect(report.plan!.travelAfterMm).toBeLessThan(report.plan!.travelBeforeMm);
    expect(report.totals.withinTolerance).toBe(true);
    expect(r.stderr).toMatch(/; plan: travel \d+ mm → \d+ mm, \d+ → \d+ pierces/);
    // The same options object as the library: the written text is refitSvg's.
    expect(readFileSync(at('out.svg'), 'utf8')).toBe(refitSvg(BRACKET, { plan: true }).text);
  });
});
