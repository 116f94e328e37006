/**
 * A sink that writes SVG path data text (W3C SVG 1.1 §8.3, grammar §8.3.9).
 *
 * Short output without losing anything:
 * - each segment is written absolute or relative, whichever text is shorter
 *   (absolute on a tie); relative numbers are taken from the current point as
 *   a reader will hold it (the sum of the rounded numbers it has read), so
 *   rounding errors never accumulate along a run of relative commands;
 * - `H`/`V` when the rounded move is exactly horizontal/vertical;
 * - separators only where the grammar needs them: none before `-`, none
 *   before `.` when the previous number already has a `.`, none next to a
 *   command letter; a command letter is left out when the grammar implies it
 *   (a repeat, or `L`/`l` after `M`/`m`);
 * - arc flags are single `0`/`1` characters, but each is still set apart by a
 *   space: the grammar lets a reader run flags together (S2 §9.3.9), yet
 *   common regex-based readers (svg-path-properties 1.3.0 `parse.ts`) split
 *   numbers on their own and misread `1025` in a run of arcs.
 */
import type { PathSink } from './sink.js';
import { angleDigits, formatNumber } from './numbers.js';

/** Options of a {@link PathWriter}. */
export interface PathWriterOptions {
  /** Decimal places for coordinates (user units). */
  digits: number;
  /**
   * Decimal places for arc radii; default digits + 6. Radii pre-rounded by the
   * caller to fewer places come out exactly as given (trailing zeros dropped).
   * A radius rounded to the coordinate digits can move a near-semicircle's
   * centre by √(chord·10^−digits), far more than the rounding (see emit.ts).
   */
  radiusDigits?: number;
}

/** The command letter a reader assumes when the letter is left out after `cmd` ('' = none). */
function impliedAfter(cmd: string): string {
  if (cmd === 'M') return 'L';
  if (cmd === 'm') return 'l';
  if (cmd === 'Z' || cmd === 'z') return '';
  return cmd;
}

/** Separator needed between the number `prev` ('' after a letter) and the number `next`. */
function separator(prev: string, next: string): string {
  if (prev === '') return '';
  const c = next.charCodeAt(0);
  if (c === 45) return ''; // '-' always starts a new number
  if (c === 46 && prev.indexOf('.') >= 0) return ''; // a second '.' ends the previous number (`0.6.5`)
  return ' ';
}

/** SVG path data writer; see the module header for what it shortens. */
export class PathWriter implements PathSink {
  private readonly digits: number;
  private readonly radiusDigits: number;
  private readonly parts: string[] = [];
  /** Last number written ('' when the last thing written was a letter). */
  private lastNum = '';
  /** Last command letter in force (written or implied). */
  private lastCmd = '';
  /** Current point and subpath start as the reader holds them. */
  private cx = 0;
  private cy = 0;
  private sx = 0;
  private sy = 0;
  private started = false;

  constructor(opts: PathWriterOptions) {
    this.digits = opts.digits;
    this.radiusDigits = opts.radiusDigits ?? opts.digits + 6;
    formatNumber(0, this.digits); // validates both digit counts up front
    formatNumber(0, this.radiusDigits);
  }

  /** Text of `letter` + `nums` if appended now (the letter dropped when implied). */
  private piece(letter: string, nums: readonly string[]): string {
    let s = '';
    let prev = this.lastNum;
    if (impliedAfter(this.lastCmd) !== letter || nums.length === 0) {
      s = letter;
      prev = '';
    }
    for (const t of nums) {
      s += separator(prev, t) + t;
      prev = t;
    }
    return s;
  }

  private commit(letter: string, nums: readonly string[], text: string): void {
    this.parts.push(text);
    this.lastCmd = letter;
    this.lastNum = nums.length > 0 ? nums[nums.length - 1] : '';
  }

  /** Pick the shorter of an absolute and a relative form (absolute on a tie) and write it. */
  private choose(absL: string, absN: string[], relL: string, relN: string[]): boolean {
    const a = this.piece(absL, absN), r = this.piece(relL, relN);
    if (r.length < a.length) {
      this.commit(relL, relN, r);
      return false;
    }
    this.commit(absL, absN, a);
    return true;
  }

