import { InputError } from '../errors.js';
import { fitAllLaws, type FitAllOptions, type LawComparison } from '../fit/fitAllLaws.js';
import type { LawName } from '../flow/types.js';
import { fitModulusDecay, findCycles } from './cycles.js';
import { linearFit } from '../fit/linearFit.js';
import { ELASTIC_WINDOW, elasticLineVariance, elasticModulus, lowBandToe } from './elasticModulus.js';
import { EXTENSOMETER_END, extensometerEnd, type ExtensometerEnd } from './extensometerEnd.js';
import { forceMaximum } from './forceMaximum.js';
import { droppedRows, findGlitches, glitchRun, GLITCH } from './glitches.js';
import { noiseLag1, recordNoiseWide } from './recordNoise.js';
import { spreadStrainSteps, strainSteps, STRAIN_STEPS, type StrainSteps } from './strainSteps.js';
import { nValueFit, nValueFromSums } from './nValue.js';
import { lawDataRanged, type LawData } from '../fit/lawNormalEquations.js';
import { LAW_NAMES } from '../flow/params.js';
import { lawUniformElongation } from './lawTop.js';
import { flowColumns } from './flowColumns.js';
import { plateauProofStrength, proofStrength, totalExtensionStrength } from './proofStrength.js';
import type { RateChange, TensileAnalysis, TensileData, TensileWarning, UnloadCycle } from './types.js';
import { yieldPlateau, yieldPoint } from './yieldPoint.js';
import { TEST_START, testStarts } from './testStarts.js';
import { findRateChange, firstAtOrPast, RATE_CHANGE, rateStep } from './rateChange.js';

export interface AnalyzeOptions {
  /** Offset of the proof strength, % (default 0.2 → Rp0.2). */
  proofOffsetPct?: number;
  /** n-value range in engineering strain (fraction), e.g. [0.1, 0.2]; default: end of yield effects to maximum force. */
  nRange?: [number, number];
  /**
   * Report the hardening laws' fits (default true). Ag uses the six laws' fits either way (lawTop.ts), so with
   * `fit: false` they are still made, only not reported.
   */
  fit?: boolean;
  /** The laws to report (default all six); Ag uses all six whatever this says. */
  laws?: readonly LawName[];
  /** Strains a route reaches, checked for disagreement between laws. */
  checkStrains?: readonly number[];
  disagreementPct?: number;
  /** Young's modulus to use instead of the fitted one (MPa). */
  elasticModulus?: number;
  /**
   * The strain is the machine's travel over the gauge length (crosshead, stroke), not an extensometer's: with
   * `elasticModulus` given, the machine's and grips' compliance is taken out first ({@link removeMachineCompliance}).
   * Without a given modulus it changes nothing.
   */
  machineTravel?: boolean;
  /**
   * With `machineTravel` and a given `elasticModulus`: the gauge length L0 the travel was divided by and the
   * specimen's parallel length Lc (mm, Lc ≥ L0). Up to maximum force the plastic part of the travel spreads over Lc,
   * after it into the neck inside L0 ({@link spreadOverParallelLength}); without them Ag and A read high by about
   * Lc/L0 − 1 of Ag.
   */
  travelLengths?: { gaugeLength: number; parallelLength: number };
  /**
   * The law fitter, default {@link fitAllLaws}. Any replacement must return what fitAllLaws returns
   * for the same arguments (the runner passes one that fits two groups of laws on two threads).
   */
  fitLaws?: (strain: Float64Array, stress: Float64Array, opts: FitAllOptions & { packed: LawData }) => LawComparison;
}

/** Half-width of Ag's 95 % interval, points, above which Ag is reported as uncertain (the issue's 0.4-point target). */
export const AG_SHARP_PCT = 0.4;

/** Half-width of the ReH range, as a fraction of ReH, above which ReH is reported as uncertain (the issue's 1.5 % target). */
export const UNCERTAIN_REH = 0.015;

/** Half-width of a plateau proof strength's range, as a fraction of it, above which it is reported as uncertain (the issue's 1 % target). */
export const UNCERTAIN_RP = 0.01;

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
 * σ = s·(1 + e), ε = ln(1 + e), εp = ε − σ/E. Ag = e(Fm) − Rm/E, Agt = Ag + Rm/E, A = e_f − s_f/E
 * (ISO 6892-1 §3.6.4–3.6.6 read from the extensometer record), all toe-compensated. Fm is placed by the
 * local top model, or by the six hardening laws fitted to the flow curve where their maximum of force lies
 * inside the top model's 99.9 % interval (LAW_GATE_CHI2; the 95 % interval reported is then widened to hold it;
 * {@link lawUniformElongation}; the six are fitted for this even with
 * `fit: false` or fewer `laws`, so Ag does not depend on those options).
 * First, samples an acquisition glitch put far off their agreeing neighbours (alone or a few in a row) are read on the
 * line between those neighbours ({@link findGlitches}, warning `glitch`), and a strain channel that stops following the specimen before
 * fracture ({@link extensometerEnd}: held, reset or jump) ends the strain part: strain-based properties are read
 * before it, Rm from the force after it too, and what is only a lower bound is listed in `lowerBounds`. A record
 * that ends with an elastic unloading is a test stopped before fracture (`unloadedBeforeFracture`). A record that holds
 * several tests one after another ({@link testStarts}) is analysed up to the second, with a `secondTest` warning first.
 * Units: strain fraction, stress MPa in; MPa and % out. Valid: a record with an elastic rise and a
 * maximum of force, finite numbers.
 * @throws InputError naming the field and index for non-finite values or too few points.
 * @example analyzeRecord({ strain, stress }).proofStrength // Rp0.2 in MPa
 */
