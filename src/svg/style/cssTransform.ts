/**
 * The CSS `transform` property (CSS Transforms 1 §6, 2D functions) → one
 * affine matrix. css-tree (npm) parses the value; this module reads its
 * nodes. Differences from the SVG attribute (src/svg/transform.ts), per
 * CT1 §6.1 and §7: arguments are separated by commas only, lengths carry units
 * (a bare number is only allowed for 0), angles carry units (deg, grad, rad,
 * turn; a bare 0 allowed), translate takes percentages of the reference box
 * (for SVG elements the nearest viewport: transform-box view-box, CT1 §7),
 * and the extra functions translateX/Y, scaleX/Y and skew exist. `rotate`
 * takes one argument only. The origin is transform-origin's initial value for
 * SVG elements, 0 0 (CT1 §8.1); a transform-origin declaration is not read.
 */
import { parseCss as parse } from './cssTree.js';
import type { CssNode, FunctionNode, Value } from 'css-tree';
import type { Matrix } from '../matrixTypes.js';
import { identityMatrix, matrix, multiply } from '../matrix.js';
import { pxPerUnit } from '../units.js';

/** Result of {@link parseCssTransform}: the matrix, or an error message. */
export type CssTransform = { matrix: Matrix; error: null } | { matrix: null; error: string };

/** Longest value read, characters: a transform list this long is not a drawing's. */
const MAX_VALUE_CHARS = 65_536;

/**
 * css-tree's value tree, or null when the text has errors, is too long, or
 * nests deeper than the parser's stack (hostile input such as a(a(a(…;
 * transform values never nest functions).
 */
function parseValue(text: string): Value | null {
  if (text.length > MAX_VALUE_CHARS) return null;
  let errors = 0;
  try {
    const ast = parse(text, { context: 'value', onParseError: () => { errors++; } });
    return errors === 0 && ast.type === 'Value' ? ast : null;
  } catch {
    return null;
  }
}

const DEG_PER: Readonly<Record<string, number>> = { deg: 1, grad: 0.9, rad: 180 / Math.PI, turn: 360 };

type Arg = { kind: 'number' | 'length' | 'percent' | 'angle'; value: number };

function argOf(node: CssNode): Arg | null {
  if (node.type === 'Number') {
    const v = Number(node.value);
    return Number.isFinite(v) ? { kind: 'number', value: v } : null;
  }
  if (node.type === 'Percentage') {
    const v = Number(node.value);
    return Number.isFinite(v) ? { kind: 'percent', value: v } : null;
  }
  if (node.type === 'Dimension') {
    const v = Number(node.value);
    if (!Number.isFinite(v)) return null;
    const u = node.unit.toLowerCase();
    if (DEG_PER[u] !== undefined) return { kind: 'angle', value: v * DEG_PER[u] };
    const px = pxPerUnit(u);
    return px !== undefined && u !== '' ? { kind: 'length', value: v * px } : null;
  }
  return null;
}

/** The function's arguments: comma-separated, one value each; null when the list is malformed. */
function argsOf(fn: FunctionNode): Arg[] | null {
  const out: Arg[] = [];
  let wantValue = true;
  for (const n of fn.children) {
    if (n.type === 'Operator' && n.value === ',') {
      if (wantValue) return null;
      wantValue = true;
      continue;
    }
    if (!wantValue) return null; // CT1: arguments are comma-separated
    const a = argOf(n);
    if (a === null) return null;
    out.push(a);
    wantValue = false;
  }
  return wantValue && out.length > 0 ? null : out;
}

const length = (a: Arg | undefined, base: number): number | null =>
  a === undefined ? null : a.kind === 'length' ? a.value : a.kind === 'percent' ? (a.value / 100) * base : a.kind === 'number' && a.value === 0 ? 0 : null;
const angle = (a: Arg | undefined): number | null =>
  a === undefined ? null : a.kind === 'angle' ? a.value : a.kind === 'number' && a.value === 0 ? 0 : null;
const factor = (a: Arg | undefined): number | null =>
  a === undefined ? null : a.kind === 'number' ? a.value : a.kind === 'percent' ? a.value / 100 : null;
const rad = (deg: number): number => (deg * Math.PI) / 180;

