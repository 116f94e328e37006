/**
 * The batch totals and the table printed at the end of a batch on standard
 * error: files, segments before and after, bytes before and after, the worst
 * measured deviation and where, failures, time.
 */
import type { FileReport } from '../report/types.js';
import { commandsReplaced, commandsText, formatBytes, formatMm, formatTolerance, overTolerance, type Paint, PLAIN } from './summary.js';

/** Running totals of a batch. */
export interface BatchTotals {
  /** Files in the batch (SVG files found or named). */
  files: number;
  /** Files whose text changed. */
  refitted: number;
  /** Files read and measured that needed no change. */
  unchanged: number;
  /** Files that could not be read or refitted. */
  failed: number;
  /** Files with an element kept because the tolerance could not be met. */
  overTolerance: number;
  /** Non-SVG files skipped in directories and pattern matches. */
  ignored: number;
  /** Drawing commands before in the elements that were rewritten, summed over the files done. */
  commandsBefore: number;
  /** Drawing commands before in every element (the reports' totals.commandsBefore), summed over the files done. */
  commandsTotal: number;
  arcs: number;
  lines: number;
  bytesIn: number;
  bytesOut: number;
  /** Largest measured deviation over all files, mm. */
  worstDeviation: number;
  /** The file it occurs in, or null. */
  worstFile: string | null;
  toleranceMm: number;
}

/** Empty totals for `files` files. */
export function newTotals(files: number, ignored: number, toleranceMm: number): BatchTotals {
  return {
    files, refitted: 0, unchanged: 0, failed: 0, overTolerance: 0, ignored,
    commandsBefore: 0, commandsTotal: 0, arcs: 0, lines: 0, bytesIn: 0, bytesOut: 0, worstDeviation: 0, worstFile: null, toleranceMm,
  };
}

/** Count one finished file. */
export function addReport(t: BatchTotals, name: string, report: FileReport, changed: boolean): void {
  if (changed) t.refitted++;
  else t.unchanged++;
  if (overTolerance(report).length > 0) t.overTolerance++;
  // As in the per-file summary line: the commands the new segments replace (kept elements keep theirs).
  t.commandsBefore += commandsReplaced(report);
  t.commandsTotal += report.totals.commandsBefore;
  t.arcs += report.totals.segmentsAfter.arcs;
  t.lines += report.totals.segmentsAfter.lines;
  t.bytesIn += report.bytesIn;
  t.bytesOut += report.bytesOut;
  // Only rewritten elements have a deviation that counts (kept ones are the original).
  if (report.totals.rewritten > 0 && (t.worstFile === null || report.totals.maxDeviation > t.worstDeviation)) {
    t.worstDeviation = report.totals.maxDeviation;
    t.worstFile = name;
  }
}

const plural = (n: number, one: string, many = `${one}s`): string => `${n} ${n === 1 ? one : many}`;

/**
 * The table's lines, e.g.
 * ```
 * files      200: 180 refitted, 18 unchanged, 2 failed (3 other files ignored)
 * segments   123456 commands → 4567 (4000 arcs, 567 lines)
 * ```
 * @param seconds wall time of the batch
 * @param jobs number of files refitted at once
 */
export function batchTable(t: BatchTotals, seconds: number, jobs: number, paint: Paint = PLAIN): string[] {
  const row = (k: string, v: string): string => `  ${k.padEnd(10)} ${v}`;
  const ignored = t.ignored > 0 ? ` (${plural(t.ignored, 'other file')} ignored)` : '';
  const failed = t.failed > 0 ? paint.red(`${t.failed} failed`) : '0 failed';
  const pct = t.bytesIn > 0 ? ` (${Math.round((100 * t.bytesOut) / t.bytesIn)} %)` : '';
  const worst = t.worstFile === null
    ? 'nothing refitted'
    : `${formatMm(t.worstDeviation)} ≤ ${formatTolerance(t.toleranceMm)}, in ${t.worstFile}`;
  const problems: string[] = [];
  if (t.failed > 0) problems.push(paint.red(`${plural(t.failed, 'file')} not refitted (named above)`));
  if (t.overTolerance > 0) problems.push(paint.yellow(`${plural(t.overTolerance, 'file')} with elements over the tolerance kept unchanged`));
  const rate = seconds > 0 ? ` (${((t.refitted + t.unchanged + t.failed) / seconds).toFixed(1)} files/s)` : '';
  return [
    paint.bold('arcspline batch summary'),
    row('files', `${t.files}: ${t.refitted} refitted, ${t.unchanged} unchanged, ${failed}${ignored}`),
    row('segments', `${commandsText(t.commandsBefore, t.commandsTotal)} → ${t.arcs + t.lines} (${plural(t.arcs, 'arc')}, ${plural(t.lines, 'line')})`),
    row('bytes', `${formatBytes(t.bytesIn)} → ${formatBytes(t.bytesOut)}${pct}`),
    row('worst', worst),
    row('failures', problems.length > 0 ? problems.join('; ') : 'none'),
    row('time', `${seconds.toFixed(1)} s with ${plural(jobs, 'job')}${rate}`),
  ];
}
