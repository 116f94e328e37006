/** Expanding inputs: directory walks, glob patterns (checked against Node's own matcher), roots for mirroring. */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { mkdirSync, symlinkSync, writeFileSync } from 'node:fs';
import * as nodePath from 'node:path';
import { join } from 'node:path';
import { expandInputs, globToRegExp, isGlobPattern, splitPattern } from '../../src/cli/inputs.js';
import { scratch } from './helpers.js';

// Node's path.matchesGlob (Node 20.17+, experimental): an independent matcher to compare with.
const matchesGlob = (nodePath as unknown as { matchesGlob?: (p: string, g: string) => boolean }).matchesGlob;

describe('globToRegExp', () => {
  const paths = [
    'a.svg', 'b.SVG', 'a.txt', '.hidden.svg', 'x/a.svg', 'x/y/a.svg', 'x/y/z/b.svg', 'x/.h/a.svg', '.h/a.svg',
    'ab/c.svg', 'a/b', 'a.b.svg', 'x/ya.svg', 'x/y', 'x(1)/a+b.svg',
  ];
  const patterns = ['*.svg', '**/*.svg', 'x/*.svg', 'x/**/*.svg', 'x/**', '?b/*.svg', 'a?svg', '**', 'x/y*.svg', 'x(1)/a+b.svg', '*/*/a.svg'];

  it.runIf(matchesGlob !== undefined)('agrees with Node path.matchesGlob on every pair of path and pattern', () => {
    let checked = 0;
    for (const g of patterns) {
      const re = globToRegExp(g);
      for (const p of paths) {
        expect(re.test(p), `${p} ~ ${g}`).toBe(matchesGlob!(p, g));
        checked++;
      }
    }
    expect(checked).toBe(paths.length * patterns.length);
  });

  it('* stays within a segment, ** spans directories, ? is one character (POSIX shell globbing, common practice)', () => {
    expect(globToRegExp('*.svg').test('x/a.svg')).toBe(false);
    expect(globToRegExp('**/*.svg').test('x/y/a.svg')).toBe(true);
    expect(globToRegExp('**/*.svg').test('a.svg')).toBe(true);
    expect(globToRegExp('a?.svg').test('ab.svg')).toBe(true);
    expect(globToRegExp('a?.svg').test('abc.svg')).toBe(false);
    expect(globToRegExp('*.svg').test('.a.svg')).toBe(false);
  });

  it('splits a pattern at the first segment with a wildcard', () => {
    expect(splitPattern('in/parts/**/*.svg')).toEqual({ base: 'in/parts', rest: '**/*.svg' });
    expect(splitPattern('*.svg')).toEqual({ base: '.', rest: '*.svg' });
    expect(splitPattern('/abs/x/*.svg')).toEqual({ base: '/abs/x', rest: '*.svg' });
    expect(isGlobPattern('in/*.svg')).toBe(true);
    expect(isGlobPattern('in/a.svg')).toBe(false);
  });
});

describe('expandInputs', () => {
  let dir = '', cleanup = (): void => undefined;
  const at = (...p: string[]): string => join(dir, ...p);
  beforeEach(() => {
    ({ dir, cleanup } = scratch());
    mkdirSync(at('in', 'sub', 'deep'), { recursive: true });
    mkdirSync(at('in', '.git'));
    for (const f of ['in/a.svg', 'in/B.SVG', 'in/notes.txt', 'in/sub/c.svg', 'in/sub/deep/d.svg', 'in/sub/e.png', 'in/.git/x.svg', 'in/.hidden.svg']) {
      writeFileSync(at(...f.split('/')), `<svg xmlns="http://www.w3.org/2000/svg"/>${f}`);
    }
  });
  afterEach(() => cleanup());

  it('walks a directory recursively for *.svg (any case), skips hidden entries, counts the rest as ignored', async () => {
    const r = await expandInputs([at('in')]);
    expect(r.files.map((f) => f.rel)).toEqual(['B.SVG', 'a.svg', 'sub/c.svg', 'sub/deep/d.svg']);
    expect(r.files.every((f) => f.root === at('in'))).toBe(true);
    expect(r.files[2].path).toBe(at('in', 'sub', 'c.svg'));
    expect(r.files[0].size).toBe(`<svg xmlns="http://www.w3.org/2000/svg"/>in/B.SVG`.length);
    expect(r.ignored).toBe(2);
    expect(r.problems).toEqual([]);
  });

  it('patterns are relative to their fixed leading directories; one file reached twice is listed once', async () => {
    const r = await expandInputs([at('in', 'sub', '**', '*.svg'), at('in', 'sub', 'c.svg'), at('in', '*.txt')]);
    expect(r.files.map((f) => [f.rel, f.root])).toEqual([['c.svg', at('in', 'sub')], ['deep/d.svg', at('in', 'sub')]]);
    expect(r.ignored).toBe(1);
    const one = await expandInputs([at('in', 'sub', '*.svg')]);
    expect(one.files.map((f) => f.rel)).toEqual(['c.svg']);
  });

  it('a named file is taken whatever its name; missing inputs and empty patterns are problems, the rest go on', async () => {
    const r = await expandInputs([at('in', 'notes.txt'), at('missing.svg'), at('in', 'nothing', '*.svg'), at('in', '*.pdf'), at('in', 'a.svg')]);
    expect(r.files.map((f) => f.rel)).toEqual(['notes.txt', 'a.svg']);
    expect(r.problems).toEqual([
      `cannot read ${at('missing.svg')}: no such file or directory`,
      `pattern ${at('in', 'nothing', '*.svg')}: ${at('in', 'nothing')} is not a directory`,
      `pattern ${at('in', '*.pdf')} matches no file`,
    ]);
  });

  it('follows links to files but not to directories', async () => {
    symlinkSync(at('in', 'sub'), at('in', 'loop'));
    symlinkSync(at('in', 'a.svg'), at('in', 'link.svg'));
    const r = await expandInputs([at('in')]);
    expect(r.files.map((f) => f.rel)).toEqual(['B.SVG', 'a.svg', 'sub/c.svg', 'sub/deep/d.svg']);
    // link.svg is the same file as a.svg, so it is listed once (under the name met first).
  });
});
