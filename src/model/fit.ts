/**
 * Fit every contour of a drawing-model element with arcs and lines, within the
 * fitting share of its budget.
 */
import { fitContour } from '../fit/fitContour.js';
import { OP_C, OP_Q, type PathData } from '../svg/pathTypes.js';
import { thinWithin } from '../fit/prefilter.js';
import type { OutcomeReason, OutcomeStatus } from '../report/types.js';
import type { DrawingContour, DrawingElement, FittedContour, FittedElement } from './drawing.js';

/** Lines a controller needs to follow the contour within the tolerance (vertex-subset polyline; a closing line counts). */
export function straightMoves(c: DrawingContour, tolMm: number): number {
  const n = c.xy.length >> 1;
  if (n < 2) return 0;
  return thinWithin(c.xy, n, c.closed, tolMm, null).length - 1;
}

/** True when path data has Bézier segments. */
export function hasBeziers(p: PathData): boolean {
  for (let i = 0; i < p.ops.length; i++) if (p.ops[i] === OP_C || p.ops[i] === OP_Q) return true;
  return false;
}

/**
 * Fit an element's contours, each on its own: a contour that cannot be fitted within the tolerance, or
 * (drawn by lines and arcs) whose fit has no fewer pieces than its source, keeps its source subpath
 * (`choice` 'original'); the rest of the element is still refitted.
 * @param cornerAngle turns sharper than this (degrees) stay sharp corners
 * @param keepSources whether a contour may keep its source subpath: only for a writer that writes the
 *   source's own path data in the source's own coordinates (the SVG writer without baked transforms)
 * @param measure whether each contour's fit is measured on its own (src/fit/fitContour.ts): a contour
 *   over the tolerance then becomes straight moves, or keeps its source
 * @returns the contours with their segments, each marked refitted until a check says otherwise
 */
export function fitElement(el: DrawingElement, cornerAngle: number, keepSources = false, measure = false): FittedElement {
  const contours = el.contours.map((c): FittedContour => {
    // Per contour, the cheapest of the spline, straight moves and its source pieces (src/fit/fitContour.ts)
    // when the source is lines and arcs, exact geometry an arc-capable machine takes as it is. A source
    // with Béziers is refitted (a machine cannot take those), and keeps its source only if no fit is within
    // the tolerance.
    const source = keepSources ? c.source : undefined;
    const exact = source !== undefined && !hasBeziers(source.path);
    const tol = el.budget.fitMm;
    const f = fitContour(c.xy, { tolerance: tol, closed: c.closed, cornerAngle, corners: c.corners, originalPieces: exact ? source.pieces : null, measure });
    const kept = f.choice === 'original' || (source !== undefined && f.deviation > tol);
    return {
      contour: c, choice: kept ? 'original' : f.choice, segments: kept ? [] : f.segments ?? [],
      straightMovesNeeded: straightMoves(c, el.toleranceMm),
      outcome: kept ? { status: 'kept', reason: 'no-shorter' } : { status: 'refitted', reason: null },
    };
  });
  return { element: el, contours };
}

/** Give every contour of a fitted element the element's outcome (the refit is accepted or reverted as a whole). */
export function setContourOutcomes(f: FittedElement, status: OutcomeStatus, reason: OutcomeReason | null): void {
  for (const c of f.contours) c.outcome = { status, reason };
}
