import { describe, expect, it } from 'vitest';
import { ANSI, PLAIN, choosePaint, formatBytes, formatMm, problemLines, summaryLine } from '../../src/cli/summary.js';
import type { ElementReport, FileReport } from '../../src/report/types.js';

function element(over: Partial<ElementReport>): ElementReport {
  return {
    index: 3, name: 'path', id: 'outline', ancestors: 'svg > g#cut', commandsBefore: { C: 1800, M: 1 }, straightMovesNeeded: 500,
    segmentsAfter: { arcs: 40, lines: 5 }, grows: false, kept: false, keptReason: null, status: 'refitted', reason: null,
    style: { stroke: '#ff0000', fill: 'none', strokeWidthMm: 0.1 }, copies: 0,
    deviation: { max: 0.0864, originalToResult: 0.0864, resultToOriginal: 0.05, mean: 0.02, worstMm: [1, 2], worstUser: [1, 2] },
    ...over,
  };
}

function report(elements: ElementReport[], warnings: string[] = []): FileReport {
  const rewritten = elements.filter((e) => !e.kept);
  return {
    tool: 'arcspline', version: '0', file: 'bracket.svg', toleranceMm: 0.1, bytesIn: 32548, bytesOut: 2037, timeMs: 1, elements, warnings, paints: [],
    totals: {
      elements: elements.length, rewritten: rewritten.length, kept: elements.length - rewritten.length,
      commandsBefore: elements.reduce((s, e) => s + Object.values(e.commandsBefore).reduce((a, b) => a + b, 0), 0),
      segmentsAfter: { arcs: rewritten.reduce((s, e) => s + e.segmentsAfter.arcs, 0), lines: rewritten.reduce((s, e) => s + e.segmentsAfter.lines, 0) },
      maxDeviation: Math.max(0, ...rewritten.map((e) => e.deviation!.max)), withinTolerance: true,
    },
  };
}

describe('summaryLine', () => {
  it('counts the commands replaced, of the total the report and the table count (every element)', () => {
    const kept = element({ index: 5, id: null, name: 'rect', commandsBefore: { rect: 1 }, kept: true, keptReason: 'an exact shape already', status: 'kept', reason: 'exact-shape', deviation: null });
    const r = report([element({}), kept]);
    expect(r.totals.commandsBefore).toBe(1802);
    expect(summaryLine('bracket.svg', r)).toBe(
      'bracket.svg: 1801 of 1802 commands → 45 segments (40 arcs, 5 lines) in 1 of 2 elements, max deviation 0.086 mm ≤ 0.1 mm, 32.5 kB → 2.0 kB',
    );
    expect(summaryLine('b', report([element({})]))).toMatch(/^b: 1801 commands → 45 segments/);
  });

  it('adds what the path plan did when it ran', () => {
    const r = report([element({})]);
    r.plan = { travelBeforeMm: 52380, travelAfterMm: 4251, piercesBefore: 2142, piercesAfter: 2101, contoursJoined: 41, doubleLinesMm: 4347, groups: 1, timeMs: 3 };
    expect(summaryLine('b', r)).toMatch(/2\.0 kB; plan: travel 52\.4 m → 4\.25 m, 2142 → 2101 pierces, 41 joined, 4\.35 m of double lines removed$/);
    r.plan = { ...r.plan, travelBeforeMm: 180.2, travelAfterMm: 91.4, piercesAfter: 1, contoursJoined: 0, doubleLinesMm: 0 };
    expect(summaryLine('b', r)).toMatch(/; plan: travel 180 mm → 91\.4 mm, 2142 → 1 pierce$/);
  });

  it('says so when nothing was refitted or there was nothing to refit, and counts elements over the tolerance', () => {
    const over = element({ kept: true, keptReason: 'measured deviation 0.2 mm is over the tolerance', status: 'reverted', reason: 'over-tolerance', deviation: { ...element({}).deviation!, max: 0.2 } });
    expect(summaryLine('f', report([over]))).toBe('f: nothing refitted (1 element kept as written), 32.5 kB → 2.0 kB; 1 element over the tolerance kept unchanged');
    expect(summaryLine('f', report([]))).toBe('f: no paths or shapes to refit, 32.5 kB → 2.0 kB');
    expect(problemLines('f', report([over], ['odd thing\nsecond line']))).toEqual([
      'f: warning: odd thing second line',
      'f: kept unchanged: <path id="outline"> (element 3): measured deviation 0.2 mm is over the tolerance',
    ]);
  });
});

describe('formatting and colour', () => {
  it('bytes in SI units and mm to two significant digits', () => {
    expect([formatBytes(999), formatBytes(1000), formatBytes(32548), formatBytes(2_500_000)]).toEqual(['999 B', '1.0 kB', '32.5 kB', '2.5 MB']);
    expect([formatMm(0.0864), formatMm(0.1), formatMm(0.00431)]).toEqual(['0.086 mm', '0.1 mm', '0.0043 mm']);
  });

  it('colour on a terminal unless NO_COLOR is set and not empty (no-color.org, common practice)', () => {
    expect(choosePaint(true, {})).toBe(ANSI);
    expect(choosePaint(true, { NO_COLOR: '1' })).toBe(PLAIN);
    expect(choosePaint(true, { NO_COLOR: '' })).toBe(ANSI);
    expect(choosePaint(false, {})).toBe(PLAIN);
    expect(ANSI.red('x')).toBe('\x1b[31mx\x1b[39m'); // ECMA-48 SGR 31 / 39
  });
});
