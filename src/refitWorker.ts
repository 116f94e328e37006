/** Worker-thread entry of ./refitParallel.ts: refit a share of a document's elements. */
import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { emptyTimes, refitOne } from './refit.js';
import type { ElementJob, ElementJobResult } from './refitParallel.js';

if (!isMainThread && parentPort && (workerData as ElementJob | null)?.kind === 'arcspline-elements') {
  const job = workerData as ElementJob;
  const times = emptyTimes();
  const doc = { text: job.text, rootToMm: job.rootToMm };
  const outcomes = job.elements.map((el) => refitOne(doc, el, job.opts, times));
  const result: ElementJobResult = { outcomes, times };
  parentPort.postMessage(result);
}
