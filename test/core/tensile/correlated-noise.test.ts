import { describe, expect, it } from 'vitest';
import { analyzeRecord, synthesizeLabRecord, xoshiro128ss } from '../../../src/core/index.js';
import { labCase, withArNoise } from './lab-records.helpers.js';

// Rp0.2's range on records whose load noise is correlated from sample to sample (an acquisition filter: AR(1), lag-1
// correlation ρ; the model as in Box & Jenkins, *Time Series Analysis*, ch. 3, from memory). INVENTED records: the
// property test's continuous curves (labCase, synthesizeLabRecord with no noise), then AR(1) noise of the case's own
// sd (0.1–1 % of Rm) added here with ρ = 0.7. The truth is the noise-free curve's Rp0.2 (ISO 6892-1 offset
// construction, computed by the generator). A 95 % range should hold it on about 95 of 100 records; the local fit's
// own residuals (13–150 samples about a parabola near the crossing) read ρ near 0 where it is 0.7, and with them
// the range held the truth on 68 of these 80 records only (85 %), and one record was off by more than 1 % unwarned
// (measured on main at 5753967). With the noise's correlation read over the whole record (noiseLag1): 75 of 80, none; 76 with
// E's interval widened for it too.
const RHO = 0.7;

describe("Rp0.2's range and E's interval under correlated load noise (INVENTED records, AR(1))", () => {
  it('holds the noise-free truth on at least 90 % of 80 continuous records, and every Rp0.2 off by more than 1 % is warned', () => {
    let n = 0, held = 0, offUnwarned = 0;
    const misses: string[] = [];
    for (let seed = 0; n < 80; seed++) {
      const c = labCase(seed);
      if (c.spec.yieldDrop) continue;
      const clean = synthesizeLabRecord({ ...c.spec, noise: 0, rng: xoshiro128ss(seed) });
      const rec = { strain: clean.strain, stress: withArNoise(clean.stress, c.spec.noise!, RHO, seed) };
      let a;
      try { a = analyzeRecord(rec, { fit: false }); } catch { continue; } // E refused: too few samples on the rise
      const t = clean.truth.proofStrength, pr = a.proofStrengthRange;
      if (a.proofStrength === null || !pr) continue;
      n++;
      if (pr[0] <= t && t <= pr[1]) held++;
      else misses.push(`${c.what}: Rp0.2 ${a.proofStrength.toFixed(1)} vs ${t.toFixed(1)} (range ${pr[0].toFixed(1)}–${pr[1].toFixed(1)})`);
      if (Math.abs(a.proofStrength - t) > 0.01 * t && !a.warnings.some((w) => w.code === 'uncertainRp')) offUnwarned++;
    }
    console.log(`Rp0.2 range held the truth on ${held} of ${n}; off by more than 1 % unwarned ${offUnwarned}\n${misses.join('\n')}`);
    expect(held / n).toBeGreaterThanOrEqual(0.9);
    expect(offUnwarned).toBe(0);
  }, 300_000);

  it("E's 95 % interval holds the generator's E on at least 90 % of 80 records with AR(1) noise of ρ 0.85", () => {
    // The band's own residuals (20–200 samples about a line) read ρ 0.85 low; with them alone the interval held E on
    // 68 of these 80 (85 %; 78 of 80 with white noise), measured before the record-wide figure floored it: 79 now.
    let n = 0, held = 0;
    for (let seed = 0; n < 80; seed++) {
      const c = labCase(seed);
      if (c.spec.yieldDrop) continue;
      const clean = synthesizeLabRecord({ ...c.spec, noise: 0, rng: xoshiro128ss(seed) });
      let a;
      try { a = analyzeRecord({ strain: clean.strain, stress: withArNoise(clean.stress, c.spec.noise!, 0.85, seed) }, { fit: false }); } catch { continue; }
      n++;
      const [lo, hi] = a.measuredModulusInterval95;
      if (lo <= c.spec.elasticModulus && c.spec.elasticModulus <= hi) held++;
    }
    expect(held / n, `${held} of ${n}`).toBeGreaterThanOrEqual(0.9);
  }, 300_000);
});
