/**
 * A length written with a space before its unit (`-t 0.1 mm`) would reach
 * commander as a length in mm and an input file called `mm`, giving two
 * misleading errors; this check, run on the raw arguments before parsing,
 * gives one line saying how to write it. A file or directory that really has
 * such a name (an input directory `in`) is left alone.
 */
import { existsSync } from 'node:fs';
import { DECIMAL } from './args.js';
import { UsageError } from './exitCodes.js';

/** The units a length flag takes (parseToleranceText's, CSS Values 3 §5.2). */
export const LENGTH_UNITS: readonly string[] = Object.freeze(['mm', 'cm', 'in', 'pt', 'pc', 'px', 'q']);

/** The flags that take a length, in every spelling. */
const LENGTH_FLAGS = /^(-t|--tolerance|--unitless-size)(=.*|.*)?$/;

/**
 * Refuse a length written with a space before its unit (`-t 0.1 mm`), which
 * commander would read as a length in mm and a file called `mm`.
 * @throws UsageError naming the flag and how to write it
 */
export function checkSpacedUnits(argv: readonly string[]): void {
  for (let i = 0; i < argv.length; i++) {
    if (argv[i] === '--') return;
    const m = LENGTH_FLAGS.exec(argv[i]);
    if (!m) continue;
    const flag = m[1];
    // The value is attached (-t0.1, --tolerance=0.1) or the next argument.
    const attached = m[2] ? m[2].replace(/^=/, '') : null;
    if (flag.startsWith('--') && m[2] && !m[2].startsWith('=')) continue; // another flag such as --tolerances
    const value = attached ?? argv[i + 1];
    const unit = argv[attached === null ? i + 2 : i + 1];
    if (value === undefined || unit === undefined || !DECIMAL.test(value) || !LENGTH_UNITS.includes(unit.toLowerCase())) continue;
    // A file or directory of that name (an input directory called `in`) is taken as written.
    if (existsSync(unit)) continue;
    throw new UsageError(`${flag} ${value.trim()} ${unit}: write the number and its unit together, as ${flag} ${value.trim()}${unit}`);
  }
}
