/**
 * Independent measurement for the fitter's tests: the segments are written as
 * SVG path text, read back by our path-data reader, and compared with the
 * input polyline by the report's sampler and Hausdorff bound (src/report),
 * which share no code with the fitter.
 */
import { emitSegments } from '../../src/write/emit.js';
import { PathWriter } from '../../src/write/pathWriter.js';
import { parsePathData } from '../../src/svg/pathData.js';
import { OP_L, OP_M, OP_Z, type PathData } from '../../src/svg/pathTypes.js';
import { identityMatrix } from '../../src/svg/matrix.js';
import { measureDeviation } from '../../src/report/measure.js';
import type { Segment } from '../../src/fit/segment.js';
import type { Deviation } from '../../src/report/types.js';

/** The polyline as path data (M, L…, Z when closed). */
export function polylinePath(xy: Float64Array, closed: boolean): PathData {
  const n = xy.length >> 1;
  const ops = new Uint8Array(n + (closed ? 1 : 0));
  ops[0] = OP_M;
  for (let i = 1; i < n; i++) ops[i] = OP_L;
  if (closed) ops[n] = OP_Z;
  return { ops, args: Float64Array.from(xy) };
}

/** Written form of the fitted segments, with `digits` decimals. */
export function writeSegments(segments: Segment[], closed: boolean, digits = 9): string {
  const w = new PathWriter({ digits });
  emitSegments(w, [{ segments, closed }], identityMatrix(), { digits });
  return w.toString();
}

/** Two-sided deviation (upper bound) between input polyline and fitted segments. */
export function deviationOf(xy: Float64Array, closed: boolean, segments: Segment[], tol: number): Deviation {
  const d = writeSegments(segments, closed);
  const written = parsePathData(d);
  if (written.error) throw new Error(`written path data did not re-read: ${written.error.message}`);
  const dev = measureDeviation(polylinePath(xy, closed), identityMatrix(), written, identityMatrix(), tol);
  if (!dev) throw new Error('nothing to measure');
  return dev;
}
