import { expect } from 'vitest';
import { analyzeRecord } from '../../../src/core/index.js';

// The tally both hold-out tests run (lab-records-holdout.test.ts, lab-records-holdout-b.test.ts): one set of
// acceptance rules for records from generators written apart from the analysis. INVENTED records only.

/** Truth of a hold-out record (ISO 6892-1 definitions on the noise-free curve), as both hold-out generators give it. */
export interface HoldoutTruthLike {
  E: number; rp02: number; rm: number; agPct: number; aPct: number;
  reH: number | null; reL: number | null; aePct: number | null;
  /** Largest serration on the plateau, fraction of ReL. */
  serration: number;
  /** Samples on the elastic line below 0.9 of the yield stress. */
  elasticPoints: number;
  /** Signal-to-noise of a recorded drop (matched filter), when the generator gives it. */
  dropEvidence?: number | null;
  /** The strain rate raised this many times after the yield region (the flow stress not following it); 1 or absent: one rate. */
  rateRatio?: number;
}
export interface HoldoutRecordLike { strain: Float64Array; stress: Float64Array; truth: HoldoutTruthLike; what: string }

export interface HoldoutTally { fails: string[]; count: Record<string, number>; refused: number; drops: number; continuous: number; agWarned: number; rpWarned: number; lowEvidence: number;
  /** Records whose Ag is off by more than the tolerance, warned or not (the raw accuracy, before any acceptance). */
  agOff: number;
  /** Records made with a change of rate, and those in which the analysis found it. */
  rateChanges: number; rateFound: number;
  /** Records with a yield drop the analysis did not report, and those in which it found the yield plateau (yieldPlateau). */
  unreportedDrops: number; plateauFound: number }

/**
 * Runs the analysis on every hold-out seed of `make` and tallies the misses by property, at issue 12's tolerances
 * times `tol` (Rp0.2 1 %, Rm 0.4 %, Ag 0.4 point, A 0.5 point, ReH/ReL 1.5 %, Ae 0.4 point; continuous curves never
 * report ReH/ReL; an impossible E is never used silently; E off by more than 5 % needs a warning or an interval
 * holding the truth).
 */
