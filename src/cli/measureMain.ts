/**
 * `arcspline measure A.svg B.svg`: the deviation between any two SVG files (an
 * original and any tool's output, or two runs), element by element and as a
 * whole drawing, in millimetres on the machine. Parses its own flags with
 * commander and runs ./compareCommand.ts.
 */
import { Command, CommanderError, InvalidArgumentError } from 'commander';
import { DEFAULT_OPTIONS, OptionError, parseToleranceText } from '../options.js';
import { EXIT_USAGE } from './exitCodes.js';
import { runCompare } from './compareCommand.js';
import { parseMaxInput } from './args.js';
import { choosePaint, PLAIN } from './summary.js';
import type { Io } from './main.js';

function length(text: string): number {
  try {
    return parseToleranceText(text);
  } catch (e) {
    if (e instanceof OptionError) throw new InvalidArgumentError(e.message);
    throw e;
  }
}

/** Run `arcspline measure …` with the arguments after `measure`; returns the exit code. */
export async function measureMain(argv: string[], io: Io): Promise<number> {
  const program = new Command('arcspline measure')
    .description('Measure how far two SVG drawings are apart, in mm on the machine: per element (paired by id, else in document order) and the whole drawing, both directions, with the worst spot.')
    .argument('<a>', 'the first SVG file (for example the original), or - for standard input')
    .argument('<b>', 'the second SVG file (for example a refitted one)')
    .option('-t, --tolerance <length>', `the bound to judge against; mm, cm, in, pt, pc, px or Q (default: ${DEFAULT_OPTIONS.tolerance} mm)`, length)
    .option('--unitless-size <length>', 'size of one user unit when a file states no physical size (default: 1 CSS px = 0.2645833 mm)', length)
    .option('--json', 'print the figures as JSON instead of a table')
    .option('--max-input <MB>', `refuse a file larger than this before reading it (default: ${DEFAULT_OPTIONS.maxInputBytes / 2 ** 20} MB)`, parseMaxInput)
    .addHelpText('after', '\nExit codes: 0 within the tolerance, 1 not within it, 2 usage or input error, 3 internal error.\n')
    .configureOutput({
      writeOut: (t) => void io.stdout.write(t),
      writeErr: (t) => void io.stderr.write(t),
      outputError: (text, write) => write(`arcspline: ${text.replace(/^error: /, '').trimEnd()} (arcspline measure --help shows the usage)\n`),
    })
    .exitOverride();
  try {
    program.parse(argv, { from: 'user' });
  } catch (e) {
    if (e instanceof CommanderError) return e.exitCode === 0 ? 0 : EXIT_USAGE;
    throw e;
  }
  const [a, b] = program.args;
  const o = program.opts<{ tolerance?: number; unitlessSize?: number; json?: boolean; maxInput?: number }>();
  const color = choosePaint(io.stderrIsTTY ?? (io.stdout as { isTTY?: boolean }).isTTY === true, io.env ?? process.env) !== PLAIN;
  return runCompare(a, b, {
    tolerance: o.tolerance ?? DEFAULT_OPTIONS.tolerance,
    assumedMmPerUnit: o.unitlessSize,
    json: o.json === true,
    maxInputBytes: o.maxInput,
    color,
  }, { stdout: io.stdout, stderr: io.stderr, stdin: io.stdin });
}
