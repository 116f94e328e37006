/**
 * Preview pictures: a PNG overlay of the original (thin, neutral) and the
 * result (arcs, lines and any Bézier curves in their own colours, knots as
 * dots), the worst-deviation spots ringed and labelled in mm, a millimetre
 * scale bar and, optionally, an inset zoomed into the worst spot so that a
 * deviation of a hundredth of a millimetre is visible at all.
 *
 * We build an SVG overlay and let sharp (librsvg) render it; nothing here
 * draws pixels. sharp is native code, so it is imported only when a picture
 * is rendered: `import 'arcspline'` never loads it (test/preview.test.ts). Everything is placed in mm: each element keeps its path data
 * in its own user units under its `toMm` matrix (./previewGeometry.ts), so the
 * picture shows both documents as a machine would cut them, whatever their
 * units, viewBox or transforms.
 *
 * Image layout (px): the drawing (the geometry's box in mm plus a margin) at
 * the top left, the inset panel to its right, a legend band below (scale bar
 * and colour key). Text is laid out inside the image (./previewLayout.ts):
 * the canvas grows to hold the labels, the inset's caption and the legend, so
 * a small drawing gets a wider picture rather than cut-off text. Elements
 * written back unchanged (kept) are drawn dashed in their own colour, named
 * in the legend: from the report when there is one, else those whose element
 * is the same in both documents (same position, name and attributes). Frame choice: the geometry's box, not the root viewport,
 * since a cut file's page is often much larger than what is cut, or absent.
 */
import { readSvg, type SvgDocument } from '../svg/document.js';
import { DEFAULT_OPTIONS } from '../options.js';
import { OP_C, OP_Q } from '../svg/pathTypes.js';
import { compareSvg, geometryItems, type GeometryItem } from '../measure/compare.js';
import { addPathBounds, boxesMeet, emptyBox, keptMarkup, originalMarkup, resultMarkup, type Box, type Ink } from './previewGeometry.js';
import { esc, FONT, FONT_PX, legendRow, ringLabel, textWidth, type KeyEntry, type PlacedText } from './previewLayout.js';
import { elementLabel, formatMmValue } from './table.js';
import type { FileReport } from './types.js';

/** Options for {@link renderPreview}. */
export interface PreviewOptions {
  /** Scale of the drawing, px per mm; default 8. Lowered when the drawing would exceed 4000 px. */
  pxPerMm?: number;
  /** Add the inset zoomed into the worst spot; default true. */
  zoomWorst?: boolean;
  /** The refit's report: worst spots are taken from it; without it they are measured (compareSvg). */
  report?: FileReport;
  /** Tolerance for measuring without a report, mm; default the report's or the options default. */
  tolerance?: number;
  /** mm per user unit for files without a physical size; default CSS px. */
  assumedMmPerUnit?: number;
}

/** Our palette (colour-blind-safe pair for arcs and lines). */
export const PREVIEW_COLORS = Object.freeze({
  background: '#ffffff',
  original: '#9e9e9e',
  arc: '#00897b',
  line: '#ef6c00',
  curve: '#7b1fa2',
  knot: '#263238',
  kept: '#3949ab',
  worst: '#d81b60',
  text: '#212121',
});

/** A ringed spot: where an element's measured deviation is largest. */
export interface WorstSpot {
  /** mm, root viewport (y down). */
  x: number;
  y: number;
  /** The deviation there, mm. */
  deviation: number;
  label: string;
}

/** Where things are in the picture (px), for callers and tests. */
export interface PreviewFrame {
  /** mm at the drawing's top-left corner. */
  minX: number;
  minY: number;
  pxPerMm: number;
  /** The drawing area, px (from the image's top-left). */
  drawW: number;
  drawH: number;
  /** The whole image, px. */
  width: number;
  height: number;
  /** The zoom inset: its square in px and the window it shows (centre and side in mm); null without one. */
  inset: { x: number; y: number; size: number; cx: number; cy: number; windowMm: number } | null;
}

/** A built overlay, before rendering. */
export interface PreviewSvg {
  svg: string;
  frame: PreviewFrame;
  worst: WorstSpot[];
}

const DEFAULT_PX_PER_MM = 8;
const MAX_SIDE_PX = 4000;
const LEGEND_PX = 44;
/** Ring radius around a worst spot, px. */
const RING_PX = 7;
const GAP_PX = 12;
const WORST_SHOWN = 3;
/** The inset window is this many deviations wide, so the gap spans a tenth of it. */
const INSET_WINDOWS = 10;

