#!/usr/bin/env node
// The installed command: a shell around main() (src/cli/main.ts), which does all the work.
import { main } from '../dist/src/cli/main.js';

// A reader that stops early (`arcspline --help | head`) closes the pipe. The writes that matter see the
// error themselves (a refit written to a closed pipe still ends with exit code 2); the rest need not crash.
process.stdout.on('error', (e) => {
  if (e.code !== 'EPIPE') throw e;
});

try {
  process.exitCode = await main(process.argv.slice(2));
} catch (e) {
  // main() turns every error into an exit code; this is only a last guard (exit code 3, internal error).
  process.stderr.write(`arcspline: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 3;
}
