import { afterEach, describe, expect, it } from 'vitest';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import sharp from 'sharp';
import { run, scratch } from './helpers.js';

const SAMPLE = new URL('../../samples/bracket.svg', import.meta.url).pathname;

describe('the proof on the command line: table, preview, measure', () => {
  let dir: { dir: string; cleanup: () => void };
  afterEach(() => dir?.cleanup());

  it('--table prints one row per element with both directions, plain when not a terminal', async () => {
    dir = scratch();
    const r = await run([SAMPLE, '-o', join(dir.dir, 'out.svg'), '--table']);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/outline\s+1876/);
    expect(r.stderr).toMatch(/o→r/);
    expect(r.stderr).not.toMatch(/\x1b\[/);
  });

  it('--preview writes a PNG (decoded by sharp) beside the refitted file', async () => {
    dir = scratch();
    const png = join(dir.dir, 'preview.png');
    const r = await run([SAMPLE, '-o', join(dir.dir, 'out.svg'), '--preview', png]);
    expect(r.code).toBe(0);
    const meta = await sharp(readFileSync(png)).metadata();
    expect(meta.format).toBe('png');
    expect(meta.width).toBeGreaterThan(100);
  });

  it('measure compares any two files: 0 within the tolerance, 1 beyond it, 2 for a missing file', async () => {
    dir = scratch();
    const out = join(dir.dir, 'out.svg');
    expect((await run([SAMPLE, '-o', out, '--tolerance', '0.1mm'])).code).toBe(0);
    const ok = await run(['measure', SAMPLE, out, '--tolerance', '0.1mm']);
    expect(ok.code).toBe(0);
    expect(ok.stdout).toMatch(/within tolerance/);
    // Moving one element by 1 mm must show as a 1 mm deviation (a line against a parallel line, common geometry).
    const moved = join(dir.dir, 'moved.svg');
    writeFileSync(moved, readFileSync(out, 'utf8').replace('<path id="slot"', '<path id="slot" transform="translate(1 0)"'));
    const far = await run(['measure', out, moved, '--tolerance', '0.1mm', '--json']);
    expect(far.code).toBe(1);
    const j = JSON.parse(far.stdout);
    const slot = j.pairs.find((p: { a: { id: string } }) => p.a.id === 'slot');
    expect(slot.deviation.max).toBeGreaterThan(0.99);
    expect(slot.deviation.max).toBeLessThan(1.01);
    const missing = await run(['measure', SAMPLE, join(dir.dir, 'nope.svg')]);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/nope\.svg/);
    expect(existsSync(join(dir.dir, 'nope.svg'))).toBe(false);
  });

  it('reads UTF-16 input and writes the result back in UTF-16', async () => {
    dir = scratch();
    const src = readFileSync(SAMPLE, 'utf8').replace('encoding="UTF-8"', 'encoding="UTF-16"');
    const inFile = join(dir.dir, 'in16.svg');
    writeFileSync(inFile, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(src, 'utf16le')]));
    const outFile = join(dir.dir, 'out16.svg');
    const r = await run([inFile, '-o', outFile]);
    expect(r.code).toBe(0);
    const bytes = readFileSync(outFile);
    expect([bytes[0], bytes[1]]).toEqual([0xff, 0xfe]);
    expect(bytes.subarray(2).toString('utf16le')).toMatch(/<path id="outline" d="M/);
  });

  it('refuses an input over --max-input before reading, naming the limit and how to raise it; the library refuses too', async () => {
    dir = scratch();
    const big = join(dir.dir, 'big.svg');
    writeFileSync(big, readFileSync(SAMPLE, 'utf8')); // 32 kB
    const r = await run([big, '-o', join(dir.dir, 'out.svg'), '--max-input', '0.01']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/more than the input limit of 0\.0 MB; raise it with --max-input/);
    expect(existsSync(join(dir.dir, 'out.svg'))).toBe(false);
    const { refitSvg } = await import('../../src/refit.js');
    expect(() => refitSvg(readFileSync(SAMPLE, 'utf8'), { maxInputBytes: 1000 })).toThrow(/input too large/);
    // measure reads with the same limit and the same flag.
    const m = await run(['measure', big, SAMPLE, '--max-input', '0.01']);
    expect(m.code).toBe(2);
    expect(m.stderr).toMatch(/big\.svg: 0\.0 MB is more than the input limit of 0\.0 MB; raise it with --max-input/);
    expect((await run(['measure', big, SAMPLE, '--max-input', '1'])).code).toBe(0);
  });
});
