/**
 * The SVG `transform` attribute → one affine matrix.
 *
 * Grammar (S11 §7.6, CT1 `#svg-syntax`; REFERENCES.md §5.1):
 *   list     ::= wsp* ( fn ( sep fn )* )? wsp*     sep ::= (wsp | ",")*
 *   fn       ::= name wsp* "(" wsp* args wsp* ")"
 *   args     ::= number ( comma_wsp? number )*
 * Names are case-sensitive. Whitespace between the name and "(" is accepted
 * on read (SVG 1.1 allowed it; CT1 does not). Between arguments the
 * separator may be empty when the numbers are still delimited (`10-5`), the
 * same greedy rule as path data. Between functions any run of whitespace and
 * commas is accepted (a superset of SVG 1.1's `comma-wsp+` and CT1's `wsp*`).
 * `none` and the empty string mean identity. Numbers are unitless: lengths in
 * user units, angles in degrees (CT1 `#svg-data-types`).
 *
 * Composition: `A B C` ≡ nested groups A ⊃ B ⊃ C, the matrix is A·B·C and a
 * point is mapped by C first (CT1 `#transform-function-lists`).
 */
import type { Matrix } from './matrixTypes.js';
import { identityMatrix, multiply } from './matrix.js';
import { isWsp, type NumberScan, scanNumber, skipWsp } from './numbers.js';

/** Result of {@link parseTransform}. */
export interface ParsedTransform {
  /** The composed matrix; identity when `error` is set. */
  matrix: Matrix;
  /** `null`, or a message naming the character offset of the first problem. */
  error: string | null;
}

/** Allowed argument counts per function name. */
const ARITY: Readonly<Record<string, readonly number[]>> = {
  matrix: [6],
  translate: [1, 2],
  scale: [1, 2],
  rotate: [1, 3],
  skewX: [1],
  skewY: [1],
};

/**
 * cos and sin of an angle in degrees, exact at multiples of 90° so that
 * `rotate(90)` is exactly [0 1 −1 0] (keeps similarity tests and output clean).
 */
function cosSinDeg(deg: number, out: Float64Array): void {
  const r = deg % 360;
  if (r % 90 === 0) {
    const q = ((r / 90) % 4 + 4) % 4;
    out[0] = q === 0 ? 1 : q === 2 ? -1 : 0;
    out[1] = q === 1 ? 1 : q === 3 ? -1 : 0;
    return;
  }
  const t = (deg * Math.PI) / 180;
  out[0] = Math.cos(t);
  out[1] = Math.sin(t);
}

/** tan of an angle in degrees, exact at multiples of 45°; non-finite at ±90°. */
function tanDeg(deg: number): number {
  const r = ((deg % 180) + 180) % 180;
  if (r === 0) return 0;
  if (r === 45) return 1;
  if (r === 135) return -1;
  if (r === 90) return Infinity;
  return Math.tan((deg * Math.PI) / 180);
}

/** Scratch [cos, sin]; parseTransform is synchronous so one is enough. */
const COS_SIN = new Float64Array(2);

/** Build the matrix of one transform function into `out`. */
function functionMatrix(name: string, v: number[], out: Matrix): void {
  out[0] = 1; out[1] = 0; out[2] = 0; out[3] = 1; out[4] = 0; out[5] = 0;
  switch (name) {
    case 'matrix':
      for (let i = 0; i < 6; i++) out[i] = v[i];
      break;
    case 'translate':
      out[4] = v[0];
      out[5] = v.length > 1 ? v[1] : 0;
      break;
    case 'scale':
      out[0] = v[0];
      out[3] = v.length > 1 ? v[1] : v[0];
      break;
    case 'rotate': {
      const cs = COS_SIN;
      cosSinDeg(v[0], cs);
      const c = cs[0], s = cs[1];
      out[0] = c; out[1] = s; out[2] = -s; out[3] = c;
      if (v.length === 3) {
        // translate(cx,cy) rotate(α) translate(−cx,−cy) (S11 §7.6)
        const cx = v[1], cy = v[2];
        out[4] = cx - c * cx + s * cy;
        out[5] = cy - s * cx - c * cy;
      }
      break;
    }
    case 'skewX':
      out[2] = tanDeg(v[0]);
      break;
    case 'skewY':
      out[1] = tanDeg(v[0]);
      break;
  }
}

function fail(at: number, what: string): ParsedTransform {
  return { matrix: identityMatrix(), error: `transform: ${what} at offset ${at}` };
}

/**
 * Parse an SVG `transform` attribute value.
 *
 * Error decision: on any syntax error (unknown function, wrong argument
 * count, missing parenthesis, non-finite value) the whole list is ignored
 * and identity is returned with a message. SVG 2 makes `transform` a
 * presentation attribute, and CSS drops an invalid declaration entirely
 * (CT1 `#svg-transform`), so no partial prefix is applied.
 *
 * @param text attribute value (may be empty)
 * @returns matrix in user units of the element's parent, and an error or null
 */
export function parseTransform(text: string): ParsedTransform {
  const s = text;
  const n = s.length;
  const total = identityMatrix();
  const fm = new Float64Array(6);
  const scan: NumberScan = { value: 0, end: 0 };
  let i = skipWsp(s, 0);
  if (i === n) return { matrix: total, error: null };
  if (s.startsWith('none', i) && skipWsp(s, i + 4) === n) return { matrix: total, error: null };
  let first = true;
  while (true) {
    // separators between functions
    const sepStart = i;
    while (i < n) {
      const c = s.charCodeAt(i);
      if (isWsp(c) || c === 44) i++;
      else break;
    }
    if (i === n) {
      if (first || s.lastIndexOf(',', n - 1) >= sepStart) return fail(sepStart, 'trailing separator');
      break;
    }
    if (first && i > sepStart) return fail(sepStart, 'leading comma');
    first = false;
    const nameStart = i;
    while (i < n) {
      const c = s.charCodeAt(i);
      if ((c >= 65 && c <= 90) || (c >= 97 && c <= 122)) i++;
      else break;
    }
    const name = s.slice(nameStart, i);
    const arity = ARITY[name];
    if (!Object.prototype.hasOwnProperty.call(ARITY, name)) {
      return fail(nameStart, name ? `unknown function "${name}"` : `unexpected "${s[nameStart]}"`);
    }
    i = skipWsp(s, i);
    if (s.charCodeAt(i) !== 40) return fail(i, `expected "(" after ${name}`);
    i = skipWsp(s, i + 1);
    const args: number[] = [];
    while (i < n && s.charCodeAt(i) !== 41) {
      if (!scanNumber(s, i, scan)) return fail(i, `expected a number in ${name}()`);
      if (!Number.isFinite(scan.value)) return fail(i, `number out of range in ${name}()`);
      args.push(scan.value);
      i = skipWsp(s, scan.end);
      if (s.charCodeAt(i) === 44) {
        i = skipWsp(s, i + 1);
        if (s.charCodeAt(i) === 41) return fail(i, `comma before ")" in ${name}()`);
      }
    }
    if (i >= n) return fail(n, `missing ")" after ${name}(`);
    if (!arity.includes(args.length)) {
      return fail(nameStart, `${name}() takes ${arity.join(' or ')} arguments, got ${args.length}`);
    }
    functionMatrix(name, args, fm);
    for (let k = 0; k < 6; k++) {
      if (!Number.isFinite(fm[k])) return fail(nameStart, `${name}(${args.join(' ')}) is not finite`);
    }
    multiply(total, total, fm); // post-multiply: later functions act first on points
    i++; // past ")"
  }
  return { matrix: total, error: null };
}
