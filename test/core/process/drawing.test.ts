import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { drawingStress, evaluateRoute, hollomon, InputError, maxDrawReduction, RAD_PER_DEG, voce, type Material } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

// Strain basis throughout: true strain ln(A0/A1) of the pass; flow stresses are uniaxial true stresses.

describe('maxDrawReduction(law, ε0, α = 0, μ = 0): the ideal-work limits', () => {
  it('is 1 − 1/e = 63.2 % for a non-hardening metal (CHECKS.md; Hosford & Caddell, Metal Forming, ch. 6; Groover, Fundamentals of Modern Manufacturing, wire drawing)', () => {
    // Voce with Q = 0 is a constant flow stress of 300 MPa (any value gives the same limit).
    const r = maxDrawReduction(voce({ sigma0: 300, Q: 0, b: 1 }), 0, 0, 0);
    expect(r.converged).toBe(true);
    // Brent converges to 1e-13 in strain, so 1e-10 relative is a safe bound.
    expectRelClose(r.strain, 1, 1e-10, 'pass strain');
    expectRelClose(r.areaReductionPct, 100 * (1 - Math.exp(-1)), 1e-10, 'area reduction %');
  });
  // n values: Callister, Fundamentals of Materials Science and Engineering, 2nd ed., p. 199 (annealed
  // low-carbon steel 0.21, copper 0.44, 4340 tempered 0.12, 2024-T3 0.17).
  for (const [what, K, n] of [['low-carbon steel', 600, 0.21], ['copper', 530, 0.44], ['4340 steel', 2650, 0.12], ['2024-T3', 780, 0.17]] as const) {
    it(`is 1 − e^−(n+1) for a Hollomon metal from the annealed state: ${what}, n = ${n} (CHECKS.md; Hosford & Caddell, ch. 6)`, () => {
      const r = maxDrawReduction(hollomon({ K, n }), 0, 0, 0);
      expectRelClose(r.strain, n + 1, 1e-10, 'pass strain');
      expectRelClose(r.areaReductionPct, 100 * -Math.expm1(-(n + 1)), 1e-10, 'area reduction %');
    });
  }
  it('falls with prior work hardening: a non-hardening metal stays at ε = 1, Hollomon tends to it', () => {
    const law = hollomon({ K: 600, n: 0.21 });
    const r0 = maxDrawReduction(law, 0, 0, 0).strain;
    const r1 = maxDrawReduction(law, 1, 0, 0).strain;
    expect(r1).toBeLessThan(r0);
    expect(r1).toBeGreaterThan(1);
  });
  it('at the limit the drawing stress equals the exit flow stress (the defining equation)', () => {
    const law = hollomon({ K: 530, n: 0.44 });
    const a = 8 * RAD_PER_DEG;
    const r = maxDrawReduction(law, 0.3, a, 0.08);
    const Y = (law.work(0.3 + r.strain) - law.work(0.3)) / r.strain;
    expectRelClose(drawingStress(Y, r.strain, a, 0.08).stress, law.stress(0.3 + r.strain), 1e-9, 'σd = σ(exit)');
  });
});

