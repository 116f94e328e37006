/**
 * The main job with a machine file as the output: SVG text in, G-code or DXF
 * text and a report out, pure. Same reading, budget and fitting as the SVG
 * output (./model, ./budget.ts, numbers written in mm, at least 3 decimals:
 * ./machine/digits.ts), then ./machine/program.ts writes the file, reads it
 * back with an independent reader and measures every element against its
 * original in machine coordinates.
 *
 * Every element that draws is written, circles, ellipses and rects included
 * (a machine file has no shapes: they become arcs), and so is every copy a
 * `<use>` draws (./machine/copies.ts: mapped, fitted and proven where it
 * lands, grouped by its own stroke); geometry only copies draw (in defs or a
 * symbol) is not written where it stands. With `plan`, stroke-only elements
 * are planned per stroke colour and written in plan order
 * (./machine/plan.ts), each colour proven as a whole. An element over its
 * tolerance after the fit is written as its flattened polyline instead
 * (status 'reverted', reason 'over-tolerance'), as the SVG output keeps its
 * original, and the file is written and proven again; a planned colour over
 * it is written unplanned first. Geometry that is not drawn (hidden) is not
 * written, and point marks (subpaths that draw only a point) are not written
 * (a warning says so). An element that cannot be modelled (too few decimals
 * for its tolerance, cannot be flattened) is missing from the file: a
 * warning names it and the file fails its check (exit status 1).
 */
import { OptionError, resolveOptions, type ArcsplineOptions } from './options.js';
import { readSvg, type GeometryElement } from './svg/document.js';
import { drawingElementFromSvg, readGeometry } from './model/fromSvg.js';
import { fitElement } from './model/fit.js';
import { baseReport, untouchedReport } from './refitElement.js';
import { summarise, untouchedSummary } from './refitSummary.js';
import { setRefitted, setUnchanged } from './report/status.js';
import { elementTag } from './report/table.js';
import type { ElementReport, FileReport, MachineSummary } from './report/types.js';
import { arcGeometry } from './fit/segment.js';
import { strokeKey } from './machine/colour.js';
import { withoutPointSubpaths } from './machine/pointMarks.js';
import { machineCopies, type MachineCopy } from './machine/copies.js';
import { machineKey, type MachineContour } from './machine/drawing.js';
import { elementVerdicts } from './machine/verdicts.js';
import { MIN_MACHINE_DIGITS, machineDigits } from './machine/digits.js';
import type { MachineElement } from './machine/drawing.js';
import { loadProfile } from './machine/profile.js';
import { straightEstimate, writeMachineFile, type MachineFile } from './machine/program.js';
import type { MachineElementProof } from './machine/proof.js';
import { planMachine, planReport, type MachineCandidate, type MachinePlanGroup } from './machine/plan.js';

type Cand = MachineCandidate & { report: ElementReport; source: GeometryElement };

/** What {@link refitToMachine} gives. */
export interface MachineRefitResult {
  /** The machine file's text. */
  text: string;
  /** The report, with `machine` set. */
  report: FileReport;
  /** The written file with its proof and time estimate. */
  machine: MachineFile;
}

const now = (): number => performance.now();

export { withoutPointSubpaths } from './machine/pointMarks.js';


/**
 * Refit an SVG document into a G-code or DXF file (`options.format`), with the
 * profile `options.machineProfile` and origin `options.machineOrigin`.
 * @throws SvgInputError for unreadable input; OptionError (ProfileError) for bad options
 */
