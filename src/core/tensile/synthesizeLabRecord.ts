import { InputError } from '../errors.js';
import { lawTopPlasticStrain } from './lawTop.js';
import { makeLaw } from '../flow/makeLaw.js';
import type { FlowLaw, LawSpec } from '../flow/types.js';
import type { Rng } from '../scatter/rng.js';

/** What {@link synthesizeLabRecord} makes: an invented record shaped like a testing machine's export. */
export interface LabRecordSpec {
  /** Hardening law, true stress on true plastic strain; needs σ(0) > 0 (an initial yield stress) and a Considère strain in (0, 1). */
  law: LawSpec;
  /** Young's modulus, MPa. */
  elasticModulus: number;
  /** Seeded generator (noise and nothing else). */
  rng: Rng;
  /** Number of samples, uniform in time at a constant extension rate (so uniform in strain); ≥ 200. */
  points: number;
  /** Standard deviation of white Gaussian noise on the stress, MPa (default 0). */
  noise?: number;
  /** Slack at the start, strain: the first 2·toe rise as E·x²/(4·toe), then the elastic line shifted by toe. */
  toe?: number;
  /**
   * Discontinuous yielding: the elastic line rises to ReH = (1 + drop)·ReL; the engineering stress falls
   * over `dropStrain` (default 2e-4) to the first trough ReL·(1 − `undershoot`) (default 0), comes back to
   * ReL over another `dropStrain` (this fall and first trough are the initial transient of ISO 6892-1), and
   * stays on a serrated plateau ReL + serration up to engineering strain eL, where work hardening starts on
   * the law. The serration rises from ReL by up to `serration`·ReL with period `serrationPeriod` strain
   * (default 0.002): `triangle` (rise and fall alike, default) or `sawtooth` (slow rise, sudden fall, as
   * serrated yielding records show, common practice). ReL = σ(εL)/(1 + eL), so the plateau's troughs meet
   * the hardening curve. A period shorter than the sample spacing is allowed (the samples then catch the
   * serration at scattered phases).
   */
  yieldDrop?: { drop: number; luedersStrain: number; serration?: number; serrationPeriod?: number; serrationShape?: 'triangle' | 'sawtooth'; dropStrain?: number; undershoot?: number };
  /** After maximum force: engineering strain added while the stress falls to `dropTo`·Rm, then fracture. Default { extraStrain: 0.4·eu, dropTo: 0.75 }. */
  necking?: { extraStrain: number; dropTo: number };
}

/** The known truth of a lab record (noise-free), engineering values. */
export interface LabRecordTruth {
  elasticModulus: number;
  /** Rp0.2 of the noise-free curve: the first crossing of the 0.2 % offset line (ISO 6892-1 construction, solved to 1e-9 strain; on a serrated plateau the first crossing, near a trough), MPa. */
  proofStrength: number;
  /** Rm: the highest engineering stress after work hardening begins (continuous curve), MPa. */
  tensileStrength: number;
  /** Ag: plastic extension at maximum force, %; Agt total, %. */
  uniformElongationPct: number;
  uniformTotalElongationPct: number;
  /** A: plastic elongation at the last sample before fracture, %. */
  totalElongationPct: number;
  /**
   * ReH: highest recorded noise-free sample at the yield drop (null also when no sample caught the peak,
   * `yieldDropRecorded` false). ReL (ISO 6892-1 §3.10.2.2: the lowest stress during plastic yielding, the
   * initial transient ignored): the lowest recorded noise-free sample on the plateau after the transient,
   * where the transient is the fall from ReH and the first trough after it (ISO 6892-1 practice, from memory:
   * the first minimum is ignored unless it is the only one). Ae: strain from ReH to the start of work
   * hardening (the last plateau trough meets the hardening curve at eL), %. Null for continuous yielding.
   */
  upperYield: number | null;
  lowerYield: number | null;
  yieldPointElongationPct: number | null;
  /** For a record made with a yield drop: whether the samples show it (see `upperYield`); null without a drop. */
  yieldDropRecorded: boolean | null;
  /** Samples in the elastic rise (below 0.9·Rp0.2 or ReH). */
  elasticPoints: number;
  /**
   * How clearly the samples show the drop: √Σ (sᵢ − ReL)² over the recorded noise-free samples of the elastic
   * rise above ReL, divided by the noise sd — the signal-to-noise ratio of the best test that knows the shape
   * (matched filter, common practice). Below about 5 no test that keeps continuous curves free of false yield
   * points can find the drop reliably. Null without a drop or without noise.
   */
  yieldDropEvidence: number | null;
}

export interface LabRecord {
  /** Engineering strain (fraction, as measured, with the toe) and engineering stress (MPa) with noise. */
  strain: Float64Array;
  stress: Float64Array;
  truth: LabRecordTruth;
}

