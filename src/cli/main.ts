/**
 * `arcspline` as a function: maps the command line onto the library's options,
 * does every file read and write, prints the summary, and returns the exit
 * code. Testable in-process with fake streams; bin/arcspline.js is only a
 * shell around it. Several inputs, directories and patterns go to the batch
 * path (./batch.ts). The geometry work is the pure `refitSvg` (src/refit.ts).
 */
import { stat } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { resolve as resolvePath } from 'node:path';
import type { Readable, Writable } from 'node:stream';
import { CommanderError } from 'commander';
import { resolveOptions, type Options } from '../options.js';
import { measureMain } from './measureMain.js';
import { SvgInputError } from '../svg/errors.js';
import { checkSpacedUnits } from './spacedUnits.js';
import { OPTION_FLAGS, buildProgram, chosenCommand, formatOfOutputName, parsedArgs, parsedMeasure, type CliFlags, type ParsedArgs } from './args.js';
import { EXIT_INTERNAL, EXIT_INTERRUPTED, EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE, UsageError } from './exitCodes.js';
import { runBatch } from './batch.js';
import { isGlobPattern } from './inputs.js';
import { failedLine, ReportLineSink } from './reportLines.js';
import { afterHelpText } from './help.js';
import { readInputBytes, sameFile } from './io.js';
import { fileExitCode, fileLines, isUserError, needsBackup, refitFileTask, writeFileResult, type FileTargets, type FileTask } from './fileJob.js';
import { choosePaint, type Paint } from './summary.js';

export { EXIT_INTERNAL, EXIT_INTERRUPTED, EXIT_OK, EXIT_TOLERANCE, EXIT_USAGE } from './exitCodes.js';

