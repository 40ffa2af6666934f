import { InputError } from '../errors.js';
import { makeLaw } from '../flow/makeLaw.js';
import { LAW_NAMES, LAW_TITLES } from '../flow/params.js';
import type { LawName, LawSpec } from '../flow/types.js';
import { blendProjectedStart } from './blendProjection.js';
import { fitLaw, fittedData, lawBounds } from './fitLaw.js';
import { lawData, type LawData } from './lawNormalEquations.js';
import type { FitWarning, LawFit } from './types.js';

/** Defaults of the law comparison, stated once. */
export const FIT_DEFAULTS = {
  /** A law "fits well" when converged and its RMSE is at most this multiple of the best RMSE, ... */
  goodFitRmseFactor: 2,
  /**
   * ... or at most this fraction of the mean flow stress of the data: 1 %, the relative force error a
   * class 1 testing machine may have (ISO 7500-1, class 1: ±1.0 %), so the test itself cannot tell
   * such laws apart. Without it a near-perfect best fit would leave one "good" law and no spread.
   */
  goodFitRelRmse: 0.01,
  /** Warn when laws that fit well differ by more than this many per cent at a checked strain. */
  disagreementPct: 10,
  /** Extrapolation strains as multiples of the top of the fitted strain range. */
  multiples: [2, 5] as readonly number[],
} as const;

export interface ExtrapolationPoint {
  /** True plastic strain. */
  strain: number;
  /** Why this strain is checked: `2× fitted range`, `route`, ... */
  note: string;
  /** Flow stress of each fitted law at this strain, MPa. */
  stress: Partial<Record<LawName, number>>;
  /** (max − min)/min·100 over the laws that fit well, %. */
  spreadPct: number;
}

export interface LawComparison {
  fits: LawFit[];
  /** Law with the lowest AIC among the converged fits. */
  best: LawName | null;
  /** Laws that fit well (see FIT_DEFAULTS.goodFitRmseFactor and goodFitRelRmse). */
  goodLaws: LawName[];
  extrapolation: ExtrapolationPoint[];
  warnings: FitWarning[];
}

export interface FitAllOptions {
  laws?: readonly LawName[];
  /** Extra strains to check, e.g. the largest accumulated strain of a route. */
  checkStrains?: readonly number[];
  disagreementPct?: number;
  /** The same strain and stress already packed by {@link lawData} (analyzeRecord shares its ln ε with the n-value). */
  packed?: LawData;
}

/**
 * Fits every law (or `laws`) to one flow curve and compares them: best by AIC, laws that fit well,
 * each law's flow stress at 2× and 5× the top of the fitted strain range and at the strains a route
 * reaches, and a `lawsDisagree` warning where the well-fitting laws differ by more than
 * `disagreementPct` (default 10 %, FIT_DEFAULTS). The spread is max/min − 1 over those laws.
 * Units: strain true plastic, stress true MPa. See {@link fitLaw} for the statistics.
 * @example fitAllLaws(eps, sigma).extrapolation[1].spreadPct // e.g. 35 (laws part ways at 5× εu)
 */
export function fitAllLaws(strain: ArrayLike<number>, stress: ArrayLike<number>, opts: FitAllOptions = {}): LawComparison {
  const laws = opts.laws ?? LAW_NAMES;
  const packed = opts.packed && opts.packed.x.length === strain.length ? opts.packed : lawData(strain, stress); // ln ε once for every law
  return compareLawFits(fitLawGroup(laws, strain, stress, packed), stress, opts.packed === packed ? opts : { ...opts, packed });
}

/**
 * The fits of {@link fitAllLaws} without the comparison: each of `laws` fitted by {@link fitLaw} to the
 * packed curve, in the order fitAllLaws uses (the Swift–Voce blend last, with α held at BLEND_ALPHA and the
 * other six started from the Swift and Voce fits, or from Swift alone (α = 1, free) when that start ends lower;
 * Hockett–Sherby, when not converged, again from its Ludwik limit, {@link hockettSherbyNearLudwik}). A law's fit depends only on the data
 * and its start, so groups of laws may be fitted apart (the runner fits two groups on two threads)
 * and give the same fits. Units as fitAllLaws.
 * @example fitLawGroup(['hollomon'], eps, sigma, lawData(eps, sigma)).get('hollomon')!.params.n
 */
