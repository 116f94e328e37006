/**
 * Basic shapes → equivalent path data (S2 ch. 10, S11 ch. 9; REFERENCES.md §3).
 *
 * Lengths are read with units.ts in the element's user units; percentages
 * refer to the viewport: x-like (x, cx, x1, x2, width, rx) to its width,
 * y-like (y, cy, y1, y2, height, ry) to its height, `r` to the normalised
 * diagonal (S2 §8.9, geometry properties).
 *
 * The resulting ParsedPath has `counts` keyed by the emitted letters
 * (M, L, A, Z), since a shape has no path text "as written".
 *
 * Result convention: `path === null` means nothing is rendered, `error`
 * says why. `path !== null` with an `error` means the element is in error
 * but its valid part is rendered (odd `points`, ignored negative radius).
 */
import { OP_A, OP_L, OP_M, OP_Z, type ParsedPath } from './pathTypes.js';
import { parseNumberList } from './numbers.js';
import { parseLength, pxPerUnit, viewportDiagonal } from './units.js';

/** Shapes handled by {@link shapeToPath}. */
export type ShapeName = 'rect' | 'circle' | 'ellipse' | 'line' | 'polyline' | 'polygon';

/** Result of {@link shapeToPath}. */
export interface ShapePath {
  path: ParsedPath | null;
  error: string | null;
}

/** Small builder: shapes are tiny, plain arrays are fine here. */
class Builder {
  ops: number[] = [];
  args: number[] = [];
  counts: Record<string, number> = {};
  private add(op: number, letter: string, vals: number[]): void {
    this.ops.push(op);
    for (const v of vals) this.args.push(v);
    this.counts[letter] = (this.counts[letter] ?? 0) + 1;
  }
  m(x: number, y: number): void { this.add(OP_M, 'M', [x, y]); }
  l(x: number, y: number): void { this.add(OP_L, 'L', [x, y]); }
  /** Arc with rotation 0, large-arc 0, sweep 1 (S2 ch. 10 equivalent paths). */
  a(rx: number, ry: number, x: number, y: number): void { this.add(OP_A, 'A', [rx, ry, 0, 0, 1, x, y]); }
  z(): void { this.add(OP_Z, 'Z', []); }
  done(error: string | null): ShapePath {
    return {
      path: { ops: Uint8Array.from(this.ops), args: Float64Array.from(this.args), counts: this.counts, error: null },
      error,
    };
  }
}

/** Missing → undefined; `auto` or invalid → NaN (with a note for invalid); else user units. */
function readLen(get: (a: string) => string | undefined, name: string, base: number, notes: string[]): number | undefined {
  const text = get(name);
  if (text === undefined) return undefined;
  const len = parseLength(text);
  if (len === null) {
    if (text.trim() !== 'auto') notes.push(`${name}="${text}" is not a length, ignored`);
    return NaN;
  }
  return len.unit === '%' ? (len.value / 100) * base : len.value * (pxPerUnit(len.unit) as number);
}

/** A coordinate: missing/invalid → 0 (the initial value). */
function coord(get: (a: string) => string | undefined, name: string, base: number, notes: string[]): number {
  const v = readLen(get, name, base, notes);
  return v === undefined || Number.isNaN(v) ? 0 : v;
}

/** A radius that may be `auto`: negative or invalid → auto (NaN), noted. */
function autoRadius(get: (a: string) => string | undefined, name: string, base: number, notes: string[]): number {
  const v = readLen(get, name, base, notes);
  if (v === undefined) return NaN;
  if (v < 0) {
    notes.push(`${name}="${get(name)}" is negative, ignored (auto)`);
    return NaN;
  }
  return v;
}

function nothing(reason: string, notes: string[]): ShapePath {
  return { path: null, error: [reason, ...notes].join('; ') };
}

function rect(get: (a: string) => string | undefined, vw: number, vh: number, notes: string[]): ShapePath {
  const x = coord(get, 'x', vw, notes);
  const y = coord(get, 'y', vh, notes);
  const w = readLen(get, 'width', vw, notes);
  const h = readLen(get, 'height', vh, notes);
  // negative → invalid → auto → 0; zero or missing → not rendered (S2 §10.2)
  if (w === undefined || Number.isNaN(w) || !(w > 0)) return nothing(`rect width ${w === undefined ? 'missing' : `"${get('width')}"`}: not rendered`, notes);
  if (h === undefined || Number.isNaN(h) || !(h > 0)) return nothing(`rect height ${h === undefined ? 'missing' : `"${get('height')}"`}: not rendered`, notes);
  let rx = autoRadius(get, 'rx', vw, notes);
  let ry = autoRadius(get, 'ry', vh, notes);
  // copy before clamp, then clamp each independently (S2 §10.2, R3)
  if (Number.isNaN(rx) && Number.isNaN(ry)) { rx = 0; ry = 0; }
  else if (Number.isNaN(rx)) rx = ry;
  else if (Number.isNaN(ry)) ry = rx;
  rx = Math.min(rx, w / 2);
  ry = Math.min(ry, h / 2);
  const round = rx > 0 && ry > 0;
  if (!round) { rx = 0; ry = 0; }
  const b = new Builder();
  b.m(x + rx, y);
  b.l(x + w - rx, y);
  if (round) b.a(rx, ry, x + w, y + ry);
  b.l(x + w, y + h - ry);
  if (round) b.a(rx, ry, x + w - rx, y + h);
  b.l(x + rx, y + h);
  if (round) b.a(rx, ry, x, y + h - ry);
  b.l(x, y + ry);
  if (round) b.a(rx, ry, x + rx, y);
  b.z();
  return b.done(notes.length ? notes.join('; ') : null);
}

