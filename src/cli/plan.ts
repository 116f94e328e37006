/**
 * Where each file of a batch is written, decided before any file is read, and
 * the refusals that keep a batch from writing over its own inputs:
 *
 * - with `-o DIR`, each file goes to `DIR/<rel>` (./inputs.ts), so the output
 *   mirrors the input tree; two files mapping to one output path are refused;
 * - an output path that is an input file (same path, link or inode) is
 *   refused, and so is any input lying inside the output directory (a second
 *   run would refit its own output), unless `--in-place` is given, where each
 *   file is its own output by request;
 * - the report-lines file must be neither an input nor an output.
 */
import { realpath, stat } from 'node:fs/promises';
import { dirname, join, resolve, sep } from 'node:path';
import { UsageError } from './exitCodes.js';
import { sameFile } from './io.js';
import type { InputFile } from './inputs.js';

/** One file of a batch and where its result goes. */
export interface Job {
  file: InputFile;
  /** The output file (the input itself in place). */
  out: string;
}

/** What planning needs from the command line. */
export interface PlanFlags {
  /** The output directory (`-o`), or undefined with `--in-place`. */
  output?: string;
  inPlace: boolean;
  /** `--report-lines` target, `-` for standard output. */
  reportLines?: string;
  /** Machine output: the outputs' extension (`.gcode`, `.dxf`) in place of `.svg`/`.svgz`. */
  outExtension?: string;
}

/** The real path of `p`, or of its nearest existing ancestor with the rest joined on (for paths not yet created). */
async function realish(p: string): Promise<string> {
  const abs = resolve(p);
  try {
    return await realpath(abs);
  } catch {
    const parent = dirname(abs);
    if (parent === abs) return abs;
    return join(await realish(parent), abs.slice(parent.length + (parent.endsWith(sep) ? 0 : 1)));
  }
}

const inside = (child: string, dir: string): boolean => child === dir || child.startsWith(dir.endsWith(sep) ? dir : dir + sep);

/**
 * The jobs of a batch, with every refusal checked.
 * @throws UsageError naming the files and the reason, before anything is written
 */
export async function planJobs(files: readonly InputFile[], flags: PlanFlags): Promise<Job[]> {
  const realIn = await Promise.all(files.map((f) => realish(f.path)));
  let jobs: Job[];
  if (flags.inPlace) {
    jobs = files.map((file) => ({ file, out: file.path }));
  } else {
    const dir = flags.output;
    if (dir === undefined || dir === '-') {
      throw new UsageError('a batch (a directory, a pattern or several files) needs -o DIR, the output directory, or --in-place');
    }
    const st = await stat(dir).catch(() => null);
    if (st !== null && !st.isDirectory()) {
      throw new UsageError(`-o ${dir} is a file; a batch needs an output directory (or refit one file at a time)`);
    }
    if (st === null && /\.svgz?$/i.test(dir)) {
      throw new UsageError(`-o ${dir} looks like a file name; a batch of ${files.length} files needs an output directory (or refit one file at a time)`);
    }
    const realDir = await realish(dir);
    const ext = flags.outExtension;
    const outRel = (rel: string): string => (ext === undefined ? rel : rel.replace(/\.svgz?$/i, '') + ext);
    jobs = files.map((file) => ({ file, out: join(dir, ...outRel(file.rel).split('/')) }));
    const byOut = new Map<string, InputFile>();
    for (const j of jobs) {
      const key = resolve(j.out);
      const other = byOut.get(key);
      if (other) throw new UsageError(`${other.path} and ${j.file.path} would both be written to ${j.out}; give them separate batches`);
      byOut.set(key, j.file);
    }
    const overwrite = (j: Job, input: string): UsageError =>
      new UsageError(`output ${j.out} would overwrite the input ${input}; choose an output directory outside the inputs, or give --in-place`);
    const realOut = jobs.map((j) => join(realDir, ...outRel(j.file.rel).split('/')));
    // Most telling first: a file written over itself (output directory = input directory).
    for (let i = 0; i < jobs.length; i++) {
      if (realOut[i] === realIn[i] || (await sameFile(jobs[i].out, jobs[i].file.path))) throw overwrite(jobs[i], jobs[i].file.path);
    }
    for (let i = 0; i < jobs.length; i++) {
      if (inside(realIn[i], realDir)) {
        throw new UsageError(`input ${jobs[i].file.path} is inside the output directory ${dir}; choose an output directory outside the inputs, or give --in-place`);
      }
    }
    const byReal = new Map(realIn.map((r, i) => [r, files[i].path]));
    for (let i = 0; i < jobs.length; i++) {
      const other = byReal.get(realOut[i]);
      if (other !== undefined) throw overwrite(jobs[i], other);
    }
  }
  const rl = flags.reportLines;
  if (rl !== undefined && rl !== '-') {
    const realRl = await realish(rl);
    for (let i = 0; i < jobs.length; i++) {
      if (realRl === realIn[i] || realRl === (await realish(jobs[i].out))) {
        throw new UsageError(`--report-lines ${rl} is one of the batch's files (${jobs[i].file.path}); choose another path`);
      }
    }
  }
  return jobs;
}
