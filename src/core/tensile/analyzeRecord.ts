import { InputError } from '../errors.js';
import { fitAllLaws } from '../fit/fitAllLaws.js';
import type { LawName } from '../flow/types.js';
import { fitModulusDecay, findCycles } from './cycles.js';
import { elasticModulus } from './elasticModulus.js';
import { nValueFit } from './nValue.js';
import { proofStrength, totalExtensionStrength } from './proofStrength.js';
import type { TensileAnalysis, TensileData, TensileWarning } from './types.js';
import { yieldPoint } from './yieldPoint.js';

export interface AnalyzeOptions {
  /** Offset of the proof strength, % (default 0.2 → Rp0.2). */
  proofOffsetPct?: number;
  /** n-value range in engineering strain (fraction), e.g. [0.1, 0.2]; default: end of yield effects to maximum force. */
  nRange?: [number, number];
  /** Fit the hardening laws (default true). */
  fit?: boolean;
  laws?: readonly LawName[];
  /** Strains a route reaches, checked for disagreement between laws. */
  checkStrains?: readonly number[];
  disagreementPct?: number;
  /** Young's modulus to use instead of the fitted one (MPa). */
  elasticModulus?: number;
}

/** Defaults, stated once. */
export const ANALYZE_DEFAULTS = {
  proofOffsetPct: 0.2,
  /** Lower end of the flow curve for continuous yielding: true plastic strain at the 0.2 % offset. */
  flowCurveFrom: 0.002,
  /** A fall of stress by more than this fraction between two samples after Rm marks fracture. */
  fractureDrop: 0.5,
  /** Or the stress falling below this fraction of Rm. */
  fractureFloor: 0.02,
} as const;

/**
 * Standard properties of one tensile record (ISO 6892-1 / ASTM E8 definitions, method beside each
 * field in {@link TensileAnalysis}) and, unless `fit: false`, every hardening law fitted to the true
 * plastic flow curve with statistics and an extrapolation spread.
 *
 * Conversions (Dowling, *Mechanical Behavior of Materials*, §4.5, valid to maximum force):
 * σ = s·(1 + e), ε = ln(1 + e), εp = ε − σ/E. Ag = e(Fm) − Rm/E, Agt = e(Fm), A = e_f − s_f/E
 * (ISO 6892-1 §3.6.4–3.6.6 read from the extensometer record), all toe-compensated.
 * Units: strain fraction, stress MPa in; MPa and % out. Valid: a record with an elastic rise and a
 * maximum of force, finite numbers.
 * @throws InputError naming the field and index for non-finite values or too few points.
 * @example analyzeRecord({ strain, stress }).proofStrength // Rp0.2 in MPa
 */
