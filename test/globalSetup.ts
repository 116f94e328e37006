/**
 * Builds dist/ once before any test file runs: the end-to-end tests run the
 * built binary and worker threads load compiled modules. One build, so no two
 * test files write dist/ at the same time.
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export default function setup(): void {
  const root = fileURLToPath(new URL('..', import.meta.url));
  execFileSync(process.execPath, [`${root}node_modules/typescript/bin/tsc`, '-p', `${root}tsconfig.json`], { cwd: root, stdio: 'inherit' });
}
