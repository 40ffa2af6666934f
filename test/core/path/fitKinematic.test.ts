import { describe, expect, it } from 'vitest';
import { fitKinematic, integratePath, normalSampler, voce, xoshiro128ss, type PathMaterial } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

// Round-trip fits (generate from known parameters, fit, recover), the habit STYLE.md asks for. E 207 GPa
// for plain steel (Callister Table B.2); the Voce law and the backstresses are invented test inputs.
const law = voce({ sigma0: 250, Q: 200, b: 15 });
const base: PathMaterial = { elasticModulus: 207000, law };

function record(truth: PathMaterial, history: number[], noise: number, seed: number) {
  const pts = integratePath(truth, history, { maxIncrement: 2e-4 }).points.slice(1);
  const rnd = normalSampler(xoshiro128ss(seed));
  return { strain: pts.map((p) => p.strain), stress: pts.map((p) => p.stress + noise * rnd()) };
}

describe('fitKinematic(material, strain, stress)', () => {
  it('recovers one backstress from a tension–compression reversal without noise', () => {
    const truth = { ...base, kinematic: { backstresses: [{ C: 30000, gamma: 200 }] } };
    const r = record(truth, [0.03, -0.03], 0, 1);
    const f = fitKinematic(base, r.strain, r.stress);
    expect(f.converged).toBe(true);
    expectRelClose(f.kinematic.backstresses[0]!.C, 30000, 1e-4, 'C');
    expectRelClose(f.kinematic.backstresses[0]!.gamma, 200, 1e-4, 'γ');
    expect(f.rmse).toBeLessThan(1e-3);
  });

  it('recovers two backstresses from tension–compression loops with seeded noise, within 3 standard errors', () => {
    // Noise 2 MPa (a typical load-cell scatter on a 500 MPa signal; common practice).
    const truth = { ...base, kinematic: { backstresses: [{ C: 40000, gamma: 400 }, { C: 1500, gamma: 10 }] } };
    const r = record(truth, [0.01, -0.01, 0.02, -0.02, 0.03], 2, 20261201);
    const f = fitKinematic(base, r.strain, r.stress, { backstresses: 2 });
    expect(f.converged).toBe(true);
    const got = [...f.kinematic.backstresses].sort((a, b) => b.gamma - a.gamma);
    const se = f.kinematic.backstresses[0]!.gamma === got[0]!.gamma ? f.standardErrors : [...f.standardErrors].reverse();
    const want = [{ C: 40000, gamma: 400 }, { C: 1500, gamma: 10 }];
    want.forEach((w, j) => {
      expect(Math.abs(got[j]!.C - w.C), `C${j + 1} within 3 SE`).toBeLessThanOrEqual(3 * se[j]!.C!);
      expect(Math.abs(got[j]!.gamma - w.gamma), `γ${j + 1} within 3 SE`).toBeLessThanOrEqual(3 * se[j]!.gamma!);
    });
    expectRelClose(f.rmse, 2, 0.15, 'rmse near the noise level');
  });

  it('refuses a monotonic record: it does not determine the backstresses', () => {
    const r = record(base, [0.03], 0, 1);
    expect(() => fitKinematic(base, r.strain, r.stress)).toThrow(/record: .*allowed a record with at least one unloading or reversal/);
  });
});
