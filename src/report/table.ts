/**
 * The report as a table for people on a terminal: one row per element, then
 * the totals. Colour (ANSI SGR, ECMA-48) only when asked; the caller decides
 * (a TTY and no NO_COLOR). Widths are measured on the plain text, so colour
 * never shifts a column.
 *
 * The grid helper {@link formatGrid} is shared with the comparison table
 * (./compareTable.ts).
 */
import { isOverTolerance } from './status.js';
import type { ElementReport, FileReport } from './types.js';

/** Options for the tables. */
export interface TableOptions {
  /** Emit ANSI colour codes. */
  color: boolean;
  /** Line width in characters to fit (the last column is shortened); default 100. */
  width?: number;
}

/** How one cell is coloured; 'none' leaves it plain. */
export type Tone = 'none' | 'good' | 'bad' | 'note' | 'head';

/** One cell: plain text, alignment and a tone. */
export interface Cell {
  text: string;
  right?: boolean;
  tone?: Tone;
}

const SGR: Readonly<Record<Tone, [number, number]>> = Object.freeze({
  none: [0, 0], good: [32, 39], bad: [31, 39], note: [33, 39], head: [1, 22],
});

/** `s` in the tone's colour when `color` is on. */
export function paint(s: string, tone: Tone, color: boolean): string {
  if (!color || tone === 'none' || s === '') return s;
  const [on, off] = SGR[tone];
  return `\x1b[${on}m${s}\x1b[${off}m`;
}

/** A distance in mm for reading: 3 significant digits, no exponent above 1e-4 mm. */
export function formatMmValue(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  if (Math.abs(v) < 1e-4) return v.toExponential(1);
  if (Math.abs(v) >= 1000) return v.toFixed(0);
  return String(+v.toPrecision(3));
}

/** Shorten to `n` characters with an ellipsis. */
function clip(s: string, n: number): string {
  if (s.length <= n) return s;
  return n <= 1 ? s.slice(0, Math.max(0, n)) : `${s.slice(0, n - 1)}…`;
}

/** Narrowest a shortened column gets, characters. */
const MIN_SHRUNK = 8;

/**
 * Lay out rows under a header: columns as wide as their widest cell, two
 * spaces apart. When a line would exceed `width`, the columns listed in
 * `shrink` are shortened in that order (the last column first by default),
 * each to no less than 8 characters, with an ellipsis.
 */
export function formatGrid(header: string[], rows: Cell[][], opts: TableOptions, shrink: number[] = [header.length - 1]): string[] {
  const cols = header.length;
  const w = new Array<number>(cols).fill(0);
  for (let c = 0; c < cols; c++) w[c] = header[c].length;
  for (const r of rows) for (let c = 0; c < cols; c++) w[c] = Math.max(w[c], r[c]?.text.length ?? 0);
  let over = w.reduce((s, x) => s + x, 0) + 2 * (cols - 1) - (opts.width ?? 100);
  for (const c of shrink) {
    if (over <= 0) break;
    const cut = Math.min(over, Math.max(0, w[c] - Math.max(MIN_SHRUNK, header[c].length)));
    w[c] -= cut;
    over -= cut;
  }
  const line = (cells: Cell[]): string => {
    const out: string[] = [];
    for (let c = 0; c < cols; c++) {
      const cell = cells[c] ?? { text: '' };
      const t = clip(cell.text, w[c]);
      const pad = ' '.repeat(w[c] - t.length);
      // The last column is not padded on the right: no trailing blanks.
      const body = cell.right ? pad + t : c === cols - 1 ? t : t + pad;
      out.push(paint(body, cell.tone ?? 'none', opts.color));
    }
    return out.join('  ').trimEnd();
  };
  return [line(header.map((h, c) => ({ text: h, right: rows[0]?.[c]?.right, tone: 'head' as const }))), ...rows.map(line)];
}

/** The name a person searches for: the id, else `name#index` (document order, root svg = 0). */
export function elementLabel(e: { id: string | null; name: string; index: number }): string {
  return e.id !== null && e.id !== '' ? e.id : `${e.name}#${e.index}`;
}

/** `<path id="a"> (element 3)`: an element as messages name it (the id when it has one; document order, root svg = 0). */
export function elementTag(e: { id: string | null; name: string; index: number }): string {
  return `<${e.name}${e.id ? ` id="${e.id}"` : ''}> (element ${e.index})`;
}

/** "L1874 M1 Z1": commands by kind, most frequent first (ties by letter). */
export function commandsText(counts: Record<string, number>): string {
  return Object.entries(counts)
    .sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1))
    .map(([k, n]) => (k.length === 1 ? `${k}${n}` : n === 1 ? k : `${k}×${n}`))
    .join(' ');
}

/** `1 element`, `2 elements`: a count with its noun in the right number (English, regular plurals). */
export function countOf(n: number, noun: string): string {
  return `${n} ${n === 1 ? noun : `${noun}s`}`;
}

