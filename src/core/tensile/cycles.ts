import { fitStatistics } from '../fit/fitStatistics.js';
import { levenbergMarquardt } from '../fit/levenbergMarquardt.js';
import type { ModulusDecayFit, UnloadCycle } from './types.js';

/** A fall of stress counts as an unloading when it is at least this fraction of the stress it starts from. */
export const UNLOAD_MIN_DROP = 0.3;
/** An unloading that is never reloaded counts only when it takes at least this many samples (fracture takes 1–4). */
export const UNLOAD_MIN_SAMPLES = 6;

/**
 * Finds unload–reload cycles: a stress peak followed by a fall of at least UNLOAD_MIN_DROP of the
 * peak stress while the strain also falls (elastic recovery; a fall at rising strain is necking or
 * fracture, not unloading), and that is either reloaded or spread over UNLOAD_MIN_SAMPLES samples or more (a
 * fracture's fall, even with the elastic strain read coming back, takes a few samples and is never reloaded). Everything is computed on true stress σ = s(1+e) and true strain
 * ε = ln(1+e) (toe-compensated), the basis of the chord-modulus law. For each cycle: the chord modulus
 * between the start of unloading and the reversal (ASTM E111 chord modulus), the true plastic strain
 * left ε_u − σ_u/E_u, the true elastic strain recovered σ_u/E_u, and the reload 0.2 % proof strength
 * (true stress; offset line through the reversal point, parallel to the unloading chord — the
 * ISO 6892-1 offset construction applied to the reload branch). Each cycle also carries the same values
 * on the engineering basis of a test report (`engineering`: s = σ/exp(ε), e = exp(ε) − 1, Dowling §4.5).
 * Units: engineering strain fraction and stress MPa in; MPa and true strain out.
 */
export function findCycles(engStrain: ArrayLike<number>, engStress: ArrayLike<number>, E: number, toe: number, fromIndex: number, noise: number): UnloadCycle[] {
  const n = engStress.length;
  if (!mayHoldCycle(engStrain, engStress, toe, Math.max(1, fromIndex), n)) return [];
  // Work in true stress and true strain: at 10 % strain the engineering chord would read (1 + e)² ≈ 21 % low.
  // True strain only where a candidate cycle is examined (a few thousand samples, not every one:
  // the full pass of ln(1 + e) was most of this function on a 1,000,000-row record, issue 12 D).
  const stress = new Float64Array(n);
  for (let q = 0; q < n; q++) stress[q] = engStress[q]! * (1 + Math.max(engStrain[q]! - toe, -0.5));
  const ts = (q: number) => Math.log1p(Math.max(engStrain[q]! - toe, -0.5));
  const out: UnloadCycle[] = [];
  const tol = 3 * noise;
  let i = Math.max(1, fromIndex);
  while (i < n - 1) {
    if (!(stress[i]! >= stress[i - 1]! && stress[i + 1]! < stress[i]!)) { i++; continue; }
    let r = i;
    let k = i + 1;
    while (k < n && stress[k]! <= stress[r]! + tol) {
      if (stress[k]! < stress[r]!) r = k;
      k++;
    }
    const drop = stress[i]! - stress[r]!;
    // The fall must also stand far clear of the noise (10 sd): after fracture the load reads about zero, and 30 % of a
    // noise peak there is less than the noise.
    if (!(drop >= Math.max(UNLOAD_MIN_DROP * stress[i]!, 10 * noise)) || !(ts(r) < ts(i) - (0.3 * drop) / E)) { i++; continue; }
    // Unloading starts where the strain turns back: the largest strain between the peak and the reversal.
    let u = i;
    for (let q = i; q <= r; q++) if (ts(q) > ts(u)) u = q;
    if (!(ts(u) > ts(r))) { i = r + 1; continue; }
    // Fracture is no unloading, though the extensometer may read the specimen's elastic strain coming back as the
    // load falls (an invented noisy record counted one "cycle" at fracture on every noisy record of hold-out C):
    // an unloading is reloaded (the stress rises again by half the fall) or, for a last unloading never reloaded,
    // spread over at least 6 samples along the elastic line, as the end of the test is told from fracture
    // (elasticUnloading in analyzeRecord.ts). A fracture's fall takes 1–4 samples and nothing follows it.
    let bottom = u;
    while (bottom < r && stress[bottom]! > stress[r]! + Math.max(tol, 0.1 * drop)) bottom++; // samples at about zero load after fracture are not the fall
    if (bottom - u < UNLOAD_MIN_SAMPLES) {
      let reloaded = false;
      for (let q = r + 1; q < n && !reloaded; q++) reloaded = stress[q]! >= stress[r]! + 0.5 * drop;
      if (!reloaded) { i = r + 1; continue; }
    }
    const Eu = (stress[u]! - stress[r]!) / (ts(u) - ts(r));
    const su = stress[u]!;
    // Reload: from the reversal until the strain passes the start of unloading by 0.5 % or the next unloading.
    let reload: number | null = null;
    let reloadStrain = 0;
    let prev = stress[r]! - Eu * (ts(r) - ts(r) - 0.002);
    let j = r + 1;
    for (; j < n; j++) {
      const g = stress[j]! - (stress[r]! + Eu * (ts(j) - ts(r) - 0.002));
      if (prev > 0 && g <= 0) {
        const t = prev / (prev - g);
        reload = stress[j - 1]! + t * (stress[j]! - stress[j - 1]!);
        reloadStrain = ts(j - 1) + t * (ts(j) - ts(j - 1));
        break;
      }
      prev = g;
      if (stress[j]! < stress[j - 1]! - Math.max(tol, 0.05 * stress[j - 1]!)) break;
    }
    const ep = ts(u) - su / Eu;
    out.push({
      basis: 'true',
      unloadIndex: u,
      reversalIndex: r,
      unloadStress: su,
      unloadModulus: Eu,
      permanentStrain: ts(u) - su / Eu,
      recoveredStrain: su / Eu,
      reloadProofStrength: reload,
      engineering: {
        unloadStress: su / Math.exp(ts(u)),
        permanentStrain: Math.expm1(ep),
        reloadProofStrength: reload === null ? null : reload / Math.exp(reloadStrain),
      },
    });
    // Resume once the reload is back above the unloading stress or past its strain.
    let next = r + 1;
    while (next < n && stress[next]! < su && ts(next) <= ts(u)) next++;
    i = Math.max(next, r + 1);
  }
  return out;
}

