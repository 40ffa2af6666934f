import { InputError } from '../errors.js';
import type { FlowLaw } from '../flow/types.js';
import type { KinematicSpec } from './types.js';
import { sig4 } from '../numeric/sig4.js';

/** Largest accumulated plastic strain at which the isotropic part is checked to stay positive. */
export const SPLIT_CHECK_STRAIN = 5;

/**
 * The split of a monotonic flow curve into isotropic and kinematic parts (combined hardening).
 *
 * Under monotonic uniaxial loading the Armstrong–Frederick backstresses follow
 * Xᵢ(p) = (Cᵢ/γᵢ)(1 − exp(−γᵢ·p)), and the flow stress is σ(p) = R(p) + ΣXᵢ(p). strainledger keeps the
 * material's flow curve as the monotonic response and gives the yield surface the rest:
 * R(p) = σ(p) − Σ(Cᵢ/γᵢ)(1 − exp(−γᵢ·p)), R'(p) = σ'(p) − ΣCᵢ·exp(−γᵢ·p).
 * So a route that only pulls one way gives the same numbers with or without kinematic parameters; a
 * reversal yields at ΣXᵢ − R. With no backstresses R = σ (isotropic); a law whose hardening is
 * entirely the backstresses (Voce with Q = C/γ, b = γ) gives a constant R (pure kinematic).
 *
 * Source: P. J. Armstrong and C. O. Frederick, "A mathematical representation of the multiaxial
 * Bauschinger effect", CEGB report RD/B/N731 (1966); J. L. Chaboche, "Time-independent constitutive
 * theories for cyclic plasticity", *Int. J. Plasticity* 2 (1986) 149–188 (sum of backstresses and the
 * combination with isotropic hardening). The 1-D form dX = C·dεp − γ·X·|dεp| is the uniaxial projection
 * of dX = (2/3)C·dεp − γ·X·dp with X the axial backstress times 3/2.
 * Units: MPa, dimensionless strain. Valid range: p ≥ 0.
 * @throws InputError (path `kinematic`) if R(p) ≤ 0 for some p in (0, 5]: the backstresses saturate above
 * what the flow curve allows.
 * @example isotropicPart(voce({ sigma0: 200, Q: 100, b: 10 }), { backstresses: [{ C: 1000, gamma: 10 }] }).size(0.3) // 200
 */
export function isotropicPart(law: FlowLaw, kin: KinematicSpec | undefined, path = 'kinematic'): { size: (p: number) => number; slope: (p: number) => number } {
  const bs = kin?.backstresses ?? [];
  if (bs.length === 0) return { size: law.stress, slope: law.slope };
  const C = Float64Array.from(bs, (b) => b.C);
  const g = Float64Array.from(bs, (b) => b.gamma);
  const stress = law.stress;
  const lawSlope = law.slope;
  // One backstress (the common case) without the loop: measurably faster in bench/integrator.mjs.
  const c0 = C[0]!, g0 = g[0]!, sat0 = c0 / g0;
  const size = C.length === 1
    ? (p: number): number => stress(p) - sat0 * -Math.expm1(-g0 * p)
    : (p: number): number => {
      let s = stress(p);
      for (let i = 0; i < C.length; i++) s -= (C[i]! / g[i]!) * -Math.expm1(-g[i]! * p);
      return s;
    };
  const slope = C.length === 1
    ? (p: number): number => lawSlope(p) - c0 * Math.exp(-g0 * p)
    : (p: number): number => {
      let s = lawSlope(p);
      for (let i = 0; i < C.length; i++) s -= C[i]! * Math.exp(-g[i]! * p);
      return s;
    };
  for (let k = 0; k <= 240; k++) {
    const p = k === 0 ? 1e-9 : 1e-6 * Math.pow(SPLIT_CHECK_STRAIN / 1e-6, k / 240);
    const r = size(p);
    if (!(r > 0)) {
      throw new InputError(path, kin, `backstresses whose sum stays below the flow curve (ΣC/γ·(1 − e^(−γp)) < σ(p) for all p ≤ ${SPLIT_CHECK_STRAIN})`,
        `the yield surface size σ(p) − ΣX(p) is ${sig4(r)} MPa at p = ${p.toPrecision(3)}`);
    }
  }
  return { size, slope };
}

/**
 * Validates kinematic parameters: one to three backstresses, each C in (0, 1e7] MPa and γ in (0, 1e5].
 * @throws InputError naming `path.backstresses[i].C` or `.gamma`.
 */
export function validateKinematic(kin: KinematicSpec, path = 'kinematic'): KinematicSpec {
  const bs = kin.backstresses;
  if (!Array.isArray(bs) || bs.length < 1 || bs.length > 3) throw new InputError(`${path}.backstresses`, bs, 'a list of 1 to 3 backstresses');
  const out = bs.map((b, i) => {
    const at = `${path}.backstresses[${i}]`;
    if (typeof b.C !== 'number' || !Number.isFinite(b.C) || b.C <= 0 || b.C > 1e7) throw new InputError(`${at}.C`, b.C, 'a number in (0, 1e7] MPa');
    if (typeof b.gamma !== 'number' || !Number.isFinite(b.gamma) || b.gamma <= 0 || b.gamma > 1e5) throw new InputError(`${at}.gamma`, b.gamma, 'a number in (0, 1e5]');
    return { C: b.C, gamma: b.gamma };
  });
  return { backstresses: out };
}

/**
 * Armstrong–Frederick backstress after a monotonic plastic strain Δp in direction s (±1), exact
 * solution of dX = γ(s·C/γ − X)·dp: X = s·C/γ + (X0 − s·C/γ)·exp(−γ·Δp).
 * From X0 = 0, s = +1 this is the closed form (C/γ)(1 − exp(−γ·p)).
 * Source: Armstrong & Frederick (1966), integrated in closed form (derived). Units: MPa.
 * @example backstressAfter(0, 1000, 10, 1, 0.1) // 100·(1 − e^−1) ≈ 63.21
 */
export function backstressAfter(X0: number, C: number, gamma: number, s: 1 | -1, dp: number): number {
  const sat = (s * C) / gamma;
  return sat + (X0 - sat) * Math.exp(-gamma * dp);
}
