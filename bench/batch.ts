/**
 * Batch benchmark: 200 generated files (170 small icons, 30 large traced
 * drawings; our own scenario, seeded) in a temporary directory, refitted at
 * 0.05 mm by the compiled batch (dist/) with 1 job and with one job per core,
 * against the single-file path: main() once per file in the same (warm)
 * process, and the command once per file from the shell (a fresh process each,
 * on the 20 files of set0, 17 icons and 3 drawings like the whole).
 * Each figure is the median of 3 runs after a warm-up; the checksum (bytes
 * written) must be equal across the in-process ways, so none skipped work.
 *
 * It also times one fresh worker thread's first and second pass over the
 * files: the difference is what each thread pays to bring its code up to speed
 * (the JIT compiling on a second core, and running slow code meanwhile), which
 * every job of a batch pays once.
 *
 * Run alone: `npx tsx bench/batch.ts` (builds dist/ first when it is missing);
 * `BATCH_CONTOURS=64 npx tsx bench/batch.ts` makes each drawing 4× larger
 * (64 MB in all), to see how the speed-up grows as the work outweighs the
 * per-thread warm-up.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync, mkdirSync } from 'node:fs';
import { availableParallelism, cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { contourPoints, rng } from './bigfile.js';
import { DEFAULT_WORKER_MEMORY_MB } from '../src/workerPool.js';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const TOLERANCE = '0.05mm';

/** A 24 mm icon: a few circles and rounded rectangles as cubic Béziers, and a polyline. */
function icon(rand: () => number): string {
  const k = 0.5523; // cubic control distance for a quarter circle (common practice, value from memory)
  const parts: string[] = [];
  const n = 2 + Math.floor(rand() * 4);
  for (let i = 0; i < n; i++) {
    const cx = 4 + rand() * 16, cy = 4 + rand() * 16, r = 1 + rand() * 4, c = k * r;
    const f = (v: number): string => v.toFixed(3);
    if (rand() < 0.5) {
      parts.push(`<path d="M${f(cx + r)} ${f(cy)}C${f(cx + r)} ${f(cy + c)} ${f(cx + c)} ${f(cy + r)} ${f(cx)} ${f(cy + r)}C${f(cx - c)} ${f(cy + r)} ${f(cx - r)} ${f(cy + c)} ${f(cx - r)} ${f(cy)}C${f(cx - r)} ${f(cy - c)} ${f(cx - c)} ${f(cy - r)} ${f(cx)} ${f(cy - r)}C${f(cx + c)} ${f(cy - r)} ${f(cx + r)} ${f(cy - c)} ${f(cx + r)} ${f(cy)}Z"/>`);
    } else {
      const pts: string[] = [];
      for (let j = 0; j < 40; j++) {
        const t = (j / 39) * Math.PI;
        pts.push(`${f(cx - r + (2 * r * j) / 39)},${f(cy + r * 0.6 * Math.sin(t * 2))}`);
      }
      parts.push(`<polyline points="${pts.join(' ')}"/>`);
    }
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" width="24mm" height="24mm" viewBox="0 0 24 24" fill="none" stroke="#000">\n${parts.join('\n')}\n</svg>\n`;
}

/** A traced drawing: closed smooth contours as dense polylines (about 0.5 MB). */
function traced(rand: () => number, contours = 16, vertices = 2000): string {
  const cols = Math.ceil(Math.sqrt(contours));
  const parts = Array.from({ length: contours }, (_, c) => `<path d="M${contourPoints(rand, c, cols, vertices, 3)}Z"/>`);
  const size = 60 * cols;
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${size}mm" height="${size}mm" viewBox="0 0 ${size} ${size}" fill="none" stroke="#000">\n${parts.join('\n')}\n</svg>\n`;
}

/** Write the 200 files (in 10 subdirectories) and return their total size in bytes. */
export function generateBatch(dir: string, icons = 170, drawings = 30, seed = 2024, contours = 16): number {
  const rand = rng(seed);
  let bytes = 0;
  for (let i = 0; i < icons + drawings; i++) {
    const sub = join(dir, `set${i % 10}`);
    mkdirSync(sub, { recursive: true });
    const text = i < icons ? icon(rand) : traced(rand, contours);
    writeFileSync(join(sub, i < icons ? `icon${i}.svg` : `drawing${i}.svg`), text);
    bytes += Buffer.byteLength(text);
  }
  return bytes;
}

function bytesBelow(dir: string): number {
  let n = 0;
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    n += e.isDirectory() ? bytesBelow(p) : statSync(p).size;
  }
  return n;
}

function filesBelow(dir: string): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) out.push(...filesBelow(p));
    else out.push(p);
  }
  return out.sort();
}

/**
 * How many cores this process can really use now: the same busy loop in 1 and
 * in `n` worker threads; on an idle machine the ratio is about `n` (a shared
 * machine under other load shows less, and so will the batch).
 */
