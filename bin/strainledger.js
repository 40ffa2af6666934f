#!/usr/bin/env node
// The headless runner. Ships compiled JavaScript (dist/), no TypeScript at run time.
import { main } from '../dist/runner/main.js';

process.exitCode = await main(process.argv.slice(2), {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
  isTTY: Boolean(process.stdout.isTTY),
});
