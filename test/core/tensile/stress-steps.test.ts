import { describe, expect, it } from 'vitest';
import { analyzeRecord, strainSteps } from '../../../src/core/index.js';
import { holdoutRecord } from './lab-records-holdout.helpers.js';
import { holdoutBRecord } from './lab-records-holdout-b.helpers.js';
import { holdoutCRecord } from './lab-records-holdout-c.helpers.js';
import { holdCeilings, holdoutTally, type HoldoutRecordLike } from './holdout-tally.js';

// A stress column written with few digits — force in kN with one decimal on a 20 mm² section is 5 MPa a step; stress
// in whole MPa from a quiet machine (common practice) — holds each reading while the curve climbs through the step,
// a staircase the load's own noise is too small to dither. INVENTED records only: the hold-out generators' records
// (written apart from the analysis) at a tenth of their noise (load noise 0.01–0.1 % of Rm), stress rounded; each
// checked against its generator's truth, computed before rounding.
const roundTo = (a: ArrayLike<number>, q: number) => Float64Array.from(a as ArrayLike<number>, (x) => Math.round(x / q) * q);
const stepped = (r: HoldoutRecordLike, q: number): HoldoutRecordLike => ({ ...r, stress: roundTo(r.stress, q), what: `${r.what} [stress in steps of ${q} MPa]` });

describe('a stress column in steps coarser than its noise', () => {
  it('finds the step, says so, and gives Ag an interval that holds the truth (hold-out A 1021, steps of 5 MPa)', () => {
    // Voce + linear, Rm 141 MPa: the curve stays within its top 5 MPa step from Ag 13 % to past 30 %. Before: no word
    // of the steps, Ag 13.4 % with a 95 % interval 13.19–13.64 against the truth 22.7 (the treads' residuals taken as
    // noise, the top model's profile sure of a vertex the record cannot place), noise read as 0.1 MPa.
    const r = holdoutRecord(1021, 0.1);
    const a = analyzeRecord(stepped(r, 5), { fit: false });
    expect(a.stressSteps?.step).toBeCloseTo(5, 9);
    expect(a.stressSteps?.coarse).toBe(true);
    expect(a.warnings.find((w) => w.code === 'coarseStress')?.message).toMatch(/steps of 5 MPa.*±2\.5 MPa/s);
    expect(a.noise).toBeGreaterThanOrEqual(5 / Math.sqrt(12));
    const [lo, hi] = a.forceMaximum.uniformElongationInterval95;
    expect(lo).toBeLessThanOrEqual(r.truth.agPct);
    expect(hi).toBeGreaterThanOrEqual(r.truth.agPct);
    expect(a.warnings.some((w) => w.code === 'uncertainAg')).toBe(true);
    // Rm: the top's step is what the record holds (±q/2), plus issue 12's 0.4 %.
    expect(Math.abs(a.tensileStrength - r.truth.rm)).toBeLessThanOrEqual(2.5 + 0.004 * r.truth.rm);
  });
  it('a yield drop its treads had hidden is found (hold-out B 5034, drop 9.8 %, steps of 5 MPa)', () => {
    // Before: not found (evidence 618): the noise read off the treads was a small fraction of an MPa.
    const r = holdoutBRecord(5034, 0.1);
    const a = analyzeRecord(stepped(r, 5), { fit: false });
    expect(a.upperYield).not.toBeNull();
    expect(Math.abs(a.upperYield! - r.truth.reH!)).toBeLessThanOrEqual(2.5 + 0.015 * r.truth.reH!);
    expect(Math.abs(a.lowerYield! - r.truth.reL!)).toBeLessThanOrEqual(2.5 + 0.015 * r.truth.reL!);
  });
  it('a step under the noise is noise: nothing said, nothing read between steps (hold-out A 1021 at its own noise, steps of 0.5 MPa)', () => {
    const r = holdoutRecord(1021, 1);
    const q = stepped(r, 0.5);
    // The column is on a lattice of 0.5 MPa, but the load's noise dithers it.
    expect(strainSteps(q.stress)?.step).toBeCloseTo(0.5, 9);
    const a = analyzeRecord(q, { fit: false });
    const raw = analyzeRecord(r, { fit: false });
    expect(a.stressSteps).toBeNull();
    expect(a.warnings.some((w) => w.code === 'coarseStress')).toBe(false);
    for (const k of ['proofStrength', 'tensileStrength'] as const) expect(Math.abs(a[k]! / raw[k]! - 1), k).toBeLessThan(2e-3);
    // E from 50 noisy samples moves with any rounding by a fraction of its own interval (±4 % here).
    const [lo, hi] = raw.measuredModulusInterval95;
    expect(Math.abs(a.elasticModulus - raw.elasticModulus)).toBeLessThan(0.25 * (hi - lo));
  });
});

describe('the three hold-out generators at a tenth of their noise, stress in steps of 5 MPa (INVENTED records)', () => {
  // The first 40 records of each generator (load noise 0.01–0.1 % of Rm; 5 MPa is 1–4 % of their Rm). Misses MEASURED
  // before the stress was read between its steps (twenty-first session): A 28 {Rm 14, Ag 8, Ae 2, ReL 2, Rp0.2 1,
  // ReH 1}, B 24 {Rm 10, Ag 9, missedYield 3, ReL 1, Ae 1}, C 18 {Rm 7, Ag 9, Ae 2}. Rm is then known to ±2.5 MPa only
  // (1–2 % of these Rm), beyond issue 12's 0.4 %: those misses are checked below against the step instead.
  // Now (held as ceilings): A {Ae 5, ReL 2, Rp0.2 2}, B {Ae 1, falseRateStep 1}, C {Ae 1, Ag 1} besides Rm: Ag's
  // interval holds the top's step, no drop is missed; Ae and ReL read on a plateau that sits within one or two steps.
  const cases = [
    ['A', holdoutRecord, 1000, { Ae: 5, ReL: 2, 'Rp0.2': 2 }],
    ['B', holdoutBRecord, 5000, { Ae: 1, falseRateStep: 1 }],
    ['C', holdoutCRecord, 9000, { Ae: 1, Ag: 1 }],
  ] as const;
  for (const [name, make, base, ceilings] of cases) {
    it(`hold-out ${name}`, () => {
      const r = holdoutTally((seed, ns) => stepped(make(seed, ns), 5), Array.from({ length: 40 }, (_, i) => base + i), 0.1);
      console.log(`hold-out ${name}, stress in steps of 5 MPa: ${r.fails.length} misses ${JSON.stringify(r.count)}; drops ${r.drops}, Ag off ${r.agOff}\n${r.fails.join('\n')}`);
      // Rm within the step's half (2.5 MPa) plus 0.4 % on every record the tally lists.
      for (const f of r.fails) {
        const m = / Rm ([\d.]+) vs ([\d.]+)/.exec(f);
        if (m) expect(Math.abs(+m[1]! - +m[2]!), f).toBeLessThanOrEqual(2.5 + 0.004 * +m[2]!);
      }
      holdCeilings({ ...r, count: { ...r.count, Rm: 0 } }, ceilings);
      expect(r.drops).toBeGreaterThan(8);
    }, 600_000);
  }
});
