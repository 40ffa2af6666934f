import fc from 'fast-check';
import odex from 'odex';
import { describe, expect, it } from 'vitest';
import { createPathStepper, hollomon, InputError, integratePath, voce, type PathMaterial } from '../../../src/core/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

// Materials. E for plain steel 207 GPa and for C11000 copper 115 GPa: Callister, Fundamentals of
// Materials Science and Engineering, Table B.2. Copper Hollomon K 530 MPa, n 0.44: Callister, 2nd ed.,
// p. 199. The Voce and backstress parameters are invented test inputs (no published source): the
// checks below compare against closed forms and an independent ODE solution, not against these numbers.
const STEEL_E = 207000;
const copper: PathMaterial = { elasticModulus: 115000, law: hollomon({ K: 530, n: 0.44 }) };
const steelVoce = voce({ sigma0: 250, Q: 200, b: 15 });
const twoBack = { backstresses: [{ C: 20000, gamma: 200 }, { C: 2000, gamma: 10 }] };
const combined: PathMaterial = { elasticModulus: STEEL_E, law: steelVoce, kinematic: twoBack };

describe('integratePath(material, history) under monotonic loading', () => {
  it('gives backstresses equal to the Armstrong–Frederick closed form Σ(C/γ)(1 − exp(−γ·εp))', () => {
    // Closed form: monotonic uniaxial integration of dX = C·dεp − γ·X·|dεp| from X = 0 (CHECKS.md,
    // Armstrong–Frederick). The exponential update is exact for monotonic flow, so 1e-9 relative is a
    // tight bound for the Newton tolerance (1e-11) propagated through the solve.
    const r = integratePath(combined, [0.1], { maxIncrement: 1e-3 });
    expect(r.converged).toBe(true);
    let checked = 0;
    for (const pt of r.points) {
      const p = pt.plasticStrain;
      if (p < 1e-4) continue;
      const closed = (20000 / 200) * -Math.expm1(-200 * p) + (2000 / 10) * -Math.expm1(-10 * p);
      expectRelClose(pt.backstress, closed, 1e-9, `backstress at εp=${p}`);
      checked++;
    }
    expect(checked).toBeGreaterThan(90);
  });

  it('follows the flow curve σ(εp) whether or not backstresses are given (combined split keeps the monotonic curve)', () => {
    for (const m of [combined, { ...combined, kinematic: undefined }]) {
      const r = integratePath(m, [0.08]);
      const last = r.points.at(-1)!;
      expectRelClose(last.stress, steelVoce.stress(last.plasticStrain), 1e-9, 'stress on the flow curve');
      // Total strain = plastic + elastic σ/E.
      expectRelClose(last.strain, last.plasticStrain + last.stress / STEEL_E, 1e-12, 'strain decomposition');
    }
  });
});

describe('integratePath(isotropic material, load–unload–reload)', () => {
  it('reloads elastically and yields again at the previous maximum stress', () => {
    // Isotropic hardening: the yield surface keeps the size reached at the maximum, so reloading is
    // elastic up to the previous maximum stress (issue 6 check; common practice, the definition of
    // isotropic hardening). Reload strain where σ returns to σmax: εp + σmax/E.
    const up = integratePath(copper, [0.05]);
    const top = up.points.at(-1)!;
    // Unload to zero stress (total strain = plastic strain), then reload.
    const eReload = top.plasticStrain + top.stress / 115000;
    const r = integratePath(copper, [0.05, top.plasticStrain, eReload, eReload + 1e-4], { maxIncrement: 1e-5 });
    expectAbsClose(r.points.find((p) => p.strain === top.plasticStrain)!.stress, 0, 1e-9, 'stress-free after unloading');
    const atReload = r.points.find((p) => p.strain === eReload)!;
    expectRelClose(atReload.stress, top.stress, 1e-9, 'stress at the end of the elastic reload');
    expectAbsClose(atReload.plasticStrain, top.plasticStrain, 1e-12, 'no plastic strain during elastic reload');
    const after = r.points.at(-1)!;
    expect(after.plasticStrain).toBeGreaterThan(top.plasticStrain + 1e-6);
    expectRelClose(after.stress, 530 * after.plasticStrain ** 0.44, 1e-9, 'back on the Hollomon curve');
  });

  it('unloads along the chord modulus E(ε̄p) = E0 − (E0 − Ea)(1 − exp(−ξ·ε̄p))', () => {
    // Form of Yoshida & Uemori, Int. J. Plasticity 18 (2002) (from memory, CHECKS.md). Written out
    // here independently of the core's chordModulus. Ea = 0.85·E0, ξ = 40 are invented inputs.
    const m: PathMaterial = { elasticModulus: STEEL_E, law: steelVoce, modulusDecay: { Ea: 0.85 * STEEL_E, xi: 40 } };
    for (const pre of [0.01, 0.04, 0.15]) {
      const r = integratePath(m, [pre, pre - 0.001], { maxIncrement: 1e-4 });
      const top = r.points.find((p) => p.strain === pre)!;
      const end = r.points.at(-1)!;
      const slope = (top.stress - end.stress) / (top.strain - end.strain);
      const expected = STEEL_E - (STEEL_E - 0.85 * STEEL_E) * (1 - Math.exp(-40 * top.plasticStrain));
      expectRelClose(slope, expected, 1e-9, `unloading slope after ${pre}`);
      expectAbsClose(end.plasticStrain, top.plasticStrain, 1e-15, 'unloading is elastic');
    }
  });
});

