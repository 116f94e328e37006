/**
 * A drawing written the way print-oriented editors write it (made by us for
 * this test): colours and widths in class rules of a `<style>` sheet inside
 * `<defs>`, shapes grouped by layer, a hidden layer, a filled logo. Cut and
 * engrave are told apart by stroke colour (common practice on lasers), so the
 * reader must give every element the colour its class sets.
 */
import { describe, expect, it } from 'vitest';
import { readSvg } from '../../../src/svg/document.js';
import { refitSvg } from '../../../src/refit.js';

/** A 40 mm circle as a dense polygon (invented data: what a tracing gives). */
function traced(cx: number, cy: number, r: number, n = 720): string {
  const pts: string[] = [];
  for (let i = 0; i < n; i++) {
    const a = (2 * Math.PI * i) / n;
    pts.push(`${(cx + r * Math.cos(a)).toFixed(3)},${(cy + r * Math.sin(a)).toFixed(3)}`);
  }
  return pts.join(' ');
}

export const PRINT_FILE = `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 300 200" width="300mm" height="200mm">
  <defs>
    <style>
      .cut{fill:none;stroke:#f00;stroke-width:.01px}
      .engrave{fill:none;stroke:#00f;stroke-miterlimit:10;stroke-width:.01px}
      .fill-dark{fill:#1a1a1a}
      .guide{display:none}
    </style>
  </defs>
  <g id="cut-layer">
    <polygon class="cut" points="${traced(60, 60, 40)}"/>
    <path class="cut" d="M150 20 C 190 20 220 50 220 90 S 190 160 150 160"/>
    <rect class="cut" x="10" y="10" width="280" height="180" rx="5"/>
  </g>
  <g id="engrave-layer">
    <path class="engrave" d="M40 150 Q 60 130 80 150 T 120 150"/>
    <polyline class="engrave" points="${traced(240, 140, 20, 360)}"/>
  </g>
  <g id="logo"><path class="fill-dark" d="M250 30 h20 v20 h-20 z"/></g>
  <g id="guides" class="guide"><path class="cut" d="M0 100 H300"/></g>
</svg>`;

describe('a print-oriented file: colours from class rules', () => {
  const doc = readSvg(PRINT_FILE, { assumedMmPerUnit: 1 });

  it('every element gets the stroke and fill its class sets; grouped by stroke colour: 3 cut, 2 engrave, 1 filled', () => {
    const groups = new Map<string, string[]>();
    for (const e of doc.elements.filter((x) => x.rewritable)) {
      const key = `${e.style.stroke} / ${e.style.fill}`;
      groups.set(key, [...(groups.get(key) ?? []), e.name]);
    }
    expect(Object.fromEntries(groups)).toEqual({
      '#ff0000 / none': ['polygon', 'path', 'rect'],
      '#0000ff / none': ['path', 'polyline'],
      'none / #1a1a1a': ['path'],
    });
  });

  it('the hairline .01px is 0.01 user units (px = user unit, SVG 2 §8.9), so 0.01 mm here: width 300mm over a viewBox 300 wide', () => {
    const cut = doc.elements[0];
    expect(cut.style.strokeWidth).toBeCloseTo(0.01, 12);
    expect(cut.style.strokeWidthMm).toBeCloseTo(0.01 * (300 / 300), 12);
  });

  it('the hidden guide layer is kept as written, with the reason', () => {
    const guide = doc.elements[doc.elements.length - 1];
    expect(guide).toMatchObject({ rewritable: false, reason: 'display: none on <g#guides>' });
  });

  it('the refit rewrites the traced cut and engrave outlines and leaves the guide alone', () => {
    const r = refitSvg(PRINT_FILE, { tolerance: 0.05 });
    expect(r.report.totals.withinTolerance).toBe(true);
    const byId = r.report.elements;
    expect(byId.filter((e) => !e.kept).map((e) => e.name)).toEqual(expect.arrayContaining(['polygon', 'polyline']));
    expect(r.text).toContain('<g id="guides" class="guide"><path class="cut" d="M0 100 H300"/></g>');
  });

  it('the report groups the drawn elements by those colours, and each element carries its paint', () => {
    const r = refitSvg(PRINT_FILE, { tolerance: 0.05 });
    expect(r.report.paints.map((g) => [g.stroke, g.fill, g.elements])).toEqual([
      ['#ff0000', 'none', 3], ['#0000ff', 'none', 2], ['none', '#1a1a1a', 1],
    ]);
    const cut = r.report.paints[0];
    expect(cut.rewritten).toBe(r.report.elements.filter((e) => e.style.stroke === '#ff0000' && e.status === 'refitted').length);
    expect(r.report.elements[0].style).toEqual({ stroke: '#ff0000', fill: 'none', strokeWidthMm: expect.closeTo(0.01, 12) });
  });
});