const num = (v: number): string => String(+v.toPrecision(10));

/** The largest 1, 2 or 5 × 10^k not above `mm` (for scale bars). */
export function niceLength(mm: number): number {
  const p = 10 ** Math.floor(Math.log10(mm));
  const f = mm / p;
  return (f >= 5 ? 5 : f >= 2 ? 2 : 1) * p;
}

function worstSpots(original: string, result: string, opts: PreviewOptions): WorstSpot[] {
  let spots: WorstSpot[];
  if (opts.report) {
    spots = opts.report.elements
      .filter((e) => !e.kept && e.deviation !== null)
      .map((e) => ({ x: e.deviation!.worstMm[0], y: e.deviation!.worstMm[1], deviation: e.deviation!.max, label: elementLabel(e) }));
  } else {
    const tolerance = opts.tolerance ?? DEFAULT_OPTIONS.tolerance;
    const c = compareSvg(original, result, { tolerance, assumedMmPerUnit: opts.assumedMmPerUnit });
    spots = c.pairs.map((p) => ({ x: p.deviation.worstMm[0], y: p.deviation.worstMm[1], deviation: p.deviation.max, label: elementLabel(p.b) }));
  }
  return spots.sort((a, b) => b.deviation - a.deviation).slice(0, WORST_SHOWN);
}

function itemBox(it: GeometryItem): Box {
  return addPathBounds(emptyBox(), it.path, it.el.toMm);
}

/**
 * Document indices of the result's elements written back unchanged: the
 * report's kept elements, or without a report those whose element is the same
 * in both documents (same position, name and attributes).
 */
function keptIndices(a: SvgDocument, b: SvgDocument, report: FileReport | undefined): Set<number> {
  if (report) return new Set(report.elements.filter((e) => e.kept).map((e) => e.index));
  const byIndex = new Map(a.elements.map((el) => [el.index, el]));
  const out = new Set<number>();
  for (const el of b.elements) {
    const o = byIndex.get(el.index);
    if (o !== undefined && o.name === el.name && JSON.stringify(o.attrs) === JSON.stringify(el.attrs)) out.add(el.index);
  }
  return out;
}

/** The geometry of both documents drawn at `px` px/mm, only what meets `view` (mm); kept result elements dashed. */
function geometry(a: GeometryItem[], b: GeometryItem[], boxA: Box[], boxB: Box[], kept: Set<number>, view: Box, px: number, ink: Ink): string {
  const out: string[] = [];
  for (let i = 0; i < a.length; i++) if (boxesMeet(boxA[i], view)) out.push(originalMarkup(a[i].path, a[i].el.toMm, ink, px));
  for (let i = 0; i < b.length; i++) {
    if (!boxesMeet(boxB[i], view)) continue;
    out.push(kept.has(b[i].el.index) ? keptMarkup(b[i].path, b[i].el.toMm, ink, px) : resultMarkup(b[i].path, b[i].el.toMm, ink, px, true).svg);
  }
  return out.join('\n');
}

/** A ring around the spot (mm, drawn at `px` px/mm); its label is placed apart (./previewLayout.ts). */
function ring(s: WorstSpot, px: number): string {
  return `<circle cx="${num(s.x)}" cy="${num(s.y)}" r="${num(RING_PX / px)}" fill="none" stroke="${PREVIEW_COLORS.worst}" stroke-width="${num(1.5 / px)}"/>`;
}

/** A horizontal scale bar of `mm` at (x, y) px, `px` px per mm, labelled; `w` is its width with the label, px. */
function scaleBar(x: number, y: number, mm: number, px: number): { svg: string; w: number } {
  const w = mm * px;
  const c = PREVIEW_COLORS.text;
  const label = `${formatMmValue(mm)} mm`;
  const tw = textWidth(label);
  // The label is centred under the bar, but never starts left of the bar's own start.
  const tx = x + Math.max(w / 2, tw / 2);
  const svg = `<path d="M${num(x)} ${num(y - 5)}V${num(y)}H${num(x + w)}V${num(y - 5)}" fill="none" stroke="${c}" stroke-width="1.5"/>` +
    `<text x="${num(tx)}" y="${num(y + 14)}" font-size="${FONT_PX}" font-family="${FONT}" text-anchor="middle" fill="${c}">${esc(label)}</text>`;
  return { svg, w: Math.max(w, tw) };
}

