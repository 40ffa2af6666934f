import { describe, expect, it } from 'vitest';
import { analyzeRecord } from '../../../src/core/index.js';
import { holdoutBRecord } from './lab-records-holdout-b.helpers.js';

// Second hold-out check of the record analysis, on INVENTED records from a generator written after the analysis
// was tuned and kept from whoever tuned it (lab-records-holdout-b.helpers.ts: Ramberg–Osgood gradual yielding
// in three families, a mild steel with a rounded upper yield peak and a sloping sawtooth plateau, strain rate
// raised up to 27× after yielding, white / load-proportional / low-pass-filtered noise, extensometer
// quantisation, an exponential toe, another necking shape, a spread fracture fall with negative loads after it).
// Tolerances are issue 12's; truth by the ISO 6892-1 definitions on the noise-free curve.

const SEEDS = Array.from({ length: 200 }, (_, i) => 5000 + i);

interface HoldoutBTally { fails: string[]; count: Record<string, number>; refused: number; drops: number; continuous: number; agWarned: number; rpWarned: number }

/** Runs the analysis on every hold-out seed and tallies the misses by property. */
function holdoutBTally(seeds: number[], noiseScale = 1, tol = 1): HoldoutBTally {
  const fails: string[] = [];
  const count: Record<string, number> = {};
  let refused = 0, drops = 0, continuous = 0, agWarned = 0, rpWarned = 0;
  const miss = (k: string, msg: string) => { fails.push(msg); count[k] = (count[k] ?? 0) + 1; };
  for (const seed of seeds) {
    const rec = holdoutBRecord(seed, noiseScale);
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
    if (t.serration <= 0.005) {
      // Off by more than 1 % is accepted only when the analysis says Rp is uncertain (E measured too loosely to
      // fix it to ±1 %) and gives a range that holds the truth.
      const pr = a.proofStrengthRange;
      const rpErr = Math.abs(a.proofStrength! - t.rp02) / t.rp02;
      if (rpErr > 0.01 * tol && a.warnings.some((w) => w.code === 'uncertainRp') && pr && (pr[1] - pr[0]) / 2 > 0.01 * tol * a.proofStrength! && pr[0] <= t.rp02 && t.rp02 <= pr[1]) rpWarned++;
      else chk('Rp0.2', rpErr, 0.01, `${a.proofStrength} vs ${t.rp02}${pr ? ` (range ${pr[0].toFixed(1)}–${pr[1].toFixed(1)})` : ''}`);
    }
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
      if (a.upperYield === null) miss('missedYield', `${rec.what}: yield drop ${t.reH.toFixed(1)}/${t.reL!.toFixed(1)} not found`);
      else {
        chk('ReH', Math.abs(a.upperYield - t.reH) / t.reH, 0.015, `${a.upperYield} vs ${t.reH}`);
        chk('ReL', Math.abs(a.lowerYield! - t.reL!) / t.reL!, 0.015, `${a.lowerYield} vs ${t.reL}`);
        chk('Ae', Math.abs(a.yieldPointElongationPct! - t.aePct!), 0.4, `${a.yieldPointElongationPct} vs ${t.aePct}`);
      }
    }
    if (a.elasticModulus < 40000 || a.elasticModulus > 450000) miss('silentE', `${rec.what}: E ${a.elasticModulus} used silently`);
    const [lo, hi] = a.measuredModulusInterval95;
    const warned = a.warnings.some((w) => w.code === 'fewElasticPoints' || w.code === 'uncertainModulus' || w.code === 'elasticBandFallback');
    if (!(lo <= t.E && t.E <= hi) && !warned && Math.abs(a.elasticModulus / t.E - 1) > 0.05 * tol) miss('quietE', `${rec.what}: E ${a.elasticModulus} off by more than 5 % outside its interval, no warning`);
  }
  return { fails, count, refused, drops, continuous, agWarned, rpWarned };
}


// Misses held as CEILINGS so that a regression fails; the aim is 0 (issue 12). Before the initial-tangent E (main,
// 22:50 UTC 2026-12-02): noisy quietE 18 of 100 seeds and Rp0.2 9, all HIGH by 1–7 % (the unsafe side). Measured on
// the merged main (23:50 UTC): still open are noisy stainless-like Rp0.2 off 1–5 % (mostly low now, warned
// `uncertainModulus`), Ag on coarse noisy tops, and noise-free Ag 0.1–0.3 point high on every family (the top
// model's bias when the necking side is a quartic): under the noisy tolerance, not under a quarter of it. A was
// 0.1–0.25 point high on 25 noise-free records (read where a fall spread over samples passes 50 %) until the
// fracture point moved back to where the fall begins: 3 left. A top model chosen by AIC (tried by a helper) took
// noisy Ag misses here from 6 to 29 and was withdrawn.
const CEILINGS_NOISY: Record<string, number> = { 'Rp0.2': 6, Ag: 6, ReH: 1, Ae: 1, quietE: 1, missedYield: 2, Rm: 1 };
const CEILINGS_CLEAN: Record<string, number> = { Ag: 122, A: 3, quietE: 6, Ae: 3, 'Rp0.2': 6 };

function holdCeilings(r: HoldoutBTally, ceilings: Record<string, number>): void {
  const list = r.fails.slice(0, 40).join('\n');
  for (const k of new Set([...Object.keys(r.count), ...Object.keys(ceilings)])) expect(r.count[k] ?? 0, `${k}\n${list}`).toBeLessThanOrEqual(ceilings[k] ?? 0);
}

describe('record analysis on 200 hold-out B INVENTED records (a second generator the analysis was not tuned on)', () => {
  it("with noise: issue 12's tolerances (Rp0.2 1 %, Rm 0.4 %, Ag 0.4 point, A 0.5 point, ReH/ReL 1.5 %, Ae 0.4 point)", () => {
    const r = holdoutBTally(SEEDS);
    console.log(`hold-out B, noisy: ${r.fails.length} misses ${JSON.stringify(r.count)}; ${r.drops} recorded drops, ${r.continuous} continuous, E refused ${r.refused}, Ag warned ${r.agWarned}, Rp warned ${r.rpWarned}\n${r.fails.slice(0, 60).join('\n')}`);
    holdCeilings(r, CEILINGS_NOISY);
  }, 180_000);
  it('noise-free: a quarter of those tolerances', () => {
    const r = holdoutBTally(SEEDS, 0, 0.25);
    console.log(`hold-out B, noise-free: ${r.fails.length} misses ${JSON.stringify(r.count)}\n${r.fails.slice(0, 60).join('\n')}`);
    holdCeilings(r, CEILINGS_CLEAN);
  }, 180_000);
});
