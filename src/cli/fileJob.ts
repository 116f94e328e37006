/**
 * The one file job, used by the single-file run, the batch and the batch's
 * worker threads: read → decode → refit → encode like the input → stage →
 * commit → report.
 *
 * The first half ({@link refitFileTask}: read, decode, refit, encode) is what
 * a batch runs in a worker thread (src/refitWorker.ts) and a single run on
 * its own thread (sharing one very large document's elements over threads,
 * src/refitParallel.ts); it never writes a file, so stopping a thread cannot
 * leave a partial one. The second half ({@link writeFileResult},
 * {@link fileLines}) always runs on the main thread.
 *
 * Encoding: the output is written in the input's encoding (UTF-8, or UTF-16
 * with its byte order and mark), so an XML declaration naming the encoding
 * stays true; gzip (`.svgz`) follows the output name (`.svgz` gzipped, `.svg`
 * plain) and otherwise the input. An unchanged document is written back as
 * the very bytes read.
 */
import { mkdir } from 'node:fs/promises';
import { dirname } from 'node:path';
import { Readable, type Writable } from 'node:stream';
import { OptionError, resolveOptions, type Options } from '../options.js';
import { refitSvgParallel } from '../refitParallel.js';
import { refitToMachine } from '../refitMachine.js';
import { formatTable } from '../report/table.js';
import type { FileReport } from '../report/types.js';
import { encodeSvgText, readSvgBytes, type SvgByteForm } from '../svg/decode.js';
import { SvgInputError } from '../svg/errors.js';
import { EXIT_INTERNAL, EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE, UsageError } from './exitCodes.js';
import { asUsageError, exists, readInputBytes, stageFile, writeToStream, type StagedFile } from './io.js';
import { PLAIN, problemLines, summaryLine, type Paint } from './summary.js';

/** One file to refit, as posted to a worker thread. */
export interface FileTask {
  kind: 'file';
  /** Caller's number for the task. */
  id: number;
  /** The file to read; null when the caller passes the bytes (standard input). */
  path: string | null;
  /** The input as messages name it. */
  name: string;
  /** The output file name (its `.svg`/`.svgz` ending picks plain or gzip), or null for standard output and in place. */
  outName: string | null;
  /** Also return the bytes read (for an in-place backup). */
  wantOriginal: boolean;
  /** Threads one document's elements may be shared over (1 in a batch: a batch shares files instead). */
  threads?: number;
  /** Return the input and output text too (for a preview). */
  wantText: boolean;
  options: Partial<Options>;
}