export function analyzeRecord(data: TensileData, opts: AnalyzeOptions = {}): TensileAnalysis {
  const N = data.strain.length;
  if (data.stress.length !== N) throw new InputError('stress', data.stress.length, `as many values as strain (${N})`);
  if (N < 10) throw new InputError('points', N, 'at least 10 points in a tensile record');
  const strainMoves: number[] = [], stressMoves: number[] = [];
  const back = { at: -1 };
  let iRaw = finiteArgMax(data.strain, data.stress, strainMoves, stressMoves, back);
  // A further test in the same file (specimens exported one after another): the first is analysed, the rest said.
  // Read as one test, the second specimen's rise had been taken for an unload–reload cycle of the first (a negative
  // permanent strain) and its top for Rm. finiteArgMax found where the strain first came back (rare): look there.
  if (back.at >= 0) {
    const starts = testStarts(data.strain, data.stress);
    if (starts.length) return firstTestOnly(data, starts, opts);
  }
  let sMax = data.stress[iRaw]!;
  if (!(sMax > 0)) throw new InputError('stress', sMax, 'a record whose highest stress is above 0 MPa');
  // Samples an acquisition glitch put far off the curve (a spike, a dropped reading or row; alone or a few in a row) are read on
  // the line between their neighbours, on a copy, and said: one spike read as the maximum had put Rm 13 % high and "fracture" there.
  const early: TensileWarning[] = [];
  const glitches = findGlitches(data.strain, data.stress, sMax, { strain: strainMoves.length < MAX_CANDIDATES ? strainMoves : null, stress: stressMoves.length < MAX_CANDIDATES ? stressMoves : null });
  let strain = data.strain, stress = data.stress;
  if (glitches.length) {
    const e = Float64Array.from(strain), s = Float64Array.from(stress);
    for (const g of glitches) (g.column === 'strain' ? e : s)[g.index] = g.readAs;
    strain = e; stress = s;
    const list = glitches.slice(0, 5).map((g) => `sample ${g.index} (${g.column} ${+g.value.toPrecision(5)}, read as ${+g.readAs.toPrecision(5)})`).join(', ');
    // A dropped row is one sample off in both columns: samples are counted once.
    const count = new Set(glitches.map((g) => g.index)).size;
    early.push({ code: 'glitch', message: `${count} sample${count > 1 ? 's' : ''} far off the curve between neighbours that agree with each other (alone or up to ${glitchRun(N)} in a row: an acquisition spike, dropped reading or dropped row; the specimen cannot do that and return): read on the line between those neighbours — ${list}${glitches.length > 5 ? ', …' : ''}. Check the export if there are many` });
    strainMoves.length = 0;
    iRaw = finiteArgMax(strain, stress, strainMoves);
    sMax = stress[iRaw]!;
  }
  // A block of rows lost by the acquisition (0 in both columns, too long to read on a line): refused, naming it.
  const lost = droppedRows(strain, stress, sMax, strainMoves.length < MAX_CANDIDATES ? strainMoves : null);
  if (lost) {
    throw new InputError(`strain[${lost.from}]`, 0, `a reading of the loaded specimen: samples ${lost.from}–${lost.to} read 0 in both strain and stress between loaded samples that agree ` +
      `(${+(100 * strain[lost.from - 1]!).toPrecision(4)} % and ${+(100 * strain[lost.to + 1]!).toPrecision(4)} % at ${+stress[lost.from - 1]!.toPrecision(4)} and ${+stress[lost.to + 1]!.toPrecision(4)} MPa), ` +
      `which a specimen cannot do: rows lost by the acquisition or the export (up to ${glitchRun(strain.length)} in a row are read on the line between their neighbours). Remove or mend those rows and analyse again`);
  }
  // The noise of the loaded specimen: the runs of samples below 5 % of the highest stress at the start (before the
  // load is taken up) and at the end (after fracture) are left out. A long quiet tail had pulled the blocks' median
  // down: 300 samples of a broken specimen after the open 46NT71 record read its noise as 0.48 MPa instead of 1.7,
  // and every threshold tied to it (yield drop, Rp's range, the fracture) with it.
  let lo = 0, hi = N;
  while (lo < N && !(stress[lo]! >= LOADED * sMax)) lo++;
  while (hi > lo && !(stress[hi - 1]! >= LOADED * sMax)) hi--;
  let noise = hi - lo >= 16 ? recordNoiseWide(stress, lo, hi) : recordNoiseWide(stress);
  // How correlated the load noise is from sample to sample (an acquisition filter), read over the whole loaded record:
  // a short window's own residuals read it near 0 where it is 0.7, and the intervals built on them were too narrow.
  let noiseRho = hi - lo >= 16 ? noiseLag1(stress, lo, hi, noise) : noiseLag1(stress, 0, N, noise);
  // A strain column written with too few digits (percent with two decimals: steps of 1e-4) holds each reading while
  // the stress climbs by E·q: on the elastic rise a staircase that read as a bend ("gradual yielding") and hid a
  // yield drop of evidence 366 on an invented record. Read between its steps (each value inside its recorded step);
  // the samples per reading are also counted on the rise (to the first sample at half the highest stress).
  let rise = lo;
  while (rise < hi && !(stress[rise]! >= 0.5 * sMax)) rise++;
  const steps = strainSteps(strain, lo, hi, rise);
  if (steps?.coarse) {
    strain = spreadStrainSteps(strain, steps.step);
    strainMoves.length = 0;
    iRaw = finiteArgMax(strain, stress, strainMoves);
  }
  // A stress column written with few digits (force in kN with one decimal on a small section, stress in whole MPa
  // from a quiet machine): a staircase whose treads are longer than the noise can dither, found as the strain's
  // steps are. Rounded stress in steps of 5 MPa on invented hold-out records with load noise 0.01–0.1 % of Rm had
  // read Ag 9 points off inside an interval of ±0.2 point and missed yield drops of evidence 180–620: the noise
  // estimated from the treads was near zero. Read between its steps where the stress rises or falls steadily
  // (every value inside its recorded step); where it turns (the top, a yield peak, a drop's foot) the step is all
  // the record knows, so the noise every threshold and interval uses is at least the rounding's sd, q/√12.
  // Only where the rounding is no small part of what the record scatters by (its sd q/√12 above half the noise
  // measured on the rounded column, which holds both): a step under the noise dithers and is noise like any other.
  const stressLattice = strainSteps(stress, lo, hi);
  const stressSteps = stressLattice?.coarse && stressLattice.step / Math.sqrt(12) > STRAIN_STEPS.materialShare * noise ? stressLattice : null;
  if (stressSteps) {
    stress = spreadStrainSteps(stress, stressSteps.step);
    noise = Math.max(hi - lo >= 16 ? recordNoiseWide(stress, lo, hi) : recordNoiseWide(stress), stressSteps.step / Math.sqrt(12));
    // The column spread between its steps is smooth within each step: its second differences say nothing of the noise.
    noiseRho = 0;
    strainMoves.length = 0;
    iRaw = finiteArgMax(strain, stress, strainMoves);
    sMax = stress[iRaw]!;
  }
  // A strain channel that stops following the specimen (extensometer taken off, reset, out of range): every
  // property that needs strain is read before that point; the force after it still counts for Rm.
  const end = extensometerEnd(strain, stress, sMax, noise, strainMoves.length < MAX_CANDIDATES ? strainMoves : undefined, steps?.step ?? 0);
  if (!end) return analyzeStrainPart(strain, stress, iRaw, { sd: noise, lag1: noiseRho }, opts, null, early, steps, stressSteps);
  if (end.index < 10) throw new InputError(`strain[${end.index}]`, strain[end.index]!, `a strain channel that follows the specimen for at least 10 samples; it ${end.kind === 'held' ? 'holds one value' : end.kind === 'reset' ? 'falls back by more than any elastic recovery' : 'jumps by far more than its steps'} from sample ${end.index} while the force goes on (extensometer taken off?)`);
  const head = (a: ArrayLike<number>) => (ArrayBuffer.isView(a) ? (a as unknown as Float64Array).subarray(0, end.index) : Array.prototype.slice.call(a, 0, end.index) as number[]);
  const hs = head(strain), hy = head(stress);
  return analyzeStrainPart(hs, hy, finiteArgMax(hs, hy), { sd: noise, lag1: noiseRho }, opts, { stress, end }, early, steps, stressSteps);
}

/**
 * analyzeRecord of the first of several tests in one record ({@link testStarts}: `starts`, the first sample of each
 * further test), with a `secondTest` warning first that says where the others start and how to analyse them.
 */
function firstTestOnly(data: TensileData, starts: number[], opts: AnalyzeOptions): TensileAnalysis {
  const k = starts[0]!;
  if (k < 10) throw new InputError('points', k, 'at least 10 points in the first test of a record that holds more than one');
  const head = (a: ArrayLike<number>) => (ArrayBuffer.isView(a) ? (a as unknown as Float64Array).subarray(0, k) : Array.prototype.slice.call(a, 0, k) as number[]);
  const a = analyzeRecord({ strain: head(data.strain), stress: head(data.stress) }, opts);
  a.furtherTests = starts.slice();
  const list = starts.slice(0, 5).map((i) => `sample ${i}`).join(', ');
  a.warnings.unshift({
    code: 'secondTest',
    message: `the record starts over ${starts.length > 1 ? `${starts.length} times` : 'once'} (at ${list}${starts.length > 5 ? ', …' : ''}): strain and stress fall back near zero and the stress rises again, which one specimen cannot do — ` +
      `read as ${starts.length + 1} tests in one file. Only the first (samples 0–${k - 1}) is analysed here; analyse each test as a record of its own (the command line and the record bench split such a file by themselves)`,
  });
  return a;
}

/** The force after a strain channel's end ({@link extensometerEnd}): the whole record's stress column and where the strain ends. */
interface ForceTail { stress: ArrayLike<number>; end: ExtensometerEnd }

/**
 * analyzeRecord on the samples whose strain follows the specimen (all of them, or those before the strain
 * channel's end, with the whole record's stress in `tail`).
 */
