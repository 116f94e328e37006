#!/usr/bin/env node
// The installed command: a shell around main() (src/cli/main.ts), which does all the work.
import { main } from '../dist/src/cli/main.js';

try {
  process.exitCode = await main(process.argv.slice(2));
} catch (e) {
  // main() turns every error into an exit code; this is only a last guard (exit code 3, internal error).
  process.stderr.write(`arcspline: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 3;
}
