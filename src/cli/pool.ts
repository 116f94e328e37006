/**
 * Running file tasks (./worker.ts): a pool of worker threads reused across
 * files, one task per worker at a time, each with a bounded heap; or, where no
 * compiled worker exists (TypeScript sources under a test runner), in-process.
 *
 * A worker that dies (out of memory, a crash) fails only its own file; the
 * next task gets a fresh worker.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { Options } from '../options.js';
import { EXIT_INTERNAL, EXIT_USAGE } from './exitCodes.js';
import { processFile, type FileFailed, type FileOutcome, type FileTask, type WorkerInit } from './worker.js';

/** Runs file tasks; at most `size` at once. */
export interface TaskRunner {
  /** How many tasks run at once. */
  readonly size: number;
  /** Whether tasks run in worker threads. */
  readonly threaded: boolean;
  run(task: FileTask): Promise<FileOutcome>;
  /** Stop every worker now; running tasks resolve as failed. */
  close(): Promise<void>;
}

/** Default heap limit of one worker (V8 old generation), MB. */
export const DEFAULT_WORKER_MEMORY_MB = 1024;

/**
 * Heap a file needs per byte of input, at most (measured: a 19 MB traced
 * drawing of 400 dense contours refits in a 100 MB heap, about 5 bytes per
 * byte; 6 leaves a margin). Files above limit / 6 are refused before reading.
 */
export const HEAP_BYTES_PER_INPUT_BYTE = 6;

/** The compiled worker beside this module, or null when running from TypeScript sources. */
export function compiledWorkerUrl(): URL | null {
  if (!import.meta.url.endsWith('.js')) return null;
  const url = new URL('./worker.js', import.meta.url);
  return existsSync(fileURLToPath(url)) ? url : null;
}

interface Slot {
  worker: Worker;
  task: FileTask | null;
  done: ((r: FileOutcome) => void) | null;
}

/** Worker threads running ./worker.js, created on demand and reused. */
export class WorkerPool implements TaskRunner {
  readonly threaded = true;
  private readonly slots: Slot[] = [];
  private readonly waiting: (() => void)[] = [];
  private closed = false;

  /**
   * @param url the compiled worker module
   * @param size number of workers (≥ 1)
   * @param options the library options every file is refitted with
   * @param memoryMb heap limit per worker, MB
   */
  constructor(
    private readonly url: URL, readonly size: number,
    private readonly options: Partial<Options>, private readonly memoryMb: number,
  ) {
    // Start every worker now, so loading the library overlaps with the first files' reading.
    for (let i = 0; i < size; i++) this.spawn();
  }

  async run(task: FileTask): Promise<FileOutcome> {
    let slot = this.slots.find((s) => s.task === null);
    while (!slot && this.slots.length >= this.size) {
      await new Promise<void>((r) => this.waiting.push(r));
      if (this.closed) return this.failed(task, EXIT_INTERNAL, 'interrupted');
      slot = this.slots.find((s) => s.task === null);
    }
    if (this.closed) return this.failed(task, EXIT_INTERNAL, 'interrupted');
    slot ??= this.spawn();
    const s = slot;
    s.task = task;
    return new Promise<FileOutcome>((resolve) => {
      s.done = resolve;
      s.worker.postMessage(task);
    });
  }

  private spawn(): Slot {
    const init: WorkerInit = { arcsplineWorker: true, options: this.options };
    const worker = new Worker(this.url, { workerData: init, resourceLimits: { maxOldGenerationSizeMb: this.memoryMb } });
    const slot: Slot = { worker, task: null, done: null };
    this.slots.push(slot);
    worker.on('message', (r: FileOutcome) => this.finish(slot, r));
    worker.on('error', (e: Error & { code?: string }) => {
      const t = slot.task;
      if (t === null) return;
      if (e.code === 'ERR_WORKER_OUT_OF_MEMORY') {
        this.finish(slot, this.failed(t, EXIT_USAGE, `needs more memory than the per-worker limit of ${this.memoryMb} MB (raise --worker-memory)`));
      } else {
        this.finish(slot, { ...this.failed(t, EXIT_INTERNAL, `internal error in worker: ${e.message}`), stack: e.stack });
      }
    });
    worker.on('exit', () => {
      // A worker that is gone is replaced on the next task.
      const i = this.slots.indexOf(slot);
      if (i >= 0) this.slots.splice(i, 1);
      if (slot.task !== null) this.finish(slot, this.failed(slot.task, EXIT_INTERNAL, this.closed ? 'interrupted' : 'worker stopped unexpectedly'));
      this.wake();
    });
    return slot;
  }

  private failed(task: FileTask, exitCode: number, reason: string): FileFailed {
    return { id: task.id, ok: false, exitCode, message: `${task.path}: ${reason}` };
  }

  private finish(slot: Slot, r: FileOutcome): void {
    const done = slot.done;
    slot.task = null;
    slot.done = null;
    done?.(r);
    this.wake();
  }

  private wake(): void {
    this.waiting.shift()?.();
  }

  async close(): Promise<void> {
    this.closed = true;
    while (this.waiting.length > 0) this.wake();
    await Promise.all(this.slots.slice().map((s) => s.worker.terminate()));
  }
}

/** Runs tasks one at a time on the calling thread (no memory limit; the event loop waits for each file). */
export class InProcessRunner implements TaskRunner {
  readonly size = 1;
  readonly threaded = false;
  constructor(private readonly options: Partial<Options>) {}
  run(task: FileTask): Promise<FileOutcome> {
    return processFile(task, this.options);
  }
  async close(): Promise<void> {}
}
