/**
 * Number scanning shared by the SVG micro-syntaxes (path data, transform
 * lists, viewBox, points, lengths).
 *
 * Grammar (S2 §9.3.9 `#PathDataBNF`, S11 §8.3.9; REFERENCES.md §2.2):
 *   number ::= sign? ( digit+ ( "." digit* )? | "." digit+ ) exponent?
 *   exponent ::= ("e" | "E") sign? digit+
 * Greedy: as many characters as the production allows, so `100-200` is two
 * numbers and `0.6.5` is `0.6`, `.5`. A trailing dot (`23.`) is accepted on
 * read (legal in SVG 1.1, tolerated for readers by SVG 2). An `e` not
 * followed by an exponent's digits is left unconsumed (it is not part of the
 * number), so the caller sees it as the next character.
 *
 * The scanner works on char codes and computes the value itself for the
 * common case (≤ 15 significant digits, |power of ten| ≤ 22: one correctly
 * rounded IEEE operation on exact operands, Clinger's fast path), falling
 * back to `Number()` on the slice otherwise, so results equal `Number(text)`.
 */

/** Result slot for {@link scanNumber}; reuse one per parse to avoid allocation. */
export interface NumberScan {
  /** The number's value. */
  value: number;
  /** Index just past the number. */
  end: number;
}

/** Exact powers of ten representable as doubles (10^0 … 10^22). */
const POW10: Float64Array = (() => {
  const p = new Float64Array(23);
  p[0] = 1;
  for (let i = 1; i < 23; i++) p[i] = p[i - 1] * 10;
  return p;
})();

/** True for SVG whitespace: TAB, LF, FF, CR, SPACE (S2 §9.3.9). */
export function isWsp(c: number): boolean {
  return c === 32 || c === 10 || c === 9 || c === 13 || c === 12;
}

/** Index of the first non-whitespace character at or after `i`. */
export function skipWsp(s: string, i: number): number {
  const n = s.length;
  while (i < n && isWsp(s.charCodeAt(i))) i++;
  return i;
}

/**
 * Skip `wsp* ","? wsp*` (comma_wsp with at most one comma, possibly empty).
 * @returns index of the next non-separator character
 */
export function skipCommaWsp(s: string, i: number): number {
  const n = s.length;
  while (i < n && isWsp(s.charCodeAt(i))) i++;
  if (i < n && s.charCodeAt(i) === 44) {
    i++;
    while (i < n && isWsp(s.charCodeAt(i))) i++;
  }
  return i;
}

/**
 * Scan one number starting exactly at `i` (no leading whitespace skipped).
 * @returns true and fills `out` when a number starts at `i`; false otherwise
 *   (`out` untouched).
 */
export function scanNumber(s: string, i: number, out: NumberScan): boolean {
  const n = s.length;
  const start = i;
  let neg = false;
  let c = i < n ? s.charCodeAt(i) : -1;
  if (c === 45 || c === 43) { // '-' '+'
    neg = c === 45;
    i++;
    c = i < n ? s.charCodeAt(i) : -1;
  }
  let mant = 0;
  let digits = 0; // significant digits accumulated into mant
  let scale = 0; // power of ten to apply to mant
  let any = false;
  while (c >= 48 && c <= 57) {
    any = true;
    if (digits < 15) {
      mant = mant * 10 + (c - 48);
      if (mant !== 0) digits++;
    } else {
      scale++;
      digits++;
    }
    i++;
    c = i < n ? s.charCodeAt(i) : -1;
  }
  if (c === 46) { // '.'
    const afterDot = i + 1;
    let j = afterDot;
    let d = j < n ? s.charCodeAt(j) : -1;
    while (d >= 48 && d <= 57) {
      if (digits < 15) {
        mant = mant * 10 + (d - 48);
        scale--;
        if (mant !== 0) digits++;
      } else {
        digits++;
      }
      j++;
      d = j < n ? s.charCodeAt(j) : -1;
    }
    if (j > afterDot) any = true;
    if (!any) return false; // a lone "." (or sign + ".") is not a number
    i = j;
    c = d;
  }
  if (!any) return false;
  if (c === 101 || c === 69) { // 'e' 'E'
    let j = i + 1;
    let d = j < n ? s.charCodeAt(j) : -1;
    let eneg = false;
    if (d === 45 || d === 43) {
      eneg = d === 45;
      j++;
      d = j < n ? s.charCodeAt(j) : -1;
    }
    if (d >= 48 && d <= 57) {
      let e = 0;
      while (d >= 48 && d <= 57) {
        if (e < 100000) e = e * 10 + (d - 48);
        j++;
        d = j < n ? s.charCodeAt(j) : -1;
      }
      scale += eneg ? -e : e;
      i = j;
    }
  }
  let v: number;
  if (digits > 15) {
    v = Math.abs(Number(s.slice(start, i))); // Number() accepts the same forms, "23." included
  } else if (mant === 0) {
    v = 0;
  } else if (scale >= 0 && scale <= 22) {
    v = mant * POW10[scale];
  } else if (scale < 0 && scale >= -22) {
    v = mant / POW10[-scale];
  } else {
    v = Math.abs(Number(s.slice(start, i)));
  }
  out.value = neg ? -v : v;
  out.end = i;
  return true;
}

/**
 * Parse a list of numbers separated by whitespace and/or single commas
 * (viewBox, points). Stops at the first character that is neither.
 * @returns the numbers read and the offset of the first bad character
 *   (`errorAt` = -1 when the whole string was consumed).
 */
export function parseNumberList(s: string): { values: number[]; errorAt: number } {
  const values: number[] = [];
  const scan: NumberScan = { value: 0, end: 0 };
  const n = s.length;
  let i = skipWsp(s, 0);
  let needNumber = false; // a comma was just consumed
  while (i < n) {
    if (!scanNumber(s, i, scan)) return { values, errorAt: i };
    values.push(scan.value);
    i = skipWsp(s, scan.end);
    needNumber = false;
    if (i < n && s.charCodeAt(i) === 44) {
      needNumber = true;
      i = skipWsp(s, i + 1);
    }
  }
  return { values, errorAt: needNumber ? n : -1 };
}
