/**
 * The one worker-thread system: a pool of threads running ./refitWorker.js,
 * created on demand and reused, one task per thread at a time, each thread
 * with an optional heap limit. Two kinds of task run in it: a share of one
 * document's elements (./refitParallel.ts, the library) and one whole file of
 * a batch (src/cli/fileJob.ts). A thread that dies (out of memory, a crash)
 * fails only its own task; the next task gets a fresh thread.
 *
 * The compiled worker is found in one place, {@link compiledWorkerUrl}: beside
 * this module in dist/. From TypeScript sources (a test runner) there is none,
 * and callers run their tasks on the calling thread instead.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';

/** Default heap limit of one batch worker (V8 old generation), MB. */
export const DEFAULT_WORKER_MEMORY_MB = 1024;

/**
 * Heap a file needs per byte of input, at most (measured: a 19 MB traced
 * drawing of 400 dense contours refits in a 100 MB heap, about 5 bytes per
 * byte; 6 leaves a margin). Batch files above limit / 6 are refused before reading.
 */
export const HEAP_BYTES_PER_INPUT_BYTE = 6;

/** The compiled worker (dist/src/refitWorker.js beside this module), or null when running from TypeScript sources. */
export function compiledWorkerUrl(): URL | null {
  if (!import.meta.url.endsWith('.js')) return null;
  const url = new URL('./refitWorker.js', import.meta.url);
  return existsSync(fileURLToPath(url)) ? url : null;
}

/** What `workerData` carries: a marker, so a test runner's own worker threads never act as ours. */
export interface WorkerInit {
  arcsplineWorker: true;
}

/** A task as posted to a thread: its kind picks the handler in ./refitWorker.ts. */
export interface PoolTask {
  kind: string;
}

/** Why a task did not come back: the thread ran out of its heap, stopped, or the pool was closed. */
export class ThreadLost extends Error {
  constructor(readonly reason: 'out-of-memory' | 'crashed' | 'closed', message: string, readonly workerStack?: string) {
    super(message);
  }
}

interface Slot {
  worker: Worker;
  busy: boolean;
  done: ((r: unknown) => void) | null;
  fail: ((e: ThreadLost) => void) | null;
}

/** Worker threads, reused across tasks. */
export class ThreadPool {
  private readonly slots: Slot[] = [];
  private readonly waiting: (() => void)[] = [];
  private closed = false;

  /**
   * @param url the compiled worker ({@link compiledWorkerUrl})
   * @param size threads at most (≥ 1); all are started now, so loading the code overlaps with the caller's own work
   * @param memoryMb heap limit per thread, MB, or undefined for V8's own limit
   */
  constructor(private readonly url: URL, readonly size: number, private readonly memoryMb?: number) {
    for (let i = 0; i < size; i++) this.spawn();
  }

  /**
   * Run one task on a free thread (waiting for one).
   * @throws ThreadLost when the thread dies or the pool is closed before the answer
   */
  async run<R>(task: PoolTask): Promise<R> {
    let slot = this.slots.find((s) => !s.busy);
    while (!slot && this.slots.length >= this.size && !this.closed) {
      await new Promise<void>((r) => this.waiting.push(r));
      slot = this.slots.find((s) => !s.busy);
    }
    if (this.closed) throw new ThreadLost('closed', 'interrupted');
    slot ??= this.spawn();
    const s = slot;
    s.busy = true;
    return new Promise<R>((resolve, reject) => {
      s.done = resolve as (r: unknown) => void;
      s.fail = reject;
      s.worker.postMessage(task);
    });
  }

  private spawn(): Slot {
    const init: WorkerInit = { arcsplineWorker: true };
    const limits = this.memoryMb === undefined ? undefined : { maxOldGenerationSizeMb: this.memoryMb };
    const worker = new Worker(this.url, { workerData: init, resourceLimits: limits });
    const slot: Slot = { worker, busy: false, done: null, fail: null };
    this.slots.push(slot);
    worker.on('message', (r: unknown) => this.settle(slot, (s) => s.done?.(r)));
    worker.on('error', (e: Error & { code?: string }) => {
      const lost = e.code === 'ERR_WORKER_OUT_OF_MEMORY'
        ? new ThreadLost('out-of-memory', `needs more memory than the per-worker limit of ${this.memoryMb} MB (raise --worker-memory)`)
        : new ThreadLost('crashed', `internal error in worker: ${e.message}`, e.stack);
      this.settle(slot, (s) => s.fail?.(lost));
    });
    worker.on('exit', () => {
      // A thread that is gone is replaced on the next task.
      const i = this.slots.indexOf(slot);
      if (i >= 0) this.slots.splice(i, 1);
      const lost = this.closed ? new ThreadLost('closed', 'interrupted') : new ThreadLost('crashed', 'worker stopped unexpectedly');
      this.settle(slot, (s) => s.fail?.(lost));
    });
    return slot;
  }

  private settle(slot: Slot, answer: (s: Slot) => void): void {
    if (!slot.busy) return;
    answer(slot);
    slot.busy = false;
    slot.done = null;
    slot.fail = null;
    this.waiting.shift()?.();
  }

  /** Stop every thread now; running tasks fail with ThreadLost('closed'). */
  async close(): Promise<void> {
    this.closed = true;
    while (this.waiting.length > 0) this.waiting.shift()?.();
    await Promise.all(this.slots.slice().map((s) => s.worker.terminate()));
  }
}
