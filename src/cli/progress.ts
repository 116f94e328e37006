/**
 * The batch progress bar on standard error: files done of total, the file
 * most recently started, rate and time left. Drawn on one line that is
 * rewritten in place (carriage return and ECMA-48 "erase in line", CSI 2 K),
 * at most ten times a second; other lines (errors, warnings) are printed above
 * it. Disabled, it prints only those other lines.
 *
 * Time left is estimated from bytes, not files: one large traced drawing can
 * take as long as a hundred icons.
 */
import { formatBytes } from './summary.js';

/** Where the bar is drawn. */
export interface ProgressOut {
  write(text: string): unknown;
}

/** Settings of a {@link Progress}. */
export interface ProgressOptions {
  /** Draw the bar (otherwise only `log` lines are printed). */
  enabled: boolean;
  /** Terminal width in columns; default 80. */
  columns?: number;
  /** Clock in ms; default `performance.now`. */
  now?: () => number;
}

/**
 * Whether to draw a bar: only on a terminal, and not when CI is set (CI
 * services set CI=true, common practice) or when the user asked for quiet.
 */
export function progressWanted(stderrIsTTY: boolean, env: Record<string, string | undefined>, quiet: boolean): boolean {
  const ci = env.CI;
  const underCi = ci !== undefined && ci !== '' && ci !== '0' && ci.toLowerCase() !== 'false';
  return stderrIsTTY && !underCi && !quiet;
}

/** Seconds as `m:ss` or `h:mm:ss`. */
export function formatDuration(s: number): string {
  if (!Number.isFinite(s) || s < 0) return '--:--';
  const t = Math.round(s);
  const h = Math.floor(t / 3600), m = Math.floor((t % 3600) / 60), sec = t % 60;
  const ss = String(sec).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

const REDRAW_MS = 100;
const CLEAR = '\r\x1b[2K';

/** A progress display over a known number of files and bytes. */
export class Progress {
  private done = 0;
  private bytesDone = 0;
  private current = '';
  private shown = false;
  private lastDraw = -Infinity;
  private readonly t0: number;
  private readonly now: () => number;
  private readonly columns: number;

  /**
   * @param out standard error
   * @param total number of files
   * @param totalBytes their sizes added up
   */
  constructor(private readonly out: ProgressOut, readonly total: number, private readonly totalBytes: number, private readonly opts: ProgressOptions) {
    this.now = opts.now ?? (() => performance.now());
    this.columns = Math.max(20, opts.columns ?? 80);
    this.t0 = this.now();
  }

  /** A file was handed to a worker. */
  started(name: string): void {
    this.current = name;
    this.draw(false);
  }

  /** A file is finished (written, or failed). */
  finished(bytes: number): void {
    this.done++;
    this.bytesDone += bytes;
    this.draw(this.done === this.total);
  }

  /** Print a whole line above the bar. */
  log(line: string): void {
    if (this.shown) this.out.write(CLEAR);
    this.out.write(`${line}\n`);
    this.shown = false;
    this.draw(true);
  }

  /** Remove the bar (before the summary table). */
  end(): void {
    if (this.shown) this.out.write(CLEAR);
    this.shown = false;
  }

  /** The bar's text (without control characters), e.g. `12/200 [####------]  6% 3.4 files/s 0:52 left a.svg`. */
  line(): string {
    const elapsed = (this.now() - this.t0) / 1000;
    const frac = this.total === 0 ? 1 : this.done / this.total;
    const width = 20;
    const fill = Math.round(frac * width);
    const bar = `[${'#'.repeat(fill)}${'-'.repeat(width - fill)}]`;
    const rate = elapsed > 0 ? this.done / elapsed : 0;
    const byteRate = elapsed > 0 ? this.bytesDone / elapsed : 0;
    const left = this.bytesDone > 0 ? (this.totalBytes - this.bytesDone) / byteRate : NaN;
    const head = `${this.done}/${this.total} ${bar} ${String(Math.floor(frac * 100)).padStart(3)}% ` +
      `${rate.toFixed(1)} files/s ${formatBytes(Math.round(byteRate))}/s ${formatDuration(left)} left`;
    const room = this.columns - 1 - head.length - 1;
    if (room < 8 || this.current === '') return head.slice(0, this.columns - 1);
    const name = this.current.length > room ? `…${this.current.slice(this.current.length - room + 1)}` : this.current;
    return `${head} ${name}`;
  }

  private draw(force: boolean): void {
    if (!this.opts.enabled) return;
    const t = this.now();
    if (!force && t - this.lastDraw < REDRAW_MS) return;
    this.lastDraw = t;
    this.out.write(`${CLEAR}${this.line()}`);
    this.shown = true;
  }
}
