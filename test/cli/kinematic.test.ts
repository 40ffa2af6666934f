import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { trueCurve } from '../../src/core/index.js';
import { expectRelClose } from '../helpers.js';

// `strainledger kinematic MATERIAL RECORD`: Armstrong–Frederick backstresses fitted to a record with
// a reversal, through the shipped runner. The record is built from the closed-form 1-D
// Armstrong–Frederick response (Armstrong & Frederick 1966; Lemaitre & Chaboche, Mechanics of Solid
// Materials, 1990, §5.4 — from memory), not from our integrator: with a Voce flow curve σ0 + (C/γ)(1 −
// e^(−γ ε̄)) the yield-surface size stays σ0 and the backstress is the whole of the hardening, so
// tension gives X = (C/γ)(1 − e^(−γ εp)) and a reversal from X_a at εp = a gives
// X = −C/γ + (X_a + C/γ)·e^(γ(εp − a)); stress σ = ±σ0 + X, total strain εp + σ/E.
const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'strainledger.js');
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, CI: 'true' }, maxBuffer: 1 << 28 });
const TMP = mkdtempSync(join(tmpdir(), 'sl-kin-'));
afterAll(() => rmSync(TMP, { recursive: true, force: true }));

const E = 200000, S0 = 200, C = 20000, G = 100; // MPa, MPa, MPa, dimensionless: INVENTED test values
const material = (kinematic?: unknown) => ({ units: 'SI', name: 'closed-form AF test material (INVENTED)', elasticModulus: E, flowCurve: { law: 'voce', sigma0: S0, Q: C / G, b: G }, ...(kinematic ? { kinematic } : {}) });

/** Closed-form record: elastic loading, tension to εp = a, elastic unloading, reverse plastic flow by d. */
function closedFormRecord(a = 0.02, d = 0.03, n = 200): { strain: number[]; stress: number[] } {
  const strain: number[] = [], stress: number[] = [];
  const push = (ep: number, s: number) => { strain.push(ep + s / E); stress.push(s); };
  for (let i = 0; i <= 20; i++) push(0, (S0 * i) / 20);
  for (let i = 1; i <= n; i++) { const ep = (a * i) / n; push(ep, S0 + (C / G) * (1 - Math.exp(-G * ep))); }
  const Xa = (C / G) * (1 - Math.exp(-G * a));
  for (let i = 1; i <= 20; i++) push(a, S0 + Xa - (2 * S0 * i) / 20);
  for (let i = 1; i <= n; i++) { const ep = a - (d * i) / n; push(ep, -C / G + (Xa + C / G) * Math.exp(G * (ep - a)) - S0); }
  return { strain, stress };
}

