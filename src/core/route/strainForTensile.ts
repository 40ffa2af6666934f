import { forcePeaks, hasLaterForcePeaks } from '../flow/considere.js';
import type { FlowLaw } from '../flow/types.js';

/**
 * The smallest accumulated strain ε̄ at which the formed part's tensile strength Rm(ε̄) reaches T:
 * the inverse of `stateProperties`' Rm, shared by the cold-work window's `minTensile` bound and the
 * tempers defined by Rm, so both agree with the ledger's rows.
 *
 * Rm(ε̄) = σ(εu)·e^(ε̄−εu) below the uniform strain εu, σ(ε̄) past it (Considère, via Dieter,
 * *Mechanical Metallurgy*, 3rd ed., §8-3); for an S-shaped law whose force peaks again after εu
 * (see `forcePeaks`) also σ(p)·e^(ε̄−p) before each later peak p. Rm is monotone in ε̄, so the
 * bound is the smallest strain of these branches that reaches T.
 * Units: T in MPa; returns a true strain, negative when the annealed state already exceeds T (callers
 * clamp), or null when no strain reaches T (at or above a saturating law's limit).
 * @example strainForTensile(hollomon({ K: 530, n: 0.44 }), 237.85) // ≈ 0 (annealed copper's Rm, Callister)
 */
export function strainForTensile(law: FlowLaw, T: number): number | null {
  const inverse = (): number | null => {
    // A stress at or above saturation is reached by no strain (checked first: throwing is slow).
    if (law.saturationStress !== undefined && T >= law.saturationStress) return null;
    try {
      return law.strainAt(T);
    } catch {
      return null;
    }
  };
  const eu = law.uniformStrain();
  if (!hasLaterForcePeaks(law)) {
    const su = law.stress(eu);
    return T <= su ? eu + Math.log(T / su) : inverse();
  }
  let e = inverse();
  for (const pk of forcePeaks(law)) {
    const sp = law.stress(pk);
    if (T <= sp) e = Math.min(e ?? Infinity, pk + Math.log(T / sp));
  }
  return e;
}
