/**
 * End-to-end benchmark (issue: the main job end to end): a generated drawing of
 * 400 closed smooth contours × 2,500 vertices (about 19 MB) through refitSvg:
 * time split into parse, flatten, fit, write and measure; input MB per second;
 * peak memory (RSS high-water mark of this process) relative to the input size.
 * Run: npm run bench or npx tsx bench/pipeline.ts.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { refitSvg } from '../src/refit.js';
import { bigDrawing } from './bigfile.js';
import { median, fmt } from './stats.js';

/**
 * The same run shared over all cores through the compiled library (worker threads load dist/), when
 * built. Forced (minChars 0): by default a file this size stays on one thread, since each fresh worker
 * first compiles its code (src/refitParallel.ts, parallelMinChars).
 */
async function parallelLine(text: string, mb: number, runs: number, oneThreadMs: number): Promise<string> {
  const built = new URL('../dist/src/refitParallel.js', import.meta.url);
  if (!existsSync(fileURLToPath(built))) return '  all cores: not run (build first: npm ci or npx tsc)';
  const { refitSvgParallel, parallelMinChars } = (await import(built.href)) as typeof import('../src/refitParallel.js');
  const jobs = availableParallelism();
  await refitSvgParallel(text, { tolerance: 0.05 }, null, jobs, 0); // warm-up
  const totals: number[] = [];
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    await refitSvgParallel(text, { tolerance: 0.05 }, null, jobs, 0);
    totals.push(performance.now() - t0);
  }
  const t = median(totals);
  const from = parallelMinChars(jobs) / 2 ** 20;
  return `  shared over ${jobs} threads (refitSvgParallel forced; fresh workers each run; the CLI shares a file only from ${fmt(from)} Mi characters): ` +
    `total ${fmt(t)} ms = ${fmt(mb / (t / 1000), 1)} MB/s, ${fmt(oneThreadMs / t, 2)}× the one-thread run`;
}

export async function benchPipelineAll(runs = 3): Promise<string> {
  const text = bigDrawing();
  const mb = Buffer.byteLength(text) / 1e6;
  const one = benchPipeline(runs, text);
  return `${one.text}\n${await parallelLine(text, mb, runs, one.ms)}`;
}

export function benchPipeline(runs = 3, given?: string): { text: string; ms: number } {
  const text = given ?? bigDrawing();
  const mb = Buffer.byteLength(text) / 1e6;
  const rss0 = process.memoryUsage().rss;
  refitSvg(text, { tolerance: 0.05 }); // warm-up
  const totals: number[] = [];
  const stages: Record<string, number[]> = { parse: [], flatten: [], fit: [], write: [], measure: [] };
  let summary = '';
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    const r = refitSvg(text, { tolerance: 0.05 });
    totals.push(performance.now() - t0);
    for (const s of Object.keys(stages)) stages[s].push(r.times[s as keyof typeof r.times]);
    summary = `${r.report.totals.commandsBefore} commands → ${r.report.totals.segmentsAfter.arcs} arcs + ${r.report.totals.segmentsAfter.lines} lines, max deviation ${fmt(r.report.totals.maxDeviation, 4)} mm, ${fmt(mb, 1)} MB → ${fmt(r.report.bytesOut / 1e6, 2)} MB`;
  }
  const peak = process.resourceUsage().maxRSS * 1024; // kilobytes → bytes
  const t = median(totals);
  const lines = [
    `pipeline: ${fmt(mb, 1)} MB, 400 contours × 2,500 vertices, tolerance 0.05 mm; median of ${runs} runs`,
    `  ${summary}`,
    `  total ${fmt(t)} ms = ${fmt(mb / (t / 1000), 1)} MB/s; ` + Object.entries(stages).map(([s, v]) => `${s} ${fmt(median(v))} ms`).join(', '),
    `  peak RSS ${fmt(peak / 1e6)} MB = ${fmt(peak / (mb * 1e6), 1)}× the input (process baseline before the runs: ${fmt(rss0 / 1e6)} MB)`,
  ];
  return { text: lines.join('\n'), ms: t };
}

if (import.meta.url === `file://${process.argv[1]}`) console.log(await benchPipelineAll());

