import { InputError } from '../errors.js';
import { lawTopPlasticStrain } from './lawTop.js';
import { makeLaw } from '../flow/makeLaw.js';
import type { LawSpec } from '../flow/types.js';
import { chordModulus, type ModulusDecay } from '../material/modulus.js';
import type { Rng } from '../scatter/rng.js';

/** What {@link synthesizeRecord} makes: an invented tensile record from a known law. */
export interface SynthSpec {
  law: LawSpec;
  /** Young's modulus, MPa. */
  elasticModulus: number;
  /** Seeded generator (noise only). */
  rng: Rng;
  /** Step of total strain between samples (fraction); default 2e-4. */
  step?: number;
  /** Standard deviation of Gaussian noise on the stress, MPa; default 0. */
  noise?: number;
  /** Slack at the start: the first 2·toe of strain rise quadratically to the elastic line, which is shifted by toe. */
  toe?: number;
  /** Discontinuous yielding: ReH = upperRatio·σ(lüdersStrain), then a plateau at σ(lüdersStrain) up to that plastic strain. */
  yieldPoint?: { upperRatio: number; luedersStrain: number };
  /** For laws with σ(0) = 0 (Hollomon): plastic strain where the elastic line meets the law (default 0.001). */
  startStrain?: number;
  /** Unload–reload cycles starting at these true plastic strains, down to `unloadTo`·σ, with the chord modulus falling by `decay`. */
  cycles?: { plasticStrains: number[]; unloadTo: number; decay?: ModulusDecay };
  /** After maximum force: engineering strain added while the stress falls to `dropTo`·Rm, then fracture (a fall to 0). */
  necking?: { extraStrain: number; dropTo: number };
}

export interface SynthRecord {
  /** Engineering strain (fraction) and stress (MPa), as a test machine would record them. */
  strain: number[];
  stress: number[];
  /** The known truth: Rm (MPa), Ag and A (%), Considère true plastic strain, lower yield. */
  truth: { tensileStrength: number; uniformElongationPct: number; totalElongationPct: number; uniformStrain: number; lowerYield: number | null; upperYield: number | null; chordModuli: number[] };
}

/**
 * An invented tensile record from a known law, for round-trip tests, benchmarks and demo files.
 *
 * True plastic strain εp runs from the start of yielding to the Considère strain εu of the law (Considère,
 * via Dieter, *Mechanical Metallurgy*, §8-3) in steps of `step`; true stress σ = law(εp), total true strain
 * ε = εp + σ/E, engineering e = exp(ε) − 1 and s = σ/(1+e) (Dowling §4.5). Before yielding the record is
 * elastic s = E·e; a toe, a yield-point plateau, unload–reload cycles on the chord modulus, a falling
 * branch after Rm and Gaussian noise (Box–Muller on the seeded `rng`) are optional.
 * Units: MPa, strain fraction. Valid: a law with a Considère strain below 1.
 * @example synthesizeRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.2 }, elasticModulus: 200000, rng: xoshiro128ss(1) }).truth.uniformStrain // 0.19
 */
