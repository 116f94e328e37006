/**
 * Parsed path data, flat.
 *
 * Layout: `ops[k]` is one opcode per segment, `args` holds each opcode's
 * numbers back to back in the order below (all absolute, in the element's
 * user units). Relative commands, H/V, S/T and implicit repeats are resolved
 * by the parser, so a consumer only ever sees these six kinds:
 *
 * | op | args | meaning |
 * |----|------|---------|
 * | OP_M | x y | start a subpath |
 * | OP_L | x y | straight line |
 * | OP_C | x1 y1 x2 y2 x y | cubic Bézier |
 * | OP_Q | x1 y1 x y | quadratic Bézier |
 * | OP_A | rx ry rotationDeg largeArc(0/1) sweep(0/1) x y | elliptical arc, as written (radii not yet corrected) |
 * | OP_Z | (none) | close the subpath |
 */
export const OP_M = 0;
export const OP_L = 1;
export const OP_C = 2;
export const OP_Q = 3;
export const OP_A = 4;
export const OP_Z = 5;

/** Number of arguments each opcode consumes from `args`. */
export const OP_ARGS: readonly number[] = [2, 2, 6, 4, 7, 0];

export interface PathData {
  ops: Uint8Array;
  args: Float64Array;
}

/** A problem found while reading path data; the data before `offset` is kept. */
export interface PathDataError {
  /** Character offset into the attribute value where the error starts. */
  offset: number;
  message: string;
}

export interface ParsedPath extends PathData {
  /** Segments per source command letter as written (e.g. { M: 1, c: 40, Z: 1 }). */
  counts: Record<string, number>;
  error: PathDataError | null;
}
