/**
 * The streaming machine-readable report of `--report-lines FILE|-`: one JSON
 * line per file as it finishes (JSON Lines, jsonlines.org: common practice).
 * A refitted file's line is its FileReport exactly as `--report` writes it
 * (src/report/types.ts, schema/report.schema.json), on one line; a failed
 * file's line has `tool`, `version`, `file`, `toleranceMm` and an `error`.
 *
 * The file is written as the batch goes (not atomically), so a reader can
 * follow it; lines are written whole and in order of finishing.
 */
import { createWriteStream } from 'node:fs';
import type { Writable } from 'node:stream';
import type { FileReport } from '../report/types.js';
import { VERSION } from '../version.js';
import { asUsageError, writeToStream } from './io.js';

/** The line of a file that could not be refitted. */
export interface FailedLine {
  tool: 'arcspline';
  version: string;
  file: string;
  toleranceMm: number;
  error: {
    /** The exit code this failure stands for (2 input error, 3 internal error). */
    exitCode: number;
    /** The same one line printed on standard error, without the `arcspline: ` prefix. */
    message: string;
  };
}

/** One line of the stream. */
export type ReportLine = FileReport | FailedLine;

/** The failed-file line. */
export function failedLine(file: string, toleranceMm: number, exitCode: number, message: string): FailedLine {
  return { tool: 'arcspline', version: VERSION, file, toleranceMm, error: { exitCode, message } };
}

/** Writes report lines in order; the first write error is kept and later lines are dropped. */
export class ReportLineSink {
  private chain: Promise<void> = Promise.resolve();
  /** The first write error, as one line naming the target; null while all is well. */
  failure: string | null = null;

  private constructor(private readonly stream: Writable, private readonly name: string, private readonly owned: boolean) {}

  /**
   * Open `target` for writing (truncating it), or use `stdout` for `-`.
   * @throws UsageError when the file cannot be created
   */
  static async open(target: string, stdout: Writable): Promise<ReportLineSink> {
    if (target === '-') return new ReportLineSink(stdout, 'standard output', false);
    const stream = createWriteStream(target, { flags: 'w' });
    await new Promise<void>((resolve, reject) => {
      stream.once('open', () => resolve());
      stream.once('error', reject);
    }).catch((e: unknown) => asUsageError(e, 'write', target));
    return new ReportLineSink(stream, target, true);
  }

  /** Queue one line. */
  write(line: ReportLine): Promise<void> {
    const text = `${JSON.stringify(line)}\n`;
    this.chain = this.chain.then(async () => {
      if (this.failure !== null) return;
      try {
        await writeToStream(this.stream, text);
      } catch (e) {
        this.failure = `cannot write the report lines to ${this.name}: ${(e as Error).message}`;
      }
    });
    return this.chain;
  }

  /** Wait for every queued line; close the file (not standard output). */
  async close(): Promise<void> {
    await this.chain;
    if (!this.owned) return;
    await new Promise<void>((resolve) => this.stream.end(() => resolve()));
  }
}