describe('integratePath(combined material, reversal) against an independent ODE integration', () => {
  // Reference: the rate equations of the same model integrated with odex 2.0.4 (Hairer–Wanner ODEX,
  // Gragg–Bulirsch–Stoer extrapolation, from the npm registry). In plastic flow in direction s, with u
  // the strain travelled: dp/du = E/(E + H), H = R'(p) + Σ(Cᵢ − s·γᵢ·Xᵢ); dσ/du = s·E·(1 − dp/du);
  // dXᵢ/du = (s·Cᵢ − γᵢ·Xᵢ)·dp/du. Elastic stretches are solved in closed form. Tolerance 1e-6
  // relative: the ODE solver runs at 1e-11 tolerances; the rest is its error control, far below 1e-6.
  const E = STEEL_E;
  const bs = twoBack.backstresses;
  const R = (p: number) => 250 + 200 * (1 - Math.exp(-15 * p)) - bs.reduce((a, b) => a + (b.C / b.gamma) * (1 - Math.exp(-b.gamma * p)), 0);
  const dR = (p: number) => 200 * 15 * Math.exp(-15 * p) - bs.reduce((a, b) => a + b.C * Math.exp(-b.gamma * p), 0);

  function reference(history: number[], samples: number[][]): number[][] {
    // Returns, per segment, the stress at each requested strain in `samples[segment]`.
    let eps = 0; let sig = 0; let p = 0; let X = bs.map(() => 0);
    const out: number[][] = [];
    const solver = new odex.Solver(2 + bs.length);
    solver.absoluteTolerance = 1e-11; solver.relativeTolerance = 1e-11; solver.maxSteps = 100000;
    history.forEach((target, k) => {
      const s = target > eps ? 1 : -1;
      const yieldStress = X.reduce((a, b) => a + b, 0) + s * R(p);
      const epsYield = eps + (yieldStress - sig) / E; // elastic until here
      const state0 = { eps, sig, p, X: [...X] };
      const at = (e: number): { sig: number; p: number; X: number[] } => {
        if (s * (e - epsYield) <= 0) return { sig: state0.sig + E * (e - state0.eps), p: state0.p, X: state0.X };
        const f = (_u: number, y: number[]) => {
          const [, pp, ...xx] = y as [number, number, ...number[]];
          let H = dR(pp);
          bs.forEach((b, i) => { H += b.C - s * b.gamma * xx[i]!; });
          const dp = E / (E + H);
          return [s * E * (1 - dp), dp, ...bs.map((b, i) => (s * b.C - b.gamma * xx[i]!) * dp)];
        };
        const y0 = [yieldStress, state0.p, ...state0.X];
        const u = s * (e - epsYield);
        const sol = solver.solve(f, 0, y0, u);
        expect(sol.outcome).toBe(0);
        return { sig: sol.y[0]!, p: sol.y[1]!, X: sol.y.slice(2) };
      };
      out.push(samples[k]!.map((e) => at(e).sig));
      const end = at(target);
      eps = target; sig = end.sig; p = end.p; X = end.X;
    });
    return out;
  }

  it('agrees with odex on a tension–compression–tension history, including the early reverse yield', () => {
    const history = [0.02, -0.02, 0.01];
    const samples = [[0.005, 0.01, 0.02], [0.015, 0.0, -0.01, -0.02], [-0.015, 0.0, 0.01]];
    const ref = reference(history, samples);
    const r = integratePath(combined, history, { maxIncrement: 1e-3 });
    expect(r.converged).toBe(true);
    // The path passes 0.01 and 0.0 more than once: look up each sample within its own segment.
    let seg = 0; let from = 0; const bySeg: Array<Map<number, number>> = [new Map(), new Map(), new Map()];
    for (const pt of r.points.slice(1)) {
      bySeg[seg]!.set(Math.round(pt.strain * 1e9) / 1e9, pt.stress);
      if (pt.strain === history[seg]) { from = pt.strain; seg++; if (seg === history.length) break; }
    }
    void from;
    samples.forEach((list, k) => list.forEach((e, j) => {
      const got = bySeg[k]!.get(Math.round(e * 1e9) / 1e9);
      expect(got, `point at ${e} in segment ${k}`).toBeDefined();
      expectRelClose(got!, ref[k]![j]!, 1e-6, `stress at ε=${e}, segment ${k}`);
    }));
  });

  it('reverse yield comes earlier than under isotropic hardening (Bauschinger effect)', () => {
    const kin = integratePath(combined, [0.03, -0.003], { maxIncrement: 1e-5 });
    const iso = integratePath({ ...combined, kinematic: undefined }, [0.03, -0.003], { maxIncrement: 1e-5 });
    const firstReversePlastic = (pts: typeof kin.points) => {
      const k = pts.findIndex((p) => p.strain === 0.03);
      const top = pts[k]!;
      const i = pts.findIndex((p, j) => j > k && p.plasticStrain < top.plasticStrain - 1e-9);
      return pts[i - 1]!.stress;
    };
    const topStress = steelVoce.stress(kin.points.find((p) => p.strain === 0.03)!.plasticStrain);
    // Isotropic: reverse yield at −σmax (within one 1e-5 increment of strain, E·1e-5 ≈ 2 MPa).
    expectAbsClose(firstReversePlastic(iso.points), -topStress, STEEL_E * 1e-5, 'isotropic reverse yield');
    // Kinematic: at X − R, |X − R| < σmax.
    const kTop = kin.points.find((p) => p.strain === 0.03)!;
    expectAbsClose(firstReversePlastic(kin.points), kTop.backstress - kTop.yieldSurfaceSize, STEEL_E * 1e-5, 'kinematic reverse yield');
    expect(Math.abs(firstReversePlastic(kin.points))).toBeLessThan(0.8 * topStress);
  });
});

