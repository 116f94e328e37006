/**
 * How a batch runs its file tasks (./fileJob.ts): on the threads of the one
 * worker system (src/workerPool.ts), each with a bounded heap, or, where no
 * compiled worker exists (TypeScript sources under a test runner), one at a
 * time on the calling thread.
 */
import { compiledWorkerUrl, ThreadLost, ThreadPool } from '../workerPool.js';
import { EXIT_INTERNAL, EXIT_USAGE } from './exitCodes.js';
import { runFileTask, type FileOutcome, type FileTask } from './fileJob.js';

export { DEFAULT_WORKER_MEMORY_MB, HEAP_BYTES_PER_INPUT_BYTE } from '../workerPool.js';

/** Runs file tasks; at most `size` at once. */
export interface TaskRunner {
  /** How many tasks run at once. */
  readonly size: number;
  /** Whether tasks run in worker threads (then each has the heap limit). */
  readonly threaded: boolean;
  /** Never rejects: a lost thread fails only its own file. */
  run(task: FileTask): Promise<FileOutcome>;
  /** Stop every thread now; running tasks resolve as failed. */
  close(): Promise<void>;
}

/** Tasks on worker threads. */
class ThreadRunner implements TaskRunner {
  readonly threaded = true;
  private readonly pool: ThreadPool;
  constructor(url: URL, readonly size: number, memoryMb: number) {
    this.pool = new ThreadPool(url, size, memoryMb);
  }
  async run(task: FileTask): Promise<FileOutcome> {
    try {
      return await this.pool.run<FileOutcome>(task);
    } catch (e) {
      if (!(e instanceof ThreadLost)) throw e;
      return { id: task.id, ok: false, exitCode: e.reason === 'out-of-memory' ? EXIT_USAGE : EXIT_INTERNAL, message: `${task.name}: ${e.message}`, stack: e.workerStack };
    }
  }
  close(): Promise<void> {
    return this.pool.close();
  }
}

/** Tasks one at a time on the calling thread (no memory limit; the event loop waits for each file). */
class InProcessRunner implements TaskRunner {
  readonly size = 1;
  readonly threaded = false;
  run(task: FileTask): Promise<FileOutcome> {
    return runFileTask(task);
  }
  async close(): Promise<void> {}
}

/**
 * The runner for a batch: `size` threads with `memoryMb` heaps each, or the calling thread when
 * `inProcess` is asked for or no compiled worker exists.
 */
export function fileRunner(size: number, memoryMb: number, inProcess = false): TaskRunner {
  const url = inProcess ? null : compiledWorkerUrl();
  return url ? new ThreadRunner(url, size, memoryMb) : new InProcessRunner();
}