async function usableCores(n: number): Promise<number> {
  const code = "const { parentPort } = require('node:worker_threads'); let x = 0; for (let i = 0; i < 2e8; i++) x += i % 7; parentPort.postMessage(x);";
  const once = async (k: number): Promise<number> => {
    const t0 = performance.now();
    await Promise.all(Array.from({ length: k }, () => new Promise<void>((resolve) => {
      const w = new Worker(code, { eval: true });
      w.once('message', () => void w.terminate().then(() => resolve()));
    })));
    return performance.now() - t0;
  };
  const t1 = median([await once(1), await once(1), await once(1)]);
  const tn = median([await once(n), await once(n), await once(n)]);
  return (n * t1) / tn;
}

/** CPU seconds used so far by each thread of this process, by thread id (Linux /proc; empty elsewhere). */
function threadCpu(): Map<string, number> {
  const out = new Map<string, number>();
  try {
    for (const tid of readdirSync('/proc/self/task')) {
      const stat = readFileSync(`/proc/self/task/${tid}/stat`, 'utf8');
      const f = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      out.set(tid, (Number(f[11]) + Number(f[12])) / 100); // utime + stime, in clock ticks of 1/100 s (USER_HZ)
    }
  } catch {
    // Not Linux: no per-thread figures.
  }
  return out;
}

/** One pass's time and CPU: the busiest thread (the worker's own) and all other threads (V8's compiler and GC helpers, this thread). */
interface Pass { s: number; worker: number; others: number }

/** One fresh worker thread (started as the batch pool starts one) and its first and second pass over `files` (the first includes bringing its code up to speed). */
async function warmUp(files: readonly string[]): Promise<[Pass, Pass]> {
  const url = new URL('../dist/src/refitWorker.js', import.meta.url);
  const options = { tolerance: Number.parseFloat(TOLERANCE) };
  const w = new Worker(url, { workerData: { arcsplineWorker: true }, resourceLimits: { maxOldGenerationSizeMb: DEFAULT_WORKER_MEMORY_MB } });
  const pass = async (): Promise<Pass> => {
    const c0 = threadCpu();
    const t0 = performance.now();
    for (let id = 0; id < files.length; id++) {
      await new Promise<void>((resolve) => {
        w.once('message', () => resolve());
        w.postMessage({ kind: 'file', id, path: files[id], name: files[id], outName: null, wantOriginal: false, threads: 1, wantText: false, options });
      });
    }
    const s = (performance.now() - t0) / 1000;
    const used = [...threadCpu()].map(([tid, c]) => c - (c0.get(tid) ?? 0)).sort((a, b) => b - a);
    return { s, worker: used[0] ?? NaN, others: used.slice(1).reduce((x, y) => x + y, 0) };
  };
  try {
    return [await pass(), await pass()];
  } finally {
    await w.terminate();
  }
}

/** The command once per file from the shell, s (a fresh Node process each). */
function perProcess(files: readonly string[], input: string, out: string): number {
  const bin = join(ROOT, 'bin', 'arcspline.js');
  const t0 = performance.now();
  for (const f of files) {
    const o = join(out, f.slice(input.length + 1));
    mkdirSync(join(o, '..'), { recursive: true });
    execFileSync(process.execPath, [bin, f, '-o', o, '--tolerance', TOLERANCE, '-q'], { stdio: 'ignore', env: { ...process.env, CI: 'true' } });
  }
  return (performance.now() - t0) / 1000;
}

const median = (xs: number[]): number => xs.slice().sort((a, b) => a - b)[xs.length >> 1];
const nullStream = (): Writable => new Writable({ write: (_c, _e, cb) => cb() });

type MainFn = (argv: string[], io: object) => Promise<number>;

