import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { expectAbsClose, expectRelClose } from '../helpers.js';

// Runs the shipped runner (bin/ → dist/), as a user would; test/globalSetup.ts builds dist/ first.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: '1' } });
const PLAN = 'examples/clip-strip-scatter.json';

describe('strainledger tolerance-factor --n N --coverage P --confidence G', () => {
  it('prints k = 2.3546 for n 10, 90 %, 95 % (Natrella NBS Handbook 91 Table A-7: 2.355, from memory; SciPy nct: 2.354640)', () => {
    const r = run('tolerance-factor', '--n', '10', '--coverage', '0.90', '--confidence', '0.95');
    expect(r.status).toBe(0);
    expect(r.stdout.split('\n')[0]).toBe('k = 2.3546');
    expect(r.stdout).toMatch(/the smallest needs n ≥ 29/);
  });
  it('--json gives k 4.2027 for n 5, 95 %, 95 % (Natrella Table A-7: 4.203, from memory; SciPy: 4.202681) and the Wilks rank for n 59', () => {
    const a = JSON.parse(run('tolerance-factor', '--n', '5', '--coverage', '0.95', '--confidence', '0.95', '--json').stdout);
    expectAbsClose(a.k, 4.2027, 1e-9, 'k');
    const b = JSON.parse(run('tolerance-factor', '--n', '59', '--coverage', '0.95', '--confidence', '0.95', '--json').stdout);
    expect(b.distributionFreeRank).toBe(1);
  });
  it('exits 2 naming the option, value and allowed range for n 1 or coverage 1.5', () => {
    const a = run('tolerance-factor', '--n', '1');
    expect(a.status).toBe(2);
    expect(a.stderr).toMatch(/--n: got 1, allowed an integer in \[2, /);
    const b = run('tolerance-factor', '--n', '10', '--coverage', '1.5');
    expect(b.status).toBe(2);
    expect(b.stderr).toMatch(/--coverage: got 1\.5, allowed a number in/);
    expect(run('tolerance-factor').stderr).toMatch(/--n: missing/);
  });
});

describe('strainledger run PLAN with a scatter section', () => {
  const one = run('run', PLAN, '--format', 'json', '--jobs', '1');
  const two = run('run', PLAN, '--format', 'json', '--jobs', '2');
  it('writes the contract fields of the scatter section', () => {
    expect(one.status).toBe(0);
    const s = JSON.parse(one.stdout).scatter;
    expect(s.samples).toBe(20000);
    expect(s.seed).toBe(2026);
    for (const k of ['mean', 'sd', 'p05', 'p50', 'p95']) expect(Number.isFinite(s.finalReloadYield[k]), k).toBe(true);
    for (const k of ['value', 'coverage', 'confidence', 'method']) expect(s.toleranceBound, k).toHaveProperty(k);
    expect(s.toleranceBound.coverage).toBe(0.9);
    expect(s.toleranceBound.confidence).toBe(0.95);
    expect(s.probabilityAllTargetsMet).toBeGreaterThan(0);
    expect(s.probabilityAllTargetsMet).toBeLessThan(1);
    expect(s.sensitivity.inputs.map((i: { input: string }) => i.input)).toEqual(['K', 'n', 'start.thickness']);
    expect(s.cautions.length).toBeGreaterThan(0);
  });
  it('the Markdown and HTML reports show the scatter section as sentences and tables with the JSON report\'s numbers, and its cautions', async () => {
    const s = JSON.parse(one.stdout).scatter;
    const pct = (x: number) => `${(x * 100).toFixed(1)} %`;
    const md = run('run', PLAN, '--format', 'md').stdout;
    const section = md.slice(md.indexOf('## Scatter'), md.indexOf('## Cautions'));
    expect(section).toContain(`Probability that all targets are met: ${pct(s.probabilityAllTargetsMet)}`);
    expect(section).toContain(`: ${s.toleranceBound.value.toFixed(1)} MPa`);
    expect(section).toContain(`| minimum reload yield (Rp0.2) | 330.0 MPa | ${pct(s.targets[0].probabilityMet)} |`);
    expect(section).toContain(`| Rp0.2 | MPa | ${s.finalReloadYield.mean.toFixed(1)} | ${s.finalReloadYield.sd.toFixed(1)} | ${s.finalReloadYield.p05.toFixed(1)} |`);
    expect(section).toContain('**Caution:** A lower bound is not a guaranteed minimum');
    expect(md).not.toContain('```json'); // no raw JSON dump
    // HTML read back with linkedom's parser (a general-purpose DOM), not by string matching alone.
    const { DOMParser } = await import('linkedom');
    const doc = new DOMParser().parseFromString(run('run', PLAN, '--format', 'html').stdout, 'text/html');
    const h2 = [...doc.querySelectorAll('h2')].find((h) => h.textContent === 'Scatter');
    expect(h2).toBeDefined();
    const rows = [...doc.querySelectorAll('table')].flatMap((t) => [...t.querySelectorAll('tr')].map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent)));
    expect(rows).toContainEqual(['K', '530', '21.2', '0.040', 'MPa']);
    expect(rows).toContainEqual(['minimum remaining uniform elongation', '2.0 %', pct(s.targets[2].probabilityMet)]);
    expect(doc.querySelector('pre')).toBeNull();
  });
  it('the JUnit report carries the probability and the lower bound as suite properties (read back by an XML parser)', async () => {
    const s = JSON.parse(one.stdout).scatter;
    const { DOMParser } = await import('linkedom');
    const xml = new DOMParser().parseFromString(run('run', PLAN, '--format', 'junit').stdout, 'text/xml');
    const prop = (n: string) => [...xml.querySelectorAll('property')].find((p) => p.getAttribute('name') === n)?.getAttribute('value');
    expect(Number(prop('scatter.probabilityAllTargetsMet'))).toBe(s.probabilityAllTargetsMet);
    expect(Number(prop('scatter.samples'))).toBe(20000);
    expect(prop('scatter.toleranceBound.reloadYield.MPa')).toBe(s.toleranceBound.value.toFixed(2));
    expect(xml.querySelectorAll('testcase').length).toBe(3); // one per target, as without scatter
  });
  it('gives the same report byte for byte with 1 and with 2 worker threads, and on a second run', () => {
    expect(two.status).toBe(0);
    expect(two.stdout).toBe(one.stdout);
    expect(run('run', PLAN, '--format', 'json', '--jobs', '2').stdout).toBe(one.stdout);
  });
  it('a different seed (--set scatter.seed=9) agrees within sampling error', () => {
    const a = JSON.parse(one.stdout).scatter;
    const b = JSON.parse(run('run', PLAN, '--format', 'json', '--set', 'scatter.seed=9').stdout).scatter;
    expect(b.seed).toBe(9);
    expect(b.finalReloadYield.mean).not.toBe(a.finalReloadYield.mean);
    // Two independent means of N = 20000: difference sd = sd·√(2/N); 4 sd.
    expectAbsClose(b.finalReloadYield.mean, a.finalReloadYield.mean, 4 * a.finalReloadYield.sd * Math.sqrt(2 / 20000), 'mean');
    const p = a.probabilityAllTargetsMet;
    expectAbsClose(b.probabilityAllTargetsMet, p, 4 * Math.sqrt((2 * p * (1 - p)) / 20000), 'P(all met)');
  });
  it('reports in ksi for a US plan: the same samples, stresses divided by 6.894757 (NIST SP 811 B.8)', () => {
    const plan = JSON.parse(readFileSync(join(ROOT, PLAN), 'utf8'));
    const us = { ...plan, units: 'US', material: { ...plan.material, elasticModulus: 115000 / 6.894757293168361, flowCurve: { law: 'hollomon', K: 530 / 6.894757293168361, n: 0.44 } },
      start: { thickness: 2.0 / 25.4, width: 40 / 25.4 }, steps: plan.steps.map((s: { thickness?: number }) => (s.thickness ? { ...s, thickness: s.thickness / 25.4 } : s)),
      targets: { minYield: 330 / 6.894757293168361, maxYield: 420 / 6.894757293168361, minRemainingElongationPct: 2 } };
    const f = join(mkdtempSync(join(tmpdir(), 'sl-sc-')), 'us.json');
    writeFileSync(f, JSON.stringify(us));
    const a = JSON.parse(one.stdout).scatter;
    const b = JSON.parse(run('run', f, '--format', 'json').stdout).scatter;
    // Unit round trips change the last bits of the inputs; 1e-9 relative covers that.
    expectRelClose(b.finalReloadYield.mean * 6.894757293168361, a.finalReloadYield.mean, 1e-9, 'mean');
    expectRelClose(b.toleranceBound.value * 6.894757293168361, a.toleranceBound.value, 1e-9, 'bound');
    expect(b.inputs[0].unit).toBe('ksi');
  });
  it('the table report shows the probability and the lower bound', () => {
    const r = run('run', PLAN);
    expect(r.stdout).toMatch(/probability all targets met: \d+\.\d %/);
    expect(r.stdout).toMatch(/lower bound on Rp0\.2, 90\.0 % coverage at 95\.0 % confidence: \d+\.\d MPa/);
  });
});

