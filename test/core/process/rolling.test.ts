import { describe, expect, it } from 'vitest';
import { evaluateRoute, hollomon, PROCESS_DEFAULTS, rollingLoad, type Material } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

describe('rollingLoad(Ȳ, R, h0, h1, w, μ): plane-strain mean pressure with friction', () => {
  // Worked example, Dieter, Mechanical Metallurgy, 3rd ed., ch. 17 (rolling load), from memory, not
  // confirmed on a stored page: a 40 mm slab rolled 30 % (to 28 mm) with 900 mm diameter rolls,
  // width 760 mm, μ = 0.30, plane-strain flow stress 140 MPa at entry and 200 MPa at exit (mean
  // 170 MPa). Book steps: L = √(450·12) = 73.5 mm, h̄ = 34 mm, Q = 0.65, p̄ ≈ 240 MPa, P ≈ 13.4 MN.
  const Ybar = 170 * Math.sqrt(3) / 2; // uniaxial mean flow stress whose plane-strain value is 170 MPa
  const r = rollingLoad(Ybar, 450, 40, 28, 760, 0.3);
  it('contact length √(R·Δh) = 73.5 mm and Q = μL/h̄ = 0.65 (Dieter example, from memory)', () => {
    expectRelClose(r.contactLength, 73.5, 0.001, 'L'); // book value to 3 digits
    expectRelClose(r.frictionParameter, 0.65, 0.005, 'Q'); // book rounds 0.6484 to 0.65
  });
  it('roll force ≈ 13.4 MN (Dieter example, from memory)', () => {
    // The book carries three digits through Q and p̄, so 1 % is the honest bound.
    expectRelClose(r.force, 13.4e6, 0.01, 'P');
  });
  it('with no friction the mean pressure is the plane-strain flow stress (2/√3)·Ȳ (Q → 0 limit of (e^Q − 1)/Q)', () => {
    expectRelClose(rollingLoad(300, 100, 2, 1.6, 50, 0).meanPressure, 2 / Math.sqrt(3) * 300, 1e-12, 'p̄');
  });
  it('torque of the roll pair is 2·P·λ·L with λ = 0.45 (Dieter §17-5, from memory)', () => {
    expectRelClose(r.torque, 2 * r.force * PROCESS_DEFAULTS.rollTorqueArmFraction * r.contactLength / 1000, 1e-14, 'torque N·m');
  });
  it('grows with friction (monotone)', () => {
    expect(rollingLoad(300, 100, 2, 1.6, 50, 0.1).force).toBeGreaterThan(rollingLoad(300, 100, 2, 1.6, 50, 0.05).force);
  });
});

describe('evaluateRoute: roll steps with rollRadius and friction carry roll force and torque', () => {
  // Callister annealed copper K 530 MPa, n 0.44; E 115 GPa (Table B.2).
  const m: Material = { name: 'copper', elasticModulus: 115000, poissonRatio: 0.3, law: hollomon({ K: 530, n: 0.44 }) };
  const ledger = evaluateRoute({ material: m, start: { thickness: 2, width: 40 }, steps: [{ kind: 'roll', thickness: 1.6, rollRadius: 60, friction: 0.08, forceCapacity: 100 }] });
  const row = ledger.rows[0]!;
  it('uses the mean flow stress of the pass and the strip width from start', () => {
    const expected = rollingLoad(row.meanFlowStress, 60, 2, 1.6, 40, 0.08);
    expectRelClose(row.rollForce!, expected.force, 1e-14, 'P');
    expectRelClose(row.rollTorque!, expected.torque, 1e-14, 'torque');
  });
  it('warns above the mill capacity; no heating without density and specific heat', () => {
    expect(row.warnings.map((w) => w.code)).toContain('capacity');
    expect(row).not.toHaveProperty('temperatureRise');
  });
  it('asks for a width when neither the step nor the strip gives one', () => {
    expect(() => evaluateRoute({ material: m, start: { thickness: 2 }, steps: [{ kind: 'roll', thickness: 1.6, rollRadius: 60, friction: 0.08 }] })).toThrow(/steps\[0\]\.width/);
  });
});
