/**
 * Expanding the command's inputs into a list of files: named files as they
 * are, directories walked recursively for `*.svg` and `*.svgz`, and glob patterns.
 *
 * Every file carries `rel`, its path below the root it was found under (a
 * directory input, a pattern's fixed leading directories, or the named file's
 * own directory), so a batch can mirror the input tree under an output
 * directory.
 *
 * Glob patterns are matched here, not by a package: Node 20 has no stable
 * `fs.promises.glob` (it arrives in Node 22) and no general-purpose glob
 * package is among our dependencies. Supported, as in POSIX shells and most
 * glob libraries (common practice): `*` any run of characters within one path
 * segment, `?` one character, `**` as a whole segment any number of
 * directories (zero included). Not supported: `[...]`, `{a,b}`, `!`. A `*`
 * does not match a leading dot, and hidden entries are skipped in walks.
 *
 * Decisions: directory walks do not follow symbolic links to directories (no
 * cycles), but do take symbolic links to files; files are listed in code-point
 * order of `rel` for a stable order; a file reached twice is listed once.
 */
import { readdir, realpath, stat } from 'node:fs/promises';
import { dirname, join, resolve, sep } from 'node:path';
import { fsReason } from './io.js';

/** One file of a batch. */
export interface InputFile {
  /** The path to read, as given or as joined from a directory input (relative paths stay relative). */
  path: string;
  /** Path below its root with `/` separators, e.g. `parts/a.svg`: where it goes under an output directory. */
  rel: string;
  /** The root `rel` is relative to (a directory input, a pattern's base, or the file's own directory). */
  root: string;
  /** Size in bytes at expansion time. */
  size: number;
}

/** The result of {@link expandInputs}. */
export interface InputList {
  files: InputFile[];
  /** Files found in directories or by patterns that are not `*.svg` and were skipped. */
  ignored: number;
  /** Real paths of the directory inputs and pattern bases (for the overwrite checks). */
  roots: string[];
  /** One line per input or directory that could not be read, or pattern that matched nothing (the rest go on). */
  problems: string[];
}

const GLOB_CHARS = /[*?]/;

/** Whether an input is a glob pattern (contains `*` or `?`). */
export function isGlobPattern(input: string): boolean {
  return GLOB_CHARS.test(input);
}

/** Whether a file name counts as SVG in a directory walk (`.svg`, or gzipped `.svgz`; any case). */
export function isSvgName(name: string): boolean {
  return /\.svgz?$/i.test(name);
}

function escapeRe(s: string): string {
  return s.replace(/[.+^${}()|[\]\\/]/g, '\\$&');
}

/**
 * A regular expression for a glob pattern over `/`-separated relative paths
 * (see the module header for the syntax).
 */
export function globToRegExp(pattern: string): RegExp {
  const segs = pattern.split('/').filter((s) => s !== '' && s !== '.');
  let re = '^';
  for (let i = 0; i < segs.length; i++) {
    const s = segs[i];
    const last = i === segs.length - 1;
    if (s === '**') {
      // Zero or more whole non-hidden directories (or, last, any non-hidden path).
      re += last ? '(?:[^/.][^/]*(?:/[^/.][^/]*)*)?' : '(?:[^/.][^/]*/)*';
      continue;
    }
    let seg = '';
    for (let k = 0; k < s.length; k++) {
      const c = s[k];
      if (c === '*') seg += '[^/]*';
      else if (c === '?') seg += '[^/]';
      else seg += escapeRe(c);
    }
    // A wildcard at the start of a segment does not match a leading dot.
    if (s[0] === '*' || s[0] === '?') seg = `(?!\\.)${seg}`;
    re += seg + (last ? '' : '/');
  }
  return new RegExp(`${re}$`);
}