function analyzeStrainPart(strain: ArrayLike<number>, stress: ArrayLike<number>, iRaw: number, noiseOf: { sd: number; lag1: number }, opts: AnalyzeOptions, tail: ForceTail | null, early: TensileWarning[], steps: StrainSteps | null, stressSteps: StrainSteps | null): TensileAnalysis {
  const noise = noiseOf.sd, noiseRho = noiseOf.lag1;
  const N = strain.length;
  const warnings: TensileWarning[] = [...early];
  const sMax = stress[iRaw]!;
  let el = elasticModulus(strain, stress, sMax, noise, 0, noiseRho);
  // A strain column in steps whose rounding on the rise matters (E·q/√12, the uniform rounding error's sd — common
  // practice — above half the load's noise): E again, each line's scatter with what rounding is left on the rise
  // (xRounding, strain: all of it where the column moves every sample or so; read between its steps, a reading held
  // over m samples of the rise is placed to about q/m).
  const xRounding = steps ? steps.step / Math.sqrt(12) / (steps.coarse ? Math.max(1, steps.riseSamplesPerReading) : 1) : 0;
  const roundingMatters = (modulus: number) => steps !== null && (modulus * steps.step) / Math.sqrt(12) > STRAIN_STEPS.materialShare * noise;
  const xr = roundingMatters(el.modulus) ? xRounding : 0;
  if (xr > 0) el = elasticModulus(strain, stress, sMax, noise, xr, noiseRho);
  const given = opts.elasticModulus;
  if (given !== undefined && !(given > 0 && Number.isFinite(given))) throw new InputError('elasticModulus', given, 'a modulus > 0 MPa');
  // Strain from the machine's travel with the specimen's E given: the machine's and grips' compliance taken out, then
  // everything read from the corrected strain (the apparent modulus is still reported as the one measured).
  const apparent = el;
  let compliance: number | null = null;
  // The plastic travel spread over the parallel length (L0/Lc), with the compliance taken out.
  let lengthRatio: number | null = null;
  const tl = opts.travelLengths;
  if (tl !== undefined) {
    if (!(Number.isFinite(tl.gaugeLength) && tl.gaugeLength > 0)) throw new InputError('travelLengths.gaugeLength', tl.gaugeLength, 'a gauge length > 0 mm');
    if (!(Number.isFinite(tl.parallelLength) && tl.parallelLength >= tl.gaugeLength && tl.parallelLength <= MAX_PARALLEL_RATIO * tl.gaugeLength)) throw new InputError('travelLengths.parallelLength', tl.parallelLength, `a parallel length from the gauge length (${tl.gaugeLength} mm) to ${MAX_PARALLEL_RATIO}× it`);
  }
  if (opts.machineTravel && given !== undefined) {
    const c = removeMachineCompliance(strain, stress, el.modulus, given);
    if (c) {
      strain = c.strain;
      compliance = c.compliance;
      if (tl && tl.parallelLength > tl.gaugeLength) {
        lengthRatio = tl.gaugeLength / tl.parallelLength;
        strain = spreadOverParallelLength(strain, stress, given, lengthRatio);
      }
      el = elasticModulus(strain, stress, sMax, noise, xr, noiseRho);
      warnings.push({
        code: 'machineCompliance',
        message: `strain from the machine's travel: its elastic slope ${(apparent.modulus / 1000).toFixed(1)} GPa (band ${apparent.window.fromStress.toFixed(0)}–${apparent.window.toStress.toFixed(0)} MPa) against the given E ${(given / 1000).toFixed(1)} GPa is the machine's and grips' compliance, taken out as a linear spring: e − s·${compliance.toExponential(2)} /MPa. Rp0.2 is then close to an extensometer's; ` +
          (lengthRatio !== null
            ? `the plastic travel is spread over the parallel length Lc ${tl!.parallelLength} mm up to maximum force (Ag, the flow curve) and after it taken as the neck's inside the gauge length L0 ${tl!.gaugeLength} mm (A). The fillets still add a little: Ag and A from the travel are estimates, take them from an extensometer for a certificate`
            : tl
              ? 'Ag and A count the travel over the gauge length (the parallel length given equals it); the fillets still add a little: take them from an extensometer for a certificate'
              : 'Ag and A still count the whole parallel length and the fillets over the gauge length (read high by about Lc/L0 − 1 of Ag): give the parallel length (--parallel-length, or a metadata line "Parallel length: 30 mm"), or take them from an extensometer'),
      });
    } else {
      warnings.push({ code: 'machineCompliance', message: `strain from the machine's travel, but its elastic slope ${(apparent.modulus / 1000).toFixed(1)} GPa is not below the given E ${(given / 1000).toFixed(1)} GPa: no compliance to take out, the strain is read as it is` });
    }
  }
  const E = given ?? el.modulus;
  let toe = el.toeStrain;
  if (given !== undefined) {
    // The given E through the centroid of the elastic band's samples up to 40 % of the Rp0.2 estimate (ISO 6892-1
    // Annex G's 10–40 % band, from memory), all of the band's samples when fewer than 3 lie there. Above that a
    // round-house curve (stainless steel, aluminium) already carries microplastic strain — Ramberg–Osgood's
    // 0.2 %·(σ/Rp0.2)ⁿ is 5e-4 at 70 % with n = 4 — whose mean entered e0 and moved the offset line right: with
    // the true E given, Rp0.2 read up to 2.9 % HIGH on noise-free hold-out B records (the unsafe side), worse than
    // with E measured. The strain's own noise hardly matters here: σ̂/E is about 1e-5 per sample.
    const { fromIndex: a, toIndex: b, proofEstimate } = el.window;
    toe = lowBandToe(strain, stress, a, b, ELASTIC_WINDOW.band[1] * proofEstimate, E) ?? lowBandToe(strain, stress, a, b, Infinity, E, 1) ?? el.toeStrain;
    if (el.issues.some((x) => x.code === 'implausibleModulus' || x.code === 'elasticBandFallback')) {
      // The band is not elastic: take the toe from the steepest three consecutive samples of the first rise
      // (the elastic samples, however few), e0 = mean of e − s/E over them.
      let best = -Infinity, at = -1;
      for (let i = 0; i + 2 < N && stress[i + 2]! < 0.98 * sMax; i++) {
        if (stress[i]! < 0.02 * sMax) continue;
        const de = strain[i + 2]! - strain[i]!;
        if (!(de > 0)) continue;
        const slope = (stress[i + 2]! - stress[i]!) / de;
        if (slope > best) { best = slope; at = i; }
      }
      if (at >= 0) toe = (strain[at]! + strain[at + 1]! + strain[at + 2]! - (stress[at]! + stress[at + 1]! + stress[at + 2]!) / E) / 3;
    }
    const [lo, hi] = apparent.window.interval95;
    if (compliance === null && !(given >= lo && given <= hi)) warnings.push({ code: 'modulusGiven', message: `the given E ${(given / 1000).toFixed(1)} GPa is outside the 95 % interval of the measured one (${(lo / 1000).toFixed(1)}–${(hi / 1000).toFixed(1)} GPa); the given E is used` });
  } else {
    const bad = el.issues.find((x) => x.code === 'implausibleModulus');
    if (bad) throw new InputError('elasticModulus', +el.modulus.toPrecision(4), `a modulus of a metal (${ELASTIC_WINDOW.plausible[0] / 1000}–${ELASTIC_WINDOW.plausible[1] / 1000} GPa) from the elastic band; ${bad.message}`);
  }
  for (const x of el.issues) if (x.code !== 'implausibleModulus' || given === undefined) warnings.push({ code: x.code, message: x.message });

  const offPct = opts.proofOffsetPct ?? ANALYZE_DEFAULTS.proofOffsetPct;
  if (!(offPct > 0 && offPct <= 5)) throw new InputError('proofOffsetPct', offPct, 'a number in (0, 5] %');
  // The elastic line's error (slope and toe) enters Rp's interval; a given E is taken as exact.
  const lineVar = given === undefined ? elasticLineVariance(strain, stress, el.window, E) : () => 0;
  // Unload–reload cycles (found here: a last unloading that is never reloaded is the end of the test, below).
  const cycles = findCycles(strain, stress, E, toe, el.window.toIndex, noise);
  // Proof strengths and the yield point are read on the loading alone (ISO 6892-1 reads them on the rising curve):
  // an unloading just past yield (a loop to measure E or the permanent set, common practice) fell along the elastic
  // slope, below the elastic line and along the offset line, and was read as a yield drop with ReL at the loop's
  // bottom (an invented loop on 46NT71 at 0.75 % strain gave "ReH / ReL 1124.5 / 199.1 MPa") or moved Rp0.2 by
  // 8–17 % (loops at 0.1 and 0.2 % plastic strain). Cycles start past the elastic band, so indices up to its end are
  // the same in both; the view's indices (`ls`, `ss`) are mapped back to the record's for the rest.
  const loading = cycles.length ? withoutCycles(strain, stress, cycles) : null;
  const ls = loading ? loading.strain : strain, ss = loading ? loading.stress : stress, NL = ss.length;
  const toView = (i: number) => (loading ? loading.toView(i) : i);
  const toRecord = (j: number) => (loading ? loading.kept[Math.floor(j)]! + (j - Math.floor(j)) : j);
  // Each offset's proof strength once (it was computed twice per listed offset and again for the asked one).
  const rpMemo = new Map<number, ReturnType<typeof proofStrength>>();
  const rp = (pct: number) => {
    if (!rpMemo.has(pct)) rpMemo.set(pct, proofStrength(ls, ss, E, toe, pct / 100, el.window.fromIndex, NL, noise));
    return rpMemo.get(pct)!;
  };
  // proof.index is on the loading's view (toRecord for the record's).
  let proof = proofStrength(ls, ss, E, toe, offPct / 100, el.window.fromIndex, NL, noise, lineVar, noiseRho);
  rpMemo.set(offPct, proof); // the same crossing; the listed offsets reuse it
  if (!proof) warnings.push({ code: 'noProofPoint', message: `the curve never meets the ${offPct} % offset line; no proof strength` });
  const proofStrengths = [0.2, 0.5, 1].map((p) => ({ offsetPct: p, stress: rp(p)?.stress ?? null, index: rp(p)?.index ?? -1 }));
  const rt = totalExtensionStrength(ls, ss, toe, 0.005, NL);

  // Fracture: first sudden fall after the highest stress, else the end of the record.
  // A fall spread over many samples along the elastic line is the specimen being unloaded, not fracture.
  const fall0 = firstFall(stress, iRaw, sMax, noise, strain, E);
  // A record that ends while the load is still falling (no sample after fracture, the fall spread over the last few
  // samples, none of its steps over 50 %): fracture where that fall began, found by the same walk back from the end.
  // Without it, A was read at the last sample, part-way down the fall, its elastic part s/E too small (A 0.25 point
  // high on an invented aluminium record whose load fell over its last three samples).
  const endFall = fall0 < 0 ? fallStart(stress, N - 1, iRaw, noise, strain, E) : -1;
  const fallAt = fall0 >= 0 ? fall0 : endFall >= 0 && endFall < N - 1 ? endFall : -1;
  const fall = fallAt >= 0 && elasticUnloading(strain, stress, iRaw, fallAt, sMax, E) ? -1 : fallAt;
  const endedInFall = fall >= 0 && fall0 < 0;
  const detected = fall >= 0;
  const fi = detected ? fall : N - 1;
  // The same rounding on the yield point's rise (E·xRounding of stress on each sample): with steps of 1e-4 on steel,
  // 6 MPa against a load noise of 0.5 MPa, the knee test read a sharp 7.7 % peak as a rounded knee, ReH 2.6 % low.
  const keptSteps = roundingMatters(E) ? steps : null;
  if (keptSteps) {
    const rounding = (E * keptSteps.step) / Math.sqrt(12);
    warnings.push({
      code: 'coarseStrain',
      message: `the strain column is written in steps of ${+(100 * keptSteps.step).toPrecision(3)} % (its resolution in this file): on the elastic rise a step is ${(E * keptSteps.step).toPrecision(3)} MPa of stress, its rounding (${rounding.toPrecision(2)} MPa sd) ${rounding > noise ? 'above' : 'near'} the load's noise (${noise.toPrecision(2)} MPa). ` +
        (keptSteps.coarse ? `The column holds each reading for ${keptSteps.samplesPerReading.toFixed(1)} samples on average (${keptSteps.riseSamplesPerReading.toFixed(1)} on the rise): between its steps the strain is read on a line in sample order, each value inside its recorded step (taken as exact, the steps read as a staircase on the rise). ` : '') +
        `The tests on the rise allow for what rounding is left; E, Rp0.2 and ReH carry it. Export the strain with more digits if the machine records them`,
    });
  }
  if (stressSteps) {
    const q = stressSteps.step;
    warnings.push({
      code: 'coarseStress',
      message: `the stress column is written in steps of ${+q.toPrecision(3)} MPa (its resolution in this file; ${+(100 * q / sMax).toPrecision(2)} % of the highest stress), coarser than the load's own noise: it holds each reading for ${stressSteps.samplesPerReading.toFixed(1)} samples on average. ` +
        `Where the stress rises or falls steadily it is read between its steps on a line in sample order, each value inside its recorded step; where it turns (the top, a yield peak, the foot of a drop) the step is all the record holds: Rm, ReH and ReL are known to about ±${+(q / 2).toPrecision(2)} MPa, and Ag's interval spans the top's step. ` +
        `Every noise threshold takes at least the rounding's ${+(q / Math.sqrt(12)).toPrecision(2)} MPa sd. Export the force or stress with more digits if the machine records them`,
    });
  }
  const ypView = yieldPoint(ls, ss, E, toe, toView(el.window.fromIndex), toView(fi), noise, keptSteps ? E * xRounding : 0);
  const yp = ypView && loading ? { ...ypView, peakIndex: loading.kept[ypView.peakIndex]!, plateauFrom: loading.kept[ypView.plateauFrom]!, endIndex: loading.kept[ypView.endIndex]! } : ypView;
  // A yield plateau with no upper yield point clear of the noise (a coarse or noisy record that missed the peak):
  // ReH, ReL and Ae are not reported, but the flow curve the laws are fitted to starts at its end (yieldPlateau).
  const plView = ypView ? null : yieldPlateau(ls, ss, E, toe, toView(el.window.fromIndex), toView(fi), noise);
  const plateau = plView && loading ? { ...plView, startIndex: loading.kept[plView.startIndex]!, endIndex: loading.kept[plView.endIndex]! } : plView;
  if (plateau) warnings.push({ code: 'yieldPlateau', message: `the record yields at about constant force (${plateau.level.toFixed(1)} MPa over ${plateau.lengthPct.toFixed(2)} % strain, from ${((strain[plateau.startIndex]! - toe) * 100).toFixed(2)} to ${((strain[plateau.endIndex]! - toe) * 100).toFixed(2)} %) with no upper yield point the record shows clear of its noise: ReH, ReL and Ae are not reported; the n-value and the hardening laws are fitted from the plateau's end` });
  if (yp && (yp.upperYieldRange[1] - yp.upperYieldRange[0]) / 2 > UNCERTAIN_REH * yp.upperYield) warnings.push({ code: 'uncertainReH', message: `ReH ${yp.upperYield.toFixed(1)} MPa is uncertain: the peak falls between samples or within the noise, so the record supports ReH anywhere from ${yp.upperYieldRange[0].toFixed(1)} to ${yp.upperYieldRange[1].toFixed(1)} MPa` });
  // A proof point on a yield plateau is read from the plateau (serrations handled: plateauProofStrength).
  let proofRange: [number, number] | null = null;
  if (yp) {
    // On the loading alone too (a loop on the plateau is no part of it).
    const v = ypView!;
    const onPlateau = (index: number) => (index >= v.plateauFrom && index < v.endIndex ? plateauProofStrength(ls, ss, Math.round(index), v.plateauFrom, v.endIndex, noise) : null);
    if (proof) {
      const pp = onPlateau(proof.index);
      if (pp) {
        proof = { ...proof, stress: pp.stress };
        proofRange = pp.range;
        if ((pp.range[1] - pp.range[0]) / 2 > UNCERTAIN_RP * pp.stress) warnings.push({ code: 'uncertainRp', message: `Rp${offPct} ${pp.stress.toFixed(1)} MPa lies on a serrated yield plateau: the offset line meets the serrations anywhere from ${pp.range[0].toFixed(1)} to ${pp.range[1].toFixed(1)} MPa, depending on where they are when it crosses` });
      }
    }
    for (const p of proofStrengths) if (p.stress !== null) p.stress = onPlateau(p.index)?.stress ?? p.stress;
  }
  // A proof point read from a local fit carries its 95 % interval (noise, and the elastic line's slope and toe).
  // Where the measured E is loosely known (a coarse or noisy rise, a rise with no straight part, whose interval
  // reaches down to the secant), Rp is also read with E at both ends of its 95 % interval, the line pivoting about
  // the middle of the elastic band. The two errors are independent (the noise near the offset point, and the slope
  // fitted on the elastic band's samples), so their 95 % half-widths add in quadrature on each side (the variance of a
  // sum of independent errors; Taylor, *An Introduction to Error Analysis*, 2nd ed., §3.6, from memory). The hull of
  // the two (the larger alone) left the truth outside the range where both pushed the same way (property test, seed
  // 147: Rp0.2 1.55 % high against a ±1.5 % range). Wider than ±1 % the range is said.
  if (proof && !proofRange) {
    const hw = proof.halfWidth95 ?? 0;
    let dLo = 0, dHi = 0;
    if (given === undefined) {
      const [eLo, eHi] = el.window.interval95;
      const mid = 0.5 * (el.window.fromStress + el.window.toStress);
      const rpAt = (Ei: number) => (Ei > 0 ? proofStrength(ls, ss, Ei, toe + mid / E - mid / Ei, offPct / 100, el.window.fromIndex, NL, noise)?.stress ?? null : null);
      for (const v of [rpAt(eLo), rpAt(eHi)]) if (v !== null) { dLo = Math.max(dLo, proof.stress - v); dHi = Math.max(dHi, v - proof.stress); }
    }
    const lo = proof.stress - Math.sqrt(dLo * dLo + hw * hw), hi = proof.stress + Math.sqrt(dHi * dHi + hw * hw);
    if (proof.halfWidth95 !== undefined || (hi - lo) / 2 > UNCERTAIN_RP * proof.stress) proofRange = [lo, hi];
    if ((hi - lo) / 2 > UNCERTAIN_RP * proof.stress) warnings.push({ code: 'uncertainRp', message: `Rp${offPct} ${proof.stress.toFixed(1)} MPa is uncertain: the record's noise, its few samples near the offset point and the uncertainty of E (95 % ${(el.window.interval95[0] / 1000).toFixed(0)}–${(el.window.interval95[1] / 1000).toFixed(0)} GPa) place it anywhere from ${lo.toFixed(1)} to ${hi.toFixed(1)} MPa; give the modulus if it is known` });
  }
  // Rm: local parabola around the top, after the yield plateau when there is one (ISO 6892-1 §3.10.1).
  // At least 3 samples for the top's fit (a record that ends on its yield plateau still gets one).
  const topFrom = Math.max(0, Math.min(yp ? yp.endIndex : el.window.toIndex, fi - 2));
  // A record that ends with an elastic unloading and no reload: the test was stopped and the specimen unloaded
  // before it broke (no fracture fall). That unloading is no unload–reload cycle, the loading ended where it
  // began, and A is the permanent elongation at the stop — a lower bound of the elongation after fracture.
  let finalUnload: UnloadCycle | null = null;
  {
    const c = cycles[cycles.length - 1];
    if (!detected && c && c.reloadProofStrength === null && neverReloaded(stress, c.reversalIndex, 0.7 * stress[c.unloadIndex]!)) { finalUnload = c; cycles.pop(); }
  }
  // The top is fitted on the loading only (an unloading at the end is no part of it).
  const fm = forceMaximum(strain, stress, noise, topFrom, finalUnload ? Math.max(topFrom + 3, finalUnload.unloadIndex + 1) : fi + 1, stressSteps?.step ?? 0);
  // Past the strain channel's end the force alone: its top on the sample axis (uniform in time), from the same
  // start, to the fracture of the whole record. Where that top lies past the end, Rm is read from it (force over
  // the original section needs no strain) and Ag, Agt and A are lower bounds; else Rm and Ag stand and A is one.
  const force = tail ? forceAfterEnd(tail, topFrom, noise) : null;
  const maxInTail = force !== null && force.top.index >= tail!.end.index;
  const Rm = maxInTail ? force!.top.stress : fm.stress;
  const iMax = fm.index;
  const eM = fm.strain - toe;
  // Ag of the local top model; the hardening laws may place it more tightly inside its interval (below, lawTop.ts).
  const agTop = (eM - fm.stress / E) * 100;
  const agCi: [number, number] = [(fm.strainInterval95[0] - toe - fm.stress / E) * 100, (fm.strainInterval95[1] - toe - fm.stress / E) * 100];
  const agWarningsAt = warnings.length; // Ag's warnings go here once Ag is known

  const loadEnd = finalUnload ? finalUnload.unloadIndex + 1 : N;
  const necked = !detected && !finalUnload && stress[N - 1]! < 0.9 * Rm;
  // The test stopped before maximum force: no fracture and the top fit reaches the last samples of the loading.
  let endMean = 0;
  for (let i = Math.max(0, loadEnd - 3); i < loadEnd; i++) endMean += stress[i]! / Math.min(3, loadEnd);
  const lowerBounds: TensileAnalysis['lowerBounds'] = [];
  if (tail) {
    const t = tail.end;
    const eEnd = (t.strain - toe) * 100;
    warnings.push({
      code: 'strainChannelEnds',
      message: `the strain ${t.kind === 'held' ? 'holds one value' : t.kind === 'reset' ? 'falls back by more than elastic recovery allows' : 'jumps by far more than its steps around it'} from sample ${t.index} (at ${eEnd.toFixed(2)} % strain) while the force goes on for ${t.samplesAfter} more samples: the extensometer was taken off${t.kind === 'held' ? ' or reached the end of its range' : t.kind === 'reset' ? ' or reset' : ' and the strain switched to another source (such as the crosshead)'}. `
        + (maxInTail
          ? `Rm ${Rm.toFixed(1)} MPa is read from the force after that point (its top against time); Ag, Agt and A are not in the record and are given as lower bounds. `
          : 'Rm and Ag lie before that point and stand; A is not in the record and is given as a lower bound. ')
        + 'Measure A on the fitted broken pieces (ISO 6892-1, from memory)',
    });
    lowerBounds.push(...(maxInTail ? ['uniformElongationPct', 'uniformTotalElongationPct', 'totalElongationPct'] as const : ['totalElongationPct'] as const));
  } else if (!detected && (iMax >= loadEnd - Math.max(2, Math.ceil(0.01 * loadEnd)) || (fm.span[1] >= strain[loadEnd - 1]! && endMean >= Rm - Math.max(3 * noise, 0.002 * Rm)))) {
    warnings.push({ code: 'maxAtEnd', message: `the highest stress is at the end of the ${finalUnload ? 'loading (the specimen was then unloaded)' : 'record'}: the test stopped before maximum force, so Rm, Ag and A are lower bounds` });
    lowerBounds.push('tensileStrength', 'uniformElongationPct', 'uniformTotalElongationPct', 'totalElongationPct');
  }
  if (finalUnload) {
    const e = finalUnload.engineering;
    warnings.push({ code: 'unloadedBeforeFracture', message: `the record ends with an elastic unloading from ${e.unloadStress.toFixed(1)} MPa (chord modulus ${(finalUnload.unloadModulus / 1000).toFixed(0)} GPa) and no fracture: the test was stopped before the specimen broke, so A is a lower bound (the permanent elongation at the stop)` });
    if (!lowerBounds.includes('totalElongationPct')) lowerBounds.push('totalElongationPct');
  }
  else if (!tail && !detected && !necked && !lowerBounds.length) warnings.push({ code: 'noFractureDrop', message: 'no sudden fall of force after Rm and no necking at the end: the last point is taken as fracture (A assumes the record ends at fracture)' });
  // A: the stress at fracture from a line through the last samples (its elastic part s_f/E, not one noisy sample).
  // Past a strain channel's end, the plastic strain of its last sample (A can only be larger).
  let sF = stress[fi]!;
  if (!tail) {
    const k = Math.min(fi - iMax, Math.max(3, Math.min(50, Math.round(N / 1000))));
    if (k >= 3) {
      try { const f = linearFit(strain, stress, fi - k + 1, fi + 1); sF = f.intercept + f.slope * strain[fi]!; } catch { /* keep the sample */ }
    }
  }
  const aRead = (strain[fi]! - toe - sF / E) * 100;

  // Flow curve: monotone envelope (cycles left out), from the end of yield effects to Fm.
  const flowStart = yp ? yp.endIndex : plateau ? plateau.endIndex : -1;
  const fromTrue = flowStart >= 0 ? Math.log1p(strain[flowStart]! - toe) - (stress[flowStart]! * (1 + strain[flowStart]! - toe)) / E : ANALYZE_DEFAULTS.flowCurveFrom;
  // The flow curve in one pass (ln(1 + e) only for the points of the envelope), into arrays sized
  // once: on a 1,000,000-row record the former loops with pushes, a second log1p per point and the
  // true curve that `analyze` never prints were a tenth of the command (bench/RESULTS.md, issue 12 D).
  const flow = flowColumns(strain, stress, toe, E, iMax, proof ? toRecord(proof.index) : 0, fromTrue);
  const { strain: fStrain, stress: fStress } = flow;
  let scaled = false; // the flow curve after a clear rate change scaled to the first rate (flow.logSums then stale)
  const nf = fStrain.length;
  // A change of the test rate on the plastic part (ISO 6892-1 method A raises it after yield): the flow stress steps
  // with the rate, and the laws fitted across the step bent to bridge it (an invented ×8 at 1 % on 46NT71: every
  // law's RMSE 0.7 → 4.5 MPa, "laws disagree"). Where the step is clear of the noise, the flow curve after it is
  // scaled to the first rate — the lower, safer level — before the n-value and the laws are fitted; Rm, Ag and A
  // stay as recorded (the standard reads them at the later rate). Searched on the loading alone, from the proof
  // point (or the end of the yield plateau) to maximum force.
  const jump = findRateChange(ls, ss, Math.max(proof ? proof.index : 0, yp ? ypView!.endIndex : 0, plView ? plView.endIndex : 0), toView(iMax), E);
  let rateChange: TensileAnalysis['rateChange'] = null;
  if (jump) {
    const at = Math.round(toRecord(jump.index));
    const e = strain[at]! - toe;
    const epAt = Math.log1p(e) - (stress[at]! * (1 + e)) / E;
    const st = nf > 0 && flow.bad < 0 ? rateStep(fStrain, fStress, epAt, noise) : null;
    const before = st ? st.stressAt / (1 + e) : stress[Math.max(0, at - 1)]!;
    const step = st ? before * (1 / st.factor - 1) : null;
    // Taken out only when it goes the way the rate went: the flow stress of metals at room temperature rises with the
    // rate (m > 0, common practice; the small negative m of some Al–Mg alloys stays below RATE_CHANGE.minStep). A step
    // against it is the noise or the law's misfit (hold-out A seed 1015: −0.9 % at a ×4 rise, on a curve with no step).
    const against = !!st && st.clear && step !== null && (step > 0) !== (jump.ratio > 1);
    const clear = !!st && st.clear && !against;
    rateChange = {
      index: at, strain: strain[at]!, ratio: jump.ratio, stressBefore: before, step, stepHalfWidth95: st ? (before * st.halfWidth95) / (st.factor * st.factor) : null, clear,
      sensitivity: clear && step !== null ? Math.log1p(step / before) / Math.log(jump.ratio) : null, law: st?.law ?? null, flowCurveFactor: clear ? st!.factor : null,
    };
    if (clear) { scaleFlowAfter(fStrain, fStress, epAt, st!.factor); scaled = true; }
    warnings.push({ code: 'rateChange', message: rateChangeMessage(rateChange, toe, against) });
  }
  // The fits' packing with the range and first bad point taken in flowColumns' pass (the same operations on the same
  // values as a pass of lawDataLogged; speed follow-up K); ln εp only if a fit reads it (lawDataRanged).
  const packed = nf > 0 ? lawDataRanged(fStrain, fStress, flow.lo, flow.hi, flow.bad) : null;
  // A flow-curve point with no positive stress (a run of zero or negative readings on the plastic part, which no
  // specimen gives): say where it is in the record, not in the flow curve the user never sees.
  if (packed && packed.bad >= 0) {
    let i = proof ? Math.max(0, Math.floor(toRecord(proof.index))) : 0;
    while (i < iMax && stress[i]! > 0 && stress[i]! < Infinity) i++;
    throw new InputError(`stress[${i}]`, stress[i]!, `a stress > 0 MPa on the plastic part of the record up to maximum force (sample ${i}${i > 0 ? `, after ${+stress[i - 1]!.toPrecision(5)} MPa` : ''}); a run of zero readings there is an acquisition fault: check the export`);
  }

  // n-value (ISO 10275).
  let nFit = null;
  {
    let xs: ArrayLike<number> = fStrain, ys: ArrayLike<number> = fStress;
    if (opts.nRange) {
      const [a, b] = opts.nRange;
      if (!(a >= 0 && b > a)) throw new InputError('nRange', opts.nRange, 'a pair [from, to] of engineering strains with 0 ≤ from < to');
      const xr: number[] = [], yr: number[] = [];
      for (let i = 0; i < nf; i++) {
        const eEng = Math.expm1(fStrain[i]! + fStress[i]! / E);
        if (eEng >= a && eEng <= b) { xr.push(fStrain[i]!); yr.push(fStress[i]!); }
      }
      xs = xr; ys = yr;
    }
    // Over the whole flow curve with every point valid (packed.bad < 0: εp and σ finite and > 0), from the sums
    // flowColumns took (no column of logarithms); after a rate change's scaling, or over a stated range, from the points.
    if (xs.length >= 3) nFit = !opts.nRange && !scaled && packed && packed.bad < 0 ? nValueFromSums(flow.logSums, packed.lo, packed.hi) : nValueFit(xs, ys);
    else warnings.push({ code: 'nRange', message: `only ${xs.length} points in the n-value range; no n-value` });
  }

  let fits = null;
  if (opts.fit !== false) {
    if (fStrain.length >= 9) {
      fits = (opts.fitLaws ?? fitAllLaws)(fStrain, fStress, { packed: packed!, ...(opts.laws ? { laws: opts.laws } : {}), ...(opts.checkStrains ? { checkStrains: opts.checkStrains } : {}), ...(opts.disagreementPct !== undefined ? { disagreementPct: opts.disagreementPct } : {}) });
      warnings.push(...fits.warnings);
    } else {
      warnings.push({ code: 'fewFlowPoints', message: `only ${fStrain.length} points on the plastic flow curve up to maximum force; no law fitted` });
    }
  }
  // Ag from the hardening laws fitted to the uniform part of the curve (their maximum of engineering stress, used
  // where it lies inside the top model's 99.9 % interval, Akaike-weighted; lawTop.ts). Always the six laws, whichever laws were
  // asked for (or none, fit: false), so that Ag does not depend on that choice; not where the record ends before
  // maximum force (the laws would extrapolate) or the flow curve is too short to fit.
  let agLaws = null;
  if (!lowerBounds.includes('uniformElongationPct') && packed && packed.bad < 0 && fStrain.length >= 9) {
    let six = fits && LAW_NAMES.every((l) => fits!.fits.some((f) => f.law === l)) ? fits.fits : null;
    if (!six) {
      try { six = fitAllLaws(fStrain, fStress, { packed }).fits; } catch { six = null; }
    }
    // A law's Ag is refused only where the samples near the top clearly rule it out: outside the top model's 99.9 %
    // interval (LAW_GATE_CHI2), not its 95 % one.
    const g = fm.strainInterval999;
    if (six) agLaws = lawUniformElongation(six, E, [(g[0] - toe - fm.stress / E) * 100, (g[1] - toe - fm.stress / E) * 100], packed);
  }
  const byLaws = agLaws?.pct ?? null;
  // Maximum force after the strain channel's end: Ag and Agt at least the plastic and total strain of its last sample.
  const Ag = maxInTail ? (strain[N - 1]! - toe - stress[N - 1]! / E) * 100 : byLaws ?? agTop;
  const Agt = maxInTail ? (strain[N - 1]! - toe) * 100 : Ag + (Rm / E) * 100;
  // The laws' Ag may lie outside the top model's 95 % interval (inside its 99.9 % one): the two readings disagree and
  // either may be right, so the interval reported holds both.
  if (byLaws !== null && !maxInTail) { agCi[0] = Math.min(agCi[0], Ag); agCi[1] = Math.max(agCi[1], Ag); }
  // The travel spread over Lc: past maximum force the plastic travel goes into the neck inside L0 (spreadOverParallelLength).
  const A = lengthRatio !== null ? Ag + (aRead - Ag) / lengthRatio : aRead;
  const agWarnings: TensileWarning[] = [];
  if (maxInTail) { /* Ag is a lower bound (said above); the top model's flatness and interval are not Ag's */ }
  else if ((agCi[1] - agCi[0]) / 2 > AG_SHARP_PCT) agWarnings.push({ code: 'uncertainAg', message: `Ag ${Ag.toFixed(2)} % is uncertain: the top is flat within the noise, so maximum force could lie anywhere from Ag ${agCi[0].toFixed(2)} % to ${agCi[1].toFixed(2)} % (95 % interval, ±${((agCi[1] - agCi[0]) / 2).toFixed(2)} points)${byLaws !== null ? '; the fitted hardening laws place it at the value given' : ''}` });
  if (fm.flat && !maxInTail) agWarnings.push({ code: 'flatTop', message: `the top of the curve is flat within the noise over ${((fm.span[1] - fm.span[0]) * 100).toFixed(2)} % strain; ${byLaws !== null ? 'Ag is read where the fitted hardening laws reach maximum force, inside that flat part' : `Ag is read at the middle of the flat part (±${((fm.span[1] - fm.span[0]) * 50).toFixed(2)} points)`}` });
  warnings.splice(agWarningsAt, 0, ...agWarnings);

  let modulusDecay = null;
  if (cycles.length) {
    const ep = cycles.map((c) => c.permanentStrain);
    const ok = ep.every((v) => v > 0);
    if (ok) modulusDecay = fitModulusDecay(E, ep, cycles.map((c) => c.unloadModulus));
    if (cycles.length < 3) warnings.push({ code: 'cycles', message: `${cycles.length} unload–reload cycle(s); at least 3 are needed to fit the fall of the chord modulus` });
  }

  const analysis: TensileAnalysis = {
    elasticModulus: E,
    elasticModulusSource: given !== undefined ? 'given' : 'measured',
    measuredModulus: apparent.modulus,
    measuredModulusInterval95: apparent.window.interval95,
    machineCompliance: compliance,
    parallelLengthRatio: lengthRatio,
    noise,
    noiseLag1: noiseRho,
    forceMaximum: { points: fm.points, span: fm.span, flat: fm.flat, uniformElongationInterval95: agCi, topModelUniformElongationPct: agTop, lawUniformElongation: agLaws, method: (byLaws !== null ? 'Ag where the hardening laws fitted to the uniform part of the curve reach maximum engineering stress (Considère with the elastic strain counted), Akaike-weighted (from the residuals of each law where the plastic strain of the flow curve is 0.3 to 0.9 of its largest; used where the laws inside hold half the weight by those and by the whole curve) over the laws whose maximum lies inside the 99.9 % interval of the top model below (the 95 % interval given is the top model\'s, widened to hold that Ag); ' : '') + 'least-squares top model fitted to the samples whose moving average lies within max(3 noise sd of the average, 1 %) of the top: each side −a·u² + b·u³ from a common vertex, bounded to fall away from it; Rm its maximum (necking side without the cubic), Ag at the Akaike-weighted vertex of this kinked top and a smooth one (one curvature both sides), or at the middle of a top flat within the noise' },
    elasticWindow: el.window,
    toeStrain: toe,
    proofStrength: proof?.stress ?? null,
    proofStrengthRange: proofRange,
    proofOffsetPct: offPct,
    proofStrengths: proofStrengths.map(({ offsetPct, stress: s }) => ({ offsetPct, stress: s })),
    totalExtensionStrength: rt,
    upperYield: yp?.upperYield ?? null,
    upperYieldRange: yp?.upperYieldRange ?? null,
    lowerYield: yp?.lowerYield ?? null,
    yieldPointElongationPct: yp?.elongationPct ?? null,
    tensileStrength: Rm,
    maxForceIndex: maxInTail ? force!.top.index : iMax,
    uniformElongationPct: Ag,
    uniformTotalElongationPct: Agt,
    totalElongationPct: A,
    fracture: force ? force.fracture : {
      index: fi,
      detected: detected || necked,
      method: finalUnload ? 'end of the record after an elastic unloading (the test was stopped before fracture)' : endedInFall ? 'the record ends while the force falls (no sample after fracture): fracture where that fall began' : fractureMethod(detected, necked),
    },
    lowerBounds,
    strainChannelEnd: tail ? { ...tail.end } : null,
    furtherTests: [],
    strainSteps: keptSteps,
    stressSteps,
    rateChange,
    yieldPlateau: plateau ? { level: plateau.level, startStrain: strain[plateau.startIndex]! - toe, endStrain: strain[plateau.endIndex]! - toe, startIndex: plateau.startIndex, endIndex: plateau.endIndex } : null,
    forceTop: force && maxInTail ? { stress: force.top.stress, index: force.top.index, points: force.top.points, method: 'top model of the force against sample number (uniform in time) past the strain channel\'s end, fitted as the top against strain is' } : null,
    nValue: nFit?.n ?? null,
    K: nFit?.K ?? null,
    nFit,
    trueCurve: { strain: [], stress: [], plasticStrain: [] },
    flowCurve: { strain: [], stress: [] },
    cycles,
    modulusDecay,
    fits,
    warnings,
  };
  // The true curve to maximum force is made when first read: `analyze` prints only properties and
  // fits, and on a 1,000,000-row record the three arrays cost 18 MB and a pass with ln(1 + e).
  let tc: TensileAnalysis['trueCurve'] | null = null;
  Object.defineProperty(analysis, 'trueCurve', {
    enumerable: true, configurable: true,
    get: () => (tc ??= trueCurveTo(strain, stress, toe, E, iMax)),
    set: (v: TensileAnalysis['trueCurve']) => { tc = v; },
  });
  // The flow curve as plain arrays when first read (analyze prints only the fits made from it).
  let fcArrays: TensileAnalysis['flowCurve'] | null = null;
  Object.defineProperty(analysis, 'flowCurve', {
    enumerable: true, configurable: true,
    get: () => (fcArrays ??= { strain: Array.from(fStrain), stress: Array.from(fStress) }),
    set: (v: TensileAnalysis['flowCurve']) => { fcArrays = v; },
  });
  return analysis;
}

