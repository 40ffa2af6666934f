import { describe, expect, it } from 'vitest';
import { analyzeRecord, spreadStrainSteps, strainSteps, xoshiro128ss } from '../../../src/core/index.js';
import { holdoutRecord } from './lab-records-holdout.helpers.js';
import { holdoutBRecord } from './lab-records-holdout-b.helpers.js';
import { holdoutCRecord } from './lab-records-holdout-c.helpers.js';
import { holdCeilings, holdoutTally, type HoldoutRecordLike } from './holdout-tally.js';

// A strain column written with few digits (percent with two decimals: steps of 1e-4; common practice in exported
// summaries) moves in whole steps and, where the samples advance by less than a step, holds each reading over several
// samples. INVENTED records only: the hold-out generators' records (written apart from the analysis), rounded here
// to the file's resolution; the truth is the generators' own (ISO 6892-1 definitions on the noise-free curve, from
// memory).

const round = (a: ArrayLike<number>, q: number) => Float64Array.from(a as ArrayLike<number>, (x) => Math.round(x / q) * q);
function rounded(r: HoldoutRecordLike, qe: number, qs: number) {
  return { strain: round(r.strain, qe), stress: round(r.stress, qs) };
}

describe('strainSteps: the step a strain column moves in', () => {
  it('finds the step of a column rounded to it, coarse when readings are held', () => {
    // A ramp of 2e-5 per sample written in steps of 1e-4: each reading held about 5 samples.
    const e = Float64Array.from({ length: 500 }, (_, i) => Math.round((i * 2e-5) / 1e-4) * 1e-4);
    const s = strainSteps(e)!;
    expect(s.step).toBeCloseTo(1e-4, 12);
    expect(s.coarse).toBe(true);
    expect(s.samplesPerReading).toBeGreaterThan(4.5);
    expect(s.samplesPerReading).toBeLessThan(5.5);
    // Advancing 1.6 steps a sample: moves of 1 and 2 steps, no reading held — on the lattice, not coarse.
    const f = Float64Array.from({ length: 500 }, (_, i) => Math.round((i * 1.6e-4) / 1e-4) * 1e-4);
    const g = strainSteps(f)!;
    expect(g.step).toBeCloseTo(1e-4, 12);
    expect(g.coarse).toBe(false);
  });
  it('finds no steps in a continuous channel, nor in one that only holds (an extensometer taken off)', () => {
    const rng = xoshiro128ss(3);
    const e = Float64Array.from({ length: 2000 }, (_, i) => i * 1e-5 + 2e-6 * (rng.nextFloat() - 0.5));
    expect(strainSteps(e)).toBeNull();
    // The same channel held at its reading from sample 1000 on: half the samples repeat, yet the moves before are
    // not on a lattice.
    const h = Float64Array.from(e, (x, i) => (i >= 1000 ? e[999]! : x));
    expect(strainSteps(h)).toBeNull();
  });
  it('finds no rounding in a channel that advances by one amount every sample, even when it is later held', () => {
    // On a lattice of its own advance, but every move the same: nothing is rounded (a noise-free or regular channel).
    const e = Float64Array.from({ length: 2000 }, (_, i) => i * 1.5e-4);
    expect(strainSteps(e)).toBeNull();
    // Held from sample 1500 on (an extensometer taken off): one turn from moving to held, no rounding.
    expect(strainSteps(Float64Array.from(e, (x, i) => (i >= 1500 ? e[1499]! : x)))).toBeNull();
    // The same channel at 1.5 steps of 1e-4 per sample, rounded: moves of 1 and 2 steps in turn.
    expect(strainSteps(round(e, 1e-4))?.step).toBeCloseTo(1e-4, 12);
  });
});

