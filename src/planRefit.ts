/**
 * The path plan inside the refit (option `plan`): the stroke-only elements of the
 * document are planned together (src/plan: double lines, join, order, per group
 * of equal stroke paint and width), fitted as planned contours and written back
 * in plan order; everything else is refitted element by element as without the
 * plan.
 *
 * Output: one `<path>` per planned contour, so each pen-down (pierce) is one
 * element a viewer or a plotter driver can follow, and a joined contour is one
 * path with one start. A group's paths are written, in plan order, where the
 * group's first element stood, with that element's attributes (its stroke paint
 * and width are the group's by construction; its `id` stays on the first path that
 * draws part of it)
 * and in its coordinate system; the group's other elements are removed. Filled
 * elements, elements drawn again by `<use>` or referenced by id, and elements with
 * single-point subpaths are not planned and stay where they are.
 *
 * Proof: a group is measured as a whole, every original element against every
 * written path (src/measure), so a removed double line counts as covered by the
 * kept line and a join as the joined pieces. A group over the tolerance is not
 * written by the plan: its elements are refitted one by one.
 */
import type { Options } from './options.js';
import type { GeometryElement, SvgDocument } from './svg/document.js';
import { invert, maxScale } from './svg/matrix.js';
import { parsePathData } from './svg/pathData.js';
import type { ParsedPath } from './svg/pathTypes.js';
import { drawingElementFromSvg, readGeometry } from './model/fromSvg.js';
import type { DrawingElement } from './model/drawing.js';
import { straightMoves } from './model/fit.js';
import { paintsFill, resolveStyle } from './model/style.js';
import { splitTolerance } from './budget.js';
import { fitPolyline } from './fit/fitPolyline.js';
import { arcGeometry } from './fit/segment.js';
import { PathWriter } from './write/pathWriter.js';
import { emitSegments } from './write/emit.js';
import { applyEdits, editStartTag, type Edit } from './write/document.js';
import { SHAPE_ATTRS } from './write/svgElement.js';
import { parametricAttributes } from './write/editorAttrs.js';
import { samplePath, type SampledPath } from './measure/sample.js';
import { compareSampled } from './measure/measure.js';
import { baseReport } from './refitElement.js';
import { setRefitted } from './report/status.js';
import type { ElementReport, PlanReport } from './report/types.js';
import { planContours } from './plan/plan.js';
import type { PlanContour, PlannedContour } from './plan/types.js';
import type { StageTimes } from './refit.js';
import { MARK_ATTR, formatMark, readMark } from './write/refitMark.js';

/** Share of the tolerance within which a line next to a kept one counts as drawn twice (the fit keeps the rest). */
export const PLAN_OVERLAP_SHARE = 0.25;
/** Sample spacing and chord error of the group measurement, as for one element (src/measure/measure.ts). */
const SPACING_FACTOR = 2;
const ERROR_FRACTION = 1 / 1000;

/** What the plan wrote: the elements it handled (not to be refitted one by one), with their edits and reports. */
export interface PlanOutcome {
  handled: Set<number>;
  edits: Edit[];
  reports: Map<number, ElementReport>;
  warnings: string[];
  report: PlanReport;
}

interface Member {
  el: GeometryElement;
  p: ParsedPath;
  model: DrawingElement;
}

const now = (): number => performance.now();

/** Attributes that place geometry (the written d replaces them), name it, or belong to an editor (namespaced). */
const NOT_RENDERING = new Set(['d', 'points', 'x', 'y', 'width', 'height', 'rx', 'ry', 'cx', 'cy', 'r', 'x1', 'y1', 'x2', 'y2', 'id', MARK_ATTR]);

/**
 * What else decides how an element is drawn besides its stroke: its parent (opacity, clips, masks, filters and
 * inherited properties of the ancestors) and its own other attributes (dashes, caps, joins, markers, opacity,
 * class, style). Elements of one group share all of it, so writing a group's contours with its first element's
 * attributes in its place draws each as before. The key is printed in no message (groups are named by paint).
 */
