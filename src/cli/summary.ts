/**
 * The human-readable lines the CLI prints on standard error for each file: one
 * summary line (segments, measured deviation, bytes) and one line per warning
 * or per element kept because the tolerance could not be met.
 */
import type { ElementReport, FileReport, MachineSummary } from '../report/types.js';
import { countOf, elementTag } from '../report/table.js';
import { isOverTolerance } from '../report/status.js';

/** Colouring functions; identity when colour is off. */
export interface Paint {
  bold(s: string): string;
  green(s: string): string;
  yellow(s: string): string;
  red(s: string): string;
}

const id = (s: string): string => s;
/** No colour. */
export const PLAIN: Paint = Object.freeze({ bold: id, green: id, yellow: id, red: id });
const sgr = (on: number, off: number) => (s: string): string => `\x1b[${on}m${s}\x1b[${off}m`;
/** ANSI SGR colours (ECMA-48). */
export const ANSI: Paint = Object.freeze({ bold: sgr(1, 22), green: sgr(32, 39), yellow: sgr(33, 39), red: sgr(31, 39) });

/**
 * Colour only on a terminal and when NO_COLOR is unset or empty (the NO_COLOR
 * convention, no-color.org: common practice).
 */
export function choosePaint(isTTY: boolean, env: Record<string, string | undefined>): Paint {
  return isTTY && !env.NO_COLOR ? ANSI : PLAIN;
}

/** Byte count in SI units: 950 B, 32.5 kB, 1.2 MB (1 kB = 1000 B). */
export function formatBytes(n: number): string {
  if (n < 1000) return `${n} B`;
  if (n < 1e6) return `${(n / 1e3).toFixed(1)} kB`;
  return `${(n / 1e6).toFixed(1)} MB`;
}

/** A length in mm for reading: 2 significant digits, no trailing zeros beyond them. */
export function formatMm(v: number): string {
  return `${+v.toPrecision(2)} mm`;
}

/** A tolerance as given (up to 6 significant digits, trailing zeros dropped), in mm. */
export function formatTolerance(v: number): string {
  return `${+v.toPrecision(6)} mm`;
}


/** Elements kept unchanged because their measured deviation is over the tolerance. */
export function overTolerance(report: FileReport): ElementReport[] {
  return report.elements.filter(isOverTolerance);
}

/** Drawing commands of the rewritten elements: the ones the new segments replace (kept elements keep theirs). */
export function commandsReplaced(report: FileReport): number {
  let n = 0;
  for (const e of report.elements) if (!e.kept) for (const k in e.commandsBefore) n += e.commandsBefore[k];
  return n;
}

/**
 * "2799 of 2801 commands": the commands replaced, and the file's total as the
 * report and the table count it (every element), when the two differ.
 */
export function commandsText(replaced: number, total: number): string {
  return replaced === total ? countOf(total, 'command') : `${replaced} of ${countOf(total, 'command')}`;
}

/**
 * One line for one file, e.g. `bracket.svg: 2799 of 2801 commands → 33 segments
 * (27 arcs, 6 lines) in 5 of 7 elements, max deviation 0.086 mm ≤ 0.1 mm,
 * 32.5 kB → 2.0 kB`.
 * @param sizes the files' sizes read and written (gzip, UTF-16); without them the report's UTF-8 sizes
 */
export function summaryLine(name: string, report: FileReport, paint: Paint = PLAIN, sizes?: { in: number; out: number }): string {
  if (report.machine) return machineSummaryLine(name, report, report.machine, paint);
  const t = report.totals;
  const bytes = `${formatBytes(sizes?.in ?? report.bytesIn)} → ${formatBytes(sizes?.out ?? report.bytesOut)}`;
  const head = `${paint.bold(name)}:`;
  if (t.elements === 0) return `${head} no paths or shapes to refit, ${bytes}`;
  const over = overTolerance(report).length;
  const overText = over > 0 ? paint.red(`; ${countOf(over, 'element')} over the tolerance kept unchanged`) : '';
  if (t.rewritten === 0) return `${head} nothing refitted (${countOf(t.elements, 'element')} kept as written), ${bytes}${overText}`;
  const { arcs, lines } = t.segmentsAfter;
  const dev = `max deviation ${formatMm(t.maxDeviation)} ≤ ${formatTolerance(report.toleranceMm)}`;
  return (
    `${head} ${commandsText(commandsReplaced(report), t.commandsBefore)} → ${countOf(arcs + lines, 'segment')} (${countOf(arcs, 'arc')}, ${countOf(lines, 'line')})` +
    ` in ${t.rewritten} of ${countOf(t.elements, 'element')}, ${paint.green(dev)}, ${bytes}${planText(report)}${overText}`
  );
}

/** The summary of a machine file: lines and moves, the deviation read back, the estimated time against straight moves. */
function machineSummaryLine(name: string, report: FileReport, m: MachineSummary, paint: Paint): string {
  const t = report.totals;
  const what = m.format === 'gcode' ? 'G-code' : 'DXF';
  const over = overTolerance(report).length;
  const moves = `${countOf(m.moves.arcs, 'arc')}, ${countOf(m.moves.lines, 'line')}${m.format === 'gcode' ? `, ${countOf(m.moves.travels, 'travel')}` : ''}`;
  const dev = `read back: max deviation ${formatMm(t.maxDeviation)} ≤ ${formatTolerance(report.toleranceMm)}`;
  const time = `est. ${m.seconds.toFixed(1)} s (as ${m.straight.moves} straight moves ${m.straight.seconds.toFixed(1)} s, profile ${m.profile})`;
  const overText = over > 0 ? paint.red(`; ${countOf(over, 'element')} over the tolerance written as straight moves`) : '';
  const checked = m.checked ? paint.green(dev) : paint.red(`${dev}; the check found problems`);
  return `${paint.bold(name)}: ${what} ${countOf(m.lines, 'line')} (${moves}) from ${countOf(t.elements, 'element')}, ${checked}, ${time}${planText(report)}${overText}`;
}

/** A length of travel or line for reading: mm below a metre, m above. */
function formatLength(mm: number): string {
  return mm < 1000 ? `${+mm.toPrecision(3)} mm` : `${+(mm / 1000).toPrecision(3)} m`;
}

/** With the path plan: "; plan: travel 52.4 m → 4.25 m, 2142 → 2101 pierces, 41 joined, 4.35 m of double lines removed". */
export function planText(report: FileReport): string {
  const p = report.plan;
  if (!p) return '';
  const parts = [`travel ${formatLength(p.travelBeforeMm)} → ${formatLength(p.travelAfterMm)}`, `${p.piercesBefore} → ${countOf(p.piercesAfter, 'pierce')}`];
  if (p.contoursJoined > 0) parts.push(`${p.contoursJoined} joined`);
  if (p.doubleLinesMm > 0) parts.push(`${formatLength(p.doubleLinesMm)} of double lines removed`);
  return `; plan: ${parts.join(', ')}`;
}

/** One line per warning and per element kept over the tolerance, each prefixed by the file name. */
export function problemLines(name: string, report: FileReport, paint: Paint = PLAIN): string[] {
  const out: string[] = [];
  for (const w of report.warnings) out.push(`${name}: ${paint.yellow('warning:')} ${w.replace(/\s*[\r\n]+\s*/g, ' ')}`);
  for (const e of overTolerance(report)) {
    const label = report.machine ? 'written as straight moves:' : 'kept unchanged:';
    out.push(`${name}: ${paint.red(label)} ${elementTag(e)}: ${e.keptReason ?? 'over the tolerance'}`);
  }
  return out;
}
