import { quickselect } from 'simple-statistics';

/**
 * Noise of a record's stress, estimated from the data: the robust scale of the second differences
 * d_i = s_{i−1} − 2·s_i + s_{i+1}. For white noise of standard deviation σ on a curve that is smooth on
 * the scale of a few samples, Var(d) = 6σ² (1 + 4 + 1); the median absolute value of a normal variable is
 * 0.6745·sd, so σ̂ = 1.4826·median|d|/√6. The median ignores the few large d at a knee, a yield drop, an
 * unloading or the fracture. Sources: the second-difference variance estimator (J. von Neumann, "Distribution
 * of the ratio of the mean square successive difference to the variance", Ann. Math. Stat. 12 (1941),
 * from memory; the difference-based form with weights (1, −2, 1) as in P. Hall, J. W. Kay and
 * D. M. Titterington, Biometrika 77 (1990) 521–528, from memory); MAD scale 1.4826 = 1/Φ⁻¹(0.75)
 * (common practice). When the stress is quantised so that most d are 0, the mean |d| is used instead
 * (E|d| = √(2/π)·√6·σ for normal noise).
 * Selection by simple-statistics' `quickselect` (Floyd–Rivest), O(n) expected, one scratch array.
 * Units: those of the stress (MPa). Valid: at least 3 samples.
 * @returns σ̂ ≥ 0 (0 for a record with exactly linear pieces).
 * @example recordNoise([0, 1, 2, 3, 4]) // 0
 */
export function recordNoise(stress: ArrayLike<number>, from = 0, to = stress.length): number {
  const m = to - from - 2;
  if (m < 1) return 0;
  const d = new Float64Array(m);
  let sum = 0;
  for (let i = 0; i < m; i++) {
    const v = Math.abs(stress[from + i]! - 2 * stress[from + i + 1]! + stress[from + i + 2]!);
    d[i] = v;
    sum += v;
  }
  const k = (m - 1) >> 1;
  quickselect(d as unknown as number[], k);
  const med = d[k]!;
  if (med > 0) return (1.482602218505602 * med) / Math.sqrt(6);
  return (sum / m) * Math.sqrt(Math.PI / 2) / Math.sqrt(6);
}