/** The colour key: only the kinds this picture shows beyond the always-present arc, line, original and knot. */
function keyEntries(curves: boolean, kept: boolean, worst: boolean): KeyEntry[] {
  const c = PREVIEW_COLORS;
  const stroke = (colour: string, w: number, dash = ''): string =>
    `<path d="M0 0h18" stroke="${colour}" stroke-width="${w}"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`;
  return [
    { name: 'arc', swatch: stroke(c.arc, 2.5) },
    { name: 'line', swatch: stroke(c.line, 2.5) },
    ...(curves ? [{ name: 'Bézier', swatch: stroke(c.curve, 2.5) }] : []),
    ...(kept ? [{ name: 'kept as it was', swatch: stroke(c.kept, 2.5, '6 4') }] : []),
    { name: 'original', swatch: stroke(c.original, 1) },
    { name: 'knot', swatch: `<circle cx="9" cy="0" r="2.5" fill="${c.knot}"/>` },
    ...(worst ? [{ name: 'worst deviation', swatch: `<circle cx="9" cy="0" r="6" fill="none" stroke="${c.worst}" stroke-width="1.5"/>` }] : []),
  ];
}

/**
 * Build the overlay SVG of `result` over `original` (both whole SVG documents)
 * and its frame. See {@link renderPreview}.
 * @throws SvgInputError when either text is not a readable SVG document
 */