/** True plastic strain at true strain ε on the law: solves εp + σ(εp)/E = ε (monotone, Newton with a bracket). */
function plasticAt(law: FlowLaw, E: number, eps: number, guess: number): number {
  let lo = 0, hi = Math.max(eps, 1e-12);
  let x = Math.min(Math.max(guess, lo), hi);
  for (let k = 0; k < 60; k++) {
    const f = x + law.stress(x) / E - eps;
    if (Math.abs(f) < 1e-15) return x;
    if (f > 0) hi = x; else lo = x;
    const d = 1 + law.slope(x) / E;
    let nx = x - f / d;
    if (!(nx > lo && nx < hi)) nx = 0.5 * (lo + hi);
    if (Math.abs(nx - x) < 1e-16) return nx;
    x = nx;
  }
  return x;
}

/**
 * An invented tensile record shaped like a testing machine's export, with its known truth, for property
 * tests, benchmarks and demo files (INVENTED data: no real material, no real test).
 *
 * Samples are uniform in time at a constant extension rate, so uniform in engineering strain from 0 to
 * fracture: the elastic rise holds only a few samples (about N·(Rp/E)/A). The noise-free curve is
 * s = E·e on the elastic line; on the law, the true plastic strain solves εp + σ(εp)/E = ln(1 + e) and
 * s = σ(εp)/(1 + e) (constant volume, Dowling, *Mechanical Behavior of Materials*, §4.5); past maximum
 * force (Considère, dσ/dεp = σ: Dieter, *Mechanical Metallurgy*, §8-3) the stress falls quadratically to
 * `dropTo`·Rm and then to about zero (three samples after fracture). Optional: a toe, a yield drop with
 * a serrated plateau, white Gaussian noise on the stress (Box–Muller on the seeded `rng`).
 * Units: MPa, strain fraction. Valid: laws with σ(0) > 0 and a Considère strain in (0, 1); 200 ≤ points ≤ 10⁷.
 * @throws InputError naming the field for a law without initial yield stress, too few points, or a bad drop.
 * @example synthesizeLabRecord({ law: { law: 'voce', sigma0: 250, Q: 200, b: 12 }, elasticModulus: 205000, rng: xoshiro128ss(1), points: 10000 }).truth.tensileStrength // ≈ 358.2 MPa
 */