// The record-long loops of analyzeRecord live in small functions of their own: analyzeRecord runs
// once per record and is long, so the engine would run its loops unoptimised until it had compiled
// the whole function (measured: the finite check and the search for the highest stress took 16 and
// 11 ms of a 1,000,000-row analysis inside analyzeRecord, bench/RESULTS.md issue 12 E).

/** Most candidate moves finiteArgMax collects per column; with more, the search they serve makes its own pass. */
const MAX_CANDIDATES = 64;
/**
 * Candidate limits, below every limit they serve so that the candidates hold every hit: a strain move of 0.8 of the
 * smaller of the reset margin and a strain glitch's offset (the move into a glitch is at least 7/8 of its offset,
 * the neighbours agreeing within a quarter of it), a stress move of 0.8 of a stress glitch's share of the top.
 */
const STRAIN_MOVE = 0.8 * Math.min(EXTENSOMETER_END.resetMargin, GLITCH.strainOff);
const STRESS_MOVE = 0.8 * GLITCH.stressOff;

/**
 * Index of the first highest stress; throws naming the first non-finite value (strain before stress at each
 * index). Also collects (up to MAX_CANDIDATES each) the indices i where the strain moved by more than STRAIN_MOVE
 * from sample i − 1 (`strainMoves`, for extensometerEnd's resets and jumps and findGlitches' strain glitches) and
 * where the stress moved by more than STRESS_MOVE of the highest stress so far (`stressMoves`, for its stress
 * glitches); both are rare on a fine record. With `back`, the first sample where strain and stress are back below
 * {@link testStarts}' levels (TEST_START) goes into `back.at` (−1: none), so that the full search runs only then.
 */
