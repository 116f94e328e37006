/** The terminal table: content per element, totals, colour only when asked. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { refitSvg } from '../../src/refit.js';
import { commandsText, countOf, elementLabel, formatMmValue, formatTable, keptReasonText } from '../../src/report/table.js';
import type { FileReport } from '../../src/report/types.js';
import { setUnchanged } from '../../src/report/status.js';

const report = refitSvg(readFileSync(new URL('../../samples/bracket.svg', import.meta.url), 'utf8'), {}, 'bracket.svg').report;
// ECMA-48 control sequence introducer (ESC [).
const ESC = /\x1b\[/;

function overReport(): FileReport {
  const r: FileReport = structuredClone(report);
  const e = r.elements.find((x) => x.id === 'slot')!;
  e.deviation!.max = 0.31;
  setUnchanged(e, 'over-tolerance', 'measured deviation 0.310 mm is over the tolerance');
  r.totals.withinTolerance = false;
  return r;
}

describe('formatTable', () => {
  it('plain mode: no escape codes, one row per element plus header, title and totals', () => {
    const s = formatTable(report, { color: false });
    expect(s).not.toMatch(ESC);
    const lines = s.trimEnd().split('\n');
    const kept = new Set(report.elements.filter((e) => e.kept).map((e) => e.keptReason)).size;
    expect(lines.length).toBe(report.elements.length + 5 + kept);
    expect(lines[0]).toContain('bracket.svg');
    expect(lines[1]).toMatch(/element\s+cmds/);
    // Each element appears by id, in order.
    report.elements.forEach((e, i) => expect(lines[i + 2].startsWith(elementLabel(e))).toBe(true));
    expect(lines.at(-2)).toContain(`${report.totals.rewritten} rewritten`);
    expect(lines.at(-1)).toContain('within tolerance');
  });

  it('shows the figures of a rewritten element and the reason of a kept one', () => {
    const s = formatTable(report, { color: false, width: 200 });
    const outline = report.elements.find((e) => e.id === 'outline')!;
    const row = s.split('\n').find((l) => l.startsWith('outline '))!;
    const cells = row.split(/\s{2,}/);
    expect(cells[1]).toBe(String(1876));
    expect(cells[2]).toBe('L1874 M1 Z1');
    expect(cells[3]).toBe(String(outline.straightMovesNeeded));
    expect(cells[4]).toBe(String(outline.segmentsAfter.arcs));
    expect(cells[5]).toBe(String(outline.segmentsAfter.lines));
    expect(cells[6]).toBe(formatMmValue(outline.deviation!.max));
    expect(cells[7]).toBe(formatMmValue(outline.deviation!.originalToResult));
    expect(cells[8]).toBe(formatMmValue(outline.deviation!.resultToOriginal));
    expect(cells[9]).toBe('refit');
    const hole = s.split('\n').find((l) => l.startsWith('hole-left '))!;
    expect(hole.split(/\s{2,}/)[9]).toBe('kept');
    expect(s).toContain('kept: an exact shape already: hole-left, hole-right');
    expect(s).not.toMatch(/kept.*kept/);
  });

  it('fits the width by shortening the last column', () => {
    const r = overReport();
    const wide = formatTable(r, { color: false, width: 300 });
    expect(wide).toContain('measured deviation 0.310 mm is over the tolerance');
    const narrow = formatTable(r, { color: false, width: 80 });
    for (const l of narrow.trimEnd().split("\n")) expect(l.length, l).toBeLessThanOrEqual(80);
    expect(narrow).toContain('…');
    // The row of every element keeps its figures.
    expect(narrow).toMatch(/\n\S+\s+8\s.*0\.31\s.*kept/);
  });

  it('colour mode: escape codes present, and the same text once they are removed', () => {
    const r = overReport();
    const c = formatTable(r, { color: true, width: 120 });
    expect(c).toMatch(ESC);
    // Red (SGR 31) marks the element over the tolerance and the verdict.
    const slot = c.split('\n').find((l) => l.startsWith('slot '))!;
    expect(slot).toContain('\x1b[31m');
    expect(c.trimEnd().split('\n').at(-1)).toContain('\x1b[31mNOT within tolerance');
    expect(c).toContain('\x1b[31mkept: measured deviation 0.310 mm is over the tolerance: \x1b[39mslot');
    // eslint-disable-next-line no-control-regex
    expect(c.replace(/\x1b\[\d+m/g, '')).toBe(formatTable(r, { color: false, width: 120 }));
  });

  it('counts of one are singular, and a kept line says "kept" once', () => {
    const one: FileReport = structuredClone(report);
    const e = one.elements.find((x) => x.id === 'hole-left')!;
    one.elements = [e];
    one.totals = { ...one.totals, elements: 1, rewritten: 0, kept: 1, commandsBefore: 1, segmentsAfter: { arcs: 1, lines: 1 } };
    const s = formatTable(one, { color: false, width: 200 });
    expect(s).toContain('total: 1 element, 0 rewritten, 1 kept; 1 command → 1 arc + 1 line');
    expect(s).not.toMatch(/\b1 (elements|commands|arcs|lines)\b/);
    for (const reason of ['exact shape (kept as written)', 'kept as written: exact shape', 'exact shape']) {
      e.keptReason = reason;
      const t = formatTable(one, { color: false, width: 200 });
      expect(t).toContain('kept: exact shape: hole-left');
      expect(t).not.toMatch(/kept.*kept/);
    }
    expect(formatTable(report, { color: false })).toMatch(/total: \d+ elements, /);
  });

  it('helpers', () => {
    expect(countOf(0, 'pair')).toBe('0 pairs');
    expect(countOf(1, 'pair')).toBe('1 pair');
    expect(countOf(2, 'arc')).toBe('2 arcs');
    expect(keptReasonText(null)).toBe('unchanged');
    expect(keptReasonText('exact shape (kept as written)')).toBe('exact shape');
    expect(keptReasonText('measured deviation 0.310 mm is over the tolerance')).toBe('measured deviation 0.310 mm is over the tolerance');
    expect(elementLabel({ id: null, name: 'polygon', index: 9 })).toBe('polygon#9');
    expect(elementLabel({ id: 'leaf', name: 'polygon', index: 9 })).toBe('leaf');
    expect(commandsText({ M: 1, C: 4, L: 2, Z: 1 })).toBe('C4 L2 M1 Z1');
    expect(commandsText({ circle: 1 })).toBe('circle');
    expect(formatMmValue(0.082294)).toBe('0.0823');
    expect(formatMmValue(0)).toBe('0');
    expect(formatMmValue(3e-6)).toBe('3.0e-6');
    expect(formatMmValue(12345.6)).toBe('12346');
  });
});