/** Four quarter arcs from 3 o'clock, clockwise on screen (sweep 1) (S2 §10.3–10.4). */
function ellipsePath(cx: number, cy: number, rx: number, ry: number, notes: string[]): ShapePath {
  const b = new Builder();
  b.m(cx + rx, cy);
  b.a(rx, ry, cx, cy + ry);
  b.a(rx, ry, cx - rx, cy);
  b.a(rx, ry, cx, cy - ry);
  b.a(rx, ry, cx + rx, cy);
  b.z();
  return b.done(notes.length ? notes.join('; ') : null);
}

function points(get: (a: string) => string | undefined, close: boolean, notes: string[]): ShapePath {
  const text = get('points');
  if (text === undefined) return nothing('no points attribute: not rendered', notes);
  const { values, errorAt } = parseNumberList(text);
  if (errorAt >= 0) notes.push(`points: bad character at offset ${errorAt}, the rest ignored`);
  let n = values.length;
  if (n % 2 === 1) {
    // S2 §10.6: drop the odd last coordinate and render the rest (element in error)
    notes.push(`points: odd number of coordinates (${n}), the last one dropped`);
    n--;
  }
  if (n === 0) return nothing('no complete point pair: not rendered', notes);
  const b = new Builder();
  b.m(values[0], values[1]);
  for (let i = 2; i < n; i += 2) b.l(values[i], values[i + 1]);
  // Decision: a polygon stays closed after a dropped coordinate (what remains is still a polygon).
  if (close) b.z();
  return b.done(notes.length ? notes.join('; ') : null);
}

/**
 * The equivalent path of a basic shape, in the element's user units.
 * @param name element local name
 * @param get attribute lookup (undefined when absent)
 * @param viewportW width that x-like percentages refer to, user units
 * @param viewportH height that y-like percentages refer to, user units
 * @returns the path (null when not rendered) and an error/reason or null
 */
export function shapeToPath(
  name: ShapeName, get: (attr: string) => string | undefined, viewportW: number, viewportH: number,
): ShapePath {
  const notes: string[] = [];
  switch (name) {
    case 'rect':
      return rect(get, viewportW, viewportH, notes);
    case 'circle': {
      const cx = coord(get, 'cx', viewportW, notes);
      const cy = coord(get, 'cy', viewportH, notes);
      const r = readLen(get, 'r', viewportDiagonal(viewportW, viewportH), notes);
      // negative is invalid, zero or missing disables rendering (S2 §10.3)
      if (r === undefined || Number.isNaN(r) || !(r > 0)) return nothing(`circle r ${r === undefined ? 'missing' : `"${get('r')}"`}: not rendered`, notes);
      return ellipsePath(cx, cy, r, r, notes);
    }
    case 'ellipse': {
      const cx = coord(get, 'cx', viewportW, notes);
      const cy = coord(get, 'cy', viewportH, notes);
      let rx = autoRadius(get, 'rx', viewportW, notes);
      let ry = autoRadius(get, 'ry', viewportH, notes);
      // SVG 2 §10.4: one auto copies the other; both auto → not rendered
      if (Number.isNaN(rx) && Number.isNaN(ry)) return nothing('ellipse rx and ry both auto: not rendered', notes);
      if (Number.isNaN(rx)) rx = ry;
      if (Number.isNaN(ry)) ry = rx;
      if (!(rx > 0) || !(ry > 0)) return nothing('ellipse radius zero: not rendered', notes);
      return ellipsePath(cx, cy, rx, ry, notes);
    }
    case 'line': {
      const b = new Builder();
      b.m(coord(get, 'x1', viewportW, notes), coord(get, 'y1', viewportH, notes));
      b.l(coord(get, 'x2', viewportW, notes), coord(get, 'y2', viewportH, notes));
      return b.done(notes.length ? notes.join('; ') : null);
    }
    case 'polyline':
      return points(get, false, notes);
    case 'polygon':
      return points(get, true, notes);
    default:
      return { path: null, error: `not a basic shape: ${String(name)}` };
  }
}
