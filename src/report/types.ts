/**
 * The report's shape (documented for users in schema/report.schema.json).
 * Every distance is in millimetres on the machine unless a field says otherwise.
 */

export interface Deviation {
  /** Two-sided Hausdorff distance: max of the two directions below. */
  max: number;
  /** Farthest any point of the original lies from the written result. */
  originalToResult: number;
  /** Farthest any point of the written result lies from the original. */
  resultToOriginal: number;
  /** Mean distance of the original's sample points from the result. */
  mean: number;
  /** Where the largest distance occurs, in mm (root viewport, y down). */
  worstMm: [number, number];
  /** The same spot in the element's own user units. */
  worstUser: [number, number];
}

/**
 * What happened to an element (or a contour): rewritten by the refit, kept as
 * written before anything was fitted, or reverted to the original after the
 * refit was written and checked.
 */
export type OutcomeStatus = 'refitted' | 'kept' | 'reverted';

/**
 * Why an element was kept or reverted (null when refitted):
 * - kept: `exact-shape` (circle, ellipse, rect or line, exact already), `not-drawn`
 *   (not drawn where it stands, or cannot be: the reader's message says which),
 *   `cannot-invert` (its coordinate system is singular), `too-few-digits` (fixed
 *   decimals leave the fit too little of the tolerance), `cannot-flatten`,
 *   `no-shorter` (lines only and the refit is no shorter); `grows` (Bézier curves whose refit has more
 *   pieces or bytes, kept by the keepGrowingCurves option); `already-refitted` (a previous run
 *   refitted it within this tolerance or less: its mark, src/write/refitMark.ts);
 *   reverted `restyled`: written as a path, the document read again styles or places it otherwise (a sheet
 *   rule for its element name, a CSS transform that wins over a baked transform);
 * - reverted: `over-tolerance` (the measured deviation is over the tolerance),
 *   `cannot-measure`, `unreadable-output` (the written path data did not read
 *   back: an internal fault), `nothing-to-measure`.
 */
export type OutcomeReason =
  | 'exact-shape' | 'not-drawn' | 'cannot-invert' | 'too-few-digits' | 'cannot-flatten' | 'no-shorter' | 'grows' | 'already-refitted' | 'restyled'
  | 'over-tolerance' | 'cannot-measure' | 'unreadable-output' | 'nothing-to-measure';

export interface ElementReport {
  /** Position among all elements of the document, in document order (root svg = 0). */
  index: number;
  name: string;
  id: string | null;
  /** Ancestor chain, e.g. "svg > g#layer1 > g". */
  ancestors: string;
  /** Drawing commands before, by source command letter (polyline, polygon: their equivalent path's M, L, Z), or {element name: 1} for the other shapes. */
  commandsBefore: Record<string, number>;
  /** Straight moves a controller would need to follow the original within the same tolerance (a closing line counts as one). */
  straightMovesNeeded: number;
  /** Pieces written: arcs, and lines including the closing lines drawn by Z. */
  segmentsAfter: { arcs: number; lines: number };
  /** True when it has Bézier curves and its refit has more pieces or more bytes of path data than written. */
  grows: boolean;
  /** Measured on the written output; null when nothing could be measured (empty geometry). */
  deviation: Deviation | null;
  /** True when the original geometry was written back unchanged (status is not 'refitted'). */
  kept: boolean;
  /** Why it was kept or reverted, for people (null when refitted); `reason` is the same as a code. */
  keptReason: string | null;
  status: OutcomeStatus;
  reason: OutcomeReason | null;
  /** Its computed paint where it stands (the CSS cascade: attributes, style sheets, style attribute). */
  style: ElementPaint;
  /** Copies drawn elsewhere by `<use>` (0 when none); each is kept within the tolerance. */
  copies: number;
  /** With the path plan: the stroke group whose planned contours draw this element (its deviation is the group's). */
  planGroup?: string;
  /** Each subpath's outcome, in source order, when the element was fitted (absent when it was kept before fitting). */
  contours?: ContourReport[];
}

/** What became of one subpath (contour) of an element. */
export interface ContourReport {
  /** Refitted, or kept as written (reason `no-shorter`: nothing fitted is shorter), or as its element was reverted. */
  status: OutcomeStatus;
  reason: OutcomeReason | null;
  /** What it is written as: `spline` (arcs and lines), `lines` (straight moves through its own vertices) or `original` (its commands as written). */
  as: 'spline' | 'lines' | 'original';
}

/** How an element is painted: what cutters and plotters map to operations (cut, score, engrave; pen 1, 2). */
export interface ElementPaint {
  /** `none`, `#rrggbb` (`#rrggbbaa` when not opaque), or `url(#id)` with an optional fallback. */
  stroke: string;
  /** As `stroke`; SVG's initial fill is `#000000`. */
  fill: string;
  /** Stroke width in mm on the machine. */
  strokeWidthMm: number;
}

/** The drawn elements with one stroke and fill, in order of first appearance. */
export interface PaintGroup {
  stroke: string;
  fill: string;
  /** Drawn elements with this paint (count; those not drawn where they stand are not counted). */
  elements: number;
  /** Of those, rewritten (count). */
  rewritten: number;
}

/** What the path plan did (src/plan), when it ran. */
export interface PlanReport {
  /** Pen-up travel from the origin and between the planned contours, document order and plan order, mm. */
  travelBeforeMm: number;
  travelAfterMm: number;
  /** Contours (pen-downs or pierces) before and after. */
  piercesBefore: number;
  piercesAfter: number;
  contoursJoined: number;
  /** Lines drawn twice that were removed, mm. */
  doubleLinesMm: number;
  /** Stroke groups written in plan order. */
  groups: number;
  timeMs: number;
}

export interface FileReport {
  tool: 'arcspline';
  version: string;
  file: string | null;
  toleranceMm: number;
  bytesIn: number;
  bytesOut: number;
  timeMs: number;
  /** Every geometry element in document order: rewritten, kept after measuring, or kept as not drawn where it stands (with the reason). */
  elements: ElementReport[];
  totals: {
    elements: number;
    rewritten: number;
    kept: number;
    commandsBefore: number;
    segmentsAfter: { arcs: number; lines: number };
    maxDeviation: number;
    withinTolerance: boolean;
  };
  /** The drawn elements grouped by stroke and fill. */
  paints: PaintGroup[];
  warnings: string[];
  /** Present when the output is a machine file (G-code or DXF) instead of SVG. */
  machine?: MachineSummary;
  /** Present when the path plan ran. */
  plan?: PlanReport;
}

/** A machine file's figures (src/refitMachine.ts). Deviations are in the elements, measured on the file read back. */
export interface MachineSummary {
  format: 'gcode' | 'dxf';
  /** Machine profile name. */
  profile: string;
  /** Page corner at the machine origin. */
  origin: 'lower-left' | 'upper-left';
  /** Decimals of the written numbers (mm). */
  digits: number;
  /** Lines of the file. */
  lines: number;
  /** Moves written: travels (G0), lines (G1, LINE), arcs (G2/G3, ARC). */
  moves: { travels: number; lines: number; arcs: number };
  /** Every element was written, and the reader found each within its tolerance, nothing drawn outside an element and arc radii within 0.002 mm. */
  checked: boolean;
  /** Estimated machine time, s (motion model with the profile's feeds; README). */
  seconds: number;
  /** The same drawing as straight moves through its flattened contours: moves and estimated time, s. */
  straight: { moves: number; seconds: number };
}
