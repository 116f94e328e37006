/**
 * Benchmark of the independent measurement (src/measure/measure.ts) on the
 * pipeline benchmark's kind of element: closed smooth contours of 2,500 line
 * vertices (same generator formula as bench/bigfile.ts, our own scenario,
 * seeded), refitted by the project's own fitter and writer and re-read from the
 * written text, exactly as src/refit.ts does before it measures.
 *
 * Reports medians over several runs for the current implementation and for the
 * frozen previous one (bench/baseline/), run in the same process and
 * interleaved so machine load hits both alike; the ratio of medians is the
 * speed-up (process CPU time too, which a loaded machine disturbs less). A checksum of the reported maxima guards against dropped work and
 * shows how far the two disagree (both are upper bounds; see measure.ts).
 *
 * Run alone: `npx tsx bench/measure.ts [contours] [runs]`.
 */
import { parsePathData } from '../src/svg/pathData.js';
import type { PathData } from '../src/svg/pathTypes.js';
import type { Matrix } from '../src/svg/matrixTypes.js';
import { identityMatrix, invert } from '../src/svg/matrix.js';
import { flattenPath } from '../src/geom/flatten.js';
import { fitPolyline } from '../src/fit/fitPolyline.js';
import { emitSegments } from '../src/write/emit.js';
import { PathWriter } from '../src/write/pathWriter.js';
import { measureDeviation } from '../src/measure/measure.js';
import { measureDeviation as baselineMeasure } from './baseline/measure.js';
import { contourPaths } from './bigfile.js';

interface Pair { original: PathData; written: PathData; vertices: number; commands: number }


/** Original and written path data per contour, written with 4 decimals (what 0.1 mm in mm units gets). */
function makePairs(count: number, tol: number): Pair[] {
  const id: Matrix = identityMatrix();
  const mmToLocal = invert(new Float64Array(6), id)!;
  const pairs: Pair[] = [];
  for (const text of contourPaths(count, 2500)) {
    const original = parsePathData(text);
    const contours = flattenPath(original, id, tol);
    const fitted = contours.map((c) => ({
      segments: fitPolyline(c.xy, { tolerance: tol * 0.9, closed: c.closed, corners: c.corners }).segments,
      closed: c.closed,
    }));
    const sink = new PathWriter({ digits: 4 });
    emitSegments(sink, fitted, mmToLocal, { digits: 4 });
    const written = parsePathData(sink.toString());
    pairs.push({ original, written, vertices: original.ops.length, commands: written.ops.length });
  }
  return pairs;
}

type Measure = typeof measureDeviation;

/** One run over all pairs: wall and process CPU ms, and the sum of maxima (the checksum). */
function run(f: Measure, pairs: Pair[], tol: number): { ms: number; cpu: number; sum: number; worst: number } {
  const id = identityMatrix();
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  let sum = 0, worst = 0;
  for (const p of pairs) {
    const d = f(p.original, id, p.written, id, tol)!;
    sum += d.max;
    worst = Math.max(worst, d.max);
  }
  const ms = performance.now() - t0, c = process.cpuUsage(c0);
  return { ms, cpu: (c.user + c.system) / 1000, sum, worst };
}

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  const n = s.length;
  return n % 2 ? s[(n - 1) >> 1] : (s[n / 2 - 1] + s[n / 2]) / 2;
}

/**
 * Time the current and the previous measurement, interleaved, on `contours`
 * refitted contours at tolerance 0.1 mm (the default option) and 0.05 mm (the
 * pipeline benchmark's); `runs` timed runs each after one warm-up run.
 *
 * @returns a printable block: medians (ms per run and per element), ratios, checksums
 */
export async function benchMeasure(contours = 40, runs = 7): Promise<string> {
  const blocks: string[] = [];
  for (const tol of [0.1, 0.05]) blocks.push(await benchAt(tol, contours, runs));
  return blocks.join('\n');
}

async function benchAt(tol: number, contours: number, runs: number): Promise<string> {
  const pairs = makePairs(contours, tol);
  const commands = pairs.reduce((s, p) => s + p.commands, 0) / pairs.length;
  run(measureDeviation, pairs, tol);
  run(baselineMeasure, pairs, tol);
  const cur: number[] = [], base: number[] = [], curCpu: number[] = [], baseCpu: number[] = [];
  let cs = 0, bs = 0, cw = 0, bw = 0;
  for (let r = 0; r < runs; r++) {
    const b = run(baselineMeasure, pairs, tol);
    const c = run(measureDeviation, pairs, tol);
    base.push(b.ms); cur.push(c.ms); baseCpu.push(b.cpu); curCpu.push(c.cpu);
    bs = b.sum; cs = c.sum; bw = b.worst; cw = c.worst;
    await new Promise((res) => setImmediate(res));
  }
  const mc = median(cur), mb = median(base), cc = median(curCpu), cb = median(baseCpu);
  const per = (ms: number): string => `${(ms / pairs.length).toFixed(2)} ms/element`;
  return [
    `measureDeviation: ${pairs.length} closed contours of 2,500 L vertices → ~${commands.toFixed(0)} written commands, tol ${tol} mm, ${runs} runs (median)`,
    `  previous (bench/baseline): ${mb.toFixed(0)} ms/run, ${per(mb)}`,
    `  current:                   ${mc.toFixed(0)} ms/run, ${per(mc)}`,
    `  speed-up: ${(mb / mc).toFixed(2)}× wall, ${(cb / cc).toFixed(2)}× process CPU (medians ${cb.toFixed(0)} → ${cc.toFixed(0)} ms/run)`,
    `  runs, wall ms: previous ${base.map((x) => x.toFixed(0)).join(' ')}; current ${cur.map((x) => x.toFixed(0)).join(' ')}`,
    `  checksum Σmax: previous ${bs.toFixed(6)} mm, current ${cs.toFixed(6)} mm; worst max: previous ${bw.toFixed(6)}, current ${cw.toFixed(6)} mm`,
  ].join('\n');
}

if (import.meta.url === `file://${process.argv[1]}` || process.argv[1]?.endsWith('bench/measure.ts')) {
  const [c, r] = process.argv.slice(2).map(Number);
  console.log(await benchMeasure(c || undefined, r || undefined));
}