/** The streams and environment of one run; every field defaults to the process's own. */
export interface Io {
  stdin: Readable;
  stdout: Writable;
  stderr: Writable;
  /** Whether standard output is a terminal (then the SVG is not written there without `-o -`). */
  isTTY?: boolean;
  /** Whether standard error is a terminal (colour); default: the stream's own `isTTY`. */
  stderrIsTTY?: boolean;
  /** Environment variables (NO_COLOR, CI); default `process.env`. */
  env?: Record<string, string | undefined>;
  /**
   * Aborting it interrupts a batch. Default: with the process's own streams,
   * the first SIGINT interrupts the batch cleanly and a second one exits at once.
   */
  signal?: AbortSignal;
  /** Run a batch on the calling thread instead of worker threads. */
  inProcess?: boolean;
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
    checkSpacedUnits(argv);
    program.parse(argv, { from: 'user' });
    // `arcspline measure A.svg B.svg`: compare any two SVG files (./measureMain.ts).
    if (chosenCommand(program) === 'measure') return await measureMain(parsedMeasure(program), io);
    args = parsedArgs(program);
  } catch (e) {
    // Help and version exit with 0; every other commander error has printed its own line.
    if (e instanceof CommanderError) return e.exitCode === 0 ? EXIT_OK : EXIT_USAGE;
    if (e instanceof UsageError) {
      err(`arcspline: ${e.message}`);
      return EXIT_USAGE;
    }
    return internal(e, argv.includes('--debug'), err);
  }
  const paint = choosePaint(io.stderrIsTTY ?? ttyOf(io.stderr), io.env ?? process.env);
  try {
    const options = checkOptions(formatFromOutput(args));
    for (const note of ignoredOptions(args, options)) err(`arcspline: warning: ${note}`);
    const batch = await isBatch(args);
    checkMachineCombination(args.flags, options);
    if (batch) return await batchCommand(args, options, io);
    await checkCombination(args, io);
    const lines = args.flags.reportLines === undefined ? null : await ReportLineSink.open(args.flags.reportLines, io.stdout);
    let code = EXIT_OK;
    try {
      for (const input of args.inputs) {
        try {
          code = Math.max(code, await refitFile(input, args.flags, options, io, paint, lines));
        } catch (e) {
          if (!isUserError(e)) throw e;
          const msg = oneLine(userMessage(e, input));
          err(`arcspline: ${paint.red(msg)}`);
          await lines?.write(failedLine(displayName(input), resolveOptions(options).tolerance, EXIT_USAGE, msg));
          code = Math.max(code, EXIT_USAGE);
        }
      }
    } finally {
      await lines?.close();
    }
    if (lines?.failure) {
      err(`arcspline: ${paint.red(lines.failure)}`);
      code = Math.max(code, EXIT_USAGE);
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

/**
 * The options with the output format taken from the `-o` name when `--format` is not given (`.gcode`, `.nc`,
 * `.ngc`, `.dxf`); a `--format` that contradicts the name is refused.
 */
function formatFromOutput(args: ParsedArgs): Partial<Options> {
  const byName = formatOfOutputName(args.flags.output);
  const given = args.options.format;
  if (given !== undefined && byName !== null && given !== byName) {
    throw new UsageError(`--format ${given} and the output name ${args.flags.output} (${byName}) disagree; give one of them`);
  }
  return given === undefined && byName !== null && byName !== 'svg' ? { ...args.options, format: byName } : args.options;
}

/** Options given that this run does not use (each would otherwise be ignored without a word). */
export function ignoredOptions(args: ParsedArgs, options: Partial<Options>): string[] {
  const notes: string[] = [];
  const given = (k: keyof Options): boolean => args.options[k] !== undefined;
  if (options.plan !== true) {
    const sub = (['planJoin', 'planDoubles', 'planOrder', 'holesFirst', 'joinDistance'] as const).filter(given).map((k) => OPTION_FLAGS[k].split(' ')[0]);
    if (sub.length > 0) notes.push(`${sub.join(', ')} ${sub.length > 1 ? 'act' : 'acts'} only with --plan, which is not given: ignored`);
  }
  if (resolveOptions(options).format === 'svg') {
    const machine = (['machineProfile', 'machineOrigin'] as const).filter(given).map((k) => OPTION_FLAGS[k].split(' ')[0]);
    if (machine.length > 0) notes.push(`${machine.join(', ')} ${machine.length > 1 ? 'act' : 'acts'} only on G-code or DXF output (-o NAME.gcode, .nc, .ngc, .dxf or --format): ignored`);
  }
  if (!args.flags.backup && !args.flags.inPlace) notes.push('--no-backup acts only with --in-place: ignored');
  return notes;
}

/** Machine output (G-code, DXF) goes to new files or standard output: never in place, no SVG preview. */
function checkMachineCombination(flags: CliFlags, options: Partial<Options>): void {
  const format = resolveOptions(options).format;
  if (format === 'svg') return;
  if (flags.inPlace) throw new UsageError(`--in-place rewrites SVG files; write ${format} with -o (a file, or a directory for a batch)`);
  if (flags.preview !== undefined) throw new UsageError(`--preview draws SVG output; run without --format ${format} for a picture`);
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
  if (svgToStdout && flags.reportLines === STDIO) {
    throw new UsageError('the SVG and the report lines cannot both go to standard output; write the SVG to a file with -o FILE, or the lines with --report-lines FILE');
  }
  if (flags.report === STDIO && flags.reportLines === STDIO) throw new UsageError('--report and --report-lines cannot both go to standard output');
  const rl = flags.reportLines;
  if (rl !== undefined && rl !== STDIO) {
    for (const i of inputs) {
      if (i !== STDIO && (resolvePath(rl) === resolvePath(i) || (await sameFile(rl, i)))) throw new UsageError(`--report-lines ${rl} is the input file; choose another path`);
    }
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

/**
 * Whether the command is a batch: several inputs, a directory, a pattern that
 * names no existing file, or one file with `-o` naming an existing directory.
 */
async function isBatch(args: ParsedArgs): Promise<boolean> {
  const { inputs, flags } = args;
  if (inputs.length > 1) return true;
  const input = inputs[0];
  if (input === STDIO) return false;
  const st = await stat(input).catch(() => null);
  if (st?.isDirectory()) return true;
  if (st === null && isGlobPattern(input)) return true;
  if (!flags.inPlace && flags.output !== undefined && flags.output !== STDIO) return (await stat(flags.output).catch(() => null))?.isDirectory() === true;
  return false;
}

/** Check the flags a batch cannot take, hook SIGINT, and run it (./batch.ts). */
async function batchCommand(args: ParsedArgs, options: Partial<Options>, io: Io): Promise<number> {
  const { flags } = args;
  if (flags.inPlace && flags.output !== undefined) throw new UsageError('--in-place and -o cannot be combined (--in-place writes each input file itself)');
  if (flags.report !== undefined) throw new UsageError('--report writes the report of one file; for a batch give --report-lines FILE (one JSON line per file)');
  if (flags.preview !== undefined) throw new UsageError('--preview draws one file; run once per file for a picture each');
  let signal = io.signal;
  let dispose = (): void => undefined;
  if (signal === undefined && io.stderr === process.stderr) {
    const ac = new AbortController();
    const onInt = (): void => {
      // A second Ctrl-C means now.
      if (ac.signal.aborted) process.exit(EXIT_INTERRUPTED);
      ac.abort();
    };
    process.on('SIGINT', onInt);
    dispose = () => void process.off('SIGINT', onInt);
    signal = ac.signal;
  }
  try {
    return await runBatch(args.inputs, flags, options, {
      stdout: io.stdout, stderr: io.stderr, stderrIsTTY: io.stderrIsTTY ?? ttyOf(io.stderr), env: io.env ?? process.env,
      signal, inProcess: io.inProcess,
    });
  } finally {
    dispose();
  }
}

/** Read, refit and write one input (the file job, ./fileJob.ts); returns EXIT_OK or EXIT_TOLERANCE. Throws user errors. */
async function refitFile(input: string, flags: CliFlags, options: Partial<Options>, io: Io, paint: Paint, lines: ReportLineSink | null): Promise<number> {
  const name = displayName(input);
  const path = input === STDIO ? null : input;
  const targets: FileTargets = {
    svg: flags.inPlace ? { to: 'in-place', path: input, backup: flags.backup }
      : flags.output !== undefined && flags.output !== STDIO ? { to: 'file', path: flags.output } : { to: 'stdout' },
    report: flags.report,
  };
  const task: FileTask = {
    kind: 'file', id: 0, path, name, outName: targets.svg.to === 'file' ? targets.svg.path : null,
    wantOriginal: await needsBackup(targets),
    // One file: its elements are shared out over the cores (a batch shares out files instead).
    threads: flags.jobs ?? availableParallelism(),
    wantText: flags.preview !== undefined, options,
  };
  const stdin = path === null ? await readInputBytes(null, io.stdin, name, resolveOptions(options).maxInputBytes) : undefined;
  const done = await refitFileTask(task, stdin);
  await writeFileResult(done, targets, io.stdout);
  if (flags.preview !== undefined && done.text !== null) {
    // Loaded only when asked for: the image library's native code takes longer to load than a small file takes to refit.
    const { writePreview } = await import('./previewCommand.js');
    await writePreview(done.text.before, done.text.after, flags.preview, { report: done.report });
  }
  const sizes = { in: done.bytesRead, out: done.out.length };
  for (const line of fileLines(name, done.report, { summary: !flags.quiet, table: flags.table && !flags.quiet, paint, sizes })) io.stderr.write(`${line}\n`);
  await lines?.write(done.report);
  return fileExitCode(done.report);
}
