/**
 * File input and output for the CLI: reading SVG bytes (UTF-8 or UTF-16, maybe gzipped) from a file or a
 * stream, and atomic writes (a temporary file in the same directory, flushed,
 * then renamed over the target), so a reader never sees a partial file and an
 * error leaves no new file behind.
 */
import { readSvgBytes } from '../svg/decode.js';
import { DEFAULT_OPTIONS } from '../options.js';
import { SvgInputError } from '../svg/errors.js';
import { randomBytes } from 'node:crypto';
import { constants as fsc } from 'node:fs';
import { lstat, open, realpath, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import type { Readable, Writable } from 'node:stream';
import { UsageError } from './exitCodes.js';

function tooLarge(name: string, bytes: number, limit: number): never {
  throw new UsageError(`${name}: ${(bytes / 2 ** 20).toFixed(1)} MB is more than the input limit of ${(limit / 2 ** 20).toFixed(1)} MB; raise it with --max-input <MB> if the machine has the memory (plan for about 20x the file size)`);
}

/** Short reasons for the file-system errors a user can cause and fix. */
const FS_REASONS: Readonly<Record<string, string>> = Object.freeze({
  ENOENT: 'no such file or directory',
  EACCES: 'permission denied',
  EPERM: 'operation not permitted',
  EISDIR: 'is a directory',
  ENOTDIR: 'a component of the path is not a directory',
  EROFS: 'read-only file system',
  ENOSPC: 'no space left on device',
  EDQUOT: 'disk quota exceeded',
  EEXIST: 'already exists',
  ELOOP: 'too many symbolic links',
  ENAMETOOLONG: 'file name too long',
  EBUSY: 'resource busy',
  EXDEV: 'temporary file and target are on different file systems',
  EPIPE: 'broken pipe',
});

/** The one-line reason of a file-system error, or null when it is not one a user can fix (an internal error). */
export function fsReason(e: unknown): string | null {
  const code = (e as NodeJS.ErrnoException | null)?.code;
  return code !== undefined && code in FS_REASONS ? FS_REASONS[code] : null;
}

/** `UsageError("<verb> <path>: <reason>")` for a user-fixable file-system error; anything else is rethrown. */
export function asUsageError(e: unknown, verb: string, path: string): never {
  const reason = fsReason(e);
  if (reason !== null) throw new UsageError(`cannot ${verb} ${path}: ${reason}`);
  throw e;
}

/** Read a whole file (or, for `null`, the stream) as bytes, refusing more than `limit` bytes (before reading a file). */
export async function readInputBytes(path: string | null, stdin: Readable, name: string, limit = DEFAULT_OPTIONS.maxInputBytes): Promise<Uint8Array> {
  if (path === null) {
    const parts: Buffer[] = [];
    let n = 0;
    for await (const chunk of stdin) {
      const b = typeof chunk === 'string' ? Buffer.from(chunk) : (chunk as Buffer);
      n += b.length;
      if (n > limit) tooLarge(name, n, limit);
      parts.push(b);
    }
    return Buffer.concat(parts);
  }
  try {
    const st = await stat(path);
    if (st.isDirectory()) throw new UsageError(`cannot read ${path}: is a directory`);
    if (st.size > limit) tooLarge(path, st.size, limit);
    const fh = await open(path, 'r');
    try {
      return await fh.readFile();
    } finally {
      await fh.close();
    }
  } catch (e) {
    if (e instanceof UsageError) throw e;
    return asUsageError(e, 'read', path);
  }
}

/**
 * Decode SVG bytes: UTF-8 (ASCII is a subset), UTF-8 with a BOM, or UTF-16 by
 * its BOM or XML declaration, gzip (`.svgz`) inflated first (src/svg/decode.ts).
 * A byte-order mark is kept in the text, so an unchanged document is written
 * back byte for byte.
 * @param limit largest inflated size of gzip data, bytes
 */
export function decodeSvgBytes(bytes: Uint8Array, name: string, limit = DEFAULT_OPTIONS.maxInputBytes): string {
  try {
    return readSvgBytes(bytes, limit).text;
  } catch (e) {
    if (e instanceof SvgInputError) throw new UsageError(`${name}: ${e.message}`);
    throw e;
  }
}

/** Whether two paths name the same existing file (same device and inode, so links count too). */
export async function sameFile(a: string, b: string): Promise<boolean> {
  try {
    const [sa, sb] = await Promise.all([stat(a), stat(b)]);
    return sa.dev === sb.dev && sa.ino === sb.ino;
  } catch {
    return false;
  }
}

/** Whether a path exists (without following a final symbolic link). */
export async function exists(path: string): Promise<boolean> {
  try {
    await lstat(path);
    return true;
  } catch {
    return false;
  }
}

/** A written, flushed temporary file waiting to replace its target. */
export interface StagedFile {
  /** The file that `commit()` replaces (a symbolic link's target, when the given path was a link). */
  readonly target: string;
  readonly tempPath: string;
  /** Rename the temporary file over the target (atomic on one file system). */
  commit(): Promise<void>;
  /** Remove the temporary file; the target is untouched. Safe to call twice or after commit. */
  abort(): Promise<void>;
}

/**
 * Write `data` to a new temporary file beside `path` and flush it to disk;
 * nothing at `path` changes until `commit()`. An existing target keeps its
 * permission bits; a symbolic link is followed so the link itself survives.
 * @throws UsageError when the directory cannot be written or the target is a directory
 */
export async function stageFile(path: string, data: string | Uint8Array): Promise<StagedFile> {
  let target = path;
  let keepMode: number | null = null;
  try {
    const st = await stat(path);
    if (st.isDirectory()) throw new UsageError(`cannot write ${path}: is a directory`);
    // A device, pipe or socket (/dev/null, a FIFO) is written into, never replaced by a renamed file.
    if (!st.isFile()) return directFile(path, data);
    keepMode = st.mode & 0o7777;
    if ((await lstat(path)).isSymbolicLink()) target = await realpath(path);
  } catch (e) {
    if (e instanceof UsageError) throw e;
    if ((e as NodeJS.ErrnoException).code !== 'ENOENT') asUsageError(e, 'write', path);
  }
  // Same directory as the target, so the rename never crosses file systems; the name matches .gitignore's `.arcspline-*`.
  const tempPath = join(dirname(target), `.arcspline-${basename(target)}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`);
  let fh;
  try {
    // 0o666 less the umask for a new file, as any program would create it.
    fh = await open(tempPath, fsc.O_WRONLY | fsc.O_CREAT | fsc.O_EXCL, 0o666);
  } catch (e) {
    return asUsageError(e, 'write', path);
  }
  try {
    await fh.writeFile(data);
    await fh.sync();
    // An existing file keeps its exact permission bits (the umask would otherwise narrow them).
    if (keepMode !== null) await fh.chmod(keepMode).catch(() => undefined);
  } catch (e) {
    await fh.close().catch(() => undefined);
    await unlink(tempPath).catch(() => undefined);
    return asUsageError(e, 'write', path);
  }
  await fh.close();
  let done = false;
  return {
    target,
    tempPath,
    async commit() {
      try {
        await rename(tempPath, target);
        done = true;
      } catch (e) {
        await unlink(tempPath).catch(() => undefined);
        done = true;
        asUsageError(e, 'write', path);
      }
    },
    async abort() {
      if (done) return;
      done = true;
      await unlink(tempPath).catch(() => undefined);
    },
  };
}

/** A target that is not a regular file: commit writes into it (no temporary file, nothing renamed). */
function directFile(path: string, data: string | Uint8Array): StagedFile {
  let done = false;
  return {
    target: path,
    tempPath: '',
    async commit() {
      if (done) return;
      done = true;
      try {
        await writeFile(path, data);
      } catch (e) {
        asUsageError(e, 'write', path);
      }
    },
    async abort() {
      done = true;
    },
  };
}

/** Write a file atomically: stage, then commit; on any error no temporary file is left. */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const staged = await stageFile(path, data);
  await staged.commit();
}

/**
 * Write text to a stream and wait until it has been handed to the system.
 * A failed write (EPIPE when the reader has gone) rejects instead of becoming
 * an unhandled 'error' event.
 */
export function writeToStream(stream: Writable, text: string | Uint8Array): Promise<void> {
  return new Promise((resolve, reject) => {
    const onError = (err: Error): void => reject(err);
    stream.once('error', onError);
    stream.write(text, (err) => {
      stream.off('error', onError);
      // The stream emits the same error after this callback; keep a listener so it is not unhandled.
      if (err) {
        stream.once('error', () => undefined);
        reject(err);
      } else resolve();
    });
  });
}
