/**
 * Batches in-process (TypeScript sources have no compiled worker, so files run
 * on the calling thread), then through the built binary with worker threads.
 */
import { afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { SaxesParser } from 'saxes';
import { refitSvg } from '../../src/refit.js';
import { EXIT_INTERRUPTED, EXIT_OK, EXIT_USAGE } from '../../src/cli/exitCodes.js';
import { Progress, progressWanted } from '../../src/cli/progress.js';
import { FILE_REPORT_KEYS, run, scratch } from './helpers.js';

const circle = (r: number): string => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">
<path id="c" d="M${50 + r} 50C${50 + r} ${50 + 0.5523 * r} ${50 + 0.5523 * r} ${50 + r} 50 ${50 + r}C${50 - 0.5523 * r} ${50 + r} ${50 - r} ${50 + 0.5523 * r} ${50 - r} 50C${50 - r} ${50 - 0.5523 * r} ${50 - 0.5523 * r} ${50 - r} 50 ${50 - r}C${50 + 0.5523 * r} ${50 - r} ${50 + r} ${50 - 0.5523 * r} ${50 + r} 50Z"/>
</svg>
`;
const BROKEN = '<svg xmlns="http://www.w3.org/2000/svg"><path d="M0 0L10 10"></svg>\n';
const NOT_SVG = 'hello, this is not a drawing\n';

/** Every file below `dir`, as `/`-separated relative paths, sorted. */
function tree(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string): void => {
    for (const e of readdirSync(d, { withFileTypes: true })) {
      const p = join(d, e.name);
      if (e.isDirectory()) walk(p);
      else out.push(relative(dir, p).split('\\').join('/'));
    }
  };
  if (existsSync(dir)) walk(dir);
  return out.sort();
}

function writeTree(root: string, files: Record<string, string>): void {
  for (const [rel, text] of Object.entries(files)) {
    const p = join(root, ...rel.split('/'));
    mkdirSync(join(p, '..'), { recursive: true });
    writeFileSync(p, text);
  }
}

let dir = '', cleanup = (): void => undefined;
const at = (...p: string[]): string => join(dir, ...p);
beforeEach(() => ({ dir, cleanup } = scratch()));
afterEach(() => cleanup());

const NESTED = { 'a.svg': circle(30), 'parts/b.svg': circle(20), 'parts/deep/c.svg': circle(10), 'parts/readme.txt': 'not svg', 'd.svg': circle(40) };

describe('batch in-process', () => {
  it('INPUT_DIR -o OUTPUT_DIR --tolerance 0.05mm mirrors the tree; other files are ignored and counted', async () => {
    writeTree(at('in'), NESTED);
    const r = await run([at('in'), '-o', at('out'), '--tolerance', '0.05mm']);
    expect(r.code).toBe(EXIT_OK);
    expect(tree(at('out'))).toEqual(['a.svg', 'd.svg', 'parts/b.svg', 'parts/deep/c.svg']);
    for (const f of tree(at('out'))) {
      const original = readFileSync(at('in', f), 'utf8');
      expect(readFileSync(at('out', f), 'utf8'), f).toBe(refitSvg(original, { tolerance: 0.05 }, at('in', f)).text);
    }
    expect(r.stderr).toMatch(/files +4: 4 refitted, 0 unchanged, 0 failed \(1 other file ignored\)/);
    expect(r.stderr).toMatch(/worst +0\.0\d+ mm ≤ 0\.05 mm/);
    expect(r.stdout).toBe('');
    // Inputs untouched.
    expect(readFileSync(at('in', 'a.svg'), 'utf8')).toBe(circle(30));
  });

  it('--in-place on a directory keeps FILE.bak; a second run keeps each existing backup; --no-backup keeps none', async () => {
    writeTree(at('in'), NESTED);
    const r = await run(['--in-place', at('in')]);
    expect(r.code).toBe(EXIT_OK);
    expect(tree(at('in'))).toEqual(['a.svg', 'a.svg.bak', 'd.svg', 'd.svg.bak', 'parts/b.svg', 'parts/b.svg.bak', 'parts/deep/c.svg', 'parts/deep/c.svg.bak', 'parts/readme.txt']);
    expect(readFileSync(at('in', 'parts', 'b.svg.bak'), 'utf8')).toBe(circle(20));
    expect(readFileSync(at('in', 'parts', 'b.svg'), 'utf8')).toBe(refitSvg(circle(20), {}, at('in', 'parts', 'b.svg')).text);
    // A nightly second run: every file is refitted again, every backup still holds the original of the first run.
    writeFileSync(at('in', 'a.svg'), circle(31));
    const again = await run(['--in-place', at('in')]);
    expect(again.code).toBe(EXIT_OK);
    expect(again.stderr).not.toMatch(/exists/);
    expect(readFileSync(at('in', 'a.svg'), 'utf8')).toBe(refitSvg(circle(31), {}, at('in', 'a.svg')).text);
    expect(readFileSync(at('in', 'a.svg.bak'), 'utf8')).toBe(circle(30));
    expect(readFileSync(at('in', 'parts', 'b.svg.bak'), 'utf8')).toBe(circle(20));
    writeFileSync(at('in', 'a.svg'), circle(32));
    const nb = await run(['--in-place', '--no-backup', at('in', 'a.svg'), at('in', 'd.svg')]);
    expect(nb.code).toBe(EXIT_OK);
    expect(readFileSync(at('in', 'a.svg'), 'utf8')).toBe(refitSvg(circle(32), {}, at('in', 'a.svg')).text);
    expect(readFileSync(at('in', 'a.svg.bak'), 'utf8')).toBe(circle(30)); // the first run's backup, kept
  });

  it('a broken file in the middle: one line naming it, the others written, exit 2', async () => {
    writeTree(at('in'), { 'a.svg': circle(30), 'b-broken.svg': BROKEN, 'c-text.svg': NOT_SVG, 'd.svg': circle(20) });
    const r = await run([at('in'), at('missing.svg'), '-o', at('out'), '-q']);
    expect(r.code).toBe(EXIT_USAGE);
    expect(tree(at('out'))).toEqual(['a.svg', 'd.svg']);
    const lines = r.stderr.trimEnd().split('\n');
    const naming = (name: string): string[] => lines.filter((l) => l.includes(name));
    expect(naming('b-broken.svg')).toHaveLength(1);
    expect(naming('b-broken.svg')[0]).toMatch(/^arcspline: .*b-broken\.svg: XML error/);
    expect(naming('c-text.svg')).toHaveLength(1);
    expect(naming('c-text.svg')[0]).toMatch(/^arcspline: .*c-text\.svg: /);
    expect(naming('missing.svg')).toEqual([`arcspline: cannot read ${at('missing.svg')}: no such file or directory`]);
    expect(lines).toHaveLength(3); // -q: no table, no per-file lines
  });

  it('--report-lines: one JSON line per file as it finishes, a FileReport or an error', async () => {
    writeTree(at('in'), { 'a.svg': circle(30), 'b.svg': BROKEN, 'sub/c.svg': circle(20) });
    const r = await run([at('in'), '-o', at('out'), '--report-lines', at('lines.jsonl')]);
    expect(r.code).toBe(EXIT_USAGE);
    const lines = readFileSync(at('lines.jsonl'), 'utf8').split('\n');
    expect(lines.pop()).toBe('');
    expect(lines).toHaveLength(3);
    const parsed = lines.map((l) => JSON.parse(l));
    const ok = parsed.filter((p) => !('error' in p));
    expect(ok.map((p) => p.file).sort()).toEqual([at('in', 'a.svg'), at('in', 'sub', 'c.svg')]);
    for (const p of ok) {
      expect(Object.keys(p).sort()).toEqual([...FILE_REPORT_KEYS].sort());
      const again = refitSvg(readFileSync(p.file, 'utf8'), {}, p.file).report;
      expect({ ...p, timeMs: 0 }).toEqual({ ...again, timeMs: 0 });
    }
    const bad = parsed.find((p) => 'error' in p);
    expect(bad).toMatchObject({ tool: 'arcspline', file: at('in', 'b.svg'), toleranceMm: 0.1, error: { exitCode: EXIT_USAGE } });
    expect(r.stderr).toContain(`arcspline: ${bad.error.message}\n`);
    // To standard output: nothing else goes there in a batch.
    const s = await run([at('in', 'a.svg'), at('in', 'sub', 'c.svg'), '-o', at('out2'), '--report-lines', '-']);
    expect(s.stdout.trimEnd().split('\n').map((l) => JSON.parse(l).file).sort()).toEqual([at('in', 'a.svg'), at('in', 'sub', 'c.svg')]);
  });

  it('glob patterns: quoted patterns mirror below their fixed leading directories', async () => {
    writeTree(at('in'), NESTED);
    const r = await run([at('in', 'parts', '**', '*.svg'), '-o', at('out')]);
    expect(r.code).toBe(EXIT_OK);
    expect(tree(at('out'))).toEqual(['b.svg', 'deep/c.svg']);
    const one = await run([at('in', '*.svg'), '-o', at('out1')]);
    expect(tree(at('out1'))).toEqual(['a.svg', 'd.svg']);
    const none = await run([at('in', '*.pdf'), '-o', at('out2')]);
    expect(none.code).toBe(EXIT_USAGE);
    expect(none.stderr).toContain(`pattern ${at('in', '*.pdf')} matches no file`);
  });

  it('refuses to write over its inputs, before reading any file', async () => {
    writeTree(at('in'), NESTED);
    writeTree(at('other'), { 'a.svg': circle(5) });
    const cases: [string[], RegExp][] = [
      [[at('in'), '-o', at('in')], /output .*a\.svg would overwrite the input .*a\.svg; choose an output directory outside the inputs, or give --in-place/],
      [[at('in'), at('other'), '-o', at('out')], /in.a\.svg and .*other.a\.svg would both be written to/],
      [[at('in', 'a.svg'), at('in', 'd.svg'), '-o', at('x.svg')], /looks like a file name.*one file at a time/],
      [[at('in'), '--report-lines', at('in', 'a.svg'), '-o', at('out')], /--report-lines .* is one of the batch's files/],
      [[at('in')], /needs -o DIR/],
      [[at('in'), '-o', at('out'), '--report', at('r.json')], /--report-lines FILE/],
      [[at('in'), '--in-place', '-o', at('out')], /--in-place and -o/],
    ];
    for (const [args, message] of cases) {
      const r = await run(args);
      expect(r.code, args.join(' ')).toBe(EXIT_USAGE);
      expect(r.stderr, args.join(' ')).toMatch(message);
    }
    expect(tree(dir).filter((f) => !f.startsWith('in/') && !f.startsWith('other/'))).toEqual([]);
    expect(readFileSync(at('in', 'a.svg'), 'utf8')).toBe(circle(30));
    // An output directory inside the input directory: allowed while it holds no input; then refused.
    expect((await run([at('in'), '-o', at('in', 'out')])).code).toBe(EXIT_OK);
    const second = await run([at('in'), '-o', at('in', 'out')]);
    expect(second.code).toBe(EXIT_USAGE);
    expect(second.stderr).toMatch(/input .*in.out.a\.svg is inside the output directory/);
  });
});

describe('progress', () => {
  it('is drawn only on a terminal, not under CI or with --quiet', () => {
    expect(progressWanted(true, {}, false)).toBe(true);
    expect(progressWanted(false, {}, false)).toBe(false);
    expect(progressWanted(true, { CI: 'true' }, false)).toBe(false);
    expect(progressWanted(true, { CI: 'false' }, false)).toBe(true);
    expect(progressWanted(true, {}, true)).toBe(false);
  });

  it('shows files done of total, rate, time left from bytes, and the current file; other lines go above it', () => {
    let t = 0, out = '';
    const p = new Progress({ write: (s: string) => (out += s) }, 4, 4000, { enabled: true, columns: 100, now: () => t });
    p.started('a.svg');
    t = 2000;
    p.finished(1000); // 1 file, 1000 B in 2 s: 3000 B left at 500 B/s = 6 s
    expect(p.line()).toBe('1/4 [#####---------------]  25% 0.5 files/s 500 B/s 0:06 left a.svg');
    out = '';
    p.log('arcspline: x.svg: broken');
    expect(out).toBe(`\r\x1b[2Karcspline: x.svg: broken\n\r\x1b[2K${p.line()}`);
    const quiet = new Progress({ write: (s: string) => (out += s) }, 1, 1, { enabled: false });
    out = '';
    quiet.started('a.svg');
    quiet.finished(1);
    quiet.log('line');
    expect(out).toBe('line\n');
  });
});

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const BIN = join(ROOT, 'bin', 'arcspline.js');
const BUILT = join(ROOT, 'dist', 'src', 'refitWorker.js');

describe('batch through the built binary (worker threads)', () => {
  beforeAll(() => {
    // dist/ is built once for the whole run by test/globalSetup.ts.
    if (!existsSync(BUILT)) throw new Error(`${BUILT} is missing: the global test setup builds it`);
  });

  const node = (args: string[]) => spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', CI: 'true' } });

  it('--jobs 2: same files as in-process, a broken file named once, JSON lines, exit 2', () => {
    writeTree(at('in'), { ...NESTED, 'parts/broken.svg': BROKEN });
    const r = node([at('in'), '-o', at('out'), '--tolerance', '0.05mm', '--jobs', '2', '--report-lines', at('l.jsonl')]);
    expect(r.status).toBe(EXIT_USAGE);
    expect(tree(at('out'))).toEqual(['a.svg', 'd.svg', 'parts/b.svg', 'parts/deep/c.svg']);
    for (const f of tree(at('out'))) {
      expect(readFileSync(at('out', f), 'utf8'), f).toBe(refitSvg(readFileSync(at('in', f), 'utf8'), { tolerance: 0.05 }).text);
    }
    expect(r.stderr.split('\n').filter((l) => l.includes('broken.svg'))).toHaveLength(1);
    expect(r.stderr).toMatch(/time +[\d.]+ s with 2 jobs/);
    expect(readFileSync(at('l.jsonl'), 'utf8').trimEnd().split('\n').map((l) => JSON.parse(l).file).sort())
      .toEqual(['a.svg', 'd.svg', 'parts/b.svg', 'parts/broken.svg', 'parts/deep/c.svg'].map((f) => at('in', ...f.split('/'))));
  }, 60_000);

  it('the bundled samples as a tree: every file refitted within the default tolerance, icons/ mirrored', () => {
    const samples = join(ROOT, 'samples');
    const r = node([samples, '-o', at('out'), '--jobs', '2', '--report-lines', at('l.jsonl')]);
    expect(r.status, r.stderr).toBe(EXIT_OK);
    const svgs = tree(samples).filter((f) => f.endsWith('.svg'));
    expect(svgs).toEqual(expect.arrayContaining(['bracket.svg', 'coaster.svg', 'gear.svg', 'icons/heart.svg']));
    expect(tree(at('out'))).toEqual(svgs);
    const reports = readFileSync(at('l.jsonl'), 'utf8').trimEnd().split('\n').map((l) => JSON.parse(l));
    expect(reports).toHaveLength(svgs.length);
    for (const rep of reports) {
      expect(rep.totals.withinTolerance, rep.file).toBe(true);
      // Each sample has curves to refit, and every element with geometry is rewritten (none kept by the guarantee).
      expect(rep.elements.some((e: { kept: boolean }) => !e.kept), rep.file).toBe(true);
      expect(rep.elements.filter((e: { keptReason?: string }) => /over the tolerance/.test(e.keptReason ?? '')), rep.file).toEqual([]);
    }
  }, 60_000);

  it("the built library resolves by its package name (import ... from 'arcspline')", () => {
    const code = "import('arcspline').then((m) => console.log(typeof m.refitSvg, typeof m.compareSvg, m.VERSION))";
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', code], { cwd: ROOT, encoding: 'utf8' });
    expect(r.stdout.trim()).toBe(`function function ${JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')).version}`);
  });

  it('refuses a file over the per-worker memory guard before reading it', () => {
    // 64 MB heap / 6 bytes of heap per input byte: files above about 11 MB are refused.
    writeTree(at('in'), { 'a.svg': circle(30), 'huge.svg': `<svg xmlns="http://www.w3.org/2000/svg"><!--${'x'.repeat(12_000_000)}--></svg>` });
    const r = node([at('in'), '-o', at('out'), '--worker-memory', '64', '-q']);
    expect(r.status).toBe(EXIT_USAGE);
    expect(r.stderr).toMatch(/huge\.svg: 12\.0 MB is too large for the per-worker memory limit of 64 MB .*--worker-memory/);
    expect(tree(at('out'))).toEqual(['a.svg']);
  }, 60_000);

  it('SIGINT in the middle: exit 130, finished files complete, no temporary or partial file', async () => {
    const files: Record<string, string> = {};
    // Dense polylines take long enough to interrupt (about 0.2-1 s each here).
    for (let k = 0; k < 20; k++) {
      const pts: string[] = [];
      for (let i = 0; i < 6000; i++) {
        const t = (2 * Math.PI * i) / 6000;
        const rr = 30 + 3 * Math.sin(5 * t + k);
        pts.push(`${(50 + rr * Math.cos(t)).toFixed(4)} ${(50 + rr * Math.sin(t)).toFixed(4)}`);
      }
      files[`f${k}.svg`] = `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100"><path d="M${pts.join(' L')}Z"/></svg>\n`;
    }
    writeTree(at('in'), files);
    const child = spawn(process.execPath, [BIN, at('in'), '-o', at('out'), '--jobs', '2', '--report-lines', at('l.jsonl')], { env: { ...process.env, CI: 'true' } });
    let stderr = '';
    child.stderr.on('data', (b: Buffer) => (stderr += b.toString()));
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    // Interrupt once the first file is done.
    while (!existsSync(at('l.jsonl')) || readFileSync(at('l.jsonl'), 'utf8').length === 0) await new Promise((r) => setTimeout(r, 20));
    child.kill('SIGINT');
    expect(await exited).toBe(EXIT_INTERRUPTED);
    expect(stderr).toMatch(/interrupted: \d+ of 20 files done; no partial file was left/);
    const written = tree(at('out'));
    expect(written.length).toBeGreaterThan(0);
    expect(written.length).toBeLessThan(20);
    expect(written.every((f) => /^f\d+\.svg$/.test(f))).toBe(true); // no .arcspline-*.tmp left
    for (const f of written) {
      let errors = 0;
      const p = new SaxesParser({ xmlns: true });
      p.on('error', () => errors++);
      p.write(readFileSync(at('out', f), 'utf8')).close();
      expect(errors, f).toBe(0);
    }
  }, 120_000);
});
