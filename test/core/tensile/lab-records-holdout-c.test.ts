import { describe, expect, it } from 'vitest';
import { holdCeilings, holdoutTally, tallySummary } from './holdout-tally.js';
import { holdoutCRecord } from './lab-records-holdout-c.helpers.js';

// Third hold-out check of the record analysis, on INVENTED records from a generator (lab-records-holdout-c.helpers.ts)
// written apart from the analysis and from the two other generators. What each record is checked against is outside
// the analysis: the truth computed on the generator's own noise-free curve by the definitions of ISO 6892-1 (E, Rp0.2,
// Rm, Ag, A, ReH, ReL, Ae; from memory), at issue 12's tolerances (Rp0.2 1 %, Rm 0.4 %, Ag 0.4 point, A 0.5 point,
// ReH/ReL 1.5 %, Ae 0.4 point), by the shared tally (holdout-tally.ts).
const SEEDS = Array.from({ length: 200 }, (_, i) => 9000 + i);

// Ceilings set to the misses MEASURED when this generator was first run (left for the lead to work on; the counts held
// over two runs while src/core/tensile/yieldPoint.ts was being edited, a few Ae values moved between them):
// with noise (9 misses; 63 recorded drops, 137 continuous, Ag off by more than 0.4 point on 13, Ag warned on 158):
//   Ag    9040 20.47 vs 21.31 (interval 19.50–21.07); 9061 14.93 vs 17.74 (14.12–15.47); 9067 6.28 vs 5.52 (5.93–6.35);
//         9073 20.45 vs 21.57 (19.90–21.02)
//   Ae    9080 1.73 vs 2.14; 9148 1.26 vs 2.20 (first run: 0.85, 0.72)
//   missedYield  9084 753.0/712.9 (evidence 8.4); 9182 388.2/367.8 (evidence 21.4)
//   falseRateChange  9086: "strain per sample falls 2.2× at 6.35 % strain" (one strain step throughout; the strain
//         step, 1.6 µε, is below the extensometer noise, 2.9 µε)
// noise-free, at a quarter of the tolerances (54 misses; Ag off by more than 0.1 point on 11):
//   Ag    10, all high by 0.10–0.19 point with the interval's low end just above the truth: 9004, 9022, 9023, 9068,
//         9084, 9117, 9127, 9149, 9162, 9198
//   ReH   19, all below the highest recorded sample, with a zero-width range: 9004, 9026, 9028, 9030 (the first sample
//         of the fall, 478.9, reported instead of the last of the rise, 481.3), 9032, 9039, 9049, 9065, 9080, 9084,
//         9092, 9101, 9107, 9111, 9170, 9171, 9179, 9196 (627.0 vs 669.0), 9198
//   Ae    19, all short: by 0.1–0.35 point on 9026, 9047, 9080, 9087, 9089, 9102, 9107, 9112, 9118, 9120, 9126, 9130,
//         9166, 9171, 9179, 9194, 9196; by 0.9 on 9025 (1.14 vs 2.06) and 0.8 on 9084 (0.20 vs 1.03)
//   ReL   9025 569.9 vs 566.0
//   missedYield  9073, 9129, 9146, 9148 (noise-free records carry no drop evidence, so every unreported drop counts)
//   quietE  9116 E 42 182 vs about 43 900 MPa (toe 0.244 %), no warning
// Nineteenth session (the lead), after reading those misses:
// - ReH 19 → 0 and missedYield 4 → 0 (noise-free): this generator's elastic rise is linear in TRUE measures, so in
//   engineering ones it bends by about 1.5·e (0.35 % at e = 0.23 %); on a quiet record the knee test read that as a
//   rounded knee and took ReH from a moving average, a good part of a sample step low. The knee must now also be
//   0.1 % of the stress (YIELD_DROP.kneeMinRel).
// - missedYield 9182 (evidence 21): the walk down the rise for the elastic line's refit stopped at a 3σ̂ step back,
//   sure to occur among the thousands of samples a constant-stress-rate rise holds; the line was then the noise's and
//   the departure went to the neck. The walk stops at 8σ̂ now (elasticDeparture, and the rise line of yieldPoint).
// - falseRateChange 9086: windows of three samples next to maximum force, on an extensometer noisier than its step;
//   the change of strain per sample must now stand 5 standard errors clear of the strain channel's own noise.
// - an unload–reload cycle read at fracture on every noisy record (the extensometer reads the elastic strain coming
//   back; noise peaks after fracture): now tallied as `falseCycle` (0), see cycles.ts.
// - Ae: the plateau–hardening hinge's branch no longer bends upward (a convex branch slid the knee early along the
//   plateau): noisy 9080 −1.29 → −0.40 and 9148 −1.47 → −0.93 point.
// Left (measured): noisy Ag 9061 (2.8 points low; the laws still refused); Ae 9080 (0.40 short) and 9148 (0.93 short:
// a random-walk plateau that wanders by 1.8 %, read as hardening at its first rise); missedYield 9084 (evidence 8.4:
// the last 8 samples of the rise fell 3.6 standard errors below the line by chance, the knee test fired and ReH was
// read on a moving average, below the drop threshold). Noise-free: Ae 22, short by 0.1–0.35 point on 19 (this
// generator's Ae ends where the law takes over; the analysis steps back from the hinge by half the serrations'
// amplitude, to where the hardening meets the troughs — the ASTM E8 construction through the last local minimum,
// from memory — while these serrations fade to nothing before the plateau ends) and by 0.9–1.0 on 9025, 9084, 9148
// (plateaus that wander by 1.6–1.8 %); Ag 10, 0.10–0.19 point high (a necking side s = Rm − c·u^q with q down to 1.8,
// sharper than any smooth top); ReL 9025, 9148 (wandering plateaus); quietE 9116 (a 0.244 % seating toe).
// Then Ag's interval widened by the residuals' long-run variance from batch means (forceMaximum.ts): the four noisy
// Ag misses all had hum of 0.2–0.3 % of Rm, which the top's vertex followed while its interval, widened for lag-1
// correlation only, refused the laws. Noisy Ag 4 → 1 (9061 left: 14.93 against 17.74, interval 13.99–15.72), Ag off
// 13 → 11; noise-free Ag 10 → 8.
const CEILINGS_NOISY: Record<string, number> = { Ag: 1, Ae: 2, missedYield: 1 };
// Twenty-third session, the laws' Ag weighted by their residuals over the upper part of the curve (lawTop.ts): Ag
// off 11 → 8.
const AG_OFF_NOISY = 8;
// Twenty-first session: the plateau's end sought only up to maximum force and past its last clear fall
// (yieldPoint.ts, found by hold-out D): noise-free Ae 22 → 21, Ag 8 → 7.
const CEILINGS_CLEAN: Record<string, number> = { Ag: 7, ReL: 2, Ae: 21, quietE: 1 };

describe('record analysis on 200 hold-out C INVENTED records (a third generator the analysis was not tuned on)', () => {
  it("with noise: issue 12's tolerances", () => {
    const r = holdoutTally(holdoutCRecord, SEEDS);
    console.log(tallySummary('hold-out C, noisy', r));
    holdCeilings(r, CEILINGS_NOISY);
    expect(r.agOff).toBeLessThanOrEqual(AG_OFF_NOISY);
  }, 600_000);
  it('noise-free: a quarter of those tolerances', () => {
    const r = holdoutTally(holdoutCRecord, SEEDS, 0, 0.25);
    console.log(tallySummary('hold-out C, noise-free', r));
    holdCeilings(r, CEILINGS_CLEAN);
  }, 600_000);
});
