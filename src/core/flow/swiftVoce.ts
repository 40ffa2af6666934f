import { InputError } from '../errors.js';
import { brent } from '../numeric/brent.js';
import { considereNumeric } from './considere.js';
import { swift } from './swift.js';
import type { FlowLaw, SwiftVoceParams } from './types.js';
import { validateParams } from './validate.js';
import { voce } from './voce.js';

/**
 * Swift–Voce blend σ = α·K(ε0+ε)ⁿ + (1−α)·[σ0 + Q(1 − e^(−bε))] (true stress, true plastic strain).
 *
 * Source: the linear combination of Swift and Voce used for steel sheet by H. Sung, J. H. Kim and
 * R. H. Wagoner, "A plastic constitutive equation incorporating strain, strain-rate, and temperature",
 * *Int. J. Plasticity* 26 (2010) 1746–1771, eq. (1).
 * Units: K, σ0, Q in MPa; α, ε0, n, b dimensionless. Valid range: 0 ≤ α ≤ 1 and each part's range.
 * Work is the same blend of the parts' closed forms; the inverse is found by Brent's method
 * (monotone σ), Considère numerically.
 * @throws InputError for parameters out of range, or `strainAt` for a stress no strain ≤ 100 reaches.
 * @example swiftVoce({ alpha: 1, K: 600, eps0: 0.01, n: 0.2, sigma0: 0, Q: 0, b: 1 }).stress(0.09) // 600·0.1^0.2 ≈ 378.6
 */
export function swiftVoce(params: SwiftVoceParams, path = 'flowCurve'): FlowLaw {
  const v = validateParams('swiftVoce', params, path) as SwiftVoceParams;
  const sw = swift(v, path);
  const vo = voce(v, path);
  const al = v.alpha;
  const bl = 1 - al;
  let eu: number | undefined;
  const stress = (e: number) => al * sw.stress(e) + bl * vo.stress(e);
  const slope = (e: number) => al * sw.slope(e) + bl * vo.slope(e);
  return {
    law: 'swiftVoce',
    params: Object.freeze({ ...v }),
    stress,
    slope,
    work: (e) => al * sw.work(e) + bl * vo.work(e),
    strainAt: (s) => {
      if (s <= stress(0)) return 0;
      const hiE = 100;
      if (s >= stress(hiE)) throw new InputError('stress', s, `below the law's stress at strain ${hiE} (${stress(hiE)} MPa)`);
      return brent((e) => stress(e) - s, 0, hiE, 1e-15).root;
    },
    uniformStrain: () => (eu ??= considereNumeric(stress, slope)),
    ...(al === 0 ? { saturationStress: v.sigma0 + v.Q } : {}),
  };
}
