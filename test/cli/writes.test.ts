/** Input errors, refused output paths and --in-place: what the CLI writes, and what it never leaves behind. */
import { describe, expect, it, beforeEach, afterEach } from 'vitest';
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync, symlinkSync } from 'node:fs';
import { join } from 'node:path';
import { EXIT_OK, EXIT_USAGE } from '../../src/cli/main.js';
import { refitSvg } from '../../src/refit.js';
import { run, scratch, SMALL } from './helpers.js';

const BRACKET_PATH = new URL('../../samples/bracket.svg', import.meta.url).pathname;

let dir = '';
let cleanup = (): void => undefined;
beforeEach(() => ({ dir, cleanup } = scratch()));
afterEach(() => cleanup());
const at = (name: string): string => join(dir, name);

describe('input errors: exit 2, one line naming the file and the reason, no output file', () => {
  it('a missing file', async () => {
    const missing = at('no-such.svg');
    const r = await run([missing, '-o', at('x.svg')]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.stderr).toBe(`arcspline: cannot read ${missing}: no such file or directory\n`);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('not an SVG: malformed XML with line:column, an HTML root (also in UTF-16), non-UTF-8 bytes', async () => {
    const cases: [string, string | Buffer, RegExp][] = [
      ['text.svg', 'just some text\nnot xml <', /text\.svg: XML error at \d+:\d+: /],
      ['broken.svg', '<svg xmlns="http://www.w3.org/2000/svg">\n  <path d="M0 0"\n</svg>', /broken\.svg: XML error at [23]:\d+: /],
      ['page.svg', '<html><body/></html>', /page\.svg: not an SVG document at 1:1: root element is <html>/],
      ['wide.svg', Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('<html/>', 'utf16le')]), /wide\.svg: not an SVG document/],
      ['latin.svg', Buffer.from([0x3c, 0x73, 0x76, 0x67, 0x20, 0xe9, 0x2f, 0x3e]), /latin\.svg: not valid UTF-8/],
    ];
    for (const [name, content, message] of cases) {
      writeFileSync(at(name), content);
      const r = await run([at(name), '-o', at('out.svg'), '--report', at('rep.json')]);
      expect(r.code, name).toBe(EXIT_USAGE);
      expect(r.stderr).toMatch(message);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(existsSync(at('out.svg'))).toBe(false);
      expect(existsSync(at('rep.json'))).toBe(false);
    }
    expect(readdirSync(dir).filter((f) => f.startsWith('.arcspline-'))).toEqual([]);
  });

  it('unknown flags and missing arguments are exit 2 in one line', async () => {
    for (const args of [[BRACKET_PATH, '--bogus'], [], [BRACKET_PATH, '-o']]) {
      const r = await run(args);
      expect(r.code, args.join(' ')).toBe(EXIT_USAGE);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(/^arcspline: /);
    }
  });
});