function finiteArgMax(strain: ArrayLike<number>, stress: ArrayLike<number>, strainMoves?: number[], stressMoves?: number[], back?: { at: number }): number {
  const N = strain.length;
  // top starts as 0, not −Infinity: i = 0 sets it anyway, and a non-small-integer start made V8 box every new top.
  let iRaw = 0, top = 0, prev = N > 0 ? strain[0]! : 0, sPrev = N > 0 ? stress[0]! : 0, eMax = 0;
  for (let i = 0; i < N; i++) {
    const e = strain[i]!, s = stress[i]!;
    // The throw in a function of its own: inline, its message kept every value boxed for it (measured).
    if (!(e - e === 0 && s - s === 0)) notFinite(strain, stress, i);
    if (i === 0 || s > top) { top = s; iRaw = i; }
    // The first sample back below testStarts' strain and stress levels (a candidate start of a further test).
    if (e > eMax) eMax = e;
    else if (e < TEST_START.strainBack * eMax && back && back.at < 0 && eMax >= TEST_START.minStrain && s < TEST_START.stressBack * top) back.at = i;
    if (Math.abs(e - prev) > STRAIN_MOVE && strainMoves && strainMoves.length < MAX_CANDIDATES) strainMoves.push(i);
    if (Math.abs(s - sPrev) > STRESS_MOVE * top && stressMoves) {
      // Full: keep only the moves still above the limit for the highest stress so far (the rest, from the noisy
      // start of loading, cannot be glitches of a loaded specimen: findGlitches measures against the final highest).
      if (stressMoves.length === MAX_CANDIDATES) compactMoves(stressMoves, stress, STRESS_MOVE * top);
      if (stressMoves.length < MAX_CANDIDATES) stressMoves.push(i);
    }
    prev = e; sPrev = s;
  }
  return iRaw;
}

