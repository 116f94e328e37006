/**
 * SVG file bytes → the document string the reader takes.
 *
 * Encoding detection follows XML 1.0 Appendix F.1 (autodetection without
 * external information), reduced to what SVG files use: a byte-order mark
 * for UTF-8, UTF-16 LE or UTF-16 BE; for UTF-16 without a mark, the first
 * characters `<?` seen as `3C 00 3F 00` (LE) or `00 3C 00 3F` (BE); otherwise
 * UTF-8 (the XML default, §4.3.3), unless the XML declaration names another
 * encoding, which is refused with a clear message (no guessing: a wrong guess
 * would corrupt text silently).
 *
 * A gzip stream (an `.svgz` file) is inflated first by {@link readSvgBytes},
 * which also reports the form (encoding, gzip) for writing back alike.
 *
 * The byte-order mark is kept in the string as U+FEFF (saxes skips it and the
 * reader's offsets count it), so an unchanged UTF-8 document is written back
 * byte for byte.
 */
import { gunzipSync, gzipSync } from 'node:zlib';
import { DEFAULT_OPTIONS } from '../options.js';
import { SvgInputError } from './errors.js';

/** What {@link detectSvgEncoding} found. */
export interface DetectedEncoding {
  encoding: 'utf-8' | 'utf-16le' | 'utf-16be';
  /** Length of the byte-order mark, bytes (0 when there is none). */
  bomBytes: number;
}

const DECL_ENCODING = /^\s*<\?xml\s[^>]*?\bencoding\s*=\s*(["'])([A-Za-z][A-Za-z0-9._-]*)\1/;

/**
 * Find the encoding of SVG bytes (BOM first, then the `<?` pattern, then UTF-8).
 * @throws SvgInputError when the XML declaration names an encoding other than UTF-8, UTF-16 or US-ASCII
 */
export function detectSvgEncoding(buf: Uint8Array): DetectedEncoding {
  const b0 = buf[0], b1 = buf[1], b2 = buf[2], b3 = buf[3];
  if (b0 === 0xef && b1 === 0xbb && b2 === 0xbf) return { encoding: 'utf-8', bomBytes: 3 };
  if (b0 === 0xff && b1 === 0xfe) return { encoding: 'utf-16le', bomBytes: 2 };
  if (b0 === 0xfe && b1 === 0xff) return { encoding: 'utf-16be', bomBytes: 2 };
  // XML 1.0 F.1: "<?" in UTF-16 without a byte-order mark.
  if (b0 === 0x3c && b1 === 0x00 && b2 === 0x3f && b3 === 0x00) return { encoding: 'utf-16le', bomBytes: 0 };
  if (b0 === 0x00 && b1 === 0x3c && b2 === 0x00 && b3 === 0x3f) return { encoding: 'utf-16be', bomBytes: 0 };
  // The declaration is ASCII in every ASCII-compatible encoding; 200 bytes covers any real one.
  const head = Buffer.from(buf.buffer, buf.byteOffset, Math.min(buf.length, 200)).toString('latin1');
  const m = DECL_ENCODING.exec(head);
  if (m) {
    const name = m[2].toLowerCase();
    if (name !== 'utf-8' && name !== 'utf8' && name !== 'us-ascii' && name !== 'ascii') {
      throw new SvgInputError(
        `the file declares encoding="${m[2]}", which arcspline does not decode; save it as UTF-8 (or UTF-16) and try again`,
      );
    }
  }
  return { encoding: 'utf-8', bomBytes: 0 };
}

/**
 * Decode SVG file bytes into a string (UTF-8 by default; UTF-16 LE/BE by BOM
 * or by the `<?xml` pattern). A BOM is kept as U+FEFF at the start.
 * @throws SvgInputError for bytes that are not valid in the detected encoding, or a declared encoding we cannot decode
 */
export function decodeSvgBytes(buf: Uint8Array): string {
  const { encoding } = detectSvgEncoding(buf);
  if (encoding !== 'utf-8' && buf.length % 2 !== 0) {
    throw new SvgInputError(`not valid ${encoding.toUpperCase()} text: odd number of bytes (${buf.length})`);
  }
  try {
    // ignoreBOM: true keeps the mark in the output (byte-identical round trip).
    return new TextDecoder(encoding, { fatal: true, ignoreBOM: true }).decode(buf);
  } catch {
    throw new SvgInputError(`not valid ${encoding.toUpperCase()} text (binary data, or another encoding); arcspline reads UTF-8 or UTF-16 SVG files`);
  }
}


/** How a document's bytes were stored: the text encoding, and whether gzip wrapped them (`.svgz`). */
export interface SvgByteForm {
  encoding: DetectedEncoding['encoding'];
  /** The bytes were a gzip stream (RFC 1952), as in `.svgz` files. */
  gzip: boolean;
}

/** Whether bytes start with the gzip magic number 1F 8B (RFC 1952 §2.3.1). */
export function isGzip(buf: Uint8Array): boolean {
  return buf.length >= 2 && buf[0] === 0x1f && buf[1] === 0x8b;
}

/**
 * Decode SVG file bytes and say how they were stored, so the result can be
 * written back the same way ({@link encodeSvgText}). Gzip is inflated first
 * (node:zlib, part of Node, no native add-on), refusing more than `maxBytes`
 * inflated bytes, so a small compressed file cannot fill the memory.
 * @param maxBytes largest inflated size accepted, bytes (default: the library's maxInputBytes)
 * @throws SvgInputError for a broken gzip stream, an inflated size over `maxBytes`, or bytes {@link decodeSvgBytes} refuses
 */
export function readSvgBytes(buf: Uint8Array, maxBytes: number = DEFAULT_OPTIONS.maxInputBytes): { text: string; form: SvgByteForm } {
  let bytes = buf;
  const gzip = isGzip(buf);
  if (gzip) {
    try {
      bytes = gunzipSync(buf, { maxOutputLength: maxBytes });
    } catch (e) {
      if ((e as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') {
        throw new SvgInputError(`the gzip data inflates to more than the input limit of ${(maxBytes / 2 ** 20).toFixed(1)} MB; raise it with --max-input <MB> if the machine has the memory`);
      }
      throw new SvgInputError(`not a readable gzip stream (${(e as Error).message})`);
    }
  }
  const text = decodeSvgBytes(bytes);
  return { text, form: { encoding: detectSvgEncoding(bytes).encoding, gzip } };
}

/**
 * The inverse of {@link readSvgBytes}: text (with any byte-order mark it kept)
 * in the given encoding, gzipped when the form says so.
 */
export function encodeSvgText(text: string, form: SvgByteForm): Uint8Array {
  let out: Buffer;
  if (form.encoding === 'utf-8') out = Buffer.from(text, 'utf8');
  else {
    out = Buffer.from(text, 'utf16le');
    if (form.encoding === 'utf-16be') out.swap16();
  }
  return form.gzip ? gzipSync(out) : out;
}
