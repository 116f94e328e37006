/**
 * The published declaration files: a caller's project must not need Node's
 * own types (@types/node) to compile against `import 'arcspline'`. The .d.ts
 * files reachable from the entry are emitted in memory with the TypeScript
 * compiler and searched for Node-only names.
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { dirname, join, normalize } from 'node:path';
import ts from 'typescript';

const ROOT = fileURLToPath(new URL('..', import.meta.url));

/** Emitted .d.ts text by normalised output path. */
function emitDeclarations(): Map<string, string> {
  const out = new Map<string, string>();
  const program = ts.createProgram([join(ROOT, 'src/index.ts')], {
    target: ts.ScriptTarget.ES2022, module: ts.ModuleKind.NodeNext, moduleResolution: ts.ModuleResolutionKind.NodeNext,
    strict: true, declaration: true, emitDeclarationOnly: true, skipLibCheck: true, types: ['node'], noCheck: true,
    rootDir: ROOT, outDir: join(ROOT, 'dist'),
  });
  program.emit(undefined, (name, text) => out.set(normalize(name), text));
  return out;
}

describe('declaration files', () => {
  it('reachable from the entry, they name no Node-only type (Buffer, NodeJS.*, node: modules)', () => {
    const files = emitDeclarations();
    const start = normalize(join(ROOT, 'dist/src/index.d.ts'));
    expect(files.has(start), [...files.keys()].slice(0, 3).join(', ')).toBe(true);
    const seen = new Set<string>();
    const queue = [start];
    const offenders: string[] = [];
    while (queue.length > 0) {
      const f = queue.pop()!;
      if (seen.has(f)) continue;
      seen.add(f);
      // Comments may mention node: modules in examples; only code counts.
      const code = (files.get(f) ?? '').replace(/\/\*[\s\S]*?\*\//g, '').replace(/\/\/.*$/gm, '');
      for (const m of code.matchAll(/\bfrom\s+['"](\.[^'"]+)\.js['"]/g)) queue.push(normalize(join(dirname(f), `${m[1]}.d.ts`)));
      for (const m of code.matchAll(/\bimport\(['"](\.[^'"]+)\.js['"]\)/g)) queue.push(normalize(join(dirname(f), `${m[1]}.d.ts`)));
      const bad = code.match(/\bBuffer\b|\bNodeJS\.|['"]node:[a-z/_]+['"]/g);
      if (bad) offenders.push(`${f.slice(ROOT.length)}: ${[...new Set(bad)].join(', ')}`);
    }
    expect(seen.size).toBeGreaterThan(10);
    expect(offenders).toEqual([]);
  }, 60_000);
});