describe('drawingStress(Ȳ, ε, α, μ): Siebel form', () => {
  it('reduces to the ideal work Ȳ·ln(A0/A1) with no friction and no redundant work (CHECKS.md)', () => {
    const d = drawingStress(400, Math.log(1 / 0.8), 0, 0);
    expectRelClose(d.stress, 400 * Math.log(1.25), 1e-15, 'σd');
    expect(d.friction).toBe(0);
    expect(d.redundant).toBe(0);
  });
  it('adds friction Ȳ·(μ/α)·ε and redundant work (2/3)·Ȳ·α (Dieter, Mechanical Metallurgy, §19-4; form from memory)', () => {
    const a = 6 * RAD_PER_DEG;
    const e = Math.log(1 / 0.8);
    const d = drawingStress(400, e, a, 0.05);
    // Hand calculation from the formula: 400·[(1 + 0.05/0.104720)·0.223144 + 0.069813] = 159.79 MPa.
    expectRelClose(d.stress, 159.79, 1e-4, 'σd (hand value to 5 digits)');
    expectRelClose(d.stress, d.ideal + d.friction + d.redundant, 1e-15, 'parts add up');
  });
  it('ideal-work drawing force of a worked example: 10 → 8 mm rod, K = 1300 MPa, n = 0.30 (Kalpakjian & Schmid, Manufacturing Engineering and Technology, drawing example; from memory: F ≈ 17.6 kN)', () => {
    const law = hollomon({ K: 1300, n: 0.3 });
    const m: Material = { name: '302 stainless (handbook law)', elasticModulus: 193000, poissonRatio: 0.3, law };
    const row = evaluateRoute({ material: m, start: { diameter: 10 }, steps: [{ kind: 'draw', diameter: 8, dieHalfAngleDeg: 0, friction: 0 }] }).rows[0]!;
    // The book rounds Ȳ and ε to three digits, so 1 % is the honest bound.
    expectRelClose(row.drawingForce!, 17.6e3, 0.01, 'drawing force N');
  });
  it('is never below the ideal work, whatever the die angle and friction (property, seeded)', () => {
    fc.assert(fc.property(
      fc.double({ min: 1, max: 3000, noNaN: true }), fc.double({ min: 0, max: 2, noNaN: true }),
      fc.double({ min: 0.5, max: 30, noNaN: true }), fc.double({ min: 0, max: 0.5, noNaN: true }),
      (Y, e, deg, mu) => {
        const d = drawingStress(Y, e, deg * RAD_PER_DEG, mu);
        return d.stress >= Y * e && d.friction >= 0 && d.redundant > 0;
      }), { seed: 7007, numRuns: 500 });
  });
  it('friction and redundant work lower the largest reduction below the ideal one (property, seeded)', () => {
    fc.assert(fc.property(
      fc.double({ min: 0.05, max: 0.6, noNaN: true }), fc.double({ min: 0, max: 1.5, noNaN: true }),
      fc.double({ min: 1, max: 20, noNaN: true }), fc.double({ min: 0, max: 0.2, noNaN: true }),
      (n, e0, deg, mu) => {
        const law = hollomon({ K: 600, n });
        return maxDrawReduction(law, e0, deg * RAD_PER_DEG, mu).strain < maxDrawReduction(law, e0, 0, 0).strain;
      }), { seed: 7008, numRuns: 100 });
  });
  it('rejects friction with a zero die angle, naming the field', () => {
    expect(() => drawingStress(400, 0.2, 0, 0.05, 'steps[2]')).toThrow(InputError);
    expect(() => drawingStress(400, 0.2, 0, 0.05, 'steps[2]')).toThrow(/steps\[2\]\.dieHalfAngleDeg/);
  });
});

describe('evaluateRoute: draw steps with dieHalfAngleDeg and friction carry the pass loads', () => {
  const law = hollomon({ K: 600, n: 0.21 });
  const m: Material = { name: 'low-carbon steel (Callister)', elasticModulus: 207000, poissonRatio: 0.3, law, density: 7850, specificHeat: 486 };
  const ledger = evaluateRoute({ material: m, start: { diameter: 5.5 }, steps: [
    { kind: 'draw', diameter: 4.6, dieHalfAngleDeg: 6, friction: 0.05, forceCapacity: 1000 },
    { kind: 'anneal' },
    { kind: 'draw', diameter: 4 },
  ] });
  const r = ledger.rows[0]!;
  it('drawing stress, force σd·A1, drawability ratio σd/σ(ε1) and the largest reduction', () => {
    const e = 2 * Math.log(5.5 / 4.6);
    const Y = law.work(e) / e;
    const sd = drawingStress(Y, e, 6 * RAD_PER_DEG, 0.05).stress;
    expectRelClose(r.drawingStress!, sd, 1e-12, 'σd');
    expectRelClose(r.drawingForce!, sd * Math.PI / 4 * 4.6 ** 2, 1e-12, 'force');
    expectRelClose(r.drawabilityRatio!, sd / law.stress(e), 1e-12, 'ratio');
    expectRelClose(r.maxAreaReductionPct!, maxDrawReduction(law, 0, 6 * RAD_PER_DEG, 0.05).areaReductionPct, 1e-12, 'max reduction');
  });
  it('warns when the force exceeds the stated capacity', () => {
    expect(r.warnings.map((w) => w.code)).toContain('capacity');
  });
  it('leaves the load fields out where they do not apply (anneal; draw without die data)', () => {
    expect(ledger.rows[1]).not.toHaveProperty('drawingStress');
    expect(ledger.rows[2]).not.toHaveProperty('drawingStress');
    expect(ledger.rows[2]).toHaveProperty('temperatureRise');
  });
  it('asks for friction when only the die angle is given', () => {
    expect(() => evaluateRoute({ material: m, start: { diameter: 5 }, steps: [{ kind: 'draw', diameter: 4, dieHalfAngleDeg: 6 }] })).toThrow(/steps\[0\]\.friction/);
  });
});
