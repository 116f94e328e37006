/**
 * `arcspline` as a function: maps the command line onto the library's options,
 * does every file read and write, prints the summary, and returns the exit
 * code. Testable in-process with fake streams; bin/arcspline.js is only a
 * shell around it. The geometry work is the pure `refitSvg` (src/refit.ts).
 */
import { resolve as resolvePath } from 'node:path';
import type { Readable, Writable } from 'node:stream';
import { CommanderError } from 'commander';
import { OptionError, resolveOptions, type Options } from '../options.js';
import { refitSvg } from '../refit.js';
import { SvgInputError } from '../svg/errors.js';
import { buildProgram, parsedArgs, type CliFlags, type ParsedArgs } from './args.js';
import { EXIT_INTERNAL, EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE, UsageError } from './exitCodes.js';
import { afterHelpText } from './help.js';
import { asUsageError, decodeSvgBytes, exists, readInputBytes, sameFile, stageFile, writeToStream, type StagedFile } from './io.js';
import { choosePaint, problemLines, summaryLine, type Paint } from './summary.js';

export { EXIT_INTERNAL, EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE } from './exitCodes.js';

/** The streams and environment of one run; every field defaults to the process's own. */
export interface Io {
  stdin: Readable;
  stdout: Writable;
  stderr: Writable;
  /** Whether standard output is a terminal (then the SVG is not written there without `-o -`). */
  isTTY?: boolean;
  /** Whether standard error is a terminal (colour); default: the stream's own `isTTY`. */
  stderrIsTTY?: boolean;
  /** Environment variables (NO_COLOR); default `process.env`. */
  env?: Record<string, string | undefined>;
}

/** The process's own streams. */
export function processIo(): Io {
  return { stdin: process.stdin, stdout: process.stdout, stderr: process.stderr, isTTY: process.stdout.isTTY === true, env: process.env };
}

const STDIO = '-';
const ttyOf = (s: unknown): boolean => (s as { isTTY?: boolean }).isTTY === true;
const oneLine = (s: string): string => s.replace(/\s*[\r\n]+\s*/g, ' ').trim();

/**
 * Run the command.
 * @param argv the arguments after the program name, e.g. `process.argv.slice(2)`
 * @returns the exit code (EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE or EXIT_INTERNAL)
 */
export async function main(argv: string[], io: Io = processIo()): Promise<number> {
  const err = (line: string): void => void io.stderr.write(`${line}\n`);
  const width = Math.min(100, (io.stdout as { columns?: number }).columns ?? 80);
  const program = buildProgram(
    { writeOut: (t) => void io.stdout.write(t), writeErr: (t) => void io.stderr.write(t), width },
    afterHelpText(width),
  );
  let args: ParsedArgs;
  try {
    program.parse(argv, { from: 'user' });
    args = parsedArgs(program);
  } catch (e) {
    // Help and version exit with 0; every other commander error has printed its own line.
    if (e instanceof CommanderError) return e.exitCode === 0 ? EXIT_OK : EXIT_USAGE;
    return internal(e, argv.includes('--debug'), err);
  }
  const paint = choosePaint(io.stderrIsTTY ?? ttyOf(io.stderr), io.env ?? process.env);
  try {
    const options = checkOptions(args.options);
    await checkCombination(args, io);
    let code = EXIT_OK;
    for (const input of args.inputs) {
      try {
        code = Math.max(code, await refitFile(input, args.flags, options, io, paint));
      } catch (e) {
        if (!isUserError(e)) throw e;
        err(`arcspline: ${paint.red(oneLine(userMessage(e, input)))}`);
        code = Math.max(code, EXIT_USAGE);
      }
    }
    return code;
  } catch (e) {
    if (isUserError(e)) {
      err(`arcspline: ${paint.red(oneLine(userMessage(e, null)))}`);
      return EXIT_USAGE;
    }
    return internal(e, args.flags.debug, err);
  }
}

function isUserError(e: unknown): e is Error {
  return e instanceof UsageError || e instanceof SvgInputError || e instanceof OptionError;
}

function userMessage(e: Error, input: string | null): string {
  // The reader's messages name the problem and its line:column but not the file.
  if (e instanceof SvgInputError) return `${displayName(input ?? STDIO)}: ${e.message}`;
  return e.message;
}

function internal(e: unknown, debug: boolean, err: (line: string) => void): number {
  const msg = e instanceof Error ? e.message : String(e);
  err(`arcspline: internal error: ${oneLine(msg)}${debug ? '' : ' (run again with --debug for the stack)'}`);
  if (debug && e instanceof Error && e.stack) err(e.stack);
  return EXIT_INTERNAL;
}

function displayName(input: string): string {
  return input === STDIO ? '<stdin>' : input;
}

