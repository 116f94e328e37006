/**
 * The file-level lines of a refit: summary warnings over all elements, and the
 * report's totals (verdicts read off the statuses, src/report/status.ts).
 */
import type { SvgDocument } from './svg/document.js';
import { elementTag } from './report/table.js';
import { withinTolerance } from './report/status.js';
import type { ElementReport, FileReport, PaintGroup } from './report/types.js';
import { VERSION } from './version.js';

/** "1 element", "2 elements". */
export function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/**
 * One warning line when rewritten elements came out with more pieces than the straight moves their
 * original needs within the tolerance: the input wiggles by about the tolerance (a traced bitmap at
 * its pixel size), so arcs can only follow the wiggles; null when none did.
 */
export function wigglySummary(elements: readonly ElementReport[], tol: number): string | null {
  const pieces = (e: ElementReport): number => e.segmentsAfter.arcs + e.segmentsAfter.lines;
  const over = elements.filter((e) => e.status === 'refitted' && pieces(e) > e.straightMovesNeeded);
  if (over.length === 0) return null;
  const worst = over.reduce((w, e) => (pieces(e) - e.straightMovesNeeded > pieces(w) - w.straightMovesNeeded ? e : w));
  const rewritten = elements.filter((e) => e.status === 'refitted').length;
  return `${over.length} of ${rewritten} rewritten elements came out with more arcs and lines than the straight moves the original needs within ${+tol.toPrecision(6)} mm ` +
    `(${elementTag(worst)}: ${pieces(worst)} against ${worst.straightMovesNeeded}): the drawing wiggles by about the tolerance ` +
    '(a traced bitmap\'s pixel steps, for one), and a larger tolerance gives fewer, smoother pieces';
}

/** One line when rewritten elements with Bézier curves came out with more pieces or bytes than written; null when none did. */
export function growingSummary(elements: readonly ElementReport[]): string | null {
  const grew = elements.filter((e) => e.status === 'refitted' && e.grows);
  if (grew.length === 0) return null;
  return `${grew.length} rewritten element${grew.length > 1 ? 's' : ''} with Bézier curves came out with more pieces or bytes than written ` +
    `(first ${elementTag(grew[0])}): arcs and lines are what an arc-capable machine takes; keepGrowingCurves (--keep-growing-curves) keeps such elements as written`;
}

/** One line when rewritable elements are drawn larger elsewhere by <use>: they are fitted within a share of the tolerance. */
export function copiesSummary(doc: SvgDocument, tol: number): string | null {
  const larger = doc.elements.filter((el) => el.rewritable && el.copyScale > 1);
  if (larger.length === 0) return null;
  const most = larger.reduce((a, b) => (b.copyScale > a.copyScale ? b : a));
  const k = +most.copyScale.toPrecision(3);
  return `${larger.length} element${larger.length > 1 ? 's are' : ' is'} drawn again larger by <use> (up to ${k}×, ${elementTag(most)}): ` +
    `each is fitted and measured where it stands within the tolerance over its factor (there ${+(tol / k).toPrecision(3)} mm), so every copy stays within ${+tol.toPrecision(6)} mm`;
}

/** One line naming the geometry left as written because it is not drawn where it stands (or cannot be), by reason. */
export function untouchedSummary(doc: SvgDocument): string | null {
  const byReason = new Map<string, number>();
  for (const el of doc.elements) if (!el.rewritable) byReason.set(el.reason ?? 'not rewritable', (byReason.get(el.reason ?? 'not rewritable') ?? 0) + 1);
  if (byReason.size === 0) return null;
  let total = 0;
  for (const n of byReason.values()) total += n;
  const parts = [...byReason].slice(0, 3).map(([r, n]) => (n > 1 ? `${n}× ${r}` : r));
  if (byReason.size > 3) parts.push(`${byReason.size - 3} more reasons`);
  return `${total} geometry element${total > 1 ? 's' : ''} left as written: ${parts.join('; ')}`;
}

/**
 * One line when rewritten elements carried an editor's parametric description (shape parameters,
 * a path effect with its original path data): it was dropped, or the editor would rebuild the old geometry.
 * @param dropped per rewritten element: its tag and the qualified attribute names dropped
 */
export function editorSummary(dropped: readonly { tag: string; names: readonly string[] }[]): string | null {
  const withAny = dropped.filter((x) => x.names.length > 0);
  if (withAny.length === 0) return null;
  const names = [...new Set(withAny.flatMap((x) => x.names))].sort();
  const shown = names.slice(0, 6).join(', ') + (names.length > 6 ? `, ${names.length - 6} more` : '');
  return `${plural(withAny.length, 'rewritten element')} (first ${withAny[0].tag}) lost the editor attributes that would regenerate the old geometry (${shown}), ` +
    'so an editor keeps the refit';
}

/** The report of a whole file. */
export function summarise(
  elements: ElementReport[], tol: number, input: string, output: string, warnings: string[], file: string | null, timeMs: number,
): FileReport {
  let commandsBefore = 0, arcs = 0, lines = 0, maxDeviation = 0, rewritten = 0;
  for (const e of elements) {
    for (const k in e.commandsBefore) commandsBefore += e.commandsBefore[k];
    if (e.status === 'refitted') {
      rewritten++;
      arcs += e.segmentsAfter.arcs;
      lines += e.segmentsAfter.lines;
      if (e.deviation && e.deviation.max > maxDeviation) maxDeviation = e.deviation.max;
    }
  }
  return {
    tool: 'arcspline', version: VERSION, file, toleranceMm: tol,
    bytesIn: Buffer.byteLength(input), bytesOut: Buffer.byteLength(output), timeMs,
    elements,
    totals: {
      elements: elements.length, rewritten, kept: elements.length - rewritten, commandsBefore,
      segmentsAfter: { arcs, lines }, maxDeviation, withinTolerance: withinTolerance(elements),
    },
    paints: paintGroups(elements),
    warnings,
  };
}

/** The drawn elements grouped by stroke and fill, in order of first appearance. */
export function paintGroups(elements: readonly ElementReport[]): PaintGroup[] {
  const groups = new Map<string, PaintGroup>();
  for (const e of elements) {
    if (e.reason === 'not-drawn') continue;
    const key = `${e.style.stroke}\n${e.style.fill}`;
    let g = groups.get(key);
    if (g === undefined) groups.set(key, (g = { stroke: e.style.stroke, fill: e.style.fill, elements: 0, rewritten: 0 }));
    g.elements++;
    if (e.status === 'refitted') g.rewritten++;
  }
  return [...groups.values()];
}
