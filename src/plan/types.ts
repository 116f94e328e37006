/**
 * The plan's data: contours in machine millimetres with the element and subpath
 * they came from, the settings of its steps, and its statistics.
 *
 * Layout of `xy`: x0, y0, x1, y1, … (stride 2, mm); a closed contour does not
 * repeat its first vertex at the end (as src/geom/contour.ts).
 */

/** Where a contour came from: the element's index in the document and the subpath's index in the element. */
export interface PlanSource {
  element: number;
  subpath: number;
}

/** One contour given to the plan. */
export interface PlanContour {
  /** Vertices in mm, stride 2. */
  xy: Float64Array;
  closed: boolean;
  /** The computed stroke colour (or any key): the plan joins, de-duplicates and reorders only within a group. */
  group: string;
  /** Filled geometry passes through untouched, in its place: its painting order and winding matter. */
  filled: boolean;
  source: PlanSource;
}

/** One contour of the plan's result, in drawing order. */
export interface PlannedContour {
  /** Vertices in mm, stride 2, starting at the entry point and running in the drawing direction. */
  xy: Float64Array;
  closed: boolean;
  group: string;
  filled: boolean;
  /** The input contours this one draws (several after a join, in drawing order; a part of one after a double line was cut out). */
  sources: PlanSource[];
  /**
   * How far, at most, this polyline lies from the input it stands for (mm), before any fitting:
   * half the widest gap a join bridged, or the overlap distance when its group lost double lines
   * (a removed line lies within that distance of the kept one). A fitter keeps within tolerance − slack.
   */
  slack: number;
}

/** The steps of the plan; each can be switched off alone. */
export interface PlanSteps {
  /** Join open contours whose ends meet. */
  join: boolean;
  /** Draw lines and arcs drawn twice (exactly, reversed or in part) only once. */
  overlaps: boolean;
  /** Reorder, reverse open contours and move the start of closed ones to shorten travel. */
  order: boolean;
  /** Draw a contour nested in a closed contour before that contour (holes before the part). */
  holesFirst: boolean;
}

/** Settings of one plan run. */
export interface PlanSettings extends PlanSteps {
  /** Ends closer than this are joined (mm). */
  joinDistance: number;
  /** A line within this distance of a line kept earlier, and parallel to it, counts as drawn twice (mm). */
  overlapDistance: number;
  /** Where the pen or head waits before the job (mm), or null for no approach move. */
  start: readonly [number, number] | null;
}

/** What the plan did. */
export interface PlanStats {
  /** Pen-up (beam-off) travel between consecutive contours, input order (mm); the approach from `start` included when given. */
  travelBefore: number;
  /** The same in plan order (mm). */
  travelAfter: number;
  /** Contours drawn, each one pen-down or pierce, before and after. */
  piercesBefore: number;
  piercesAfter: number;
  /** Open contours that became part of another contour by a join. */
  contoursJoined: number;
  /** Length of the lines drawn twice that were removed (mm). */
  doubleLength: number;
  /** Contours that lost a double line somewhere (in part or whole). */
  doubleContours: number;
  /** Time the plan took (ms). */
  ms: number;
}
