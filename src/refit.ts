/**
 * The main job, end to end and pure: SVG text in, SVG text and a report out.
 *
 * read (src/svg) → flatten into mm contours (src/geom) → fit arcs and lines
 * (src/fit, on the rotor kernel src/pga) → write path data back in each
 * element's own coordinates (src/write) → measure the written text against the
 * original, independently (src/report). An element whose measured deviation is
 * over the tolerance keeps its original geometry and is flagged.
 *
 * Error budget per element: src/budget.ts splits the tolerance between
 * flattening, rounding and fitting.
 */
import { resolveOptions, type Options } from './options.js';
import { readSvg, type GeometryElement, type SvgDocument } from './svg/document.js';
import { parsePathData } from './svg/pathData.js';
import { shapeToPath, type ShapeName } from './svg/shapes.js';
import { parseTransform } from './svg/transform.js';
import { applyX, applyY, invert, maxScale, multiply } from './svg/matrix.js';
import { OP_A, OP_ARGS, OP_C, OP_L, OP_M, OP_Q, OP_Z, type ParsedPath, type PathData } from './svg/pathTypes.js';
import type { Matrix } from './svg/matrixTypes.js';
import { flattenPath } from './geom/flatten.js';
import type { Contour } from './geom/contour.js';
import { fitPolyline } from './fit/fitPolyline.js';
import { thinWithin } from './fit/prefilter.js';
import { PathWriter } from './write/pathWriter.js';
import { emitSegments, type EmitContour } from './write/emit.js';
import { splitTolerance } from './budget.js';
import { applyEdits, editStartTag, type Edit } from './write/document.js';
import { measureDeviation } from './report/measure.js';
import { elementTag } from './report/table.js';
import type { ElementReport, FileReport } from './report/types.js';
import { VERSION } from './version.js';


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

/** Attributes a shape loses when it becomes a path. */
const SHAPE_ATTRS: Readonly<Record<ShapeName, readonly string[]>> = {
  rect: ['x', 'y', 'width', 'height', 'rx', 'ry'],
  circle: ['cx', 'cy', 'r'],
  ellipse: ['cx', 'cy', 'rx', 'ry'],
  line: ['x1', 'y1', 'x2', 'y2'],
  polyline: ['points'],
  polygon: ['points'],
};

const now = (): number => performance.now();

/**
 * Refit every curve of an SVG document.
 * @param text the whole document
 * @param partial options (see src/options.ts); `file` only names the input in the report
 * @throws SvgInputError for input that is not a readable SVG document
 */
export function refitSvg(text: string, partial: Partial<Options> = {}, file: string | null = null): RefitResult {
  const t0 = now();
  const opts = resolveOptions(partial);
  const times = emptyTimes();
  const t = now();
  const doc = readSvg(text, { assumedMmPerUnit: opts.assumedMmPerUnit, maxInputChars: opts.maxInputBytes });
  times.parse += now() - t;
  const outcomes = doc.elements.filter((el) => el.rewritable).map((el) => refitOne(doc, el, opts, times));
  return assemble(text, doc, outcomes, opts, file, times, t0);
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
}

/**
 * One warning line when rewritten elements came out with more pieces than the straight moves their
 * original needs within the tolerance: the input wiggles by about the tolerance (a traced bitmap at
 * its pixel size), so arcs can only follow the wiggles; null when none did.
 */
function wigglySummary(elements: readonly ElementReport[], tol: number): string | null {
  const pieces = (e: ElementReport): number => e.segmentsAfter.arcs + e.segmentsAfter.lines;
  const over = elements.filter((e) => !e.kept && pieces(e) > e.straightMovesNeeded);
  if (over.length === 0) return null;
  const worst = over.reduce((w, e) => (pieces(e) - e.straightMovesNeeded > pieces(w) - w.straightMovesNeeded ? e : w));
  const rewritten = elements.filter((e) => !e.kept).length;
  return `${over.length} of ${rewritten} rewritten elements came out with more arcs and lines than the straight moves the original needs within ${+tol.toPrecision(6)} mm ` +
    `(${elementTag(worst)}: ${pieces(worst)} against ${worst.straightMovesNeeded}): the drawing wiggles by about the tolerance ` +
    '(a traced bitmap\'s pixel steps, for one), and a larger tolerance gives fewer, smoother pieces';
}

