/**
 * One contour, never worse than its input: the cheapest of the fitted spline
 * (./fitPolyline.ts), straight moves through a vertex subset within the
 * tolerance (./thinLines.ts) and the contour's own original pieces, each
 * allowed only within the tolerance. The spline is measured independently
 * (src/measure/polylineDeviation.ts: written out, read back, Hausdorff bound)
 * and dropped if over; the straight moves are within the tolerance by
 * construction; the original is the input itself. Ties go to the original
 * (nothing changes), then to the lines (fewer bytes than arcs).
 */
import { fitPolyline, LINES_SHARE, type FitOptions } from './fitPolyline.js';
import { thinnedLines } from './thinLines.js';
import type { Segment } from './segment.js';
import { polylineDeviation } from '../measure/polylineDeviation.js';

/** Which of the three a contour came out as. */
export type ContourChoice = 'spline' | 'lines' | 'original';

export interface ContourOptions extends FitOptions {
  /**
   * Pieces the contour's source draws (its commands, a closing `Z` that draws a
   * line counted as one), when the source is exact geometry that can be kept as
   * written; null or absent when it cannot (a polyline's own vertices are
   * always at least as many as the straight moves, so it needs none).
   */
  originalPieces?: number | null;
  /**
   * Measure the spline (and the lines) independently and drop what is over; default true. A pipeline that
   * measures the whole element anyway passes false, and true again only for an element found over.
   */
  measure?: boolean;
}

export interface ContourFit {
  choice: ContourChoice;
  /** The pieces to write (mm); null when the original is kept. */
  segments: Segment[] | null;
  /** Pieces drawn: segments.length, or originalPieces. */
  pieces: number;
  /** Measured deviation of the written spline or lines (mm, upper bound); 0 for the original; NaN when not measured. */
  deviation: number;
  /** The spline's measured deviation when it was over the tolerance and dropped, else null. */
  splineOver: number | null;
}

/**
 * Fit one contour (flat x,y pairs in mm) and choose what to write.
 * @throws RangeError for a non-positive tolerance or a non-finite coordinate (as fitPolyline)
 */
export function fitContour(xy: Float64Array, opts: ContourOptions): ContourFit {
  const tol = opts.tolerance;
  const closed = opts.closed ?? false;
  const check = opts.measure ?? true;
  const fit = fitPolyline(xy, opts);
  let segments = fit.segments;
  let choice: ContourChoice = fit.choice;
  let deviation = segments.length === 0 ? Infinity : check ? measured(xy, closed, segments, tol) : NaN;
  let splineOver: number | null = null;
  if (segments.length === 0 || (check && !(deviation <= tol))) {
    // Over (or nothing drawn, or not measurable): straight moves, within the tolerance by construction.
    if (segments.length > 0 && choice === 'spline') splineOver = deviation;
    segments = thinnedLines(xy, closed, LINES_SHARE * tol);
    choice = 'lines';
    deviation = segments.length === 0 ? Infinity : check ? measured(xy, closed, segments, tol) : NaN;
  }
  const original = opts.originalPieces ?? null;
  if (original !== null && (!(deviation <= tol || Number.isNaN(deviation)) || original <= segments.length)) {
    return { choice: 'original', segments: null, pieces: original, deviation: 0, splineOver };
  }
  // Without an original to keep, lines measured over (only rounding could do that) are still drawn; `deviation` says so.
  return { choice, segments, pieces: segments.length, deviation, splineOver };
}

/** The independent measurement's deviation (mm), Infinity when it cannot measure (a contour too long to sample). */
function measured(xy: Float64Array, closed: boolean, segments: Segment[], tol: number): number {
  try {
    return polylineDeviation(xy, closed, segments, tol).max;
  } catch {
    return Infinity;
  }
}