/** A refitted file. */
export interface FileDone {
  id: number;
  ok: true;
  report: FileReport;
  /** The output bytes, encoded like the input (the input bytes themselves when nothing changed). */
  out: Uint8Array;
  /** Whether the document text changed. */
  changed: boolean;
  /** The bytes read, when the task asked for them. */
  original: Uint8Array | null;
  /** Size of the file read, bytes (the report's bytesIn counts the decoded text as UTF-8). */
  bytesRead: number;
  /** Input and output text, when the task asked for them. */
  text: { before: string; after: string } | null;
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

const NO_STDIN = Readable.from([]);
const oneLine = (s: string): string => s.replace(/\s*[\r\n]+\s*/g, ' ').trim();

/** The form to write: the output name's ending decides gzip, else the input's form. */
export function outputForm(input: SvgByteForm, outName: string | null): SvgByteForm {
  if (outName !== null && /\.svgz$/i.test(outName)) return { ...input, gzip: true };
  if (outName !== null && /\.svg$/i.test(outName)) return { ...input, gzip: false };
  return input;
}

/**
 * Read (unless `bytes` are given), decode, refit and encode one file.
 * @throws UsageError or SvgInputError (named by the file) for what the user can fix; anything else is a bug
 */
export async function refitFileTask(task: FileTask, bytes?: Uint8Array): Promise<FileDone> {
  const limit = resolveOptions(task.options).maxInputBytes;
  const raw = bytes ?? (await readInputBytes(task.path, NO_STDIN, task.name, limit));
  let decoded: { text: string; form: SvgByteForm };
  try {
    decoded = readSvgBytes(raw, limit);
  } catch (e) {
    if (e instanceof SvgInputError) throw new UsageError(`${task.name}: ${e.message}`);
    throw e;
  }
  if (resolveOptions(task.options).format !== 'svg') {
    // A machine file (G-code, DXF): always new text, UTF-8 (ASCII in practice), on this thread.
    const m = refitToMachine(decoded.text, task.options, task.path);
    return {
      id: task.id, ok: true, report: m.report, out: new TextEncoder().encode(m.text), changed: true,
      original: task.wantOriginal ? new Uint8Array(raw) : null, bytesRead: raw.length, text: null,
    };
  }
  const result = await refitSvgParallel(decoded.text, task.options, task.path, task.threads);
  const changed = result.text !== decoded.text;
  const form = outputForm(decoded.form, task.outName);
  const sameForm = form.gzip === decoded.form.gzip;
  return {
    id: task.id, ok: true, report: result.report,
    out: !changed && sameForm ? raw : encodeSvgText(result.text, form),
    changed,
    // A copy, so the buffer sent back is exactly the file (a read buffer may be a slice of a larger one).
    original: task.wantOriginal ? new Uint8Array(raw) : null,
    bytesRead: raw.length,
    text: task.wantText ? { before: decoded.text, after: result.text } : null,
  };
}

/** Whether an error is one the user can fix (a one-line message, exit code 2). */
export function isUserError(e: unknown): e is Error {
  return e instanceof UsageError || e instanceof SvgInputError || e instanceof OptionError;
}

/** {@link refitFileTask} that never throws: every failure becomes a FileFailed naming the file. */
export async function runFileTask(task: FileTask): Promise<FileOutcome> {
  try {
    return await refitFileTask(task);
  } catch (e) {
    return failure(task, e);
  }
}

/** A FileFailed for an error thrown while refitting `task`. */
export function failure(task: Pick<FileTask, 'id' | 'name'>, e: unknown): FileFailed {
  // The reader's messages name the problem and its line:column but not the file.
  if (e instanceof SvgInputError) return { id: task.id, ok: false, exitCode: EXIT_USAGE, message: oneLine(`${task.name}: ${e.message}`) };
  if (isUserError(e)) return { id: task.id, ok: false, exitCode: EXIT_USAGE, message: oneLine(e.message) };
  const err = e instanceof Error ? e : new Error(String(e));
  return { id: task.id, ok: false, exitCode: EXIT_INTERNAL, message: oneLine(`${task.name}: internal error: ${err.message}`), stack: err.stack };
}

/** Where one file's results go. */
export interface FileTargets {
  /** The SVG: a file (parent directories created when `mkdir`), standard output, or the input itself. */
  svg: { to: 'file'; path: string; mkdir?: boolean } | { to: 'stdout' } | { to: 'in-place'; path: string; backup: boolean };
  /** The JSON report: a file, `-` for standard output, or undefined. */
  report?: string;
}

/** The backup of an in-place rewrite. */
export const backupPath = (path: string): string => `${path}.bak`;

/**
 * Whether an in-place run must keep the bytes it reads: a backup is wanted
 * and none exists yet (an existing FILE.bak holds the file as it was before
 * arcspline first rewrote it, and is kept as it is).
 */
export async function needsBackup(targets: FileTargets): Promise<boolean> {
  return targets.svg.to === 'in-place' && targets.svg.backup && !(await exists(backupPath(targets.svg.path)));
}

/**
 * Stage every file of one result, then rename them all (backup first); an
 * error before the renames, or an interrupt (`interrupted()` true), leaves no
 * new file behind. Standard output is written after the renames.
 * @returns false when interrupted before the renames
 * @throws UsageError when a file cannot be written
 */
export async function writeFileResult(done: FileDone, targets: FileTargets, stdout: Writable, interrupted = (): boolean => false): Promise<boolean> {
  const reportJson = `${JSON.stringify(done.report, null, 2)}\n`;
  const staged: StagedFile[] = [];
  const svg = targets.svg;
  try {
    if (svg.to === 'in-place') {
      // An input that needs no change is not rewritten in place.
      if (done.changed) {
        if (svg.backup && !(await exists(backupPath(svg.path)))) {
          // Never an empty backup: the job was asked for the bytes it read.
          if (done.original === null) throw new Error(`no original bytes for the backup of ${svg.path}`);
          staged.push(await stageFile(backupPath(svg.path), done.original));
        }
        staged.push(await stageFile(svg.path, done.out));
      }
    } else if (svg.to === 'file') {
      if (svg.mkdir) await mkdir(dirname(svg.path), { recursive: true }).catch(() => undefined);
      staged.push(await stageFile(svg.path, done.out));
    }
    if (targets.report !== undefined && targets.report !== '-') staged.push(await stageFile(targets.report, reportJson));
    if (interrupted()) return false;
    for (const s of staged) await s.commit();
  } finally {
    for (const s of staged) await s.abort();
  }
  try {
    if (svg.to === 'stdout') await writeToStream(stdout, done.out);
    if (targets.report === '-') await writeToStream(stdout, reportJson);
  } catch (e) {
    asUsageError(e, 'write', 'standard output');
  }
  return true;
}

/** What to print for a refitted file. */
export interface FileView {
  /** The one summary line. */
  summary: boolean;
  /** The per-element table (--table). */
  table: boolean;
  paint?: Paint;
  /** The file sizes read and written (gzip and UTF-16 included), for the summary; the report's UTF-8 sizes when absent. */
  sizes?: { in: number; out: number };
}

/** The lines printed on standard error for a refitted file: summary, table, then warnings and elements kept over the tolerance (always). */
export function fileLines(name: string, report: FileReport, view: FileView): string[] {
  const paint = view.paint ?? PLAIN;
  const out: string[] = [];
  if (view.summary) out.push(summaryLine(name, report, paint, view.sizes));
  if (view.table) out.push(formatTable(report, { color: paint !== PLAIN, width: 100 }).trimEnd());
  out.push(...problemLines(name, report, paint));
  return out;
}

/** The exit code of a refitted file: EXIT_OK, or EXIT_TOLERANCE when an element was kept over the tolerance. */
export function fileExitCode(report: FileReport): number {
  return report.totals.withinTolerance ? EXIT_OK : EXIT_TOLERANCE;
}