describe('spreadStrainSteps: the strain read between its steps', () => {
  it('stays inside every recorded step and comes back close to the strain before rounding', () => {
    const q = 1e-4;
    const truth = Float64Array.from({ length: 3000 }, (_, i) => 1e-6 * i + 5e-10 * i * i);
    const rec = round(truth, q);
    const spread = spreadStrainSteps(rec, q);
    let worstRaw = 0, worstSpread = 0;
    for (let i = 0; i < rec.length; i++) {
      // Every value rounds back to what the file holds.
      expect(Math.round(spread[i]! / q)).toBe(Math.round(rec[i]! / q));
      if (i > 200 && i < rec.length - 200) {
        worstRaw = Math.max(worstRaw, Math.abs(rec[i]! - truth[i]!));
        worstSpread = Math.max(worstSpread, Math.abs(spread[i]! - truth[i]!));
      }
    }
    // Rounding leaves up to half a step; read between the steps, a steady advance is recovered to a few percent of one.
    expect(worstRaw).toBeGreaterThan(0.45 * q);
    expect(worstSpread).toBeLessThan(0.05 * q);
    // The record itself is not changed.
    expect(rec[150]).toBe(Math.round(truth[150]! / q) * q);
  });
  it('leaves turns of the strain and the record ends as recorded', () => {
    const e = [0, 0, 0, 1, 1, 1, 2, 2, 1, 1, 1, 0, 0].map((k) => k * 1e-4);
    const out = spreadStrainSteps(e, 1e-4);
    // The first run (record start), the turn at 2 (2 between 1 and 1) and the last run (record end) are as recorded.
    expect(Array.from(out.subarray(0, 3))).toEqual([0, 0, 0]);
    expect(out[6]).toBe(2e-4);
    expect(out[7]).toBe(2e-4);
    expect(out[12]).toBe(0);
    // The rising run 1, 1, 1 spreads from 0.5 to 1.5 steps; the falling one from 1.5 down to 0.5.
    expect(out[3]! / 1e-4).toBeCloseTo(0.5 + 0.5 / 3, 9);
    expect(out[5]! / 1e-4).toBeCloseTo(1.5 - 0.5 / 3, 9);
    expect(out[8]! / 1e-4).toBeCloseTo(1.5 - 0.5 / 3, 9);
    expect(out[10]! / 1e-4).toBeCloseTo(0.5 + 0.5 / 3, 9);
  });
});

describe('analyzeRecord on records whose strain is written in steps of 1e-4 (INVENTED hold-out records, rounded)', () => {
  it('a yield drop of evidence 366 is still found, ReH/ReL within 1.5 %, Ae within 0.4 point', () => {
    // Hold-out A 1047: 166,485 samples, steel, drop 9.3 %; 4,664 samples on the elastic rise, each reading of the
    // column held about 270 samples there. Read as exact, the staircase was taken for gradual yielding and no drop
    // was reported.
    const r = holdoutRecord(1047, 1);
    const a = analyzeRecord(rounded(r, 1e-4, 1), { fit: false });
    expect(a.strainSteps?.coarse).toBe(true);
    expect(a.warnings.some((w) => w.code === 'coarseStrain')).toBe(true);
    expect(a.warnings.some((w) => w.code === 'gradualYield')).toBe(false);
    expect(Math.abs(a.upperYield! / r.truth.reH! - 1)).toBeLessThan(0.015);
    expect(Math.abs(a.lowerYield! / r.truth.reL! - 1)).toBeLessThan(0.015);
    expect(Math.abs(a.yieldPointElongationPct! - r.truth.aePct!)).toBeLessThan(0.4);
    expect(Math.abs(a.elasticModulus / r.truth.E - 1)).toBeLessThan(0.05);
  });
  it('a sharp peak on a rise of 7 samples is not read as a rounded knee (ReH within 1.5 %)', () => {
    // Hold-out A 1023: 1,674 samples, 7 on the rise, 1.6 steps a sample: the rounding (6 MPa on the rise) is 12 times
    // the load noise; taken as the noise's, the knee test fired and ReH was read on a moving average, 2.6 % low.
    const r = holdoutRecord(1023, 1);
    const a = analyzeRecord(rounded(r, 1e-4, 1), { fit: false });
    expect(a.strainSteps?.coarse).toBe(false);
    expect(a.warnings.some((w) => w.code === 'coarseStrain')).toBe(true);
    expect(Math.abs(a.upperYield! / r.truth.reH! - 1)).toBeLessThan(0.015);
  });
  it('a reading held over the last samples of necking and the fracture fall is not the extensometer taken off', () => {
    // Hold-out B 5005 and 5048: the last reading held 7–20 samples while the force fell into fracture.
    for (const seed of [5005, 5048]) {
      const r = holdoutBRecord(seed, 1);
      const a = analyzeRecord(rounded(r, 1e-4, 1), { fit: false });
      expect(a.strainChannelEnd, String(seed)).toBeNull();
      expect(Math.abs(a.totalElongationPct - r.truth.aPct), String(seed)).toBeLessThan(0.5);
    }
  });
  it('the strain written with 6 decimals: nothing said, the properties as unrounded', () => {
    const r = holdoutRecord(1047, 1);
    const fine = analyzeRecord(rounded(r, 1e-6, 0.01), { fit: false });
    const raw = analyzeRecord(r, { fit: false });
    expect(fine.strainSteps).toBeNull();
    expect(fine.warnings.some((w) => w.code === 'coarseStrain')).toBe(false);
    // Rounding of 1e-6 strain and 0.01 MPa moves nothing by more than a few hundredths of a percent.
    for (const k of ['proofStrength', 'upperYield', 'lowerYield', 'tensileStrength', 'elasticModulus'] as const) expect(Math.abs(fine[k]! / raw[k]! - 1), k).toBeLessThan(5e-4);
    expect(Math.abs(fine.yieldPointElongationPct! - raw.yieldPointElongationPct!)).toBeLessThan(0.01);
  });
});

