/**
 * The worker-thread entry of the one worker system (./workerPool.ts): answers
 * each posted task by its kind. `elements`: a share of one document's
 * elements (./refitParallel.ts). `file`: one whole file of a batch
 * (src/cli/fileJob.ts, loaded only when such a task comes, so a library
 * caller's threads never load the command line's code).
 */
import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { refitElements, type ElementJob } from './refitParallel.js';
import type { FileTask } from './cli/fileJob.js';
import type { WorkerInit } from './workerPool.js';

// Only when started by the pool (a test runner's own worker threads carry no such marker).
if (!isMainThread && parentPort !== null && (workerData as WorkerInit | null)?.arcsplineWorker === true) {
  const port = parentPort;
  port.on('message', (task: ElementJob | FileTask) => {
    if (task.kind === 'elements') {
      port.postMessage(refitElements(task));
    } else {
      void import('./cli/fileJob.js').then(({ runFileTask }) => runFileTask(task)).then((r) => port.postMessage(r));
    }
  });
}
