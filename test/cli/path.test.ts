import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { expectRelClose } from '../helpers.js';

// Runs the shipped runner (bin/ → dist/); test/globalSetup.ts builds dist/ first.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8' });
const dir = mkdtempSync(join(tmpdir(), 'sl-path-'));

describe('strainledger path PLAN --history H --format json', () => {
  it('prints the points of the history, monotonic part on the Hollomon flow curve', () => {
    const r = run('path', 'examples/hinge-tab-bend.json', '--history', '0.02,0,-0.02,0.03', '--format', 'json');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.converged).toBe(true);
    expect(out.history).toEqual([0.02, 0, -0.02, 0.03]);
    expect(out.cautions.length).toBeGreaterThan(2);
    const pts = out.points as Array<{ strain: number; stress: number; plasticStrain: number }>;
    expect(pts[0]).toMatchObject({ strain: 0, stress: 0 });
    // Callister low-carbon steel K 600, n 0.21: on first loading σ = K·εp^n (the combined split keeps the curve).
    const top = pts.find((p) => p.strain === 0.02)!;
    expectRelClose(top.stress, 600 * top.plasticStrain ** 0.21, 1e-9, 'stress at 0.02');
    expect(pts.at(-1)!.strain).toBe(0.03);
    expect(pts.some((p) => p.stress < -100)).toBe(true);
  });
  it('reads a material file on its own, with US units converted', () => {
    const f = join(dir, 'mat.json');
    writeFileSync(f, JSON.stringify({ units: 'US', name: 'steel', elasticModulus: 30000, flowCurve: { law: 'voce', sigma0: 36, Q: 20, b: 10 } }));
    const out = JSON.parse(run('path', f, '--history', '0.01').stdout);
    expect(out.units.stress).toBe('ksi');
    const last = out.points.at(-1);
    expectRelClose(last.stress, 36 + 20 * (1 - Math.exp(-10 * last.plasticStrain)), 1e-9, 'Voce stress in ksi');
  });
});

describe('strainledger path --format csv', () => {
  it('writes a header with units and one row per point, atomically to --out', () => {
    const f = join(dir, 'out.csv');
    const r = run('path', 'examples/hinge-tab-bend.json', '--history', '0.01,-0.01', '--format', 'csv', '--increment', '0.001', '--out', f);
    expect(r.status).toBe(0);
    const lines = readFileSync(f, 'utf8').trim().split('\n');
    expect(lines[0]).toBe('strain,stress_MPa,plasticStrain,accumulatedPlasticStrain,backstress_MPa,yieldSurfaceSize_MPa,modulus_MPa');
    expect(lines).toHaveLength(1 + 1 + 10 + 20);
  });
});

describe('strainledger path with invalid input exits 2 naming the field', () => {
  it.each([
    [['--history', '0.02,abc'], /--history\[1\]: got "abc"/],
    [['--history', '0.02,5'], /history\[1\]: got 5, allowed a number in \[-2, 2\]/],
    [[], /--history: missing/],
    [['--history', '0.01', '--format', 'xml'], /--format: got "xml"/],
  ])('%j', (extra, re) => {
    const r = run('path', 'examples/hinge-tab-bend.json', ...extra);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(re);
  });
  it('a material file with a bad field names it with its line', () => {
    const f = join(dir, 'bad.json');
    writeFileSync(f, '{\n  "name": "x",\n  "elasticModulus": -5,\n  "flowCurve": { "law": "hollomon", "K": 600, "n": 0.21 }\n}\n');
    const r = run('path', f, '--history', '0.01');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/bad\.json:3:\d+: material\.elasticModulus/);
  });
});

describe('a reader that stops early', () => {
  it('`strainledger path ... | head -1` ends quietly: no EPIPE error or stack trace (common practice for command-line tools)', () => {
    const r = spawnSync('bash', ['-c', `set -o pipefail; "${process.execPath}" "${BIN}" path examples/hinge-tab-bend.json --history 0.03,-0.03,0.03 --increment 1e-6 --format csv | head -1`], { cwd: ROOT, encoding: 'utf8' });
    expect(r.stdout).toBe('strain,stress_MPa,plasticStrain,accumulatedPlasticStrain,backstress_MPa,yieldSurfaceSize_MPa,modulus_MPa\n');
    expect(r.stderr).not.toMatch(/EPIPE|Error|\n\s+at /);
    expect(r.status).toBe(0);
  });
});
