/**
 * SVG path data (`d`) → flat absolute {@link ParsedPath} (layout in pathTypes.ts).
 *
 * Grammar: S2 §9.3.9 `#PathDataBNF`, S11 §8.3.9 (REFERENCES.md §2.2).
 * Semantics: S2 §9.3.3–9.3.8, reflection S2 §9.5.2, errors S2 §9.5.4.
 *
 * One pass over char codes; numbers via the shared scanner (numbers.ts);
 * output into typed arrays that double when full.
 *
 * Resolved here, so consumers see only OP_M/L/C/Q/A/Z with absolute values:
 * relative coordinates (relative to the current point at the start of each
 * segment, control points included), H/V → OP_L, S/T → OP_C/OP_Q with the
 * reflected control point, implicit repeats (after M/m they are L/l).
 * After Z the current point is the subpath start; a drawing command that
 * follows Z directly starts a new subpath there, so an OP_M is emitted first
 * (this OP_M is not counted in `counts`).
 *
 * `counts[letter]` = parameter groups (segments) read under that letter as
 * written: `M 0 0 10 10` gives { M: 2 } (the moveto and its implicit lineto),
 * each Z/z counts 1.
 *
 * Errors (S2 §9.5.4): every complete segment before the first error is kept;
 * `error.offset` is the character where reading failed. Decisions: an empty
 * or all-whitespace `d`, and `none`, give an empty path without error; a
 * comma before a command letter or at the end is an error (the grammar only
 * allows commas between numbers); a number that overflows to ±Infinity is an
 * error. Arc flags are single characters `0`/`1`, separators after them
 * optional (`a25 25 0 1025 25`).
 */
import { OP_A, OP_C, OP_L, OP_M, OP_Q, OP_Z, OP_ARGS, type ParsedPath, type PathData } from './pathTypes.js';
import { type NumberScan, scanNumber, skipWsp } from './numbers.js';

// Imported bindings copied into module constants once: test runners and
// loaders that rewrite imports into namespace getters (vitest, tsx) otherwise
// pay a getter call per token on the hot path (measured: about 3x slower
// under vitest without these copies).
const scanNum = scanNumber;
const skipWs = skipWsp;
const ARGS_PER_OP: readonly number[] = OP_ARGS;
const K_M = OP_M, K_L = OP_L, K_C = OP_C, K_Q = OP_Q, K_A = OP_A, K_Z = OP_Z;

/** A copy of `a` with at least `need` more room (doubling), the first `used` entries kept. */
function growOps(a: Uint8Array, used: number, need: number): Uint8Array<ArrayBuffer> {
  const o = new Uint8Array(a.length * 2 + need);
  o.set(a.subarray(0, used));
  return o;
}

/** Float64Array counterpart of {@link growOps}. */
function growArgs(a: Float64Array, used: number, need: number): Float64Array<ArrayBuffer> {
  const o = new Float64Array(a.length * 2 + need);
  o.set(a.subarray(0, used));
  return o;
}

/** Parameters per group for each command letter (lower-case index). */
function arity(lc: number): number {
  switch (lc) {
    case 109: case 108: case 116: return 2; // m l t
    case 104: case 118: return 1; // h v
    case 99: return 6; // c
    case 115: case 113: return 4; // s q
    case 97: return 7; // a
    case 122: return 0; // z
    default: return -1;
  }
}

/** True if `c` can begin a number: digit, sign or '.'. */
function startsNumber(c: number): boolean {
  return (c >= 48 && c <= 57) || c === 45 || c === 43 || c === 46;
}

/**
 * Parse SVG path data.
 * @param d the `d` attribute value
 * @returns absolute segments in the element's user units, per-letter counts,
 *   and the first error (or null)
 */
