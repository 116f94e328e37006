/**
 * Test helper: render SVG text to pixels with sharp (librsvg inside) and
 * compare two renderings outside a band around the edges.
 *
 * Data layout: a {@link Raster} is row-major RGBA, 8 bits per channel,
 * straight (not premultiplied) alpha, `rgba.length === 4 * width * height`.
 * Comparisons use premultiplied values so that the colour of a fully
 * transparent pixel, which carries no meaning, never counts as a difference.
 *
 * Scale facts measured on sharp 0.35 / librsvg 2.63 (common practice, checked
 * in this repository by test/e2e/render.test.ts): with `density: D` one user
 * unit of a root without physical size becomes D/72 px, while physical units
 * (mm, in) become D²/72 px per inch, i.e. CSS-correct relative to user units
 * only at D = 96. Callers therefore derive the px-per-mm of a rendering from
 * its actual size, never from D alone.
 */
import sharp from 'sharp';

/** Row-major RGBA pixels, straight alpha (see the module header). */
export interface Raster {
  width: number;
  height: number;
  rgba: Uint8Array;
}

/** Render SVG text at `density` (sharp's DPI; 72 = one px per root user unit). */
export async function renderSvg(svg: string, density: number): Promise<Raster> {
  const { data, info } = await sharp(Buffer.from(svg, 'utf8'), { density, limitInputPixels: false })
    .ensureAlpha()
    .raw()
    .toBuffer({ resolveWithObject: true });
  if (info.channels !== 4) throw new Error(`expected 4 channels, got ${info.channels}`);
  return { width: info.width, height: info.height, rgba: new Uint8Array(data.buffer, data.byteOffset, data.length) };
}

/** Size in px sharp gives an SVG at `density`, without rasterising it. */
export async function svgSize(svg: string, density: number): Promise<{ width: number; height: number }> {
  const m = await sharp(Buffer.from(svg, 'utf8'), { density }).metadata();
  return { width: m.width ?? 0, height: m.height ?? 0 };
}

/** Read a PNG file as a {@link Raster}. */
export async function readPng(path: string): Promise<Raster> {
  const { data, info } = await sharp(path).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
  return { width: info.width, height: info.height, rgba: new Uint8Array(data.buffer, data.byteOffset, data.length) };
}

/** A copy of `r` composited over opaque white (for references drawn on white). */
export function overWhite(r: Raster): Raster {
  const out = new Uint8Array(r.rgba.length);
  const s = r.rgba;
  for (let i = 0; i < s.length; i += 4) {
    const a = s[i + 3];
    out[i] = (s[i] * a + 255 * (255 - a) + 127) / 255;
    out[i + 1] = (s[i + 1] * a + 255 * (255 - a) + 127) / 255;
    out[i + 2] = (s[i + 2] * a + 255 * (255 - a) + 127) / 255;
    out[i + 3] = 255;
  }
  return { width: r.width, height: r.height, rgba: out };
}

/** Largest premultiplied channel difference (0..255) between pixel `i` of `a` and pixel `j` of `b` (pixel indices). */
export function pixelDiff(a: Uint8Array, i: number, b: Uint8Array, j: number): number {
  const p = i << 2, q = j << 2;
  const aa = a[p + 3], ba = b[q + 3];
  let m = Math.abs(aa - ba);
  for (let c = 0; c < 3; c++) {
    const d = Math.abs(a[p + c] * aa - b[q + c] * ba) / 255;
    if (d > m) m = d;
  }
  return m;
}

/**
 * Mark (set to 1 in `out`) every pixel that differs from a 4-neighbour by more
 * than `threshold` (0..255, premultiplied): the antialiased rim of every edge.
 */
export function markEdges(out: Uint8Array, r: Raster, threshold: number): Uint8Array {
  const { width: w, height: h, rgba } = r;
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      const i = y * w + x;
      if (x + 1 < w && pixelDiff(rgba, i, rgba, i + 1) > threshold) out[i] = out[i + 1] = 1;
      if (y + 1 < h && pixelDiff(rgba, i, rgba, i + w) > threshold) out[i] = out[i + w] = 1;
    }
  }
  return out;
}

const FAR = 1e20;

/** One row or column of the squared distance transform, in place over f[off + k*stride]. */
function edt1d(f: Float64Array, off: number, stride: number, n: number, g: Float64Array, v: Int32Array, z: Float64Array): void {
  for (let q = 0; q < n; q++) g[q] = f[off + q * stride];
  let k = 0;
  v[0] = 0;
  z[0] = -Infinity;
  z[1] = Infinity;
  for (let q = 1; q < n; q++) {
    let s = (g[q] + q * q - (g[v[k]] + v[k] * v[k])) / (2 * q - 2 * v[k]);
    while (s <= z[k]) {
      k--;
      s = (g[q] + q * q - (g[v[k]] + v[k] * v[k])) / (2 * q - 2 * v[k]);
    }
    k++;
    v[k] = q;
    z[k] = s;
    z[k + 1] = Infinity;
  }
  k = 0;
  for (let q = 0; q < n; q++) {
    while (z[k + 1] < q) k++;
    const d = q - v[k];
    f[off + q * stride] = d * d + g[v[k]];
  }
}

/**
 * Exact Euclidean distance (px, centre to centre) from every pixel to the
 * nearest marked pixel; FAR-ish (≥ 1e10) when nothing is marked.
 * Lower envelope of parabolas, rows then columns (Felzenszwalb & Huttenlocher,
 * "Distance Transforms of Sampled Functions", 2012; algorithm from memory).
 */
