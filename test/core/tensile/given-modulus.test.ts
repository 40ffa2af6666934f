import { describe, expect, it } from 'vitest';
import { analyzeRecord, synthesizeLabRecord, xoshiro128ss } from '../../../src/core/index.js';
import { labCase } from './lab-records.helpers.js';
import { holdoutBRecord } from './lab-records-holdout-b.helpers.js';

// Rp0.2 with the modulus GIVEN (`--modulus`, the record bench's field): what the analysis tells users to do when E
// is uncertain. Truth: the ISO 6892-1 offset construction on each INVENTED record's noise-free curve. With E given the
// toe e0 is read from the elastic band; on round-house curves (hold-out B's stainless-like and aluminium-like
// Ramberg–Osgood records, n 4–25) a band reaching 70 % of Rp0.2 carries microplastic strain, whose mean entered e0
// and read Rp0.2 up to 2.9 % HIGH on noise-free records (15 of 150 continuous ones off by more than 1 %; noisy 21) —
// worse than with E measured. Measured 2026-12-03 after e0 came from the band's samples up to 40 % of Rp0.2:
// noise-free worst +0.22 % (hold-out B), −0.07 % (property test); noisy hold-out B off by more than 1 % on 1 of 152.
describe('Rp0.2 with the modulus given (continuous INVENTED records)', () => {
  it('noise-free: within a quarter of the 1 % tolerance on the property test and hold-out B; noisy hold-out B: the tolerance held but for one', () => {
    const worst = { P0: 0, B0: 0 }; let bOff = 0, bN = 0, b0N = 0, p0N = 0;
    for (let seed = 0; seed < 240; seed++) {
      const c = labCase(seed);
      const rec = synthesizeLabRecord({ ...c.spec, noise: 0, rng: xoshiro128ss(seed) });
      const a = analyzeRecord(rec, { fit: false, elasticModulus: rec.truth.elasticModulus });
      if (a.upperYield !== null) continue; // Rp0.2 on a yield plateau is tested with the plateau (lab-records.test.ts)
      p0N++;
      const e = Math.abs(a.proofStrength! / rec.truth.proofStrength - 1) * 100;
      worst.P0 = Math.max(worst.P0, e);
    }
    for (let seed = 5000; seed < 5200; seed++) for (const nz of [1, 0]) {
      const r = holdoutBRecord(seed, nz);
      const a = analyzeRecord(r, { fit: false, elasticModulus: r.truth.E });
      if (a.upperYield !== null) continue;
      const e = Math.abs(a.proofStrength! / r.truth.rp02 - 1) * 100;
      if (nz) { bN++; if (e > 1) bOff++; } else { b0N++; worst.B0 = Math.max(worst.B0, e); }
    }
    console.log(`given E: property test noise-free worst ${worst.P0.toFixed(3)} % of ${p0N}; hold-out B noise-free worst ${worst.B0.toFixed(3)} % of ${b0N}, noisy off by more than 1 % on ${bOff} of ${bN}`);
    expect(p0N).toBeGreaterThanOrEqual(150);
    expect(b0N).toBeGreaterThanOrEqual(140);
    expect(worst.P0).toBeLessThan(0.25);
    expect(worst.B0).toBeLessThan(0.25);
    expect(bOff).toBeLessThanOrEqual(1);
  }, 900_000); // 640 analyses with the six laws fitted for Ag: 214–296 s on this 2-core machine, 575 s under load
});