/**
 * A keeping reason as the table prints it after "kept: ". The line already says
 * "kept", so a reason worded "(kept as written)" or "kept …" loses those words
 * instead of saying it twice.
 */
export function keptReasonText(reason: string | null): string {
  const r = (reason ?? 'unchanged').replace(/\s*\(kept(?: as written)?\)\s*$/i, '').replace(/^kept(?: as written)?\b[\s:,-]*/i, '').trim();
  return r === '' ? 'unchanged' : r;
}

function elementRow(e: ElementReport, tol: number): Cell[] {
  const d = e.deviation;
  const fitted = e.segmentsAfter.arcs + e.segmentsAfter.lines > 0;
  const devTone: Tone = d === null ? 'none' : d.max <= tol ? 'good' : 'bad';
  const mm = (v: number | undefined): Cell => ({ text: v === undefined ? '-' : formatMmValue(v), right: true, tone: devTone });
  let before = 0;
  for (const k in e.commandsBefore) before += e.commandsBefore[k];
  const status: Cell = !e.kept ? { text: 'refit', tone: 'good' } : { text: 'kept', tone: isOverTolerance(e) ? 'bad' : 'note' };
  return [
    { text: elementLabel(e) },
    { text: String(before), right: true },
    { text: commandsText(e.commandsBefore) },
    { text: fitted ? String(e.straightMovesNeeded) : '-', right: true },
    { text: fitted ? String(e.segmentsAfter.arcs) : '-', right: true },
    { text: fitted ? String(e.segmentsAfter.lines) : '-', right: true },
    mm(d?.max), mm(d?.originalToResult), mm(d?.resultToOriginal),
    status,
  ];
}

/** Column titles of the element table (deviations in mm). */
export const ELEMENT_COLUMNS: readonly string[] = Object.freeze([
  'element', 'cmds', 'by kind', 'moves', 'arcs', 'lines', 'max mm', 'o→r', 'r→o', 'result',
]);

/** One line explaining the abbreviated columns. */
export const ELEMENT_LEGEND = 'o→r: original to result, r→o: result to original (mm); moves: line-only moves needed';

/**
 * Reasons for keeping, one line each: "kept: reason: a, b, c", the labels
 * shortened to fit `width`. Over-tolerance reasons are coloured as failures.
 */
function keptNotes(elements: ElementReport[], opts: TableOptions): string[] {
  const byReason = new Map<string, { labels: string[]; bad: boolean }>();
  for (const e of elements) {
    if (!e.kept) continue;
    // One measured figure per element: such reasons are listed each on their own.
    const key = keptReasonText(e.keptReason);
    const g = byReason.get(key) ?? { labels: [], bad: isOverTolerance(e) };
    g.labels.push(elementLabel(e));
    byReason.set(key, g);
  }
  const out: string[] = [];
  for (const [reason, g] of byReason) {
    const head = `kept: ${reason}: `;
    const room = Math.max(MIN_SHRUNK, (opts.width ?? 100) - head.length);
    out.push(paint(head, g.bad ? 'bad' : 'note', opts.color) + clip(g.labels.join(', '), room));
  }
  return out;
}

/**
 * The report as text: a title line, one row per element (label, commands
 * before in total and by kind, straight moves needed, arcs and lines after,
 * deviation in mm: max and both directions, refit or kept), a legend, the
 * reasons for keeping, then a totals line. Ends with a newline.
 */
export function formatTable(report: FileReport, opts: TableOptions): string {
  const tol = report.toleranceMm;
  const t = report.totals;
  const title = `${report.file ?? '(input)'}: tolerance ${formatMmValue(tol)} mm`;
  const lines = [paint(title, 'head', opts.color)];
  if (report.elements.length > 0) {
    // Shorten the by-kind list first, then the label.
    lines.push(...formatGrid([...ELEMENT_COLUMNS], report.elements.map((e) => elementRow(e, tol)), opts, [2, 0]));
    lines.push(clip(ELEMENT_LEGEND, opts.width ?? 100), ...keptNotes(report.elements, opts));
  } else {
    lines.push('no geometry elements');
  }
  const verdict = t.withinTolerance
    ? paint('within tolerance', 'good', opts.color)
    : paint('NOT within tolerance (some kept unchanged)', 'bad', opts.color);
  lines.push(
    `total: ${countOf(t.elements, 'element')}, ${t.rewritten} rewritten, ${t.kept} kept; ` +
      `${countOf(t.commandsBefore, 'command')} → ${countOf(t.segmentsAfter.arcs, 'arc')} + ${countOf(t.segmentsAfter.lines, 'line')}`,
    `max deviation ${formatMmValue(t.maxDeviation)} mm of ${formatMmValue(tol)} mm: ${verdict}`,
  );
  return `${lines.join('\n')}\n`;
}
