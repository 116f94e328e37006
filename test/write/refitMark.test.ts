/**
 * The refit mark and what it buys: a second run changes nothing, and repeated runs never take the
 * geometry further from the first original than the tolerance asked for. Bounds: the Hausdorff
 * distance is a metric, so d(A, C) ≤ d(A, B) + d(B, C) (triangle inequality, from memory of any
 * text on metric spaces); `data-*` attributes are allowed on SVG elements (SVG 2 §1.9). The
 * deviation to the first original is measured by compareSvg (src/measure), sampling both files.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { refitSvg } from '../../src/refit.js';
import { compareSvg } from '../../src/measure/compare.js';
import { MARK_ATTR, formatMark, readMark } from '../../src/write/refitMark.js';

const SAMPLES = fileURLToPath(new URL('../../samples/', import.meta.url));
const samples = [
  ...readdirSync(SAMPLES).filter((f) => f.endsWith('.svg')).map((f) => SAMPLES + f),
  ...readdirSync(SAMPLES + 'icons').filter((f) => f.endsWith('.svg')).map((f) => `${SAMPLES}icons/${f}`),
];

describe('the mark', () => {
  it('reads a positive number, nothing else', () => {
    expect(readMark({ [MARK_ATTR]: '0.1' })).toBe(0.1);
    expect(readMark({ [MARK_ATTR]: ' 0.05 ' })).toBe(0.05);
    for (const bad of ['', 'x', '-1', '0', 'Infinity']) expect(readMark({ [MARK_ATTR]: bad })).toBeNull();
    expect(readMark({})).toBeNull();
  });

  it('is written with six significant digits, rounded up (it must never understate the bound)', () => {
    expect(formatMark(0.1)).toBe('0.1');
    expect(formatMark(0.1 / 3)).toBe('0.0333334');
    expect(Number(formatMark(1 / 7))).toBeGreaterThanOrEqual(1 / 7);
  });
});

describe.each(samples)('repeated runs on %s', (file) => {
  const original = readFileSync(file, 'utf8');

  it('a second run at the same tolerance changes nothing, byte for byte', () => {
    const first = refitSvg(original, { tolerance: 0.1 });
    const second = refitSvg(first.text, { tolerance: 0.1 });
    expect(second.text).toBe(first.text);
    for (const e of second.report.elements) expect(e.status).not.toBe('refitted');
  });

  it('runs at 0.1, 0.1, 0.2 and 0.3 mm stay within 0.3 mm of the first original', () => {
    let text = original;
    for (const t of [0.1, 0.1, 0.2, 0.3]) text = refitSvg(text, { tolerance: t }).text;
    const c = compareSvg(original, text, { tolerance: 0.3 });
    expect(c.totals.withinTolerance).toBe(true);
    expect(c.totals.maxPairDeviation).toBeLessThanOrEqual(0.3);
  });
});

describe('refitMarked', () => {
  it('refits a marked element as if new', () => {
    const file = samples.find((f) => f.endsWith('coaster.svg'))!;
    const first = refitSvg(readFileSync(file, 'utf8'), { tolerance: 0.1 }).text;
    const again = refitSvg(first, { tolerance: 0.1, refitMarked: true });
    expect(again.report.elements.some((e) => e.reason === 'already-refitted')).toBe(false);
    const kept = refitSvg(first, { tolerance: 0.1 });
    expect(kept.report.elements.some((e) => e.reason === 'already-refitted')).toBe(true);
  });
});