/**
 * True when the fall of stress that firstFall found at `fall` is a controlled unloading: it begins where the strain
 * is largest after the highest stress (index iRaw), takes at least 6 samples to reach 2 % of the highest stress,
 * and its chord follows the elastic line (the strain falls, the chord slope within 0.5–2 E). At fracture the strain
 * is largest at the fall itself (the specimen stretches until it breaks) and the fall takes 1–4 samples on a
 * fast-sampled record.
 */
function elasticUnloading(strain: ArrayLike<number>, stress: ArrayLike<number>, iRaw: number, fall: number, sMax: number, E: number): boolean {
  let u = iRaw;
  for (let i = iRaw; i <= fall; i++) if (strain[i]! > strain[u]!) u = i;
  let k = fall;
  const floor = ANALYZE_DEFAULTS.fractureFloor * sMax;
  while (k < stress.length - 1 && stress[k]! >= floor) k++;
  if (k - u < 6) return false;
  const de = strain[u]! - strain[k]!;
  if (!(de > 0)) return false;
  const slope = (stress[u]! - stress[k]!) / de;
  return slope >= 0.5 * E && slope <= 2 * E;
}

/** How the fracture was placed, in words: a fall found by firstFall, a record that ends after necking, or neither. */
function fractureMethod(detected: boolean, necked: boolean): string {
  return detected ? `first fall of stress by more than ${ANALYZE_DEFAULTS.fractureDrop * 100} % between two samples after Rm`
    : necked ? 'last point of a record that ends after necking (force below 90 % of Fm): the machine stopped at fracture' : 'end of the record (no fracture seen)';
}

