import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BASE } from './corpus.js';

// The progress bar shows on a terminal for long work and stays silent under CI or when piped.
// A terminal is given by util-linux `script` (a pseudo-terminal); the test skips where it is missing.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const hasScript = spawnSync('script', ['--version']).status === 0;
const dir = mkdtempSync(join(tmpdir(), 'sl-progress-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
for (let i = 0; i < 25; i++) writeFileSync(join(dir, `p${String(i).padStart(2, '0')}.json`), JSON.stringify({ ...BASE, name: `progress ${i} (INVENTED)` }));
const onTty = (env: Record<string, string | undefined>) => {
  const e = { ...process.env, ...env };
  if (env.CI === undefined) delete e.CI;
  const cmd = `${JSON.stringify(process.execPath)} ${JSON.stringify(BIN)} run ${JSON.stringify(join(dir, '*.json'))} > /dev/null`;
  return spawnSync('script', ['-qec', cmd, '/dev/null'], { cwd: ROOT, encoding: 'utf8', env: e });
};

describe.skipIf(!hasScript)('strainledger run with 25 plans: the progress bar', () => {
  it('shows on a terminal when CI is not set', () => {
    const r = onTty({});
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/plans \[.*\] 25\/25 100%/);
  });
  it('stays silent on a terminal when CI is set', () => {
    const r = onTty({ CI: 'true' });
    expect(r.status).toBe(0);
    expect(r.stdout).not.toMatch(/plans \[/);
  });
  it('stays silent when stderr is not a terminal', () => {
    const r = spawnSync(process.execPath, [BIN, 'run', join(dir, '*.json')], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: '' } });
    expect(r.status).toBe(0);
    expect(r.stderr).toBe('');
    expect(r.stdout).toMatch(/25 plans: 25 met, 0 not met, 0 invalid; exit 0/);
  });
});