function renderingKey(el: GeometryElement): string {
  const own = Object.keys(el.attrs).filter((k) => !k.includes(':') && !NOT_RENDERING.has(k)).sort();
  return `\u0000${el.parent}\u0000${own.map((k) => `${k}=${el.attrs[k]}`).join('\u0000')}`;
}

/** Plan and write the document's stroke-only elements. */
export function planDocument(doc: SvgDocument, opts: Options, times: StageTimes): PlanOutcome {
  const t0 = now();
  const tol = opts.tolerance;
  const members = new Map<number, Member>();
  const input: PlanContour[] = [];
  // Painting order: a group never reaches across geometry drawn between its members (a white fill over a line
  // would otherwise end up under or over it), so every drawn element the plan leaves alone starts a new run.
  let run = 0;
  const skip = (): void => void run++;
  for (const el of doc.elements) {
    if (!el.rewritable) continue; // not drawn where it stands: it paints nothing between members
    if (el.copyScale > 1 || el.drawnByUse || (el.id !== null && referenced(doc.text, el.id))) { skip(); continue; }
    // Refitted before (its mark): the plan would spend the tolerance again; such elements go to the per-element
    // refit, which keeps them within what is left (src/write/refitMark.ts), unless refitMarked.
    if (!opts.refitMarked && readMark(el.attrs) !== null) { skip(); continue; }
    // Stroked, decided before any geometry is read; whether a fill paints is decided on the geometry below
    // (filled elements are refitted one by one, untouched here).
    if (resolveStyle(el).stroke === 'none') { skip(); continue; }
    let t = now();
    const p = readGeometry(el, []);
    times.parse += now() - t;
    if (!p || p.ops.length === 0 || p.error) { skip(); continue; }
    t = now();
    const model = drawingElementFromSvg(el, p, tol, maxScale(el.toMm), opts.digits);
    times.flatten += now() - t;
    if (!('contours' in model) || model.points.length > 0 || model.contours.length === 0 || paintsFill(model.style.fill, model.contours)) { skip(); continue; }
    const { stroke, strokeWidthMm } = model.style;
    members.set(el.index, { el, p, model });
    // Planned paths are written in one element's place with its attributes: only siblings drawn alike may share a group.
    const group = `${stroke} ${+strokeWidthMm.toPrecision(6)} mm${renderingKey(el)}\u0000${run}`;
    model.contours.forEach((c, k) => input.push({ xy: c.xy, closed: c.closed, group, filled: false, source: { element: el.index, subpath: k } }));
  }
  const out: PlanOutcome = {
    handled: new Set(), edits: [], reports: new Map(), warnings: [],
    report: { travelBeforeMm: 0, travelAfterMm: 0, piercesBefore: 0, piercesAfter: 0, contoursJoined: 0, doubleLinesMm: 0, groups: 0, timeMs: 0 },
  };
  // Each group planned alone (groups never mix), in the order they first appear, each starting where the last one ended;
  // a group that is not written (over the tolerance) adds nothing to the figures.
  const byGroup = new Map<string, PlanContour[]>();
  for (const c of input) (byGroup.get(c.group) ?? byGroup.set(c.group, []).get(c.group)!).push(c);
  const written: PlannedContour[] = [];
  let start: [number, number] = [0, 0];
  for (const [group, contours] of byGroup) {
    const result = planContours(contours, {
      join: opts.planJoin, overlaps: opts.planDoubles, order: opts.planOrder, holesFirst: opts.holesFirst,
      joinDistance: opts.joinDistance ?? tol, overlapDistance: PLAN_OVERLAP_SHARE * tol, start,
    });
    const elements: number[] = [];
    for (const c of contours) if (elements[elements.length - 1] !== c.source.element) elements.push(c.source.element);
    const planned = result.contours;
    if (!writeGroup(doc, opts, group, planned, elements.map((i) => members.get(i)!), out, times)) continue;
    for (const c of planned) written.push(c); // no spread: a large group would overflow the call stack
    out.report.groups++;
    out.report.contoursJoined += result.stats.contoursJoined;
    out.report.doubleLinesMm += result.stats.doubleLength;
    const last = planned[planned.length - 1];
    if (last) start = [last.xy[0], last.xy[1]];
    if (last && !last.closed) start = [last.xy[last.xy.length - 2], last.xy[last.xy.length - 1]];
  }
  // Travel of what the plan wrote, before (document order) and after (plan order), from the origin.
  const before = input.filter((c) => out.handled.has(c.source.element));
  out.report.travelBeforeMm = travel(before);
  out.report.travelAfterMm = travel(written);
  out.report.piercesBefore = before.length;
  out.report.piercesAfter = written.length;
  out.report.timeMs = now() - t0;
  return out;
}

