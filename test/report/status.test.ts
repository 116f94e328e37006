/** Outcomes as data: the status each reason implies, and the verdict read off the codes, never off a message. */
import { describe, expect, it } from 'vitest';
import { REASON_STATUS, isOverTolerance, setRefitted, setUnchanged, withinTolerance } from '../../src/report/status.js';
import type { ElementReport } from '../../src/report/types.js';

function entry(): ElementReport {
  return {
    index: 1, name: 'path', id: null, ancestors: 'svg', commandsBefore: { M: 1, C: 1 }, straightMovesNeeded: 3,
    segmentsAfter: { arcs: 1, lines: 0 }, grows: false, deviation: null, kept: true, keptReason: null, status: 'kept', reason: null,
    style: { stroke: 'none', fill: '#000000', strokeWidthMm: 0.26 }, copies: 0,
  };
}

describe('status', () => {
  it('kept before fitting, reverted after the check', () => {
    expect(REASON_STATUS['exact-shape']).toBe('kept');
    expect(REASON_STATUS['over-tolerance']).toBe('reverted');
    const e = entry();
    setUnchanged(e, 'over-tolerance', 'any wording at all');
    expect([e.status, e.reason, e.kept, e.keptReason]).toEqual(['reverted', 'over-tolerance', true, 'any wording at all']);
    setRefitted(e);
    expect([e.status, e.reason, e.kept, e.keptReason]).toEqual(['refitted', null, false, null]);
  });

  it('decides the verdict on the code, whatever the message says', () => {
    const worded = entry();
    setUnchanged(worded, 'cannot-measure', 'measured deviation sounds bad but is not the reason');
    const over = entry();
    setUnchanged(over, 'over-tolerance', 'x');
    expect(isOverTolerance(worded)).toBe(false);
    expect(withinTolerance([worded])).toBe(true);
    expect(withinTolerance([worded, over])).toBe(false);
    expect(withinTolerance([])).toBe(true);
  });
});
