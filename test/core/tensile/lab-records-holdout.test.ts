import { describe, expect, it } from 'vitest';
import { analyzeRecord } from '../../../src/core/index.js';
import { holdoutRecord } from './lab-records-holdout.helpers.js';

// Hold-out check of the record analysis on INVENTED records from a generator written apart from the one the
// analysis was developed on (see lab-records-holdout.helpers.ts: other laws, two-rate sampling, correlated and
// quantised load noise, extensometer noise, random serrations with an undershoot transient, another necking
// shape, trailing samples after fracture). Tolerances are issue 12's: Rp0.2 1 %, Rm 0.4 %, Ag 0.4 point,
// A 0.5 point, ReH/ReL 1.5 %, Ae 0.4 point; continuous curves never report ReH/ReL; an impossible E is never
// used silently. Truth by the ISO 6892-1 definitions on the noise-free curve.

const SEEDS = Array.from({ length: 200 }, (_, i) => 1000 + i);

interface HoldoutTally { fails: string[]; count: Record<string, number>; refused: number; drops: number; continuous: number; agWarned: number; lowEvidence: number }

/** Runs the analysis on every hold-out seed and tallies the misses by property. */
function holdoutTally(seeds: number[], noiseScale = 1, tol = 1): HoldoutTally {
  const fails: string[] = [];
  const count: Record<string, number> = {};
  let refused = 0, drops = 0, continuous = 0, agWarned = 0, lowEvidence = 0;
  const miss = (k: string, msg: string) => { fails.push(msg); count[k] = (count[k] ?? 0) + 1; };
  for (const seed of seeds) {
    const rec = holdoutRecord(seed, noiseScale);
    const t = rec.truth;
    let a;
    try { a = analyzeRecord(rec, { fit: false }); } catch (e) {
      const msg = (e as Error).message;
      // Refusing the measured E is right only when the elastic rise holds too few samples to measure it; then
      // the user gives the modulus (--modulus), as here.
      if (!(t.elasticPoints <= 8 && /elasticModulus/.test(msg) && /--modulus/.test(msg))) { miss('threw', `${rec.what}: threw ${msg}`); continue; }
      refused++;
      a = analyzeRecord(rec, { fit: false, elasticModulus: t.E });
    }
    const chk = (k: string, err: number, t0: number, msg: string) => { if (!(err <= t0 * tol)) miss(k, `${rec.what}: ${k} ${msg}`); };
    // Rp0.2 on a plateau serrated by more than 0.5 % depends on which serration the offset line meets; ISO 6892-1
    // reports ReH/ReL for discontinuous yielding, so Rp0.2 is checked only where it is well defined.
    // A miss is accepted only when the analysis says Rp is uncertain (warning, 95 % interval wider than ±1 % that holds
    // the truth): few noisy samples near the offset point, or a coarse elastic line, cannot place it closer.
    const pr = a.proofStrengthRange;
    const rpUncertain = a.warnings.some((w) => w.code === 'uncertainRp') && pr !== null && (pr[1] - pr[0]) / 2 > 0.01 * a.proofStrength! && pr[0] <= t.rp02 && t.rp02 <= pr[1];
    if (t.serration <= 0.005 && !rpUncertain) chk('Rp0.2', Math.abs(a.proofStrength! - t.rp02) / t.rp02, 0.01, `${a.proofStrength} vs ${t.rp02}`);
    chk('Rm', Math.abs(a.tensileStrength - t.rm) / t.rm, 0.004, `${a.tensileStrength} vs ${t.rm}`);
    const agErr = Math.abs(a.uniformElongationPct - t.agPct);
    const [agLo, agHi] = a.forceMaximum.uniformElongationInterval95;
    const agUncertain = a.warnings.some((w) => w.code === 'uncertainAg') && (agHi - agLo) / 2 > 0.4;
    if (agUncertain) agWarned++;
    // Ag off by more than 0.4 point is accepted only when the analysis says Ag is uncertain, with a 95 %
    // interval wider than ±0.4 point that holds the truth.
    if (!(agErr <= 0.4 * tol || (agUncertain && agLo <= t.agPct && t.agPct <= agHi))) miss('Ag', `${rec.what}: Ag ${a.uniformElongationPct} vs ${t.agPct} (interval ${agLo.toFixed(2)}–${agHi.toFixed(2)})`);
    chk('A', Math.abs(a.totalElongationPct - t.aPct), 0.5, `${a.totalElongationPct} vs ${t.aPct}`);
    if (t.reH === null) {
      if (rec.what.includes('peak not caught')) { /* either answer is acceptable */ } else {
        continuous++;
        if (a.upperYield !== null) miss('falseYield', `${rec.what}: continuous curve reported ReH ${a.upperYield}`);
      }
    } else {
      drops++;
      // A drop may go unreported only when its evidence (see HoldoutTruth.dropEvidence) is below 6: a test that keeps
      // continuous curves free of false yield points (about 3.7 noise sd at a false-alarm rate of 10⁻⁴) finds a drop of
      // evidence 6 with probability ≥ 99 % and one of evidence 4 about half the time (the same rule as the property test).
      if (a.upperYield === null) {
        if (t.dropEvidence !== null && t.dropEvidence < 6) lowEvidence++;
        else miss('missedYield', `${rec.what}: yield drop ${t.reH.toFixed(1)}/${t.reL!.toFixed(1)} (evidence ${t.dropEvidence?.toFixed(1)}) not found`);
      } else {
        // As in the property test: ReH off by more than 1.5 % is accepted only with the `uncertainReH` warning and a range
        // wider than ±1.5 % that holds the truth (one noisy sample at the peak cannot tell whether it was still rising).
        const rr = a.upperYieldRange!;
        const rehWarned = tol === 1 && a.warnings.some((w) => w.code === 'uncertainReH') && (rr[1] - rr[0]) / 2 > 0.015 * a.upperYield && rr[0] <= t.reH && t.reH <= rr[1];
        if (!rehWarned) chk('ReH', Math.abs(a.upperYield - t.reH) / t.reH, 0.015, `${a.upperYield} vs ${t.reH} (range ${rr[0].toFixed(1)}–${rr[1].toFixed(1)})`);
        chk('ReL', Math.abs(a.lowerYield! - t.reL!) / t.reL!, 0.015, `${a.lowerYield} vs ${t.reL}`);
        chk('Ae', Math.abs(a.yieldPointElongationPct! - t.aePct!), 0.4, `${a.yieldPointElongationPct} vs ${t.aePct}`);
      }
    }
    if (a.elasticModulus < 40000 || a.elasticModulus > 450000) miss('silentE', `${rec.what}: E ${a.elasticModulus} used silently`);
    const [lo, hi] = a.measuredModulusInterval95;
    const warned = a.warnings.some((w) => w.code === 'fewElasticPoints' || w.code === 'uncertainModulus' || w.code === 'elasticBandFallback');
    if (!(lo <= t.E && t.E <= hi) && !warned && Math.abs(a.elasticModulus / t.E - 1) > 0.05 * tol) miss('quietE', `${rec.what}: E ${a.elasticModulus} off by more than 5 % outside its interval, no warning`);
  }
  return { fails, count, refused, drops, continuous, agWarned, lowEvidence };
}