/** Fit, write and measure one group; false (nothing written) when it cannot be or measures over the tolerance. */
function writeGroup(doc: SvgDocument, opts: Options, group: string, planned: PlannedContour[], els: Member[], out: PlanOutcome, times: StageTimes): boolean {
  const tol = opts.tolerance;
  const anchor = els[0].el;
  // The group as people read it: its paint and width, and where it is written (groups of one paint may differ in context).
  const name = `${group.split('\u0000')[0]} at element ${anchor.index}`;
  const mmToLocal = invert(new Float64Array(6), anchor.toMm);
  if (!mmToLocal) return false;
  const budget = splitTolerance(tol, { curved: els.some((m) => m.model.curved), mmPerUnit: maxScale(anchor.toMm), digits: opts.digits });
  if (!budget.fits) return false;
  let t = now();
  const paths: string[] = [];
  let arcs = 0, lines = 0, moves = 0;
  for (const c of planned) {
    // The fit keeps within what the plan left of the budget (a join's bridge, a removed double line).
    // A closed contour starts at the plan's entry vertex: the fitter keeps a closed contour's first vertex as its
    // seam (src/fit/stretches.ts), smooth there when the contour is smooth, so a ring stays two half turns.
    // A join distance over twice the budget leaves the fit nothing: it then gets a twentieth, and the measurement decides.
    const fitTol = Math.max(budget.fitMm - c.slack, 0.05 * tol);
    const fit = fitPolyline(c.xy, { tolerance: fitTol, closed: c.closed, cornerAngle: opts.cornerAngle });
    moves += straightMoves({ xy: c.xy, closed: c.closed }, tol);
    const sink = new PathWriter({ digits: budget.digits });
    const stats = emitSegments(sink, [{ segments: fit.segments, closed: c.closed }], mmToLocal, { digits: budget.digits });
    const segs = fit.segments;
    const closing = c.closed && segs.length > 0 && arcGeometry(segs[segs.length - 1]) === null ? 1 : 0;
    arcs += stats.arcs;
    lines += stats.lines + closing;
    paths.push(sink.toString());
  }
  times.fit += now() - t;
  t = now();
  const spacing = SPACING_FACTOR * tol, chord = ERROR_FRACTION * tol;
  const original = union(els.map((m) => samplePath(m.p, m.el.toMm, spacing, chord)));
  const parsed = paths.map((d) => parsePathData(d));
  const result = union(parsed.map((p) => samplePath(p, anchor.toMm, spacing, chord)));
  const deviation = compareSampled(original, result, anchor.toMm, chord);
  times.measure += now() - t;
  if (parsed.some((p) => p.error) || !deviation || !(deviation.max <= tol)) {
    const what = deviation ? `measured ${deviation.max.toPrecision(3)} mm, over the ${+tol.toPrecision(6)} mm tolerance` : 'could not be measured';
    out.warnings.push(`plan: the ${name} group ${what}; its elements are refitted one by one instead`);
    return false;
  }
  t = now();
  // The anchor's id goes with the first path that draws part of the anchor itself (the others would be misnamed).
  const own = planned.findIndex((c) => c.sources.some((src) => src.element === anchor.index));
  const text = paths.map((d, k) => pathElement(doc, anchor, d, k === Math.max(0, own), tol)).join(indentOf(doc.text, anchor.startTag[0]));
  for (const m of els) {
    const start = m.el.startTag[0], end = m.el.endTag ? m.el.endTag[1] : m.el.startTag[1];
    if (m === els[0]) out.edits.push({ start, end, text });
    else out.edits.push({ start: lineStart(doc.text, start, end), end, text: '' });
    out.handled.add(m.el.index);
    const r = baseReport(m.el, m.p);
    setRefitted(r);
    r.deviation = deviation;
    r.planGroup = name;
    if (m === els[0]) {
      r.segmentsAfter = { arcs, lines };
      r.straightMovesNeeded = moves;
    }
    out.reports.set(m.el.index, r);
  }
  times.write += now() - t;
  return true;
}

