/**
 * Fitter benchmark (issue: core fitter): segment counts, measured deviation and
 * throughput of arcspline against lines-only Ramer–Douglas–Peucker from the
 * general-purpose simplify-js package (high-quality mode), in the same process.
 * Run: npm run bench (all benchmarks) or npx tsx bench/fit.ts.
 */
import simplify from 'simplify-js';
import { fitPolyline } from '../src/fit/fitPolyline.js';
import { polylineDeviation, polylinePath } from '../src/measure/polylineDeviation.js';
import { measureDeviation } from '../src/measure/measure.js';
import { identityMatrix } from '../src/svg/matrix.js';
import { bigSmooth, ellipse, sine, spiral, type Curve } from './curves.js';
import { consume, fmt, timeMedian } from './stats.js';

type Pt = { x: number; y: number };

function toPoints(xy: Float64Array, closed: boolean): Pt[] {
  const pts: Pt[] = [];
  for (let i = 0; i < xy.length; i += 2) pts.push({ x: xy[i], y: xy[i + 1] });
  if (closed) pts.push({ x: xy[0], y: xy[1] });
  return pts;
}

function rdpDeviation(xy: Float64Array, closed: boolean, kept: Pt[], tol: number): number {
  const flat = new Float64Array(2 * kept.length);
  kept.forEach((p, i) => {
    flat[2 * i] = p.x;
    flat[2 * i + 1] = p.y;
  });
  return measureDeviation(polylinePath(xy, closed), identityMatrix(), polylinePath(flat, false), identityMatrix(), tol)!.max;
}

/** The printable benchmark block. */
export function benchFit(runs = 5): string {
  const lines: string[] = [];
  lines.push('curve      tol mm | arcspline segs  max dev mm  Mpts/s | RDP lines  max dev mm  Mpts/s | segs ratio  speed ratio');
  for (const c of [ellipse(), sine(), spiral()] as Curve[]) {
    const pts = toPoints(c.xy, c.closed);
    const n = c.xy.length / 2;
    for (const tol of [0.01, 0.05]) {
      const fit = timeMedian(() => fitPolyline(c.xy, { tolerance: tol, closed: c.closed }), runs);
      const rdp = timeMedian(() => simplify(pts, tol, true), runs);
      consume(fit.result.segments.length + rdp.result.length);
      const devFit = polylineDeviation(c.xy, c.closed, fit.result.segments, tol).max;
      const devRdp = rdpDeviation(c.xy, c.closed, rdp.result, tol);
      const segs = fit.result.segments.length, rdpSegs = rdp.result.length - 1;
      const mf = n / fit.ms / 1000, mr = n / rdp.ms / 1000;
      lines.push(
        `${c.name.padEnd(10)} ${fmt(tol, 2).padStart(6)} | ${String(segs).padStart(14)}  ${fmt(devFit, 4).padStart(10)}  ${fmt(mf, 2).padStart(6)} | ` +
          `${String(rdpSegs).padStart(9)}  ${fmt(devRdp, 4).padStart(10)}  ${fmt(mr, 2).padStart(6)} | ${fmt(rdpSegs / segs, 1).padStart(10)}x  ${fmt(mf / mr, 2).padStart(10)}x`,
      );
    }
  }
  const big = bigSmooth();
  const pts = toPoints(big.xy, big.closed);
  const n = big.xy.length / 2;
  lines.push('');
  lines.push(`throughput on ${big.name} (${n.toLocaleString('en')} points, closed), median of ${runs} runs after a warm-up:`);
  for (const tol of [0.01, 0.05]) {
    const fit = timeMedian(() => fitPolyline(big.xy, { tolerance: tol, closed: true }), runs);
    const rdp = timeMedian(() => simplify(pts, tol, true), runs);
    consume(fit.result.segments.length + rdp.result.length);
    const mf = n / fit.ms / 1000, mr = n / rdp.ms / 1000;
    lines.push(
      `  tol ${fmt(tol, 2)} mm: arcspline ${fmt(mf, 2)} M points/s (${fit.result.segments.length} segments), ` +
        `simplify-js RDP ${fmt(mr, 2)} M points/s (${rdp.result.length - 1} lines); ratio ${fmt(mf / mr, 2)}`,
    );
  }
  return lines.join('\n');
}

if (import.meta.url === `file://${process.argv[1]}`) console.log(benchFit());
