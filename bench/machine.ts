/**
 * Machine output benchmark (issue 13): G-code lines with arcs against the same
 * drawing as straight G1 moves, on the bundled samples and the 1M-vertex
 * pipeline drawing (bench/bigfile.ts), with the estimated machine time of both
 * (laser profile: 1200 mm/min work, 6000 mm/min travel, 500 mm/s², δ 0.05 mm,
 * 16 moves of look-ahead) and the write, read-back and proof times (medians).
 *
 * Baselines, both G1 only, same digits and profile: every input vertex (what a
 * converter that flattens the drawing writes), and the fewest straight moves
 * within the tolerance (a vertex subset; the best a line-only program can do).
 * Run: npx tsx bench/machine.ts (also part of npm run bench).
 */
import { readFileSync } from 'node:fs';
import { svgMachineJob, type SvgMachineJob } from '../test/machine/fromSvg.js';
import { straightProgram, writeMachineFile } from '../src/machine/program.js';
import { readBackGcode } from '../src/machine/readback.js';
import { BUILTIN_PROFILES } from '../src/machine/profile.js';
import { bigDrawing } from './bigfile.js';
import { refitSvg } from '../src/refit.js';
import { refitToMachine } from '../src/refitMachine.js';
import { fmt, median } from './stats.js';

const SAMPLES = ['coaster.svg', 'bracket.svg', 'gear.svg', 'icons/heart.svg', 'icons/tag.svg', 'icons/target.svg', 'icons/wave.svg'];
const profile = BUILTIN_PROFILES.laser;

interface Row { name: string; tArcsFast: number; tDenseFast: number; arcs: number; dense: number; thin: number; tArcs: number; tDense: number; tThin: number; writeMs: number; readMs: number; proofMs: number; readDenseMs: number; dev: number }

function row(name: string, job: SvgMachineJob, tol: number, runs: number): Row {
  const w: number[] = [], rd: number[] = [], pr: number[] = [], rdd: number[] = [];
  let out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: tol, profile });
  for (let k = 0; k < runs; k++) {
    out = writeMachineFile(job.drawing, { format: 'gcode', tolerance: tol, profile });
    w.push(out.ms.write);
    rd.push(out.ms.readBack);
    pr.push(out.ms.measure);
  }
  if (!out.proof.ok) throw new Error(`${name}: ${out.proof.problems[0]}`);
  const dense = straightProgram(job.dense, job.drawing.pageHeightMm, profile, out.digits);
  const thin = straightProgram(job.thinned, job.drawing.pageHeightMm, profile, out.digits);
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    readBackGcode(dense.text, tol / 1000, 2 * tol);
    rdd.push(performance.now() - t0);
  }
  // The same at a fast feed (6000 mm/min), where acceleration, corners and look-ahead bind rather than the feed.
  const fast = { ...profile, workFeed: 6000 };
  const tArcsFast = writeMachineFile(job.drawing, { format: 'gcode', tolerance: tol, profile: fast }).time.seconds;
  const tDenseFast = straightProgram(job.dense, job.drawing.pageHeightMm, fast, out.digits).time.seconds;
  return {
    name, tArcsFast, tDenseFast, arcs: out.lines, dense: dense.lines, thin: thin.lines, tArcs: out.time.seconds, tDense: dense.time.seconds, tThin: thin.time.seconds,
    writeMs: median(w), readMs: median(rd), proofMs: median(pr), readDenseMs: median(rdd), dev: out.proof.maxDeviation,
  };
}

function table(rows: Row[]): string {
  const head = 'file | lines arcs | G1 every vertex (×) | G1 fewest (×) | time arcs s | G1 vertex s | G1 fewest s | at 6000 mm/min: arcs s | G1 vertex s | write ms | read-back ms (G1 vertex) | proof ms | max dev mm';
  const lines = rows.map((r) => [
    r.name, r.arcs, `${r.dense} (${fmt(r.dense / r.arcs, 1)}×)`, `${r.thin} (${fmt(r.thin / r.arcs, 1)}×)`,
    fmt(r.tArcs, 1), fmt(r.tDense, 1), fmt(r.tThin, 1), fmt(r.tArcsFast, 1), fmt(r.tDenseFast, 1), fmt(r.writeMs, 1), `${fmt(r.readMs, 1)} (${fmt(r.readDenseMs, 0)})`, fmt(r.proofMs, 0), fmt(r.dev, 4),
  ].join(' | '));
  return [head, ...lines].join('\n');
}

export function benchMachine(runs = 3): string {
  const rows: Row[] = [];
  for (const f of SAMPLES) {
    const text = readFileSync(new URL(`../samples/${f}`, import.meta.url), 'utf8');
    rows.push(row(f, svgMachineJob(text, 0.1, f), 0.1, runs));
  }
  const t0 = performance.now();
  const big = svgMachineJob(bigDrawing(), 0.05, 'bigfile');
  const fitMs = performance.now() - t0;
  rows.push(row('1M-vertex drawing (0.05 mm)', big, 0.05, runs));
  return `machine output (G-code, laser profile; samples at 0.1 mm; medians of ${runs}; the big drawing read and fitted once in ${fmt(fitMs / 1000, 1)} s)\n${table(rows)}\n${pipelineLine(runs)}`;
}

/** The whole job on the big drawing: SVG output against G-code output, same process, interleaved, medians. */
function pipelineLine(runs: number): string {
  const text = bigDrawing();
  const svg: number[] = [], gcode: number[] = [];
  refitToMachine(text, { tolerance: 0.05, format: 'gcode' }); // warm-up
  for (let k = 0; k < runs; k++) {
    let t0 = performance.now();
    refitSvg(text, { tolerance: 0.05 });
    svg.push(performance.now() - t0);
    t0 = performance.now();
    refitToMachine(text, { tolerance: 0.05, format: 'gcode' });
    gcode.push(performance.now() - t0);
  }
  const a = median(svg), b = median(gcode);
  return `whole job on the big drawing: refitSvg ${fmt(a / 1000, 2)} s, refitToMachine (G-code, read back and proven) ${fmt(b / 1000, 2)} s, ${fmt(b / a, 2)}× (medians of ${runs})`;
}

if (import.meta.url === `file://${process.argv[1]}`) console.log(benchMachine());
