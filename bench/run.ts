/**
 * `npm run bench`: every benchmark, one after the other, in this process.
 * Speed and memory goals live here, never in timed tests. Figures are medians;
 * compare ratios run in the same process, not single timings (shared machines).
 */
import { cpus } from 'node:os';
import { benchFit } from './fit.js';
import { benchPipeline } from './pipeline.js';

const optional = async (path: string, name: string): Promise<string | null> => {
  try {
    const mod = (await import(path)) as Record<string, () => Promise<string> | string>;
    return typeof mod[name] === 'function' ? await mod[name]() : null;
  } catch (e) {
    return `${path}: not run (${(e as Error).message})`;
  }
};

console.log(`arcspline benchmarks on ${cpus().length} × ${cpus()[0]?.model ?? 'unknown CPU'}, Node ${process.version}\n`);
console.log(benchFit());
console.log('');
console.log(benchPipeline());
for (const [path, name] of [['./measure.js', 'benchMeasure'], ['./batch.js', 'benchBatch']] as const) {
  const out = await optional(path, name);
  if (out) console.log(`\n${out}`);
}