/** Refit one rewritable element of a read document. */
export function refitOne(doc: Pick<SvgDocument, 'text' | 'rootToMm'>, el: GeometryElement, opts: Options, times: StageTimes): ElementOutcome {
  const warnings: string[] = [];
  const r = refitElement(doc, el, opts, times, warnings);
  return { index: el.index, report: r ? r.report : null, edits: r ? r.edits : null, warnings };
}

/** Put the outcomes (in document order) together into the new text and the report. */
export function assemble(
  text: string, doc: SvgDocument, outcomes: ElementOutcome[], opts: Options, file: string | null, times: StageTimes, t0: number,
): RefitResult {
  const warnings = doc.warnings.slice();
  const untouched = untouchedSummary(doc);
  if (untouched) warnings.push(untouched);
  const copies = copiesSummary(doc, opts.tolerance);
  if (copies) warnings.push(copies);
  const edits: Edit[] = [];
  const elements: ElementReport[] = [];
  const byIndex = new Map(outcomes.map((o) => [o.index, o]));
  for (const el of doc.elements) {
    // Geometry left as written because it is not drawn where it stands is listed too, with the reason.
    if (!el.rewritable) {
      elements.push(untouchedReport(el));
      continue;
    }
    const o = byIndex.get(el.index);
    if (!o) continue;
    warnings.push(...o.warnings);
    if (!o.report) continue;
    elements.push(o.report);
    if (o.edits) edits.push(...o.edits);
  }
  const wiggly = wigglySummary(elements, opts.tolerance);
  if (wiggly) warnings.push(wiggly);
  const t = now();
  const out = applyEdits(text, edits);
  times.write += now() - t;
  const report = summarise(elements, opts.tolerance, text, out, warnings, file, now() - t0);
  return { text: out, report, times };
}

interface ElementResult {
  report: ElementReport;
  edits: Edit[] | null;
}

function readGeometry(el: GeometryElement, warnings: string[]): ParsedPath | null {
  if (el.name === 'path') {
    const p = parsePathData(el.attrs.d ?? '');
    if (p.error) warnings.push(`${elementTag(el)}: path data error at offset ${p.error.offset}: ${p.error.message}; the part before it is kept`);
    return p;
  }
  const s = shapeToPath(el.name, (a) => el.attrs[a], el.viewportW, el.viewportH);
  if (s.error) warnings.push(`${elementTag(el)}: ${s.error}`);
  return s.path;
}

