/**
 * `npm run bench`: every benchmark, one after the other, in this process.
 * Speed and memory goals live here, never in timed tests. Figures are medians;
 * compare ratios run in the same process, not single timings (shared machines).
 */
import { cpus } from 'node:os';
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { benchFit } from './fit.js';
import { benchRealData } from './realdata.js';

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
console.log(benchRealData());
console.log('');
// The pipeline runs in a fresh process so its peak memory is its own.
const pipeline = fileURLToPath(new URL('./pipeline.ts', import.meta.url));
console.log(execFileSync(process.execPath, ['--import', 'tsx', pipeline], { encoding: 'utf8', maxBuffer: 1 << 24 }).trimEnd());
for (const [path, name] of [['./measure.js', 'benchMeasure'], ['./batch.js', 'benchBatch'], ['./machine.js', 'benchMachine'], ['./styles.js', 'benchStyles'], ['./plan.js', 'benchPlan'], ['./endToEnd.js', 'benchEndToEnd']] as const) {
  const out = await optional(path, name);
  if (out) console.log(`\n${out}`);
}