/**
 * The record with its unload–reload cycles left out: for each cycle the samples after the start of unloading up to
 * where the reload is back at the unloading's stress or strain (all the rest for an unloading never reloaded).
 * `kept[j]` is the record index of sample j of the view; `toView(i)` the view index of the last kept sample at or
 * before record index i. O(n), only for a record with cycles.
 */
function withoutCycles(strain: ArrayLike<number>, stress: ArrayLike<number>, cycles: readonly UnloadCycle[]): { strain: Float64Array; stress: Float64Array; kept: Int32Array; toView: (i: number) => number } {
  const n = stress.length;
  const drop = new Uint8Array(n);
  for (const c of cycles) {
    const u = c.unloadIndex, su = stress[u]!, eu = strain[u]!;
    let j = c.reversalIndex + 1;
    while (j < n && stress[j]! < su && strain[j]! <= eu) j++;
    for (let i = u + 1; i < j; i++) drop[i] = 1;
  }
  let m = 0;
  for (let i = 0; i < n; i++) if (!drop[i]) m++;
  const kept = new Int32Array(m), view = new Int32Array(n), xs = new Float64Array(m), ys = new Float64Array(m);
  for (let i = 0, j = -1; i < n; i++) {
    if (!drop[i]) { j++; kept[j] = i; xs[j] = strain[i]!; ys[j] = stress[i]!; }
    view[i] = Math.max(0, j);
  }
  return { strain: xs, stress: ys, kept, toView: (i) => view[Math.max(0, Math.min(n - 1, i))]! };
}

/** Multiplies the true stress of the flow points from the first at or past true plastic strain `from` on by `factor`, in place. */
function scaleFlowAfter(xs: Float64Array, ys: Float64Array, from: number, factor: number): void {
  for (let i = firstAtOrPast(xs, from); i < xs.length; i++) ys[i]! *= factor;
}

/** The `rateChange` warning's words: where, how much faster, the step and what was done with it (`against`: a clear step the other way from the rate's change). */
function rateChangeMessage(r: RateChange, toe: number, against: boolean): string {
  const faster = r.ratio >= 1;
  const jump = faster ? r.ratio : 1 / r.ratio;
  const where = `the strain per sample ${faster ? 'rises' : 'falls'} ${jump.toFixed(1)}× at ${((r.strain - toe) * 100).toFixed(2)} % strain (sample ${r.index})`;
  if (r.step === null) return `${where}: a change of the test rate or of the logging rate, too near the end of the uniform part to measure its effect on the flow stress; the flow curve is used as recorded`;
  const size = `${r.step >= 0 ? '+' : '−'}${Math.abs(r.step).toFixed(1)} MPa, 95 % ±${r.stepHalfWidth95!.toFixed(1)} MPa`;
  if (against) return `${where} and the flow stress steps ${r.step >= 0 ? 'up' : 'down'} there (${size}), against the change of rate: the flow stress of metals at room temperature rises with the rate, so this is read as the noise or the laws' misfit, not taken out; the flow curve is used as recorded`;
  if (r.flowCurveFactor === null) return `${where} with no step in the flow stress to take out (${size}; one is taken out when at least ${RATE_CHANGE.clearWidths} times its 95 % half-width and ${RATE_CHANGE.minStep * 100} % of the flow stress): a change of the logging rate, or of the test rate with too small an effect to measure here; the flow curve is used as recorded`;
  const pct = (r.step / r.stressBefore) * 100;
  return `${where} and the flow stress steps ${r.step >= 0 ? 'up' : 'down'} there by ${Math.abs(r.step).toFixed(1)} MPa (${Math.abs(pct).toFixed(1)} %, 95 % ±${r.stepHalfWidth95!.toFixed(1)} MPa): the test rate was ${faster ? 'raised (ISO 6892-1 method A allows a higher rate after yield, from memory)' : 'lowered'} and the flow stress followed it` +
    (r.sensitivity !== null ? ` (a rate sensitivity m ≈ ${r.sensitivity.toFixed(3)} if the samples are uniform in time)` : '') +
    `. Rm, Ag and A are read as recorded, at the later rate; the n-value and the hardening laws are fitted to the flow curve with its part after the change scaled by ${r.flowCurveFactor.toFixed(4)} to the first rate${faster ? ' (the lower level: the strength a slow test would find after forming)' : ''}. Forming runs faster than either rate: its flow stress and the pass loads are higher by about (forming rate / test rate)^m`;
}

/** A sample below this fraction of the highest stress, before the first or after the last above it, is of an unloaded specimen (the record's noise leaves those runs out). */
const LOADED = 0.05;

/** True when no stress after index `from` reaches `level` (an unloading that is never reloaded). */
function neverReloaded(stress: ArrayLike<number>, from: number, level: number): boolean {
  for (let i = from + 1; i < stress.length; i++) if (stress[i]! >= level) return false;
  return true;
}

/** Keeps the indices i of `moves` where the stress moved by more than `min` from sample i − 1 (in place). */
function compactMoves(moves: number[], stress: ArrayLike<number>, min: number): void {
  let k = 0;
  for (const i of moves) if (Math.abs(stress[i]! - stress[i - 1]!) > min) moves[k++] = i;
  moves.length = k;
}

/** Throws the InputError of finiteArgMax for index i (strain before stress). */
function notFinite(strain: ArrayLike<number>, stress: ArrayLike<number>, i: number): never {
  const e = strain[i]!, s = stress[i]!;
  if (!Number.isFinite(e)) throw new InputError(`strain[${i}]`, e, 'a finite number');
  throw new InputError(`stress[${i}]`, s, 'a finite number');
}

