import { ComputationError } from '../errors.js';
import { blockAverage } from '../fit/blockAverage.js';
import { averageTopSpan, solveSmall } from './localFit.js';
import { recordNoiseWide } from './recordNoise.js';

/** Where the maximum of force is and how it was read. */
export interface ForceMaximum {
  /** Rm: the maximum of the top model without the necking side's cubic, MPa. */
  stress: number;
  /** Engineering strain (as recorded, toe not removed) where Ag is read: the weighted vertex, or the middle of a top flat within the noise. */
  strain: number;
  /** Sample nearest to that strain. */
  index: number;
  /** Samples in the top fit and its strain span. */
  points: number;
  span: [number, number];
  /** True when the top is flat within the noise, so Ag is read at the middle of the flat part. */
  flat: boolean;
  /**
   * 95 % interval of the strain at maximum force (as `strain`, toe not removed), from the profile of the
   * residual sum over the vertex position: every xv whose best fit has ssr ≤ ssr_min + 3.84·s², with
   * s² = max(σ̂², ssr_min/(bins − p − 1))·max((1 + ρ)/(1 − ρ), batch-means factor) (profile-likelihood interval for
   * one parameter, χ²₁(0.95) = 3.84; Bates & Watts, *Nonlinear Regression Analysis and Its Applications*, §6.1, from
   * memory; ρ the lag-1 autocorrelation of the residuals; the batch-means factor the long-run variance of the residuals
   * over their variance, for slow disturbances such as hum), for the kinked and the Rm model, joined with the vertices of the smooth
   * and the d⁴ model, and of the smooth d⁴ model where the data do not reject it (Akaike difference ≤ 4).
   */
  strainInterval95: [number, number];
  /**
   * The same interval at 99.9 % (χ²₁(0.999) = 10.83 in place of 3.84): where the data near the top do not clearly
   * rule maximum force out. The hardening laws' Ag is used where it lies inside this one (analyzeRecord, lawTop.ts).
   */
  strainInterval999: [number, number];
}

/**
 * χ²₁(0.999) (the square of the normal quantile z(0.9995) = 3.2905: 10.828; NIST/SEMATECH e-Handbook of Statistical
 * Methods, table of upper critical values of the chi-square distribution, ν = 1, from memory): the profile limit of
 * {@link ForceMaximum.strainInterval999}. A 95 % interval leaves out one true value in twenty by design, and the top
 * model's own shape error puts it out more often (property-test seed 57: 2.9 half-widths off); the laws' Ag, read from
 * the whole uniform curve, was refused there although it lay within 0.4 point of the truth. Gated at 99.9 %, Ag off by
 * more than 0.4 point fell 65 → 53 over the three invented generators' noisy records, and the misses outside the
 * interval given (widened to hold the laws' Ag) 17 → 5 (npx vitest run test/core/tensile).
 */
export const LAW_GATE_CHI2 = 10.828;

/** Block averages the top is fitted on (at most): 1000 keep every fit O(1000) on a 1,000,000-row record; 2000 gave the same Rm and Ag on the property test and cost twice the time. */
const TOP_BLOCKS = 1000;

/**
 * Maximum force from a local smooth fit around the top, not the highest raw sample (the highest of
 * many noisy samples is biased high by 2–3 noise standard deviations).
 *
 * A centred moving average (window n/50, odd, 5 to 20001 samples) finds the top. The outermost samples
 * whose average lies within δ = max(3σ̂/√w, 1 % of the top) of it, widened by w/4 samples on each side
 * (the average blunts the top) and to at least 9 samples, form the span. On the span (binned to at most
 * 1000 block averages, {@link blockAverage}) a model of two half-cubics joined at the vertex with zero slope
 * (s = Rm − a·u² + b·u³ on each side, its own a and b, bounded so that each side falls away from the vertex
 * over the whole span: a ≥ 0 and the slope at the span's end of the right sign) is fitted by bounded least
 * squares, the vertex position found by a grid and golden-section search: the necking side bends more sharply
 * than the hardening side, and neither side is a mirror of the other (a model without the right-hand cubic put
 * Ag 0.3–1 point late on necking branches that are not parabolas). Rm is the maximum of the same model without
 * the necking side's cubic (less scatter). Ag is read at the Akaike-weighted mean of the vertices of this
 * (kinked) model and of a smooth one (one curvature for both sides); where neither side of the kinked model falls
 * by more than 4σ̂/√m over the span (m samples in the fit) the top is flat within the noise and Ag is read at the
 * middle of the span (ASTM E8/E8M practice for flat tops, from memory). ISO 6892-1 §3.10.1: for a record with a yield drop, Fm is
 * the highest force after work hardening begins — the caller passes `from` after the yield plateau.
 * σ̂ is the record's noise (`recordNoise`, which finds the span) until the span is known; a span of 128 samples or
 * more is then fitted with its own noise ({@link recordNoiseWide} over the span: 8 blocks of 16 at least), since real
 * records are not equally noisy everywhere (the open 42CrMoS4 record 46NT71 scatters 1–3 MPa on its elastic rise and
 * while it necks, 0.1–0.3 MPa around its maximum; the record-wide 1.7 MPa had warned its Ag as uncertain by ±0.98
 * point, ±0.34 with the top's own).
 * `stressStep` (MPa, 0 when the stress is not written in coarse steps): the step of a stress column read between its
 * steps (analyzeRecord, warning `coarseStress`); the span's noise is then at least stressStep/√12, and both Ag
 * intervals hold the strain range of the top's own step, where the record cannot place the maximum.
 * Units: strain fraction, stress MPa, σ̂ MPa. Valid: `to − from` ≥ 3, stressStep ≥ 0. Cost: O(to − from).
 * @example forceMaximum([0, 1, 2, 3, 4], [0, 3, 4, 3, 0], 0, 0, 5).stress // 4.0
 */
