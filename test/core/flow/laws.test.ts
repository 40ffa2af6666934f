import { describe, expect, it } from 'vitest';
import {
  considereNumeric, hockettSherby, hollomon, InputError, integrate, LAW_NAMES, ludwik, makeLaw, swift, swiftVoce,
  tensileStrengthOf, uniformElongationOf, voce, type LawSpec,
} from '../../../src/core/index.js';
import { derivative, expectAbsClose, expectRelClose } from '../../helpers.js';

/** One representative, valid parameter set per law (values chosen for the test, not from a source). */
export const SAMPLE_LAWS: LawSpec[] = [
  { law: 'hollomon', K: 530, n: 0.44 },
  { law: 'ludwik', sigma0: 150, K: 450, n: 0.5 },
  { law: 'swift', K: 600, eps0: 0.012, n: 0.21 },
  { law: 'voce', sigma0: 200, Q: 180, b: 9 },
  { law: 'hockettSherby', sigmaSat: 520, sigma0: 180, a: 4, p: 0.8 },
  { law: 'swiftVoce', alpha: 0.6, K: 600, eps0: 0.012, n: 0.21, sigma0: 200, Q: 180, b: 9 },
];

describe('Hollomon against Callister (Fundamentals of Materials Science and Engineering, 2nd ed., p. 199)', () => {
  // Callister's annealed copper: n = 0.44, K = 530 MPa (true stress, true strain).
  const cu = hollomon({ K: 530, n: 0.44 });
  it('hollomon(copper).uniformStrain() equals n (Considère: dσ/dε = σ ⇒ ε = n; CHECKS.md)', () => {
    expect(cu.uniformStrain()).toBe(0.44);
  });
  it('the numerical Considère search agrees with the closed form ε = n to 1e-10 (Brent tolerance 1e-14)', () => {
    for (const [K, n] of [[530, 0.44], [600, 0.21], [2650, 0.12], [1400, 0.44], [780, 0.17]] as const) {
      const law = hollomon({ K, n });
      expectAbsClose(considereNumeric(law.stress, law.slope), n, 1e-10, `K=${K} n=${n}`);
    }
  });
  it('engineering UTS = K(n/e)^n (CHECKS.md, from Considère); copper 237.9 MPa computed from the formula', () => {
    expectRelClose(tensileStrengthOf(cu), 530 * (0.44 / Math.E) ** 0.44, 1e-14, 'Rm');
    // 4340 steel tempered at 315 °C (Callister): n = 0.12, K = 2650 MPa.
    const s4340 = hollomon({ K: 2650, n: 0.12 });
    expectRelClose(tensileStrengthOf(s4340), 2650 * (0.12 / Math.E) ** 0.12, 1e-14, 'Rm 4340');
  });
  it('uniform engineering elongation = e^n − 1 (CHECKS.md)', () => {
    expectRelClose(uniformElongationOf(cu), Math.exp(0.44) - 1, 1e-14, 'eu');
  });
  it('Dowling Table 4.6 AISI 1020 as rolled (σ = H·ε_pⁿ, H 737 MPa, n 0.19): stress at ε_p = 0.1 is 737·0.1^0.19', () => {
    expectRelClose(hollomon({ K: 737, n: 0.19 }).stress(0.1), 737 * 0.1 ** 0.19, 1e-15, 'σ');
  });
});

describe('closed-form Considère points against the numerical search', () => {
  it('swift uniformStrain() = n − ε0 (Swift 1952) and matches the numerical search', () => {
    const s = swift({ K: 600, eps0: 0.012, n: 0.21 });
    expectAbsClose(s.uniformStrain(), 0.198, 1e-15, 'closed');
    expectAbsClose(considereNumeric(s.stress, s.slope), 0.198, 1e-10, 'numeric');
  });
  it('swift with ε0 ≥ n necks at yield (εu = 0)', () => {
    expect(swift({ K: 600, eps0: 0.3, n: 0.2 }).uniformStrain()).toBe(0);
  });
  it('voce uniformStrain() = ln(Q(1+b)/(σ0+Q))/b and matches the numerical search', () => {
    const v = voce({ sigma0: 200, Q: 180, b: 9 });
    expectAbsClose(v.uniformStrain(), Math.log((180 * 10) / 380) / 9, 1e-15, 'closed');
    expectAbsClose(considereNumeric(v.stress, v.slope), v.uniformStrain(), 1e-10, 'numeric');
  });
  it('voce with Q·b ≤ σ0 necks at yield', () => {
    expect(voce({ sigma0: 500, Q: 50, b: 5 }).uniformStrain()).toBe(0);
  });
  it('at the Considère point of every law the slope equals the stress (relative 1e-8)', () => {
    for (const spec of SAMPLE_LAWS) {
      const law = makeLaw(spec);
      const eu = law.uniformStrain();
      expect(eu, spec.law).toBeGreaterThan(0);
      expectRelClose(law.slope(eu), law.stress(eu), 1e-8, spec.law);
    }
  });
});