/**
 * Fracture: the first i ≥ iRaw after which the stress falls by more than fractureDrop or below
 * fractureFloor·sMax, then moved back to where that fall began: a fast-sampled record catches the load on its
 * way down over a few samples, each step far larger than the necking's and the noise's (> max(6σ̂, 3 % of
 * the stress)); the specimen broke at the first of them, not at the one where the fall passes 50 %.
 * With the strain given, a step counts as part of the fall only where the strain hardly moved while the load fell
 * (less than Δs/(FALL_SLOPE·E)): a breaking specimen sheds its load at about constant gauge strain (the load path
 * of an unloading is the elastic slope E, far steeper than any necking), while on a coarse record (tens of points, a
 * curve read off a chart) each necking step also falls by more than 3 % but over a percent of strain or more; walked
 * back through them, A had read 8 points short on such a curve. A step whose strain moves by more than three times the
 * record's usual step (the median of the ten before the top) still counts: a crack opening inside the gauge length
 * reads as strain while the load falls. −1 if none.
 */
function firstFall(stress: ArrayLike<number>, iRaw: number, sMax: number, noise: number, strain?: ArrayLike<number>, E = 0): number {
  const keep = 1 - ANALYZE_DEFAULTS.fractureDrop, floor = ANALYZE_DEFAULTS.fractureFloor * sMax;
  for (let i = iRaw; i < stress.length - 1; i++) {
    if (stress[i + 1]! < keep * stress[i]! || stress[i + 1]! < floor) return fallStart(stress, i, iRaw, noise, strain, E);
  }
  return -1;
}

/**
 * Where the fall of load that sample i is part of began: walked back from i through the steps that belong to a
 * fracture fall (firstFall's rule: each more than max(6σ̂, 3 %) of the stress and, with the strain given, shedding
 * load at ≥ FALL_SLOPE·E per unit strain unless the strain jumps far beyond its usual step), not past iRaw.
 */
function fallStart(stress: ArrayLike<number>, i: number, iRaw: number, noise: number, strain?: ArrayLike<number>, E = 0): number {
  const minSlope = strain && E > 0 ? FALL_SLOPE * E : 0;
  let usual = -1; // the record's usual strain step before the top, found when first needed
  while (i > iRaw) {
    const drop = stress[i - 1]! - stress[i]!;
    if (!(drop > Math.max(6 * noise, 0.03 * stress[i - 1]!))) break;
    const de = minSlope > 0 ? strain![i]! - strain![i - 1]! : 0;
    if (de >= drop / minSlope) {
      // The strain moved on while the load fell, by a usual step (necking on a coarse record): not the fall. A
      // step far larger than usual is a crack opening inside the gauge as the load falls: part of the fall.
      if (usual < 0) usual = usualStrainStep(strain!, iRaw);
      if (de <= FALL_STEP_FACTOR * usual) break;
    }
    i--;
  }
  return i;
}

/**
 * A step of a fracture fall sheds load at least this multiple of E per unit strain (firstFall): a breaking specimen
 * sheds it at about constant gauge strain or unloads along E. ¼ let the steep final necking of sparsely sampled
 * records (steps over 3 % at about ⅓ E: hold-out B 5000, 5144) pass as fall, reading A 0.15 point low.
 */
const FALL_SLOPE = 1;
/** A strain step this many times the usual one, during a fall of load, is a crack opening (firstFall). */
const FALL_STEP_FACTOR = 3;

/**
 * Median of the strain steps |e[i] − e[i−1]| over the ten samples up to `at` (the usual step of the record there). It
 * is 0 on a fast record whose strain channel is coarser than one sample's stretch; every moving step then counts as
 * far beyond it, which only matters for a step already too flat to be a fall, and on a fast record only a crack
 * opening is that (necking never falls 3 % a sample there).
 */
function usualStrainStep(strain: ArrayLike<number>, at: number): number {
  const steps: number[] = [];
  for (let i = Math.max(1, at - 9); i <= at; i++) steps.push(Math.abs(strain[i]! - strain[i - 1]!));
  steps.sort((a, b) => a - b);
  return steps.length ? steps[(steps.length - 1) >> 1]! : 0;
}

/**
 * True strain, true stress and true plastic strain of samples 0…iMax (toe-compensated, e > −1 only):
 * ε = ln(1 + e), σ = s(1 + e), εp = ε − σ/E (Dowling, *Mechanical Behavior of Materials*, §4.5).
 */
function trueCurveTo(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, E: number, iMax: number): TensileAnalysis['trueCurve'] {
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
  return { strain: tStrain, stress: tStress, plasticStrain: tPlastic };
}

/**
 * The force past a strain channel's end: the top of the whole record's stress on the sample axis (samples are
 * uniform in time, so this is force against time, whose maximum is Fm; ISO 6892-1 §3.10.1 needs no strain for
 * it) from `from` to the fracture after the highest stress, by the same top model as against strain
 * ({@link forceMaximum}), and that fracture (index in the whole record).
 */
function forceAfterEnd(tail: ForceTail, from: number, noise: number): { top: ReturnType<typeof forceMaximum>; fracture: TensileAnalysis['fracture'] } {
  const S = tail.stress, NT = S.length;
  let iTop = from, top = S[from]!;
  for (let i = from + 1; i < NT; i++) if (S[i]! > top) { top = S[i]!; iTop = i; }
  const fall = firstFall(S, iTop, top, noise);
  const fi = fall >= 0 ? fall : NT - 1;
  const axis = new Float64Array(fi + 1);
  for (let i = 0; i <= fi; i++) axis[i] = i;
  const t = forceMaximum(axis, S, noise, Math.min(from, Math.max(0, fi - 2)), fi + 1);
  const necked = fall < 0 && S[NT - 1]! < 0.9 * t.stress;
  return {
    top: t,
    fracture: {
      index: fi,
      detected: fall >= 0 || necked,
      method: `${fractureMethod(fall >= 0, necked)}; read in the force, which goes on past the strain channel's end (the index is the whole record's)`,
    },
  };
}

/** The longest parallel length accepted, as a multiple of the gauge length (ISO 6892-1 specimens: Lc ≈ L0 + d0/2 to L0 + 2b0; common practice). */
const MAX_PARALLEL_RATIO = 10;

/**
 * Spreads the plastic part of a strain from the machine's travel (compliance already taken out) over the specimen's
 * parallel length Lc instead of the gauge length L0 it was divided by:
 *   e' = s/E + (e − s/E)·r,   r = L0/Lc   (0 < r ≤ 1),
 * so that up to maximum force — where the reduced section deforms uniformly along Lc — e' is the strain of the
 * parallel length (Ag, the flow curve, Rp). After maximum force the extension goes into the neck, which lies inside
 * L0, so A over L0 is Ag' + (A' − Ag')/r with A', Ag' read from e' (analyzeRecord does that). The basis: the
 * parallel length is the part of the specimen that deforms (ISO 6892-1 §3.2 defines Lc; using it for crosshead
 * elongation is common practice, from memory); the fillets' small plastic share is not counted. Units: strain
 * fraction, stress and E MPa. Valid for a specimen whose parallel length is uniform and whose neck forms inside L0.
 * On the ten open 42CrMoS4 records (L0 25 mm, Lc 30 mm) read through their machine travel: Ag within 0.4 point and A
 * within 0.3 point of their extensometer's (0.6–0.9 and 0.9–1.2 point high without it;
 * test/core/tensile/machine-compliance.test.ts).
 * @example spreadOverParallelLength([0.001, 0.06], [200, 500], 200000, 25 / 30) // [0.001, 0.0504…]
 */
export function spreadOverParallelLength(strain: ArrayLike<number>, stress: ArrayLike<number>, modulus: number, ratio: number): Float64Array {
  if (!(modulus > 0 && Number.isFinite(modulus))) throw new InputError('elasticModulus', modulus, 'a modulus > 0 MPa');
  if (!(ratio > 0 && ratio <= 1)) throw new InputError('ratio', ratio, 'a ratio L0/Lc in (0, 1]');
  const out = new Float64Array(strain.length);
  for (let i = 0; i < out.length; i++) {
    const el = stress[i]! / modulus;
    out[i] = el + (strain[i]! - el) * ratio;
  }
  return out;
}

/**
 * Takes the compliance of the machine and grips out of a strain computed from the machine's travel (crosshead,
 * stroke) over the gauge length: the travel is the specimen's extension plus that of the machine, the load train
 * and the grips, which act as a linear spring in series with it (common practice; the usual correction of crosshead
 * data, from memory), so
 *   e_specimen = e − s·c,   c = 1/E_apparent − 1/E   (1/MPa),
 * with E_apparent the slope of the record's elastic band and E the specimen's modulus (given: from an extensometer
 * test, a handbook or a certificate). Returns the corrected strain (a new array) and c, or null when E_apparent is not
 * below E (no compliance to take out). Valid while the load train stays elastic and its slope does not change with
 * the load (grips seating in the first part of the rise do not obey it). Units: strain fraction, stress and moduli MPa.
 * On the ten open 42CrMoS4 records with the machine's travel as the strain and the producers' E given, Rp0.2 comes
 * within −1.5 % to +0.2 % of the producers' (7–23 % low with the travel read as it is;
 * test/core/tensile/machine-compliance.test.ts).
 * @example removeMachineCompliance([0, 0.01, 0.02], [0, 350, 700], 35000, 200000)!.compliance // 1/35000 − 1/200000 ≈ 2.36e-5
 */
export function removeMachineCompliance(strain: ArrayLike<number>, stress: ArrayLike<number>, apparentModulus: number, modulus: number): { strain: Float64Array; compliance: number } | null {
  if (!(apparentModulus > 0 && modulus > 0 && apparentModulus < modulus)) return null;
  const c = 1 / apparentModulus - 1 / modulus;
  const out = new Float64Array(strain.length);
  for (let i = 0; i < out.length; i++) out[i] = strain[i]! - stress[i]! * c;
  return { strain: out, compliance: c };
}