function hasCurves(p: PathData): boolean {
  for (let i = 0; i < p.ops.length; i++) if (p.ops[i] === OP_C || p.ops[i] === OP_Q || p.ops[i] === OP_A) return true;
  return false;
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

/** The report entry of an element that is not rewritable: kept, with the document reader's reason. */
function untouchedReport(el: GeometryElement): ElementReport {
  // Its path data or shape warnings are not the file's: it is not drawn where it stands.
  const r = baseReport(el, readGeometry(el, []));
  r.keptReason = el.reason ?? 'not rewritable';
  return r;
}

function baseReport(el: GeometryElement, p: ParsedPath | null): ElementReport {
  const commandsBefore = commandsOf(el, p);
  return {
    index: el.index, name: el.name, id: el.id, ancestors: el.ancestors, commandsBefore,
    straightMovesNeeded: 0, segmentsAfter: { arcs: 0, lines: 0 }, deviation: null, kept: true, keptReason: null,
  };
}

function refitElement(
  doc: Pick<SvgDocument, 'text' | 'rootToMm'>, el: GeometryElement, opts: Options, times: StageTimes, warnings: string[],
): ElementResult | null {
  let t = now();
  const p = readGeometry(el, warnings);
  times.parse += now() - t;
  if (!p || p.ops.length === 0) return null;
  const report = baseReport(el, p);
  const exactShape = el.name === 'rect' || el.name === 'circle' || el.name === 'ellipse' || el.name === 'line';
  if (exactShape && !opts.shapesAsPaths && !opts.bakeTransforms) {
    report.keptReason = 'exact shape (kept as written)';
    return { report, edits: null };
  }
  // A copy drawn larger by <use> magnifies any deviation: fit and check within the tolerance over that factor.
  const tol = opts.tolerance / Math.max(1, el.copyScale);
  const curved = hasCurves(p);
  // Where the written coordinates live: the element's own user units, or root user units when baking.
  const writtenToMm: Matrix = opts.bakeTransforms ? doc.rootToMm : el.toMm;
  const mmToLocal = invert(new Float64Array(6), writtenToMm);
  if (!mmToLocal) {
    report.keptReason = 'coordinate system cannot be inverted';
    return { report, edits: null };
  }
  const budget = splitTolerance(tol, { curved, mmPerUnit: maxScale(writtenToMm), digits: opts.digits });
  const { digits, flattenMm: flatMm, fitMm: fitTol } = budget;
  if (!budget.fits) {
    report.keptReason = `too few decimals (${digits}) for the tolerance`;
    return { report, edits: null };
  }
  t = now();
  let contours: Contour[];
  try {
    contours = flattenPath(p, el.toMm, curved ? flatMm : tol);
  } catch (e) {
    times.flatten += now() - t;
    report.keptReason = `cannot flatten: ${(e as Error).message}`;
    return { report, edits: null };
  }
  times.flatten += now() - t;
  t = now();
  const fitted: EmitContour[] = [];
  let moves = 0;
  for (const c of contours) {
    const r = fitPolyline(c.xy, { tolerance: fitTol, closed: c.closed, cornerAngle: opts.cornerAngle, corners: c.corners });
    fitted.push({ segments: r.segments, closed: c.closed });
    moves += straightMoves(c, tol);
  }
  times.fit += now() - t;
  report.straightMovesNeeded = moves;
  t = now();
  const sink = new PathWriter({ digits });
  const stats = emitSegments(sink, fitted, mmToLocal, { digits });
  // Subpaths that draw a single point (a pierce mark such as `M x y Z`) have no contour; keep them as points.
  for (const [x, y] of pointSubpaths(p)) {
    const mx = applyX(el.toMm, x, y), my = applyY(el.toMm, x, y);
    sink.moveTo(applyX(mmToLocal, mx, my), applyY(mmToLocal, mx, my));
    sink.closePath();
  }
  const d = sink.toString();
  times.write += now() - t;
  report.segmentsAfter = { arcs: stats.arcs, lines: stats.lines };
  const written = parsePathData(d);
  // Already as short as it can be: only lines and arcs, and no fewer drawing commands after fitting.
  if (!curved && el.name === 'path' && drawingCommands(written) >= drawingCommands(p)) {
    report.keptReason = 'already no longer than a refit';
    report.segmentsAfter = { arcs: 0, lines: 0 };
    return { report, edits: null };
  }
  t = now();
  try {
    report.deviation = measureDeviation(p, el.toMm, written, writtenToMm, tol);
  } catch (e) {
    times.measure += now() - t;
    report.keptReason = `cannot measure: ${(e as Error).message}`;
    return { report, edits: null };
  }
  times.measure += now() - t;
  if (written.error || !report.deviation || !(report.deviation.max <= tol)) {
    report.keptReason = written.error
      ? `internal: written path data did not re-read (${written.error.message})`
      : report.deviation
        ? `measured deviation ${report.deviation.max.toPrecision(3)} mm is over the tolerance`
        : 'nothing to measure';
    return { report, edits: null };
  }
  report.kept = false;
  return { report, edits: elementEdits(doc, el, d, opts) };
}

/** One line when rewritable elements are drawn larger elsewhere by <use>: they are fitted within a share of the tolerance. */
function copiesSummary(doc: SvgDocument, tol: number): string | null {
  const larger = doc.elements.filter((el) => el.rewritable && el.copyScale > 1);
  if (larger.length === 0) return null;
  const most = larger.reduce((a, b) => (b.copyScale > a.copyScale ? b : a));
  const k = +most.copyScale.toPrecision(3);
  return `${larger.length} element${larger.length > 1 ? 's are' : ' is'} drawn again larger by <use> (up to ${k}×, ${elementTag(most)}): ` +
    `each is fitted and measured where it stands within the tolerance over its factor (there ${+(tol / k).toPrecision(3)} mm), so every copy stays within ${+tol.toPrecision(6)} mm`;
}

/** One line naming the geometry left as written because it is not drawn where it stands (or cannot be), by reason. */
function untouchedSummary(doc: SvgDocument): string | null {
  const byReason = new Map<string, number>();
  for (const el of doc.elements) if (!el.rewritable) byReason.set(el.reason ?? 'not rewritable', (byReason.get(el.reason ?? 'not rewritable') ?? 0) + 1);
  if (byReason.size === 0) return null;
  let total = 0;
  for (const n of byReason.values()) total += n;
  const parts = [...byReason].slice(0, 3).map(([r, n]) => (n > 1 ? `${n}× ${r}` : r));
  if (byReason.size > 3) parts.push(`${byReason.size - 3} more reasons`);
  return `${total} geometry element${total > 1 ? 's' : ''} left as written: ${parts.join('; ')}`;
}

/** Segments drawn (every command but moveto; a Z draws the closing line). */
function drawingCommands(p: PathData): number {
  let n = 0;
  for (let i = 0; i < p.ops.length; i++) if (p.ops[i] !== OP_M) n++;
  return n;
}

/** Start points of subpaths that draw something but never leave their start point. */
function pointSubpaths(p: PathData): [number, number][] {
  const out: [number, number][] = [];
  let sx = 0, sy = 0, draws = false, still = true, open = false;
  const finish = (): void => {
    if (open && draws && still) out.push([sx, sy]);
  };
  let j = 0;
  for (let i = 0; i < p.ops.length; i++) {
    const op = p.ops[i], n = OP_ARGS[op];
    if (op === OP_M) {
      finish();
      sx = p.args[j];
      sy = p.args[j + 1];
      draws = false;
      still = true;
      open = true;
    } else {
      draws = true;
      // Every point the segment names (control points too; an arc's radii and flags are not points).
      const first = op === OP_A ? 5 : 0;
      for (let k = first; k + 1 < n; k += 2) if (p.args[j + k] !== sx || p.args[j + k + 1] !== sy) still = false;
    }
    j += n;
  }
  finish();
  return out;
}

/** Lines a controller needs to follow the contour within the tolerance (vertex-subset polyline). */
function straightMoves(c: Contour, tol: number): number {
  const n = c.xy.length >> 1;
  if (n < 2) return 0;
  return thinWithin(c.xy, n, c.closed, tol, null).length - 1;
}

function elementEdits(doc: Pick<SvgDocument, 'text'>, el: GeometryElement, d: string, opts: Options): Edit[] {
  const set: Record<string, string> = { d };
  const remove: string[] = el.name === 'path' ? [] : SHAPE_ATTRS[el.name].filter((a) => a in el.attrs);
  if (opts.bakeTransforms) {
    // Coordinates are now root user units: undo the ancestors' transforms instead of applying the element's own.
    const own = parseTransform(el.attrs.transform ?? '').matrix;
    const ownInv = invert(new Float64Array(6), own) ?? own;
    const ancestors = multiply(new Float64Array(6), el.ctm, ownInv);
    const undo = invert(new Float64Array(6), ancestors);
    if (undo && !isIdentity(undo)) set.transform = `matrix(${Array.from(undo, (v) => +v.toPrecision(12)).join(' ')})`;
    else if ('transform' in el.attrs) remove.push('transform');
  }
  return editStartTag(doc.text, el, { rename: el.name === 'path' ? undefined : 'path', set, remove });
}

function isIdentity(m: Matrix): boolean {
  const e = 1e-12;
  return Math.abs(m[0] - 1) < e && Math.abs(m[1]) < e && Math.abs(m[2]) < e && Math.abs(m[3] - 1) < e && Math.abs(m[4]) < e && Math.abs(m[5]) < e;
}

function summarise(
  elements: ElementReport[], tol: number, input: string, output: string, warnings: string[], file: string | null, timeMs: number,
): FileReport {
  let commandsBefore = 0, arcs = 0, lines = 0, maxDeviation = 0, rewritten = 0;
  for (const e of elements) {
    for (const k in e.commandsBefore) commandsBefore += e.commandsBefore[k];
    if (!e.kept) {
      rewritten++;
      arcs += e.segmentsAfter.arcs;
      lines += e.segmentsAfter.lines;
      if (e.deviation && e.deviation.max > maxDeviation) maxDeviation = e.deviation.max;
    }
  }
  const withinTolerance = elements.every((e) => !e.keptReason?.startsWith('measured deviation'));
  return {
    tool: 'arcspline', version: VERSION, file, toleranceMm: tol,
    bytesIn: Buffer.byteLength(input), bytesOut: Buffer.byteLength(output), timeMs,
    elements,
    totals: { elements: elements.length, rewritten, kept: elements.length - rewritten, commandsBefore, segmentsAfter: { arcs, lines }, maxDeviation, withinTolerance },
    warnings,
  };
}
