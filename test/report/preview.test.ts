/**
 * Preview pictures: the PNG decodes (sharp, npm), has the frame's size, and
 * shows the result's arcs and lines in their own colours where the bundled
 * sample has them, with the original visible next to the result in the zoom.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { afterAll, describe, expect, it } from 'vitest';
import { refitSvg } from '../../src/refit.js';
import { buildPreviewSvg, mmToPx, niceLength, PREVIEW_COLORS, renderPreview, type PreviewFrame } from '../../src/report/preview.js';
import { writePreview } from '../../src/cli/previewCommand.js';

const original = readFileSync(new URL('../../samples/bracket.svg', import.meta.url), 'utf8');
const refit = refitSvg(original, {}, 'bracket.svg');

interface Pixels { width: number; height: number; data: Buffer }
async function decode(png: Uint8Array): Promise<Pixels> {
  const { data, info } = await sharp(png).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  return { width: info.width, height: info.height, data };
}
const rgb = (hex: string): [number, number, number] => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)) as [number, number, number];

/** Whether a pixel within `radius` px of (x, y) is within `tol` (per channel) of the colour. */
function hasColour(p: Pixels, x: number, y: number, hex: string, radius = 2, tol = 40): boolean {
  const [r, g, b] = rgb(hex);
  for (let j = Math.floor(y - radius); j <= Math.ceil(y + radius); j++) {
    for (let i = Math.floor(x - radius); i <= Math.ceil(x + radius); i++) {
      if (i < 0 || j < 0 || i >= p.width || j >= p.height) continue;
      const k = 3 * (j * p.width + i);
      if (Math.abs(p.data[k] - r) <= tol && Math.abs(p.data[k + 1] - g) <= tol && Math.abs(p.data[k + 2] - b) <= tol) return true;
    }
  }
  return false;
}

/** Pixels of a colour in a rectangle (px). */
function countColour(p: Pixels, x0: number, y0: number, w: number, h: number, hex: string, tol = 40): number {
  const [r, g, b] = rgb(hex);
  let n = 0;
  for (let j = y0; j < y0 + h; j++) for (let i = x0; i < x0 + w; i++) {
    const k = 3 * (j * p.width + i);
    if (Math.abs(p.data[k] - r) <= tol && Math.abs(p.data[k + 1] - g) <= tol && Math.abs(p.data[k + 2] - b) <= tol) n++;
  }
  return n;
}

