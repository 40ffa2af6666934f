import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { CORPUS } from './corpus.js';

// Runs the shipped runner (bin/ → dist/, built by test/globalSetup.ts) on each malformed input, as a user would.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const TMP = mkdtempSync(join(tmpdir(), 'sl-corpus-'));
afterAll(() => rmSync(TMP, { recursive: true, force: true }));

describe('strainledger run on malformed input exits 2 with one clear message and writes nothing', () => {
  it('the corpus holds at least 40 malformed inputs', () => {
    expect(CORPUS.length).toBeGreaterThanOrEqual(40);
    expect(new Set(CORPUS.map((c) => c.name)).size).toBe(CORPUS.length);
  });
  CORPUS.forEach((c, i) => {
    it(`${c.name}`, () => {
      const dir = join(TMP, `case-${i}`);
      mkdirSync(dir);
      const args = c.setup(dir);
      const before = readdirSync(dir).sort();
      const out = join(TMP, `out-${i}`);
      const r = spawnSync(process.execPath, [BIN, ...args, ...(c.ownOut ? [] : ['--out', out])], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true' } });
      expect(r.status, r.stderr).toBe(2);
      expect(r.stdout).toBe('');
      // One message: the problem's line (the usage text may follow an option error, never a second problem).
      const first = r.stderr.split('\n')[0]!;
      expect(first).toMatch(c.expect);
      const lines = r.stderr.split('\n').filter((l) => l.trim() !== '');
      if (c.usage) expect(lines[1]).toMatch(/^usage: strainledger run /);
      else expect(lines, r.stderr).toHaveLength(1);
      expect(r.stderr).not.toMatch(/\n\s+at |Error: |internal error/);
      // Nothing written: no output folder, and the case's own folder holds exactly what the case put there.
      expect(existsSync(out)).toBe(false);
      expect(readdirSync(dir).sort()).toEqual(before);
    });
  });
});
