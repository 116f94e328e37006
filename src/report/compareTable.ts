/**
 * A comparison (./compare.ts) as text for people: one row per pair, the
 * unpaired elements, the whole-document distance and the verdict. Same
 * layout rules and colours as the report table (./table.ts).
 */
import type { Comparison } from '../measure/compare.js';
import { countOf, elementLabel, formatGrid, formatMmValue, paint, type Cell, type TableOptions } from './table.js';

/** Column titles of the comparison table (deviations in mm). */
export const PAIR_COLUMNS: readonly string[] = Object.freeze(['A', 'B', 'by', 'max mm', 'a→b', 'b→a', 'worst at (mm)', 'verdict']);

const xy = (p: [number, number]): string => `${formatMmValue(p[0])}, ${formatMmValue(p[1])}`;

/**
 * The comparison as text, ending with a newline.
 * @param names how to call the two documents in the title (e.g. file names)
 */
export function formatComparison(c: Comparison, opts: TableOptions, names: { a: string; b: string } = { a: 'A', b: 'B' }): string {
  const tol = c.toleranceMm;
  const width = opts.width ?? 100;
  const lines = [paint(`${names.a} (A) against ${names.b} (B): tolerance ${formatMmValue(tol)} mm`, 'head', opts.color)];
  if (c.pairs.length > 0) {
    const rows: Cell[][] = c.pairs.map((p) => {
      const d = p.deviation;
      const tone = p.withinTolerance ? 'good' : 'bad';
      return [
        { text: elementLabel(p.a) }, { text: elementLabel(p.b) }, { text: p.by },
        { text: formatMmValue(d.max), right: true, tone },
        { text: formatMmValue(d.originalToResult), right: true, tone },
        { text: formatMmValue(d.resultToOriginal), right: true, tone },
        { text: xy(d.worstMm) },
        { text: p.withinTolerance ? 'within' : 'OVER', tone },
      ];
    });
    lines.push(...formatGrid([...PAIR_COLUMNS], rows, opts, [0, 1, 6]));
  } else {
    lines.push('no pairs of geometry elements');
  }
  const unpaired = (side: string, list: Comparison['unpairedA']): void => {
    if (list.length === 0) return;
    const head = `only in ${side}: `;
    const body = list.map(elementLabel).join(', ');
    const room = Math.max(8, width - head.length);
    lines.push(paint(head, 'note', opts.color) + (body.length <= room ? body : `${body.slice(0, room - 1)}…`));
  };
  unpaired('A', c.unpairedA);
  unpaired('B', c.unpairedB);
  for (const w of c.warnings) lines.push(paint(w.length <= width ? w : `${w.slice(0, width - 1)}…`, 'note', opts.color));
  const w = c.whole;
  lines.push(
    w === null
      ? 'whole drawing: nothing to measure on one side'
      : `whole drawing: max ${formatMmValue(w.max)} mm (a→b ${formatMmValue(w.originalToResult)}, b→a ${formatMmValue(w.resultToOriginal)}), worst at ${xy(w.worstMm)} mm`,
  );
  const t = c.totals;
  const verdict = t.withinTolerance ? paint('within tolerance', 'good', opts.color) : paint('NOT within tolerance', 'bad', opts.color);
  // Pairs by document order decide nothing when elements are left over (merged or split, as a path plan does):
  // say so, so that "N over" beside "within tolerance" is not read as a contradiction.
  const leftOver = c.unpairedA.length + c.unpairedB.length;
  const byOrderOver = c.pairs.filter((p) => p.by === 'order' && !p.withinTolerance).length;
  const note = leftOver > 0 && byOrderOver > 0
    ? ` (${byOrderOver} paired by order only, not counted: ${countOf(leftOver, 'element')} left unpaired, so the whole drawing decides)`
    : '';
  lines.push(`${countOf(t.pairs, 'pair')}, ${t.overTolerance} over ${formatMmValue(tol)} mm, largest ${formatMmValue(t.maxPairDeviation)} mm${note}: ${verdict}`);
  return `${lines.join('\n')}\n`;
}