describe('renderPreview', () => {
  it('is a PNG of the frame size with arcs and lines in their colours where the sample has them', async () => {
    const { frame } = buildPreviewSvg(original, refit.text, { report: refit.report });
    const png = await renderPreview(original, refit.text, { report: refit.report });
    const meta = await sharp(png).metadata();
    expect(meta.format).toBe('png');
    expect([meta.width, meta.height]).toEqual([frame.width, frame.height]);
    // The sample is 120 × 80 mm with geometry from 5 to 115 mm: drawing ≈ (110 + margins) · 8 px/mm.
    expect(frame.pxPerMm).toBe(8);
    expect(frame.drawW).toBeGreaterThan(110 * 8);
    const px = await decode(png);
    const at = (f: PreviewFrame, x: number, y: number) => mmToPx(f, x, y);
    // The outline's rounded corner: centre (13, 13), r = 8, in the sample's mm (viewBox = mm); halfway round.
    const s = Math.SQRT1_2 * 8;
    const corner = at(frame, 13 - s, 13 - s);
    expect(hasColour(px, ...corner, PREVIEW_COLORS.arc)).toBe(true);
    expect(hasColour(px, ...corner, PREVIEW_COLORS.line)).toBe(false);
    // The top edge y = 5 is straight, as are the slot's long sides (y = 40).
    for (const [x, y] of [[60, 5], [40, 40], [5, 40]]) {
      const p = at(frame, x, y);
      expect(hasColour(px, ...p, PREVIEW_COLORS.line), `line at ${x},${y}`).toBe(true);
      expect(hasColour(px, ...p, PREVIEW_COLORS.arc), `no arc at ${x},${y}`).toBe(false);
    }
    // The hole circles are kept as written (the report says so): drawn dashed in the kept colour, not as arcs.
    expect(refit.report.elements.find((e) => e.id === 'hole-left')!.kept).toBe(true);
    expect(hasColour(px, ...at(frame, 20, 17.5), PREVIEW_COLORS.kept, 5)).toBe(true);
    expect(hasColour(px, ...at(frame, 20, 17.5), PREVIEW_COLORS.arc, 5)).toBe(false);
    // Empty paper has neither.
    expect(hasColour(px, ...at(frame, 60, 65), PREVIEW_COLORS.arc, 3)).toBe(false);
    // The worst spot is ringed.
    const w = refit.report.elements.filter((e) => !e.kept).sort((a, b) => b.deviation!.max - a.deviation!.max)[0].deviation!;
    const [wx, wy] = at(frame, w.worstMm[0], w.worstMm[1]);
    expect(hasColour(px, wx + 7, wy, PREVIEW_COLORS.worst, 1.5) || hasColour(px, wx - 7, wy, PREVIEW_COLORS.worst, 1.5)).toBe(true);
  });

  it('the inset zooms into the worst spot: original and result both visible and apart', async () => {
    const b = buildPreviewSvg(original, refit.text, { report: refit.report });
    const inset = b.frame.inset!;
    expect(inset).not.toBeNull();
    expect(inset.windowMm).toBeCloseTo(10 * refit.report.totals.maxDeviation, 9);
    const px = await decode(await renderPreview(original, refit.text, { report: refit.report }));
    const x0 = Math.ceil(inset.x) + 2, y0 = Math.ceil(inset.y) + 2, n = Math.floor(inset.size) - 4;
    expect(countColour(px, x0, y0, n, n, PREVIEW_COLORS.original, 12)).toBeGreaterThan(50);
    expect(countColour(px, x0, y0, n, n, PREVIEW_COLORS.arc, 30)).toBeGreaterThan(50);
  });

  it('without a report it measures the worst spots itself; without zoom there is no inset', async () => {
    const b = buildPreviewSvg(original, refit.text, { zoomWorst: false });
    expect(b.frame.inset).toBeNull();
    expect(b.frame.width).toBe(b.frame.drawW);
    expect(b.worst[0].deviation).toBeCloseTo(refit.report.totals.maxDeviation, 9);
    const meta = await sharp(await renderPreview(original, refit.text, { zoomWorst: false, pxPerMm: 4 })).metadata();
    const f4 = buildPreviewSvg(original, refit.text, { zoomWorst: false, pxPerMm: 4 }).frame;
    expect([meta.width, meta.height]).toEqual([f4.width, f4.height]);
    expect(f4.drawW).toBeLessThan(b.frame.drawW / 2 + 2);
  });

  it('keeps huge drawings at most 4000 px wide, and draws Bézier results in their own colour', async () => {
    const page = (d: string): string => `<svg xmlns="http://www.w3.org/2000/svg" width="2000mm" height="100mm" viewBox="0 0 2000 100"><path d="${d}"/></svg>`;
    const svg = page('M0 50C500 0 1500 100 2000 50'), other = page('M0 50C500 0 1500 100 2000 50.5');
    const b = buildPreviewSvg(svg, other, { zoomWorst: false });
    expect(b.frame.drawW).toBeLessThanOrEqual(4000);
    const px = await decode(await renderPreview(svg, other, { zoomWorst: false }));
    expect(hasColour(px, ...mmToPx(b.frame, 0, 50), PREVIEW_COLORS.curve, 3)).toBe(true);
    // Against itself every element is unchanged: drawn as kept, not as a Bézier result.
    const same = await decode(await renderPreview(svg, svg, { zoomWorst: false }));
    expect(hasColour(same, ...mmToPx(b.frame, 0, 50), PREVIEW_COLORS.kept, 6)).toBe(true);
    expect(hasColour(same, ...mmToPx(b.frame, 0, 50), PREVIEW_COLORS.curve, 6)).toBe(false);
  });

  it('a small drawing: labels, caption and legend lie inside the image; kept elements are dashed and named in the legend', async () => {
    // Our own scenario: an 8 mm part, a traced circle (polygon, refitted) around a drilled hole (circle, kept as written).
    const pts: string[] = [];
    for (let i = 0; i < 90; i++) pts.push(`${(4 + 3 * Math.cos((i * Math.PI) / 45)).toFixed(4)},${(4 + 3 * Math.sin((i * Math.PI) / 45)).toFixed(4)}`);
    const small = `<svg xmlns="http://www.w3.org/2000/svg" width="8mm" height="8mm" viewBox="0 0 8 8"><polygon id="ring" points="${pts.join(' ')}"/><circle id="hole" cx="4" cy="4" r="1"/></svg>`;
    const r = refitSvg(small, { tolerance: 0.05 }, 'small.svg');
    expect(r.report.elements.map((e) => [e.id, e.kept])).toEqual([['ring', false], ['hole', true]]);
    const b = buildPreviewSvg(small, r.text, { report: r.report });
    expect(b.svg).toContain('>kept as it was<');
    const png = await renderPreview(small, r.text, { report: r.report });
    const meta = await sharp(png).metadata();
    expect([meta.width, meta.height]).toEqual([b.frame.width, b.frame.height]);
    // The drawing is far narrower than the legend: the canvas grew instead of cutting it.
    expect(b.frame.drawW).toBeLessThan(100);
    expect(b.frame.width).toBeGreaterThan(b.frame.inset!.x + b.frame.inset!.size);
    const px = await decode(png);
    // Nothing is drawn in the outermost 4 columns: no text runs off the right edge.
    expect(countColour(px, px.width - 4, 0, 4, px.height, PREVIEW_COLORS.background, 8)).toBe(4 * px.height);
    // The legend band holds the kept swatch and, as its last entry, the worst-deviation ring.
    const band = b.frame.height - 44;
    expect(countColour(px, 0, band, px.width, 44, PREVIEW_COLORS.kept, 40)).toBeGreaterThan(10);
    expect(countColour(px, 0, band, px.width, 44, PREVIEW_COLORS.worst, 40)).toBeGreaterThan(10);
    expect(countColour(px, 0, band, px.width, 44, PREVIEW_COLORS.text, 60)).toBeGreaterThan(200);
    // The kept hole is dashed in the kept colour; the refitted ring is drawn as arcs.
    expect(hasColour(px, ...mmToPx(b.frame, 4, 3), PREVIEW_COLORS.kept, 4)).toBe(true);
    expect(hasColour(px, ...mmToPx(b.frame, 4, 1), PREVIEW_COLORS.arc, 4)).toBe(true);
  });

  it('niceLength picks 1, 2 or 5 × 10^k', () => {
    expect([niceLength(23), niceLength(0.7), niceLength(4.9), niceLength(5)]).toEqual([20, 0.5, 2, 5]);
  });
});

describe('writePreview', () => {
  const dir = mkdtempSync(join(tmpdir(), 'arcspline-preview-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  it('writes a PNG file, and names the file when it cannot', async () => {
    const file = join(dir, 'bracket.png');
    const n = await writePreview(original, refit.text, file, { report: refit.report });
    const meta = await sharp(file).metadata();
    expect(meta.format).toBe('png');
    expect(readFileSync(file).length).toBe(n);
    await expect(writePreview(original, refit.text, join(dir, 'no', 'such', 'dir.png'))).rejects.toThrow(/dir\.png.*no such file/);
  });
});
