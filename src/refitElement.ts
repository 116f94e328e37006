/**
 * Refit one element: read its geometry → drawing model (mm) → fit → SVG writer
 * → independent measurement → status. Each early exit sets a status and reason
 * code (src/report/status.ts) with a message for people.
 */
import type { Options } from './options.js';
import type { GeometryElement, SvgDocument } from './svg/document.js';
import { parsePathData } from './svg/pathData.js';
import { invert, maxScale } from './svg/matrix.js';
import { OP_L, OP_M, OP_Z, type ParsedPath, type PathData } from './svg/pathTypes.js';
import type { Matrix } from './svg/matrixTypes.js';
import { drawingElementFromSvg, readGeometry } from './model/fromSvg.js';
import { fitElement, hasBeziers, setContourOutcomes } from './model/fit.js';
import type { FittedElement } from './model/drawing.js';
import { arcGeometry } from './fit/segment.js';
import { svgElementEdits, svgPathData } from './write/svgElement.js';
import { readMark } from './write/refitMark.js';
import type { Edit } from './write/document.js';
import { measureDeviation } from './measure/measure.js';
import { setRefitted, setUnchanged } from './report/status.js';
import type { ContourReport, ElementReport } from './report/types.js';
import type { StageTimes } from './refit.js';

const now = (): number => performance.now();

/** What refitting one element gave. */
export interface ElementResult {
  report: ElementReport;
  edits: Edit[] | null;
  /** The fitted element in the drawing model (null when it was kept before fitting). */
  fitted: FittedElement | null;
  /** Editor attributes the rewrite drops (qualified names). */
  droppedEditorAttrs: string[];
}

/**
 * The drawing commands of the input: a path's by letter as written; for polyline and polygon those of
 * their equivalent path, M then L per further point (and Z for a polygon; SVG 2 §10.6, §10.7); else
 * {"<element name>": 1}.
 */
function commandsOf(el: GeometryElement, p: ParsedPath | null): Record<string, number> {
  if (el.name !== 'path' && el.name !== 'polyline' && el.name !== 'polygon') return { [el.name]: 1 };
  if (p === null) return {};
  if (el.name === 'path') return { ...p.counts };
  let m = 0, l = 0, z = 0;
  for (let i = 0; i < p.ops.length; i++) {
    if (p.ops[i] === OP_M) m++;
    else if (p.ops[i] === OP_L) l++;
    else if (p.ops[i] === OP_Z) z++;
  }
  return z > 0 ? { M: m, L: l, Z: z } : { M: m, L: l };
}

/** A fresh report entry, marked kept until a refit is accepted. */
export function baseReport(el: GeometryElement, p: ParsedPath | null): ElementReport {
  return {
    index: el.index, name: el.name, id: el.id, ancestors: el.ancestors, commandsBefore: commandsOf(el, p),
    straightMovesNeeded: 0, segmentsAfter: { arcs: 0, lines: 0 }, grows: false, deviation: null,
    kept: true, keptReason: null, status: 'kept', reason: null,
    style: { stroke: el.style.stroke, fill: el.style.fill, strokeWidthMm: el.style.strokeWidthMm }, copies: el.copies.length,
  };
}

/** The report entry of an element that is not rewritable: kept, with the document reader's message. */
export function untouchedReport(el: GeometryElement): ElementReport {
  // Its path data or shape warnings are not the file's: it is not drawn where it stands.
  const r = baseReport(el, readGeometry(el, []));
  setUnchanged(r, 'not-drawn', el.reason ?? 'not rewritable');
  return r;
}

/** Segments drawn (every command but moveto; a Z draws the closing line). */
function drawingCommands(p: PathData): number {
  let n = 0;
  for (let i = 0; i < p.ops.length; i++) if (p.ops[i] !== OP_M) n++;
  return n;
}

/**
 * Closing lines the writer leaves to Z: a closed contour whose last fitted segment is a line is
 * written without it, and the Z draws it (SVG 2 §9.3.4). They count as lines written.
 */
export function closingLines(f: FittedElement): number {
  let n = 0;
  for (const c of f.contours) {
    const segs = c.segments;
    if (c.contour.closed && segs.length > 0 && arcGeometry(segs[segs.length - 1]) === null) n++;
  }
  return n;
}

/** Each contour's outcome for the report. */
function contourReports(f: FittedElement): ContourReport[] {
  return f.contours.map((c) => ({ status: c.outcome.status, reason: c.outcome.reason, as: c.choice }));
}

const EXACT_SHAPES = new Set(['rect', 'circle', 'ellipse', 'line']);