// What the misses showed when this test was written (lead's reading, for whoever fixes them):
// - Ag: on a clean top the two-half-parabola vertex sits 0.3–1 point right of the maximum whenever the
//   necking side is not itself a parabola; a local polynomial (or smoothing) fit of the whole top with its
//   stationary point, bandwidth from the noise, is unbiased as the bandwidth shrinks.
// - ReH: the raw highest sample is biased high by 2–3 noise sd on noisy records, while a smoothed peak
//   falls below a single clean peak sample: fit the elastic rise and the drop and let the noise decide.
// - ReL: the undershoot right after the drop is the "initial transient" ISO 6892-1 ignores.
// - Ae: ISO 6892-1 takes the end of the plateau where a regression line of the early work hardening meets the
//   horizontal line through the last local minimum before it (from memory); random serrations above ReL
//   otherwise push the end late.
// - E: correlated load noise (ρ 0.2–0.7) makes the white-noise interval too narrow (account for the lag-1
//   autocorrelation, as the law fits do); a long seating toe reaches into 10–40 % of Rp0.2 (the linear part is
//   the steepest straight stretch of the rise).
// - Rp0.2: misses follow the E misses and sharp knees (Hockett–Sherby with p < 1).
// Misses held as CEILINGS so that a regression fails; the aim is 0 everywhere (issue 12). When this test was
// written (main, 19:55 UTC 2026-12-02): noisy Ag 73, Rp0.2 19, ReL 13, ReH 10, missed drops 6, Ae 4, E off
// unwarned 4; noise-free Ag 200, ReL 34, Ae 11, ReH 9, missed drops 5. After the estimator work (21:05 UTC), the
// counts below: NOT zero. The noisy misses are mostly correlated load noise (ρ 0.4–0.65), which the white-noise
// estimate of the record reads low; see docs/records-and-fits.md.
const CEILINGS_NOISY: Record<string, number> = { Ag: 4, Ae: 4, ReH: 2, 'Rp0.2': 1 };
// Noise-free: met on every seed (ReH was read at a moving average on 3 clean records whose peak sample sat just past
// the peak, 0.5–0.7 % low: the knee test now leaves the peak sample out).
const CEILINGS_CLEAN: Record<string, number> = {};

function holdCeilings(r: HoldoutTally, ceilings: Record<string, number>): void {
  const list = r.fails.slice(0, 40).join('\n');
  for (const k of new Set([...Object.keys(r.count), ...Object.keys(ceilings)])) expect(r.count[k] ?? 0, `${k}\n${list}`).toBeLessThanOrEqual(ceilings[k] ?? 0);
}

describe('record analysis on 200 hold-out INVENTED records (a generator the analysis was not tuned on)', () => {
  it("with noise: issue 12's tolerances (Rp0.2 1 %, Rm 0.4 %, Ag 0.4 point, A 0.5 point, ReH/ReL 1.5 %, Ae 0.4 point)", () => {
    const r = holdoutTally(SEEDS);
    console.log(`hold-out, noisy: ${r.fails.length} misses ${JSON.stringify(r.count)}; ${r.drops} recorded drops, ${r.continuous} continuous, E refused ${r.refused}, Ag warned ${r.agWarned}, drops not found with evidence < 6: ${r.lowEvidence}\n${r.fails.slice(0, 60).join('\n')}`);
    holdCeilings(r, CEILINGS_NOISY);
    // Drops too weak for any test to find reliably (evidence below 6: seeds 1128 at 2.6 and 1059 at 5.5 when this was
    // written) stay the exception.
    expect(r.lowEvidence).toBeLessThanOrEqual(2);
  }, 180_000);
  it('noise-free: a quarter of those tolerances (the estimators are unbiased on clean data)', () => {
    const r = holdoutTally(SEEDS, 0, 0.25);
    console.log(`hold-out, noise-free: ${r.fails.length} misses ${JSON.stringify(r.count)}\n${r.fails.slice(0, 60).join('\n')}`);
    holdCeilings(r, CEILINGS_CLEAN);
  }, 180_000);
});
