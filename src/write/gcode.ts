/**
 * G-code (RS274/NGC words, NIST RS274NGC v3) as a machine sink: G0 travel, G1
 * lines, G2/G3 arcs in the centre format (I, J = centre − start point, always
 * incremental, §3.5.3), F in mm/min (G94), tool lines from a machine profile.
 *
 * Rounding (../../shared/REFERENCES.md §12.1, writer rule from G5): the end
 * point is rounded first; the centre is then moved to the nearest point of the
 * perpendicular bisector of the *rounded* start and end, and only then are I
 * and J rounded. The two radii then differ by at most √2·q (q = 10^−digits),
 * so an interpreter's radius check (0.002 mm in NIST §3.5.3.2) passes from 3
 * decimals on. A move whose rounded end is the current point is left out; an
 * arc whose sagitta is below one quantum is written as a line.
 *
 * Comments are `( … )` with parentheses and control characters taken out of
 * the text, since a comment may not contain another "(" (NIST §3.3.4).
 */
import type { MachineGroupStart, MachineSink } from '../machine/sink.js';
import { arcOnRoundedChord } from '../machine/roundedArc.js';
import { colourSettings, fillLine, type MachineProfile } from '../machine/profile.js';
import { formatNumber } from './numbers.js';

/** Options of {@link GcodeWriter}. */
export interface GcodeWriterOptions {
  profile: MachineProfile;
  /** Decimals of every coordinate, offset and feed (mm). */
  digits: number;
}

/** What a {@link GcodeWriter} wrote. */
export interface GcodeStats {
  travels: number;
  lines: number;
  arcs: number;
  /** Moves left out because their rounded end is the current point. */
  skipped: number;
  /** Arcs written as a line because their sagitta is below one quantum. */
  flat: number;
}

/** A number as a G-code word value: fixed decimals, trailing zeros dropped, a leading 0 kept, never an exponent or "-0". */
export function gcodeNumber(v: number, digits: number): string {
  const s = formatNumber(v, digits);
  if (s.charCodeAt(0) === 46) return '0' + s; // ".5" → "0.5"
  if (s.charCodeAt(0) === 45 && s.charCodeAt(1) === 46) return '-0' + s.slice(1); // "-.5" → "-0.5"
  return s;
}

/** Text safe inside a ( … ) comment: one line, no parentheses. */
export function commentText(s: string): string {
  // eslint-disable-next-line no-control-regex
  return s.replace(/[()]/g, (c) => (c === '(' ? '[' : ']')).replace(/[\u0000-\u001f\u007f]/g, ' ');
}

/** Writes a G-code program; {@link GcodeWriter.toString} gives the text (without a header, see ../machine/gcodeHeader). */
export class GcodeWriter implements MachineSink {
  readonly stats: GcodeStats = { travels: 0, lines: 0, arcs: 0, skipped: 0, flat: 0 };
  private readonly out: string[] = [];
  private readonly p: MachineProfile;
  private readonly d: number;
  private readonly q: number;
  /** Current position as written (rounded). */
  private x = NaN;
  private y = NaN;
  private toolOn = false;
  private feedWritten = NaN;
  private power = 0;
  private feed = 0;
  private finished = false;

  constructor(opts: GcodeWriterOptions) {
    this.p = opts.profile;
    this.d = opts.digits;
    this.q = Math.pow(10, -opts.digits);
    // Modes first: the numbers below mean nothing without them (NIST: program G20/G21 before motion).
    this.out.push('G21 G90 G17 G94', ...this.p.preamble);
  }

  private n(v: number): string {
    return gcodeNumber(v, this.d);
  }

  private r(v: number): number {
    return Number(formatNumber(v, this.d));
  }

  private tool(on: boolean): void {
    if (on === this.toolOn) return;
    const ls = on ? this.p.toolOn : this.p.toolOff;
    for (const l of ls) this.out.push(fillLine(l, this.power, this.feed, (v) => gcodeNumber(v, Math.max(this.d, 3))));
    this.toolOn = on;
    // A tool line may set its own feed (a pen's plunge): write F again on the next work move.
    this.feedWritten = NaN;
  }

