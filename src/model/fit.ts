/**
 * Fit every contour of a drawing-model element with arcs and lines, within the
 * fitting share of its budget.
 */
import { fitPolyline } from '../fit/fitPolyline.js';
import { thinWithin } from '../fit/prefilter.js';
import type { OutcomeReason, OutcomeStatus } from '../report/types.js';
import type { DrawingContour, DrawingElement, FittedElement } from './drawing.js';

/** Lines a controller needs to follow the contour within the tolerance (vertex-subset polyline; a closing line counts). */
export function straightMoves(c: DrawingContour, tolMm: number): number {
  const n = c.xy.length >> 1;
  if (n < 2) return 0;
  return thinWithin(c.xy, n, c.closed, tolMm, null).length - 1;
}

/**
 * Fit an element's contours.
 * @param cornerAngle turns sharper than this (degrees) stay sharp corners
 * @returns the contours with their segments, each marked refitted until a check says otherwise
 */
export function fitElement(el: DrawingElement, cornerAngle: number): FittedElement {
  const contours = el.contours.map((c) => ({
    contour: c,
    segments: fitPolyline(c.xy, { tolerance: el.budget.fitMm, closed: c.closed, cornerAngle, corners: c.corners }).segments,
    straightMovesNeeded: straightMoves(c, el.toleranceMm),
    outcome: { status: 'refitted' as OutcomeStatus, reason: null as OutcomeReason | null },
  }));
  return { element: el, contours };
}

/** Give every contour of a fitted element the element's outcome (the refit is accepted or reverted as a whole). */
export function setContourOutcomes(f: FittedElement, status: OutcomeStatus, reason: OutcomeReason | null): void {
  for (const c of f.contours) c.outcome = { status, reason };
}
