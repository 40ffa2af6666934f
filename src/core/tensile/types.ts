import type { LawName } from '../flow/types.js';
import type { LawTop } from './lawTop.js';
import type { ExtensometerEnd } from './extensometerEnd.js';
import type { StrainSteps } from './strainSteps.js';
import type { LawComparison } from '../fit/fitAllLaws.js';

/** A tensile record as the core takes it: engineering strain (fraction) and engineering stress (MPa), same length. */
export interface TensileData {
  strain: ArrayLike<number>;
  stress: ArrayLike<number>;
}

export interface TensileWarning {
  code: 'noProofPoint' | 'noFractureDrop' | 'maxAtEnd' | 'fewElasticPoints' | 'nRange' | 'fewFlowPoints' | 'notConverged' | 'atBound' | 'notIdentifiable' | 'lawsDisagree' | 'fewPoints' | 'extrapolated' | 'cycles' | 'strainChannelEnds' | 'unloadedBeforeFracture' | 'glitch' | 'secondTest'
    | 'implausibleModulus' | 'uncertainModulus' | 'elasticBandFallback' | 'gradualYield' | 'modulusGiven' | 'machineCompliance' | 'flatTop' | 'uncertainAg' | 'uncertainReH' | 'uncertainRp' | 'rateChange' | 'yieldPlateau' | 'coarseStrain' | 'coarseStress';
  message: string;
}

/** A change of the test rate on the plastic part of a record (findRateChange, rateStep; warning `rateChange`). */
export interface RateChange {
  /** Record index of the first sample at the new rate, and its engineering strain as recorded (fraction). */
  index: number;
  strain: number;
  /** Strain per sample after over before (> 1: faster); with samples uniform in time, the ratio of the rates. */
  ratio: number;
  /** Engineering stress just before the change, MPa. */
  stressBefore: number;
  /** Step of the engineering stress at the change, MPa, and its 95 % half-width; null when it could not be measured. */
  step: number | null;
  stepHalfWidth95: number | null;
  /** True when the step is clear of its 95 % interval. */
  clear: boolean;
  /** Strain-rate sensitivity m = ln(1 + step/stressBefore)/ln(ratio), if the samples are uniform in time; null unless clear. */
  sensitivity: number | null;
  /** The law whose shape carried the flow curve across the change to measure the step; null when not measured. */
  law: LawName | null;
  /** Factor the flow curve after the change was scaled by before the n-value and the laws were fitted; null when used as recorded. */
  flowCurveFactor: number | null;
}

/** How E was found: the least-squares window on the initial loading branch. */
export interface ElasticWindow {
  /** Stress range of the window, MPa. */
  fromStress: number;
  toStress: number;
  fromIndex: number;
  /** Exclusive end index. */
  toIndex: number;
  points: number;
  r2: number;
  /** Standard error of E, MPa: max(record noise, residual scatter)/√Sxx. */
  standardError: number;
  /** 95 % confidence interval of the fitted E (Student t), MPa. */
  interval95: [number, number];
  /** The Rp0.2 estimate the band is tied to (10–40 % of it), MPa. */
  proofEstimate: number;
  /** How the window was chosen, in words. */
  method: string;
}

/**
 * One unload–reload cycle. Basis: the top-level stress and strain fields are **true** stress and
 * **true** (logarithmic) strain, toe-compensated (`basis: 'true'`); `engineering` gives the values a test
 * report compares with (engineering stress s = σ/(1 + e), engineering strain e = exp(ε) − 1).
 */
export interface UnloadCycle {
  /** The basis of the top-level fields: always 'true' (true stress, true strain). */
  basis: 'true';
  /** Index where unloading starts and where the reversal (lowest stress) is. */
  unloadIndex: number;
  reversalIndex: number;
  /** True stress at the start of unloading, MPa. */
  unloadStress: number;
  /** Chord modulus between the start of unloading and the reversal (ASTM E111 chord), MPa. */
  unloadModulus: number;
  /** True plastic strain left after unloading: ε_u − σ_u/E_u. */
  permanentStrain: number;
  /** True elastic strain recovered on unloading σ_u/E_u. */
  recoveredStrain: number;
  /** 0.2 % proof strength of the reload branch, offset parallel to the unloading chord, MPa; null when the reload does not reach it. */
  reloadProofStrength: number | null;
  /** The same cycle on the engineering basis of a test report: stresses MPa, strains fractions. */
  engineering: {
    /** Engineering stress at the start of unloading, MPa. */
    unloadStress: number;
    /** Engineering strain left at zero stress, exp(εp) − 1. */
    permanentStrain: number;
    /** Engineering stress where the reload branch meets the 0.2 % offset line, MPa (null when not reached). */
    reloadProofStrength: number | null;
  };
}

