/**
 * The main job on several cores: the document is read once, its rewritable
 * elements are shared out (largest first, each to the least loaded thread) to
 * worker threads and this thread, and the outcomes are put together in document
 * order, exactly as `refitSvg` would (same text, same report). Elements are
 * independent: each is fitted and measured on its own.
 *
 * The threads are those of the one worker system (./workerPool.ts). Where no
 * compiled worker exists (TypeScript sources under a test runner) or one
 * thread is asked for, it runs in this thread.
 */
import { availableParallelism } from 'node:os';
import { compiledWorkerUrl, ThreadPool } from './workerPool.js';
import { resolveOptions, type Options } from './options.js';
import { readSvg, type GeometryElement } from './svg/document.js';
import { assemble, emptyTimes, refitOne, refitSvg, type ElementOutcome, type RefitResult, type StageTimes } from './refit.js';

/**
 * A fresh worker thread first spends about as long bringing its code up to
 * speed as one warm thread takes to refit this much traced-drawing text
 * (measured from the shell on 2 cores: 1.1 to 19 MB files took as long or
 * longer with --jobs 2 than with --jobs 1, 39 MB took 15 % less).
 */
export const WARM_UP_CHARS = 16 * 2 ** 20;

/**
 * Smallest document worth sharing over `threads` threads: sharing saves
 * (1 − 1/threads) of the work and costs a worker's warm-up, so it pays above
 * WARM_UP_CHARS · threads / (threads − 1) characters (32 Mi for 2 threads).
 */
export function parallelMinChars(threads: number): number {
  return threads < 2 ? Infinity : (WARM_UP_CHARS * threads) / (threads - 1);
}

/** The task a worker gets (./refitWorker.ts), and what it answers. */
export interface ElementJob {
  kind: 'elements';
  text: string;
  rootToMm: Float64Array;
  elements: GeometryElement[];
  opts: Options;
}
export interface ElementJobResult {
  outcomes: ElementOutcome[];
  times: StageTimes;
}

function weight(el: GeometryElement): number {
  return (el.attrs.d ?? el.attrs.points ?? '').length + 64;
}

/** Refit a share of a document's elements (the worker's side of an ElementJob; also callable in-process). */
export function refitElements(job: ElementJob): ElementJobResult {
  const times = emptyTimes();
  const doc = { text: job.text, rootToMm: job.rootToMm };
  const outcomes = job.elements.map((el) => refitOne(doc, el, job.opts, times));
  return { outcomes, times };
}

/**
 * Refit an SVG document using up to `jobs` threads. Same result as `refitSvg`;
 * stage times are summed over the threads.
 * @param minChars documents shorter than this run on this thread alone (default: where threads pay, parallelMinChars)
 */
export async function refitSvgParallel(
  text: string, partial: Partial<Options> = {}, file: string | null = null, jobs = availableParallelism(),
  minChars = parallelMinChars(jobs),
): Promise<RefitResult> {
  const url = compiledWorkerUrl();
  // Small documents, one thread, or no compiled worker: exactly the one-thread call.
  // The path plan looks at the whole document at once: it runs on this thread.
  if (!url || jobs < 2 || text.length < minChars || resolveOptions(partial).plan) return refitSvg(text, partial, file);
  const t0 = performance.now();
  const opts = resolveOptions(partial);
  const times = emptyTimes();
  const t = performance.now();
  const doc = readSvg(text, { assumedMmPerUnit: opts.assumedMmPerUnit, maxInputChars: opts.maxInputBytes });
  times.parse += performance.now() - t;
  const els = doc.elements.filter((el) => el.rewritable);
  const threads = Math.max(1, Math.min(jobs, els.length));
  if (threads < 2) {
    const outcomes = els.map((el) => refitOne(doc, el, opts, times));
    return assemble(text, doc, outcomes, opts, file, times, t0);
  }
  // Largest first, each to the least loaded share (bin 0 stays on this thread).
  const bins: GeometryElement[][] = Array.from({ length: threads }, () => []);
  const load = new Float64Array(threads);
  for (const el of els.slice().sort((a, b) => weight(b) - weight(a))) {
    let k = 0;
    for (let i = 1; i < threads; i++) if (load[i] < load[k]) k = i;
    bins[k].push(el);
    load[k] += weight(el);
  }
  // No heap limit here: each thread holds the whole document text, and its size is the caller's choice.
  const pool = new ThreadPool(url, threads - 1);
  let results: ElementJobResult[];
  let mine: ElementOutcome[];
  try {
    const pending = bins.slice(1).map((b) => {
      const job: ElementJob = { kind: 'elements', text, rootToMm: doc.rootToMm, elements: b, opts };
      return pool.run<ElementJobResult>(job);
    });
    // A failed share must not leave the others' rejections unhandled while this thread works.
    for (const p of pending) p.catch(() => undefined);
    mine = bins[0].map((el) => refitOne(doc, el, opts, times));
    results = await Promise.all(pending);
  } finally {
    await pool.close();
  }
  const byIndex = new Map<number, ElementOutcome>();
  for (const o of mine) byIndex.set(o.index, o);
  for (const r of results) {
    for (const o of r.outcomes) byIndex.set(o.index, o);
    for (const k of Object.keys(times) as (keyof StageTimes)[]) times[k] += r.times[k];
  }
  const outcomes = els.map((el) => byIndex.get(el.index)!);
  return assemble(text, doc, outcomes, opts, file, times, t0);
}