describe('the three hold-out generators, strain written in steps of 1e-4 and stress in whole MPa (INVENTED records)', () => {
  // The first 60 records of each generator, rounded; the shared tally at issue 12's tolerances against each
  // generator's own truth (computed before rounding). Misses MEASURED before the strain was read between its steps
  // (twentieth session): A {Ag 2, missedYield 3, ReH 1}, B {falseStrainEnd 9, ReH 3, Ag 1, missedYield 2},
  // C {quietE 1, missedYield 1, ReH 2}; the same records unrounded: A {Ag 1}, B {}, C {}.
  // Now (held as ceilings): A {Ag 1 (1000, as unrounded), missedYield 1 (1026, evidence 6.1 before rounding)};
  // B none; C {quietE 1 (9028: E 5 % low, no warning), missedYield 2 (9032, evidence 8.1, its plateau reported;
  // 9037, peak not caught), ReH 1 (9058, 2.3 % low at a noise of 1 % of Rm)}.
  const roundedMake = (make: (seed: number, noiseScale: number) => HoldoutRecordLike) => (seed: number, noiseScale: number): HoldoutRecordLike => {
    const r = make(seed, noiseScale);
    return { ...r, ...rounded(r, 1e-4, 1), what: `${r.what} [strain in steps of 1e-4, stress in whole MPa]` };
  };
  const cases = [
    ['A', holdoutRecord, 1000, { Ag: 1, missedYield: 1 }],
    ['B', holdoutBRecord, 5000, {}],
    ['C', holdoutCRecord, 9000, { quietE: 1, missedYield: 2, ReH: 1 }],
  ] as const;
  for (const [name, make, base, ceilings] of cases) {
    it(`hold-out ${name}`, () => {
      const r = holdoutTally(roundedMake(make), Array.from({ length: 60 }, (_, i) => base + i));
      console.log(`hold-out ${name} rounded: ${r.fails.length} misses ${JSON.stringify(r.count)}; drops ${r.drops}, Ag off ${r.agOff}\n${r.fails.join('\n')}`);
      holdCeilings(r, ceilings);
      // The rounding is exercised: some records' drops are there to be found.
      expect(r.drops).toBeGreaterThan(10);
    }, 600_000);
  }
});