  beginElement(el: MachineGroupStart): void {
    const s = colourSettings(this.p, el.group);
    if (this.toolOn && (s.power !== this.power || s.feed !== this.feed)) this.tool(false);
    this.power = s.power;
    this.feed = s.feed;
    this.out.push(`(${commentText(`element ${el.index}${el.copy ? ` copy ${el.copy}` : ''} ${el.label} stroke ${el.group}`)})`);
  }

  moveTo(x: number, y: number): void {
    const rx = this.r(x), ry = this.r(y);
    if (rx === this.x && ry === this.y) return;
    this.tool(false);
    this.out.push(`G0 X${this.n(rx)} Y${this.n(ry)}`);
    this.x = rx;
    this.y = ry;
    this.stats.travels++;
  }

  private work(): string {
    this.tool(true);
    if (this.feedWritten === this.feed) return '';
    this.feedWritten = this.feed;
    return ` F${this.n(this.feed)}`;
  }

  lineTo(x: number, y: number): void {
    const rx = this.r(x), ry = this.r(y);
    if (rx === this.x && ry === this.y) {
      this.stats.skipped++;
      return;
    }
    const f = this.work();
    this.out.push(`G1 X${this.n(rx)} Y${this.n(ry)}${f}`);
    this.x = rx;
    this.y = ry;
    this.stats.lines++;
  }

  arcTo(x: number, y: number, cx: number, cy: number, ccw: boolean): void {
    const sx = this.x, sy = this.y;
    const ex = this.r(x), ey = this.r(y);
    if (ex === sx && ey === sy) {
      this.stats.skipped++;
      return;
    }
    const a = arcOnRoundedChord(sx, sy, ex, ey, cx, cy, ccw, this.q);
    if (a === null) {
      this.stats.flat++;
      this.lineTo(ex, ey);
      return;
    }
    const i = this.r(a.ox - sx), j = this.r(a.oy - sy);
    const f = this.work();
    this.out.push(`${ccw ? 'G3' : 'G2'} X${this.n(ex)} Y${this.n(ey)} I${this.n(i)} J${this.n(j)}${f}`);
    this.x = ex;
    this.y = ey;
    this.stats.arcs++;
  }

  finish(): void {
    if (this.finished) return;
    this.tool(false);
    this.out.push(...this.p.end);
    this.finished = true;
  }

  /** The program so far, one line per entry (without a header). */
  lines(): readonly string[] {
    return this.out;
  }

  /** The program text, lines ended by "\n". */
  toString(): string {
    return this.out.join('\n') + '\n';
  }
}

/** What the header comment of a program states. */
export interface GcodeHeaderInfo {
  tool: string;
  profile: MachineProfile;
  source: string | null;
  toleranceMm: number;
  /** Largest measured deviation of the read-back program from the drawing, mm (null when nothing was drawn). */
  deviationMm: number | null;
  origin: string;
  /** Estimated machine time, seconds (null when not estimated). */
  seconds: number | null;
}

/** Comment lines that open a program: tool, source, tolerance and measured deviation, frame, time, a caution. */
export function gcodeHeader(h: GcodeHeaderInfo): string[] {
  const c = (s: string): string => `(${commentText(s)})`;
  const out = [
    c(`${h.tool}: ${h.profile.name} profile, ${h.profile.description}`),
    c(`source ${h.source ?? 'standard input'}`),
    c(`tolerance ${+h.toleranceMm.toPrecision(6)} mm, measured deviation ${h.deviationMm === null ? 'none drawn' : `${+h.deviationMm.toPrecision(3)} mm`} (program read back independently)`),
    c(`units mm, X right, Y up, origin at the page's ${h.origin} corner`),
  ];
  if (h.seconds !== null) out.push(c(`estimated time ${h.seconds.toFixed(1)} s (motion model, see README)`));
  out.push(c('check this program in a simulator or a dry run with the tool off before running it'));
  return out;
}