export function holdoutTally(make: (seed: number, noiseScale: number) => HoldoutRecordLike, seeds: number[], noiseScale = 1, tol = 1): HoldoutTally {
  const fails: string[] = [];
  const count: Record<string, number> = {};
  let refused = 0, drops = 0, continuous = 0, agWarned = 0, rpWarned = 0, lowEvidence = 0, agOff = 0, rateChanges = 0, rateFound = 0, unreportedDrops = 0, plateauFound = 0;
  const miss = (k: string, msg: string) => { fails.push(msg); count[k] = (count[k] ?? 0) + 1; };
  for (const seed of seeds) {
    const rec = make(seed, noiseScale);
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
    // A miss is accepted only when the analysis says Rp is uncertain (warning, 95 % interval wider than the tolerance
    // that holds the truth): few noisy samples near the offset point, or a loosely measured E, cannot place it closer.
    if (t.serration <= 0.005) {
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
    if (!(agErr <= 0.4 * tol)) agOff++;
    // Ag off by more than 0.4 point is accepted only when the analysis says Ag is uncertain, with a 95 %
    // interval wider than ±0.4 point that holds the truth.
    if (!(agErr <= 0.4 * tol || (agUncertain && agLo <= t.agPct && t.agPct <= agHi))) miss('Ag', `${rec.what}: Ag ${a.uniformElongationPct} vs ${t.agPct} (interval ${agLo.toFixed(2)}–${agHi.toFixed(2)})`);
    chk('A', Math.abs(a.totalElongationPct - t.aPct), 0.5, `${a.totalElongationPct} vs ${t.aPct}`);
    if (t.reH === null) {
      if (rec.what.includes('peak not caught')) { /* either answer is acceptable */ } else {
        continuous++;
        if (a.upperYield !== null) miss('falseYield', `${rec.what}: continuous curve reported ReH ${a.upperYield}`);
        // Nor a yield plateau: the laws would be fitted from a false plateau's end, the curve before it left out.
        const pl = a.warnings.find((w) => w.code === 'yieldPlateau');
        if (pl) miss('falsePlateau', `${rec.what}: ${pl.message}`);
      }
    } else {
      drops++;
      // A drop may go unreported only when its evidence (see HoldoutTruth.dropEvidence) is below 6: a test that keeps
      // continuous curves free of false yield points (about 3.7 noise sd at a false-alarm rate of 10⁻⁴) finds a drop of
      // evidence 6 with probability ≥ 99 % and one of evidence 4 about half the time (the same rule as the property test).
      if (a.upperYield === null) {
        unreportedDrops++;
        if (a.warnings.some((w) => w.code === 'yieldPlateau')) plateauFound++;
        if (t.dropEvidence != null && t.dropEvidence < 6) lowEvidence++;
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
    // The extensometer stays on to fracture on every hold-out record (quantised, noisy, with samples at about zero
    // load after fracture): the strain channel must never be read as ending early.
    if (a.strainChannelEnd !== null) miss('falseStrainEnd', `${rec.what}: strain channel read as ending at sample ${a.strainChannelEnd.index} (${a.strainChannelEnd.kind})`);
    // Nor is any sample read as an acquisition glitch (yield drops, serrations, fracture and noise are the specimen's).
    if (a.warnings.some((w) => w.code === 'glitch')) miss('falseGlitch', `${rec.what}: ${a.warnings.find((w) => w.code === 'glitch')!.message}`);
    // Nor as a file that starts over with a second test (testStarts): every record here is one specimen.
    if (a.warnings.some((w) => w.code === 'secondTest')) miss('falseSecondTest', `${rec.what}: ${a.warnings.find((w) => w.code === 'secondTest')!.message}`);
    // Nor is fracture read as an unloading (no record here is unloaded before it breaks): hold-out C's extensometer reads
    // the specimen's elastic strain coming back as the load falls, and noise peaks on the samples after fracture.
    if (a.cycles.length) miss('falseCycle', `${rec.what}: ${a.cycles.length} unload–reload cycle(s) read, the first at sample ${a.cycles[0]!.unloadIndex}`);
    // A change of rate only where the generator made one; and no step of the flow stress there (its m is 0): a step
    // read from the noise would scale the flow curve the laws and Ag are read from.
    const rate = rec.truth.rateRatio ?? 1;
    const said = a.warnings.find((w) => w.code === 'rateChange')?.message;
    if (a.rateChange !== null && rate === 1) miss('falseRateChange', `${rec.what}: ${said}`);
    if (a.rateChange !== null && a.rateChange.clear) miss('falseRateStep', `${rec.what}: ${said}`);
    if (rate > 1) { rateChanges++; if (a.rateChange !== null) rateFound++; }
    const [lo, hi] = a.measuredModulusInterval95;
    const warned = a.warnings.some((w) => w.code === 'fewElasticPoints' || w.code === 'uncertainModulus' || w.code === 'elasticBandFallback');
    if (!(lo <= t.E && t.E <= hi) && !warned && Math.abs(a.elasticModulus / t.E - 1) > 0.05 * tol) miss('quietE', `${rec.what}: E ${a.elasticModulus} off by more than 5 % outside its interval, no warning`);
  }
  return { fails, count, refused, drops, continuous, agWarned, rpWarned, lowEvidence, agOff, rateChanges, rateFound, unreportedDrops, plateauFound };
}

/** One line on a tally and its misses, for the test's output (what a reader compares between runs). */
export function tallySummary(label: string, r: HoldoutTally): string {
  return `${label}: ${r.fails.length} misses ${JSON.stringify(r.count)}; recorded drops ${r.drops}, continuous ${r.continuous}, E refused ${r.refused}, Ag warned ${r.agWarned}, Ag off ${r.agOff}, Rp warned ${r.rpWarned}, drops unreported ${r.unreportedDrops} (evidence < 6: ${r.lowEvidence}, plateau found ${r.plateauFound}), rate changes found ${r.rateFound} of ${r.rateChanges}\n${r.fails.join('\n')}`;
}

/** Holds every miss count at or below its ceiling (0 where none is named), listing the misses on failure. */
export function holdCeilings(r: HoldoutTally, ceilings: Record<string, number>): void {
  const list = r.fails.slice(0, 40).join('\n');
  for (const k of new Set([...Object.keys(r.count), ...Object.keys(ceilings)])) expect(r.count[k] ?? 0, `${k}\n${list}`).toBeLessThanOrEqual(ceilings[k] ?? 0);
}