export function distanceToMarked(mask: Uint8Array, w: number, h: number): Float64Array {
  const f = new Float64Array(w * h);
  for (let i = 0; i < f.length; i++) f[i] = mask[i] ? 0 : FAR;
  const n = Math.max(w, h);
  const g = new Float64Array(n), v = new Int32Array(n), z = new Float64Array(n + 1);
  for (let y = 0; y < h; y++) edt1d(f, y * w, 1, w, g, v, z);
  for (let x = 0; x < w; x++) edt1d(f, x, w, h, g, v, z);
  for (let i = 0; i < f.length; i++) f[i] = Math.sqrt(f[i]);
  return f;
}

/** Settings for {@link compareRasters}. */
export interface CompareOptions {
  /** Half-width of the allowed band around edges, px. */
  bandPx: number;
  /** A pixel differs when a premultiplied channel differs by more than this (0..255). Default 24. */
  diffThreshold?: number;
  /** Neighbour difference (0..255) that makes a pixel part of an edge. Default 8. */
  edgeThreshold?: number;
  /**
   * 'each' (default): a difference is allowed only within the band of an edge
   * of the first image and within the band of an edge of the second, so a thin
   * stroke that moved whole is still caught. 'either': within the band of an
   * edge of one of them (lenient; for references drawn with other fonts).
   */
  near?: 'each' | 'either';
}

/** Result of {@link compareRasters}. */
export interface Comparison {
  pixels: number;
  /** Pixels over the difference threshold anywhere. */
  differing: number;
  /** Of those, the ones farther than `bandPx` from every edge of either image. */
  outsideBand: number;
  /** outsideBand / pixels. */
  fractionOutside: number;
  /** Largest distance (px) from an edge of a differing pixel; 0 when none differ. */
  worstDistancePx: number;
  /** Pixel (x, y) of that worst difference, or null. */
  worstAt: [number, number] | null;
}

/**
 * Compare two renderings of equal size: differences are allowed only within
 * `bandPx` of edges (see {@link CompareOptions.near} and {@link markEdges}).
 */
export function compareRasters(a: Raster, b: Raster, o: CompareOptions): Comparison {
  if (a.width !== b.width || a.height !== b.height) {
    throw new Error(`renderings differ in size: ${a.width}x${a.height} vs ${b.width}x${b.height}`);
  }
  const w = a.width, h = a.height, n = w * h;
  const diffT = o.diffThreshold ?? 24;
  let differing = 0, outside = 0, worst = 0;
  let worstAt: [number, number] | null = null;
  let dist: Float64Array | null = null;
  for (let i = 0; i < n; i++) {
    if (pixelDiff(a.rgba, i, b.rgba, i) <= diffT) continue;
    differing++;
    dist ??= bandDistance(a, b, o); // only computed when something differs
    const d = dist[i];
    if (d > o.bandPx) outside++;
    if (d > worst || worstAt === null) {
      worst = d;
      worstAt = [i % w, Math.floor(i / w)];
    }
  }
  return { pixels: n, differing, outsideBand: outside, fractionOutside: n ? outside / n : 0, worstDistancePx: worst, worstAt };
}

/** Per pixel, the distance (px) that must fit in the band: see {@link CompareOptions.near}. */
export function bandDistance(a: Raster, b: Raster, o: CompareOptions): Float64Array {
  const w = a.width, h = a.height, n = w * h;
  const edgeT = o.edgeThreshold ?? 8;
  if (o.near === 'either') {
    const mask = new Uint8Array(n);
    markEdges(mask, a, edgeT);
    markEdges(mask, b, edgeT);
    return distanceToMarked(mask, w, h);
  }
  const da = distanceToMarked(markEdges(new Uint8Array(n), a, edgeT), w, h);
  const db = distanceToMarked(markEdges(new Uint8Array(n), b, edgeT), w, h);
  for (let i = 0; i < n; i++) if (db[i] > da[i]) da[i] = db[i];
  return da;
}

/** Write a picture a person can open: `a` in grey, differences inside the band in orange, outside it in red. */
export async function writeDiffPng(path: string, a: Raster, b: Raster, o: CompareOptions): Promise<void> {
  const w = a.width, h = a.height, n = w * h;
  const dist = bandDistance(a, b, o);
  const out = new Uint8Array(n * 3);
  for (let i = 0; i < n; i++) {
    // Ink of `a` over white, lightened to half contrast so the differences stand out.
    const p = 4 * i, al = a.rgba[p + 3];
    const ink = (al * (765 - a.rgba[p] - a.rgba[p + 1] - a.rgba[p + 2])) / (3 * 255);
    out[3 * i] = out[3 * i + 1] = out[3 * i + 2] = 255 - (ink >> 1);
    if (pixelDiff(a.rgba, i, b.rgba, i) > (o.diffThreshold ?? 24)) {
      const far = dist[i] > o.bandPx;
      out[3 * i] = 255;
      out[3 * i + 1] = far ? 0 : 200;
      out[3 * i + 2] = far ? 0 : 120;
    }
  }
  await sharp(Buffer.from(out), { raw: { width: w, height: h, channels: 3 } }).png().toFile(path);
}

/**
 * Pixels per root user unit of a rendering, per axis, from its actual size:
 * with a viewBox, the viewport (the whole raster) over the viewBox, combined
 * as preserveAspectRatio says (S2 §8.2 `#ComputingAViewportsTransform`);
 * without one, a user unit is D/72 px (see the module header).
 */
export function pxPerRootUnit(r: Raster, density: number, viewBox: readonly number[] | null, align: string, slice: boolean): [number, number] {
  if (!viewBox || !(viewBox[2] > 0) || !(viewBox[3] > 0)) return [density / 72, density / 72];
  const sx = r.width / viewBox[2], sy = r.height / viewBox[3];
  if (align === 'none') return [sx, sy];
  const s = slice ? Math.max(sx, sy) : Math.min(sx, sy);
  return [s, s];
}