export function synthesizeLabRecord(spec: LabRecordSpec): LabRecord {
  const law = makeLaw(spec.law, 'law');
  const E = spec.elasticModulus;
  if (!(E >= 1000 && E <= 1e6)) throw new InputError('elasticModulus', E, 'a modulus in [1000, 1e6] MPa');
  const N = spec.points;
  if (!(Number.isInteger(N) && N >= 200 && N <= 1e7)) throw new InputError('points', N, 'an integer in [200, 1e7]');
  if (!(law.stress(0) > 0)) throw new InputError('law', spec.law, 'a law with an initial yield stress σ(0) > 0');
  const eu = law.uniformStrain();
  if (!(eu > 0 && eu < 1)) throw new InputError('law', spec.law, 'a law whose Considère strain is in (0, 1)');
  const noise = spec.noise ?? 0;
  const toe = spec.toe ?? 0;
  const yd = spec.yieldDrop;
  if (yd && !(yd.drop > 0 && yd.drop < 0.5 && yd.luedersStrain > 0 && yd.luedersStrain < 0.2)) throw new InputError('yieldDrop', yd, 'drop in (0, 0.5) and luedersStrain in (0, 0.2)');
  if (yd && !((yd.serration ?? 0) >= 0 && (yd.serration ?? 0) < 0.2 && (yd.undershoot ?? 0) >= 0 && (yd.undershoot ?? 0) < 0.2 && (yd.serrationPeriod ?? 0.002) > 0)) throw new InputError('yieldDrop', yd, 'serration and undershoot in [0, 0.2), serrationPeriod > 0');
  // Hardening starts at true plastic strain εL (0 without a yield drop).
  const epL = yd ? yd.luedersStrain : 0;
  const sigL = law.stress(epL);
  const eL = Math.expm1(epL + sigL / E);
  const reL = sigL / (1 + eL);
  const reH = yd ? (1 + yd.drop) * reL : null;
  const dropStrain = yd?.dropStrain ?? 2e-4;
  const serr = (yd?.serration ?? 0) * reL;
  const period = yd?.serrationPeriod ?? 0.002;
  const saw = yd?.serrationShape === 'sawtooth';
  const trough = reL * (1 - (yd?.undershoot ?? 0));
  const eH = reH !== null ? reH / E : sigL / E; // end of the elastic line
  const eUeng = Math.expm1(eu + law.stress(eu) / E);
  const Rm = law.stress(eu) / (1 + eUeng);
  // The truth's maximum force: where the engineering stress s = σ·exp(−εp − σ/E) stops rising, σ'·(1 − σ/E) = σ,
  // a little before the rigid-plastic Considère strain eu (σ' = σ) at which the curve's necking begins (lawTop.ts). Read at
  // eu instead, Ag was 0.03–0.17 point late on the property test's curves (the curve itself is unchanged).
  const euTop = Math.min(eu, Math.max(epL, lawTopPlasticStrain(law, E) ?? eu));
  const eTop = Math.expm1(euTop + law.stress(euTop) / E);
  const RmTop = law.stress(euTop) / (1 + eTop);
  const neck = spec.necking ?? { extraStrain: 0.4 * eu, dropTo: 0.75 };
  if (!(neck.extraStrain > 0 && neck.dropTo > 0 && neck.dropTo < 1)) throw new InputError('necking', neck, 'extraStrain > 0 and dropTo in (0, 1)');
  const eF = eUeng + neck.extraStrain;

  let guess = 0;
  /** Noise-free engineering stress at engineering strain e (without the toe). */
  const curve = (e: number): number => {
    if (e <= eH) return E * e;
    if (reH !== null && e < eL) {
      if (e < eH + dropStrain) return reH - ((reH - trough) * (e - eH)) / dropStrain;
      if (e < eH + 2 * dropStrain) return trough + ((reL - trough) * (e - eH - dropStrain)) / dropStrain;
      const ph = ((e - eH - 2 * dropStrain) % period) / period;
      return reL + serr * (saw ? ph : ph < 0.5 ? 2 * ph : 2 - 2 * ph);
    }
    if (e <= eUeng) {
      const ep = plasticAt(law, E, Math.log1p(e), guess);
      guess = ep;
      return law.stress(ep) / (1 + e);
    }
    const sU = Rm;
    const t = (e - eUeng) / neck.extraStrain;
    return sU + (neck.dropTo * Rm - sU) * t * t;
  };

  // Samples: x_i = i·Δ, the last sample before fracture at exactly eF + toe, then 3 samples after fracture.
  const after = 3;
  const dx = (eF + toe) / (N - 1 - after);
  const strain = new Float64Array(N), stress = new Float64Array(N);
  let spare: number | null = null;
  const gauss = () => {
    if (spare !== null) { const s = spare; spare = null; return s; }
    const u = Math.max(spec.rng.nextFloat(), 1e-300), v = spec.rng.nextFloat();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
  let reHrec = -Infinity, reLrec = Infinity, elasticPoints = 0;
  let sFrac = 0;
  const iFrac = N - 1 - after;
  for (let i = 0; i < N; i++) {
    const x = i * dx;
    let s: number;
    if (i > iFrac) s = 0.002 * Rm;
    else if (toe > 0 && x < 2 * toe) s = (E * x * x) / (4 * toe);
    else s = curve(x - toe);
    const e = x - toe;
    if (reH !== null && e <= eH + dropStrain / 2 && e > 0.5 * eH) reHrec = Math.max(reHrec, s);
    if (reH !== null && e >= eH + 2 * dropStrain && e < eL) reLrec = Math.min(reLrec, s);
    if (i === iFrac) sFrac = s;
    strain[i] = x;
    stress[i] = s + (noise > 0 ? noise * gauss() : 0);
  }
  // Truth Rp0.2: first crossing of s(e) − E(e − 0.002) from above, by bisection on the noise-free curve.
  // On a serrated plateau g is not monotone: step at a sixteenth of the serration period (each step then lies on
  // one linear piece of the serration) so the bracket holds the first crossing, not any crossing.
  const g = (e: number) => curve(e) - E * (e - 0.002);
  const step = reH !== null && serr > 0 ? Math.min(0.002, period / 16, dropStrain / 4) : 0.002;
  let a = eH, b = eH + step;
  while (g(b) > 0) { a = b; b += step; }
  for (let k = 0; k < 100 && b - a > 1e-12; k++) { const m = 0.5 * (a + b); if (g(m) > 0) a = m; else b = m; }
  // The stress where the offset line meets the curve: read on the line (equal to the curve at a continuous
  // crossing; at a sudden serration fall the curve is vertical and the line gives the meeting point).
  const rp = E * (0.5 * (a + b) - 0.002);
  const yieldTop = reH ?? rp;
  // A drop is in the record only when a sample caught the peak at least half-way up the drop (with coarse
  // sampling the last elastic sample can sit below the plateau: no machine could show that drop).
  const recorded = reH !== null && reHrec > reLrec + 0.5 * (reH - reL);
  let ev = 0;
  for (let i = 0; i < N; i++) {
    const e = strain[i]! - toe;
    if (e > 0 && e * E < 0.9 * yieldTop) elasticPoints++;
    if (reH !== null && e > 0 && e <= eH + dropStrain) { const s = curve(e) - reL; if (s > 0) ev += s * s; }
  }
  return {
    strain, stress,
    truth: {
      elasticModulus: E,
      proofStrength: rp,
      tensileStrength: RmTop,
      uniformElongationPct: (eTop - RmTop / E) * 100,
      uniformTotalElongationPct: eTop * 100,
      totalElongationPct: (eF - sFrac / E) * 100,
      upperYield: recorded ? reHrec : null,
      lowerYield: recorded ? reLrec : null,
      yieldPointElongationPct: recorded ? (eL - eH) * 100 : null,
      yieldDropRecorded: reH === null ? null : recorded,
      elasticPoints,
      yieldDropEvidence: reH !== null && noise > 0 ? Math.sqrt(ev) / noise : null,
    },
  };
}

