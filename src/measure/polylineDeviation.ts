/**
 * The independent check of a fit, public so scripts (and our own tests and
 * benchmarks) can use it: fitted segments are written as SVG path text, read
 * back by the path-data reader, and compared with the input polyline by the
 * report's sampler and Hausdorff bound, which share no code with the fitter.
 */
import { emitSegments } from '../write/emit.js';
import { PathWriter } from '../write/pathWriter.js';
import { parsePathData } from '../svg/pathData.js';
import { OP_L, OP_M, OP_Z, type PathData } from '../svg/pathTypes.js';
import { identityMatrix } from '../svg/matrix.js';
import { measureDeviation } from './measure.js';
import type { Segment } from '../fit/segment.js';
import type { Deviation } from '../report/types.js';

/** A polyline (flat x,y pairs) as path data: M, L…, and Z when closed. */
export function polylinePath(xy: Float64Array, closed: boolean): PathData {
  const n = xy.length >> 1;
  const ops = new Uint8Array(n + (closed ? 1 : 0));
  ops[0] = OP_M;
  for (let i = 1; i < n; i++) ops[i] = OP_L;
  if (closed) ops[n] = OP_Z;
  return { ops, args: Float64Array.from(xy) };
}

/** The written form of fitted segments (coordinates as given, `digits` decimals). */
export function segmentsToPathData(segments: Segment[], closed: boolean, digits = 9): string {
  const w = new PathWriter({ digits });
  emitSegments(w, [{ segments, closed }], identityMatrix(), { digits });
  return w.toString();
}

/**
 * Two-sided deviation (an upper bound, see ./measure.ts) between a polyline and
 * the segments fitted to it, both in the same units (mm).
 * @throws Error when the written text does not re-read or nothing is drawn
 */
export function polylineDeviation(xy: Float64Array, closed: boolean, segments: Segment[], tolerance: number): Deviation {
  const written = parsePathData(segmentsToPathData(segments, closed));
  if (written.error) throw new Error(`written path data did not re-read: ${written.error.message}`);
  const dev = measureDeviation(polylinePath(xy, closed), identityMatrix(), written, identityMatrix(), tolerance);
  if (!dev) throw new Error('nothing to measure');
  return dev;
}
