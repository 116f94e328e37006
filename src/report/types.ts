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

export interface ElementReport {
  /** Position among all elements of the document, in document order (root svg = 0). */
  index: number;
  name: string;
  id: string | null;
  /** Ancestor chain, e.g. "svg > g#layer1 > g". */
  ancestors: string;
  /** Drawing commands before, by source command letter (polyline, polygon: their equivalent path's M, L, Z), or {element name: 1} for the other shapes. */
  commandsBefore: Record<string, number>;
  /** Straight moves a controller would need to follow the original within the same tolerance. */
  straightMovesNeeded: number;
  segmentsAfter: { arcs: number; lines: number };
  /** Measured on the written output; null when nothing could be measured (empty geometry). */
  deviation: Deviation | null;
  /** True when the original geometry was written back unchanged. */
  kept: boolean;
  keptReason: string | null;
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
  warnings: string[];
}
