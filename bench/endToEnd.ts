/**
 * End to end on the 1M-vertex file (./bigfile.ts, 400 closed contours × 2,500
 * vertices, about 19 MB) at 0.05 mm: the arcspline CLI (compiled, `dist/`)
 * against a lines-only pipeline built from general-purpose libraries
 * (./linesOnly.ts: fast-xml-parser + simplify-js + a string writer), each a
 * fresh Node process reading and writing files, run alternately; medians of
 * 3 wall-clock times and their ratio. The baseline is compiled to plain
 * JavaScript first (TypeScript's transpiler) so neither side pays a loader.
 * Run: npm run bench or npx tsx bench/endToEnd.ts (after a build: npx tsc).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';
import { bigDrawing } from './bigfile.js';
import { fmt, median } from './stats.js';

const root = fileURLToPath(new URL('..', import.meta.url));

function timeRun(args: string[]): number {
  const t0 = performance.now();
  execFileSync(process.execPath, args, { stdio: 'ignore', maxBuffer: 1 << 26 });
  return performance.now() - t0;
}

/** The printable benchmark block. */
export function benchEndToEnd(runs = 3, tol = 0.05): string {
  const cli = join(root, 'bin', 'arcspline.js');
  if (!existsSync(join(root, 'dist', 'src', 'index.js'))) return 'end to end: not run (build first: npx tsc)';
  const dir = mkdtempSync(join(tmpdir(), 'arcspline-e2e-'));
  // Compiled next to node_modules so its imports resolve.
  const cache = join(root, 'node_modules', '.cache', 'arcspline-bench');
  mkdirSync(cache, { recursive: true });
  const baseline = join(cache, 'linesOnly.mjs');
  const src = readFileSync(join(root, 'bench', 'linesOnly.ts'), 'utf8');
  writeFileSync(baseline, ts.transpileModule(src, { compilerOptions: { module: ts.ModuleKind.ESNext, target: ts.ScriptTarget.ES2022 } }).outputText);
  try {
    const input = join(dir, 'big.svg');
    writeFileSync(input, bigDrawing());
    const ours: number[] = [], theirs: number[] = [];
    const oursOut = join(dir, 'ours.svg'), theirsOut = join(dir, 'lines.svg');
    for (let k = 0; k < runs; k++) {
      ours.push(timeRun([cli, input, '-o', oursOut, '-t', String(tol)]));
      theirs.push(timeRun([baseline, input, theirsOut, String(tol)]));
    }
    const a = median(ours), b = median(theirs);
    const mb = statSync(input).size / 1e6;
    return `end to end, ${fmt(mb, 1)} MB of 1,000,000 vertices at ${tol} mm, fresh processes, median of ${runs}: ` +
      `arcspline CLI ${fmt(a)} ms (${fmt(statSync(oursOut).size / 1e3)} kB out), lines-only fast-xml-parser + simplify-js ${fmt(b)} ms ` +
      `(${fmt(statSync(theirsOut).size / 1e3)} kB out); time ratio ${fmt(a / b, 2)}`;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) console.log(benchEndToEnd());