export function parsePathData(d: string): ParsedPath {
  const n = d.length;
  let ops = new Uint8Array(Math.max(16, n >> 3));
  let args = new Float64Array(Math.max(32, n >> 2));
  let nOps = 0;
  let nArgs = 0;
  const letterCounts = new Int32Array(128);
  const scan: NumberScan = { value: 0, end: 0 };
  const v = new Float64Array(7);
  let error: { offset: number; message: string } | null = null;

  let cx = 0, cy = 0; // current point
  let sx = 0, sy = 0; // subpath start
  let lx = 0, ly = 0; // last control point of the previous segment
  let lastKind = 0; // 1 cubic (C/S), 2 quadratic (Q/T), 0 other
  let needMove = false; // after Z: a drawing command must first emit OP_M at (sx, sy)

  let i = skipWs(d, 0);
  const isNone = d.startsWith('none', i) && skipWs(d, i + 4) === n;
  if (i < n && !isNone) {
    const c0 = d.charCodeAt(i);
    if (c0 !== 77 && c0 !== 109) {
      error = { offset: i, message: `path data must begin with M or m, found "${d[i]}" at offset ${i}` };
    }
  }
  let cmd = 0; // current command letter (char code), 0 before the first; M/m becomes L/l
  let written = 0; // the letter as written, for counts
  let commaPending = false;

  while (error === null && i < n && !isNone) {
    const c = d.charCodeAt(i);
    let letter: number;
    if (!startsNumber(c)) {
      const lc = c | 0x20;
      if (c > 127 || arity(lc) < 0) {
        error = { offset: i, message: `unexpected "${d[i]}" at offset ${i}` };
        break;
      }
      if (commaPending) {
        error = { offset: i, message: `comma before command "${d[i]}" at offset ${i}` };
        break;
      }
      letter = c;
      cmd = c;
      written = c;
      i = skipWs(d, i + 1);
      if ((c | 0x20) === 122) { // z / Z: no parameters
        if (nOps + 2 > ops.length) ops = growOps(ops, nOps, 2);
        if (nArgs + 2 > args.length) args = growArgs(args, nArgs, 2);
        if (needMove) { // Z Z: the second closes an empty subpath at the same start
          ops[nOps++] = K_M;
          args[nArgs++] = sx;
          args[nArgs++] = sy;
        }
        ops[nOps++] = K_Z;
        letterCounts[c]++;
        cx = sx;
        cy = sy;
        lastKind = 0;
        needMove = true;
        continue;
      }
    } else {
      // implicit repeat of the previous command
      if (cmd === 0 || (cmd | 0x20) === 122) {
        error = { offset: i, message: `number without a command at offset ${i}` };
        break;
      }
      letter = cmd;
    }
    commaPending = false;
    const lc = letter | 0x20;
    const rel = letter >= 97; // lower-case letter: relative
    const k = arity(lc);
    // read one parameter group into v[0..k)
    let ok = true;
    for (let p = 0; p < k; p++) {
      if (lc === 97 && (p === 3 || p === 4)) { // arc flags: one character '0' or '1'
        const f = i < n ? d.charCodeAt(i) : -1;
        if (f !== 48 && f !== 49) {
          error = { offset: i, message: `arc flag must be 0 or 1 at offset ${i}` };
          ok = false;
          break;
        }
        v[p] = f - 48;
        i++;
      } else {
        if (!scanNum(d, i, scan)) {
          error = { offset: i, message: i < n ? `expected a number for "${String.fromCharCode(letter)}", found "${d[i]}" at offset ${i}` : `expected a number for "${String.fromCharCode(letter)}" at end of data (offset ${i})` };
          ok = false;
          break;
        }
        if (!Number.isFinite(scan.value)) {
          error = { offset: i, message: `number out of range at offset ${i}` };
          ok = false;
          break;
        }
        v[p] = scan.value;
        i = scan.end;
      }
      // separator: wsp* ","? wsp*; a comma after the last parameter must be followed by a number
      i = skipWs(d, i);
      if (i < n && d.charCodeAt(i) === 44) {
        i = skipWs(d, i + 1);
        if (p === k - 1) commaPending = true;
        else if (i >= n) {
          error = { offset: i, message: `expected a number after "," at end of data (offset ${i})` };
          ok = false;
          break;
        }
      }
    }
    if (!ok) break;

    // emit the complete segment
    if (nOps + 2 > ops.length) ops = growOps(ops, nOps, 2);
    if (nArgs + 9 > args.length) args = growArgs(args, nArgs, 9);
    if (needMove && lc !== 109) {
      ops[nOps++] = K_M;
      args[nArgs++] = sx;
      args[nArgs++] = sy;
    }
    needMove = false;
    letterCounts[written]++;
    const ox = rel ? cx : 0, oy = rel ? cy : 0;
    let op: number;
    switch (lc) {
      case 109: // m
        op = K_M;
        cx = v[0] + ox; cy = v[1] + oy;
        sx = cx; sy = cy;
        v[0] = cx; v[1] = cy;
        cmd = rel ? 108 : 76; // further pairs are l / L
        lastKind = 0;
        break;
      case 108: // l
        op = K_L;
        cx = v[0] + ox; cy = v[1] + oy;
        v[0] = cx; v[1] = cy;
        lastKind = 0;
        break;
      case 104: // h
        op = K_L;
        cx = v[0] + ox;
        v[0] = cx; v[1] = cy;
        lastKind = 0;
        break;
      case 118: // v
        op = K_L;
        cy = v[0] + oy;
        v[0] = cx; v[1] = cy;
        lastKind = 0;
        break;
      case 99: // c
        op = K_C;
        v[0] += ox; v[1] += oy; v[2] += ox; v[3] += oy; v[4] += ox; v[5] += oy;
        lx = v[2]; ly = v[3]; cx = v[4]; cy = v[5];
        lastKind = 1;
        break;
      case 115: { // s: cp1 reflected from a previous C/S, else the current point (S2 §9.5.2)
        op = K_C;
        const x2 = v[0] + ox, y2 = v[1] + oy, x = v[2] + ox, y = v[3] + oy;
        v[0] = lastKind === 1 ? 2 * cx - lx : cx;
        v[1] = lastKind === 1 ? 2 * cy - ly : cy;
        v[2] = x2; v[3] = y2; v[4] = x; v[5] = y;
        lx = x2; ly = y2; cx = x; cy = y;
        lastKind = 1;
        break;
      }
      case 113: // q
        op = K_Q;
        v[0] += ox; v[1] += oy; v[2] += ox; v[3] += oy;
        lx = v[0]; ly = v[1]; cx = v[2]; cy = v[3];
        lastKind = 2;
        break;
      case 116: { // t: control point reflected from a previous Q/T (its inferred one for T)
        op = K_Q;
        const x = v[0] + ox, y = v[1] + oy;
        const qx = lastKind === 2 ? 2 * cx - lx : cx;
        const qy = lastKind === 2 ? 2 * cy - ly : cy;
        v[0] = qx; v[1] = qy; v[2] = x; v[3] = y;
        lx = qx; ly = qy; cx = x; cy = y;
        lastKind = 2;
        break;
      }
      default: // a: only the end point is relative
        op = K_A;
        v[5] += ox; v[6] += oy;
        cx = v[5]; cy = v[6];
        lastKind = 0;
        break;
    }
    const na = ARGS_PER_OP[op];
    ops[nOps++] = op;
    for (let q = 0; q < na; q++) args[nArgs++] = v[q];
  }
  if (error === null && commaPending) {
    error = { offset: n, message: `trailing comma at end of path data (offset ${n})` };
  }

  const counts: Record<string, number> = {};
  for (let c = 0; c < 128; c++) if (letterCounts[c] > 0) counts[String.fromCharCode(c)] = letterCounts[c];
  return { ops: ops.slice(0, nOps), args: args.slice(0, nArgs), counts, error };
}

/**
 * Plain absolute serialisation (`M x y L x y C … A rx ry rot fA fS x y Z`),
 * numbers in shortest round-trip form. For tests and fallbacks, not for
 * the writer's rounded output.
 */
export function pathDataToString(p: PathData): string {
  const parts: string[] = [];
  const letters: string[] = [];
  letters[K_M] = 'M'; letters[K_L] = 'L'; letters[K_C] = 'C';
  letters[K_Q] = 'Q'; letters[K_A] = 'A'; letters[K_Z] = 'Z';
  let k = 0;
  for (let s = 0; s < p.ops.length; s++) {
    const op = p.ops[s];
    const na = ARGS_PER_OP[op];
    let t = letters[op];
    for (let q = 0; q < na; q++) t += ' ' + String(p.args[k + q]);
    k += na;
    parts.push(t);
  }
  return parts.join(' ');
}