export function refitToMachine(text: string, options: ArcsplineOptions = {}, file: string | null = null): MachineRefitResult {
  const t0 = now();
  const opts = resolveOptions(options);
  if (opts.format === 'svg') throw new RangeError('refitToMachine writes gcode or dxf; use refitSvg for SVG');
  const format = opts.format;
  if (opts.digits !== null && opts.digits < MIN_MACHINE_DIGITS) {
    throw new OptionError(`digits ${opts.digits} is too few for a machine file: at least ${MIN_MACHINE_DIGITS} (an interpreter refuses arcs whose two radii differ by more than 0.002 mm)`);
  }
  const profile = loadProfile(opts.machineProfile);
  const doc = readSvg(text, { assumedMmPerUnit: opts.assumedMmPerUnit, maxInputChars: opts.maxInputBytes });
  const warnings = doc.warnings.slice();
  const untouched = untouchedSummary(doc);
  if (untouched) warnings.push(untouched);
  // No copy-factor warning as for SVG output: every copy is written, fitted and measured where it lands.
  // One number format for the whole file: enough decimals for the tightest element.
  let tightest = opts.tolerance;
  for (const el of doc.elements) if (el.rewritable) tightest = Math.min(tightest, opts.tolerance / Math.max(1, el.copyScale));
  const digits = opts.digits ?? machineDigits(tightest);
  const reports: ElementReport[] = [];
  const cands: Cand[] = [];
  const what = format === 'gcode' ? 'G-code' : 'DXF';
  let missing = 0, points = 0;
  for (const el of doc.elements) {
    if (!el.rewritable) {
      reports.push(untouchedReport(el));
      continue;
    }
    const p = readGeometry(el, warnings);
    if (!p || p.ops.length === 0) continue;
    const report = baseReport(el, p);
    reports.push(report);
    const tol = opts.tolerance / Math.max(1, el.copyScale);
    const model = drawingElementFromSvg(el, p, tol, 1, digits);
    if (!('contours' in model)) {
      setUnchanged(report, model.reason, model.message);
      warnings.push(`${elementTag(el)}: not written to the ${what} file: ${model.message}`);
      missing++;
      continue;
    }
    points += model.points.length / 2;
    const original = { path: model.points.length > 0 ? withoutPointSubpaths(p) : p, toMm: el.toMm };
    cands.push({ model, report, label: el.id ? `${el.name}#${el.id}` : el.name, original, source: el });
  }
  if (points > 0) warnings.push(`${points === 1 ? '1 point mark (a subpath that draws only a point) is' : `${points} point marks (subpaths that draw only a point) are`} not written to the ${what} file`);
  // The plan starts where the head waits: the machine origin, on the page.
  const home: [number, number] = [0, opts.machineOrigin === 'lower-left' ? doc.pageMm[1] : 0];
  const tPlan = now();
  const groups = opts.plan ? planMachine(cands, opts, home) : [];
  const planMs = now() - tPlan;
  const active = new Map(groups.map((g) => [g.anchor, g]));
  const memberOf = new Map<number, MachinePlanGroup>();
  for (const g of groups) for (const i of g.members) memberOf.set(i, g);
  const unplanned = new Map<number, MachineElement>();
  /** By machine key: each written element's contours as straight moves, for one that measures over the tolerance. */
  const straightOf = new Map<number, MachineContour[]>();
  /** An element fitted on its own (its report says what the fit made). */
  const single = (c: Cand): MachineElement => {
    const have = unplanned.get(c.model.index);
    if (have) return have;
    const fitted = fitElement(c.model, opts.cornerAngle);
    let arcs = 0, lines = 0;
    for (const fc of fitted.contours) {
      c.report.straightMovesNeeded += fc.straightMovesNeeded;
      for (const s of fc.segments) if (arcGeometry(s)) arcs++; else lines++;
    }
    c.report.segmentsAfter = { arcs, lines };
    const m: MachineElement = {
      index: c.model.index, label: c.label, group: strokeKey(c.model.style.stroke), toleranceMm: c.model.toleranceMm,
      contours: fitted.contours.map((fc) => ({ segments: fc.segments, closed: fc.contour.closed })), original: c.original,
    };
    unplanned.set(c.model.index, m);
    straightOf.set(c.model.index, c.model.contours.map((ct) => ({ segments: [], closed: ct.closed, xy: ct.xy })));
    return m;
  };
  const copied = new Map<number, MachineCopy[]>();
  /** Every copy a `<use>` draws of an element, fitted where it lands (the report counts the first when the element is not drawn in place). */
  const copiesOf = (c: Cand): MachineCopy[] => {
    if (c.model.copies.length === 0) return [];
    let have = copied.get(c.model.index);
    if (have) return have;
    have = machineCopies(c.model, c.source.copies, c.original.path, c.label, doc.rootToMm, opts.tolerance, opts.cornerAngle);
    copied.set(c.model.index, have);
    for (const k of have) straightOf.set(machineKey(k.element.index, k.element.copy), k.straight);
    if (!c.model.inPlace) c.report.segmentsAfter = have[0].segments;
    const clipped = have.filter((k) => k.clipped).length;
    if (clipped > 0) warnings.push(`${c.label}: ${clipped === 1 ? '1 copy reaches' : `${clipped} copies reach`} outside the viewport that clips it in SVG; the ${what} file draws the whole geometry`);
    return have;
  };
  // Painting order: an element where it stands (unless only copies draw it), a copy where its <use> stands,
  // a planned colour where its first element stood and its other elements nowhere else.
  const assemble = (): MachineElement[] => {
    const placed: { m: MachineElement; at: number }[] = [];
    for (const c of cands) {
      const g = memberOf.get(c.model.index);
      if (g && active.has(g.anchor)) {
        if (g.anchor === c.model.index) placed.push({ m: g.element, at: g.anchor });
        continue;
      }
      if (c.model.inPlace) placed.push({ m: single(c), at: c.model.index });
      for (const k of copiesOf(c)) placed.push({ m: k.element, at: k.use });
    }
    return placed.sort((a, b) => a.at - b.at).map((p) => p.m);
  };
  const drawing = { pageHeightMm: doc.pageMm[1], elements: assemble(), source: file };
  const run = { format, tolerance: opts.tolerance, profile, origin: opts.machineOrigin, digits };
  let out = writeMachineFile(drawing, run);
  const failing = (): Map<number, MachineElementProof> => new Map(out.proof.elements.filter((e) => !e.ok).map((e) => [machineKey(e.index, e.copy), e]));
  let failed = failing();
  const overGroups = groups.filter((g) => failed.has(g.anchor));
  if (overGroups.length > 0) {
    // As for SVG output: a colour over the tolerance is written unplanned, element by element.
    for (const g of overGroups) {
      const d = failed.get(g.anchor)!.deviation;
      warnings.push(`plan: the ${g.group} group ${d ? `measured ${d.max.toPrecision(3)} mm, over the ${+opts.tolerance.toPrecision(6)} mm tolerance` : 'could not be measured'}; its elements are written one by one instead`);
      active.delete(g.anchor);
    }
    drawing.elements = assemble();
    out = writeMachineFile(drawing, run);
    failed = failing();
  }
  const byIndex = new Map(cands.map((c) => [c.model.index, c]));
  if (failed.size > 0) {
    // As the SVG output keeps an original: the flattened polyline (within the flattening share) instead of the fit.
    for (const m of drawing.elements) {
      const key = machineKey(m.index, m.copy), first = failed.get(key);
      if (!first || (m.copy === undefined && active.has(m.index))) continue;
      const { report } = byIndex.get(m.index)!;
      m.contours = straightOf.get(key)!;
      setUnchanged(report, 'over-tolerance',
        `${m.copy ? `copy ${m.copy}: ` : ''}measured deviation ${first.deviation ? `${first.deviation.max.toPrecision(3)} mm` : '(none)'} of the fit is over the tolerance; written as straight moves through the original`);
      report.segmentsAfter = { arcs: 0, lines: 0 };
    }
    out = writeMachineFile(drawing, run);
  }
  for (const e of elementVerdicts(out.proof.elements)) {
    const g = active.get(e.index);
    for (const i of g ? g.members : [e.index]) {
      const c = byIndex.get(i);
      if (!c) continue;
      const r = c.report;
      r.deviation = e.deviation;
      if (g) {
        r.planGroup = g.group;
        if (i === g.anchor) Object.assign(r, { segmentsAfter: g.segments, straightMovesNeeded: g.straightMovesNeeded });
      }
      if (r.status === 'reverted') continue;
      if (e.ok && e.deviation === null) setUnchanged(r, 'nothing-to-measure', `draws only point marks, which are not written to the ${what} file`);
      else if (e.ok) setRefitted(r);
      else setUnchanged(r, 'over-tolerance', `${e.where}measured deviation ${e.deviation ? `${e.deviation.max.toPrecision(3)} mm` : '(none)'} of the ${what} file is over the tolerance`);
    }
  }
  for (const p of out.proof.problems) if (!/over the tolerance/.test(p)) warnings.push(`${what} file check: ${p}`);
  // The baseline: the same drawing in the same order (each copy, each planned contour) as straight moves through the flattened contours.
  const straight = straightEstimate(
    drawing.elements.map((m) => {
      const g = m.copy === undefined ? active.get(m.index) : undefined;
      const polylines = g ? g.planned : straightOf.get(machineKey(m.index, m.copy))!.map((c) => ({ xy: c.xy!, closed: c.closed }));
      return { index: m.index, label: '', group: m.group, polylines };
    }), doc.pageMm[1], profile, opts.machineOrigin,
  );
  const report = summarise(reports, opts.tolerance, text, out.text, warnings, file, now() - t0);
  const machine: MachineSummary = {
    format, profile: profile.name, origin: opts.machineOrigin, digits: out.digits, lines: out.lines,
    moves: out.moves, checked: out.proof.ok && missing === 0, seconds: out.time.seconds,
    straight: { moves: straight.moves, seconds: straight.time.seconds },
  };
  report.machine = machine;
  if (opts.plan) report.plan = planReport(groups.filter((g) => active.has(g.anchor)), home, planMs);
  // Geometry missing from the file is a failure like a deviation over the tolerance (exit status 1).
  if (!machine.checked) report.totals.withinTolerance = false;
  return { text: out.text, report, machine: out };
}
