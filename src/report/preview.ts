/**
 * Preview pictures: a PNG overlay of the original (thin, neutral) and the
 * result (arcs, lines and any Bézier curves in their own colours, knots as
 * dots), the worst-deviation spots ringed and labelled in mm, a millimetre
 * scale bar and, optionally, an inset zoomed into the worst spot so that a
 * deviation of a hundredth of a millimetre is visible at all.
 *
 * We build an SVG overlay and let sharp (librsvg) render it; nothing here
 * draws pixels. Everything is placed in mm: each element keeps its path data
 * in its own user units under its `toMm` matrix (./previewGeometry.ts), so the
 * picture shows both documents as a machine would cut them, whatever their
 * units, viewBox or transforms.
 *
 * Image layout (px): the drawing (the geometry's box in mm plus a margin) at
 * the top left, the inset panel to its right, a legend band below (scale bar
 * and colour key). Frame choice: the geometry's box, not the root viewport,
 * since a cut file's page is often much larger than what is cut, or absent.
 */
import sharp from 'sharp';
import { readSvg } from '../svg/document.js';
import { DEFAULT_OPTIONS } from '../options.js';
import { OP_C, OP_Q } from '../svg/pathTypes.js';
import { compareSvg, geometryItems, type GeometryItem } from './compare.js';
import { addPathBounds, boxesMeet, emptyBox, originalMarkup, resultMarkup, type Box, type Ink } from './previewGeometry.js';
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
const GAP_PX = 12;
const WORST_SHOWN = 3;
/** The inset window is this many deviations wide, so the gap spans a tenth of it. */
const INSET_WINDOWS = 10;
const FONT = 'DejaVu Sans, Arial, sans-serif';

const num = (v: number): string => String(+v.toPrecision(10));
const esc = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

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

/** The geometry of both documents drawn at `px` px/mm, only what meets `view` (mm). */
function geometry(a: GeometryItem[], b: GeometryItem[], boxA: Box[], boxB: Box[], view: Box, px: number, ink: Ink): string {
  const out: string[] = [];
  for (let i = 0; i < a.length; i++) if (boxesMeet(boxA[i], view)) out.push(originalMarkup(a[i].path, a[i].el.toMm, ink, px));
  for (let i = 0; i < b.length; i++) if (boxesMeet(boxB[i], view)) out.push(resultMarkup(b[i].path, b[i].el.toMm, ink, px, true).svg);
  return out.join('\n');
}

/** A ring around the spot, with its value as a label unless `label` is false. */
function ring(s: WorstSpot, px: number, label = true): string {
  const r = 7 / px;
  const circle = `<circle cx="${num(s.x)}" cy="${num(s.y)}" r="${num(r)}" fill="none" stroke="${PREVIEW_COLORS.worst}" stroke-width="${num(1.5 / px)}"/>`;
  // Deep in a zoom the font size in user units gets so small that text renders badly: the caption says it instead.
  if (!label) return circle;
  return circle +
    `<text x="${num(s.x + 1.4 * r)}" y="${num(s.y - 1.2 * r)}" font-size="${num(11 / px)}" font-family="${FONT}" fill="${PREVIEW_COLORS.worst}">${esc(`${formatMmValue(s.deviation)} mm`)}</text>`;
}

/** A horizontal scale bar of `mm` at (x, y) px, `px` px per mm, labelled. */
function scaleBar(x: number, y: number, mm: number, px: number): string {
  const w = mm * px;
  const c = PREVIEW_COLORS.text;
  return `<path d="M${num(x)} ${num(y - 5)}V${num(y)}H${num(x + w)}V${num(y - 5)}" fill="none" stroke="${c}" stroke-width="1.5"/>` +
    `<text x="${num(x + w / 2)}" y="${num(y + 14)}" font-size="11" font-family="${FONT}" text-anchor="middle" fill="${c}">${esc(`${formatMmValue(mm)} mm`)}</text>`;
}