/** Samples in the top's span from which its own noise is used (8 blocks of 16 for recordNoiseWide). */
const TOP_LOCAL_NOISE_MIN = 128;

export function forceMaximum(strain: ArrayLike<number>, stress: ArrayLike<number>, recordNoise: number, from: number, to: number, stressStep = 0): ForceMaximum {
  const noiseFloor = stressStep / Math.sqrt(12);
  let noise = recordNoise;
  const n = to - from;
  if (!(n >= 3)) throw new ComputationError('record.maximumForce', `${n} samples between index ${from} and ${to}; at least 3 are needed to fit the top of the record`);
  let w = Math.max(5, Math.min(20001, Math.round(n / 50))) | 1;
  if (w > n) w = Math.max(1, n) | 1;
  // The first highest average and the outermost samples whose average is within delta of it (a contiguous scan would
  // stop at the first noise dip of the average), from two passes that keep no column of averages (averageTopSpan).
  const top = averageTopSpan(stress, from, to, w, (t) => t - Math.max((3 * noise) / Math.sqrt(w), 0.01 * Math.abs(t)));
  const j = top[0]! | 0, maTop = top[1]!;
  const a0 = top[2]! | 0, b0 = top[3]! | 0;
  let a = a0, b = b0;
  // The averaging window blunts the top: widen the span by w/4 samples on each side.
  a = Math.max(0, a - (w >> 2)); b = Math.min(n - 1, b + (w >> 2));
  while (b - a + 1 < 9 && (a > 0 || b < n - 1)) { if (a > 0) a--; if (b < n - 1) b++; }
  const i0 = from + a, i1 = from + b + 1;
  const xa = strain[i0]!, xb = strain[i1 - 1]!;
  const h = Math.max(xb - xa, 1e-300);
  // Bin the span to at most 1000 groups of consecutive samples (mean strain, mean stress, count): a weighted
  // least-squares fit to the group means has the same minimiser in xv as the fit to every sample, up to the
  // few groups the vertex splits; their moments are kept once ({@link TopSums}), so a trial xv costs O(log bins).
  const m = i1 - i0;
  // The span's own noise from here on (see the doc comment). Measured on the property test and both hold-outs: the
  // same tallies but one property-test record whose interval now holds the truth (seed 143).
  if (m >= TOP_LOCAL_NOISE_MIN) noise = Math.max(recordNoiseWide(stress, i0, i1), noiseFloor);
  const blocks = blockAverage(columnSpan(strain, i0, i1), columnSpan(stress, i0, i1), Math.ceil(m / TOP_BLOCKS));
  const bx = blocks.x, by = blocks.y, bw = blocks.w, nb = bx.length;
  const sums = new TopSums(bx, by, bw, 0.5 * (xa + xb), h);
  // Two halves joined at the vertex xv: s = Rm − a·u² + b·uᵖ on each side (u = (x − xv)/h), each side its own a
  // and b; p = 3 on the hardening side, and on the necking side 3 (the model Ag is read from), 4 (a necking branch
  // that starts flatter, for the interval) or no second term (the model Rm is read from). A top falls away from its
  // vertex over the whole span: the slope u·(p·b·u^(p−2) − 2a) must be ≥ 0 left of the vertex and ≤ 0 right of it,
  // that is p·b·u^(p−2) − 2a ≤ 0 over each side's range, which (monotone in |u|) holds iff it holds at u = 0
  // (a ≥ 0) and at the side's end uE (p·b·uE^(p−2) − 2a ≤ 0). For a fixed xv this is a least-squares problem linear
  // in (Rm, aL, bL, aR, bR) under two linear inequalities per side, solved exactly by its active sets: per side free
  // (a, b), a = 0 (b·uᵖ only), the end slope zero (b = 2a/(p·uE^(p−2)): one column −u² + 2uᵖ/(p·uE^(p−2))), or both
  // (the side flat). The unconstrained fit is tried first; if it breaks a constraint, every combination is solved
  // and the feasible one with the least residual sum is kept (for a convex quadratic objective under linear
  // constraints the optimum is the feasible solution of its own active set, so this is the constrained optimum).
  // Without the constraint a side could rise past the vertex and fall again (a second, higher top inside the span):
  // on the property test that read Ag up to 7 points early (Ag off by more than 0.4 point on 110 of 240 records,
  // 49 with it). Per-side power sums (Σw·uᵏ, k ≤ 8, Σw·(y − y0)·uᵏ, k ≤ 4, from TopSums) give every combination's
  // normal equations.
  const PW = 9, PY = 5;
  const pw = [new Float64Array(PW), new Float64Array(PW)], py = [new Float64Array(PY), new Float64Array(PY)];
  const M = new Float64Array(25), V = new Float64Array(5);
  interface Side { a: number; b: number }
  // A column of the design: qL·(−u²) + cL·u³ left of the vertex, qR·(−u²) + cR·uᵖ right of it (its parameter adds
  // q to that side's a and c to its b).
  interface Col { qL: number; cL: number; qR: number; cR: number }
  const col = (qL: number, cL: number, qR: number, cR: number): Col => ({ qL, cL, qR, cR });
  const fitWith = (cols: Col[], p: number, tt: number): { Rm: number; L: Side; R: Side; ssr: number } | null => {
    const k = 1 + cols.length;
    const WL = pw[0]!, WR = pw[1]!, YL = py[0]!, YR = py[1]!;
    M.fill(0, 0, k * k);
    M[0] = WL[0]! + WR[0]!; V[0] = YL[0]! + YR[0]!;
    for (let i = 0; i < cols.length; i++) {
      const ci = cols[i]!;
      const c1 = -ci.qL * WL[2]! + ci.cL * WL[3]! - ci.qR * WR[2]! + ci.cR * WR[p]!;
      M[(i + 1) * k] = c1; M[i + 1] = c1;
      V[i + 1] = -ci.qL * YL[2]! + ci.cL * YL[3]! - ci.qR * YR[2]! + ci.cR * YR[p]!;
      for (let j = i; j < cols.length; j++) {
        const cj = cols[j]!;
        const v = ci.qL * cj.qL * WL[4]! - (ci.qL * cj.cL + ci.cL * cj.qL) * WL[5]! + ci.cL * cj.cL * WL[6]!
          + ci.qR * cj.qR * WR[4]! - (ci.qR * cj.cR + ci.cR * cj.qR) * WR[2 + p]! + ci.cR * cj.cR * WR[2 * p]!;
        M[(i + 1) * k + j + 1] = v; M[(j + 1) * k + i + 1] = v;
      }
    }
    const sol = solveSmall(M.subarray(0, k * k), V.subarray(0, k), k, 1e-18);
    if (!sol) return null;
    let ssr = tt;
    for (let i = 0; i < k; i++) ssr -= sol[i]! * V[i]!;
    const L: Side = { a: 0, b: 0 }, R: Side = { a: 0, b: 0 };
    for (let i = 0; i < cols.length; i++) {
      const ci = cols[i]!, c = sol[i + 1]!;
      L.a += ci.qL * c; L.b += ci.cL * c; R.a += ci.qR * c; R.b += ci.cR * c;
    }
    return { Rm: sums.y0 + sol[0]!, L, R, ssr };
  };
  // A tied side (end slope zero, b = 2a/(p·uE^(p−2))) lies on its bound by construction; its slope factor comes out
  // ±1e-16 of its terms, so the test allows rounding (without the allowance a tied fit was refused at random,
  // however good: on a fifth of the property-test records a worse active set was kept at some trial vertices).
  const feasible = (sd: Side, uE: number, p: number) => {
    const t = p * sd.b * uE ** (p - 2);
    return sd.a >= 0 && t - 2 * sd.a <= 1e-12 * (Math.abs(t) + 2 * Math.abs(sd.a));
  };
  /**
   * The designs of every active set, the unconstrained one first (`firstOnly`: that one alone). Kinked top (each side its own a): per side free
   * (a, b), b only (a = 0), tied end slope (b = 2a/(p·uE^(p−2))), flat. Smooth top (one a for both sides: the
   * curve's second derivative continuous at the vertex, as a record's top is where necking starts gradually): a
   * shared or zero, each side's b free or tied.
   */
  const designs = (nL: number, nR: number, uL: number, uR: number, pR: number, smooth: boolean, firstOnly = false): Col[][] => {
    const p = pR === 0 ? 3 : pR;
    const cubL = nL >= 3, cubR = nR >= 3 && pR !== 0;
    const kL = cubL ? 2 / (3 * uL) : 0, kR = cubR ? 2 / (p * uR ** (p - 2)) : 0;
    const out: Col[][] = [];
    if (smooth) {
      for (const zero of [false, true]) for (const tL of cubL ? [false, true] : [true]) for (const tR of cubR ? [false, true] : [true]) {
        const cols: Col[] = [];
        if (!zero && (nL > 0 || nR > 0)) cols.push(col(nL > 0 ? 1 : 0, tL ? kL : 0, nR > 0 ? 1 : 0, tR ? kR : 0));
        if (!tL) cols.push(col(0, 1, 0, 0));
        if (!tR) cols.push(col(0, 0, 0, 1));
        out.push(cols);
        if (firstOnly) return out;
      }
      return out;
    }
    const side = (n: number, cub: boolean, kap: number, left: boolean): Col[][] => {
      const mk = (q: number, c: number) => (left ? col(q, c, 0, 0) : col(0, 0, q, c));
      if (n === 0) return [[]];
      if (!cub) return [[mk(1, 0)], []];
      return [[mk(1, 0), mk(0, 1)], [mk(0, 1)], [mk(1, kap)], []];
    };
    for (const l of side(nL, cubL, kL, true)) for (const r of side(nR, cubR, kR, false)) { out.push([...l, ...r]); if (firstOnly) return out; }
    return out;
  };
  /** Best bounded fit with the vertex at xv; `pR` the necking side's second power (3, 4, or 0 for none). */
  const solve = (xv: number, pR = 3, smooth = false) => {
    const nL = sums.at(xv, pw[0]!, py[0]!, pw[1]!, py[1]!), nR = nb - nL, tt = sums.tt;
    const uL = (xa - xv) / h, uR = (xb - xv) / h, p = pR === 0 ? 3 : pR;
    const ok = (f: { L: Side; R: Side } | null) => f !== null && feasible(f.L, uL, 3) && feasible(f.R, uR, p);
    // The unconstrained fit, when feasible, is the optimum; otherwise the best feasible active set. Its design alone
    // first (built as the first of all, the same columns): the others are built only when it breaks a constraint
    // (358 of the 622 trial vertices of the bench's 1,000,000-row record).
    let all = designs(nL, nR, uL, uR, pR, smooth, true);
    let best = fitWith(all[0]!, p, tt);
    if (!ok(best)) {
      all = designs(nL, nR, uL, uR, pR, smooth);
      best = null;
      for (let d = 1; d < all.length; d++) {
        const f = fitWith(all[d]!, p, tt);
        if (ok(f) && (!best || f!.ssr < best.ssr)) best = f;
      }
    }
    return best ? { Rm: best.Rm, aL: best.L.a, bL: best.L.b, aR: best.R.a, bR: best.R.b, pR: p, ssr: best.ssr } : null;
  };
  // Vertex by the least residual sum: grid over the span, then golden section around the best grid point.
  const vertex = (pR: number, smooth = false) => {
    let bx0 = strain[from + j]!, bf = solve(bx0, pR, smooth);
    const G = 48;
    for (let g = 0; g <= G; g++) {
      const xv = xa + ((xb - xa) * g) / G;
      const f = solve(xv, pR, smooth);
      if (f && (!bf || f.ssr < bf.ssr)) { bf = f; bx0 = xv; }
    }
    let lo = Math.max(xa, bx0 - (xb - xa) / G), hi = Math.min(xb, bx0 + (xb - xa) / G);
    // Golden section with one new trial per step (the other is kept), down to 1e-6 of the span (about 1e-5 point
    // of Ag on a 5 % span: far below any record's resolution; 22 trials where 60 were spent before).
    const gr = (Math.sqrt(5) - 1) / 2, tolX = 1e-6 * (xb - xa);
    let x1 = hi - gr * (hi - lo), x2 = lo + gr * (hi - lo);
    let f1 = solve(x1, pR, smooth), f2 = solve(x2, pR, smooth);
    for (let k = 0; k < 60 && hi - lo > tolX && f1 && f2; k++) {
      if (f1.ssr < f2.ssr) { hi = x2; x2 = x1; f2 = f1; x1 = hi - gr * (hi - lo); f1 = solve(x1, pR, smooth); }
      else { lo = x1; x1 = x2; f1 = f2; x2 = lo + gr * (hi - lo); f2 = solve(x2, pR, smooth); }
    }
    const xm = 0.5 * (lo + hi);
    const fm = solve(xm, pR, smooth);
    if (fm && bf && fm.ssr <= bf.ssr) { bf = fm; bx0 = xm; }
    return { x: bx0, f: bf };
  };
  // Ag from the models with a cubic on each side (below); Rm from the model without the necking side's cubic term,
  // whose maximum has the smaller variance (the top is flat: Rm hardly depends on where the vertex sits, and one
  // parameter fewer halves the scatter of Rm on noisy coarse records, measured on the property test).
  // Two top shapes: kinked (each side its own curvature at the vertex, as where necking sets in abruptly) and smooth
  // (one curvature for both sides: the second derivative continuous at the vertex, as where necking starts
  // gradually). Ag is their Akaike-weighted mean (multimodel inference; Burnham & Anderson, *Model Selection and
  // Multimodel Inference*, 2nd ed., §4.2, from memory): AIC = ssr/s² + 2k, k = 5 and 4 linear parameters, s² the
  // larger of the record's noise and the kinked fit's residual variance; weight ∝ exp(−ΔAIC/2). Measured on 240 +
  // 200 + 200 invented records (property test, hold-outs A and B): Ag off by more than 0.4 point on 49/82/73 with
  // the kinked shape alone, 71/56/68 choosing the lower AIC, 51/52/67 with the weighted mean.
  const kinked = vertex(3);
  const smoothTop = vertex(3, true);
  let bestX = kinked.x;
  const bestF = kinked.f;
  const s2sel = kinked.f ? Math.max(noise * noise, kinked.f.ssr / Math.max(1, nb - 6)) : 0;
  if (smoothTop.f && kinked.f && s2sel > 0) {
    const dK = kinked.f.ssr / s2sel + 10, dS = smoothTop.f.ssr / s2sel + 8, m0 = Math.min(dK, dS);
    const wK = Math.exp(-(dK - m0) / 2), wS = Math.exp(-(dS - m0) / 2);
    const x = (wK * kinked.x + wS * smoothTop.x) / (wK + wS);
    if (Number.isFinite(x)) bestX = x;
  }
  const rmVertex = vertex(0), rmFit = rmVertex.f;
  let best = from + j;
  if (!bestF) return { stress: maTop, strain: strain[best]!, index: best, points: i1 - i0, span: [xa, xb], flat: false, strainInterval95: [xa, xb], strainInterval999: [xa, xb] };
  // Profile interval of the vertex: scan xv over the span (G2 steps), keep the outermost xv still within the
  // χ²₁(0.95) band of the minimum; an end of the span still inside the band is reported as the span's end.
  // The kinked and the Rm model are scanned and the interval is their union with their vertices, the smooth
  // model's vertex and the vertex of a fourth model whose necking side starts flatter (−a·u² + b·u⁴): where the
  // necking side's shape is in doubt, so is the vertex (model uncertainty joins the noise; without the d⁴ model,
  // tops that fall like d⁴ after the maximum left the truth just outside the interval on 16 of 200 hold-out
  // records).
  // Correlated residuals (filtered noise, a wavy top) carry less information than as many independent ones: the
  // variance scale is multiplied by (1 + ρ)/(1 − ρ), ρ the lag-1 autocorrelation of the weighted bin residuals
  // (AR(1) variance inflation of a mean; Box, Jenkins & Reinsel, *Time Series Analysis*, §2.1, from memory),
  // ρ clamped to [0, 0.9].
  const residualInflation = (xv: number, f: { Rm: number; aL: number; bL: number; aR: number; bR: number; pR: number }) => {
    let num = 0, den = 0, prev = 0;
    const R = new Float64Array(nb);
    for (let b = 0; b < nb; b++) {
      const u = (bx[b]! - xv) / h, u2 = u * u;
      const r = by[b]! - (f.Rm - (u < 0 ? f.aL * u2 - f.bL * u2 * u : f.aR * u2 - f.bR * u ** f.pR));
      const wr = Math.sqrt(bw[b]!) * r;
      R[b] = wr;
      den += wr * wr;
      if (b > 0) num += wr * prev;
      prev = wr;
    }
    const rho = den > 0 ? Math.min(0.9, Math.max(0, num / den)) : 0;
    let fac = (1 + rho) / (1 - rho);
    // A slow disturbance (mains hum aliased to a period of a few hundred samples, a drift) is correlated far beyond
    // lag 1 and bends the top's samples as a whole: the lag-1 factor misses it. The long-run variance by batch means
    // (the residuals cut into 8 and 16 consecutive batches of at least 8 bins; b·Var(batch mean) over the residual
    // variance, 1 for independent residuals; Law & Kelton, *Simulation Modeling and Analysis*, §9.5.3, from memory)
    // is taken where larger, capped at 25. Hold-out C (hum of 0.2–0.3 % of Rm on 4 of its noisy Ag misses, whose
    // intervals were too narrow and refused the laws): Ag off by more than 0.4 point 13 → 11, outside the interval 4 → 1;
    // hold-out B 10 → 9 and 2 → 1; the property test and hold-out A unchanged; mean half-width +1–2 %.
    if (den > 0) {
      const v0 = den / nb;
      for (const K of [8, 16]) {
        const bsz = Math.floor(nb / K);
        if (bsz < 8) continue;
        let sm = 0, ss = 0;
        for (let k = 0; k < K; k++) { let m = 0; for (let q = k * bsz; q < (k + 1) * bsz; q++) m += R[q]!; m /= bsz; sm += m; ss += m * m; }
        const vm = (ss - (sm * sm) / K) / (K - 1);
        fac = Math.max(fac, Math.min(25, (bsz * vm) / v0));
      }
    }
    return fac;
  };
  let ciLo = bestX, ciHi = bestX, gLo = bestX, gHi = bestX;
  const G2 = 120;
  const scans: [number, boolean, typeof kinked][] = [[3, false, kinked], [0, false, rmVertex]];
  for (const [pR, sm, v] of scans) {
    const ref = v.f;
    if (!ref) continue;
    const s2 = Math.max(noise * noise, ref.ssr / Math.max(1, nb - (pR === 3 ? 6 : 5))) * residualInflation(v.x, ref);
    const limit = ref.ssr + 3.84 * s2, limitG = ref.ssr + LAW_GATE_CHI2 * s2;
    for (let g = 0; g <= G2; g++) {
      const xv = xa + ((xb - xa) * g) / G2;
      const f = solve(xv, pR, sm);
      if (f && f.ssr <= limit) { if (xv < ciLo) ciLo = xv; if (xv > ciHi) ciHi = xv; }
      if (f && f.ssr <= limitG) { if (xv < gLo) gLo = xv; if (xv > gHi) gHi = xv; }
    }
    ciLo = Math.min(ciLo, v.x); ciHi = Math.max(ciHi, v.x);
    gLo = Math.min(gLo, v.x); gHi = Math.max(gHi, v.x);
  }
  const flatter = vertex(4);
  const joins = [flatter, smoothTop];
  // A smooth top whose necking side starts like d⁴ (one curvature both sides, then −b·u⁴ on the necking side, as
  // where the branch's cubic term vanishes) joins too, but only when the data do not reject it against the
  // kinked and the smooth top: its Akaike difference to the better of them at most 4 (its weight at least e⁻² ≈ 0.14
  // of the best's; Burnham & Anderson §2.6, from memory, call such models "considerably less supported" only
  // beyond 4–7). Measured on the three invented generators (npx vitest run test/core/tensile): on hold-out B's
  // noise-free records (necking s = Rm + ½c·d² − q·d⁴) the truth left the interval on 80 of 200 without it and on
  // none with it; noisy hold-out B 14 → 12; joined unconditionally it warned `uncertainAg` on 104 instead of 37
  // noise-free property-test records whose Ag was right to 0.02 point.
  if (kinked.f && s2sel > 0) {
    const s4 = vertex(4, true);
    if (s4.f) {
      const aK = kinked.f.ssr / s2sel + 10, aS = smoothTop.f ? smoothTop.f.ssr / s2sel + 8 : Infinity;
      if (s4.f.ssr / s2sel + 8 - Math.min(aK, aS) <= 4) joins.push(s4);
    }
  }
  for (const v of joins) if (v.f) { ciLo = Math.min(ciLo, v.x); ciHi = Math.max(ciHi, v.x); gLo = Math.min(gLo, v.x); gHi = Math.max(gHi, v.x); }
  // Widen by one grid step on each side that the scan left unresolved.
  ciLo = Math.max(xa, ciLo - (xb - xa) / G2); ciHi = Math.min(xb, ciHi + (xb - xa) / G2);
  gLo = Math.max(xa, gLo - (xb - xa) / G2); gHi = Math.min(xb, gHi + (xb - xa) / G2);
  // Flat top: neither side of the model falls by more than the fit's noise over the span.
  const uA = (xa - kinked.x) / h, uB = (xb - kinked.x) / h;
  const fallL = bestF.aL * uA * uA - bestF.bL * uA * uA * uA, fallR = bestF.aR * uB * uB - bestF.bR * uB * uB * uB;
  const tolFit = (4 * noise) / Math.sqrt(i1 - i0);
  const flat = !(fallL > tolFit) && !(fallR > tolFit);
  const xAg = flat ? 0.5 * (xa + xb) : bestX;
  const topStress = rmFit ? rmFit.Rm : bestF.Rm;
  // Nearest sample (strain rises through the top; scan the span).
  best = nearestSample(strain, i0, i1, xAg);
  // A stress column in steps of q (stressStep > 0; read between its steps where it rises or falls, analyzeRecord):
  // the top's own cell is all the record knows of the top — the curve stays below the cell's lower edge outside the
  // samples that read it, and may peak anywhere among them. Both intervals hold that strain range (from the sample
  // before the first reading within q of the highest to the sample after the last; one step down takes in a noise
  // flicker to the cell above). Profile intervals on the treads' residuals, which are not noise, had held Ag to
  // ±0.2 point on invented records whose truth lay 2–9 points away.
  if (stressStep > 0) {
    const [c0, c1] = topCell(strain, stress, from, to, stressStep);
    ciLo = Math.min(ciLo, c0); ciHi = Math.max(ciHi, c1); gLo = Math.min(gLo, c0); gHi = Math.max(gHi, c1);
  }
  return { stress: topStress, strain: xAg, index: best, points: i1 - i0, span: [xa, xb], flat, strainInterval95: [Math.min(ciLo, xAg), Math.max(ciHi, xAg)], strainInterval999: [Math.min(gLo, xAg), Math.max(gHi, xAg)] };
}

