/**
 * The main job, end to end and pure: SVG text in, SVG text and a report out.
 *
 * read (src/svg) → drawing model in mm (src/model: contours with their element,
 * style and group; curves flattened by src/geom) → fit arcs and lines (src/fit,
 * on the rotor kernel src/pga) → SVG writer (src/write: path data in each
 * element's own coordinates, byte-preserving edits) → measure the written text
 * against the original, independently (src/report). An element whose measured
 * deviation is over the tolerance keeps its original geometry, with status
 * 'reverted' and reason 'over-tolerance' (src/report/status.ts).
 *
 * Error budget per element: src/budget.ts splits the tolerance between
 * flattening, rounding and fitting. One element at a time: ./refitElement.ts.
 */
import { resolveOptions, type ArcsplineOptions, type Options } from './options.js';
import { readSvg, type GeometryElement, type SvgDocument } from './svg/document.js';
import { applyEdits, type Edit } from './write/document.js';
import { elementTag } from './report/table.js';
import type { ElementReport, FileReport } from './report/types.js';
import { refitElement, untouchedReport } from './refitElement.js';
import { copiesSummary, editorSummary, growingSummary, summarise, untouchedSummary, wigglySummary } from './refitSummary.js';
import { planDocument, type PlanOutcome } from './planRefit.js';
import { needsRecheck, restyledElements } from './refitCheck.js';
import { setUnchanged } from './report/status.js';

/** Time spent per stage, milliseconds. */
export interface StageTimes {
  parse: number;
  flatten: number;
  fit: number;
  write: number;
  measure: number;
}

export interface RefitResult {
  /** The new document text (the input itself when nothing was rewritten). */
  text: string;
  report: FileReport;
  /** Per-stage times, for benchmarks and the verbose summary. */
  times: StageTimes;
}

const now = (): number => performance.now();

/**
 * Refit every curve of an SVG document.
 * @param text the whole document
 * @param options options (see src/options.ts; any left out take their defaults); `file` only names the input in the report
 * @throws SvgInputError for input that is not a readable SVG document; OptionError for a bad or unknown option
 */
export function refitSvg(text: string, options: ArcsplineOptions = {}, file: string | null = null): RefitResult {
  const t0 = now();
  const opts = resolveOptions(options);
  const times = emptyTimes();
  const t = now();
  const doc = readSvg(text, { assumedMmPerUnit: opts.assumedMmPerUnit, maxInputChars: opts.maxInputBytes });
  times.parse += now() - t;
  // With the plan, the stroke-only elements it writes are not refitted one by one (src/planRefit.ts).
  const planned = opts.plan ? planDocument(doc, opts, times) : null;
  const outcomes = doc.elements.filter((el) => el.rewritable && !planned?.handled.has(el.index)).map((el) => refitOne(doc, el, opts, times));
  return assemble(text, doc, outcomes, opts, file, times, t0, planned);
}

/** Fresh stage times. */
export function emptyTimes(): StageTimes {
  return { parse: 0, flatten: 0, fit: 0, write: 0, measure: 0 };
}

/** What refitting one element gave: its report entry (null when it draws nothing), its edits, its warnings. */
export interface ElementOutcome {
  index: number;
  report: ElementReport | null;
  edits: Edit[] | null;
  warnings: string[];
  /** Editor attributes the rewrite drops (qualified names; absent or empty when none). */
  droppedEditorAttrs?: string[];
}

/** Refit one rewritable element of a read document. */
export function refitOne(doc: Pick<SvgDocument, 'text' | 'rootToMm'>, el: GeometryElement, opts: Options, times: StageTimes): ElementOutcome {
  const warnings: string[] = [];
  const r = refitElement(doc, el, opts, times, warnings);
  return { index: el.index, report: r ? r.report : null, edits: r ? r.edits : null, warnings, droppedEditorAttrs: r?.droppedEditorAttrs ?? [] };
}

/** Put the outcomes (in document order) together into the new text and the report. */
export function assemble(
  text: string, doc: SvgDocument, outcomes: ElementOutcome[], opts: Options, file: string | null, times: StageTimes, t0: number,
  planned: PlanOutcome | null = null,
): RefitResult {
  const warnings = doc.warnings.slice();
  const untouched = untouchedSummary(doc);
  if (untouched) warnings.push(untouched);
  const copies = copiesSummary(doc, opts.tolerance);
  if (copies) warnings.push(copies);
  const edits: Edit[] = [];
  // Each rewritten element's edits, so a rewrite the document read again refuses can be put back.
  const own = new Map<number, { edits: Edit[]; report: ElementReport }>();
  const elements: ElementReport[] = [];
  const dropped: { tag: string; names: string[] }[] = [];
  const byIndex = new Map(outcomes.map((o) => [o.index, o]));
  for (const el of doc.elements) {
    // Geometry left as written because it is not drawn where it stands is listed too, with the reason.
    if (!el.rewritable) {
      elements.push(untouchedReport(el));
      continue;
    }
    const fromPlan = planned?.reports.get(el.index);
    if (fromPlan) {
      elements.push(fromPlan);
      continue;
    }
    const o = byIndex.get(el.index);
    if (!o) continue;
    warnings.push(...o.warnings);
    if (!o.report) continue;
    elements.push(o.report);
    if (o.edits) {
      edits.push(...o.edits);
      own.set(el.index, { edits: o.edits, report: o.report });
      if (o.droppedEditorAttrs && o.droppedEditorAttrs.length > 0) dropped.push({ tag: elementTag(el), names: o.droppedEditorAttrs });
    }
  }
  if (planned) {
    warnings.push(...planned.warnings);
    edits.push(...planned.edits);
  }
  const editor = editorSummary(dropped);
  if (editor) warnings.push(editor);
  const wiggly = wigglySummary(elements, opts.tolerance);
  if (wiggly) warnings.push(wiggly);
  const growing = growingSummary(elements);
  if (growing) warnings.push(growing);
  let t = now();
  let out = applyEdits(text, edits);
  times.write += now() - t;
  // Planned groups restructure the document (elements removed): only the per-element rewrites are checked.
  if (own.size > 0 && needsRecheck(doc, opts) && !(planned && planned.edits.length > 0)) {
    t = now();
    const bad = restyledElements(out, doc, [...own.keys()], opts);
    times.measure += now() - t;
    if (bad.size > 0) {
      const putBack = new Set<Edit>();
      for (const i of bad) {
        const { edits: mine, report: r } = own.get(i)!;
        for (const e of mine) putBack.add(e);
        setUnchanged(r, 'restyled', 'written as a path, the document would style or place it otherwise (a style sheet rule for its element name, or a CSS transform over a baked one); kept as written');
        if (r.contours) r.contours = r.contours.map((c) => ({ ...c, status: r.status, reason: r.reason }));
      }
      warnings.push(`${bad.size} rewritten element${bad.size > 1 ? 's' : ''} put back as written: as a path the document would style or place ${bad.size > 1 ? 'them' : 'it'} otherwise (a style sheet rule for the element name, or a CSS transform over a baked one)`);
      t = now();
      out = applyEdits(text, edits.filter((e) => !putBack.has(e)));
      times.write += now() - t;
    }
  }
  const report = summarise(elements, opts.tolerance, text, out, warnings, file, now() - t0);
  if (planned) report.plan = planned.report;
  return { text: out, report, times };
}