/** Fit of the chord-modulus decay E(εp) = E0 − (E0 − Ea)(1 − exp(−ξ·εp)) to the cycles. */
export interface ModulusDecayFit {
  E0: number;
  Ea: number;
  xi: number;
  standardErrors: { Ea: number | null; xi: number | null };
  rmse: number;
  converged: boolean;
}

export interface NValueResult {
  n: number;
  K: number;
  r2: number;
  /** True plastic strain range used. */
  range: [number, number];
  points: number;
  method: string;
}

/** Everything {@link analyzeRecord} finds. Stresses MPa; percentages of the gauge length. */
export interface TensileAnalysis {
  /** The E used for every property below: the measured one, or the one given (`elasticModulusSource`). */
  elasticModulus: number;
  /** Where E came from: 'measured' (the elastic band) or 'given' (an option such as --modulus). */
  elasticModulusSource: 'measured' | 'given';
  /** The E measured on the elastic band and its 95 % interval, MPa (also when a given E is used). */
  measuredModulus: number;
  measuredModulusInterval95: [number, number];
  /**
   * The machine's and grips' compliance taken out of a strain from the machine's travel (1/MPa: e − s·c; analyzeRecord's
   * `machineTravel` with a given E, {@link removeMachineCompliance}); every strain-based property is read after it.
   * null (or absent) when no compliance was taken out.
   */
  machineCompliance?: number | null;
  /**
   * L0/Lc when the plastic part of a strain from the machine's travel was spread over the parallel length Lc
   * (analyzeRecord's `travelLengths`, {@link spreadOverParallelLength}); null (or absent) otherwise.
   */
  parallelLengthRatio?: number | null;
  /** Noise of the stress estimated from the data (second differences, robust scale), MPa. */
  noise: number;
  /**
   * Lag-1 correlation of that noise from sample to sample, read over the whole loaded record ({@link noiseLag1}): 0 for
   * white noise (and for a column read between its steps), up to 0.9 where a filter in the machine makes neighbouring
   * samples alike; the intervals built on a few neighbouring samples (Rp's range) are widened by (1 + ρ)/(1 − ρ) in
   * variance. Optional for analyses made before it was reported.
   */
  noiseLag1?: number;
  /** How Rm and Ag were read: the local parabola around the top (samples, strain span, flat top). */
  forceMaximum: {
    points: number; span: [number, number]; flat: boolean; method: string;
    /**
     * 95 % interval of Ag, % (profile of the top fit over the position of maximum force; see `forceMaximum`), widened
     * to hold the laws' Ag where that is reported and lies outside it.
     */
    uniformElongationInterval95: [number, number];
    /** Ag of the local top model alone, % (the reported Ag where no law applies). */
    topModelUniformElongationPct: number;
    /**
     * Ag from the six hardening laws fitted to the flow curve (lawUniformElongation): each law's own Ag, Akaike
     * weight (from its residuals over the upper part of the flow curve, `upperPart`) and whether it lies inside the
     * top fit's 99.9 % interval (`LAW_GATE_CHI2`), and their weighted mean over those inside (the reported Ag; null
     * when they hold less than half the weight, by the upper part's criteria or the whole curve's); null where the
     * record ends before maximum force or no law was fitted.
     */
    lawUniformElongation: LawTop | null;
  };
  elasticWindow: ElasticWindow;
  /** Toe correction: strain where the elastic line meets zero stress (subtracted from all strains). */
  toeStrain: number;
  /** Rp at the requested offset (default 0.2 %), MPa. */
  proofStrength: number | null;
  /** On a yield plateau: the band of stresses where the offset line can meet the serrations, MPa (see plateauProofStrength); elsewhere, when E is uncertain enough to move Rp by more than ±1 %, Rp over E's 95 % interval; else null. */
  proofStrengthRange: [number, number] | null;
  proofOffsetPct: number;
  /** Rp0.2, Rp0.5, Rp1, MPa (null where not reached). */
  proofStrengths: { offsetPct: number; stress: number | null }[];
  /** Rt0.5: stress at 0.5 % total extension, MPa. */
  totalExtensionStrength: number | null;
  upperYield: number | null;
  /** Bounds on ReH the record supports (±3 noise sd; on a coarse record, line or part-way down the fall), MPa; null without a yield drop. */
  upperYieldRange: [number, number] | null;
  lowerYield: number | null;
  yieldPointElongationPct: number | null;
  tensileStrength: number;
  maxForceIndex: number;
  /** Ag: plastic extension at maximum force, %. */
  uniformElongationPct: number;
  /** Agt: total extension at maximum force, %. */
  uniformTotalElongationPct: number;
  /** A: plastic elongation after fracture, %. */
  totalElongationPct: number;
  fracture: { index: number; detected: boolean; method: string };
  /**
   * The properties whose value is a lower bound, not a measurement: all four when the test stopped before
   * maximum force (warning `maxAtEnd`); A (and Ag, Agt when maximum force came later) when the strain channel
   * ended before fracture (warning `strainChannelEnds`). Empty when every value is measured.
   */
  lowerBounds: ('tensileStrength' | 'uniformElongationPct' | 'uniformTotalElongationPct' | 'totalElongationPct')[];
  /** Where the strain channel stopped following the specimen while the force went on (extensometer taken off, reset, out of range); null when it followed it to the end. Strain-based properties are read before it. */
  strainChannelEnd: ExtensometerEnd | null;
  /**
   * Where each further test begins in a record that holds several (testStarts; warning `secondTest`): sample indices,
   * ascending. The analysis is of the samples before the first of them. Empty for a record of one test.
   */
  furtherTests: number[];
  /**
   * The steps the strain column is written in, where they matter (strainSteps; warning `coarseStrain`): a coarse
   * channel, one that holds each reading over several samples and then moves by a whole step, whose strain was read
   * between its steps (spreadStrainSteps) before anything else; or one that moves every sample or so in steps whose
   * rounding on the elastic rise (E·q/√12) exceeds half the load's noise, allowed for by the rise's tests. Null
   * otherwise (a fine or continuous channel).
   */
  strainSteps: StrainSteps | null;
  /**
   * The steps the stress column is written in, where they are coarser than the load's noise (strainSteps on the stress;
   * warning `coarseStress`): each reading held over several samples, then a whole step. The stress was read between
   * its steps where it rises or falls steadily (spreadStrainSteps), every noise threshold is at least the rounding's
   * sd (step/√12), and Ag's interval holds the top's step. Null otherwise (`step` in MPa here).
   */
  stressSteps: StrainSteps | null;
  /**
   * A change of the test rate on the plastic part (findRateChange; warning `rateChange`), `index` the record's;
   * `flowCurveFactor` the factor the flow curve after it was scaled by before the n-value and the laws were fitted
   * (the step, clear of the noise, taken out to the first rate), null when it was used as recorded. Null when none.
   */
  rateChange: RateChange | null;
  /**
   * A yield plateau with no upper yield point clear of the noise (yieldPlateau; warning `yieldPlateau`): its level
   * (MPa), its start and end as engineering strain, toe removed (fraction), and as the record's sample indices. The
   * flow curve, the n-value and the laws start at its end; ReH, ReL and Ae stay null. Null when there is none or the
   * drop was reported.
   */
  yieldPlateau: { level: number; startStrain: number; endStrain: number; startIndex: number; endIndex: number } | null;
  /** Rm read from the force alone past the strain channel's end (its top against sample number); null otherwise. `index` is the whole record's. */
  forceTop: { stress: number; index: number; points: number; method: string } | null;
  nValue: number | null;
  K: number | null;
  nFit: NValueResult | null;
  /** True curve to maximum force: true strain, true stress, true plastic strain. */
  trueCurve: { strain: number[]; stress: number[]; plasticStrain: number[] };
  /** The flow curve the laws are fitted to (true plastic strain, true stress), from the end of yield effects to maximum force. */
  flowCurve: { strain: number[]; stress: number[] };
  cycles: UnloadCycle[];
  modulusDecay: ModulusDecayFit | null;
  fits: LawComparison | null;
  warnings: TensileWarning[];
}