/** Run the benchmark and return the printable block. */
export async function benchBatch(): Promise<string> {
  const built = join(ROOT, 'dist', 'src', 'cli', 'main.js');
  if (!existsSync(join(ROOT, 'dist', 'src', 'cli', 'worker.js'))) execFileSync('npx', ['tsc', '-p', 'tsconfig.json'], { cwd: ROOT, stdio: 'ignore' });
  const { main } = (await import(built)) as { main: MainFn };
  const work = mkdtempSync(join(tmpdir(), 'arcspline-bench-'));
  try {
    const input = join(work, 'in');
    const contours = Number(process.env.BATCH_CONTOURS ?? 16);
    const bytesIn = generateBatch(input, 170, 30, 2024, contours);
    const files = filesBelow(input);
    const io = (): object => ({ stdin: process.stdin, stdout: nullStream(), stderr: nullStream(), isTTY: false, stderrIsTTY: false, env: { CI: 'true' } });
    let run = 0;
    const timeIt = async (f: (out: string) => Promise<void>): Promise<{ s: number; bytes: number }> => {
      const out = join(work, `out${run++}`);
      const t0 = performance.now();
      await f(out);
      const s = (performance.now() - t0) / 1000;
      const bytes = bytesBelow(out);
      rmSync(out, { recursive: true, force: true });
      return { s, bytes };
    };
    const single = async (out: string): Promise<void> => {
      for (const f of files) {
        const o = join(out, f.slice(input.length + 1));
        mkdirSync(join(o, '..'), { recursive: true });
        const code = await main([f, '-o', o, '--tolerance', TOLERANCE, '-q'], io());
        if (code > 1) throw new Error(`single-file run failed on ${f} (exit ${code})`);
      }
    };
    const batch = (jobs: number) => async (out: string): Promise<void> => {
      const code = await main([input, '-o', out, '--tolerance', TOLERANCE, '--jobs', String(jobs), '-q'], io());
      if (code > 1) throw new Error(`batch failed (exit ${code})`);
    };
    const cores = availableParallelism();
    await timeIt(batch(cores)); // warm-up: file cache, JIT of the main thread
    await timeIt(single);
    const measure = async (f: (out: string) => Promise<void>): Promise<{ s: number; bytes: number }> => {
      const r: { s: number; bytes: number }[] = [];
      for (let i = 0; i < 3; i++) r.push(await timeIt(f));
      if (new Set(r.map((x) => x.bytes)).size !== 1) throw new Error('output size differs between runs');
      return { s: median(r.map((x) => x.s)), bytes: r[0].bytes };
    };
    const s = await measure(single);
    const j1 = await measure(batch(1));
    const jn = await measure(batch(cores));
    if (s.bytes !== j1.bytes || s.bytes !== jn.bytes) throw new Error(`checksum differs: ${s.bytes} / ${j1.bytes} / ${jn.bytes} bytes`);
    const usable = await usableCores(cores);
    const [first, second] = await warmUp(files);
    const set0 = files.filter((f) => f.slice(input.length + 1).startsWith('set0'));
    const shell = perProcess(set0, input, join(work, 'shell'));
    const n = files.length;
    const rate = (t: number): string => `${(n / t).toFixed(1)} files/s`;
    const perCore = (t: number, jobs: number): number => n / t / jobs;
    const cpu = cpus()[0]?.model.trim() ?? 'unknown CPU';
    return [
      `batch: ${n} files (170 icons, 30 traced drawings of ${contours} contours; ${(bytesIn / 1e6).toFixed(1)} MB), tolerance ${TOLERANCE}, median of 3`,
      `  machine: ${cores} cores (${cpu}), Node ${process.version}; load average ${loadavg()[0].toFixed(1)}; ` +
        `a busy loop in ${cores} threads ran ${usable.toFixed(2)}x as fast as in 1 (the parallelism free at the time)`,
      `  single-file path (main() per file, same process)  ${s.s.toFixed(2)} s  ${rate(s.s)}`,
      `  batch --jobs 1 (one worker thread)                ${j1.s.toFixed(2)} s  ${rate(j1.s)}`,
      `  batch --jobs ${cores} (all cores)                       ${jn.s.toFixed(2)} s  ${rate(jn.s)}`,
      `  speed-up --jobs ${cores} over --jobs 1: ${(j1.s / jn.s).toFixed(2)}x; over the single-file path: ${(s.s / jn.s).toFixed(2)}x`,
      `  throughput per core: --jobs ${cores} ${perCore(jn.s, cores).toFixed(1)}, --jobs 1 ${perCore(j1.s, 1).toFixed(1)}, single-file ${perCore(s.s, 1).toFixed(1)} files/s ` +
        `(ratio ${(perCore(jn.s, cores) / perCore(s.s, 1)).toFixed(2)})`,
      `  single-file path from the shell (one process per file, ${set0.length} of the files): ${(set0.length / shell).toFixed(1)} files/s; ` +
        `throughput per core of --jobs ${cores} against it: ${(perCore(jn.s, cores) / (set0.length / shell)).toFixed(1)}x`,
      `  a fresh worker thread: first pass ${first.s.toFixed(2)} s, second pass ${second.s.toFixed(2)} s; ` +
        `each job pays the difference, ${(first.s - second.s).toFixed(2)} s, once (bringing its code up to speed)`,
      `    CPU s, first / second pass: the worker thread ${first.worker.toFixed(2)} / ${second.worker.toFixed(2)}, ` +
        `the other threads (V8's compiler and GC helpers, the main thread) ${first.others.toFixed(2)} / ${second.others.toFixed(2)}`,
      `  checksum: ${s.bytes} bytes written by each`,
    ].join('\n');
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  benchBatch().then((text) => console.log(text), (e: unknown) => {
    console.error(e);
    process.exitCode = 1;
  });
}