/**
 * The strain range of a stepped stress column's top cell over [from, to): from the sample before the first reading
 * within `step` of the highest to the sample after the last one.
 */
function topCell(strain: ArrayLike<number>, stress: ArrayLike<number>, from: number, to: number, step: number): [number, number] {
  let top = -Infinity;
  for (let i = from; i < to; i++) if (stress[i]! > top) top = stress[i]!;
  let a = -1, b = -1;
  for (let i = from; i < to; i++) if (stress[i]! >= top - step) { if (a < 0) a = i; b = i; }
  const x0 = strain[Math.max(from, a - 1)]!, x1 = strain[Math.min(to - 1, b + 1)]!;
  return [Math.min(x0, x1), Math.max(x0, x1)];
}

/** Samples [i0, i1) of a column: a view where the column is a typed array (no copy), else a copy. */
function columnSpan(a: ArrayLike<number>, i0: number, i1: number): ArrayLike<number> {
  if (a instanceof Float64Array) return a.subarray(i0, i1);
  const out = new Float64Array(i1 - i0);
  for (let k = 0; k < out.length; k++) out[k] = a[i0 + k]!;
  return out;
}

/** Index in [i0, i1) of the sample whose strain is nearest x (the first of equals). */
function nearestSample(strain: ArrayLike<number>, i0: number, i1: number, x: number): number {
  // From the first sample's distance, not from Infinity: that start made the engine box every new nearest distance
  // (the same pattern as finiteArgMax's top). NaN distances never win, as before.
  let best = i0, bd = Math.abs(strain[i0]! - x);
  if (!(bd === bd)) bd = Infinity;
  for (let i = i0 + 1; i < i1; i++) { const dd = Math.abs(strain[i]! - x); if (dd < bd) { bd = dd; best = i; } }
  return best;
}

