/**
 * One file of a batch: read it, decode it and refit it, returning the new text
 * and the report, or a one-line reason for failing. The same function runs in
 * a worker thread (this module is the worker's entry when started by
 * ./pool.ts) and in-process (jobs = 1 from TypeScript sources, e.g. tests).
 *
 * A task never writes a file: every write happens on the main thread
 * (./batch.ts), so terminating a worker can never leave a partial file.
 */
import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { OptionError, resolveOptions, type Options } from '../options.js';
import { refitSvg } from '../refit.js';
import type { FileReport } from '../report/types.js';
import { SvgInputError } from '../svg/errors.js';
import { EXIT_INTERNAL, EXIT_USAGE, UsageError } from './exitCodes.js';
import { decodeSvgBytes, readInputBytes } from './io.js';
import { Readable } from 'node:stream';

/** What a worker is asked to do with one file. */
export interface FileTask {
  /** Caller's number for the task (results come back tagged with it). */
  id: number;
  /** The path to read. */
  path: string;
  /** Also return the original bytes (for an in-place backup). */
  wantOriginal: boolean;
}

/** A refitted file. */
export interface FileDone {
  id: number;
  ok: true;
  report: FileReport;
  /** The new document text (the input text itself when nothing changed). */
  text: string;
  /** Whether `text` differs from the input. */
  changed: boolean;
  /** The bytes read, when the task asked for them. */
  original: Uint8Array | null;
}

/** A file that could not be refitted. */
export interface FileFailed {
  id: number;
  ok: false;
  /** EXIT_USAGE (input error) or EXIT_INTERNAL (a bug). */
  exitCode: number;
  /** One line naming the file and the reason. */
  message: string;
  /** Stack of an internal error (printed with --debug). */
  stack?: string;
}

export type FileOutcome = FileDone | FileFailed;

/** What the pool passes in `workerData`. */
export interface WorkerInit {
  arcsplineWorker: true;
  options: Partial<Options>;
}

const oneLine = (s: string): string => s.replace(/\s*[\r\n]+\s*/g, ' ').trim();
const NO_STDIN = Readable.from([]);

/** Read and refit one file; never throws (every failure becomes a FileFailed). */
export async function processFile(task: FileTask, options: Partial<Options>): Promise<FileOutcome> {
  try {
    const bytes = await readInputBytes(task.path, NO_STDIN, task.path, resolveOptions(options).maxInputBytes);
    const text = decodeSvgBytes(bytes, task.path);
    const result = refitSvg(text, options, task.path);
    return {
      id: task.id, ok: true, report: result.report,
      text: result.text, changed: result.text !== text,
      // A copy, so the buffer sent back is exactly the file (a read buffer may be a slice of a larger one).
      original: task.wantOriginal ? new Uint8Array(bytes) : null,
    };
  } catch (e) {
    // The reader's messages name the problem and its line:column but not the file.
    if (e instanceof SvgInputError) return { id: task.id, ok: false, exitCode: EXIT_USAGE, message: oneLine(`${task.path}: ${e.message}`) };
    if (e instanceof UsageError || e instanceof OptionError) return { id: task.id, ok: false, exitCode: EXIT_USAGE, message: oneLine(e.message) };
    const err = e instanceof Error ? e : new Error(String(e));
    return { id: task.id, ok: false, exitCode: EXIT_INTERNAL, message: oneLine(`${task.path}: internal error: ${err.message}`), stack: err.stack };
  }
}

// Worker entry: only when started by the pool (a test runner's own worker threads carry no such marker).
const init = workerData as WorkerInit | null;
if (!isMainThread && parentPort !== null && init?.arcsplineWorker === true) {
  const port = parentPort;
  port.on('message', (task: FileTask) => {
    void processFile(task, init.options).then((r) => port.postMessage(r));
  });
}
