// bin/strainledger.js when the runner cannot be loaded: one located line on stderr and the documented
// exit code (3, internal error; docs/runner.md "Exit codes"), never Node's own exit 1 with a stack.
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '..', '..');
const TMP = mkdtempSync(join(tmpdir(), 'sl-bin-'));
afterAll(() => rmSync(TMP, { recursive: true, force: true }));

/** A package folder holding the real bin/ and a runner made of the given files (none: not built). */
function pkg(name: string, files: Record<string, string>): string {
  const dir = join(TMP, name);
  mkdirSync(join(dir, 'bin'), { recursive: true });
  copyFileSync(join(ROOT, 'bin', 'strainledger.js'), join(dir, 'bin', 'strainledger.js'));
  writeFileSync(join(dir, 'package.json'), '{ "type": "module" }\n');
  for (const [f, text] of Object.entries(files)) {
    mkdirSync(join(dir, 'dist', 'runner'), { recursive: true });
    writeFileSync(join(dir, 'dist', 'runner', f), text);
  }
  return dir;
}
const run = (dir: string) => spawnSync(process.execPath, [join(dir, 'bin', 'strainledger.js'), 'run', 'plan.json'], { encoding: 'utf8' });

describe('bin/strainledger.js when the runner does not load', () => {
  it('a runner never built: says to build, exit 3', () => {
    const r = run(pkg('unbuilt', {}));
    expect(r.status).toBe(3);
    expect(r.stderr).toBe('strainledger: the runner is not built (dist/runner/main.js is missing); in a clone of the repository run `npm run build` first\n');
  });
  it('a chunk missing (main.js present): names the missing file, not "not built"; exit 3', () => {
    const dir = pkg('missing-chunk', { 'main.js': 'import "./chunk-a.js";\nexport async function main() { return 0; }\n' });
    const r = run(dir);
    expect(r.status).toBe(3);
    expect(r.stderr).toMatch(/^strainledger: internal error \(exit 3\): could not load the runner: Cannot find module '[^']*chunk-a\.js'/);
    expect(r.stderr.split('\n').filter(Boolean)).toHaveLength(1);
  });
  it('a chunk that does not parse: names the file and line, exit 3, no stack', () => {
    const dir = pkg('bad-syntax', { 'main.js': 'import "./chunk-b.js";\nexport async function main() { return 0; }\n', 'chunk-b.js': 'export const x = 1;\nexport function f( {\n' });
    const r = run(dir);
    expect(r.status).toBe(3);
    expect(r.stderr).toMatch(/could not load the runner: Unexpected end of input \(at \S*chunk-b\.js:\d+\)/);
    expect(r.stderr).not.toMatch(/^\s+at /m);
  });
  it('a module that throws while loading: its message and location, exit 3', () => {
    const r = run(pkg('throws', { 'main.js': 'throw new TypeError("not a function");\nexport async function main() { return 0; }\n' }));
    expect(r.status).toBe(3);
    expect(r.stderr).toMatch(/could not load the runner: not a function \(at \S*main\.js:1:7\)/);
    expect(r.stderr).not.toMatch(/^\s+at /m);
  });
});
