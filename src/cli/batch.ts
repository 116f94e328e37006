/**
 * A batch: many inputs (files, directories, patterns) refitted across worker
 * threads, each result written atomically on the main thread, with a progress
 * bar, a JSON line per file and a summary table.
 *
 * One bad file gives one line naming it and the reason; the others go on, and
 * the exit code is the worst of all files (0 < 1 tolerance < 2 input < 3
 * internal). On interrupt (the `signal`): no new file is started, workers are
 * stopped, a file whose temporary copies are written but not yet renamed is
 * abandoned (temporaries removed), and the result is EXIT_INTERRUPTED.
 *
 * Files are dispatched largest first, so one large drawing does not start
 * last and leave the other cores idle (longest-processing-time-first
 * scheduling, common practice).
 */
import { availableParallelism } from 'node:os';
import type { Writable } from 'node:stream';
import { resolveOptions, type Options } from '../options.js';
import { addReport, batchTable, newTotals } from './batchSummary.js';
import { EXIT_INTERRUPTED, EXIT_OK, EXIT_USAGE, UsageError } from './exitCodes.js';
import { failure, fileExitCode, fileLines, needsBackup, writeFileResult, type FileOutcome, type FileTargets } from './fileJob.js';
import { expandInputs } from './inputs.js';
import { planJobs, type Job } from './plan.js';
import { DEFAULT_WORKER_MEMORY_MB, fileRunner, HEAP_BYTES_PER_INPUT_BYTE } from './runner.js';
import { Progress, progressWanted } from './progress.js';
import { failedLine, ReportLineSink } from './reportLines.js';
import { choosePaint, formatBytes } from './summary.js';
import type { CliFlags } from './args.js';

/** The command-line flags a batch uses (`output` is the output directory; undefined with `inPlace`). */
export type BatchFlags = Pick<CliFlags, 'output' | 'inPlace' | 'backup' | 'quiet' | 'debug' | 'reportLines' | 'jobs' | 'workerMemoryMb' | 'table'>;

/** Streams and environment of a batch. */
export interface BatchIo {
  stdout: Writable;
  stderr: Writable;
  stderrIsTTY: boolean;
  env: Record<string, string | undefined>;
  /** Aborting it interrupts the batch (SIGINT). */
  signal?: AbortSignal;
  /** Force in-process work even where compiled workers exist (tests, profiling). */
  inProcess?: boolean;
}

/**
 * Refit every file the inputs name.
 * @returns the exit code: the worst over all files, or EXIT_INTERRUPTED
 * @throws UsageError for a batch refused before any file is read (no output directory, overwrite risks)
 */
