/**
 * The one file job (src/cli/fileJob.ts): the single run, the in-process batch
 * and the batch on worker threads write a file back in the form it came in:
 * UTF-16 (either byte order, with its byte-order mark) stays UTF-16 with a
 * declaration that is still true, and gzip (`.svgz`) stays gzip.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gunzipSync, gzipSync } from 'node:zlib';
import { SaxesParser } from 'saxes';
import { EXIT_OK, EXIT_USAGE } from '../../src/cli/exitCodes.js';
import { outputForm } from '../../src/cli/fileJob.js';
import { refitSvg } from '../../src/refit.js';
import { run, scratch, SMALL } from './helpers.js';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const BIN = join(ROOT, 'bin', 'arcspline.js');

let dir = '', cleanup = (): void => undefined;
const at = (...p: string[]): string => join(dir, ...p);
beforeEach(() => ({ dir, cleanup } = scratch()));
afterEach(() => cleanup());

/** A UTF-16 document with its byte-order mark and a declaration naming UTF-16 (our own test data). */
const WIDE = `\ufeff<?xml version="1.0" encoding="UTF-16"?>\n${SMALL}`;

/** UTF-16 bytes in either byte order; the BOM is the text's first character, U+FEFF (Unicode §23.8, XML 1.0 §4.3.3). */
function utf16(text: string, order: 'le' | 'be'): Buffer {
  const b = Buffer.from(text, 'utf16le');
  return order === 'be' ? b.swap16() : b;
}

/**
 * Check output bytes against the expected text the way a reader outside the
 * project would: the byte-order mark says the order (FF FE little, FE FF big
 * endian: Unicode §23.8), WHATWG TextDecoder (Node's, fatal on bad bytes)
 * decodes them, the declaration still names UTF-16 (XML 1.0 §4.3.3), and
 * saxes, a general-purpose XML parser, reads the text without error.
 */
function expectUtf16(bytes: Buffer, order: 'le' | 'be', expected: string): void {
  expect([...bytes.subarray(0, 2)]).toEqual(order === 'le' ? [0xff, 0xfe] : [0xfe, 0xff]);
  const text = new TextDecoder(order === 'le' ? 'utf-16le' : 'utf-16be', { fatal: true, ignoreBOM: true }).decode(bytes);
  expect(text).toBe(expected);
  expect(text).toMatch(/^\ufeff<\?xml version="1\.0" encoding="UTF-16"\?>/);
  let errors = 0;
  const p = new SaxesParser({ xmlns: true });
  p.on('error', () => errors++);
  p.write(text.slice(1)).close();
  expect(errors).toBe(0);
}

const expectedWide = refitSvg(WIDE).text;