/** Split a pattern into its fixed leading directories and the wildcard rest. */
export function splitPattern(pattern: string): { base: string; rest: string } {
  const norm = pattern.split(sep).join('/');
  const segs = norm.split('/');
  let k = 0;
  while (k < segs.length - 1 && !GLOB_CHARS.test(segs[k])) k++;
  const baseSegs = segs.slice(0, k);
  const base = baseSegs.length === 0 ? '.' : baseSegs.join('/') || '/';
  return { base, rest: segs.slice(k).join('/') };
}

const byRel = (a: { rel: string }, b: { rel: string }): number => (a.rel < b.rel ? -1 : a.rel > b.rel ? 1 : 0);

interface Walked {
  path: string;
  rel: string;
  size: number;
}

/** All non-hidden files below `dir` (recursively unless `deep` is false), with `/`-separated rel paths. */
async function walk(dir: string, deep: boolean, problems: string[], prefix = ''): Promise<Walked[]> {
  let entries;
  try {
    entries = await readdir(dir, { withFileTypes: true });
  } catch (e) {
    const reason = fsReason(e);
    if (reason === null) throw e;
    problems.push(`cannot read directory ${dir}: ${reason}`);
    return [];
  }
  const out: Walked[] = [];
  for (const d of entries) {
    if (d.name.startsWith('.')) continue;
    const path = join(dir, d.name);
    const rel = prefix + d.name;
    if (d.isDirectory()) {
      if (deep) out.push(...(await walk(path, deep, problems, `${rel}/`)));
    } else if (d.isFile()) {
      out.push({ path, rel, size: (await stat(path)).size });
    } else if (d.isSymbolicLink()) {
      // Links to files count; links to directories are not followed (no cycles).
      const st = await stat(path).catch(() => null);
      if (st?.isFile()) out.push({ path, rel, size: st.size });
    }
  }
  return out;
}

/**
 * Expand inputs (files, directories, glob patterns) into the files of a batch.
 * An input that does not exist or cannot be read, or a pattern that matches
 * no file, is listed in `problems` and the others are still expanded (a
 * pattern matching only non-SVG files is not a problem).
 */
export async function expandInputs(inputs: readonly string[]): Promise<InputList> {
  const files: InputFile[] = [];
  const seen = new Set<string>();
  const roots: string[] = [];
  const problems: string[] = [];
  let ignored = 0;
  const add = async (f: InputFile): Promise<void> => {
    const key = await realpath(f.path).catch(() => resolve(f.path));
    if (seen.has(key)) return;
    seen.add(key);
    files.push(f);
  };
  for (const input of inputs) {
    const st = await stat(input).catch((e: unknown) => e as NodeJS.ErrnoException);
    if (st instanceof Error) {
      // A file whose name really contains * or ? is taken as a file (above); otherwise it is a pattern.
      if (!isGlobPattern(input)) {
        problems.push(`cannot read ${input}: ${fsReason(st) ?? st.message}`);
        continue;
      }
      const { base, rest } = splitPattern(input);
      const re = globToRegExp(rest);
      const baseSt = await stat(base).catch(() => null);
      if (!baseSt?.isDirectory()) {
        problems.push(`pattern ${input}: ${base} is not a directory`);
        continue;
      }
      roots.push(await realpath(base));
      const found = (await walk(base, rest.includes('/'), problems)).filter((w) => re.test(w.rel));
      if (found.length === 0) problems.push(`pattern ${input} matches no file`);
      for (const w of found.sort(byRel)) {
        if (isSvgName(w.rel)) await add({ path: w.path, rel: w.rel, root: base, size: w.size });
        else ignored++;
      }
      continue;
    }
    if (st.isDirectory()) {
      roots.push(await realpath(input));
      for (const w of (await walk(input, true, problems)).sort(byRel)) {
        if (isSvgName(w.rel)) await add({ path: w.path, rel: w.rel, root: input, size: w.size });
        else ignored++;
      }
    } else {
      // A file named by the user is taken whatever its extension.
      const parts = input.split(/[\\/]/);
      await add({ path: input, rel: parts[parts.length - 1], root: dirname(input), size: st.size });
    }
  }
  return { files, ignored, roots, problems };
}
