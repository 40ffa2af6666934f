import { ComputationError } from '../errors.js';
import { brent } from '../numeric/brent.js';

/** Largest true plastic strain searched for the Considère condition. */
export const CONSIDERE_SEARCH_LIMIT = 10;

/**
 * Considère uniform strain of any law, found numerically: the smallest ε ≥ 0 where
 * dσ/dε = σ (A. Considère, *Annales des Ponts et Chaussées* 9, 1885; Dieter, *Mechanical
 * Metallurgy*, 3rd ed., §8-3). Returns 0 when the law already has dσ/dε ≤ σ at yield.
 * Units: true plastic strain. Valid range: laws whose slope falls below σ before ε = 10.
 * @throws ComputationError when no necking point lies below ε = 10.
 * @example considereNumeric((e) => 530 * e ** 0.44, (e) => 0.44 * 530 * e ** -0.56) // ≈ 0.44
 */
export function considereNumeric(stress: (e: number) => number, slope: (e: number) => number): number {
  const h = (e: number) => slope(e) - stress(e);
  let lo = 1e-12;
  if (h(lo) <= 0) return 0;
  // Geometric scan for the first sign change, then Brent on the bracket.
  let hi = lo;
  for (;;) {
    hi = Math.min(hi * 2, CONSIDERE_SEARCH_LIMIT);
    if (h(hi) <= 0) break;
    if (hi >= CONSIDERE_SEARCH_LIMIT) throw new ComputationError('material.flowCurve', `no Considère necking point below true strain ${CONSIDERE_SEARCH_LIMIT}`);
    lo = hi;
  }
  const r = brent(h, lo, hi, 1e-14);
  if (!r.converged) throw new ComputationError('material.flowCurve', 'Considère search did not converge');
  return r.root;
}

/**
 * Engineering tensile strength of the unstrained material from its law: Rm = σ(εu)·exp(−εu)
 * (force at the Considère point over the original area, constant volume). For Hollomon this is
 * K·(n/e)ⁿ (Dieter, *Mechanical Metallurgy*, §8-3; CHECKS.md). Units: MPa.
 * @example tensileStrengthOf(hollomon({K: 530, n: 0.44})) // 530·(0.44/e)^0.44 ≈ 237.9
 */
export function tensileStrengthOf(law: { stress(e: number): number; uniformStrain(): number }): number {
  const eu = law.uniformStrain();
  return law.stress(eu) * Math.exp(-eu);
}

/**
 * Uniform engineering (plastic) elongation at maximum force from the law: e_u = exp(εu) − 1; for
 * Hollomon exp(n) − 1 (CHECKS.md, derived from Considère). Dimensionless (multiply by 100 for %).
 * @example uniformElongationOf(hollomon({K: 530, n: 0.44})) // e^0.44 − 1 ≈ 0.5527
 */
export function uniformElongationOf(law: { uniformStrain(): number }): number {
  return Math.expm1(law.uniformStrain());
}

/**
 * True for a law whose force can peak after its first Considère point (Hockett–Sherby with p > 1,
 * see {@link forcePeaks}); every other law has a single peak at εu. A cheap test for hot paths.
 */
export function hasLaterForcePeaks(law: { readonly law: string; readonly params: Readonly<Record<string, number>> }): boolean {
  return law.law === 'hockettSherby' && (law.params.p ?? 0) > 1;
}

/** Peaks already found, per law object (a law is immutable; its peaks never change). */
const PEAKS = new WeakMap<object, readonly number[]>();

/**
 * Strains at which the force of a tensile test has a local maximum: the points where
 * g(ε) = ln σ(ε) − ε changes from rising to falling (dσ/dε − σ goes from + to −, Considère), in
 * increasing order, ε > 0. The engineering stress on the section of a state ε̄,
 * σ(ε)·exp(ε̄ − ε) for ε ≥ ε̄, therefore peaks at ε̄ itself or at one of these strains.
 *
 * For a law whose σ'/σ falls monotonically (every concave law: Hollomon, Ludwik, Swift with n ≤ 1,
 * Voce, the Swift–Voce blend, Hockett–Sherby with p ≤ 1) there is at most one peak, the Considère
 * uniform strain εu (none when εu = 0). A Hockett–Sherby law with p > 1 is S-shaped: its slope rises
 * from 0, so the force may fall at yield, rise and fall again; its second peak is found by a scan of
 * dσ/dε − σ on a geometric grid (ratio 1.05, from 10⁻⁶ to 10) and Brent on each sign change.
 * Source: Considère (1885) via Dieter, *Mechanical Metallurgy*, 3rd ed., §8-3 (force maximum
 * where dσ/dε = σ); the scan is ours. Units: true plastic strain. Cached per law object.
 * @example forcePeaks(hollomon({ K: 530, n: 0.44 })) // [0.44]
 */
export function forcePeaks(law: { readonly law: string; readonly params: Readonly<Record<string, number>>; stress(e: number): number; slope(e: number): number; uniformStrain(): number }): readonly number[] {
  const cached = PEAKS.get(law);
  if (cached) return cached;
  let peaks: number[];
  if (hasLaterForcePeaks(law)) peaks = forcePeakScan((e) => law.stress(e), (e) => law.slope(e));
  else {
    const eu = law.uniformStrain();
    peaks = eu > 0 ? [eu] : [];
  }
  const frozen = Object.freeze(peaks);
  PEAKS.set(law, frozen);
  return frozen;
}

/**
 * Every local force maximum of a tensile test on a law, scanned: the strains where dσ/dε − σ goes
 * from + to − on a geometric grid (ratio 1.05, 10⁻⁶ to 10), each refined by Brent. Used for S-shaped
 * laws (see {@link forcePeaks}). Units: true plastic strain, increasing.
 * @throws ComputationError when a refinement does not converge.
 */
export function forcePeakScan(stress: (e: number) => number, slope: (e: number) => number): number[] {
  const peaks: number[] = [];
  const h = (e: number) => slope(e) - stress(e);
  let a = 1e-6;
  let ha = h(a);
  while (a < CONSIDERE_SEARCH_LIMIT) {
    const b = Math.min(a * 1.05, CONSIDERE_SEARCH_LIMIT);
    const hb = h(b);
    if (ha > 0 && hb <= 0) {
      const r = brent(h, a, b, 1e-14);
      if (!r.converged) throw new ComputationError('material.flowCurve', 'force-peak search did not converge');
      peaks.push(r.root);
    }
    a = b;
    ha = hb;
  }
  return peaks;
}

/**
 * Uniform strain of an S-shaped law: the strain of the test's maximum force, the largest
 * σ(ε)·e^(−ε) over ε ≥ 0 (ISO 6892-1 reads Ag at maximum force), among ε = 0 and the scanned peaks.
 * Where the force falls right at yield and rises again above that level, this is the later peak —
 * not the first point where dσ/dε = σ (which is 0 there). Units: true plastic strain.
 */
export function maximumForceStrain(stress: (e: number) => number, slope: (e: number) => number): number {
  let best = 0;
  let gBest = Math.log(stress(0));
  for (const pk of forcePeakScan(stress, slope)) {
    const g = Math.log(stress(pk)) - pk;
    if (g > gBest) { gBest = g; best = pk; }
  }
  return best;
}
