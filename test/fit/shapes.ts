/** Polylines sampled from exact compositions of lines and arcs, for the fitter's tests (our own test data). */

/** Append points of a circular arc (excluding its start) with chords of at most `step`. */
function arcPts(out: number[], cx: number, cy: number, r: number, a0: number, a1: number, step: number): void {
  const n = Math.max(1, Math.ceil((Math.abs(a1 - a0) * r) / step));
  for (let i = 1; i <= n; i++) {
    const a = a0 + ((a1 - a0) * i) / n;
    out.push(cx + r * Math.cos(a), cy + r * Math.sin(a));
  }
}

/** Append points of a line (excluding its start). */
function linePts(out: number[], x0: number, y0: number, x1: number, y1: number, step: number): void {
  const n = Math.max(1, Math.ceil(Math.hypot(x1 - x0, y1 - y0) / step));
  for (let i = 1; i <= n; i++) out.push(x0 + ((x1 - x0) * i) / n, y0 + ((y1 - y0) * i) / n);
}

/** A w × h rectangle with corner radius r, closed, first vertex not repeated. */
export function roundedRect(w: number, h: number, r: number, step: number): Float64Array {
  const p: number[] = [r, 0];
  linePts(p, r, 0, w - r, 0, step);
  arcPts(p, w - r, r, r, -Math.PI / 2, 0, step);
  linePts(p, w, r, w, h - r, step);
  arcPts(p, w - r, h - r, r, 0, Math.PI / 2, step);
  linePts(p, w - r, h, r, h, step);
  arcPts(p, r, h - r, r, Math.PI / 2, Math.PI, step);
  linePts(p, 0, h - r, 0, r, step);
  arcPts(p, r, r, r, Math.PI, 1.5 * Math.PI, step);
  p.length -= 2; // back at the start
  return Float64Array.from(p);
}

/** A circle of radius r, closed. */
export function circle(cx: number, cy: number, r: number, n: number): Float64Array {
  const p = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    p[2 * i] = cx + r * Math.cos((2 * Math.PI * i) / n);
    p[2 * i + 1] = cy + r * Math.sin((2 * Math.PI * i) / n);
  }
  return p;
}

/** A slot (stadium): two parallel lines of length len joined by semicircles of radius r, closed. */
export function slot(len: number, r: number, step: number): Float64Array {
  const p: number[] = [0, -r];
  linePts(p, 0, -r, len, -r, step);
  arcPts(p, len, 0, r, -Math.PI / 2, Math.PI / 2, step);
  linePts(p, len, r, 0, r, step);
  arcPts(p, 0, 0, r, Math.PI / 2, 1.5 * Math.PI, step);
  p.length -= 2;
  return Float64Array.from(p);
}

export { rng } from '../rng.js';

/** Apply x' = a x + c y + e, y' = b x + d y + f to every vertex. */
export function mapXY(xy: Float64Array, a: number, b: number, c: number, d: number, e: number, f: number): Float64Array {
  const out = new Float64Array(xy.length);
  for (let i = 0; i < xy.length; i += 2) {
    out[i] = a * xy[i] + c * xy[i + 1] + e;
    out[i + 1] = b * xy[i] + d * xy[i + 1] + f;
  }
  return out;
}

/** The same polyline walked backwards. */
export function reversed(xy: Float64Array): Float64Array {
  const n = xy.length >> 1;
  const out = new Float64Array(xy.length);
  for (let i = 0; i < n; i++) {
    out[2 * i] = xy[2 * (n - 1 - i)];
    out[2 * i + 1] = xy[2 * (n - 1 - i) + 1];
  }
  return out;
}
