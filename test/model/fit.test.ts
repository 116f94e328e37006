/**
 * Per-contour choice in the pipeline (issue 10): each contour of an element is
 * the cheapest of its spline, straight moves and its own source pieces; a
 * contour kept as written does not stop the rest of its element from being
 * refitted, and an element whose contours all keep their source is left as
 * written byte for byte. Drawings are our own test data; deviations measured
 * by the pipeline's independent check (src/measure/).
 */
import { describe, expect, it } from 'vitest';
import { refitSvg } from '../../src/refit.js';

const page = (d: string): string =>
  `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100"><path id="p" d="${d}"/></svg>`;

/** A polygon of n vertices on a circle, as path data. */
function polygon(cx: number, cy: number, r: number, n: number): string {
  const pts: string[] = [];
  for (let i = 0; i < n; i++) pts.push(`${(cx + r * Math.cos((2 * Math.PI * i) / n)).toFixed(4)} ${(cy + r * Math.sin((2 * Math.PI * i) / n)).toFixed(4)}`);
  return `M${pts.join(' L')}Z`;
}

describe('per-contour choice', () => {
  it('a square keeps its 4 lines as written while the sampled circle beside it becomes 2 arcs', () => {
    const square = 'M10 10 L30 10 L30 30 L10 30 Z';
    const res = refitSvg(page(`${square} ${polygon(60, 60, 20, 720)}`), { tolerance: 0.05 });
    const e = res.report.elements[0];
    expect(e.status).toBe('refitted');
    expect(e.segmentsAfter).toEqual({ arcs: 2, lines: 4 });
    // The square is written as it was (absolute, the same numbers).
    expect(res.text).toContain('M10 10');
    expect(e.deviation!.max).toBeLessThanOrEqual(0.05);
  });

  it('an element of lines and arcs no refit shortens is left as written, so a second run changes nothing', () => {
    const input = page('M10 10 H40 A5 5 0 0 1 45 15 V40 A5 5 0 0 1 40 45 H10 Z');
    const once = refitSvg(input, { tolerance: 0.05 });
    expect(once.report.elements[0].reason).toBe('no-shorter');
    expect(once.text).toBe(input);
  });

  it('repeated refits never add pieces and settle on the same bytes', () => {
    const input = page(`${polygon(30, 30, 15, 500)} ${polygon(70, 70, 20, 720)}`);
    const pieces = (r: ReturnType<typeof refitSvg>): number => r.report.elements[0].segmentsAfter.arcs + r.report.elements[0].segmentsAfter.lines;
    const runs = [refitSvg(input, { tolerance: 0.05 })];
    for (let pass = 2; pass <= 4; pass++) runs.push(refitSvg(runs[runs.length - 1].text, { tolerance: 0.05 }));
    for (let k = 1; k < runs.length; k++) expect(pieces(runs[k])).toBeLessThanOrEqual(pieces(runs[k - 1]));
    expect(runs[3].text).toBe(runs[2].text);
  });
});

describe('Bézier elements that grow', () => {
  // A wavy open curve of 4 cubics that needs many more arcs than 4 at a fine tolerance (our own drawing).
  const wavy = page('M10 50 C20 10 30 90 40 50 S60 10 70 50 S90 90 95 50 S99 20 99 40');

  it('are reported (grows) and rewritten by default', () => {
    const r = refitSvg(wavy, { tolerance: 0.01 });
    const e = r.report.elements[0];
    expect(e.status).toBe('refitted');
    expect(e.segmentsAfter.arcs + e.segmentsAfter.lines).toBeGreaterThan(4);
    expect(e.grows).toBe(true);
    expect(r.report.warnings.join('\n')).toMatch(/1 rewritten element with Bézier curves came out with more pieces or bytes than written/);
  });

  it('are kept as written with keepGrowingCurves, reason grows', () => {
    const r = refitSvg(wavy, { tolerance: 0.01, keepGrowingCurves: true });
    expect(r.report.elements[0].reason).toBe('grows');
    expect(r.text).toBe(wavy);
  });

  it('a Bézier circle refitted into fewer pieces does not grow', () => {
    const k = 0.5523 * 20;
    const circle = page(`M70 50C70 ${50 + k} ${50 + k} 70 50 70C${50 - k} 70 30 ${50 + k} 30 50C30 ${50 - k} ${50 - k} 30 50 30C${50 + k} 30 70 ${50 - k} 70 50Z`);
    const e = refitSvg(circle, { tolerance: 0.05, keepGrowingCurves: true }).report.elements[0];
    expect(e.status).toBe('refitted');
    expect(e.grows).toBe(false);
  });
});
