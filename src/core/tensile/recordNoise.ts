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
  const k = (m - 1) >> 1;
  const bracketed = m >= BRACKET_FROM ? bracketedMedian(stress, from, m, k) : null;
  let med: number, sum: number;
  if (bracketed) ({ med, sum } = bracketed);
  else {
    const d = new Float64Array(m);
    sum = 0;
    for (let i = 0; i < m; i++) {
      const v = Math.abs(stress[from + i]! - 2 * stress[from + i + 1]! + stress[from + i + 2]!);
      d[i] = v;
      sum += v;
    }
    quickselect(d as unknown as number[], k);
    med = d[k]!;
  }
  if (med > 0) return (1.482602218505602 * med) / Math.sqrt(6);
  return (sum / m) * Math.sqrt(Math.PI / 2) / Math.sqrt(6);
}

/** Second differences from which {@link recordNoise} brackets its median first (below, the plain selection). */
const BRACKET_FROM = 50_000;
/** Sample size of the bracket, and its half-width in sample standard deviations of the median's rank. */
const BRACKET_SAMPLE = 4096, BRACKET_SIGMAS = 4;

/**
 * The k-th smallest |second difference| of stress[from…from + m + 2) and their sum (added in index order), without
 * the array of all m of them: a sample of 4096 evenly spaced differences, sorted, gives a value range [L, H] that
 * holds the k-th with near certainty (its rank ± 4 standard deviations of a sample rank); one pass counts the
 * differences below L and keeps only those in [L, H], and the k-th is selected among these. Exact: the same value
 * as selecting among all m (the k-th smallest of a multiset does not depend on the method); null when the k-th is
 * not in the range (or too many differences are, as on a quantised record whose differences are mostly 0): the
 * caller then selects among all m. Why not the library's selection alone: on a 1,000,000-row record its pass over a
 * fresh array of a million took 23 ms in a fresh process, this 4–6 ms (bench/RESULTS.md, tenth session).
 */
function bracketedMedian(stress: ArrayLike<number>, from: number, m: number, k: number): { med: number; sum: number } | null {
  const S = BRACKET_SAMPLE;
  const sample = new Float64Array(S);
  for (let j = 0; j < S; j++) {
    const i = from + Math.floor(((j + 0.5) * m) / S);
    sample[j] = Math.abs(stress[i]! - 2 * stress[i + 1]! + stress[i + 2]!);
  }
  sample.sort();
  const p = k / Math.max(1, m - 1), r = p * (S - 1), sd = Math.sqrt(S * p * (1 - p)) + 1;
  const lo = Math.floor(r - BRACKET_SIGMAS * sd), hi = Math.ceil(r + BRACKET_SIGMAS * sd);
  const L = lo >= 0 ? sample[lo]! : -Infinity, H = hi < S ? sample[hi]! : Infinity;
  // Room for four times the differences the sample puts in the range; more means a range too wide to pay.
  const room = Math.min(m, 4 * Math.ceil(((hi - lo + 1) / S) * m) + 1024);
  const kept = new Float64Array(room);
  const counts = new Float64Array(3); // below L, kept, sum
  if (!bracketPass(stress, from, m, L, H, kept, counts)) return null;
  const below = counts[0]!, n = counts[1]!;
  if (k < below || k >= below + n) return null;
  const mid = kept.subarray(0, n);
  quickselect(mid as unknown as number[], k - below);
  return { med: mid[k - below]!, sum: counts[2]! };
}

/**
 * The pass of bracketedMedian: false when more than kept.length − 1 differences fall in [L, H]. Without branches on
 * the values (each is stored at kept[n], and n advances only for one in the range): about half the differences lie
 * below L in no order, and a branch on that test was mispredicted half the time (6 ms against 2 ms a million, measured).
 */
function bracketPass(stress: ArrayLike<number>, from: number, m: number, L: number, H: number, kept: Float64Array, counts: Float64Array): boolean {
  let below = 0, n = 0, sum = 0;
  const last = kept.length - 1;
  for (let i = 0; i < m; i++) {
    const v = Math.abs(stress[from + i]! - 2 * stress[from + i + 1]! + stress[from + i + 2]!);
    sum += v;
    const lt = +(v < L);
    below += lt;
    if (n === last) return false;
    kept[n] = v;
    n += (1 - lt) & +(v <= H);
  }
  counts[0] = below; counts[1] = n; counts[2] = sum;
  return true;
}