/**
 * A necessary condition for {@link findCycles} to find a cycle, in one pass without logarithms: some
 * sample r whose true stress is at most UNLOAD_MIN_DROP below an earlier peak's (σ_r ≤ 0.7·max σ
 * before r) while its strain lies below an earlier strain (a cycle's reversal has ε_r < ε_i − 0.3·drop/E
 * < ε_i; ln(1 + e) is increasing, so the engineering strains compare the same way). A record without
 * such a sample (no unloading: strain never falls back while the stress is 30 % down) has no cycle,
 * and findCycles skips its candidate walk, which on a noisy 1,000,000-row record visited every
 * noise peak of the flat top (bench/RESULTS.md, issue 12 E). A record with one runs the full search,
 * so the cycles found are the same either way.
 */
function mayHoldCycle(engStrain: ArrayLike<number>, engStress: ArrayLike<number>, toe: number, from: number, n: number): boolean {
  // The running maxima start from the first sample (what Math.max-like updates from −Infinity give it), not from
  // −Infinity: such a start made the engine box every new maximum (a heap number a sample; speed follow-up J).
  const q0 = from - 1;
  if (!(q0 < n)) return false;
  let maxE = Math.max(engStrain[q0]! - toe, -0.5);
  let maxS = engStress[q0]! * (1 + maxE);
  if (!(maxS > -Infinity)) maxS = -Infinity; // NaN stays below every sample, as with the −Infinity start
  for (let q = q0 + 1; q < n; q++) {
    const e = Math.max(engStrain[q]! - toe, -0.5);
    const s = engStress[q]! * (1 + e);
    // Slack of 1e-9 on the stress bound: findCycles compares drop ≥ 0.3·σ_i in its own rounding.
    if (e < maxE && s <= 0.7 * maxS + 1e-9 * Math.abs(maxS)) return true;
    if (s > maxS) maxS = s;
    if (e > maxE) maxE = e;
  }
  return false;
}

/**
 * Fits the fall of the unloading chord modulus with plastic strain,
 * E(εp) = E0 − (E0 − Ea)·(1 − exp(−ξ·εp)), E0 fixed at the initial Young's modulus, Ea and ξ by
 * bounded Levenberg–Marquardt (0 < Ea ≤ E0, 0 < ξ ≤ 1e4). The form is the chord-modulus law of
 * Yoshida & Uemori (Int. J. Plasticity 18 (2002) 661–686; cited from memory in CHECKS.md).
 * Units: moduli MPa, εp true plastic strain. @returns null with fewer than 3 cycles.
 * @example decay of 200, 190, 184 GPa at εp 0.02, 0.05, 0.1 → Ea ≈ 180 GPa
 */
export function fitModulusDecay(E0: number, plasticStrain: readonly number[], modulus: readonly number[]): ModulusDecayFit | null {
  if (plasticStrain.length < 3) return null;
  const x = plasticStrain;
  let emin = Infinity;
  for (const m of modulus) emin = Math.min(emin, m);
  const model = (p: Float64Array) => Float64Array.from(x, (e) => E0 - (E0 - p[0]!) * -Math.expm1(-p[1]! * e));
  const start = [Math.min(E0, Math.max(1, emin * 0.98)), 1 / Math.max(1e-6, x.reduce((a, b) => a + b, 0) / x.length)];
  const lower = [1, 1e-9], upper = [E0, 1e4];
  const res = levenbergMarquardt(model, modulus, [Math.min(upper[0]!, start[0]!), Math.min(upper[1]!, start[1]!)], { lower, upper });
  const resid = Array.from(res.predicted, (v, i) => v - modulus[i]!);
  const st = fitStatistics(res.jacobian, resid, modulus, 2, res.atBound, res.params);
  return { E0, Ea: res.params[0]!, xi: res.params[1]!, standardErrors: { Ea: st.standardErrors[0] ?? null, xi: st.standardErrors[1] ?? null }, rmse: st.rmse, converged: res.converged };
}