/**
 * One `<path>` with the anchor's attributes (shape geometry, editor descriptions and, unless `keepId`, the id
 * removed) and the refit mark of the tolerance it was planned within, so a second run keeps it.
 */
function pathElement(doc: SvgDocument, anchor: GeometryElement, d: string, keepId: boolean, tolMm: number): string {
  const remove = anchor.name === 'path' ? [] : SHAPE_ATTRS[anchor.name].filter((a) => a in anchor.attrs);
  remove.push(...parametricAttributes(anchor.attrs, anchor.namespaces));
  if (!keepId && 'id' in anchor.attrs) remove.push('id');
  const edits = editStartTag(doc.text, anchor, { rename: anchor.name === 'path' ? undefined : 'path', set: { d, [MARK_ATTR]: formatMark(tolMm) }, remove });
  // The edits touch only the start tag: apply them to the text up to its end and keep the new tag.
  const tag = applyEdits(doc.text.slice(0, anchor.startTag[1]), edits).slice(anchor.startTag[0]);
  if (tag.endsWith('/>')) return tag;
  // It had content (a title, say): the path is written as an empty element without it.
  return `${tag.slice(0, -1).trimEnd()}/>`;
}

/** The line break and indentation before an element, to put between the paths written in its place. */
function indentOf(text: string, at: number): string {
  const nl = text.lastIndexOf('\n', at - 1);
  const lead = nl < 0 ? '' : text.slice(nl, at);
  return /^\s*$/.test(lead) && lead.length > 0 ? lead : '\n';
}

/** Where removing an element alone on its line starts: at the line break before it, so no blank line is left. */
function lineStart(text: string, start: number, end: number): number {
  const nl = text.lastIndexOf('\n', start - 1);
  if (nl < 0 || !/^\s*$/.test(text.slice(nl + 1, start))) return start;
  const next = text.indexOf('\n', end);
  return /^\s*$/.test(text.slice(end, next < 0 ? text.length : next)) ? nl : start;
}

/** Whether `#id` appears in the document (a reference by href or url()): such an element stays in place. */
function referenced(text: string, id: string): boolean {
  return text.includes(`#${id}`);
}

function union(parts: SampledPath[]): SampledPath {
  return { polylines: parts.flatMap((s) => s.polylines), errorBound: parts.reduce((m, s) => Math.max(m, s.errorBound), 0) };
}

/** Pen-up travel from the origin through contours drawn from their first vertex (mm). */
function travel(cs: readonly { xy: Float64Array; closed: boolean }[]): number {
  let t = 0, x = 0, y = 0;
  for (const c of cs) {
    t += Math.hypot(c.xy[0] - x, c.xy[1] - y);
    const m = c.closed ? 2 : c.xy.length;
    x = c.xy[m - 2];
    y = c.xy[m - 1];
  }
  return t;
}
