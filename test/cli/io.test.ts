import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { chmodSync, existsSync, linkSync, mkdirSync, readFileSync, readdirSync, statSync, symlinkSync, writeFileSync, lstatSync } from 'node:fs';
import { join } from 'node:path';
import { execFileSync } from 'node:child_process';
import { Readable, Writable } from 'node:stream';
import { UsageError } from '../../src/cli/exitCodes.js';
import { decodeSvgBytes, readInputBytes, sameFile, stageFile, writeFileAtomic, writeToStream } from '../../src/cli/io.js';
import { scratch } from './helpers.js';

let dir = '';
let cleanup = (): void => undefined;
beforeEach(() => ({ dir, cleanup } = scratch()));
afterEach(() => cleanup());

describe('stageFile / writeFileAtomic', () => {
  it('changes nothing at the target until commit, and leaves only the target after it', async () => {
    const target = join(dir, 'out.svg');
    writeFileSync(target, 'old');
    const s = await stageFile(target, 'new');
    expect(readFileSync(target, 'utf8')).toBe('old');
    expect(readFileSync(s.tempPath, 'utf8')).toBe('new');
    expect(s.tempPath.startsWith(join(dir, '.arcspline-'))).toBe(true); // same directory: rename is atomic
    await s.commit();
    await s.abort(); // after commit: a no-op
    expect(readFileSync(target, 'utf8')).toBe('new');
    expect(readdirSync(dir)).toEqual(['out.svg']);
  });

  it('abort removes the temporary file and creates no target', async () => {
    const s = await stageFile(join(dir, 'never.svg'), 'x');
    await s.abort();
    await s.abort();
    expect(readdirSync(dir)).toEqual([]);
  });

  it('keeps the permission bits of a file it replaces', async () => {
    const target = join(dir, 'p.svg');
    writeFileSync(target, 'old');
    chmodSync(target, 0o604);
    await writeFileAtomic(target, 'new');
    expect(statSync(target).mode & 0o777).toBe(0o604);
  });

  it('follows a symbolic link, so the link survives and its target gets the text', async () => {
    writeFileSync(join(dir, 'real.svg'), 'old');
    symlinkSync(join(dir, 'real.svg'), join(dir, 'link.svg'));
    await writeFileAtomic(join(dir, 'link.svg'), 'new');
    expect(lstatSync(join(dir, 'link.svg')).isSymbolicLink()).toBe(true);
    expect(readFileSync(join(dir, 'real.svg'), 'utf8')).toBe('new');
  });

  it('refuses a directory and a missing directory with a UsageError naming the path', async () => {
    mkdirSync(join(dir, 'sub'));
    await expect(writeFileAtomic(join(dir, 'sub'), 'x')).rejects.toThrow(new UsageError(`cannot write ${join(dir, 'sub')}: is a directory`));
    const missing = join(dir, 'nope', 'x.svg');
    await expect(writeFileAtomic(missing, 'x')).rejects.toThrow(`cannot write ${missing}: no such file or directory`);
    expect(readdirSync(dir)).toEqual(['sub']);
  });
});

describe('a target that is not a regular file', () => {
  // A character device of our own (1,3 is the null device on Linux, devices.txt of the kernel docs): only root
  // may make one, so the test runs where that is possible (CI runs as root) and says so where it is not.
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0 && process.platform === 'linux';
  it.runIf(isRoot)('is written into, not replaced by a renamed file (-o /dev/null must leave the device a device)', async () => {
    const dev = join(dir, 'null');
    execFileSync('mknod', [dev, 'c', '1', '3']);
    await writeFileAtomic(dev, 'refitted');
    expect(lstatSync(dev).isCharacterDevice()).toBe(true);
    expect(readdirSync(dir).filter((f) => f.startsWith('.arcspline-'))).toEqual([]);
  });
});

describe('reading input', () => {
  it('reads a file or a stream as bytes', async () => {
    writeFileSync(join(dir, 'a.svg'), 'abc');
    expect(Buffer.from(await readInputBytes(join(dir, 'a.svg'), Readable.from([]), 'a')).toString()).toBe('abc');
    expect(Buffer.from(await readInputBytes(null, Readable.from([Buffer.from('x'), Buffer.from('yz')]), '-')).toString()).toBe('xyz');
    await expect(readInputBytes(dir, Readable.from([]), dir)).rejects.toThrow(`cannot read ${dir}: is a directory`);
  });

  it('decodes UTF-8 and UTF-16 (XML 1.0 §4.3.3, App. F), keeps a BOM, and refuses invalid bytes naming the file', () => {
    expect(decodeSvgBytes(Buffer.from('\ufeff<svg/>', 'utf8'), 'f')).toBe('\ufeff<svg/>');
    expect(decodeSvgBytes(Buffer.from('<svg>é</svg>', 'utf8'), 'f')).toBe('<svg>é</svg>');
    expect(decodeSvgBytes(Buffer.from('\ufeff<svg/>', 'utf16le'), 'f.svg')).toBe('\ufeff<svg/>');
    expect(() => decodeSvgBytes(Buffer.from([0x3c, 0xff, 0x3e]), 'f.svg')).toThrow(/^f\.svg: not valid UTF-8/);
  });

  it('sameFile sees hard links and is false for a missing path', async () => {
    writeFileSync(join(dir, 'a'), 'x');
    linkSync(join(dir, 'a'), join(dir, 'b'));
    writeFileSync(join(dir, 'c'), 'x');
    expect(await sameFile(join(dir, 'a'), join(dir, 'b'))).toBe(true);
    expect(await sameFile(join(dir, 'a'), join(dir, 'c'))).toBe(false);
    expect(await sameFile(join(dir, 'a'), join(dir, 'missing'))).toBe(false);
    expect(existsSync(join(dir, 'missing'))).toBe(false);
  });
});

describe('writeToStream', () => {
  it('rejects on a broken pipe instead of leaving an unhandled error event', async () => {
    const broken = new Writable({
      write(_c, _e, cb) {
        cb(Object.assign(new Error('write EPIPE'), { code: 'EPIPE' }));
      },
    });
    await expect(writeToStream(broken, 'x')).rejects.toThrow('EPIPE');
    await new Promise((r) => setTimeout(r, 10)); // the stream's own 'error' event has fired by now, handled
    const chunks: string[] = [];
    const ok = new Writable({ write(c, _e, cb) { chunks.push(String(c)); cb(); } });
    await writeToStream(ok, 'abc');
    expect(chunks).toEqual(['abc']);
  });
});
