/**
 * The process exit codes of the `arcspline` command, stated once: `--help`
 * prints this table and `main()` returns these values.
 */

/** Every file was refitted within the tolerance (or needed no change). */
export const EXIT_OK = 0;
/** The tolerance could not be met for some element; it was written back unchanged (see the report). */
export const EXIT_TOLERANCE = 1;
/** Usage or input error: bad flag or value, unreadable file, not an SVG document, refused output path. */
export const EXIT_USAGE = 2;
/** Internal error (a bug): the stack is printed only with `--debug`. */
export const EXIT_INTERNAL = 3;

/** Interrupted (SIGINT) in the middle of a batch: 128 + signal 2, the shell convention (common practice). */
export const EXIT_INTERRUPTED = 130;

/** The exit codes with one-line meanings, in order, for `--help`. */
export const EXIT_CODE_DOCS: readonly (readonly [number, string])[] = Object.freeze([
  [EXIT_OK, 'every element refitted within the tolerance, or left as it was'],
  [EXIT_TOLERANCE, 'the tolerance was not met for some element; it was kept unchanged (see the report)'],
  [EXIT_USAGE, 'usage or input error (bad flag or value, unreadable file, not an SVG, refused output path)'],
  [EXIT_INTERNAL, 'internal error (a bug; run again with --debug for the stack)'],
  [EXIT_INTERRUPTED, 'interrupted (Ctrl-C) during a batch; files finished so far are complete, no partial file is left'],
] as const);

/**
 * A mistake of the user or the input (exit code 2). Its message is one line,
 * printed without a stack, and names the file or flag and the reason.
 */
export class UsageError extends Error {
  override name = 'UsageError';
}
