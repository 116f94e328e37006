/**
 * Exit codes 1 and 3 need a library result the sample does not give reliably,
 * so here refitSvg is wrapped: the real function runs, and a test can replace
 * its result (an element over the tolerance) or make it throw (a bug).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { setUnchanged } from '../../src/report/status.js';
import type { RefitResult } from '../../src/refit.js';
import { EXIT_INTERNAL, EXIT_TOLERANCE } from '../../src/cli/exitCodes.js';
import { run, scratch, SMALL } from './helpers.js';

const hook = vi.hoisted(() => ({ after: null as null | ((r: RefitResult) => RefitResult) }));
vi.mock('../../src/refit.js', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../src/refit.js')>();
  return {
    ...real,
    refitSvg: (...a: Parameters<typeof real.refitSvg>) => {
      const r = real.refitSvg(...a);
      return hook.after ? hook.after(r) : r;
    },
  };
});


let dir = '';
let cleanup = (): void => undefined;
beforeEach(() => ({ dir, cleanup } = scratch()));
afterEach(() => {
  hook.after = null;
  cleanup();
});

/** The element kept with its original geometry because its measured deviation was over the tolerance. */
function overTolerance(r: RefitResult): RefitResult {
  const e = r.report.elements[0];
  e.deviation = { ...e.deviation!, max: 2 * r.report.toleranceMm };
  setUnchanged(e, 'over-tolerance', `measured deviation ${e.deviation.max.toPrecision(3)} mm is over the tolerance`);
  r.report.totals.withinTolerance = false;
  return r;
}

describe('exit code 1: the tolerance was not met for some element', () => {
  it('still writes the output and the report, and names the element on stderr', async () => {
    hook.after = overTolerance;
    const r = await run(['-', '-o', join(dir, 'o.svg'), '--report', join(dir, 'r.json'), '-q'], { stdin: SMALL });
    expect(r.code).toBe(EXIT_TOLERANCE);
    expect(existsSync(join(dir, 'o.svg'))).toBe(true);
    expect(JSON.parse(readFileSync(join(dir, 'r.json'), 'utf8')).totals.withinTolerance).toBe(false);
    expect(r.stderr).toBe('<stdin>: kept unchanged: <path id="c"> (element 1): measured deviation 0.200 mm is over the tolerance\n');
  });
});

describe('exit code 3: internal error', () => {
  it('prints one line without a stack, and leaves no file behind', async () => {
    hook.after = () => {
      throw new TypeError('something is not a function');
    };
    writeFileSync(join(dir, 'a.svg'), SMALL);
    const r = await run([join(dir, 'a.svg'), '-o', join(dir, 'o.svg'), '--report', join(dir, 'r.json')]);
    expect(r.code).toBe(EXIT_INTERNAL);
    expect(r.stderr).toBe('arcspline: internal error: something is not a function (run again with --debug for the stack)\n');
    expect(readdirSync(dir)).toEqual(['a.svg']);
  });

  it('prints the stack with --debug', async () => {
    hook.after = () => {
      throw new TypeError('boom');
    };
    const r = await run(['-', '-o', join(dir, 'o.svg'), '--debug'], { stdin: SMALL });
    expect(r.code).toBe(EXIT_INTERNAL);
    expect(r.stderr).toMatch(/^arcspline: internal error: boom\nTypeError: boom\n\s+at /);
  });
});
