/**
 * The one worker system (src/workerPool.ts + src/refitWorker.ts), through the
 * compiled code in dist/ (built once by test/globalSetup.ts): one locator, one
 * thread answering both kinds of task, a thread lost fails only its task.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { compiledWorkerUrl as sourceLocator } from '../src/workerPool.js';
import { refitSvg } from '../src/refit.js';
import { readSvg } from '../src/svg/document.js';
import { resolveOptions } from '../src/options.js';
import type { ElementJob, ElementJobResult } from '../src/refitParallel.js';
import type { FileOutcome, FileTask } from '../src/cli/fileJob.js';
import { SMALL } from './cli/helpers.js';

const root = fileURLToPath(new URL('..', import.meta.url));
type PoolModule = typeof import('../src/workerPool.js');

describe('the worker pool', () => {
  it('finds the compiled worker in one place, and none from the TypeScript sources', async () => {
    expect(sourceLocator()).toBeNull();
    const built = (await import(`${root}/dist/src/workerPool.js`)) as PoolModule;
    const url = built.compiledWorkerUrl();
    expect(url && fileURLToPath(url)).toBe(join(root, 'dist', 'src', 'refitWorker.js'));
  });

  it('one thread answers an element share and a whole file, each equal to the one-thread refit', async () => {
    const built = (await import(`${root}/dist/src/workerPool.js`)) as PoolModule;
    const pool = new built.ThreadPool(built.compiledWorkerUrl()!, 1, built.DEFAULT_WORKER_MEMORY_MB);
    const dir = mkdtempSync(join(tmpdir(), 'arcspline-pool-'));
    try {
      const opts = resolveOptions({});
      const doc = readSvg(SMALL, { assumedMmPerUnit: opts.assumedMmPerUnit });
      const els = doc.elements.filter((e) => e.rewritable);
      const job: ElementJob = { kind: 'elements', text: SMALL, rootToMm: doc.rootToMm, elements: els, opts };
      const share = await pool.run<ElementJobResult>(job);
      expect(share.outcomes.map((o) => o.index)).toEqual(els.map((e) => e.index));
      writeFileSync(join(dir, 'a.svg'), SMALL);
      const task: FileTask = { kind: 'file', id: 7, path: join(dir, 'a.svg'), name: 'a.svg', outName: null, wantOriginal: false, threads: 1, wantText: true, options: {} };
      const done = await pool.run<FileOutcome>(task);
      expect(done.ok && done.id).toBe(7);
      if (!done.ok) return;
      expect(done.text?.after).toBe(refitSvg(SMALL, {}, join(dir, 'a.svg')).text);
      expect(Buffer.from(done.out).toString('utf8')).toBe(done.text?.after);
      const gone: FileTask = { ...task, id: 8, path: join(dir, 'none.svg') };
      const missing = await pool.run<FileOutcome>(gone);
      expect(missing).toMatchObject({ id: 8, ok: false, exitCode: 2, message: `cannot read ${join(dir, 'none.svg')}: no such file or directory` });
    } finally {
      await pool.close();
      rmSync(dir, { recursive: true, force: true });
    }
    // After close, a task is refused as interrupted rather than left waiting.
    await expect(pool.run({ kind: 'elements' })).rejects.toMatchObject({ reason: 'closed' });
  }, 60_000);
});