/** The library validates the whole object too; checking it once here refuses bad values before any file is read. */
function checkOptions(options: Partial<Options>): Partial<Options> {
  resolveOptions(options);
  return options;
}

/** Refuse flag combinations that cannot work, before reading anything. */
async function checkCombination(args: ParsedArgs, io: Io): Promise<void> {
  const { inputs, flags } = args;
  if (flags.inPlace) {
    if (flags.output !== undefined) throw new UsageError('--in-place and -o cannot be combined (--in-place writes each input file itself)');
    if (inputs.includes(STDIO)) throw new UsageError('--in-place needs input files, not - (standard input)');
    if (flags.report !== undefined && inputs.length > 1) throw new UsageError('--report takes one input file; run once per file for a report each');
  } else if (inputs.length > 1) {
    throw new UsageError(`${inputs.length} input files given; refit one file at a time with -o, or several with --in-place`);
  }
  if (inputs.filter((i) => i === STDIO).length > 1) throw new UsageError('standard input (-) can be read only once');
  if (inputs.includes(STDIO) && ttyOf(io.stdin)) throw new UsageError('standard input is a terminal; pipe an SVG file in (arcspline - < FILE.svg) or name the file');
  const svgToStdout = !flags.inPlace && (flags.output === undefined || flags.output === STDIO);
  if (svgToStdout && flags.report === STDIO) {
    throw new UsageError('the SVG and the report cannot both go to standard output; write the SVG to a file with -o FILE, or the report with --report FILE');
  }
  if (!flags.inPlace && flags.output === undefined && (io.isTTY ?? ttyOf(io.stdout))) {
    throw new UsageError('standard output is a terminal; give -o FILE for the refitted SVG (or -o - to print it anyway)');
  }
  const input = inputs[0];
  const out = flags.output;
  if (out !== undefined && out !== STDIO && input !== STDIO && (resolvePath(out) === resolvePath(input) || (await sameFile(out, input)))) {
    throw new UsageError(`output ${out} is the input file; arcspline never overwrites its input unless --in-place is given`);
  }
  const rep = flags.report;
  if (rep !== undefined && rep !== STDIO) {
    for (const i of inputs) {
      if (i !== STDIO && (resolvePath(rep) === resolvePath(i) || (await sameFile(rep, i)))) throw new UsageError(`report ${rep} is the input file; choose another report path`);
    }
    if (out !== undefined && out !== STDIO && (resolvePath(rep) === resolvePath(out) || (await sameFile(rep, out)))) {
      throw new UsageError(`the report and the SVG output are both ${rep}; choose two paths`);
    }
  }
}

/** Read, refit and write one input; returns EXIT_OK or EXIT_TOLERANCE. Throws user errors. */
async function refitFile(input: string, flags: CliFlags, options: Partial<Options>, io: Io, paint: Paint): Promise<number> {
  const name = displayName(input);
  const bytes = await readInputBytes(input === STDIO ? null : input, io.stdin, name);
  const text = decodeSvgBytes(bytes, name);
  const result = refitSvg(text, options, input === STDIO ? null : input);
  const reportJson = `${JSON.stringify(result.report, null, 2)}\n`;
  const changed = result.text !== text;

  // Stage every file first, then rename them all: an error before the renames leaves no new file behind.
  const staged: StagedFile[] = [];
  try {
    if (flags.inPlace) {
      if (changed) {
        if (flags.backup) {
          const bak = `${input}.bak`;
          if (await exists(bak)) throw new UsageError(`${bak} exists already; remove it, or give --no-backup`);
          staged.push(await stageFile(bak, bytes));
        }
        staged.push(await stageFile(input, result.text));
      }
    } else if (flags.output !== undefined && flags.output !== STDIO) {
      staged.push(await stageFile(flags.output, result.text));
    }
    if (flags.report !== undefined && flags.report !== STDIO) staged.push(await stageFile(flags.report, reportJson));
    for (const s of staged) await s.commit();
  } finally {
    for (const s of staged) await s.abort();
  }
  const svgToStdout = !flags.inPlace && (flags.output === undefined || flags.output === STDIO);
  try {
    if (svgToStdout) await writeToStream(io.stdout, result.text);
    if (flags.report === STDIO) await writeToStream(io.stdout, reportJson);
  } catch (e) {
    asUsageError(e, 'write', 'standard output');
  }
  const err = (line: string): void => void io.stderr.write(`${line}\n`);
  if (!flags.quiet) err(summaryLine(name, result.report, paint));
  for (const line of problemLines(name, result.report, paint)) err(line);
  return result.report.totals.withinTolerance ? EXIT_OK : EXIT_TOLERANCE;
}