export function analyzeRecord(data: TensileData, opts: AnalyzeOptions = {}): TensileAnalysis {
  const { strain, stress } = data;
  const N = strain.length;
  if (stress.length !== N) throw new InputError('stress', stress.length, `as many values as strain (${N})`);
  if (N < 10) throw new InputError('points', N, 'at least 10 points in a tensile record');
  for (let i = 0; i < N; i++) {
    if (!Number.isFinite(strain[i]!)) throw new InputError(`strain[${i}]`, strain[i], 'a finite number');
    if (!Number.isFinite(stress[i]!)) throw new InputError(`stress[${i}]`, stress[i], 'a finite number');
  }
  const warnings: TensileWarning[] = [];
  let iMax = 0;
  for (let i = 1; i < N; i++) if (stress[i]! > stress[iMax]!) iMax = i;
  const Rm = stress[iMax]!;
  if (!(Rm > 0)) throw new InputError('stress', Rm, 'a record whose highest stress is above 0 MPa');
  const el = elasticModulus(strain, stress, Rm);
  const E = opts.elasticModulus ?? el.modulus;
  const toe = opts.elasticModulus === undefined ? el.toeStrain : el.toeStrain * (el.modulus / E);
  if (el.window.points < 8) warnings.push({ code: 'fewElasticPoints', message: `only ${el.window.points} points in the elastic window; E is uncertain (±${((el.window.standardError / el.modulus) * 100).toFixed(1)} % standard error)` });

  const offPct = opts.proofOffsetPct ?? ANALYZE_DEFAULTS.proofOffsetPct;
  if (!(offPct > 0 && offPct <= 5)) throw new InputError('proofOffsetPct', offPct, 'a number in (0, 5] %');
  const rp = (pct: number) => proofStrength(strain, stress, E, toe, pct / 100, el.window.fromIndex, N);
  const proof = rp(offPct);
  if (!proof) warnings.push({ code: 'noProofPoint', message: `the curve never meets the ${offPct} % offset line; no proof strength` });
  const proofStrengths = [0.2, 0.5, 1].map((p) => ({ offsetPct: p, stress: rp(p)?.stress ?? null }));
  const rt = totalExtensionStrength(strain, stress, toe, 0.005, N);

  const yp = yieldPoint(strain, stress, E, toe, el.window.fromIndex, iMax, el.noise);
  const eM = strain[iMax]! - toe;
  const Ag = (eM - Rm / E) * 100;
  const Agt = eM * 100;

  // Fracture: first sudden fall after Rm, else the end of the record.
  let fi = N - 1;
  let detected = false;
  for (let i = iMax; i < N - 1; i++) {
    if (stress[i + 1]! < (1 - ANALYZE_DEFAULTS.fractureDrop) * stress[i]! || stress[i + 1]! < ANALYZE_DEFAULTS.fractureFloor * Rm) {
      fi = i;
      detected = true;
      break;
    }
  }
  const necked = !detected && stress[N - 1]! < 0.9 * Rm;
  if (!detected && iMax >= N - Math.max(2, Math.ceil(0.01 * N))) {
    warnings.push({ code: 'maxAtEnd', message: 'the highest stress is at the end of the record: the test stopped before maximum force, so Rm, Ag and A are lower bounds' });
  }
  else if (!detected && !necked) warnings.push({ code: 'noFractureDrop', message: 'no sudden fall of force after Rm and no necking at the end: the last point is taken as fracture (A assumes the record ends at fracture)' });
  const A = (strain[fi]! - toe - stress[fi]! / E) * 100;

  // True curve to maximum force.
  const tStrain: number[] = [], tStress: number[] = [], tPlastic: number[] = [];
  for (let i = 0; i <= iMax; i++) {
    const e = strain[i]! - toe;
    if (e <= -1) continue;
    const s = stress[i]! * (1 + e);
    const eps = Math.log1p(e);
    tStrain.push(eps);
    tStress.push(s);
    tPlastic.push(eps - s / E);
  }
  // Flow curve: monotone envelope (cycles left out), from the end of yield effects to Fm.
  const cycles = findCycles(strain, stress, E, toe, el.window.toIndex, el.noise);
  const fromTrue = yp ? Math.log1p(strain[yp.endIndex]! - toe) - (stress[yp.endIndex]! * (1 + strain[yp.endIndex]! - toe)) / E : ANALYZE_DEFAULTS.flowCurveFrom;
  const fStrain: number[] = [], fStress: number[] = [];
  let runMax = -Infinity;
  for (let i = 0; i <= iMax; i++) {
    const e = strain[i]! - toe;
    if (e <= runMax) continue;
    runMax = e;
    const s = stress[i]! * (1 + e);
    const ep = Math.log1p(e) - s / E;
    if (ep >= fromTrue && ep > 0 && (!proof || i >= proof.index)) {
      fStrain.push(ep);
      fStress.push(s);
    }
  }

  // n-value (ISO 10275).
  let nFit = null;
  {
    const xs: number[] = [], ys: number[] = [];
    const [a, b] = opts.nRange ?? [-Infinity, Infinity];
    if (opts.nRange && !(a >= 0 && b > a)) throw new InputError('nRange', opts.nRange, 'a pair [from, to] of engineering strains with 0 ≤ from < to');
    for (let i = 0; i < fStrain.length; i++) {
      const eEng = Math.expm1(fStrain[i]! + fStress[i]! / E);
      if (eEng >= a && eEng <= b) { xs.push(fStrain[i]!); ys.push(fStress[i]!); }
    }
    if (xs.length >= 3) nFit = nValueFit(xs, ys);
    else warnings.push({ code: 'nRange', message: `only ${xs.length} points in the n-value range; no n-value` });
  }

  let fits = null;
  if (opts.fit !== false) {
    if (fStrain.length >= 9) {
      fits = fitAllLaws(fStrain, fStress, { ...(opts.laws ? { laws: opts.laws } : {}), ...(opts.checkStrains ? { checkStrains: opts.checkStrains } : {}), ...(opts.disagreementPct !== undefined ? { disagreementPct: opts.disagreementPct } : {}) });
      warnings.push(...fits.warnings);
    } else {
      warnings.push({ code: 'fewFlowPoints', message: `only ${fStrain.length} points on the plastic flow curve up to maximum force; no law fitted` });
    }
  }
  let modulusDecay = null;
  if (cycles.length) {
    const ep = cycles.map((c) => c.permanentStrain);
    const ok = ep.every((v) => v > 0);
    if (ok) modulusDecay = fitModulusDecay(E, ep, cycles.map((c) => c.unloadModulus));
    if (cycles.length < 3) warnings.push({ code: 'cycles', message: `${cycles.length} unload–reload cycle(s); at least 3 are needed to fit the fall of the chord modulus` });
  }

  return {
    elasticModulus: E,
    elasticWindow: el.window,
    toeStrain: toe,
    proofStrength: proof?.stress ?? null,
    proofOffsetPct: offPct,
    proofStrengths,
    totalExtensionStrength: rt,
    upperYield: yp?.upperYield ?? null,
    lowerYield: yp?.lowerYield ?? null,
    yieldPointElongationPct: yp?.elongationPct ?? null,
    tensileStrength: Rm,
    maxForceIndex: iMax,
    uniformElongationPct: Ag,
    uniformTotalElongationPct: Agt,
    totalElongationPct: A,
    fracture: {
      index: fi,
      detected: detected || necked,
      method: detected ? `first fall of stress by more than ${ANALYZE_DEFAULTS.fractureDrop * 100} % between two samples after Rm`
        : necked ? 'last point of a record that ends after necking (force below 90 % of Fm): the machine stopped at fracture' : 'end of the record (no fracture seen)',
    },
    nValue: nFit?.n ?? null,
    K: nFit?.K ?? null,
    nFit,
    trueCurve: { strain: tStrain, stress: tStress, plasticStrain: tPlastic },
    flowCurve: { strain: fStrain, stress: fStress },
    cycles,
    modulusDecay,
    fits,
    warnings,
  };
}
