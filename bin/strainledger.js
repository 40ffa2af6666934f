#!/usr/bin/env node
// The headless runner. Ships compiled JavaScript (dist/), no TypeScript at run time.
let main;
try {
  ({ main } = await import('../dist/runner/main.js'));
} catch (e) {
  // Only in a clone that was never built (an installed package always holds dist/): say what to do.
  if (e?.code === 'ERR_MODULE_NOT_FOUND' && /^Cannot find module '[^']*dist[\\/]runner[\\/]main\.js'/.test(String(e.message))) {
    process.stderr.write('strainledger: the runner is not built (dist/runner/main.js is missing); in a clone of the repository run `npm run build` first\n');
    process.exit(3);
  }
  // Any other failure to load the runner (a missing or damaged chunk, a Node too old for its syntax):
  // one located line and exit 3 (internal error, docs/runner.md), never a bare stack trace.
  process.stderr.write(`strainledger: internal error (exit 3): could not load the runner: ${await loadFailure(e)}; reinstall strainledger (in a clone: npm run build), and report it if it persists\n`);
  process.exit(3);
}

/** The message of an import failure with the file and line it happened at, when the error gives one. */
async function loadFailure(e) {
  const message = String(e?.message ?? e).split('\n')[0];
  // A syntax error names its file on the first stack line (`file:///…/chunk.js:12`); others in a frame.
  const at = /(file:\/\/[^\s)]+?:\d+(?::\d+)?)/.exec(String(e?.stack ?? ''));
  const where = at ? decodeURI(at[1].replace(/^file:\/\//, '')) : e?.url ? decodeURI(String(e.url).replace(/^file:\/\//, '')) : e instanceof SyntaxError ? await syntaxErrorAt() : '';
  return where && !message.includes(where) ? `${message} (at ${where})` : message;
}

// A reader that stops early (`| head`) closes the pipe: finish quietly, as command-line tools do.
process.stdout.on('error', (e) => { if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0); else throw e; });

process.exitCode = await main(process.argv.slice(2), {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
  isTTY: Boolean(process.stdout.isTTY),
});

/**
 * Node 20 does not say which file of a dynamic import failed to parse: check the runner's files one by
 * one (`node --check`, only on this error path) and return the first one's `file:line`, or ''.
 */
async function syntaxErrorAt() {
  // Loaded here, on the error path only: a normal start-up pays for none of them.
  const [{ spawnSync }, { readdirSync }, { join }, { fileURLToPath }] = await Promise.all([import('node:child_process'), import('node:fs'), import('node:path'), import('node:url')]);
  const dir = fileURLToPath(new URL('../dist/runner/', import.meta.url));
  let files = [];
  try { files = readdirSync(dir, { recursive: true }).filter((f) => f.endsWith('.js')).sort(); } catch { return ''; }
  for (const f of files) {
    const r = spawnSync(process.execPath, ['--check', join(dir, f)], { encoding: 'utf8' });
    if (r.status !== 0) return (/^(\S+:\d+)$/m.exec(r.stderr) ?? [, join(dir, f)])[1];
  }
  return '';
}