/**
 * Noise of a record's stress as scatter about a local smooth at a scale wider than the noise's correlation length:
 * the record (or [from, to)) is cut into blocks of B samples, B = 16, 32 and 64 (each while at least 8 blocks fit),
 * a least-squares parabola is fitted in every block, and the scale at B is √(median of SSR/(B − 3)) divided by the
 * median of χ²_ν/ν, ν = B − 3 (Wilson–Hilferty: (1 − 2/(9ν))³). The result is the largest of these and
 * {@link recordNoise}. For white noise every scale gives σ; load noise correlated from sample to sample (a filter in
 * the machine, AR(1) with ρ 0.2–0.7) hides from second differences — they read it as low as half its sd — but not
 * from a parabola over many correlation lengths, so the estimate rises with B to the noise's marginal sd. The
 * medians ignore the blocks that hold a knee, a yield drop, an unloading or the fracture.
 * Sources: local polynomial residual variance (Draper & Smith, *Applied Regression Analysis*, ch. 5), the
 * variance-vs-scale reading of correlated noise as in the Allan variance (D. W. Allan, Proc. IEEE 54 (1966)
 * 221–230, from memory), Wilson–Hilferty (1931, from memory).
 * Units: those of the stress (MPa). Valid: any length (below 16 samples per block count the white estimate stands).
 * Cost: O(n). @returns σ̂ ≥ 0.
 * @example recordNoiseWide([0, 1, 2, 3, 4]) // 0
 */
/** Blocks per scale at most in {@link recordNoiseWide}. */
const MAX_BLOCKS = 1000;

export function recordNoiseWide(stress: ArrayLike<number>, from = 0, to = stress.length): number {
  let best = recordNoise(stress, from, to);
  for (const B of [16, 32, 64]) {
    const all = Math.floor((to - from) / B);
    if (all < 8) break;
    // At most MAX_BLOCKS blocks, spread evenly over the record: the median needs no more, and a 1,000,000-row
    // record costs the same as a 100,000-row one.
    const nb = Math.min(all, MAX_BLOCKS), step = all / nb;
    const v = new Float64Array(nb);
    for (let k = 0; k < nb; k++) v[k] = blockParabolaSsr(stress, from + Math.floor(k * step) * B, B) / (B - 3);
    const mid = (nb - 1) >> 1;
    quickselect(v as unknown as number[], mid);
    const nu = B - 3, medChi = (1 - 2 / (9 * nu)) ** 3;
    best = Math.max(best, Math.sqrt(v[mid]! / medChi));
  }
  return best;
}

/** Residual sum of squares of the least-squares parabola through the B samples from `at`, against their index. */
function blockParabolaSsr(y: ArrayLike<number>, at: number, B: number): number {
  // Orthogonal polynomials on the indices 0…B−1 (discrete Legendre): p0 = 1, p1 = t − c, p2 = (t − c)² − (B² − 1)/12.
  // Values taken from the block's middle sample, so the sums do not cancel (stress ~10³ MPa, noise ~10⁻¹).
  const c = (B - 1) / 2, q = (B * B - 1) / 12, y0 = y[at + (B >> 1)]!;
  let s0 = 0, s1 = 0, s2 = 0, n1 = 0, n2 = 0, yy = 0;
  for (let t = 0; t < B; t++) {
    const v = y[at + t]! - y0, d = t - c, p2 = d * d - q;
    s0 += v; s1 += v * d; s2 += v * p2; n1 += d * d; n2 += p2 * p2; yy += v * v;
  }
  return Math.max(0, yy - (s0 * s0) / B - (s1 * s1) / n1 - (s2 * s2) / n2);
}

/** Largest lag-1 correlation {@link noiseLag1} returns: beyond it (1 + ρ)/(1 − ρ) = 19 rests on too little. */
export const NOISE_LAG1_MAX = 0.9;

/** Samples per block of {@link noiseLag1} (64 first differences, each block detrended on its own). */
const LAG1_BLOCK = 64;

