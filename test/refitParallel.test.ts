import { beforeAll, describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { refitSvg } from '../src/refit.js';
import { bigDrawing } from '../bench/bigfile.js';

const root = fileURLToPath(new URL('..', import.meta.url));

describe('refitting on several threads', () => {
  beforeAll(() => {
    // Worker threads run the compiled library, built once for the run by test/globalSetup.ts.
    expect(existsSync(`${root}/dist/src/refitParallel.js`)).toBe(true);
  });

  it('gives exactly the text and report of the one-thread run (worker threads really used)', async () => {
    const built = `${root}/dist/src/refitParallel.js`;
    expect(existsSync(`${root}/dist/src/refitWorker.js`)).toBe(true);
    const { refitSvgParallel, parallelMinChars } = (await import(built)) as typeof import('../src/refitParallel.js');
    const { refitSvg: builtRefit } = (await import(`${root}/dist/src/refit.js`)) as typeof import('../src/refit.js');
    const text = bigDrawing(40, 2500); // about 1.9 MB: threads are forced below (by default they start at 32 MiB)
    expect(text.length).toBeLessThan(parallelMinChars(2));
    expect(parallelMinChars(1)).toBe(Infinity);
    const one = builtRefit(text, { tolerance: 0.05 });
    // And the sources agree with the build on the figures that matter.
    expect(refitSvg(text, { tolerance: 0.05 }).text).toBe(one.text);
    const two = await refitSvgParallel(text, { tolerance: 0.05 }, null, 2, 0);
    expect(two.text).toBe(one.text);
    const strip = (r: typeof one.report): unknown => ({ ...r, timeMs: 0 });
    expect(strip(two.report)).toEqual(strip(one.report));
  }, 120_000);
});