export async function runBatch(inputs: readonly string[], flags: BatchFlags, options: Partial<Options>, io: BatchIo): Promise<number> {
  const paint = choosePaint(io.stderrIsTTY, io.env);
  const err = (line: string): void => void io.stderr.write(`${line}\n`);
  if (inputs.includes('-')) throw new UsageError('standard input (-) cannot be part of a batch; name files or directories');
  const tolerance = resolveOptions(options).tolerance;
  const list = await expandInputs(inputs);
  let code = EXIT_OK;
  for (const p of list.problems) {
    err(`arcspline: ${paint.red(p)}`);
    code = EXIT_USAGE;
  }
  if (list.files.length === 0) {
    const ignored = list.ignored > 0 ? ` (${list.ignored} other files ignored)` : '';
    err(`arcspline: ${paint.red(`no SVG files to refit in ${inputs.join(' ')}${ignored}`)}`);
    return EXIT_USAGE;
  }
  const format = resolveOptions(options).format;
  const jobs = await planJobs(list.files, { ...flags, outExtension: format === 'svg' ? undefined : `.${format}` });
  // Largest first; equal sizes keep the listing order.
  const order = jobs.map((j, i) => ({ j, i })).sort((a, b) => b.j.file.size - a.j.file.size || a.i - b.i).map((x) => x.j);
  const memoryMb = flags.workerMemoryMb ?? DEFAULT_WORKER_MEMORY_MB;
  const width = Math.min(flags.jobs ?? availableParallelism(), jobs.length);
  const runner = fileRunner(width, memoryMb, io.inProcess);
  const maxBytes = runner.threaded ? Math.floor((memoryMb * 1024 * 1024) / HEAP_BYTES_PER_INPUT_BYTE) : Infinity;

  const lines = flags.reportLines === undefined ? null : await ReportLineSink.open(flags.reportLines, io.stdout);
  const bar = progressWanted(io.stderrIsTTY, io.env, flags.quiet);
  const totalBytes = jobs.reduce((s, j) => s + j.file.size, 0);
  const progress = new Progress(io.stderr, jobs.length, totalBytes, { enabled: bar, columns: (io.stderr as { columns?: number }).columns });
  const totals = newTotals(jobs.length, list.ignored, tolerance);
  const t0 = performance.now();
  let stopped = false;
  let finished = 0;
  const onAbort = (): void => {
    stopped = true;
    void runner.close();
  };
  io.signal?.addEventListener('abort', onAbort, { once: true });
  if (io.signal?.aborted) onAbort();

  const fail = (job: Job, exitCode: number, message: string, stack?: string): void => {
    progress.log(`arcspline: ${paint.red(message)}`);
    if (flags.debug && stack) progress.log(stack);
    totals.failed++;
    code = Math.max(code, exitCode);
    void lines?.write(failedLine(job.file.path, tolerance, exitCode, message));
  };

  const handle = async (job: Job, id: number): Promise<void> => {
    const path = job.file.path;
    progress.started(path);
    const targets: FileTargets = flags.inPlace
      ? { svg: { to: 'in-place', path, backup: flags.backup } }
      : { svg: { to: 'file', path: job.out, mkdir: true } };
    let outcome: FileOutcome;
    if (job.file.size > maxBytes) {
      outcome = { id, ok: false, exitCode: EXIT_USAGE, message: `${path}: ${formatBytes(job.file.size)} is too large for the per-worker memory limit of ${memoryMb} MB (files up to ${formatBytes(maxBytes)}; raise --worker-memory)` };
    } else {
      outcome = await runner.run({
        kind: 'file', id, path, name: path, outName: flags.inPlace ? null : job.out,
        wantOriginal: await needsBackup(targets), threads: 1, wantText: false, options,
      });
    }
    if (stopped) return;
    if (outcome.ok) {
      try {
        if (!(await writeFileResult(outcome, targets, io.stdout, () => stopped))) return;
      } catch (e) {
        outcome = failure({ id, name: path }, e);
      }
    }
    finished++;
    if (!outcome.ok) {
      fail(job, outcome.exitCode, outcome.message, outcome.stack);
    } else {
      const r = outcome.report;
      addReport(totals, path, r, outcome.changed);
      const sizes = { in: outcome.bytesRead, out: outcome.out.length };
      for (const l of fileLines(path, r, { summary: !bar && !flags.quiet, table: flags.table && !flags.quiet, paint, sizes })) progress.log(l);
      code = Math.max(code, fileExitCode(r));
      void lines?.write(r);
    }
    progress.finished(job.file.size);
  };

  let next = 0;
  const lane = async (): Promise<void> => {
    while (!stopped && next < order.length) {
      const id = next++;
      await handle(order[id], id);
    }
  };
  try {
    await Promise.all(Array.from({ length: runner.size }, lane));
  } finally {
    io.signal?.removeEventListener('abort', onAbort);
    await runner.close();
    await lines?.close();
    progress.end();
  }
  if (lines?.failure) {
    err(`arcspline: ${paint.red(lines.failure)}`);
    code = Math.max(code, EXIT_USAGE);
  }
  if (!flags.quiet || stopped) for (const l of batchTable(totals, (performance.now() - t0) / 1000, runner.size, paint)) err(l);
  if (stopped) {
    err(`arcspline: interrupted: ${finished} of ${jobs.length} files done; no partial file was left`);
    return EXIT_INTERRUPTED;
  }
  return code;
}