function legend(y: number, x0: number, curves: boolean): string {
  const c = PREVIEW_COLORS;
  const keys: [string, string][] = [['arc', c.arc], ['line', c.line], ...(curves ? [['Bézier', c.curve] as [string, string]] : []), ['original', c.original]];
  const out: string[] = [];
  let x = x0;
  for (const [name, colour] of keys) {
    const w = name === 'original' ? 1 : 2.5;
    out.push(`<path d="M${x} ${y}h18" stroke="${colour}" stroke-width="${w}"/><text x="${x + 22}" y="${y + 4}" font-size="11" font-family="${FONT}" fill="${c.text}">${esc(name)}</text>`);
    x += 30 + 7 * name.length;
  }
  out.push(`<circle cx="${x + 4}" cy="${y}" r="2.5" fill="${c.knot}"/><text x="${x + 12}" y="${y + 4}" font-size="11" font-family="${FONT}" fill="${c.text}">knot</text>`);
  x += 50;
  out.push(`<circle cx="${x + 6}" cy="${y}" r="6" fill="none" stroke="${c.worst}" stroke-width="1.5"/><text x="${x + 16}" y="${y + 4}" font-size="11" font-family="${FONT}" fill="${c.text}">worst deviation</text>`);
  return out.join('');
}

/**
 * Build the overlay SVG of `result` over `original` (both whole SVG documents)
 * and its frame. See {@link renderPreview}.
 * @throws SvgInputError when either text is not a readable SVG document
 */
export function buildPreviewSvg(original: string, result: string, opts: PreviewOptions = {}): PreviewSvg {
  const read = { assumedMmPerUnit: opts.assumedMmPerUnit ?? DEFAULT_OPTIONS.assumedMmPerUnit };
  const ia = geometryItems(readSvg(original, read), []);
  const ib = geometryItems(readSvg(result, read), []);
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
    knot: PREVIEW_COLORS.knot, originalWidth: 1, resultWidth: 2, knotRadius: 2,
  };
  const top = worst[0];
  let inset: PreviewFrame['inset'] = null;
  if ((opts.zoomWorst ?? true) && top !== undefined) {
    const size = Math.max(160, Math.min(320, drawH));
    const windowMm = Math.min(Math.max(INSET_WINDOWS * top.deviation, side * 1e-6, 1e-6), Math.max(wMm, hMm));
    inset = { x: drawW + GAP_PX, y: 0, size, cx: top.x, cy: top.y, windowMm };
  }
  const width = inset ? inset.x + inset.size : drawW;
  const height = Math.max(drawH, inset ? inset.size + 20 : 0) + LEGEND_PX;
  const view: Box = [minX, minY, minX + wMm, minY + hMm];
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`,
    `<rect width="${width}" height="${height}" fill="${PREVIEW_COLORS.background}"/>`,
    `<svg x="0" y="0" width="${drawW}" height="${drawH}" viewBox="${num(minX)} ${num(minY)} ${num(drawW / px)} ${num(drawH / px)}">`,
    geometry(ia, ib, boxA, boxB, view, px, ink),
    ...worst.map((s) => ring(s, px)),
    '</svg>',
  ];
  // Bézier curves in the result get a key entry only when there are any.
  const curves = ib.some((it) => it.path.ops.some((op) => op === OP_C || op === OP_Q));
  if (inset) {
    const z = inset.size / inset.windowMm;
    const h = inset.windowMm / 2;
    const win: Box = [inset.cx - h, inset.cy - h, inset.cx + h, inset.cy + h];
    const bar = niceLength(inset.windowMm / 3);
    parts.push(
      `<svg x="${inset.x}" y="${inset.y}" width="${inset.size}" height="${inset.size}" viewBox="${num(win[0])} ${num(win[1])} ${num(inset.windowMm)} ${num(inset.windowMm)}">`,
      `<rect x="${num(win[0])}" y="${num(win[1])}" width="${num(inset.windowMm)}" height="${num(inset.windowMm)}" fill="#fafafa"/>`,
      geometry(ia, ib, boxA, boxB, win, z, ink),
      ring(top, z, false),
      '</svg>',
      `<rect x="${inset.x}" y="${inset.y}" width="${inset.size}" height="${inset.size}" fill="none" stroke="#bdbdbd"/>`,
      `<text x="${inset.x}" y="${inset.y + inset.size + 14}" font-size="11" font-family="${FONT}" fill="${PREVIEW_COLORS.text}">${esc(`worst: ${top.label}, ${formatMmValue(top.deviation)} mm (zoom ×${formatMmValue(z / px)})`)}</text>`,
      scaleBar(inset.x + inset.size - bar * z - 8, inset.y + inset.size - 22, bar, z),
    );
  }
  const base = height - LEGEND_PX + 22;
  const bar = niceLength(Math.max(wMm / 5, 1e-9));
  parts.push(scaleBar(10, base, bar, px), legend(base - 4, 30 + bar * px, curves), '</svg>');
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
  // density 72: one px of the overlay's unitless size is one pixel.
  return sharp(Buffer.from(svg, 'utf8'), { density: 72, limitInputPixels: false }).png().toBuffer();
}
