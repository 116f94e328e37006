/**
 * The drawing model: what the reader found, in millimetres on the machine,
 * independent of the file format it came from or goes to.
 *
 * read (src/svg) → DrawingElement (here, built by ./fromSvg.ts) → fit
 * (./fit.ts: FittedElement) → writers: the SVG writer now (src/write), other
 * machine formats (G-code, DXF) and a path plan next, each taking the fitted
 * elements and their contours in mm with the element's style and group.
 */
import type { Segment } from '../fit/segment.js';
import type { Matrix } from '../svg/matrixTypes.js';
import type { ContourChoice } from '../fit/fitContour.js';
import type { PathData } from '../svg/pathTypes.js';
import type { ToleranceSplit } from '../budget.js';
import type { OutcomeReason, OutcomeStatus } from '../report/types.js';

/** How an element is drawn (its computed style): the properties a cutter or plotter maps to its operations. */
export interface DrawingStyle {
  /** Stroke paint: `none`, `#rrggbb` (`#rrggbbaa` when not opaque), or `url(#id)` with an optional fallback. */
  stroke: string;
  /** Fill paint, as `stroke` (SVG's initial value is black, `#000000`). */
  fill: string;
  /** Stroke width in mm on the machine (the element's scale applied; with non-scaling-stroke, the root's). */
  strokeWidthMm: number;
  fillRule: 'nonzero' | 'evenodd';
}

/** One copy of an element drawn through `<use>`. */
export interface DrawingCopy {
  /** mm where the element stands → mm where the copy is, SVG matrix order [a b c d e f]. */
  map: Matrix;
  style: DrawingStyle;
}

/** One contour in mm: flat x,y pairs (root viewport, y down), open or closed. */
export interface DrawingContour {
  xy: Float64Array;
  closed: boolean;
  /** Vertex indices that are tangent breaks in the source (sharp corners); absent when none are known. */
  corners?: Uint32Array;
  /**
   * The source subpath this contour was flattened from, in the element's own user units (absolute path
   * data starting with its moveto), and the pieces it draws (a closing Z that draws a line counted); absent
   * when not known. A contour that cannot be fitted, or whose fit has no fewer pieces, is kept as this.
   */
  source?: { path: PathData; pieces: number };
}

/** One source element as the model sees it. */
export interface DrawingElement {
  /** Position in document order (root = 0). */
  index: number;
  id: string | null;
  /** Source element name (`path`, `circle`, …). */
  name: string;
  /** Id of the nearest enclosing group (SVG: the nearest ancestor `g` with an id), or null. */
  group: string | null;
  style: DrawingStyle;
  /** False when only copies drawn by `<use>` draw it (it stands in defs or a symbol): a writer then draws just the copies. */
  inPlace: boolean;
  /** Every copy a `<use>` draws of it: `map` takes its contours (mm) to the copy's (mm); the copy has its own style (inherited from the use). */
  copies: DrawingCopy[];
  /** Its contours in mm (a point subpath such as a pierce mark has none; see `points`). */
  contours: DrawingContour[];
  /** Subpaths that draw a single point, in mm, flat x,y pairs. */
  points: Float64Array;
  /** Whether the source has curves (Bézier or elliptical arcs) that were flattened. */
  curved: boolean;
  /** This element's tolerance, mm (the file's, over the largest enlargement of a copy). */
  toleranceMm: number;
  /** How that tolerance is split (src/budget.ts), for the writer the contours will be written by. */
  budget: ToleranceSplit;
}

/** What became of one contour. */
export interface ContourOutcome {
  status: OutcomeStatus;
  reason: OutcomeReason | null;
}

/** A contour with the arcs and lines fitted to it (mm, end to end), and its outcome. */
export interface FittedContour {
  contour: DrawingContour;
  /** What it is written as: the arc spline, straight moves, or its source subpath as written (`segments` empty). */
  choice: ContourChoice;
  segments: Segment[];
  /** Straight moves a controller needs to follow the contour within the element's tolerance. */
  straightMovesNeeded: number;
  outcome: ContourOutcome;
}

/**
 * A fitted element: what every writer takes. Contours keep the order of the
 * source; each writer decides how to emit `segments` (SVG arcs, G2/G3, DXF ARC).
 */
export interface FittedElement {
  element: DrawingElement;
  contours: FittedContour[];
}
