import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');

describe('run PLAN with a scatter section and a bend step', () => {
  it('exits 2 naming steps[1].kind instead of failing inside the sampler', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-sb-'));
    const file = join(dir, 'p.json');
    writeFileSync(file, JSON.stringify({
      name: 't', material: { name: 'm', elasticModulus: 200000, flowCurve: { law: 'hollomon', K: 600, n: 0.2 } },
      start: { thickness: 1 }, steps: [{ kind: 'roll', reductionPct: 10 }, { kind: 'bend', radius: 3, angle: 90 }],
      scatter: { samples: 1000, seed: 1, params: { K: { cv: 0.04 } } },
    }));
    const r = spawnSync(process.execPath, [BIN, 'run', file, '--format', 'json'], { encoding: 'utf8' });
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/p\.json:\d+:\d+: steps\[1\]\.kind: scatter through bend steps is not supported/);
  });
});
