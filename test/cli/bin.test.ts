/**
 * End to end: the built command (bin/arcspline.js over dist/) in a child
 * process, in the exact form the acceptance harness uses.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { SaxesParser } from 'saxes';
import { FILE_REPORT_KEYS, TOTALS_KEYS } from './helpers.js';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const BIN = join(ROOT, 'bin', 'arcspline.js');
const BUILT = join(ROOT, 'dist', 'src', 'cli', 'main.js');

beforeAll(() => {
  // dist/ is built once for the whole run by test/globalSetup.ts.
  if (!existsSync(BUILT)) throw new Error(`${BUILT} is missing: the global test setup builds it`);
});

describe('bin/arcspline.js', () => {
  it('INPUT.svg -o OUTPUT.svg --tolerance 0.05mm --report REPORT.json', () => {
    const dir = mkdtempSync(join(tmpdir(), 'arcspline-bin-'));
    try {
      const args = [BIN, join(ROOT, 'samples', 'bracket.svg'), '-o', 'OUTPUT.svg', '--tolerance', '0.05mm', '--report', 'REPORT.json'];
      const r = spawnSync(process.execPath, args, { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
      expect(r.stderr).toMatch(/bracket\.svg: \d+ (?:of \d+ )?commands → \d+ segments .* ≤ 0\.05 mm, /);
      expect(r.status).toBe(0);
      expect(readdirSync(dir).sort()).toEqual(['OUTPUT.svg', 'REPORT.json']);
      // saxes, a general-purpose XML parser, reads the output without error.
      let errors = 0;
      const p = new SaxesParser({ xmlns: true });
      p.on('error', () => errors++);
      p.write(readFileSync(join(dir, 'OUTPUT.svg'), 'utf8')).close();
      expect(errors).toBe(0);
      const report = JSON.parse(readFileSync(join(dir, 'REPORT.json'), 'utf8'));
      expect(Object.keys(report).sort()).toEqual([...FILE_REPORT_KEYS].sort());
      expect(Object.keys(report.totals).sort()).toEqual([...TOTALS_KEYS].sort());
      expect(report.toleranceMm).toBe(0.05);
      expect(report.totals.maxDeviation).toBeLessThanOrEqual(0.05);
      // The exit code reaches the shell: a missing input is 2.
      const bad = spawnSync(process.execPath, [BIN, 'missing.svg', '-o', 'x.svg'], { cwd: dir, encoding: 'utf8' });
      expect(bad.status).toBe(2);
      expect(bad.stderr).toBe('arcspline: cannot read missing.svg: no such file or directory\n');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('a reader that closes the pipe early (--help | head) ends it quietly with exit code 0', async () => {
    // Common practice for shell tools: a closed standard output is no error when only help text was going there.
    const child = spawn(process.execPath, [BIN, '--help'], { stdio: ['ignore', 'pipe', 'pipe'] });
    child.stdout.destroy();
    let stderr = '';
    child.stderr.on('data', (b: Buffer) => void (stderr += b.toString()));
    const code = await new Promise<number | null>((resolve) => child.on('close', resolve));
    expect(stderr).toBe('');
    expect(code).toBe(0);
  });
});