/** Binomial coefficients C(k, j), k ≤ 8, row-major (9 × 9). */
const BINOM = (() => {
  const c = new Float64Array(81);
  for (let k = 0; k <= 8; k++) { c[k * 9] = 1; for (let j = 1; j <= k; j++) c[k * 9 + j] = c[(k - 1) * 9 + j - 1]! + (j < k ? c[(k - 1) * 9 + j]! : 0); }
  return c;
})();

/**
 * Per-side power sums of the top's bins about any vertex position: Σw·uᵏ (k ≤ 8) and Σw·(y − y0)·uᵏ (k ≤ 4) over
 * the bins left of the vertex (x < xv) and right of it, u = (x − xv)/h, y0 the bins' weighted mean stress. Prefix
 * sums of the moments about the span's middle c, t = (x − c)/h (|t| ≤ ½), are kept once; about v = (xv − c)/h they
 * follow from the binomial expansion Σw(t − v)ᵏ = Σⱼ C(k, j)(−v)^(k−j)·Σw·tʲ, in O(log bins) per position. The
 * vertex searches and the interval's scans ask for about 700 positions: a pass over the bins for each took 90–140 ms
 * of a fresh process on a 1,000,000-row record (their first calls run unoptimised), the whole top model now 35–55 ms
 * (bench/RESULTS.md, sixth session). Rounding: |t|, |v| ≤ ½, so the expansion's absolute error is about 1e-16 of the
 * total weight — too much for a side whose bins all lie close to the vertex (its high moments are tiny), so a side
 * reaching less than a quarter of the span is summed bin by bin: every sum then agrees with a per-bin pass to about
 * 1e-11, and Ag with the per-bin top model to 2e-4 point at most (the property test, both hold-outs and the inflected
 * generator, with and without noise; no warning changes).
 */