describe('strainledger kinematic MATERIAL RECORD', () => {
  const matFile = join(TMP, 'material.json');
  writeFileSync(matFile, JSON.stringify(material(), null, 2));
  const rec = closedFormRecord();

  it('recovers C and γ from a closed-form Armstrong–Frederick reversal (true values), and writes a material that reproduces it', () => {
    const csv = join(TMP, 'af-true.csv');
    writeFileSync(csv, 'strain,stress [MPa]\n' + rec.strain.map((e, i) => `${e},${rec.stress[i]}`).join('\n') + '\n');
    const out = join(TMP, 'fitted.json');
    const r = run('kinematic', matFile, csv, '--values', 'true', '--format', 'json', '--material-out', out);
    expect(r.status, r.stderr).toBe(0);
    const fit = JSON.parse(r.stdout);
    expectRelClose(fit.backstresses[0].C, C, 1e-6, 'C');
    expectRelClose(fit.backstresses[0].gamma, G, 1e-6, 'γ');
    expect(fit.rmse).toBeLessThan(1e-3); // MPa: the return mapping integrates the 1-D AF law exactly along each increment
    expect(fit.cautions.length).toBeGreaterThan(1);
    // The written material drives `path` through the record's strain history to the same stresses.
    const written = JSON.parse(readFileSync(out, 'utf8'));
    expect(written.kinematic.backstresses).toHaveLength(1);
    const history = [0.02 + (S0 + (C / G) * (1 - Math.exp(-G * 0.02))) / E, rec.strain[rec.strain.length - 1]!];
    const p = JSON.parse(run('path', out, '--history', history.join(','), '--increment', '1e-5').stdout);
    const last = p.points[p.points.length - 1];
    expectRelClose(last.stress, rec.stress[rec.stress.length - 1]!, 2e-3, 'stress at the end of the reversal');
  });

  it('reads engineering values by default and converts them at constant volume (ε = ln(1 + e), σ = s(1 + e); Dieter §8-3)', () => {
    // e = 0.02, s = 300 MPa → ε = ln 1.02 = 0.0198026, σ = 306 MPa (by hand).
    const t = trueCurve([0.02, -0.01], [300, -250]);
    expect(t.strain[0]).toBeCloseTo(0.0198026273, 9);
    expect(t.stress[0]).toBeCloseTo(306, 9);
    expect(t.strain[1]).toBeCloseTo(Math.log(0.99), 12);
    expect(t.stress[1]).toBeCloseTo(-247.5, 9);
    const csv = join(TMP, 'af-eng.csv');
    const eng = rec.strain.map((e, i) => [Math.expm1(e), rec.stress[i]! / Math.exp(e)]);
    writeFileSync(csv, 'Strain (%),Stress (MPa)\n' + eng.map(([e, s]) => `${e! * 100},${s}`).join('\n') + '\n');
    const r = run('kinematic', matFile, csv, '--format', 'json');
    expect(r.status, r.stderr).toBe(0);
    const fit = JSON.parse(r.stdout);
    expect(fit.values).toBe('engineering');
    expectRelClose(fit.backstresses[0].C, C, 1e-6, 'C from engineering values');
    expectRelClose(fit.backstresses[0].gamma, G, 1e-6, 'γ from engineering values');
  });

  it('exits 2 with one clear message for a record without a reversal, a wrong option, or a missing file', () => {
    const mono = join(TMP, 'mono.csv');
    const k = rec.strain.findIndex((_, i) => i > 0 && rec.stress[i]! < rec.stress[i - 1]!);
    writeFileSync(mono, 'strain,stress [MPa]\n' + rec.strain.slice(0, k).map((e, i) => `${e},${rec.stress[i]}`).join('\n') + '\n');
    const a = run('kinematic', matFile, mono, '--values', 'true');
    expect(a.status).toBe(2);
    expect(a.stderr).toMatch(/record: .*allowed a record with at least one unloading or reversal/);
    const b = run('kinematic', matFile, mono, '--backstresses', '4');
    expect(b.status).toBe(2);
    expect(b.stderr).toMatch(/--backstresses: got "4", allowed 1, 2 or 3/);
    const c = run('kinematic', matFile, join(TMP, 'nonesuch.csv'));
    expect(c.status).toBe(2);
    for (const x of [a, b, c]) expect(x.stderr).not.toMatch(/\n\s+at /); // no stack trace
  });
  it('refuses a record whose extension is the machine\'s travel, naming the column (its compliance is in every reversal)', () => {
    // The closed-form reversal as force and crosshead travel of an INVENTED 20 mm² strip over 50 mm, with a spring in series.
    const f = join(TMP, 'travel.csv');
    writeFileSync(f, 'Area: 20 mm²\nGauge length: 50 mm\n\nForce [N],Crosshead [mm]\n' + rec.strain.map((e, i) => `${rec.stress[i]! * 20},${(Math.expm1(e) + rec.stress[i]! * 4e-6) * 50}`).join('\n') + '\n');
    const r = run('kinematic', matFile, f);
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/travel\.csv: Crosshead \[mm\]: the extension is the machine's travel, not an extensometer: .*allowed a record from an extensometer or a strain gauge/);
  });
});

describe('kinematic --material-out never replaces an input by accident (a user\'s data is kept)', () => {
  const rec = closedFormRecord();
  const csv = join(TMP, 'guard.csv');
  writeFileSync(csv, 'strain,stress [MPa]\n' + rec.strain.map((e, i) => `${e},${rec.stress[i]}`).join('\n') + '\n');
  const planFile = join(TMP, 'guard-plan.json');
  const { units: _u, ...planMaterial } = material();
  const planText = JSON.stringify({ name: 'guard plan (INVENTED)', units: 'SI', material: planMaterial, start: { thickness: 1 }, steps: [{ kind: 'roll', thickness: 0.9 }], targets: { minYield: 100 } }, null, 2);
  it('refuses the plan it read as --material-out (exit 2, naming the option and the path), even with --replace-input', () => {
    writeFileSync(planFile, planText);
    for (const extra of [[], ['--replace-input']]) {
      const r = run('kinematic', planFile, csv, '--values', 'true', '--material-out', planFile, ...extra);
      expect(r.status).toBe(2);
      expect(r.stderr).toContain('--material-out');
      expect(r.stderr).toContain(JSON.stringify(planFile));
      expect(r.stderr).toMatch(/plan \(its route and targets would be lost\)/);
      expect(readFileSync(planFile, 'utf8')).toBe(planText); // untouched
    }
  });
  it('refuses the record it read, and the material file unless --replace-input is given', () => {
    const matFile = join(TMP, 'guard-material.json');
    const matText = JSON.stringify(material(), null, 2);
    writeFileSync(matFile, matText);
    const onRecord = run('kinematic', matFile, csv, '--values', 'true', '--material-out', csv);
    expect(onRecord.status).toBe(2);
    expect(onRecord.stderr).toMatch(/--material-out.*which is the record read by this command; allowed a new file/);
    const onMaterial = run('kinematic', matFile, csv, '--values', 'true', '--material-out', join(TMP, '.', 'guard-material.json'));
    expect(onMaterial.status).toBe(2);
    expect(onMaterial.stderr).toMatch(/allowed a new file, or --replace-input to replace the material file on purpose/);
    expect(readFileSync(matFile, 'utf8')).toBe(matText);
    const asked = run('kinematic', matFile, csv, '--values', 'true', '--material-out', matFile, '--replace-input');
    expect(asked.status, asked.stderr).toBe(0);
    const written = JSON.parse(readFileSync(matFile, 'utf8'));
    expectRelClose(written.kinematic.backstresses[0].C, C, 1e-5, 'C written in place');
    expect(written.flowCurve).toEqual(material().flowCurve);
  });
});
