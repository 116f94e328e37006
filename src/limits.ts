/**
 * Input-size limits, checked before any parsing, so an oversized file is
 * refused up front with a message that says how to raise the limit rather
 * than running the machine out of memory half way.
 *
 * Peak memory of refitSvg grows roughly linearly with the input, by 4 to
 * 100 bytes per input byte depending on the structure (docs/ROBUSTNESS.md),
 * so the limit is a guard against accidents, not a promise that any file
 * below it fits in memory. The XML reader has its own character cap
 * (XML_LIMITS.maxInputChars in src/svg/xmlSafety.ts, also 256 Mi).
 */
import { SvgInputError } from './svg/errors.js';
import { DEFAULT_OPTIONS } from './options.js';

/** Size caps applied to a whole input. */
export interface InputLimits {
  /** Largest input accepted, bytes (as read from the file, before decoding). */
  maxInputBytes: number;
}

/** Defaults: the library's `maxInputBytes` option (256 MiB), which also sets the XML reader's character cap. */
export const DEFAULT_LIMITS: Readonly<InputLimits> = Object.freeze({
  maxInputBytes: DEFAULT_OPTIONS.maxInputBytes,
});

/** "256 MiB", "1.5 GiB", "900 bytes": for messages. */
export function formatBytes(n: number): string {
  if (n >= 2 ** 30) return `${+(n / 2 ** 30).toFixed(2)} GiB`;
  if (n >= 2 ** 20) return `${+(n / 2 ** 20).toFixed(2)} MiB`;
  if (n >= 2 ** 10) return `${+(n / 2 ** 10).toFixed(2)} KiB`;
  return `${n} bytes`;
}

/**
 * Refuse an input larger than `limits.maxInputBytes`.
 * @param bytes size of the input in bytes (e.g. from `stat`, so nothing needs to be read first)
 * @param limits caps; missing fields take DEFAULT_LIMITS (with `??`, so 0 is a real limit)
 * @param name names the input in the message (a file name), or null
 * @throws SvgInputError with a one-line message naming the size, the limit and how to raise it
 * @throws RangeError when `bytes` or the limit is not a non-negative number
 */
export function checkInputSize(bytes: number, limits: Partial<InputLimits> = {}, name: string | null = null): void {
  const max = limits.maxInputBytes ?? DEFAULT_LIMITS.maxInputBytes;
  if (!(bytes >= 0) || !Number.isFinite(bytes)) throw new RangeError(`input size must be a non-negative number of bytes, got ${bytes}`);
  if (!(max >= 0)) throw new RangeError(`maxInputBytes must be a non-negative number, got ${max}`);
  if (bytes > max) {
    throw new SvgInputError(
      `${name === null ? 'input' : name} is too large: ${formatBytes(bytes)} (${bytes} bytes), limit ${formatBytes(max)}; ` +
      `raise it with the maxInputBytes limit if the machine has the memory (up to about ${MEMORY_PER_INPUT_BYTE} bytes of memory per input byte were measured)`,
    );
  }
}

/**
 * Worst measured growth of resident memory of refitSvg per byte of input,
 * rounded up (docs/ROBUSTNESS.md: a million tiny subpaths in 12 MB took
 * +1.1 GB; ordinary curve and line files took 4 to 16 bytes per byte).
 */
export const MEMORY_PER_INPUT_BYTE = 100;