export function synthesizeRecord(spec: SynthSpec): SynthRecord {
  const law = makeLaw(spec.law, 'law');
  const E = spec.elasticModulus;
  const h = spec.step ?? 2e-4;
  if (!(h > 0 && h < 0.01)) throw new InputError('step', h, 'a strain step in (0, 0.01)');
  const eu = law.uniformStrain();
  if (!(eu > 0 && eu < 1)) throw new InputError('law', spec.law, 'a law whose Considère strain is in (0, 1)');
  const noise = spec.noise ?? 0;
  let spare: number | null = null;
  const gauss = () => {
    if (spare !== null) { const s = spare; spare = null; return s; }
    const u = Math.max(spec.rng.nextFloat(), 1e-300), v = spec.rng.nextFloat();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
  const e: number[] = [], s: number[] = [];
  const push = (eng: number, st: number) => { e.push(eng); s.push(st); };
  // True (ε, σ) → engineering sample.
  const pushTrue = (eps: number, sig: number) => { const en = Math.expm1(eps); push(en, sig / (1 + en)); };
  const lued = spec.yieldPoint?.luedersStrain ?? 0;
  let ep0 = lued;
  if (law.stress(0) <= 0 && lued === 0) ep0 = spec.startStrain ?? 0.001;
  const sigY = law.stress(ep0);
  const reh = spec.yieldPoint ? spec.yieldPoint.upperRatio * sigY : null;
  // Elastic line (at least 40 samples, as test machines record it) to ReH, or for a law without an initial
  // yield stress to 0.95·σ(ε0), then a rising microplastic segment to σ(ε0) (no plateau, no drop).
  const micro = !spec.yieldPoint && ep0 > 0;
  const top = reh ?? (micro ? 0.95 * sigY : sigY);
  const he = Math.min(h, top / E / 40);
  for (let eps = 0; eps < top / E; eps += he) pushTrue(eps, E * eps);
  pushTrue(top / E, top);
  // Plateau (Lüders) at σ(εL), or the microplastic segment.
  for (let ep = h; ep < ep0; ep += h) {
    const sg = micro ? sigY * (0.95 + (0.05 * ep) / ep0) : sigY;
    pushTrue(ep + sg / E, sg);
  }
  const chord: number[] = [];
  const cyc = [...(spec.cycles?.plasticStrains ?? [])].sort((a, b) => a - b);
  let ci = 0;
  for (let ep = ep0; ep <= eu + 1e-12; ep += h) {
    const sig = law.stress(ep);
    pushTrue(ep + sig / E, sig);
    if (ci < cyc.length && ep >= cyc[ci]!) {
      ci++;
      const Eu = chordModulus(E, spec.cycles!.decay, ep);
      chord.push(Eu);
      const low = spec.cycles!.unloadTo * sig;
      const k = Math.max(5, Math.ceil((sig - low) / Eu / h));
      const epsU = ep + sig / E;
      for (let j = 1; j <= k; j++) { const sj = sig - ((sig - low) * j) / k; pushTrue(epsU - (sig - sj) / Eu, sj); }
      for (let j = k - 1; j >= 1; j--) { const sj = sig - ((sig - low) * j) / k; pushTrue(epsU - (sig - sj) / Eu, sj); }
    }
  }
  let iMax = 0;
  for (let i = 1; i < s.length; i++) if (s[i]! > s[iMax]!) iMax = i;
  const Rm = s[iMax]!;
  const eM = e[iMax]!;
  let eF = e[e.length - 1]!, sF = s[s.length - 1]!;
  if (spec.necking) {
    const { extraStrain, dropTo } = spec.necking;
    const eLast = e[e.length - 1]!, sLast = s[s.length - 1]!;
    const k = Math.max(3, Math.round(extraStrain / h));
    for (let j = 1; j <= k; j++) {
      const t = j / k;
      push(eLast + t * extraStrain, sLast + (dropTo * Rm - sLast) * t * t);
    }
    eF = e[e.length - 1]!;
    sF = s[s.length - 1]!;
    push(eF + h / 4, 0.001 * Rm);
  }
  // Toe and noise.
  const toe = spec.toe ?? 0;
  const outE: number[] = [], outS: number[] = [];
  if (toe > 0) for (let x = 0; x < 2 * toe; x += h) { outE.push(x); outS.push((E * x * x) / (4 * toe)); }
  const first = toe > 0 ? e.findIndex((x) => x + toe >= 2 * toe) : 0;
  for (let i = Math.max(0, first); i < e.length; i++) {
    outE.push(e[i]! + toe);
    outS.push(s[i]! + (noise > 0 ? noise * gauss() : 0));
  }
  // The truth's maximum force: where the law's engineering stress stops rising (σ'·(1 − σ/E) = σ, lawTop.ts), not
  // the highest sample (2e-4 strain apart, up to 0.02 point of Ag away); the sampled top where that root is not on
  // the hardening curve (a law whose maximum the yield point outranks).
  const epTop = lawTopPlasticStrain(law, E);
  let RmT = Rm, agT = (eM - Rm / E) * 100;
  if (epTop !== null && epTop >= ep0 && epTop <= eu && law.stress(epTop) / Math.exp(epTop + law.stress(epTop) / E) >= Rm) {
    const sig = law.stress(epTop), en = Math.expm1(epTop + sig / E);
    RmT = sig / (1 + en);
    agT = (en - RmT / E) * 100;
  }
  return {
    strain: outE,
    stress: outS,
    truth: {
      tensileStrength: RmT,
      uniformElongationPct: agT,
      totalElongationPct: spec.necking ? (eF - sF / E) * 100 : (e[e.length - 1]! - s[s.length - 1]! / E) * 100,
      uniformStrain: eu,
      lowerYield: spec.yieldPoint ? sigY : null,
      upperYield: reh,
      chordModuli: chord,
    },
  };
}
