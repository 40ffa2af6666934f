// A test whose rate is changed on the plastic part: ISO 6892-1 method A lets the strain rate be raised once the proof
// strength is determined (from memory), and the flow stress of a metal follows its rate (σ ∝ ε̇^m, m about 0.01 for
// steels at room temperature, from memory). The samples, uniform in time, step apart there and the stress steps up.
// Every record below is invented or an open record reshaped: the rate change is put in by keeping every r-th sample
// past the change and multiplying the stress there by r^m, so the truth of the step is known.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseHTML } from 'linkedom';
import { recordCurveChart } from '../../../src/charts/records.js';
import { describe, expect, it } from 'vitest';
import { analyzeRecord, findRateChange, makeLaw, synthesizeLabRecord, xoshiro128ss, type TensileAnalysis } from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';
import { labCase } from './lab-records.helpers.js';

const OPEN = ['46NT71', '46NT73', '46NT99', '46NT9B', '46NTA1', '46NTA3', '46NTAT', '46NTAV', '46NTBL', '46NTBN'];
function openRecord(name: string) {
  const f = `${name}.csv`;
  return parseRecordText(readFileSync(join(import.meta.dirname, '..', '..', 'fixtures', '42crmos4', f), 'utf8'), { file: f });
}

/**
 * The record with its rate multiplied by `r` from engineering strain `at` on: r ≥ 1 keeps every r-th sample past it,
 * r < 1 every (1/r)-th before it; the stress past it times r^m.
 */
function withRateChange(strain: ArrayLike<number>, stress: ArrayLike<number>, at: number, r: number, m: number) {
  const e: number[] = [], s: number[] = [];
  const every = Math.round(r >= 1 ? r : 1 / r), f = r ** m;
  let k = 0;
  for (let i = 0; i < strain.length; i++) {
    const past = strain[i]! >= at;
    if (past === r >= 1 && k++ % every !== 0) continue;
    e.push(strain[i]!); s.push(past ? stress[i]! * f : stress[i]!);
  }
  return { strain: e, stress: s };
}

function bestRmse(a: TensileAnalysis): number {
  return Math.min(...a.fits!.fits.filter((f) => f.converged).map((f) => f.rmse));
}

/** The step's relative size and its interval: the truth r^m − 1 must lie inside. */
function expectStepHolds(a: TensileAnalysis, r: number, m: number, what: string) {
  const rc = a.rateChange!;
  expect(rc, what).not.toBeNull();
  expect(rc.step, what).not.toBeNull();
  const truth = r ** m - 1;
  const rel = rc.step! / rc.stressBefore, hw = rc.stepHalfWidth95! / rc.stressBefore;
  expect(Math.abs(rel - truth), `${what}: step ${(rel * 100).toFixed(2)} ± ${(hw * 100).toFixed(2)} % against ${(truth * 100).toFixed(2)} %`).toBeLessThanOrEqual(hw);
  return { rel, hw };
}