/**
 * Lag-1 correlation ρ of a record's load noise from sample to sample (an acquisition filter), read over the whole
 * record (or [from, to)), for the AR(1) variance factor (1 + ρ)/(1 − ρ) that widens an interval from a few
 * neighbouring samples. Two readings (the AR(1) model as in Box & Jenkins, *Time Series Analysis*, ch. 3, from
 * memory):
 * - From first differences dᵢ = sᵢ₊₁ − sᵢ, in blocks of 64 each detrended by a least-squares line in i: the median
 *   over the blocks (at most 1000, spread evenly; it ignores a knee, a drop, the fracture) of their lag-1
 *   autocorrelation c. For AR(1) noise Cov(dᵢ, dᵢ₊₁) = −σ²(1 − ρ)² and Var(d) = 2σ²(1 − ρ), so c = −(1 − ρ)/2 and
 *   ρ_d = 1 + 2c. Differences are nearly blind to the curve, which a window's own residuals are not.
 * - ρ_d near 1 (0.85 to 1.3) is what a moving-average filter gives too (its first differences are uncorrelated
 *   whatever its length), so there ρ is read from the two noise scales instead: second differences have variance
 *   2σ²(1 − ρ)(3 − ρ) under AR(1) instead of 6σ², so r = white/wide = √((1 − ρ)(3 − ρ)/3) and ρ = 2 − √(1 + 3r²),
 *   `white` = {@link recordNoise}, `wide` = {@link recordNoiseWide} (given). This reads a boxcar filter of 3–5
 *   samples as ρ 0.71–0.82 (a variance factor 6–10 where 3–5 is right: wider, not narrower).
 * - ρ_d above 1.3 (differences that move together, which no noise gives: the record follows its own curve's wiggles,
 *   its noise small and white against them, as the open 42CrMoS4 records 46NT71 and 46NT73 do, ρ_d 2.0–2.2) reads
 *   as no correlation.
 * Why from the whole record: a short window's own residuals (13 samples about a parabola near the Rp0.2 crossing)
 * read ρ near 0 where it is 0.7, and the intervals built on them were too narrow. On invented hold-out D records ρ_d
 * follows the generator's ρ within about 0.1 (0.70 → 0.79, 0.83 → 0.82, 0.40 → 0.41, white → 0.00–0.10).
 * Units: none (stresses in any one unit). Valid: any length; fewer than 65 samples give 0.
 * Cost: O(min(n, 64,000)), and recordNoise's O(n) pass only where ρ_d is near 1.
 * @returns ρ in [0, NOISE_LAG1_MAX].
 * @example noiseLag1(Float64Array.from({ length: 200 }, (_, i) => i * i), 0, 200, 0) // 0 (no noise)
 */
export function noiseLag1(stress: ArrayLike<number>, from: number, to: number, wide: number): number {
  const B = LAG1_BLOCK, all = Math.floor((to - from - 1) / B);
  if (all < 1) return 0;
  const nb = Math.min(all, MAX_BLOCKS), step = all / nb;
  const c = new Float64Array(nb);
  let m = 0;
  for (let k = 0; k < nb; k++) {
    const r = blockDifferenceLag1(stress, from + Math.floor(k * step) * B, B);
    if (r !== null) c[m++] = r;
  }
  if (m === 0) return 0;
  const v = c.subarray(0, m), mid = (m - 1) >> 1;
  quickselect(v as unknown as number[], mid);
  const rhoD = 1 + 2 * v[mid]!;
  if (rhoD > LAG1_CURVE) return 0;
  if (rhoD < LAG1_NEAR_ONE) return Math.max(0, rhoD);
  const white = recordNoise(stress, from, to);
  if (!(wide > 0) || !(white < wide)) return 0;
  const r = white / wide;
  return Math.min(NOISE_LAG1_MAX, Math.max(0, 2 - Math.sqrt(1 + 3 * r * r)));
}

/** ρ_d from which {@link noiseLag1} reads the two noise scales instead (a moving-average filter gives ρ_d ≈ 1). */
const LAG1_NEAR_ONE = 0.85;
/** ρ_d above which the differences follow the curve, not the noise ({@link noiseLag1}). */
const LAG1_CURVE = 1.3;

/** Lag-1 autocorrelation of the B first differences from `at`, detrended by a line in their index; null if flat. */
function blockDifferenceLag1(y: ArrayLike<number>, at: number, B: number): number | null {
  const cm = (B - 1) / 2;
  let sd = 0, std = 0, tt = 0;
  for (let t = 0; t < B; t++) { const d = y[at + t + 1]! - y[at + t]!, u = t - cm; sd += d; std += d * u; tt += u * u; }
  const mean = sd / B, slope = std / tt;
  let r0 = 0, r1 = 0, prev = 0;
  for (let t = 0; t < B; t++) {
    const d = y[at + t + 1]! - y[at + t]! - mean - slope * (t - cm);
    r0 += d * d;
    if (t > 0) r1 += d * prev;
    prev = d;
  }
  return r0 > 0 ? r1 / r0 : null;
}
