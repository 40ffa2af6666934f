#!/usr/bin/env node
// The headless runner. Ships compiled JavaScript (dist/), no TypeScript at run time.
let main;
try {
  ({ main } = await import('../dist/runner/main.js'));
} catch (e) {
  // Only in a clone that was never built (an installed package always holds dist/): say what to do.
  if (e?.code === 'ERR_MODULE_NOT_FOUND' && String(e.message).includes('dist/runner/main.js')) {
    process.stderr.write('strainledger: the runner is not built (dist/runner/main.js is missing); in a clone of the repository run `npm run build` first\n');
    process.exit(3);
  }
  throw e;
}

// A reader that stops early (`| head`) closes the pipe: finish quietly, as command-line tools do.
process.stdout.on('error', (e) => { if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0); else throw e; });

process.exitCode = await main(process.argv.slice(2), {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
  isTTY: Boolean(process.stdout.isTTY),
});