export function buildPreviewSvg(original: string, result: string, opts: PreviewOptions = {}): PreviewSvg {
  const read = { assumedMmPerUnit: opts.assumedMmPerUnit ?? DEFAULT_OPTIONS.assumedMmPerUnit };
  const da = readSvg(original, read), db = readSvg(result, read);
  const ia = geometryItems(da, []);
  const ib = geometryItems(db, []);
  const kept = keptIndices(da, db, opts.report);
  const boxA = ia.map(itemBox), boxB = ib.map(itemBox);
  const all = emptyBox();
  for (const b of [...boxA, ...boxB]) {
    all[0] = Math.min(all[0], b[0]); all[1] = Math.min(all[1], b[1]);
    all[2] = Math.max(all[2], b[2]); all[3] = Math.max(all[3], b[3]);
  }
  if (!(all[0] <= all[2])) all.splice(0, 4, 0, 0, 10, 10); // nothing drawn: a 10 mm empty frame
  const side = Math.max(all[2] - all[0], all[3] - all[1], 1e-3);
  const pad = Math.max(side * 0.04, 1e-3);
  const wMm = all[2] - all[0] + 2 * pad, hMm = all[3] - all[1] + 2 * pad;
  let px = opts.pxPerMm ?? DEFAULT_PX_PER_MM;
  if (!(px > 0) || !Number.isFinite(px)) throw new RangeError(`pxPerMm must be a positive number, got ${px}`);
  px = Math.min(px, MAX_SIDE_PX / Math.max(wMm, hMm));
  const drawW = Math.max(1, Math.ceil(wMm * px)), drawH = Math.max(1, Math.ceil(hMm * px));
  const minX = all[0] - pad, minY = all[1] - pad;
  const worst = worstSpots(original, result, opts);
  const ink: Ink = {
    original: PREVIEW_COLORS.original, arc: PREVIEW_COLORS.arc, line: PREVIEW_COLORS.line, curve: PREVIEW_COLORS.curve,
    knot: PREVIEW_COLORS.knot, kept: PREVIEW_COLORS.kept, originalWidth: 1, resultWidth: 2, knotRadius: 2,
  };
  // Labels of the rings, in image px: inside the drawing where they fit, else beside it (the canvas grows).
  const labels: PlacedText[] = worst.map((s) => {
    const [cx, cy] = [(s.x - minX) * px, (s.y - minY) * px];
    return ringLabel(`${formatMmValue(s.deviation)} mm`, cx, cy, RING_PX, drawW, PREVIEW_COLORS.worst);
  });
  let right = drawW, bottom = drawH;
  for (const l of labels) { right = Math.max(right, Math.ceil(l.x + l.w) + 2); bottom = Math.max(bottom, Math.ceil(l.y) + 4); }
  const top = worst[0];
  let inset: PreviewFrame['inset'] = null;
  let caption = '';
  if ((opts.zoomWorst ?? true) && top !== undefined) {
    const size = Math.max(160, Math.min(320, drawH));
    const windowMm = Math.min(Math.max(INSET_WINDOWS * top.deviation, side * 1e-6, 1e-6), Math.max(wMm, hMm));
    inset = { x: right + GAP_PX, y: 0, size, cx: top.x, cy: top.y, windowMm };
    caption = `worst: ${top.label}, ${formatMmValue(top.deviation)} mm (zoom ×${formatMmValue(size / windowMm / px)})`;
    right = Math.max(inset.x + size, inset.x + textWidth(caption) + 2);
    bottom = Math.max(bottom, size + 20);
  }
  // The legend band: scale bar, then the colour key; the canvas is at least as wide as both.
  const curves = ib.some((it) => !kept.has(it.el.index) && it.path.ops.some((op) => op === OP_C || op === OP_Q));
  const anyKept = ib.some((it) => kept.has(it.el.index));
  const base = bottom + 22;
  const bar = scaleBar(10, base, niceLength(Math.max(wMm / 5, 1e-9)), px);
  const key = legendRow(keyEntries(curves, anyKept, worst.length > 0), 10 + bar.w + 20, base - 4, PREVIEW_COLORS.text);
  const width = Math.max(right, Math.ceil(key.right) + 10);
  const height = bottom + LEGEND_PX;
  const view: Box = [minX, minY, minX + wMm, minY + hMm];
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`,
    `<rect width="${width}" height="${height}" fill="${PREVIEW_COLORS.background}"/>`,
    `<svg x="0" y="0" width="${drawW}" height="${drawH}" viewBox="${num(minX)} ${num(minY)} ${num(drawW / px)} ${num(drawH / px)}">`,
    geometry(ia, ib, boxA, boxB, kept, view, px, ink),
    ...worst.map((s) => ring(s, px)),
    '</svg>',
    ...labels.map((l) => l.svg),
  ];
  if (inset) {
    const z = inset.size / inset.windowMm;
    const h = inset.windowMm / 2;
    const win: Box = [inset.cx - h, inset.cy - h, inset.cx + h, inset.cy + h];
    const ibar = niceLength(inset.windowMm / 3);
    parts.push(
      `<svg x="${inset.x}" y="${inset.y}" width="${inset.size}" height="${inset.size}" viewBox="${num(win[0])} ${num(win[1])} ${num(inset.windowMm)} ${num(inset.windowMm)}">`,
      `<rect x="${num(win[0])}" y="${num(win[1])}" width="${num(inset.windowMm)}" height="${num(inset.windowMm)}" fill="#fafafa"/>`,
      geometry(ia, ib, boxA, boxB, kept, win, z, ink),
      // Deep in a zoom a label would need a tiny font in user units: the caption says the value instead.
      ring(top, z),
      '</svg>',
      `<rect x="${inset.x}" y="${inset.y}" width="${inset.size}" height="${inset.size}" fill="none" stroke="#bdbdbd"/>`,
      `<text x="${inset.x}" y="${inset.y + inset.size + 14}" font-size="${FONT_PX}" font-family="${FONT}" fill="${PREVIEW_COLORS.text}">${esc(caption)}</text>`,
      scaleBar(inset.x + inset.size - ibar * z - 8, inset.y + inset.size - 22, ibar, z).svg,
    );
  }
  parts.push(bar.svg, key.svg, '</svg>');
  return { svg: parts.join('\n'), frame: { minX, minY, pxPerMm: px, drawW, drawH, width, height, inset }, worst };
}

/** Where a point in mm lands in the picture, px from the top-left. */
export function mmToPx(frame: PreviewFrame, x: number, y: number): [number, number] {
  return [(x - frame.minX) * frame.pxPerMm, (y - frame.minY) * frame.pxPerMm];
}

/**
 * Render the preview PNG of `result` over `original` (see the module header).
 * @returns PNG bytes, `frame.width` × `frame.height` px
 * @throws SvgInputError when either text is not a readable SVG document
 */
export async function renderPreview(original: string, result: string, opts: PreviewOptions = {}): Promise<Uint8Array> {
  const { svg } = buildPreviewSvg(original, result, opts);
  const { default: sharp } = await import('sharp');
  // density 72: one px of the overlay's unitless size is one pixel.
  return sharp(Buffer.from(svg, 'utf8'), { density: 72, limitInputPixels: false }).png().toBuffer();
}