export function fitLawGroup(laws: readonly LawName[], strain: ArrayLike<number>, stress: ArrayLike<number>, packed: LawData, prior?: ReadonlyMap<LawName, LawFit>): Map<LawName, LawFit> {
  // `prior`: fits already made (e.g. Voce on the other thread), used as the blend's start like fits made here.
  const byLaw = new Map<LawName, LawFit>(prior ?? []);
  const fit = (law: LawName, o: { start?: Record<string, number>; hold?: Record<string, number> } = {}) => fitLaw(law, strain, stress, { ...o, packed });
  const order = [...laws].sort((a, b) => (a === 'swiftVoce' ? 1 : 0) - (b === 'swiftVoce' ? 1 : 0));
  for (const law of order) {
    let start: Record<string, number> | undefined;
    let hold: Record<string, number> | undefined;
    if (law === 'swiftVoce') {
      // α is not determined by one curve: any α gives the same curve with αK, (1−α)σ0 and (1−α)Q fixed. Fitted
      // freely it drifted to 1, where the Voce part loses its pull and the fit stuck at the Swift law (6 of the 10
      // open 42CrMoS4 records, RMSE up to 1.7× SciPy's from the same start); held at 0.5 the other six are fitted.
      const s = byLaw.get('swift') ?? fit('swift');
      const v = byLaw.get('voce') ?? fit('voce');
      start = { ...s.params, ...v.params, alpha: BLEND_ALPHA };
      hold = { alpha: BLEND_ALPHA };
    }
    let f = fit(law, { ...(start ? { start } : {}), ...(hold ? { hold } : {}) });
    if (law === 'hockettSherby' && !f.converged) {
      // Where the data want σsat → ∞ (a → 0), Hockett–Sherby tends to Ludwik's σ0 + K·εᵖ with K = (σsat − σ0)·a, and
      // the fit crawls towards the bound (46NTAT and three more open 42CrMoS4 records: 500 steps, not converged).
      // Start it again at that limit (σsat on its bound), from the Ludwik fit, and keep the better of the two.
      const g = fit(law, { start: hockettSherbyNearLudwik(byLaw.get('ludwik') ?? fit('ludwik')) });
      if (g.rmse < f.rmse || (g.converged && g.rmse <= f.rmse * (1 + 1e-9))) f = g;
    }
    if (law === 'swiftVoce' && !f.converged && start) {
      // Crawling along a curved valley (TS275_0003: 500 steps, 2.5 % above SciPy's RMSE): find (ε0, n, b) with the
      // linear parameters solved exactly (variable projection), polish that with the blend's own fit, keep the better.
      const p = blendProjectedStart(fittedData(packed), { eps0: start.eps0!, n: start.n!, b: start.b! }, BLEND_ALPHA);
      const g = p && fit(law, { start: p, hold });
      if (g && (g.rmse < f.rmse || (g.converged && g.rmse <= f.rmse * (1 + 1e-9)))) f = g;
    }
    if (law === 'swiftVoce') {
      // A blend can always do at least as well as its better part: keep the better of the two starts.
      const s = byLaw.get('swift');
      if (s && s.rmse < f.rmse * (1 - 1e-9)) {
        const g = fit(law, { start: { ...s.params, alpha: 1, sigma0: 0, Q: 0, b: 1 } });
        if (g.rmse < f.rmse) { byLaw.set(law, g); continue; }
      }
    }
    byLaw.set(law, f);
  }
  return byLaw;
}

/** The Swift–Voce blend's α while its other six parameters are fitted (fitLawGroup; α is not identified by one curve). */
export const BLEND_ALPHA = 0.5;

/**
 * A Hockett–Sherby start at its Ludwik limit: σ = σsat − (σsat − σ0)·exp(−a·εᵖ) → σ0 + (σsat − σ0)·a·εᵖ as
 * σsat → ∞, a → 0 (first order in a·εᵖ). From a Ludwik fit σ0 + K·εⁿ: σ0, p = n, σsat on its upper bound
 * (LAW_PARAMETERS, 10⁵ MPa) and a = K/(σsat − σ0). It falls short of Ludwik by the second-order term
 * h²/(2(σsat − σ0)) for hardening h = K·εⁿ (exp(−x) = 1 − x + x²/2 − …): 0.8 MPa for h = 400 MPa, which the
 * fit then removes. Units MPa, strain true plastic. Valid: a Ludwik fit.
 * @example hockettSherbyNearLudwik(fitLaw('ludwik', eps, sigma)) // { sigmaSat: 1e5, sigma0, a, p }
 */
export function hockettSherbyNearLudwik(ludwik: LawFit): Record<string, number> {
  const { sigma0 = 0, K = 0, n = 0.5 } = ludwik.params;
  const { upper } = lawBounds('hockettSherby');
  const sigmaSat = upper[0]!;
  return { sigmaSat, sigma0, a: Math.max(K / (sigmaSat - sigma0), 1e-12), p: Math.min(Math.max(n, 1e-6), 2) };
}

