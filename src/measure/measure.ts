/**
 * The per-element proof: how far the written geometry is from the original,
 * measured on the path data re-read from the text we wrote, with the report's
 * own sampler (sample.ts) and distance bound (hausdorff.ts).
 *
 * Every distance reported is an upper bound of the exact value between the
 * true curves: polyline bound + both sides' chord bounds (hausdorff.ts header).
 * The overestimate is at most 2·(eA + eB) + resolution, which with the
 * defaults below is 0.5 % of the tolerance.
 */
import type { PathData } from '../svg/pathTypes.js';
import type { Matrix } from '../svg/matrixTypes.js';
import type { Deviation } from '../report/types.js';
import { SampleBuffer, samplePath, sampleCount, type SampledPath } from './sample.js';
import { buildSegmentIndex, directedDistance } from './hausdorff.js';
import { SegmentGrid } from './segmentGrid.js';

/**
 * Sample buffers and grids lent to every measurement in turn (each call is done
 * with them before it returns), so steady state allocates no sample arrays or
 * index. One grown past KEEP_BYTES by a huge element is dropped after use.
 */
let bufA = new SampleBuffer(), bufB = new SampleBuffer();
let gridA = new SegmentGrid(), gridB = new SegmentGrid();
const KEEP_BYTES = 8 << 20;

/** Chord error and bisection resolution, as fractions of the tolerance. */
const ERROR_FRACTION = 1 / 1000;
/**
 * Longest chord, as a multiple of the tolerance: sets how dense the `mean` is
 * sampled (the max needs no spacing: segments are measured exactly), and keeps
 * segments short, so the index's cells stay small (segmentGrid.ts).
 */
const SPACING_FACTOR = 2;
/** Default cap on sample points (both sides together) per element. */
export const DEFAULT_MAX_SAMPLES = 2_000_000;

/**
 * Measure the deviation between an original element and its rewritten form.
 *
 * Sampling: chords at most 2·tolerance long and within tolerance/1000 of the
 * curve; the distance bound is resolved to tolerance/1000. When that would take
 * more than `maxSamples` points, spacing and chord error are coarsened together
 * (the bounds stay honest, just looser).
 *
 * @param original original path data in its user units, with `originalToMm` to mm
 * @param written written path data (parsed from our output text), with `writtenToMm`
 * @param toleranceMm the fitting tolerance in mm (> 0)
 * @returns null when either side draws nothing (no distance is defined);
 *   `worstUser` is NaN when `writtenToMm` cannot be inverted
 */
export function measureDeviation(
  original: PathData, originalToMm: Matrix, written: PathData, writtenToMm: Matrix,
  toleranceMm: number, maxSamples = DEFAULT_MAX_SAMPLES,
): Deviation | null {
  if (!(toleranceMm > 0) || !Number.isFinite(toleranceMm)) throw new RangeError(`toleranceMm must be a positive number, got ${toleranceMm}`);
  let spacing = toleranceMm * SPACING_FACTOR;
  let chord = toleranceMm * ERROR_FRACTION;
  let sa = samplePath(original, originalToMm, spacing, chord, bufA);
  let sb = samplePath(written, writtenToMm, spacing, chord, bufB);
  const total = sampleCount(sa) + sampleCount(sb);
  if (total > maxSamples) {
    // Points scale like 1/spacing on straight runs and 1/sqrt(chord error) on curves.
    const f = total / maxSamples;
    spacing *= f;
    chord *= f * f;
    sa = samplePath(original, originalToMm, spacing, chord, bufA);
    sb = samplePath(written, writtenToMm, spacing, chord, bufB);
  }
  const d = compareSampled(sa, sb, writtenToMm, chord);
  if (bufA.data.byteLength > KEEP_BYTES) bufA = new SampleBuffer();
  if (bufB.data.byteLength > KEEP_BYTES) bufB = new SampleBuffer();
  return d;
}

/**
 * Deviation between two already sampled shapes (mm); `writtenToMm` only locates
 * the worst spot in the written element's user units.
 */
export function compareSampled(sa: SampledPath, sb: SampledPath, writtenToMm: Matrix, resolution: number): Deviation | null {
  const ia = buildSegmentIndex(sa.polylines, gridA), ib = buildSegmentIndex(sb.polylines, gridB);
  if (ia === null || ib === null) return null;
  const slack = sa.errorBound + sb.errorBound;
  const ab = directedDistance(sa.polylines, sb.polylines, ib, resolution);
  const ba = directedDistance(sb.polylines, sa.polylines, ia, resolution);
  if (gridA.bytes > KEEP_BYTES) gridA = new SegmentGrid();
  if (gridB.bytes > KEEP_BYTES) gridB = new SegmentGrid();
  const w = ab.max >= ba.max ? ab : ba;
  return {
    max: Math.max(ab.max, ba.max) + slack,
    originalToResult: ab.max + slack,
    resultToOriginal: ba.max + slack,
    mean: ab.mean,
    worstMm: [w.worstX, w.worstY],
    worstUser: invertPoint(writtenToMm, w.worstX, w.worstY),
  };
}

/** Map a point by the inverse of an affine matrix; NaNs when it is singular. */
function invertPoint(m: Matrix, x: number, y: number): [number, number] {
  const a = m[0], b = m[1], c = m[2], d = m[3];
  const det = a * d - b * c;
  if (det === 0 || !Number.isFinite(det)) return [NaN, NaN];
  const dx = x - m[4], dy = y - m[5];
  return [(d * dx - c * dy) / det, (a * dy - b * dx) / det];
}
