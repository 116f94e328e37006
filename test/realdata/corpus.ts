/**
 * A real-data corpus built at test and bench time from open datasets that dev
 * dependencies ship (licences and sources in ./README.md): coastline and
 * country maps, single-stroke plotter fonts on a coarse grid, font outlines of
 * quadratic Béziers, and an open icon set. Every drawing is an SVG document in
 * millimetres (1 user unit = 1 mm).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { createRequire } from 'node:module';
import opentype from 'opentype.js';
import { feature } from 'topojson-client';

const require = createRequire(import.meta.url);

export type RealClass = 'maps' | 'strokeFonts' | 'fontOutlines' | 'icons';

export interface RealDrawing {
  cls: RealClass;
  name: string;
  svg: string;
}

const PANGRAM = 'Sphinx of black quartz, judge my vow. 0123456789';
const PANGRAM2 = 'The quick brown fox jumps over the lazy dog!';

function doc(w: number, h: number, body: string[]): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${w}mm" height="${h}mm" viewBox="0 0 ${w} ${h}">\n${body.join('\n')}\n</svg>\n`;
}

const r3 = (v: number): string => String(Math.round(v * 1000) / 1000);

/**
 * Natural Earth polygons (through world-atlas) as one closed path per feature (a country, or all land),
 * equirectangular, `k` mm per degree.
 */
function mapDrawing(file: string, k: number, lon0: number, lat1: number, w: number, h: number, keep: (name: string) => boolean): string {
  const topo = JSON.parse(readFileSync(require.resolve(`world-atlas/${file}`), 'utf8')) as { objects: { countries?: unknown; land: unknown } };
  const fc = feature(topo, topo.objects.countries ?? topo.objects.land);
  const body: string[] = [];
  for (const f of fc.features) {
    if (!f.geometry || !keep(f.properties.name ?? '')) continue;
    const polys = (f.geometry.type === 'Polygon' ? [f.geometry.coordinates] : f.geometry.coordinates) as number[][][][];
    const parts: string[] = [];
    for (const poly of polys) {
      for (const ring of poly) {
        // GeoJSON rings repeat their first position at the end: Z closes them instead.
        const pts = ring.slice(0, -1).map(([lon, lat]) => `${r3((lon - lon0) * k)} ${r3((lat1 - lat) * k)}`);
        if (pts.length >= 3) parts.push(`M${pts.join('L')}Z`);
      }
    }
    if (parts.length > 0) body.push(`<path id="${(f.properties.name ?? 'x').replace(/[^A-Za-z]/g, '')}" d="${parts.join('')}"/>`);
  }
  return doc(w, h, body);
}

const EUROPE = new Set(['France', 'Italy', 'Spain', 'United Kingdom', 'Ireland', 'Norway', 'Greece', 'Denmark', 'Croatia', 'Portugal', 'Netherlands', 'Iceland']);

/** Hershey glyph outlines (through hersheytext): one open-stroke path per glyph, 0.5 mm per font unit. */
function hersheyDrawing(fontKey: string): string {
  const fonts = require('hersheytext/hersheytext.json') as Record<string, { chars: { d: string; o: number }[] }>;
  const font = fonts[fontKey];
  const unit = 0.5;
  const body: string[] = [];
  let y = 0;
  for (const line of [PANGRAM, PANGRAM2]) {
    let x = 0;
    for (const ch of line) {
      const g = font.chars[ch.charCodeAt(0) - 33];
      if (ch === ' ' || !g) {
        x += 16;
        continue;
      }
      // Font units on the integer grid: translate and scale (to the 0.5 mm grid) in the transform.
      if (g.d) body.push(`<path transform="translate(${x * unit} ${y * unit}) scale(${unit})" d="${g.d}"/>`);
      x += 2 * g.o;
    }
    y += 40;
  }
  return doc(600, 50, body);
}

/**
 * Font outlines from an OFL font (Lato, woff via @fontsource/lato) read with opentype.js: one path per
 * glyph, or one per line of text (`perLine`, as text converted to outlines often is).
 */
function outlineDrawing(weight: number, size: number, perLine: boolean): string {
  const buf = readFileSync(require.resolve(`@fontsource/lato/files/lato-latin-${weight}-normal.woff`));
  const font = opentype.parse(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer);
  const body: string[] = [];
  [PANGRAM, PANGRAM2].forEach((line, i) => {
    const glyphs = font.getPaths(line, 0, size * (1.2 + 1.3 * i), size).map((p) => p.toPathData(3)).filter((d) => d);
    for (const d of perLine ? [glyphs.join('')] : glyphs) body.push(`<path d="${d}"/>`);
  });
  return doc(Math.ceil(size * 30), Math.ceil(size * 3), body);
}

/** Every `every`-th icon of lucide-static (24-unit icons drawn `scale` mm per unit), placed on a grid. */
function iconDrawing(every: number, offset: number, scale: number): string {
  const dir = require.resolve('lucide-static/package.json').replace(/package\.json$/, 'icons/');
  const files = readdirSync(dir).filter((f) => f.endsWith('.svg')).sort();
  const body: string[] = [];
  const cell = 26 * scale;
  let n = 0;
  for (let i = offset; i < files.length; i += every, n++) {
    const text = readFileSync(dir + files[i], 'utf8');
    // The icon's children: the text between the end of its <svg …> start tag and </svg>.
    const open = text.indexOf('>', text.indexOf('<svg'));
    const inner = text.slice(open + 1, text.lastIndexOf('</svg>'));
    body.push(`<g transform="translate(${(n % 10) * cell} ${Math.floor(n / 10) * cell}) scale(${scale})">${inner}</g>`);
  }
  return doc(Math.ceil(10 * cell), Math.ceil(Math.ceil(n / 10) * cell), body);
}

/** The corpus, in a fixed order. */
export function realCorpus(): RealDrawing[] {
  return [
    { cls: 'maps', name: 'world 110m, 1 mm/°', svg: mapDrawing('countries-110m.json', 1, -180, 90, 360, 180, () => true) },
    { cls: 'maps', name: 'land 50m, 1 mm/°', svg: mapDrawing('land-50m.json', 1, -180, 90, 360, 180, () => true) },
    { cls: 'maps', name: 'Europe 50m, 4 mm/°', svg: mapDrawing('countries-50m.json', 4, -25, 72, 280, 152, (n) => EUROPE.has(n)) },
    { cls: 'strokeFonts', name: 'Hershey sans 0.5 mm grid', svg: hersheyDrawing('futural') },
    { cls: 'strokeFonts', name: 'Hershey script 0.5 mm grid', svg: hersheyDrawing('scripts') },
    { cls: 'strokeFonts', name: 'Hershey roman 0.5 mm grid', svg: hersheyDrawing('timesr') },
    { cls: 'fontOutlines', name: 'Lato regular 20 mm', svg: outlineDrawing(400, 20, true) },
    { cls: 'fontOutlines', name: 'Lato black 12 mm', svg: outlineDrawing(900, 12, false) },
    // As drawn on screen: one user unit = one CSS px (25.4/96 mm).
    { cls: 'icons', name: 'lucide every 10th, 1 px', svg: iconDrawing(10, 3, 25.4 / 96) },
    { cls: 'icons', name: 'lucide every 20th, 2×', svg: iconDrawing(20, 0, 2) },
    { cls: 'icons', name: 'lucide every 20th (+7), 4×', svg: iconDrawing(20, 7, 4) },
  ];
}