describe('every law: slope, work and inverse are consistent with the stress', () => {
  for (const spec of SAMPLE_LAWS) {
    const law = makeLaw(spec);
    it(`${spec.law}: slope(ε) equals the central difference of stress, step 1e-4·ε (truncation and rounding both below 1e-7 relative; bound 1e-6)`, () => {
      for (const e of [0.01, 0.05, 0.2, 0.6, 1.5]) expectRelClose(law.slope(e), derivative(law.stress, e, 1e-4 * e), 1e-6, `ε=${e}`);
    });
    it(`${spec.law}: work(ε) equals an independent quadrature of stress (relative 1e-10)`, () => {
      for (const e of [0.001, 0.05, 0.3, 1, 3]) expectRelClose(law.work(e), integrate(law.stress, 0, e).value, 1e-10, `ε=${e}`);
      expect(law.work(0)).toBe(0);
    });
    it(`${spec.law}: strainAt(stress(ε)) returns ε (relative 1e-9)`, () => {
      for (const e of [0.002, 0.05, 0.3, 1]) expectRelClose(law.strainAt(law.stress(e)), e, 1e-9, `ε=${e}`);
    });
    it(`${spec.law}: strainAt below the initial yield is 0`, () => {
      expect(law.strainAt(law.stress(0) - 1)).toBe(0);
    });
  }
});

describe('Hockett–Sherby work against closed forms of ∫exp(−a·xᵖ)dx', () => {
  it('p = 1: σsat·ε − (σsat−σ0)(1 − e^(−aε))/a', () => {
    const h = hockettSherby({ sigmaSat: 500, sigma0: 200, a: 6, p: 1 });
    for (const e of [0.01, 0.2, 2]) expectRelClose(h.work(e), 500 * e - (300 * -Math.expm1(-6 * e)) / 6, 1e-12, `ε=${e}`);
  });
  it('p = 1/2: ∫₀^ε e^(−a√x)dx = 2/a²·[1 − e^(−a√ε)(1 + a√ε)]', () => {
    const a = 3;
    const h = hockettSherby({ sigmaSat: 500, sigma0: 200, a, p: 0.5 });
    for (const e of [0.01, 0.2, 2]) {
      const r = Math.sqrt(e);
      expectRelClose(h.work(e), 500 * e - 300 * (2 / a ** 2) * (1 - Math.exp(-a * r) * (1 + a * r)), 1e-11, `ε=${e}`);
    }
  });
});

describe('swiftVoce blends its parts', () => {
  it('alpha = 1 is Swift, alpha = 0 is Voce', () => {
    const base = { K: 600, eps0: 0.012, n: 0.21, sigma0: 200, Q: 180, b: 9 };
    const s = swift(base);
    const v = voce(base);
    for (const e of [0, 0.1, 0.5]) {
      expect(swiftVoce({ ...base, alpha: 1 }).stress(e)).toBeCloseTo(s.stress(e), 12);
      expect(swiftVoce({ ...base, alpha: 0 }).stress(e)).toBeCloseTo(v.stress(e), 12);
    }
  });
});

describe('parameter validation names the parameter, the value and the range', () => {
  it('hollomon({K: 530, n: 1.5}) throws naming flowCurve.n and (0, 1]', () => {
    expect(() => hollomon({ K: 530, n: 1.5 })).toThrow(InputError);
    expect(() => hollomon({ K: 530, n: 1.5 })).toThrow(/flowCurve\.n: got 1\.5, allowed a number in \(0, 1\]/);
  });
  it('NaN, Infinity, strings and missing parameters are rejected for every law', () => {
    for (const spec of SAMPLE_LAWS) {
      for (const bad of [NaN, Infinity, -1, '5', undefined]) {
        const key = Object.keys(spec).find((k) => k !== 'law')!;
        expect(() => makeLaw({ ...spec, [key]: bad } as LawSpec), `${spec.law}.${key}=${String(bad)}`).toThrow(InputError);
      }
    }
  });
  it('hockettSherby needs sigma0 < sigmaSat', () => {
    expect(() => hockettSherby({ sigmaSat: 200, sigma0: 300, a: 1, p: 1 })).toThrow(/sigma0.*below sigmaSat/);
  });
  it('voce strainAt at or above saturation throws instead of returning Infinity', () => {
    expect(() => voce({ sigma0: 200, Q: 100, b: 5 }).strainAt(300)).toThrow(InputError);
  });
  it('an unknown law name lists the known ones', () => {
    expect(() => makeLaw({ law: 'ramberg' } as unknown as LawSpec)).toThrow(new RegExp(LAW_NAMES.join(', ')));
  });
  it('a law whose stress is zero everywhere is rejected', () => {
    expect(() => makeLaw({ law: 'voce', sigma0: 0, Q: 0, b: 1 })).toThrow(/above 0/);
  });
});

describe('ludwik', () => {
  it('ludwik({sigma0: 200, K: 400, n: 0.5}).stress(0.04) is 280 (the doc example)', () => {
    expectRelClose(ludwik({ sigma0: 200, K: 400, n: 0.5 }).stress(0.04), 280, 1e-15);
  });
});
