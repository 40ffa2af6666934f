import { cumulativeStdNormalProbability } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  evaluateRoute, evaluateScatterSample, prepareScatter, runScatter, sampleScatterBlock, scatterRouteInput, taborHardness, hollomon, type ScatterProblem,
} from '../../../src/core/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

// INVENTED scenario: a clip-strip shop rolls annealed low-carbon steel to a hardness band. Law: Hollomon
// K 600 MPa, n 0.21 (Callister, Fundamentals of Materials Science and Engineering, 2nd ed., p. 199).
const hardness = { taborFactor: 3.0, representativeStrain: 0.08, basis: 'given' as const };
const problem = (over: Partial<ScatterProblem> = {}): ScatterProblem => ({
  material: { name: 'steel', elasticModulus: 207000, poissonRatio: 0.3, flowCurve: { law: 'hollomon', K: 600, n: 0.21 }, hardness },
  start: { thickness: 1.5 },
  steps: [{ kind: 'roll', thickness: 1.25 }, { kind: 'roll', thickness: 1.0 }],
  targets: { minHardnessHV: 165, maxHardnessHV: 185 },
  inputs: [{ name: 'K', mean: 600, sd: 30 }, { name: 'n', mean: 0.21, sd: 0.01 }],
  correlation: [[1, -0.4], [-0.4, 1]],
  samples: 20000, seed: 15, coverage: 0.9, confidence: 0.95,
  ...over,
});

describe('scatter with hardness targets', () => {
  it('the fast path decides each hardness target as evaluateRoute does, sample by sample', () => {
    const prep = prepareScatter(problem());
    const block = sampleScatterBlock(prep, 0);
    let met = 0;
    for (let s = 0; s < 200; s++) {
      const x = block.inputs.subarray(s * 2, s * 2 + 2);
      const fast = evaluateScatterSample(prep, x);
      const ledger = evaluateRoute(scatterRouteInput(prep, x));
      ledger.targets.forEach((t, i) => expect(((fast.metMask >> (i + 1)) & 1) === 1, `sample ${s} ${t.name}`).toBe(t.met));
      expect((fast.metMask & 1) === 1).toBe(ledger.allTargetsMet);
      // The sample carries the material's c: the ledger's HV is c·σ(ε̄ + εr)/g₀ of the sampled law.
      const law = hollomon({ K: x[0]!, n: x[1]! });
      expect(ledger.rows.at(-1)!.hardnessHV).toBe(taborHardness(law, ledger.rows.at(-1)!.accumulatedStrain, hardness));
      if (ledger.allTargetsMet) met++;
    }
    // Both outcomes occur, so the comparison above is not vacuous.
    expect(met).toBeGreaterThan(10);
    expect(met).toBeLessThan(190);
  });
  it('with only K scattering, P(HV ≥ H) is the normal tail of K beyond the K that gives H (HV ∝ K for Hollomon)', () => {
    const prob = problem({ inputs: [{ name: 'K', mean: 600, sd: 30 }], correlation: [[1]], targets: { minHardnessHV: 165 } });
    const summary = runScatter(prob);
    // Rolling 1.5 → 1.0 mm: ε̄ = (2/√3)·ln 1.5; HV = 3·K·(ε̄ + 0.08)^0.21/9.80665 ≥ 165 ⇔ K ≥ K*.
    const eps = (2 / Math.sqrt(3)) * Math.log(1.5);
    const kStar = (165 * 9.80665) / (3 * (eps + 0.08) ** 0.21);
    const expected = 1 - cumulativeStdNormalProbability((kStar - 600) / 30); // simple-statistics' Φ (table to 4 decimals)
    // N = 20000: binomial sd ≤ 0.0036; the Φ table's own rounding is ≤ 5e-5. Tolerance 4 sd.
    expectAbsClose(summary.targets[0]!.probabilityMet, expected, 0.015);
    expect(expected).toBeGreaterThan(0.2);
    expect(expected).toBeLessThan(0.8);
    // HV ∝ K, so the final hardness is normal with mean HV(600) and sd HV(600)·30/600. N = 20000:
    // the mean's sampling sd is 0.035 % of it, the sd's 0.5 %; tolerances are about 4 sampling sd.
    const hv600 = (3 * 600 * (eps + 0.08) ** 0.21) / 9.80665;
    expectRelClose(summary.hardnessHV.mean, hv600, 0.0015);
    expectRelClose(summary.hardnessHV.sd, hv600 * 0.05, 0.02);
    expectRelClose(summary.hardnessHV.p50, hv600, 0.002);
  });
});
