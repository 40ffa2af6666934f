import { InputError } from '../errors.js';
import { linearFit } from '../fit/linearFit.js';
import type { ElasticWindow } from './types.js';

/** Candidate window bounds, as fractions of the highest stress of the record. */
export const ELASTIC_WINDOW = {
  starts: [0.02, 0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5] as readonly number[],
  widths: [0.05, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5] as readonly number[],
  maxTop: 0.9,
  minPoints: 5,
} as const;

export interface ElasticResult {
  modulus: number;
  toeStrain: number;
  window: ElasticWindow;
  /** Standard deviation of the elastic-line residuals, MPa (a noise estimate). */
  noise: number;
}

/**
 * Young's modulus by least squares over an automatically chosen linear window of the initial loading
 * branch, with toe compensation.
 *
 * Window: every band [a, a + w]·Rm with a ∈ {0.02, 0.05 … 0.5}, w ∈ {0.05, 0.1 … 0.5}, top ≤ 0.9·Rm, taken on
 * the first rise of the stress (points until the stress first exceeds the top); the band with the
 * smallest relative standard error of the slope SE(E)/E wins — it rewards both many points and
 * straightness, in the spirit of ASTM E3076 (objective choice of the fit window) and ASTM E111
 * (least-squares modulus). Toe compensation as ISO 6892-1 Annex and ASTM E8 §7: the line
 * σ = E·(e − e0) is extended to zero stress and e0 is subtracted from all strains.
 * Units: strain fraction, stress MPa, E MPa. Valid: at least 5 points on the rising branch.
 * @throws InputError when no window holds 5 points.
 * @example elasticModulus([0, 0.001, 0.002, 0.003, 0.004, 0.005], [0, 200, 400, 600, 800, 1000]).modulus // 200000
 */
export function elasticModulus(strain: ArrayLike<number>, stress: ArrayLike<number>, rm?: number): ElasticResult {
  const n = stress.length;
  let top = rm ?? 0;
  if (rm === undefined) for (let i = 0; i < n; i++) top = Math.max(top, stress[i]!);
  if (!(top > 0)) throw new InputError('stress', top, 'a record whose highest stress is above 0 MPa');
  // First index at or above a stress level, on the first rise.
  const firstAt = (level: number) => {
    for (let i = 0; i < n; i++) if (stress[i]! >= level) return i;
    return n;
  };
  let best: { se: number; a: number; b: number; i0: number; i1: number; fit: ReturnType<typeof linearFit> } | null = null;
  for (const a of ELASTIC_WINDOW.starts) {
    for (const w of ELASTIC_WINDOW.widths) {
      const b = a + w;
      if (b > ELASTIC_WINDOW.maxTop + 1e-12) continue;
      const i0 = firstAt(a * top);
      const i1 = firstAt(b * top);
      if (i1 - i0 < ELASTIC_WINDOW.minPoints) continue;
      let fit;
      try {
        fit = linearFit(strain, stress, i0, i1);
      } catch {
        continue;
      }
      if (!(fit.slope > 0)) continue;
      const se = fit.slopeStandardError / fit.slope;
      if (!best || se < best.se) best = { se, a, b, i0, i1, fit };
    }
  }
  if (!best) throw new InputError('strain', n, `a rising branch with at least ${ELASTIC_WINDOW.minPoints} points between 5 % and 90 % of the highest stress (elastic window)`);
  const { fit } = best;
  const E = fit.slope;
  return {
    modulus: E,
    toeStrain: -fit.intercept / E,
    noise: Math.sqrt(fit.ssr / Math.max(1, fit.n - 2)),
    window: {
      fromStress: best.a * top,
      toStress: best.b * top,
      fromIndex: best.i0,
      toIndex: best.i1,
      points: best.i1 - best.i0,
      r2: fit.r2,
      standardError: fit.slopeStandardError,
      method: 'least squares over the band of the initial rise (fractions of Rm) with the smallest relative standard error of the slope; toe-compensated',
    },
  };
}