  moveTo(x: number, y: number): void {
    const d = this.digits;
    const ax = formatNumber(x, d), ay = formatNumber(y, d);
    if (!this.started) {
      // The first moveto is absolute either way (S2 §9.3.3); write it as such.
      this.commit('M', [ax, ay], this.piece('M', [ax, ay]));
      this.cx = Number(ax);
      this.cy = Number(ay);
    } else {
      const rx = formatNumber(Number(ax) - this.cx, d), ry = formatNumber(Number(ay) - this.cy, d);
      if (this.choose('M', [ax, ay], 'm', [rx, ry])) {
        this.cx = Number(ax);
        this.cy = Number(ay);
      } else {
        this.cx += Number(rx);
        this.cy += Number(ry);
      }
    }
    this.started = true;
    this.sx = this.cx;
    this.sy = this.cy;
  }

  lineTo(x: number, y: number): void {
    const d = this.digits;
    const ax = formatNumber(x, d), ay = formatNumber(y, d);
    const rx = formatNumber(Number(ax) - this.cx, d), ry = formatNumber(Number(ay) - this.cy, d);
    this.started = true;
    if (ry === '0') {
      if (this.choose('H', [ax], 'h', [rx])) this.cx = Number(ax);
      else this.cx += Number(rx);
    } else if (rx === '0') {
      if (this.choose('V', [ay], 'v', [ry])) this.cy = Number(ay);
      else this.cy += Number(ry);
    } else if (this.choose('L', [ax, ay], 'l', [rx, ry])) {
      this.cx = Number(ax);
      this.cy = Number(ay);
    } else {
      this.cx += Number(rx);
      this.cy += Number(ry);
    }
  }

  /**
   * Write one segment of source path data as it was read: absolute, every number exactly as the double
   * holds it (shortest round-trip form), so a kept source subpath draws exactly what it drew.
   * @param letter 'M', 'L', 'C', 'Q' or 'A' (arc flags as 0/1)
   * @param nums the segment's absolute arguments (pathTypes.ts order); the last two are its end point
   */
  exact(letter: 'M' | 'L' | 'C' | 'Q' | 'A', nums: ArrayLike<number>): void {
    const t = Array.from(nums, (v) => String(v === 0 ? 0 : v));
    // A letter is always written, numbers set apart by spaces (arc flags too, see the header).
    this.parts.push(letter + t.join(' '));
    this.lastCmd = letter;
    this.lastNum = t[t.length - 1];
    this.cx = nums[nums.length - 2];
    this.cy = nums[nums.length - 1];
    if (letter === 'M') {
      this.sx = this.cx;
      this.sy = this.cy;
    }
    this.started = true;
  }

  /**
   * Radii are written as |rx|, |ry| (readers take absolute values, F.6.6 step 2);
   * the rotation is reduced to [0°, 180°) (an ellipse turned by 180° is the same
   * ellipse, so the arc is unchanged) and written as 0 when the written radii
   * are equal (a circle has no orientation).
   */
  arcTo(rx: number, ry: number, rotation: number, largeArc: boolean, sweep: boolean, x: number, y: number): void {
    const d = this.digits;
    const trx = formatNumber(Math.abs(rx), this.radiusDigits);
    const tr_y = formatNumber(Math.abs(ry), this.radiusDigits);
    let trot = '0';
    if (trx !== tr_y) {
      const k = angleDigits(this.radiusDigits, Math.max(Math.abs(rx), Math.abs(ry)));
      let rot = Number(formatNumber(((rotation % 180) + 180) % 180, k));
      if (rot >= 180) rot -= 180;
      trot = formatNumber(rot, k);
    }
    const fa = largeArc ? '1' : '0', fs = sweep ? '1' : '0';
    const ax = formatNumber(x, d), ay = formatNumber(y, d);
    const ex = formatNumber(Number(ax) - this.cx, d), ey = formatNumber(Number(ay) - this.cy, d);
    this.started = true;
    if (this.choose('A', [trx, tr_y, trot, fa, fs, ax, ay], 'a', [trx, tr_y, trot, fa, fs, ex, ey])) {
      this.cx = Number(ax);
      this.cy = Number(ay);
    } else {
      this.cx += Number(ex);
      this.cy += Number(ey);
    }
  }

  /** `Z`; the current point returns to the subpath start (S2 §9.3.4). */
  closePath(): void {
    this.commit('Z', [], 'Z');
    this.cx = this.sx;
    this.cy = this.sy;
  }

  /** The path data written so far. */
  toString(): string {
    return this.parts.join('');
  }
}