describe('invalid scatter sections exit 2 with file, line, field, value and range', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sl-sc-'));
  const base = JSON.parse(readFileSync(join(ROOT, PLAN), 'utf8'));
  const plan = (scatter: unknown) => {
    const f = join(dir, `p${Math.random().toString(36).slice(2)}.json`);
    writeFileSync(f, JSON.stringify({ ...base, scatter }, null, 2));
    return f;
  };
  it('a correlation matrix that is not positive definite', () => {
    const r = run('run', plan({ ...base.scatter, params: { K: { cv: 0.04 }, n: { cv: 0.06 } }, start: { thickness: { cv: 0.01 } },
      correlation: { 'K,n': 0.9, 'K,start.thickness': 0.9, 'n,start.thickness': -0.9 } }));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/:\d+:\d+: scatter\.correlation: not positive definite at pivot 3/);
    expect(r.stdout).toBe('');
  });
  it('a parameter the law does not have', () => {
    const r = run('run', plan({ ...base.scatter, params: { Q: { cv: 0.1 } } }));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/scatter\.params\.Q: got "Q", allowed a parameter of the hollomon law: one of K, n/);
  });
  it('both cv and sd for one input, and a correlation of an input without spread', () => {
    expect(run('run', plan({ ...base.scatter, params: { K: { cv: 0.04, sd: 20 } } })).stderr).toMatch(/scatter\.params\.K: .*allowed exactly one of cv or sd/);
    expect(run('run', plan({ ...base.scatter, params: { K: { cv: 0.04 } }, start: {}, correlation: { 'K,n': -0.5 } })).stderr)
      .toMatch(/scatter\.correlation\.K,n: got "K,n", allowed two of the inputs that scatter: K/);
  });
});