describe('a change of the test rate on the plastic part (findRateChange, rateStep)', () => {
  // Continuous invented records of the property test's generator, fine enough to keep 8 samples in 8.
  const cases = [] as ReturnType<typeof labCase>[];
  for (let seed = 1; cases.length < 6 && seed < 200; seed++) {
    const c = labCase(seed);
    const L = makeLaw(c.spec.law);
    if (c.spec.yieldDrop || c.spec.points < 6000 || L.uniformStrain() < 0.08) continue;
    cases.push(c);
  }

  it('six invented records with the rate raised ×8 at 1 % plastic strain (m = 0.01): found where it is, the step\'s 95 % interval holds the truth, the laws fitted at the first rate are the true law within 1 %', () => {
    expect(cases.length).toBe(6);
    const r = 8, m = 0.01;
    for (const c of cases) {
      const lab = synthesizeLabRecord({ ...c.spec, rng: xoshiro128ss(c.seed) });
      const L = makeLaw(c.spec.law);
      const at = L.stress(0.01) / c.spec.elasticModulus + 0.01 + (c.spec.toe ?? 0);
      const rec = withRateChange(lab.strain, lab.stress, at, r, m);
      const a = analyzeRecord(rec, {});
      const what = c.what;
      const rc = a.rateChange!;
      expect(rc, what).not.toBeNull();
      expect(Math.abs(rc.strain - at), what).toBeLessThan(3 * (lab.strain[1]! - lab.strain[0]!));
      expect(rc.ratio, what).toBeGreaterThan(0.85 * r);
      expect(rc.ratio, what).toBeLessThan(1.15 * r);
      const { hw } = expectStepHolds(a, r, m, what);
      expect(hw, what).toBeLessThan(0.012); // fine records measure it to about ±1 % or better
      expect(rc.clear, what).toBe(true);
      expect(rc.flowCurveFactor, what).not.toBeNull();
      expect(Math.abs(rc.sensitivity! - m), what).toBeLessThan(0.004);
      expect(a.warnings.find((w) => w.code === 'rateChange')!.message).toMatch(/steps up there by .* MPa.*scaled by/);
      // Rm as recorded: the top lies past the change, at the later rate (ISO 6892-1 reads it there).
      expect(Math.abs(a.tensileStrength / (lab.truth.tensileStrength * r ** m) - 1), what).toBeLessThan(0.004);
      // The laws describe the first rate: the best law within 1 % of the true law over the uniform part.
      const best = a.fits!.fits.find((f) => f.law === a.fits!.best)!;
      const fitted = makeLaw({ law: best.law, ...best.params } as Parameters<typeof makeLaw>[0]);
      for (const ep of [0.005, 0.02, 0.5 * L.uniformStrain()]) expect(Math.abs(fitted.stress(ep) / L.stress(ep) - 1), `${what} at εp ${ep}`).toBeLessThan(0.01);
    }
  });

  it('the same records with the logging rate changed and no step (m = 0): the change is said, nothing is scaled, the fits are those of the record without it', () => {
    for (const c of cases.slice(0, 3)) {
      const lab = synthesizeLabRecord({ ...c.spec, rng: xoshiro128ss(c.seed) });
      const L = makeLaw(c.spec.law);
      const at = L.stress(0.01) / c.spec.elasticModulus + 0.01 + (c.spec.toe ?? 0);
      const a = analyzeRecord(withRateChange(lab.strain, lab.stress, at, 5, 0), {});
      const rc = a.rateChange!;
      expect(rc, c.what).not.toBeNull();
      expect(rc.clear, c.what).toBe(false);
      expect(rc.flowCurveFactor, c.what).toBeNull();
      expect(Math.abs(rc.step!), c.what).toBeLessThanOrEqual(2 * rc.stepHalfWidth95!);
      expect(a.warnings.find((w) => w.code === 'rateChange')!.message).toMatch(/no step in the flow stress to take out/);
      const plain = analyzeRecord({ strain: lab.strain, stress: lab.stress }, {});
      expect(plain.rateChange, c.what).toBeNull();
      expect(bestRmse(a), c.what).toBeLessThan(1.3 * bestRmse(plain) + 0.05);
    }
  });

  it('a rate lowered ×4 at 2 % (m = 0.01): a step down, its interval holding the truth, the curve after it scaled up', () => {
    const c = cases[1]!;
    const lab = synthesizeLabRecord({ ...c.spec, rng: xoshiro128ss(c.seed) });
    const at = makeLaw(c.spec.law).stress(0.02) / c.spec.elasticModulus + 0.02 + (c.spec.toe ?? 0);
    const a = analyzeRecord(withRateChange(lab.strain, lab.stress, at, 0.25, 0.01), {});
    expect(a.rateChange!.ratio).toBeLessThan(0.3);
    const { rel } = expectStepHolds(a, 0.25, 0.01, c.what);
    expect(rel).toBeLessThan(0);
    expect(a.rateChange!.flowCurveFactor!).toBeGreaterThan(1);
    expect(a.warnings.find((w) => w.code === 'rateChange')!.message).toMatch(/falls .*× at .*steps down/);
    // The laws at the first (faster) rate, the true law's level here (the part after the change was lowered by 0.25^0.01): within 1 %.
    const best = a.fits!.fits.find((f) => f.law === a.fits!.best)!;
    const fitted = makeLaw({ law: best.law, ...best.params } as Parameters<typeof makeLaw>[0]), L = makeLaw(c.spec.law);
    for (const ep of [0.01, 0.5 * L.uniformStrain()]) expect(Math.abs(fitted.stress(ep) / L.stress(ep) - 1), `${c.what} at εp ${ep}`).toBeLessThan(0.01);
  });

  it('the open 46NT71 and 46NTA3 records (MaterialDigital, CC BY 4.0) with an invented ×8 at 1 % strain, m = 0.01: the step\'s interval holds the truth; the best law\'s RMSE back near the record\'s own', () => {
    for (const name of ['46NT71', '46NTA3']) {
      const rec = openRecord(name);
      const plain = analyzeRecord(rec, {});
      const a = analyzeRecord(withRateChange(rec.strain, rec.stress, 0.01, 8, 0.01), {});
      expectStepHolds(a, 8, 0.01, name);
      expect(a.rateChange!.clear, name).toBe(true);
      // Measured: 46NT71 best RMSE 0.74 MPa as recorded; 4.5 with the step fitted across (before the correction).
      expect(bestRmse(a), name).toBeLessThan(2 * bestRmse(plain) + 0.5);
      // Rp0.2 lies before the change: read as without it.
      expect(Math.abs(a.proofStrength! / plain.proofStrength! - 1), name).toBeLessThan(0.002);
    }
  });

  it('no change is found in the ten open records as their producers logged them, nor where rows are missing or the sampling is thinned smoothly', () => {
    for (const name of OPEN) {
      const a = analyzeRecord(openRecord(name), { fit: false });
      expect(a.rateChange, name).toBeNull();
      expect(a.warnings.some((w) => w.code === 'rateChange'), name).toBe(false);
    }
    // 300 rows lost in the middle of the plastic part: one gap, no change of rate.
    const c = cases[0]!;
    const lab = synthesizeLabRecord({ ...c.spec, rng: xoshiro128ss(c.seed) });
    const N = lab.strain.length, i0 = Math.floor(0.3 * N);
    const keep = (_: number, i: number) => i < i0 || i >= i0 + 300;
    const gap = analyzeRecord({ strain: Array.from(lab.strain).filter(keep), stress: Array.from(lab.stress).filter(keep) }, { fit: false });
    expect(gap.rateChange).toBeNull();
    // A rate that rises smoothly (the strain per sample from 1 to 3 times over the record, as a crosshead drive's strain
    // rate does while the specimen stiffens less): no change.
    const e: number[] = [], s: number[] = [];
    let x = 0;
    for (let i = 0; i < N; i++) { const j = Math.floor(x); if (j >= N - 1) break; e.push(lab.strain[j]!); s.push(lab.stress[j]!); x += 1 + (2 * i) / N; }
    expect(analyzeRecord({ strain: e, stress: s }, { fit: false }).rateChange).toBeNull();
  });

  it('findRateChange alone: a jump on the elastic rise (stress-rate control leaving the elastic line) is not a change; below twice, not a change', () => {
    // Elastic then plastic, the strain per sample rising 5× over the elastic–plastic knee only.
    const e: number[] = [], s: number[] = [];
    const E = 200000;
    let x = 0;
    for (let i = 0; i < 400; i++) { e.push(x); s.push(Math.min(E * x, 300 + 2000 * (x - 300 / E))); x += x < 0.002 ? 2e-5 : 1e-4; }
    expect(findRateChange(e, s, 0, e.length - 1, E)).toBeNull();
    // A plastic record whose samples step 1.8× apart: below the threshold.
    const e2: number[] = [], s2: number[] = [];
    x = 0.01;
    for (let i = 0; i < 200; i++) { e2.push(x); s2.push(300 + 2000 * x); x += i < 100 ? 1e-4 : 1.8e-4; }
    expect(findRateChange(e2, s2, 0, 199, E)).toBeNull();
    // The same at 2.5×: found at sample 100.
    const e3: number[] = [];
    x = 0.01;
    for (let i = 0; i < 200; i++) { e3.push(x); x += i < 100 ? 1e-4 : 2.5e-4; }
    const j = findRateChange(e3, e3.map((v) => 300 + 2000 * v), 0, 199, E)!;
    expect(j.index).toBe(100);
    expect(j.ratio).toBeCloseTo(2.5, 6);
  });

  it('said where users read it: the record chart marks the change with its factor and step; `analyze` prints the warning and writes `rateChange` in its JSON', () => {
    const rec = openRecord('46NT71');
    const changed = withRateChange(rec.strain, rec.stress, 0.01, 8, 0.01);
    const a = analyzeRecord(changed, {});
    const { document } = parseHTML('<!doctype html><html><body></body></html>');
    const svg = recordCurveChart(changed, a, { document: document as unknown as Document }) as unknown as Element;
    const texts = [...svg.querySelectorAll('text')].map((t) => t.textContent ?? '');
    const pct = (a.rateChange!.step! / a.rateChange!.stressBefore) * 100;
    expect(texts).toContain(`rate ×${a.rateChange!.ratio.toFixed(1)}, flow stress +${pct.toFixed(1)} %`);
    // The command line (the dist bundle, as users run it): the warning in words, the numbers in the JSON.
    const dir = mkdtempSync(join(tmpdir(), 'sl-rate-'));
    const file = join(dir, 'rate-change.csv');
    writeFileSync(file, 'strain,stress_MPa\n' + changed.strain.map((e, i) => `${e},${changed.stress[i]}`).join('\n') + '\n');
    const bin = join(import.meta.dirname, '..', '..', '..', 'bin', 'strainledger.js');
    const text = spawnSync(process.execPath, [bin, 'analyze', file], { encoding: 'utf8' });
    expect(text.status, text.stderr).toBe(0);
    expect(text.stdout).toMatch(/the strain per sample rises 7\.\d× at 1\.0\d % strain .* steps up there by/);
    const json = spawnSync(process.execPath, [bin, 'analyze', file, '--format', 'json'], { encoding: 'utf8' });
    expect(json.status, json.stderr).toBe(0);
    const out = JSON.parse(json.stdout);
    const rc = out.rateChange;
    expect(rc.clear).toBe(true);
    expect(rc.flowCurveFactor).toBeCloseTo(a.rateChange!.flowCurveFactor!, 10);
  });
});
