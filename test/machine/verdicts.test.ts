/**
 * One verdict per source element from the verdicts on each of its drawings
 * (where it stands and each <use> copy): the worst decides.
 */
import { describe, expect, it } from 'vitest';
import { elementVerdicts } from '../../src/machine/verdicts.js';
import type { Deviation } from '../../src/report/types.js';

const dev = (max: number): Deviation => ({ max, rms: max / 2, worstMm: [0, 0], worstUser: [0, 0] } as unknown as Deviation);

describe('elementVerdicts', () => {
  it('the larger deviation of passing drawings, and a failing copy over a passing original', () => {
    const v = elementVerdicts([
      { index: 2, label: 'a', deviation: dev(0.02), ok: true },
      { index: 2, copy: 1, label: 'a copy 1', deviation: dev(0.05), ok: true },
      { index: 5, label: 'b', deviation: dev(0.09), ok: true },
      { index: 5, copy: 1, label: 'b copy 1', deviation: dev(0.03), ok: false },
    ]);
    expect(v.map((e) => [e.index, e.deviation!.max, e.ok, e.where])).toEqual([[2, 0.05, true, 'copy 1: '], [5, 0.03, false, 'copy 1: ']]);
  });
  it('a drawing the reader did not find outweighs a measured failure; nothing to measure never outweighs a measurement', () => {
    const v = elementVerdicts([
      { index: 1, label: 'a', deviation: dev(0.2), ok: false },
      { index: 1, copy: 1, label: 'a copy 1', deviation: null, ok: false },
      { index: 3, label: 'c', deviation: dev(0.01), ok: true },
      { index: 3, copy: 1, label: 'c copy 1', deviation: null, ok: true },
    ]);
    expect(v.map((e) => [e.index, e.deviation?.max ?? null, e.ok])).toEqual([[1, null, false], [3, 0.01, true]]);
  });
});
