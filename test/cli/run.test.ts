import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { expectRelClose } from '../helpers.js';

// Runs the shipped runner (bin/ → dist/) as a user would; test/globalSetup.ts builds dist/ first.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8' });

describe('strainledger run PLAN --format json', () => {
  it('writes exactly the contract fields and exits 0 when all targets are met', () => {
    const r = run('run', 'examples/contact-spring-strip.json', '--format', 'json');
    expect(r.status).toBe(0);
    expect(r.stderr).toBe('');
    const rep = JSON.parse(r.stdout);
    expect(Object.keys(rep)).toEqual(['reportVersion', 'plan', 'units', 'material', 'steps', 'targets', 'allTargetsMet', 'coldWorkWindow', 'cautions']);
    expect(rep.reportVersion).toBe(1);
    for (const k of ['index', 'kind', 'size', 'strainIncrement', 'accumulatedStrain', 'coldWorkPct', 'flowStress', 'reloadYield', 'tensileStrength', 'yieldRatio',
      'remainingUniformStrain', 'remainingUniformElongationPct', 'elasticRecoveryStrain', 'meanFlowStress', 'plasticWork', 'warnings']) {
      expect(rep.steps[0], k).toHaveProperty(k);
    }
    expect(rep.steps).toHaveLength(5);
    // Step 5: strip rolled 1.2 → 0.9 → 0.675 mm after the anneal; Callister copper K 530, n 0.44.
    // Reload yield = ISO 6892-1 Rp0.2 as force over the rolled section: σ(ε̄ + 0.002)·e^(−0.002).
    const eps = (2 / Math.sqrt(3)) * Math.log(1.2 / 0.675);
    expectRelClose(rep.steps[4].reloadYield, 530 * (eps + 0.002) ** 0.44 * Math.exp(-0.002), 1e-12, 'step 5 reload yield');
    expect(rep.cautions.length).toBeGreaterThan(2);
  });
  it('exits 1 when a target is missed', () => {
    const r = run('run', 'examples/bracket-stretch-specimen.yaml', '--format', 'json');
    expect(r.status).toBe(1);
    const rep = JSON.parse(r.stdout);
    expect(rep.allTargetsMet).toBe(false);
    expect(rep.targets.find((t: { name: string }) => t.name === 'minRemainingElongationPct').met).toBe(false);
  });
  it('US plans report in ksi and inches', () => {
    const rep = JSON.parse(run('run', 'examples/fencing-wire-us.json', '--format', 'json').stdout);
    expect(rep.units.stress).toBe('ksi');
    expect(rep.steps[3].size.diameter).toBeCloseTo(0.148, 12);
  });
  it('the same plan gives the same report byte for byte', () => {
    expect(run('run', 'examples/contact-spring-strip.json', '--format', 'json').stdout).toBe(run('run', 'examples/contact-spring-strip.json', '--format', 'json').stdout);
  });
});

describe('invalid input exits 2 with a one-line message naming file, line, field, value and range', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sl-'));
  const plan = (obj: unknown, name = 'p.json') => {
    const f = join(dir, name);
    writeFileSync(f, typeof obj === 'string' ? obj : JSON.stringify(obj, null, 2));
    return f;
  };
  const good = { name: 'x', material: { name: 'm', elasticModulus: 115000, flowCurve: { law: 'hollomon', K: 530, n: 0.44 } }, start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.5 }] };
  const cases: Array<[string, unknown, RegExp]> = [
    ['a roll to a larger size', { ...good, steps: [{ kind: 'roll', thickness: 2.5 }] }, /:\d+:\d+: steps\[0\]\.thickness: .*got 2\.5.*at most the current thickness 2 mm/],
    ['a reduction of 100 %', { ...good, steps: [{ kind: 'roll', reductionPct: 100 }] }, /steps\[0\]\.reductionPct: got 100, allowed a number < 100/],
    ['a draw of strip', { ...good, steps: [{ kind: 'draw', areaReductionPct: 10 }] }, /steps\[0\]\.kind: drawing needs wire/],
    ['a law parameter out of range', { ...good, material: { ...good.material, flowCurve: { law: 'hollomon', K: 530, n: 2 } } }, /material\.flowCurve\.n: got 2, allowed a number ≤ 1/],
    ['an unknown step kind', { ...good, steps: [{ kind: 'forge' }] }, /steps\[0\]\.kind: got "forge", allowed one of "roll", "draw"/],
    ['a missing field', { ...good, material: { name: 'm', flowCurve: good.material.flowCurve } }, /material\.elasticModulus: got nothing \(the field is required\), allowed a number/],
    ['a syntax error', '{ "name": "x", ', /JSON syntax/],
  ];
  for (const [what, obj, re] of cases) {
    it(what, () => {
      const r = run('run', plan(obj), '--format', 'json');
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(re);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    });
  }
  it('a plan with several independent problems hears of all of them at once, each located', () => {
    const f = plan({
      ...good,
      material: { ...good.material, modulusDecay: { Ea: 300000, xi: 25 }, fittedStrainRange: [0.2, 0.05] },
      targets: { minYield: 500, maxYield: 300 },
    }, 'multi.json');
    const r = run('run', f, '--format', 'json');
    expect(r.status).toBe(2);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/multi\.json:\d+:\d+: material\.modulusDecay\.Ea: got 300000, allowed a modulus at most elasticModulus \(115000\)/);
    expect(lines[1]).toMatch(/multi\.json:\d+:\d+: material\.fittedStrainRange: got \[0\.2,0\.05\], allowed a pair \[from, to\] with to > from/);
    expect(lines[2]).toMatch(/multi\.json:\d+:\d+: targets\.maxYield: contradictory targets; got 300, allowed a value ≥ minYield \(500\)/);
  });
  it('a missing plan file', () => {
    const r = run('run', join(dir, 'nope.json'));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/nope\.json: file not found/);
  });
});
