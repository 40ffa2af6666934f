import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { equivalentPerMajor, evaluateRoute, hillLocalizedLimit, hollomon, sheetFormability, swift, swiftDiffuseLimit, swiftInstabilityRate, voce, type Material } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

// Strains are true strains; β = ε2/ε1; von Mises isotropic sheet.
describe('hillLocalizedLimit(n, β) = n/(1 + β) for β ≤ 0 (Hill 1952; Marciniak, Duncan & Hu, Mechanics of Sheet Metal Forming, §5.4)', () => {
  it('plane strain β = 0 gives n; uniaxial β = −1/2 gives 2n', () => {
    expectRelClose(hillLocalizedLimit(0.21, 0), 0.21, 1e-15);
    expectRelClose(hillLocalizedLimit(0.21, -0.5), 0.42, 1e-15);
  });
  it('sheetFormability of an annealed Hollomon sheet equals n/(1 + β) for every β ≤ 0 (property, seeded)', () => {
    fc.assert(fc.property(fc.double({ min: 0.05, max: 0.6, noNaN: true }), fc.double({ min: -0.9, max: 0, noNaN: true }), (n, beta) => {
      const f = sheetFormability(hollomon({ K: 500, n }), 0, beta);
      // Brent to 1e-14 in strain; 1e-9 relative is a safe bound.
      return f.criterion === 'hillLocalized' && Math.abs(f.remainingMajorStrain - n / (1 + beta)) <= 1e-9 * n;
    }), { seed: 7101, numRuns: 200 });
  });
});

describe('swiftDiffuseLimit(n, β) (Swift 1952; Marciniak, Duncan & Hu §5.3, form from memory)', () => {
  it('reduces to ε1 = n in uniaxial tension (Considère), plane strain and equibiaxial tension', () => {
    for (const beta of [-0.5, 0, 1]) expectRelClose(swiftDiffuseLimit(0.44, beta), 0.44, 1e-15, `β = ${beta}`);
  });
  it('its instability rate is 1 in uniaxial tension: dσ/dε = σ (Considère, Dieter §8-3)', () => {
    expectRelClose(swiftInstabilityRate(-0.5), 1, 1e-15);
  });
  it('is above n between plane strain and equibiaxial (a maximum at β = 1/2: 2n·1.75/(1.5·2) = 7n/6)', () => {
    expectRelClose(swiftDiffuseLimit(0.3, 0.5), 0.35, 1e-14);
  });
  it('sheetFormability for β > 0 on annealed Hollomon equals the closed form (property, seeded)', () => {
    fc.assert(fc.property(fc.double({ min: 0.05, max: 0.6, noNaN: true }), fc.double({ min: 0.01, max: 1, noNaN: true }), (n, beta) => {
      const f = sheetFormability(hollomon({ K: 500, n }), 0, beta);
      return f.criterion === 'swiftDiffuse' && Math.abs(f.remainingMajorStrain - swiftDiffuseLimit(n, beta)) <= 1e-9 * n;
    }), { seed: 7102, numRuns: 200 });
  });
});

describe('sheetFormability(law, ε̄0, β): remaining formability of the current state', () => {
  it('after prestrain ε̄0 a Hollomon sheet has (n·φ/(1 + β) − ε̄0)/φ left in mode β ≤ 0', () => {
    const n = 0.21;
    for (const beta of [-0.5, -0.25, 0]) {
      const phi = equivalentPerMajor(beta);
      const f = sheetFormability(hollomon({ K: 600, n }), 0.1, beta);
      expectRelClose(f.remainingMajorStrain, (n * phi / (1 + beta) - 0.1) / phi, 1e-9, `β = ${beta}`);
    }
  });
  it('is zero once the state is past the limit, and works for a saturating law (Voce)', () => {
    expect(sheetFormability(hollomon({ K: 600, n: 0.2 }), 0.5, 0).remainingMajorStrain).toBe(0);
    const v = voce({ sigma0: 200, Q: 150, b: 8 });
    const f = sheetFormability(v, 0, -0.5);
    // Hill uniaxial: σ'/σ = 1/2 at the limit.
    expectRelClose(v.slope(f.limitEquivalentStrain) / v.stress(f.limitEquivalentStrain), 0.5, 1e-9, 'rate');
  });
  it('a law without a closed form (Swift) is solved so that (1/σ)·dσ/dε equals the criterion rate at the limit', () => {
    const law = swift({ K: 550, eps0: 0.01, n: 0.25 });
    for (const beta of [-0.5, 0, 0.5]) {
      const f = sheetFormability(law, 0.02, beta);
      expect(f.converged).toBe(true);
      const z = beta <= 0 ? (1 + beta) / equivalentPerMajor(beta) : swiftInstabilityRate(beta);
      // Brent to 1e-14 in strain; the rate is smooth, so 1e-9 relative.
      expectRelClose(law.slope(f.limitEquivalentStrain) / law.stress(f.limitEquivalentStrain), z, 1e-9, `rate at β = ${beta}`);
      // Swift from eps0: ε̄* = n/z − eps0 (same algebra as Hollomon, shifted).
      expectRelClose(f.limitEquivalentStrain, 0.25 / z - 0.01, 1e-9, 'closed-form check');
    }
  });
  it('the ledger reports formingLimitMajorStrain on sheet stretching steps, in the step\'s own strain ratio', () => {
    // Callister annealed low-carbon steel K 600 MPa, n 0.21.
    const m: Material = { name: 'steel sheet', elasticModulus: 207000, poissonRatio: 0.3, law: hollomon({ K: 600, n: 0.21 }) };
    const ledger = evaluateRoute({ material: m, start: { thickness: 1, width: 100 }, steps: [
      { kind: 'roll', reductionPct: 5 }, { kind: 'stretch', strain: 0.05 }, { kind: 'stretchBiaxial', strain: 0.02 },
    ] });
    expect(ledger.rows[0]).not.toHaveProperty('formingLimitMajorStrain');
    const e1 = ledger.rows[1]!.accumulatedStrain;
    expectRelClose(ledger.rows[1]!.formingLimitMajorStrain!, 2 * 0.21 - e1, 1e-9, 'uniaxial: Hill 2n − ε̄');
    const e2 = ledger.rows[2]!.accumulatedStrain;
    expectRelClose(ledger.rows[2]!.formingLimitMajorStrain!, (0.21 / swiftInstabilityRate(1) - e2) / 2, 1e-9, 'equibiaxial: Swift');
    // Wire has no sheet limit.
    expect(evaluateRoute({ material: m, start: { diameter: 3 }, steps: [{ kind: 'stretch', strain: 0.05 }] }).rows[0]).not.toHaveProperty('formingLimitMajorStrain');
  });
});
