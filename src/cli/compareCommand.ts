/**
 * The measuring command, as a function the CLI registers: read two SVG files,
 * compare them (src/measure/compare.ts) and print the table or JSON. Proposed
 * name: `arcspline measure A.svg B.svg [--tolerance 0.1mm] [--json]`.
 *
 * Exit codes are the CLI's (./exitCodes.ts): 0 within tolerance, 1 not,
 * 2 usage or input error (unreadable file, not an SVG, bad tolerance),
 * 3 internal error.
 */
import type { Readable, Writable } from 'node:stream';
import { compareSvg, type Comparison } from '../measure/compare.js';
import { formatComparison } from '../report/compareTable.js';
import { SvgInputError } from '../svg/errors.js';
import { readSvg } from '../svg/document.js';
import { DEFAULT_OPTIONS } from '../options.js';
import { EXIT_INTERNAL, EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE, UsageError } from './exitCodes.js';
import { decodeSvgBytes, readInputBytes, writeToStream } from './io.js';

/** Streams the command writes to; `stdin` only when a file is given as "-". */
export interface CommandIo {
  stdout: Writable;
  stderr: Writable;
  stdin?: Readable;
}

/** Parsed values of the measuring command. */
export interface CompareCommandOptions {
  /** mm, > 0 (the CLI parses units with parseToleranceText). */
  tolerance: number;
  /** Print the comparison as JSON instead of the table. */
  json: boolean;
  /** ANSI colour in the table (the CLI decides: a TTY and no NO_COLOR); default false. */
  color?: boolean;
  /** Table width in characters; default 100. */
  width?: number;
  /** mm per user unit for files without a physical size; default CSS px. */
  assumedMmPerUnit?: number;
  /** Largest file read, bytes (refused before reading); default the library's maxInputBytes. */
  maxInputBytes?: number;
}

/** Read one file ("-" = standard input) as SVG text; UsageError for what the user can fix. */
export async function readSvgText(path: string, io: CommandIo, maxInputBytes = DEFAULT_OPTIONS.maxInputBytes): Promise<string> {
  if (path === '-' && io.stdin === undefined) throw new UsageError('standard input is not available here; name a file');
  const bytes = await readInputBytes(path === '-' ? null : path, io.stdin as Readable, path === '-' ? 'standard input' : path, maxInputBytes);
  return decodeSvgBytes(bytes, path === '-' ? 'standard input' : path, maxInputBytes);
}

/** The comparison as JSON text (NaN coordinates become null), with a trailing newline. */
export function comparisonJson(c: Comparison, a: string, b: string): string {
  return `${JSON.stringify({ tool: 'arcspline', a, b, ...c }, null, 2)}\n`;
}

/**
 * Compare `fileA` (reference) with `fileB` and print the result on stdout;
 * errors are one line on stderr.
 * @returns the exit code
 */
export async function runCompare(fileA: string, fileB: string, opts: CompareCommandOptions, io: CommandIo): Promise<number> {
  const fail = async (code: number, msg: string): Promise<number> => {
    await writeToStream(io.stderr, `arcspline: ${msg}\n`).catch(() => undefined);
    return code;
  };
  if (fileA === '-' && fileB === '-') return fail(EXIT_USAGE, 'only one of the two files can be standard input');
  let a: string, b: string;
  try {
    a = await readSvgText(fileA, io, opts.maxInputBytes);
    b = await readSvgText(fileB, io, opts.maxInputBytes);
  } catch (e) {
    if (e instanceof UsageError) return fail(EXIT_USAGE, e.message);
    return fail(EXIT_INTERNAL, `internal error: ${(e as Error).message}`);
  }
  let c: Comparison;
  try {
    c = compareSvg(a, b, { tolerance: opts.tolerance, assumedMmPerUnit: opts.assumedMmPerUnit });
  } catch (e) {
    if (e instanceof SvgInputError) {
      // Which of the two: reading A again is cheap next to measuring, and names the file for certain.
      const which = isReadable(a, opts) ? fileB : fileA;
      return fail(EXIT_USAGE, `${which}: ${e.message}`);
    }
    if (e instanceof RangeError && /tolerance/.test(e.message)) return fail(EXIT_USAGE, e.message);
    return fail(EXIT_INTERNAL, `internal error: ${(e as Error).message}`);
  }
  const text = opts.json
    ? comparisonJson(c, fileA, fileB)
    : formatComparison(c, { color: opts.color ?? false, width: opts.width }, { a: fileA, b: fileB });
  try {
    await writeToStream(io.stdout, text);
  } catch (e) {
    return fail(EXIT_USAGE, `cannot write the result: ${(e as Error).message}`);
  }
  return c.totals.withinTolerance ? EXIT_OK : EXIT_TOLERANCE;
}

function isReadable(text: string, opts: CompareCommandOptions): boolean {
  try {
    readSvg(text, { assumedMmPerUnit: opts.assumedMmPerUnit ?? DEFAULT_OPTIONS.assumedMmPerUnit });
    return true;
  } catch (e) {
    return !(e instanceof SvgInputError);
  }
}