/** Refit one rewritable element; null when it draws nothing. Warnings go to `warnings`. */
export function refitElement(
  doc: Pick<SvgDocument, 'text' | 'rootToMm'>, el: GeometryElement, opts: Options, times: StageTimes, warnings: string[],
): ElementResult | null {
  let t = now();
  const p = readGeometry(el, warnings);
  times.parse += now() - t;
  if (!p || p.ops.length === 0) return null;
  const report = baseReport(el, p);
  const unchanged = (reason: Parameters<typeof setUnchanged>[1], message: string, fitted: FittedElement | null = null): ElementResult => {
    setUnchanged(report, reason, message);
    if (fitted) {
      setContourOutcomes(fitted, report.status, reason);
      report.contours = contourReports(fitted);
    }
    return { report, edits: null, fitted, droppedEditorAttrs: [] };
  };
  if (EXACT_SHAPES.has(el.name) && !opts.shapesAsPaths && !opts.bakeTransforms) {
    return unchanged('exact-shape', 'an exact shape already');
  }
  // A copy drawn larger by <use> magnifies any deviation: fit and check within the tolerance over that factor.
  const elTol = opts.tolerance / Math.max(1, el.copyScale);
  // A previous run's mark: what that refit may already have spent of the distance to the first original.
  const spent = opts.refitMarked ? null : readMark(el.attrs);
  if (spent !== null && elTol <= spent * (1 + 1e-9)) {
    return unchanged('already-refitted', `refitted before within ${+spent.toPrecision(6)} mm (its mark); a refit within ${+elTol.toPrecision(6)} mm would add to that`);
  }
  // The fit and its measurement get what is left, so the mark written (elTol) bounds the distance to the first original.
  const tol = spent === null ? elTol : elTol - spent;
  // Where the written coordinates live: the element's own user units, or root user units when baking.
  const writtenToMm: Matrix = opts.bakeTransforms ? doc.rootToMm : el.toMm;
  const mmToLocal = invert(new Float64Array(6), writtenToMm);
  if (!mmToLocal) return unchanged('cannot-invert', 'coordinate system cannot be inverted');
  t = now();
  const model = drawingElementFromSvg(el, p, tol, maxScale(writtenToMm), opts.digits);
  times.flatten += now() - t;
  if (!('contours' in model)) return unchanged(model.reason, model.message);
  // First every contour fitted on its own without its own measurement (the element's measurement below
  // covers them all); an element found over the tolerance is fitted again with each contour measured on
  // its own, so only the contours that are over fall back (to straight moves, or their source).
  for (let pass = 0; ; pass++) {
    t = now();
    const fitted = fitElement(model, opts.cornerAngle, !opts.bakeTransforms, pass > 0);
    times.fit += now() - t;
    if (pass === 0) for (const c of fitted.contours) report.straightMovesNeeded += c.straightMovesNeeded;
    // Every contour keeps its source (none is shorter refitted, or none could be fitted): leave the element
    // as written, byte for byte, so a refit of a refit changes nothing there.
    if (fitted.contours.length > 0 && fitted.contours.every((c) => c.choice === 'original')) {
      return unchanged('no-shorter', 'already no longer than a refit', fitted);
    }
    t = now();
    const { d, stats } = svgPathData(fitted, mmToLocal, model.budget.digits);
    times.write += now() - t;
    const written = parsePathData(d);
    report.segmentsAfter = { arcs: stats.arcs, lines: stats.lines + closingLines(fitted) };
    // Already as short as it can be: only lines and arcs, and no fewer drawing commands after fitting.
    if (!model.curved && el.name === 'path' && drawingCommands(written) >= drawingCommands(p)) {
      report.segmentsAfter = { arcs: 0, lines: 0 };
      return unchanged('no-shorter', 'already no longer than a refit', fitted);
    }
    // Bézier curves that come out as more pieces, or more bytes, than written: said in the report, and
    // kept as written when asked.
    report.grows = hasBeziers(p) && (report.segmentsAfter.arcs + report.segmentsAfter.lines > drawingCommands(p) ||
      (el.name === 'path' && d.length > (el.attrs.d ?? '').length));
    if (report.grows && opts.keepGrowingCurves) {
      return unchanged('grows', 'its refit has more pieces or bytes than written (kept: keepGrowingCurves)', fitted);
    }
    t = now();
    try {
      report.deviation = measureDeviation(p, el.toMm, written, writtenToMm, tol);
    } catch (e) {
      times.measure += now() - t;
      return unchanged('cannot-measure', `cannot measure: ${(e as Error).message}`, fitted);
    }
    times.measure += now() - t;
    if (written.error) return unchanged('unreadable-output', `internal: written path data did not re-read (${written.error.message})`, fitted);
    if (!report.deviation) return unchanged('nothing-to-measure', 'nothing to measure', fitted);
    if (!(report.deviation.max <= tol)) {
      if (pass === 0) continue;
      return unchanged('over-tolerance', `measured deviation ${report.deviation.max.toPrecision(3)} mm is over the tolerance`, fitted);
    }
    setRefitted(report);
    report.contours = contourReports(fitted);
    const { edits, droppedEditorAttrs } = svgElementEdits(doc, el, d, opts.bakeTransforms, elTol);
    return { report, edits, fitted, droppedEditorAttrs };
  }
}