describe('strainledger run PLAN with scatter.records (several specimens of one material)', () => {
  it('fits the law to each record and samples the specimens\' means, spreads and K–n correlation', async () => {
    const { specimens } = await import('../core/scatter/specimenFixtures.js');
    const dir = mkdtempSync(join(tmpdir(), 'sl-rec-'));
    const files = specimens.map((s: { name: string; strain: number[]; stress: number[] }) => {
      const f = `${s.name}.csv`;
      writeFileSync(join(dir, f), 'Record:,INVENTED coupon\n\nStrain [%],Stress [MPa]\n' + s.strain.map((e, i) => `${(e * 100).toFixed(6)},${s.stress[i]!.toFixed(4)}`).join('\n') + '\n');
      return f;
    });
    const base = JSON.parse(readFileSync(join(ROOT, PLAN), 'utf8'));
    const planFile = join(dir, 'plan.json');
    writeFileSync(planFile, JSON.stringify({ ...base, scatter: { samples: 5000, seed: 5, records: files, start: { thickness: { cv: 0.01 } } } }, null, 2));
    const r = run('run', planFile, '--format', 'json');
    expect(r.stderr).toBe('');
    const rep = JSON.parse(r.stdout);
    expect(rep.material.source).toMatch(/^mean of 6 specimen fits .*spreads from only 6 specimens are themselves uncertain/);
    const { specimens: _s, ...inputs } = { specimens: 0, ...Object.fromEntries(rep.scatter.inputs.map((i: { name: string }) => [i.name, i])) };
    // Same tolerances as test/core/scatter/specimens.test.ts (simple-statistics on the true K, n).
    expectRelClose(inputs.K.mean, 531.833, 3e-3, 'mean K');
    expect(rep.scatter.correlation['K,n']).toBeLessThan(-0.5);
    expect(Object.keys(rep.scatter.correlation)).toEqual(['K,n']);
    expect(rep.material.flowCurve.K).toBe(inputs.K.mean);
  });
  it('exits 2 naming scatter.records[0] when a record file is missing', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-rec-'));
    const base = JSON.parse(readFileSync(join(ROOT, PLAN), 'utf8'));
    const planFile = join(dir, 'plan.json');
    writeFileSync(planFile, JSON.stringify({ ...base, scatter: { records: ['missing-a.csv', 'missing-b.csv'] } }, null, 2));
    const r = run('run', planFile, '--format', 'json');
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/:\d+:\d+: scatter\.records\[0\]: got "missing-a\.csv" .*file not found/);
  });
});
