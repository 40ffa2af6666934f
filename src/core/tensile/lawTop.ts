import { makeLaw } from '../flow/makeLaw.js';
import type { LawSpec } from '../flow/types.js';
import type { LawFit } from '../fit/types.js';

/**
 * True plastic strain at which a hardening law with elastic strain σ/E reaches maximum engineering
 * stress: the root of σ'(εp)·(1 − σ/E) − σ = 0. With true strain ε = εp + σ/E and engineering stress
 * s = σ/(1 + e) = σ·exp(−εp − σ/E), d ln s/dεp = 0 gives σ'/σ − 1 − σ'/E = 0 (the Considère condition
 * σ' = σ with the elastic strain counted; conversions as Dowling, *Mechanical Behavior of Materials*,
 * §4.5). Found by bisection on [1e-9, 5] to 1e-13. Units: εp true plastic strain, E in MPa.
 * Valid: a law whose left side changes sign once from + to − (every law here that hardens more slowly
 * than it strengthens); null when it does not change sign in the bracket — also for a law whose hardening rate
 * starts at zero (Hockett–Sherby with p > 1: the left side is negative at first), which is thus left out of Ag from
 * the laws. Deliberately: bracketed past that start, the Hockett–Sherby fits (p 1.25–1.28) of the open 42CrMoS4
 * records 46NT71 and 46NT73 put Ag at 5.50 and 5.57 % against the producers' 5.21 % (the top model reads 5.16 and
 * 5.20), and held all the Akaike weight there.
 * @example lawTopPlasticStrain(makeLaw({ law: 'hockettSherby', sigmaSat: 1303, sigma0: 1133, a: 73, p: 1.28 }), 200000) // null
 * @example lawTopPlasticStrain(makeLaw({ law: 'hollomon', K: 530, n: 0.2 }), 200000) // ≈ 0.1993 (0.2 rigid-plastic)
 */
export function lawTopPlasticStrain(law: { stress(e: number): number; slope(e: number): number }, E: number): number | null {
  const g = (ep: number) => law.slope(ep) * (1 - law.stress(ep) / E) - law.stress(ep);
  let lo = 1e-9, hi = 5;
  const glo = g(lo), ghi = g(hi);
  if (!(glo > 0) || !(ghi < 0)) return null;
  while (hi - lo > 1e-13) {
    const m = 0.5 * (lo + hi);
    const v = g(m);
    if (!Number.isFinite(v)) return null;
    if (v > 0) lo = m; else hi = m;
  }
  return 0.5 * (lo + hi);
}

/** What {@link lawUniformElongation} found. */
export interface LawTop {
  /**
   * Ag, %: the Akaike-weighted mean of the Ag of the laws whose Ag lies inside `interval` (the top model's 99.9 % one);
   * null when those laws hold less than LAW_TOP_MIN_WEIGHT of the weight (the top model's Ag is reported).
   */
  pct: number | null;
  /** Each converged law's own Ag (%), its Akaike weight among all converged laws, and whether it lies inside the interval. */
  laws: { law: LawFit['law']; pct: number; weight: number; inside: boolean }[];
}

/** Least Akaike weight the laws inside the top model's interval must hold together for their Ag to be used. */
export const LAW_TOP_MIN_WEIGHT = 0.5;

/**
 * Ag (plastic extension at maximum force, ISO 6892-1: Agt − Rm/E) from the hardening laws fitted to the
 * flow curve up to maximum force: each converged law's maximum of engineering stress
 * ({@link lawTopPlasticStrain}) read as e − s/E with e = exp(εp + σ/E) − 1 and s = σ/(1 + e). A law uses
 * the whole uniform part of the curve, so on a flat noisy top it places maximum force far more tightly
 * than the few samples near the top do, but only if it describes the curve up there. So a law counts only
 * when its Ag lies inside `interval` (the local top model's 99.9 % interval, LAW_GATE_CHI2: where the data near
 * the top do not clearly rule maximum force out), the laws inside must together hold at least LAW_TOP_MIN_WEIGHT of the
 * Akaike weights exp(−ΔAIC/2) of all converged laws (Burnham & Anderson, *Model Selection and Multimodel
 * Inference*, 2002, §2.9), and their Ag is averaged with those weights. Otherwise `pct` is null (the caller
 * keeps the top model's Ag): on the open 42CrMoS4 records every law puts maximum force above the top's
 * interval (their curves round over earlier than any law), and there nothing changes.
 * Units: E MPa, interval and result in %. Valid: fits of one flow curve that ends at maximum force.
 * @returns null when no converged law has a maximum of engineering stress.
 * @example lawUniformElongation(analysis.fits.fits, 200000, [18.2, 20.9])?.pct // e.g. 19.61
 */
export function lawUniformElongation(fits: readonly LawFit[], E: number, interval: readonly [number, number]): LawTop | null {
  const found: { law: LawFit['law']; pct: number; aic: number }[] = [];
  for (const f of fits) {
    if (!f.converged || !Number.isFinite(f.aic)) continue;
    let law;
    try { law = makeLaw({ law: f.law, ...f.params } as LawSpec); } catch { continue; }
    const ep = lawTopPlasticStrain(law, E);
    if (ep === null) continue;
    const sig = law.stress(ep);
    const e = Math.expm1(ep + sig / E);
    const pct = (e - sig / (1 + e) / E) * 100;
    if (Number.isFinite(pct)) found.push({ law: f.law, pct, aic: f.aic });
  }
  if (!found.length) return null;
  const best = Math.min(...found.map((f) => f.aic));
  const raw = found.map((f) => Math.exp(-(f.aic - best) / 2));
  const total = raw.reduce((a, b) => a + b, 0);
  const laws = found.map((f, i) => ({ law: f.law, pct: f.pct, weight: raw[i]! / total, inside: f.pct >= interval[0] && f.pct <= interval[1] }));
  let wIn = 0, sum = 0;
  for (const l of laws) if (l.inside) { wIn += l.weight; sum += l.weight * l.pct; }
  return { pct: wIn >= LAW_TOP_MIN_WEIGHT ? sum / wIn : null, laws };
}