describe('integratePath properties (fast-check, seeded)', () => {
  const materialArb = fc.record({
    sigma0: fc.double({ min: 100, max: 500, noNaN: true }),
    Q: fc.double({ min: 0, max: 300, noNaN: true }),
    b: fc.double({ min: 1, max: 50, noNaN: true }),
    frac: fc.double({ min: 0, max: 0.9, noNaN: true }),
    gamma: fc.double({ min: 10, max: 500, noNaN: true }),
    decay: fc.boolean(),
  }).map(({ sigma0, Q, b, frac, gamma, decay }): PathMaterial => ({
    elasticModulus: STEEL_E,
    law: voce({ sigma0, Q, b }),
    ...(frac > 0.01 ? { kinematic: { backstresses: [{ C: frac * sigma0 * gamma, gamma }] } } : {}),
    ...(decay ? { modulusDecay: { Ea: 0.85 * STEEL_E, xi: 30 } } : {}),
  }));
  const historyArb = fc.array(fc.double({ min: -0.03, max: 0.03, noNaN: true }), { minLength: 1, maxLength: 5 })
    .filter((h) => Math.max(...h.map(Math.abs)) >= 0.005)
    .map((h) => [...h, 0]);

  it('work ∮σ dε over any strain cycle from the annealed state is never negative', () => {
    // Thermodynamics: W = ΔΨ + D with Ψ(start) = 0, Ψ ≥ 0 and dissipation D ≥ 0. Trapezoid work over
    // the output points is exact on elastic increments; where an increment yields part-way, its error
    // is at most E·h²/2, so the tolerance is (segments)·E·h²/2 with h = 1e-5.
    const h = 1e-5;
    fc.assert(fc.property(materialArb, historyArb, (m, hist) => {
      const r = integratePath(m, hist, { maxIncrement: h });
      let W = 0;
      for (let i = 1; i < r.points.length; i++) {
        const a = r.points[i - 1]!; const c = r.points[i]!;
        W += 0.5 * (a.stress + c.stress) * (c.strain - a.strain);
      }
      expect(W).toBeGreaterThanOrEqual(-hist.length * STEEL_E * h * h);
    }), { seed: 20261201, numRuns: 60 });
  });

  it('the end state converges as the increment shrinks', () => {
    // Halving the increment: the change shrinks (or is already at round-off, 1e-9 of the stress).
    fc.assert(fc.property(materialArb, historyArb, (m, hist) => {
      const end = (h: number) => integratePath(m, hist, { maxIncrement: h }).points.at(-1)!;
      const a = end(1e-3); const b = end(5e-4); const c = end(2.5e-4);
      const scale = 1e-9 * (Math.abs(a.stress) + m.law.stress(0.1));
      expect(Math.abs(b.stress - c.stress)).toBeLessThanOrEqual(Math.abs(a.stress - b.stress) + scale);
      expect(Math.abs(a.stress - c.stress)).toBeLessThanOrEqual(1e-6 * m.law.stress(0.1));
    }), { seed: 7, numRuns: 40 });
  });
});

describe('integratePath input validation', () => {
  it('rejects a history entry out of range, naming it', () => {
    expect(() => integratePath(copper, [0.01, 3])).toThrow(/history\[1\]: got 3, allowed a number in \[-2, 2\]/);
    expect(() => integratePath(copper, [Number.NaN])).toThrow(InputError);
  });
  it('rejects backstresses that saturate above the flow curve', () => {
    expect(() => integratePath({ ...combined, kinematic: { backstresses: [{ C: 100000, gamma: 100 }] } }, [0.01]))
      .toThrow(/material\.kinematic: the yield surface size/);
    expect(() => createPathStepper({ ...combined, kinematic: { backstresses: [{ C: -1, gamma: 100 }] } })).toThrow(/backstresses\[0\]\.C: got -1/);
  });
});
