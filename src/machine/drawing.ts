/**
 * What the machine writers take: a fitted drawing in millimetres on the page
 * (SVG's frame: origin at the page's upper-left corner, y down), element by
 * element, and the frame of the machine it is written for.
 *
 * Machine frame (RS274/NGC and DXF both): millimetres, X right, Y up, seen from
 * +Z. The page is flipped into it: y_machine = pageHeight − y (origin at the
 * page's lower-left corner, the default) or y_machine = −y (origin at its
 * upper-left corner, the drawing then lies at negative Y). A flip reverses the
 * turning sense: an arc that turns from +x towards +y on the page (SVG
 * sweep-flag 1, clockwise on screen) turns clockwise in the machine frame too,
 * i.e. it is a G2 (derived in test/machine/emit.test.ts and checked there
 * against the independent read-back).
 */
import type { Segment } from '../fit/segment.js';
import type { PathData } from '../svg/pathTypes.js';
import type { Matrix } from '../svg/matrixTypes.js';

/**
 * One contour of an element in page mm: fitted segments end to end, or, for
 * geometry that is not refitted (an element kept as written), the polyline
 * `xy` (flat x,y pairs; a closed one does not repeat its first point), written
 * as straight moves.
 */
export interface MachineContour {
  segments: Segment[];
  closed: boolean;
  xy?: Float64Array;
}

/** One drawn element: its fitted contours, the group it is cut with, and its original geometry for the proof. */
export interface MachineElement {
  /** Position among the document's elements (the SVG report's `index`). */
  index: number;
  /** The copy drawn by `<use>` this is (1, 2, …; the model's `copies` order), absent for the element where it stands. */
  copy?: number;
  /** Short name for comments and messages, e.g. `path#edge`. */
  label: string;
  /** Group key: the element's computed stroke colour as `#rrggbb`, or `none`. Selects layer, power and feed. */
  group: string;
  contours: MachineContour[];
  /** This element's tolerance in mm when tighter than the file's (a copy drawn larger elsewhere); default the file's. */
  toleranceMm?: number;
  /** The original geometry (path data in user units and its matrix to page mm), measured against in the proof. */
  original: { path: PathData; toMm: Matrix };
  /**
   * More originals this element stands for (a planned group: every member element, a double line kept once
   * counting as both): the proof measures the union of all of them against what is read back.
   */
  also?: { path: PathData; toMm: Matrix }[];
}

/** More copies than any element lists (src/svg/reuse.ts lists at most 4096 each). */
const COPY_SLOTS = 1 << 20;

/**
 * The key the read-back and the proof know a machine element by: its document index where it stands, and
 * index + copy / 2^20 for a copy (unique, exact in a double, and its integer part is still the element).
 */
export function machineKey(index: number, copy?: number): number {
  if (copy === undefined) return index;
  if (!(copy >= 1 && copy < COPY_SLOTS && Number.isInteger(copy))) throw new RangeError(`copy must be an integer from 1 to ${COPY_SLOTS - 1}, got ${copy}`);
  return index + copy / COPY_SLOTS;
}

/** A machine key for people: `element 3` or `element 3 copy 2`. */
export function keyName(key: number): string {
  const index = Math.floor(key), copy = Math.round((key - index) * COPY_SLOTS);
  return copy === 0 ? `element ${index}` : `element ${index} copy ${copy}`;
}

/** Where the machine origin sits on the page. */
export type MachineOrigin = 'lower-left' | 'upper-left';

/** A fitted drawing, ready for a machine writer. */
export interface MachineDrawing {
  /** Height of the page in mm (the root viewport), for the lower-left origin. */
  pageHeightMm: number;
  elements: MachineElement[];
  /** Input file name for the header comment, or null. */
  source: string | null;
}

/** The page → machine matrix `[a b c d e f]` (SVG order): x' = x, y' = h − y or −y. */
export function pageToMachine(pageHeightMm: number, origin: MachineOrigin): Matrix {
  if (!(pageHeightMm >= 0) || !Number.isFinite(pageHeightMm)) throw new RangeError(`page height must be a non-negative number of mm, got ${pageHeightMm}`);
  return Float64Array.of(1, 0, 0, -1, 0, origin === 'lower-left' ? pageHeightMm : 0);
}