describe('UTF-16 round trip (XML 1.0 §4.3.3 and Appendix F)', () => {
  it('the expected text is a real refit that keeps the BOM and the declaration', () => {
    expect(expectedWide).not.toBe(WIDE);
    expect(expectedWide.startsWith('\ufeff<?xml version="1.0" encoding="UTF-16"?>')).toBe(true);
  });

  for (const order of ['le', 'be'] as const) {
    it(`UTF-16${order.toUpperCase()}: a single run writes UTF-16 back, to a file, to standard output and in place`, async () => {
      writeFileSync(at('w.svg'), utf16(WIDE, order));
      const r = await run([at('w.svg'), '-o', at('o.svg')]);
      expect(r.code, r.stderr).toBe(EXIT_OK);
      expectUtf16(readFileSync(at('o.svg')), order, expectedWide);
      const s = await run(['-'], { stdin: utf16(WIDE, order) });
      expectUtf16(s.stdoutBytes, order, expectedWide);
      expect((await run(['--in-place', at('w.svg')])).code).toBe(EXIT_OK);
      expectUtf16(readFileSync(at('w.svg')), order, expectedWide);
      expect(readFileSync(at('w.svg.bak')).equals(utf16(WIDE, order))).toBe(true);
    });

    it(`UTF-16${order.toUpperCase()}: a batch (in-process) writes UTF-16 back, with -o DIR and in place`, async () => {
      mkdirSync(at('in'));
      writeFileSync(at('in', 'a.svg'), utf16(WIDE, order));
      writeFileSync(at('in', 'b.svg'), SMALL);
      const r = await run([at('in'), '-o', at('out')]);
      expect(r.code, r.stderr).toBe(EXIT_OK);
      expectUtf16(readFileSync(at('out', 'a.svg')), order, expectedWide);
      expect(readFileSync(at('out', 'b.svg'), 'utf8')).toBe(refitSvg(SMALL).text);
      expect((await run(['--in-place', at('in')])).code).toBe(EXIT_OK);
      expectUtf16(readFileSync(at('in', 'a.svg')), order, expectedWide);
    });
  }

  it('a batch on worker threads (the built command, --jobs 2) writes both byte orders back as UTF-16', () => {
    mkdirSync(at('in'));
    writeFileSync(at('in', 'le.svg'), utf16(WIDE, 'le'));
    writeFileSync(at('in', 'be.svg'), utf16(WIDE, 'be'));
    const r = spawnSync(process.execPath, [BIN, at('in'), '-o', at('out'), '--jobs', '2'], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', CI: 'true' } });
    expect(r.status, r.stderr).toBe(EXIT_OK);
    expect(r.stderr).toMatch(/time +[\d.]+ s with 2 jobs/);
    expectUtf16(readFileSync(at('out', 'le.svg')), 'le', expectedWide);
    expectUtf16(readFileSync(at('out', 'be.svg')), 'be', expectedWide);
  }, 60_000);
});

describe('.svgz: gzip (RFC 1952) read and written back, checked with node:zlib', () => {
  const gz = gzipSync(Buffer.from(SMALL));
  const expected = refitSvg(SMALL).text;

  it('the output name decides: .svgz gzipped, .svg plain; standard output and in place like the input', async () => {
    writeFileSync(at('a.svgz'), gz);
    expect((await run([at('a.svgz'), '-o', at('o.svgz')])).code).toBe(EXIT_OK);
    expect(gunzipSync(readFileSync(at('o.svgz'))).toString('utf8')).toBe(expected);
    expect((await run([at('a.svgz'), '-o', at('o.svg')])).code).toBe(EXIT_OK);
    expect(readFileSync(at('o.svg'), 'utf8')).toBe(expected);
    const s = await run(['-'], { stdin: gz });
    expect(gunzipSync(s.stdoutBytes).toString('utf8')).toBe(expected);
    expect((await run(['--in-place', at('a.svgz')])).code).toBe(EXIT_OK);
    expect(gunzipSync(readFileSync(at('a.svgz'))).toString('utf8')).toBe(expected);
    expect(readFileSync(at('a.svgz.bak')).equals(gz)).toBe(true);
    expect(outputForm({ encoding: 'utf-8', gzip: false }, 'x.SVGZ').gzip).toBe(true);
    expect(outputForm({ encoding: 'utf-16le', gzip: true }, null)).toEqual({ encoding: 'utf-16le', gzip: true });
  });

  it('the summary line gives the sizes of the files read and written, gzip included (SI kB, 1 kB = 1000 B)', async () => {
    writeFileSync(at('s.svgz'), gz);
    const r = await run([at('s.svgz'), '-o', at('s.out.svgz')]);
    expect(r.code).toBe(EXIT_OK);
    const b = (n: number): string => (n < 1e3 ? `${n} B` : `${(n / 1e3).toFixed(1)} kB`);
    expect(r.stderr).toContain(`${b(gz.length)} → ${b(readFileSync(at('s.out.svgz')).length)}`);
  });

  it('a batch finds *.svgz in directories and writes them gzipped; a broken one is a named failure, not skipped', async () => {
    mkdirSync(at('in'));
    writeFileSync(at('in', 'a.svgz'), gz);
    writeFileSync(at('in', 'b.svg'), SMALL);
    writeFileSync(at('in', 'c.svgz'), Buffer.from([0x1f, 0x8b, 8, 0, 1, 2, 3]));
    const r = await run([at('in'), '-o', at('out')]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(readdirSync(at('out')).sort()).toEqual(['a.svgz', 'b.svg']);
    expect(gunzipSync(readFileSync(at('out', 'a.svgz'))).toString('utf8')).toBe(expected);
    expect(r.stderr.split('\n').filter((l) => l.includes('c.svgz'))).toEqual([`arcspline: ${at('in', 'c.svgz')}: not a readable gzip stream (unexpected end of file)`]);
    expect(r.stderr).toMatch(/files +3: 2 refitted, 0 unchanged, 1 failed/);
  });

  it('refuses gzip data that inflates past the input limit, before decoding it', async () => {
    writeFileSync(at('big.svgz'), gzipSync(Buffer.alloc(3 * 2 ** 20, 0x20)));
    const r = await run([at('big.svgz'), '-o', at('o.svg'), '--max-input', '1']);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.stderr).toBe(`arcspline: ${at('big.svgz')}: the gzip data inflates to more than the input limit of 1.0 MB; raise it with --max-input <MB> if the machine has the memory\n`);
    expect(existsSync(at('o.svg'))).toBe(false);
  });
});
