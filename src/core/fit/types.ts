import type { LawName } from '../flow/types.js';

/** A warning returned with a result (never global state). */
export interface FitWarning {
  code: 'notConverged' | 'atBound' | 'notIdentifiable' | 'lawsDisagree' | 'fewPoints' | 'extrapolated';
  message: string;
}

/** The goodness-of-fit statistics every fit in the core reports (law fits, kinematic fits). */
export interface FitQuality {
  /** Root-mean-square residual sqrt(SSR/N), MPa. */
  rmse: number;
  /** 1 − SSR/SST. */
  r2: number;
  /** Akaike information criterion N·ln(SSR/N) + 2k (lower is better; compare on the same data only). */
  aic: number;
  /** Bayesian information criterion N·ln(SSR/N) + k·ln N. */
  bic: number;
  /** Residuals model − data at each point, MPa. */
  residuals: number[];
  converged: boolean;
  iterations: number;
  points: number;
  warnings: FitWarning[];
}

/** One law fitted to a flow curve (true stress MPa versus true plastic strain). */
export interface LawFit extends FitQuality {
  law: LawName;
  /** Fitted parameters by name, stresses in MPa. */
  params: Record<string, number>;
  /** Standard error of each parameter, s·sqrt(diag((JᵀJ)⁻¹)); null when it is on a bound or not identifiable. */
  standardErrors: Record<string, number | null>;
  /**
   * 95 % confidence interval of each parameter, value ± t(0.975, N − k)·SE, cut at the ends of the parameter's
   * admissible range (basis.intervalsClipped names those); null where the SE is null.
   */
  intervals95: Record<string, [number, number] | null>;
  /** Range of true plastic strain the law was fitted on. */
  strainRange: [number, number];
  /**
   * Standard errors as if every point were an independent observation (s·sqrt(diag((JᵀJ)⁻¹)), what
   * SciPy's curve_fit reports); shown for comparison only: too small for closely sampled records.
   */
  standardErrorsIndependent: Record<string, number | null>;
  /** How the fit and its intervals were computed (see {@link FitBasis}). */
  basis: FitBasis;
}

/** How a law fit was computed: on which points, and how its intervals allow for correlated residuals. */
export interface FitBasis {
  /** Points the solver fitted: all points, or block averages of `blockSize` consecutive points. */
  fittedPoints: number;
  /** 1 when every point was fitted; else the points per block average (REDUCTION_DEFAULTS). */
  blockSize: number;
  /** Lag-1 autocorrelation of the residuals on the full curve. */
  lag1Autocorrelation: number;
  /** Effective number of independent points, n(1 − ρ)/(1 + ρ) (effectivePoints). */
  effectivePoints: number;
  /** Factor by which `standardErrors` exceed `standardErrorsIndependent`: sqrt(n / effectivePoints). */
  inflation: number;
  /**
   * Parameters held at a set value instead of fitted (no standard error): the Swift–Voce blend's α,
   * which one flow curve does not determine (see fitLawGroup); empty for the other laws.
   */
  held: string[];
  /**
   * Parameters whose 95 % interval (value ± t·SE) reached past the law's admissible range (LAW_PARAMETERS, e.g. a
   * saturation stress below 0) and was cut at its end: the linearised interval is not to be read beyond the
   * range a parameter can take. Usually a sign that the data hardly determine that parameter.
   */
  intervalsClipped: string[];
}
