/**
 * Text in the preview picture (./preview.ts) laid out inside the image: the
 * value labels beside the ringed worst spots and the legend band. The picture
 * is an SVG rendered by librsvg, which does not report text sizes back, so
 * widths are estimated from the character count, on the high side: 0.64 em
 * per character covers DejaVu Sans' digits (0.64 em) and most lowercase
 * letters (from memory of its metrics); wide letters such as "m" and "w" are
 * balanced by narrow ones ("i", "l", ".", " "). The caller grows the canvas to
 * what is laid out here, so nothing is cut at the image's edge.
 */

/** Font size of every text in the picture, px. */
export const FONT_PX = 11;
/** The font stack; DejaVu Sans is what librsvg finds on a bare Linux system. */
export const FONT = 'DejaVu Sans, Arial, sans-serif';
const EM_PER_CHAR = 0.64;

/** Estimated width of `s` drawn at `fontPx`, px (on the high side, see the module header). */
export function textWidth(s: string, fontPx = FONT_PX): number {
  return Math.ceil([...s].length * EM_PER_CHAR * fontPx);
}

const num = (v: number): string => String(+v.toPrecision(10));
/** Text for SVG character data and attribute values. */
export const esc = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** A placed text: baseline start (px), width and the markup. */
export interface PlacedText {
  x: number;
  y: number;
  w: number;
  svg: string;
}

/**
 * The label of a ring of radius `r` px around (cx, cy) px: to the upper right
 * of the ring, else to its left when it would pass `right`, and below it when
 * it would pass the top; never left of x = 2.
 */
export function ringLabel(text: string, cx: number, cy: number, r: number, right: number, colour: string): PlacedText {
  const w = textWidth(text);
  let x = cx + 1.4 * r;
  // Left of the ring only when it fits there; otherwise it stays right and the canvas grows.
  if (x + w > right && cx - 1.4 * r - w >= 2) x = cx - 1.4 * r - w;
  let y = cy - 1.2 * r;
  if (y - FONT_PX < 0) y = cy + 1.2 * r + FONT_PX;
  return { x, y, w, svg: `<text x="${num(x)}" y="${num(y)}" font-size="${FONT_PX}" font-family="${FONT}" fill="${colour}">${esc(text)}</text>` };
}

/** One entry of the colour key: a swatch and its name. */
export interface KeyEntry {
  name: string;
  /** The swatch's markup with its left end at (0, 0) px and 18 px wide (centre line y = 0). */
  swatch: string;
}

/**
 * The legend row at baseline-centre `y`, starting at `x0` px: each entry's
 * swatch then its name, 12 px apart.
 * @returns the markup and the x just past the last entry, px
 */
export function legendRow(entries: readonly KeyEntry[], x0: number, y: number, textColour: string): { svg: string; right: number } {
  const out: string[] = [];
  let x = x0;
  for (const e of entries) {
    out.push(`<g transform="translate(${num(x)} ${num(y)})">${e.swatch}</g>` +
      `<text x="${num(x + 22)}" y="${num(y + 4)}" font-size="${FONT_PX}" font-family="${FONT}" fill="${textColour}">${esc(e.name)}</text>`);
    x += 22 + textWidth(e.name) + 12;
  }
  return { svg: out.join(''), right: x - 12 };
}
