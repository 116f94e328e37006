/** In-process runs of the CLI with fake streams, and scratch directories. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable, Writable } from 'node:stream';
import { main } from '../../src/cli/main.js';
import type { Deviation, ElementReport, FileReport, MachineSummary } from '../../src/report/types.js';

export interface RunResult {
  code: number;
  stdout: string;
  stdoutBytes: Buffer;
  stderr: string;
}

export interface RunOptions {
  stdin?: string | Buffer;
  /** Pretend standard output is a terminal. */
  isTTY?: boolean;
  stderrIsTTY?: boolean;
  /** Mark standard input as a terminal. */
  stdinIsTTY?: boolean;
  env?: Record<string, string | undefined>;
}

/** Run `main(args)` with collecting streams; standard output is not a terminal unless asked. */
export async function run(args: string[], o: RunOptions = {}): Promise<RunResult> {
  const out: Buffer[] = [];
  const err: Buffer[] = [];
  const sink = (into: Buffer[]) =>
    new Writable({
      write(chunk, _enc, cb) {
        into.push(Buffer.from(chunk));
        cb();
      },
    });
  const stdin = Readable.from(o.stdin === undefined ? [] : [Buffer.from(o.stdin)]);
  if (o.stdinIsTTY) Object.assign(stdin, { isTTY: true });
  const code = await main(args, {
    stdin, stdout: sink(out), stderr: sink(err),
    isTTY: o.isTTY ?? false, stderrIsTTY: o.stderrIsTTY ?? false, env: o.env ?? {},
  });
  const stdoutBytes = Buffer.concat(out);
  return { code, stdout: stdoutBytes.toString('utf8'), stdoutBytes, stderr: Buffer.concat(err).toString('utf8') };
}

/** A fresh scratch directory and a function that removes it. */
export function scratch(): { dir: string; cleanup: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'arcspline-cli-'));
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

/** Keys of FileReport and of its parts, as declared in src/report/types.ts. */
/** A small file with curves: a circle drawn as four cubic Béziers, 100 mm wide (our own test data). */
export const SMALL = `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100">
<path id="c" d="M90 50C90 72.09 72.09 90 50 90C27.91 90 10 72.09 10 50C10 27.91 27.91 10 50 10C72.09 10 90 27.91 90 50Z"/>
</svg>
`;

export const FILE_REPORT_KEYS = ['tool', 'version', 'file', 'toleranceMm', 'bytesIn', 'bytesOut', 'timeMs', 'elements', 'totals', 'paints', 'warnings'] as const;
export const TOTALS_KEYS = ['elements', 'rewritten', 'kept', 'commandsBefore', 'segmentsAfter', 'maxDeviation', 'withinTolerance'] as const;
export const ELEMENT_KEYS = ['index', 'name', 'id', 'ancestors', 'commandsBefore', 'straightMovesNeeded', 'segmentsAfter', 'grows', 'deviation', 'kept', 'keptReason', 'status', 'reason', 'style', 'copies'] as const;
/** An element that was fitted (not kept before fitting) also lists its contours. */
export const ELEMENT_FITTED_KEYS = [...ELEMENT_KEYS, 'contours'] as const;
export const DEVIATION_KEYS = ['max', 'originalToResult', 'resultToOriginal', 'mean', 'worstMm', 'worstUser'] as const;
/** The report's `machine` field, present only for G-code and DXF output (FILE_REPORT_KEYS are an SVG report's). */
export const MACHINE_KEYS = ['format', 'profile', 'origin', 'digits', 'lines', 'moves', 'checked', 'seconds', 'straight'] as const;

// The lists above must name every field: a field added to the types without a test fails to compile here.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const complete: [
  // plan and planGroup appear only with the path plan (test/planRefit.test.ts); an element's contours only
  // when it was fitted (ELEMENT_FITTED_KEYS).
  Same<Exclude<keyof FileReport, 'machine' | 'plan'>, (typeof FILE_REPORT_KEYS)[number]>,
  Same<keyof MachineSummary, (typeof MACHINE_KEYS)[number]>,
  Same<keyof FileReport['totals'], (typeof TOTALS_KEYS)[number]>,
  Same<keyof ElementReport, (typeof ELEMENT_KEYS)[number] | 'planGroup' | 'contours'>,
  Same<keyof Deviation, (typeof DEVIATION_KEYS)[number]>,
] = [true, true, true, true, true];
void complete;