function fnMatrix(name: string, a: Arg[], w: number, h: number): Matrix | null {
  const n = a.length;
  switch (name) {
    case 'matrix': {
      if (n !== 6 || a.some((x) => x.kind !== 'number')) return null;
      return matrix(a[0].value, a[1].value, a[2].value, a[3].value, a[4].value, a[5].value);
    }
    case 'translate': {
      const tx = length(a[0], w), ty = n === 2 ? length(a[1], h) : 0;
      return n <= 2 && tx !== null && ty !== null ? matrix(1, 0, 0, 1, tx, ty) : null;
    }
    case 'translatex': { const t = n === 1 ? length(a[0], w) : null; return t === null ? null : matrix(1, 0, 0, 1, t, 0); }
    case 'translatey': { const t = n === 1 ? length(a[0], h) : null; return t === null ? null : matrix(1, 0, 0, 1, 0, t); }
    case 'scale': {
      const sx = factor(a[0]), sy = n === 2 ? factor(a[1]) : sx;
      return n <= 2 && sx !== null && sy !== null ? matrix(sx, 0, 0, sy, 0, 0) : null;
    }
    case 'scalex': { const s = n === 1 ? factor(a[0]) : null; return s === null ? null : matrix(s, 0, 0, 1, 0, 0); }
    case 'scaley': { const s = n === 1 ? factor(a[0]) : null; return s === null ? null : matrix(1, 0, 0, s, 0, 0); }
    case 'rotate': {
      const t = n === 1 ? angle(a[0]) : null;
      if (t === null) return null;
      const c = Math.cos(rad(t)), s = Math.sin(rad(t));
      return matrix(c, s, -s, c, 0, 0);
    }
    case 'skew': {
      const ax = angle(a[0]), ay = n === 2 ? angle(a[1]) : 0;
      return n <= 2 && ax !== null && ay !== null ? matrix(1, Math.tan(rad(ay)), Math.tan(rad(ax)), 1, 0, 0) : null;
    }
    case 'skewx': { const t = n === 1 ? angle(a[0]) : null; return t === null ? null : matrix(1, 0, Math.tan(rad(t)), 1, 0, 0); }
    case 'skewy': { const t = n === 1 ? angle(a[0]) : null; return t === null ? null : matrix(1, Math.tan(rad(t)), 0, 1, 0, 0); }
    default:
      return null;
  }
}

/**
 * Parse a CSS `transform` value.
 * @param w, h size of the reference box (the nearest viewport), user units, for percentages
 * @returns the composed matrix (functions applied left to right as nested groups), or an error naming the bad part
 */
export function parseCssTransform(text: string, w: number, h: number): CssTransform {
  const t = text.trim();
  if (t.toLowerCase() === 'none') return { matrix: identityMatrix(), error: null };
  const ast = parseValue(t);
  if (ast === null) return { matrix: null, error: `not a transform list: "${t.slice(0, 60)}"` };
  let m = identityMatrix();
  let count = 0;
  for (const node of ast.children) {
    if (node.type !== 'Function') return { matrix: null, error: `not a transform function: "${t.slice(0, 60)}"` };
    const args = argsOf(node);
    const f = args === null ? null : fnMatrix(node.name.toLowerCase(), args, w, h);
    if (f === null) return { matrix: null, error: `invalid ${node.name}() in "${t.slice(0, 60)}"` };
    m = multiply(new Float64Array(6), m, f);
    count++;
  }
  return count > 0 ? { matrix: m, error: null } : { matrix: null, error: 'empty transform' };
}

const ORIGIN_KEYWORD: Readonly<Record<string, { axis: 'x' | 'y' | 'either'; at: number }>> = {
  left: { axis: 'x', at: 0 }, right: { axis: 'x', at: 100 }, top: { axis: 'y', at: 0 }, bottom: { axis: 'y', at: 100 },
  center: { axis: 'either', at: 50 },
};

/**
 * A `transform-origin` value (CT1 §8.1: one to three values; keywords
 * left/center/right/top/bottom, lengths, percentages of the reference box,
 * which for SVG elements is the nearest viewport, transform-box view-box),
 * as a point in user units; the z value is ignored. Bare numbers are
 * accepted as user units (the attribute form, SVG 2 §8.5).
 * @returns [x, y], or null when invalid
 */
export function parseTransformOrigin(text: string, w: number, h: number): [number, number] | null {
  const ast = parseValue(text.trim());
  if (ast === null) return null;
  const parts: ({ kw: string } | { len: number | null; pct: number | null })[] = [];
  for (const n of ast.children) {
    if (n.type === 'Identifier') {
      const k = n.name.toLowerCase();
      if (ORIGIN_KEYWORD[k] === undefined) return null;
      parts.push({ kw: k });
    } else {
      const a = argOf(n);
      if (a === null || a.kind === 'angle') return null;
      parts.push(a.kind === 'percent' ? { len: null, pct: a.value } : { len: a.value, pct: null });
    }
  }
  if (parts.length < 1 || parts.length > 3) return null;
  const xy = parts.slice(0, 2);
  // A keyword for the vertical axis first (e.g. "top left") is swapped into place.
  const first = xy[0], second = xy[1];
  if ('kw' in first && ORIGIN_KEYWORD[first.kw].axis === 'y' && (second === undefined || !('kw' in second) || ORIGIN_KEYWORD[second.kw].axis !== 'y')) {
    xy.reverse();
    if (xy.length === 1) xy.unshift({ kw: 'center' });
  }
  const value = (p: (typeof parts)[number] | undefined, base: number, axis: 'x' | 'y'): number | null => {
    if (p === undefined) return base / 2;
    if ('kw' in p) {
      const k = ORIGIN_KEYWORD[p.kw];
      return k.axis === axis || k.axis === 'either' ? (k.at / 100) * base : null;
    }
    return p.pct !== null ? (p.pct / 100) * base : p.len;
  };
  const x = value(xy[0], w, 'x'), y = value(xy[1], h, 'y');
  return x === null || y === null ? null : [x, y];
}
