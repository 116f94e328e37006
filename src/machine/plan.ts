/**
 * The path plan for a machine file (option `plan` with format gcode or dxf):
 * the stroke-only elements are planned per stroke colour (the machine's
 * operation or layer) with src/plan (double lines, join, order, holes first)
 * and each colour becomes one machine element: its planned contours, fitted in
 * plan order, written where the colour's first element stood. Filled elements,
 * elements with point marks and elements drawn by `<use>` stay as they are, in
 * their place, so painting order and the colours' sequence (first appearance)
 * are kept and colours never interleave.
 *
 * Proof: the group's machine element carries every member's original
 * (./drawing.ts `also`), so the written file is measured per group as a whole
 * (a removed double line counts as covered by the kept one, as in
 * ../planRefit.ts); a group over the tolerance is written unplanned instead.
 */
import type { Options } from '../options.js';
import type { DrawingElement } from '../model/drawing.js';
import { straightMoves } from '../model/fit.js';
import { fitPolyline } from '../fit/fitPolyline.js';
import { arcGeometry } from '../fit/segment.js';
import { planContours } from '../plan/plan.js';
import type { PlanContour, PlannedContour } from '../plan/types.js';
import type { PathData } from '../svg/pathTypes.js';
import type { Matrix } from '../svg/matrixTypes.js';
import type { MachineElement } from './drawing.js';
import { strokeKey } from './colour.js';
import type { PlanReport } from '../report/types.js';

import { PLAN_OVERLAP_SHARE } from '../planRefit.js';
import { paintsFill } from '../model/style.js';

/** One element that can be written to the machine file, before fitting. */
export interface MachineCandidate {
  model: DrawingElement;
  label: string;
  /** Its original geometry (path data in user units and its matrix to page mm), for the proof. */
  original: { path: PathData; toMm: Matrix };
}

/** One planned colour: the machine element that draws it and what the plan did. */
export interface MachinePlanGroup {
  group: string;
  /** Index of the group's first element: the machine element takes its index and place. */
  anchor: number;
  /** Indices of every member element, document order. */
  members: number[];
  element: MachineElement;
  /** The group's input contours (document order) and planned ones (plan order), page mm. */
  input: PlanContour[];
  planned: PlannedContour[];
  joined: number;
  doubleMm: number;
  segments: { arcs: number; lines: number };
  straightMovesNeeded: number;
}

/** Whether the plan takes an element: stroked, painting no fill (src/model/style.ts), drawn in place only, with contours and no point marks. */
export function plannable(m: DrawingElement): boolean {
  return m.style.stroke !== 'none' && m.inPlace && m.copies.length === 0 &&
    m.points.length === 0 && m.contours.length > 0 && !paintsFill(m.style.fill, m.contours);
}

/**
 * Plan the plannable candidates per stroke colour, in the order the colours first appear, each group starting
 * where the last one ended.
 * @param start page mm where the head waits (the machine origin on the page)
 */
export function planMachine(cands: readonly MachineCandidate[], opts: Options, start: [number, number]): MachinePlanGroup[] {
  const tol = opts.tolerance;
  const byGroup = new Map<string, MachineCandidate[]>();
  for (const c of cands) {
    if (!plannable(c.model)) continue;
    const g = strokeKey(c.model.style.stroke);
    (byGroup.get(g) ?? byGroup.set(g, []).get(g)!).push(c);
  }
  const out: MachinePlanGroup[] = [];
  let at = start;
  for (const [group, members] of byGroup) {
    const input: PlanContour[] = [];
    for (const m of members) {
      m.model.contours.forEach((c, k) => input.push({ xy: c.xy, closed: c.closed, group, filled: false, source: { element: m.model.index, subpath: k } }));
    }
    const result = planContours(input, {
      join: opts.planJoin, overlaps: opts.planDoubles, order: opts.planOrder, holesFirst: opts.holesFirst,
      joinDistance: opts.joinDistance ?? tol, overlapDistance: PLAN_OVERLAP_SHARE * tol, start: at,
    });
    const planned = result.contours;
    // The fit keeps within what the plan left of the tightest member's budget; a closed contour starts at its entry
    // (the fitter keeps a closed contour's first vertex as its seam, smooth where the contour is).
    // A loop, not Math.min(...list): a spread of some 120,000 values overflows the call stack.
    let fitMm = Infinity, toleranceMm = Infinity;
    for (const m of members) {
      fitMm = Math.min(fitMm, m.model.budget.fitMm);
      toleranceMm = Math.min(toleranceMm, m.model.toleranceMm);
    }
    let arcs = 0, lines = 0, moves = 0;
    const contours = planned.map((c) => {
      const fit = fitPolyline(c.xy, { tolerance: Math.max(fitMm - c.slack, 0.05 * toleranceMm), closed: c.closed, cornerAngle: opts.cornerAngle });
      for (const s of fit.segments) if (arcGeometry(s)) arcs++; else lines++;
      moves += straightMoves({ xy: c.xy, closed: c.closed }, toleranceMm);
      return { segments: fit.segments, closed: c.closed };
    });
    const [first, ...rest] = members;
    out.push({
      group, anchor: first.model.index, members: members.map((m) => m.model.index), input, planned,
      element: {
        index: first.model.index, label: `${group} group of ${members.length} element${members.length === 1 ? '' : 's'}`, group,
        toleranceMm, contours, original: first.original, also: rest.map((m) => m.original),
      },
      joined: result.stats.contoursJoined, doubleMm: result.stats.doubleLength, segments: { arcs, lines }, straightMovesNeeded: moves,
    });
    const last = planned[planned.length - 1];
    if (last) at = last.closed ? [last.xy[0], last.xy[1]] : [last.xy[last.xy.length - 2], last.xy[last.xy.length - 1]];
  }
  return out;
}

/** Pen-up travel from `start` through contours drawn from their first vertex (mm). */
export function travelMm(cs: readonly { xy: Float64Array; closed: boolean }[], start: readonly [number, number]): number {
  let t = 0, [x, y] = start;
  for (const c of cs) {
    if (c.xy.length < 2) continue;
    t += Math.hypot(c.xy[0] - x, c.xy[1] - y);
    const m = c.closed ? 2 : c.xy.length;
    x = c.xy[m - 2];
    y = c.xy[m - 1];
  }
  return t;
}

/** The plan's figures over the groups written planned: travel from `home` in document order and in plan order. */
export function planReport(written: readonly MachinePlanGroup[], home: readonly [number, number], ms: number): PlanReport {
  const before = written.flatMap((g) => g.input.map((c) => ({ c, at: c.source.element })))
    .sort((a, b) => a.at - b.at || a.c.source.subpath - b.c.source.subpath).map((x) => x.c);
  const after = written.flatMap((g) => g.planned);
  return {
    travelBeforeMm: travelMm(before, home), travelAfterMm: travelMm(after, home),
    piercesBefore: before.length, piercesAfter: after.length,
    contoursJoined: written.reduce((n, g) => n + g.joined, 0), doubleLinesMm: written.reduce((n, g) => n + g.doubleMm, 0),
    groups: written.length, timeMs: ms,
  };
}
