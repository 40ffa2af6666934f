#!/usr/bin/env node
// The headless runner. Ships compiled JavaScript (dist/), no TypeScript at run time.
import { main } from '../dist/runner/main.js';

// A reader that stops early (`| head`) closes the pipe: finish quietly, as command-line tools do.
process.stdout.on('error', (e) => { if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0); else throw e; });

process.exitCode = await main(process.argv.slice(2), {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
  isTTY: Boolean(process.stdout.isTTY),
});
