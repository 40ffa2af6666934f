import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

// A guard on the runner's start-up budget (issue 4: a JSON run at most twice `node -e 0`, measured
// by bench/coldstart.mjs): which bundled code a run reads, not how long it takes (timed tests flake
// on shared machines). A valid JSON plan must not load the YAML package, zod, the record reader, the
// scatter sampler or the chart code; a YAML plan loads the YAML package and an invalid plan loads
// zod for its messages. Modules are seen through a Node module hook (module.register).
const ROOT = join(import.meta.dirname, '..', '..');
const HOOK = `data:text/javascript,${encodeURIComponent(`
import { register } from 'node:module';
register('data:text/javascript,' + encodeURIComponent('export async function load(u, c, next) { if (u.startsWith("file:")) process.stderr.write("LOADED " + u + "\\\\n"); return next(u, c); }'));
`)}`;

/** The packages whose code a run read, from the `// node_modules/NAME/...` markers the bundler leaves in each chunk. */
function packagesRead(...args: string[]): { status: number | null; packages: Set<string> } {
  const r = spawnSync(process.execPath, ['--import', HOOK, join(ROOT, 'bin/strainledger.js'), ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true' } });
  const files = [...r.stderr.matchAll(/^LOADED file:\/\/(.*)$/gm)].map((m) => decodeURIComponent(m[1]!));
  expect(files.some((f) => f.endsWith('dist/runner/main.js')), r.stderr.slice(0, 500)).toBe(true);
  const packages = new Set<string>();
  for (const f of files) for (const m of readFileSync(f, 'utf8').matchAll(/^\/\/ node_modules\/((?:@[^/]+\/)?[^/]+)\//gm)) packages.add(m[1]!);
  return { status: r.status, packages };
}

describe('what a run loads', () => {
  it('a valid JSON plan: none of the YAML package, zod, csv-parse, Plot, linkedom or the progress bar', () => {
    const { status, packages } = packagesRead('run', 'examples/contact-spring-strip.json', '--format', 'json');
    expect(status).toBe(0);
    for (const p of ['yaml', 'zod', 'csv-parse', '@observablehq/plot', 'linkedom', 'cli-progress']) expect(packages.has(p), `${p} was loaded`).toBe(false);
  });
  it('a YAML plan loads the YAML package; an invalid plan loads zod for its messages', () => {
    expect(packagesRead('run', 'examples/bracket-stretch-specimen.yaml', '--format', 'json').packages.has('yaml')).toBe(true);
    const bad = packagesRead('run', 'test/cli/fixtures/startup-invalid.json', '--format', 'json');
    expect(bad.status).toBe(2);
    expect(bad.packages.has('zod')).toBe(true);
  });
});

describe('what `help` loads', () => {
  /** The runner files a command line read (through the same module hook). */
  const filesRead = (...args: string[]) => {
    const r = spawnSync(process.execPath, ['--import', HOOK, join(ROOT, 'bin/strainledger.js'), ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true' } });
    expect(r.status).toBe(0);
    return [...r.stderr.matchAll(/^LOADED file:\/\/(.*)$/gm)].map((m) => decodeURIComponent(m[1]!)).filter((f) => f.includes('/dist/runner/')).sort();
  };
  it('the overview loads no command module: the same files as --version', () => {
    const base = filesRead('--version');
    expect(filesRead('help')).toEqual(base);
    expect(filesRead('--help')).toEqual(base);
  });
  it('help COMMAND loads that command only (fewer files than loading every command)', () => {
    const base = filesRead('--version');
    const one = filesRead('help', 'tolerance-factor');
    expect(one.length).toBeGreaterThan(base.length);
    expect(filesRead('help', 'analyze').length).toBeGreaterThan(base.length);
    expect(one).not.toEqual(filesRead('help', 'analyze'));
  });
});