describe('the output never replaces the input without --in-place', () => {
  it('refuses -o naming the input, also through another spelling or a symbolic link', async () => {
    writeFileSync(at('a.svg'), SMALL);
    symlinkSync(at('a.svg'), at('link.svg'));
    for (const out of [at('a.svg'), join(dir, '.', 'sub', '..', 'a.svg'), at('link.svg')]) {
      const r = await run([at('a.svg'), '-o', out]);
      expect(r.code, out).toBe(EXIT_USAGE);
      expect(r.stderr).toMatch(/is the input file.*--in-place/);
    }
    expect(readFileSync(at('a.svg'), 'utf8')).toBe(SMALL);
  });

  it('replaces an existing output file that is not the input, keeping its permissions', async () => {
    writeFileSync(at('out.svg'), 'old', { mode: 0o640 });
    const r = await run(['-', '-o', at('out.svg')], { stdin: SMALL });
    expect(r.code).toBe(EXIT_OK);
    expect(readFileSync(at('out.svg'), 'utf8')).toBe(refitSvg(SMALL).text);
    expect(statSync(at('out.svg')).mode & 0o777).toBe(0o640);
  });

  it('writes no output when the report cannot be written (both are staged before either is renamed)', async () => {
    writeFileSync(at('out.svg'), 'previous');
    const r = await run(['-', '-o', at('out.svg'), '--report', at('no-dir/r.json')], { stdin: SMALL });
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.stderr).toBe(`arcspline: cannot write ${at('no-dir/r.json')}: no such file or directory\n`);
    expect(readFileSync(at('out.svg'), 'utf8')).toBe('previous');
    expect(readdirSync(dir)).toEqual(['out.svg']);
  });

  it('--in-place rewrites the file and keeps the original as FILE.bak', async () => {
    writeFileSync(at('a.svg'), SMALL);
    const r = await run(['--in-place', at('a.svg')]);
    expect(r.code).toBe(EXIT_OK);
    expect(readFileSync(at('a.svg'), 'utf8')).toBe(refitSvg(SMALL).text);
    expect(readFileSync(at('a.svg.bak'), 'utf8')).toBe(SMALL);
    expect(r.stdout).toBe('');
    expect(readdirSync(dir).sort()).toEqual(['a.svg', 'a.svg.bak']);
  });

  it('--in-place keeps an existing FILE.bak as it is (the original from the first rewrite); --no-backup keeps none', async () => {
    writeFileSync(at('a.svg'), SMALL);
    writeFileSync(at('a.svg.bak'), 'older backup');
    const r = await run(['--in-place', at('a.svg')]);
    expect(r.code).toBe(EXIT_OK);
    expect(readFileSync(at('a.svg'), 'utf8')).toBe(refitSvg(SMALL).text);
    expect(readFileSync(at('a.svg.bak'), 'utf8')).toBe('older backup');
    writeFileSync(at('b.svg'), SMALL);
    expect((await run(['--in-place', '--no-backup', at('b.svg')])).code).toBe(EXIT_OK);
    expect(existsSync(at('b.svg.bak'))).toBe(false);
    expect(readFileSync(at('b.svg'), 'utf8')).toBe(refitSvg(SMALL).text);
  });

  it('--in-place takes several files; one bad file is exit 2 but the others are done', async () => {
    writeFileSync(at('a.svg'), SMALL);
    writeFileSync(at('bad.svg'), 'not xml <');
    const r = await run(['--in-place', '--no-backup', at('bad.svg'), at('a.svg')]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.stderr).toMatch(/bad\.svg: XML error/);
    expect(readFileSync(at('a.svg'), 'utf8')).toBe(refitSvg(SMALL).text);
    expect(readFileSync(at('bad.svg'), 'utf8')).toBe('not xml <');
  });

  it('refuses combinations that cannot work', async () => {
    writeFileSync(at('a.svg'), SMALL);
    const cases: [string[], RegExp][] = [
      [['--in-place', at('a.svg'), '-o', at('b.svg')], /--in-place and -o/],
      [['--in-place', '-'], /--in-place needs input files/],
      [[at('a.svg'), at('a.svg'), '-o', at('b.svg')], /one file at a time/],
      [[at('a.svg'), '-o', at('b.svg'), '--report', at('a.svg')], /report .* is the input/],
      [[at('a.svg'), '-o', at('b.svg'), '--report', at('b.svg')], /both/],
    ];
    for (const [args, message] of cases) {
      const r = await run(args);
      expect(r.code, args.join(' ')).toBe(EXIT_USAGE);
      expect(r.stderr).toMatch(message);
    }
    expect(readdirSync(dir)).toEqual(['a.svg']);
  });
});


describe('standard input on a terminal', () => {
  it('is refused rather than waiting for typed SVG', async () => {
    const r = await run(['-', '-o', at('o.svg')], { stdinIsTTY: true });
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.stderr).toMatch(/standard input is a terminal/);
    expect(readdirSync(dir)).toEqual([]);
  });
});