/**
 * The comparison part of {@link fitAllLaws}: fits in the order of `opts.laws` (default LAW_NAMES)
 * from `byLaw`, best by AIC, laws that fit well, extrapolation spreads and `lawsDisagree` warnings.
 * `stress` is the fitted curve's stress (its mean sets the 1 % rule). Units as fitAllLaws.
 * @example compareLawFits(fitLawGroup(LAW_NAMES, eps, sigma, lawData(eps, sigma)), sigma).best
 */
export function compareLawFits(byLaw: ReadonlyMap<LawName, LawFit>, stress: ArrayLike<number>, opts: FitAllOptions = {}): LawComparison {
  const laws = opts.laws ?? LAW_NAMES;
  const fits: LawFit[] = [];
  const warnings: FitWarning[] = [];
  for (const law of laws) {
    const f = byLaw.get(law);
    if (!f) throw new InputError('laws', law, `a law fitted in the group (${[...byLaw.keys()].join(', ')})`);
    fits.push(f);
    warnings.push(...f.warnings);
  }
  const conv = fits.filter((f) => f.converged);
  const best = conv.length ? conv.reduce((a, b) => (b.aic < a.aic ? b : a)).law : null;
  const bestRmse = conv.length ? Math.min(...conv.map((f) => f.rmse)) : Infinity;
  // The mean flow stress: from the block moments of the fitted curve when they were made (the same divisions and
  // additions in the same order as meanOf, in a pass the moments make anyway), else a pass of its own.
  const mom = opts.packed?.moments;
  const meanStress = mom && opts.packed!.y === stress && mom.points === stress.length ? mom.meanY : meanOf(stress);
  const goodRmse = Math.max(FIT_DEFAULTS.goodFitRmseFactor * bestRmse, FIT_DEFAULTS.goodFitRelRmse * Math.abs(meanStress)) + 1e-12;
  const good = conv.filter((f) => f.rmse <= goodRmse);
  const top = fits.length ? Math.max(...fits.map((f) => f.strainRange[1])) : 0;
  const checks: { strain: number; note: string }[] = FIT_DEFAULTS.multiples.map((m) => ({ strain: m * top, note: `${m}× the top of the fitted range` }));
  for (const s of opts.checkStrains ?? []) if (Number.isFinite(s) && s > 0) checks.push({ strain: s, note: 'strain the route reaches' });
  const limit = opts.disagreementPct ?? FIT_DEFAULTS.disagreementPct;
  const extrapolation: ExtrapolationPoint[] = [];
  for (const c of checks) {
    const stressAt: Partial<Record<LawName, number>> = {};
    for (const f of fits) {
      const v = makeLaw({ law: f.law, ...f.params } as LawSpec).stress(c.strain);
      if (Number.isFinite(v)) stressAt[f.law] = v;
    }
    const vals = good.map((f) => stressAt[f.law]).filter((v): v is number => v !== undefined && v > 0);
    const spread = vals.length >= 2 ? (Math.max(...vals) / Math.min(...vals) - 1) * 100 : 0;
    extrapolation.push({ strain: c.strain, note: c.note, stress: stressAt, spreadPct: spread });
    if (spread > limit) {
      const hiLaw = good.reduce((a, b) => ((stressAt[b.law] ?? 0) > (stressAt[a.law] ?? 0) ? b : a));
      const loLaw = good.reduce((a, b) => ((stressAt[b.law] ?? Infinity) < (stressAt[a.law] ?? Infinity) ? b : a));
      warnings.push({
        code: 'lawsDisagree',
        message: `at true plastic strain ${c.strain.toPrecision(3)} (${c.note}) laws that fit the test equally well differ by ${spread.toFixed(1)} % (> ${limit} %): ` +
          `${LAW_TITLES[hiLaw.law]} ${stressAt[hiLaw.law]!.toFixed(0)} MPa, ${LAW_TITLES[loLaw.law]} ${stressAt[loLaw.law]!.toFixed(0)} MPa; choosing a law there is an engineering decision — test the formed material`,
      });
    }
  }
  return { fits, best, goodLaws: good.map((f) => f.law), extrapolation, warnings };
}

/** Σ yᵢ/n in index order (the comparison's mean flow stress), in a function of its own so the loop is optimised at once. */
function meanOf(y: ArrayLike<number>): number {
  const n = y.length;
  let m = 0;
  for (let i = 0; i < n; i++) m += y[i]! / n;
  return m;
}
