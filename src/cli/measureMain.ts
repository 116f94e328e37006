/**
 * `arcspline measure A.svg B.svg`: the deviation between any two SVG files (an
 * original and any tool's output, or two runs), element by element and as a
 * whole drawing, in millimetres on the machine. The subcommand and its flags
 * are declared with the program (./args.ts); this runs ./compareCommand.ts.
 */
import { DEFAULT_OPTIONS, checkTolerance } from '../options.js';
import { runCompare } from './compareCommand.js';
import type { MeasureArgs } from './args.js';
import { choosePaint, PLAIN } from './summary.js';
import type { Io } from './main.js';

/** Run `arcspline measure …` with its parsed values; returns the exit code. */
export async function measureMain(m: MeasureArgs, io: Io): Promise<number> {
  const color = choosePaint(io.stderrIsTTY ?? (io.stdout as { isTTY?: boolean }).isTTY === true, io.env ?? process.env) !== PLAIN;
  const tolerance = m.tolerance ?? DEFAULT_OPTIONS.tolerance;
  checkTolerance(tolerance);
  return runCompare(m.a, m.b, {
    tolerance,
    assumedMmPerUnit: m.assumedMmPerUnit,
    json: m.json,
    maxInputBytes: m.maxInputBytes,
    color,
  }, { stdout: io.stdout, stderr: io.stderr, stdin: io.stdin });
}