class TopSums {
  /** Total Σw·(y − y0)². */
  readonly tt: number;
  /** Weighted mean stress of the bins, MPa: the sums are of y − y0. */
  readonly y0: number;
  private readonly xs: Float64Array;
  private readonly ts: Float64Array;
  private readonly ws: Float64Array;
  private readonly wys: Float64Array;
  private readonly P: Float64Array;
  private readonly Q: Float64Array;
  private readonly n: number;
  private readonly nv = new Float64Array(9);
  private readonly S = new Float64Array(9);
  private readonly T = new Float64Array(5);
  constructor(bx: Float64Array, by: Float64Array, bw: Float64Array, private readonly c: number, private readonly h: number) {
    const n = bx.length;
    this.n = n;
    // Bins by strain (block means of consecutive samples; sorted unless the strain signal itself wanders back).
    const order = new Uint32Array(n);
    let sorted = true;
    for (let b = 0; b < n; b++) { order[b] = b; if (b > 0 && bx[b]! < bx[b - 1]!) sorted = false; }
    if (!sorted) order.sort((p, q) => bx[p]! - bx[q]! || p - q);
    const xs = new Float64Array(n), P = new Float64Array((n + 1) * 9), Q = new Float64Array((n + 1) * 5);
    const ts = new Float64Array(n), ws = new Float64Array(n), wys = new Float64Array(n);
    // Stresses about their weighted mean y0 (the fit's level is y0 + the fitted constant): the residual sum
    // tt − θ·V then cancels far less than with Σw·y² of stresses some hundred MPa high.
    let sw = 0, swy = 0;
    for (let b = 0; b < n; b++) { sw += bw[b]!; swy += bw[b]! * by[b]!; }
    const y0 = sw > 0 ? swy / sw : 0;
    this.y0 = y0;
    let tt = 0;
    for (let i = 0; i < n; i++) {
      const b = order[i]!, t = (bx[b]! - c) / h, w = bw[b]!, dy = by[b]! - y0, wy = w * dy;
      xs[i] = bx[b]!; ts[i] = t; ws[i] = w; wys[i] = wy;
      tt += wy * dy;
      let p = w;
      for (let k = 0; k < 9; k++) { P[(i + 1) * 9 + k] = P[i * 9 + k]! + p; p *= t; }
      p = wy;
      for (let k = 0; k < 5; k++) { Q[(i + 1) * 5 + k] = Q[i * 5 + k]! + p; p *= t; }
    }
    this.xs = xs; this.P = P; this.Q = Q; this.tt = tt; this.ts = ts; this.ws = ws; this.wys = wys;
  }
  /** Fills WL, YL (left of xv) and WR, YR (right) with the sums about xv; returns the number of bins left of xv. */
  at(xv: number, WL: Float64Array, YL: Float64Array, WR: Float64Array, YR: Float64Array): number {
    const { xs, P, Q, n, nv, S, T } = this;
    let lo = 0, hi = n;
    while (lo < hi) { const mid = (lo + hi) >> 1; if (xs[mid]! < xv) lo = mid + 1; else hi = mid; }
    const s = lo, v = (xv - this.c) / this.h;
    nv[0] = 1;
    for (let k = 1; k < 9; k++) nv[k] = nv[k - 1]! * -v;
    for (let side = 0; side < 2; side++) {
      const W = side === 0 ? WL : WR, Y = side === 0 ? YL : YR;
      // A side reaching less than a quarter of the span from the vertex is summed bin by bin: its high moments
      // are too small for the expansion (whose rounding is about 1e-16 of the total weight) to carry them.
      const reach = side === 0 ? (s > 0 ? v - this.ts[0]! : 0) : (s < n ? this.ts[n - 1]! - v : 0);
      if (reach < DIRECT_REACH) { this.direct(side === 0 ? 0 : s, side === 0 ? s : n, v, W, Y); continue; }
      for (let k = 0; k < 9; k++) S[k] = side === 0 ? P[s * 9 + k]! : P[n * 9 + k]! - P[s * 9 + k]!;
      for (let k = 0; k < 5; k++) T[k] = side === 0 ? Q[s * 5 + k]! : Q[n * 5 + k]! - Q[s * 5 + k]!;
      for (let k = 0; k < 9; k++) {
        let acc = 0;
        for (let j = 0; j <= k; j++) acc += BINOM[k * 9 + j]! * nv[k - j]! * S[j]!;
        W[k] = acc;
      }
      for (let k = 0; k < 5; k++) {
        let acc = 0;
        for (let j = 0; j <= k; j++) acc += BINOM[k * 9 + j]! * nv[k - j]! * T[j]!;
        Y[k] = acc;
      }
    }
    return s;
  }
  /** Sums over the sorted bins [i0, i1) directly, u = t − v. */
  private direct(i0: number, i1: number, v: number, W: Float64Array, Y: Float64Array): void {
    W.fill(0); Y.fill(0);
    const { ts, ws, wys } = this;
    for (let i = i0; i < i1; i++) {
      const u = ts[i]! - v;
      let p = ws[i]!;
      for (let k = 0; k < 9; k++) { W[k]! += p; p *= u; }
      p = wys[i]!;
      for (let k = 0; k < 5; k++) { Y[k]! += p; p *= u; }
    }
  }
}

/** A side of the top reaching less than this fraction of the span from the vertex is summed directly (TopSums). */
const DIRECT_REACH = 0.25;
