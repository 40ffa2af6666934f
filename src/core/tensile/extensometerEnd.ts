/** Where a record's strain channel stops following the specimen while the force goes on. */
export interface ExtensometerEnd {
  /** First sample whose strain is not the specimen's: the strain is read on samples 0 … index − 1 only. */
  index: number;
  /**
   * 'held': the channel keeps one value (an extensometer taken off whose last reading the machine holds, or one at
   * the end of its range), exactly or within its noise, while the force changes; 'reset': it falls back by more than elastic recovery allows (to
   * zero, or to a new origin); 'jump': it rises in one sample by far more than its steps around it (the machine
   * switched the strain to another source, such as the crosshead, when the extensometer came off).
   */
  kind: 'held' | 'reset' | 'jump';
  /** Engineering strain of the last sample read (index − 1), as recorded (toe not removed). */
  strain: number;
  /** Samples after the end in which the force was still recorded (to the end of the record). */
  samplesAfter: number;
}

/** Limits of {@link extensometerEnd}, stated once. */
export const EXTENSOMETER_END = {
  /** Lowest Young's modulus of a metal, MPa (magnesium alloys ≈ 45 GPa, common practice): the most strain an unloading can give back is Δs/E_LOW. */
  lowestModulus: 40000,
  /** A fall of strain larger than the elastic recovery by more than this (0.2 % strain) is a reset. */
  resetMargin: 0.002,
  /** The force must still carry at least this fraction of the highest stress (a fall to below it is fracture, not the channel). */
  carrying: 0.1,
  /** Fewest samples of a held value before the force falls. */
  heldSamples: 5,
  /** A held value is the channel's end only if the stress moves by more than max(this fraction of the highest stress, 8 noise sd) while it is held. */
  heldStressChange: 0.02,
  /** Two strain readings closer than this are the same held value (far below any extensometer's resolution). */
  sameValue: 1e-9,
  /** A rise of strain in one sample of more than this (0.5 % strain) and jumpRatio times the steps around it is a jump. */
  jumpMin: 0.005,
  jumpRatio: 20,
  /** Highest Young's modulus of a metal, MPa (common practice: about 450 GPa at most): the least strain a change of force Δs can move a working channel by is Δs/E_HIGH. */
  highestModulus: 450000,
  /** Fewest samples of a channel held within its noise (a noisy held run) before the force falls. */
  noisyHeldSamples: 10,
  /** Window lengths of the noisy held test, in turn: the samples themselves, then means of 4, 16 and 64 (noise ÷2, ÷4, ÷8). */
  noisyHeldMeans: [1, 4, 16, 64],
  /** Samples before fracture whose second differences give the strain channel's noise. */
  noiseSamples: 200,
} as const;

/**
 * Finds where the strain channel of a tensile record stops following the specimen while the force goes on:
 * an extensometer taken off before fracture (common practice for specimens whose fracture would damage it; the
 * machine holds its last reading, writes zero, or leaves the cells empty — the readers hold an empty cell's last
 * value), or one that runs out of range. Properties that need strain (Ag, A) cannot be read past that point;
 * those that need only force (Rm, the highest force over the original section, ISO 6892-1 §3.10.1) can.
 *
 * Three signatures, physically impossible for the specimen itself:
 * - reset: at sample i the strain falls by more than the elastic recovery any metal allows,
 *   e[i−1] − e[i] > resetMargin + max(0, s[i−1] − s[i])/E_LOW (E_LOW = 40 GPa), while the force still carries
 *   (s[i] > 10 % of the highest stress and > half of s[i−1]: not fracture). Unloading gives back Δs/E ≤ Δs/E_LOW.
 * - jump: at sample i the strain rises by more than 0.5 % and 20 times the median step of the 25 samples on each
 *   side (the larger median: a change of test rate keeps its larger steps), the force carrying on both sides — the
 *   machine switched the strain to another source (common practice: the crosshead, once the extensometer is off);
 * - held: from sample c the strain keeps one value (within 1e-9) to the end of the record, to a reset, or to
 *   fracture (the stress below 10 % of the highest), and over the held samples before the force falls (at least
 *   5) the stress changes by more than max(2 % of the highest stress, 8σ̂). A working extensometer on a specimen
 *   whose force changes by that much moves (elastically by Δs/E at least); a resolution step of a coarse channel
 *   is held for a few samples in the elastic rise only, and the channel then moves again.
 * - held within its noise: the exact test finds nothing, yet over the last samples before fracture (or before a
 *   reset, or to the end) the strain stays within max(8σ̂ₑ, Δs/(2·E_HIGH)) while the force changes by Δs, with
 *   Δs > max(2 % of the highest stress, 8σ̂) and Δs/(2·E_HIGH) above both that strain range and 8σ̂ₑ, over at least 10
 *   samples (σ̂ₑ: the strain channel's noise from the median second difference of the last 200 samples before
 *   fracture, MAD-scaled; E_HIGH = 450 GPa). A working extensometer moves by at least Δs/E_HIGH for a change of force
 *   Δs: elastically (loading or unloading) or more (plastic flow, necking); a channel that only wanders within its
 *   noise (and a slow drift) while the force changes by that much has come off (an extensometer taken off whose
 *   electronics keep reading). Walked back from the last loaded sample while the strain stays within that bound.
 *   Sample by sample first; where the channel is too noisy for that (8σ̂ₑ above the bound), on the means of 4, 16 and
 *   64 consecutive samples in turn (noise σ̂ₑ/√m for white noise, floor 8σ̂ₑ/√m; the run then starts up to about m
 *   samples early). On the open 42CrMoS4 records held after maximum force this finds channels 2–10 × 1e-4 peak to
 *   peak that the samples alone did not, and never fires on the ten records with that much noise added to a channel
 *   that follows the specimen (test/core/tensile/noisy-held.test.ts).
 * - on a coarse channel (`resolution` q > 0: the strain written in steps of q, {@link strainSteps}) both held tests
 *   also need Δs/(2·E_HIGH) > q: a working channel holds each reading until the specimen has moved by a step, over
 *   the last samples of necking too (steps of 1e-4 held 13 samples there on an invented record and read as the
 *   extensometer taken off).
 * Cost: O(N), one pass; with `moves`
 * (every index i, ascending, where |e[i] − e[i−1]| passes a limit no larger than resetMargin: a superset of the
 * resets and jumps) only those and the held run's length.
 * Units: strain fraction, stress and σ̂ (`noise`) MPa. Valid: finite arrays of one length, sMax > 0.
 * @example extensometerEnd([0, 0.001, 0.002, 0.003, 0.004, 0.004, 0.004, 0.004, 0.004, 0.004], [0, 200, 300, 350, 380, 390, 400, 405, 402, 0], 405, 1)
 *   // { index: 5, kind: 'held', strain: 0.004, samplesAfter: 5 }
 */
export function extensometerEnd(strain: ArrayLike<number>, stress: ArrayLike<number>, sMax: number, noise: number, moves?: readonly number[], resolution = 0): ExtensometerEnd | null {
  const N = strain.length;
  const L = EXTENSOMETER_END;
  const carrying = L.carrying * sMax;
  const heldChange = Math.max(L.heldStressChange * sMax, 8 * noise);
  // First reset or jump, if any (a held run must end before or at it). `moves` (the samples where the strain moved
  // by more than a limit, found by a pass the caller makes anyway) spares a pass of its own: on a
  // 1,000,000-row record that pass cost 6 ms cold, the test inside the caller's pass under 1 ms (measured).
  let reset = -1;
  const margin = L.resetMargin, lowE = L.lowestModulus;
  const event = (i: number): boolean => {
    const d = strain[i - 1]! - strain[i]!;
    return d > margin ? isReset(d, stress[i]!, stress[i - 1]!, carrying, margin, lowE) : -d > L.jumpMin && isJump(strain, stress, i, carrying);
  };
  if (moves) {
    for (const i of moves) if (event(i)) { reset = i; break; }
  } else {
    for (let i = 1; i < N; i++) {
      const d = strain[i - 1]! - strain[i]!;
      if ((d > margin || -d > L.jumpMin) && event(i)) { reset = i; break; }
    }
  }
  const stop = reset >= 0 ? reset : N;
  // The held run that reaches `stop`: walk back from stop − 1 over samples equal to the last strain read.
  let c = stop - 1;
  const v = strain[c]!;
  while (c > 0 && Math.abs(strain[c - 1]! - v) <= L.sameValue) c--;
  // A run that ends in fracture: the force falls below `carrying` inside it (samples at about zero load after
  // fracture may also hold the strain); the run's span before that fall is what counts.
  if (stop - c >= L.heldSamples + 1 && stress[c]! > carrying) {
    let lo = stress[c]!, hi = lo, k = c + 1, top = lo;
    for (; k < stop; k++) {
      const s = stress[k]!;
      // The fracture fall's steps (each a drop of more than max(6σ̂, 3 %) of the stress, noisyHeld's rule) are no
      // evidence either: the specimen breaks at about constant strain (a coarse channel's reading held through a
      // fall of 476 → 283 MPa had read as the channel ending, invented hold-out B records in steps of 1e-4).
      if (s < carrying || s < 0.5 * top || stress[k - 1]! - s > Math.max(6 * noise, 0.03 * stress[k - 1]!)) break;
      if (s > top) top = s;
      if (s < lo) lo = s; else if (s > hi) hi = s;
    }
    // The held reading at c is the channel's last true one; the force after it is not matched by strain.
    // On a coarse channel (steps of `resolution`) a working extensometer holds a reading until the specimen has moved
    // by a step: the change of force must move it by more than that (Δs/(2·E_HIGH), as for the noisy test below).
    if (k - c >= L.heldSamples && hi - lo > heldChange && (hi - lo) / (2 * L.highestModulus) > resolution) return { index: c + 1, kind: 'held', strain: v, samplesAfter: N - c - 1 };
  }
  const quiet = noisyHeld(strain, stress, stop, carrying, heldChange, noise, resolution);
  if (quiet >= 0) return { index: quiet + 1, kind: 'held', strain: strain[quiet]!, samplesAfter: N - quiet - 1 };
  if (reset >= 0) {
    // A reset or jump after a held run shorter than the rule (or none): the channel is read to the sample before it.
    return { index: reset, kind: strain[reset]! < strain[reset - 1]! ? 'reset' : 'jump', strain: strain[reset - 1]!, samplesAfter: N - reset };
  }
  return null;
}

/**
 * The jump test of {@link extensometerEnd} at sample i (the strain rose by more than jumpMin from i − 1): the rise
 * is more than jumpRatio times the median step of the 25 samples on each side (the larger of the two medians, so
 * a change of test rate, whose steps stay large after it, is no jump), and the force carries on both sides.
 */
function isJump(strain: ArrayLike<number>, stress: ArrayLike<number>, i: number, carrying: number): boolean {
  const N = strain.length;
  if (!(stress[i]! > carrying && stress[i]! > 0.5 * stress[i - 1]! && (i + 1 >= N || stress[i + 1]! > carrying))) return false;
  const steps = (a: number, b: number) => {
    const out: number[] = [];
    for (let k = Math.max(1, a); k < Math.min(N, b); k++) if (k !== i) out.push(Math.abs(strain[k]! - strain[k - 1]!));
    out.sort((x, y) => x - y);
    return out.length ? out[out.length >> 1]! : 0;
  };
  const typical = Math.max(steps(i - 25, i), steps(i + 1, i + 26));
  return strain[i]! - strain[i - 1]! > EXTENSOMETER_END.jumpRatio * typical;
}

/** The reset test of {@link extensometerEnd} for a strain fall `fall` from the sample with stress `sp` to the one with `s`. */
function isReset(fall: number, s: number, sp: number, carrying: number, margin: number, lowE: number): boolean {
  return s > carrying && s > 0.5 * sp && fall > margin + Math.max(0, sp - s) / lowE;
}

/**
 * The held-within-its-noise test of {@link extensometerEnd} on the samples before `stop` (a reset, or the record's
 * end): from the last sample still carrying (stress ≥ `carrying`; the samples after fracture and the steps of the
 * fracture fall, each over max(6σ̂, 3 %) of the stress with σ̂ = `noise`, are passed over),
 * walked back while the strain's range stays within max(8σ̂ₑ, Δs/(2·E_HIGH)), Δs the stress range walked so far.
 * Returns the first sample c of that run (the channel's last reading of the specimen) when its samples before the force
 * falls below half the run's highest (a fracture fall is no evidence: the specimen breaks at about constant strain)
 * are at least noisyHeldSamples, the force changed over them by more than `heldChange`, and Δs/(2·E_HIGH) exceeds
 * both the strain's range over them and 8σ̂ₑ (the stall stands clear of the noise); else −1.
 */
function noisyHeld(strain: ArrayLike<number>, stress: ArrayLike<number>, stop: number, carrying: number, heldChange: number, noise: number, resolution = 0): number {
  const L = EXTENSOMETER_END;
  let f = stop;
  while (f > 0 && !(stress[f - 1]! >= carrying)) f--;
  // Back over the fracture fall's steps too (each a drop of more than max(6σ̂, 3 %) of the stress, firstFall's size
  // rule): a sample caught on the way down had let a steadily advancing strain pass as held (hold-out B 5163).
  while (f > 1 && stress[f - 2]! - stress[f - 1]! > Math.max(6 * noise, 0.03 * stress[f - 2]!)) f--;
  if (f < L.noisyHeldSamples + 2) return -1;
  const sigmaE = strainNoise(strain, Math.max(0, f - L.noiseSamples), f);
  // Sample by sample first; then, for a channel too noisy for that (its 8σ̂ₑ above the stall's bound), on means of
  // `m` consecutive samples, whose noise is σ̂ₑ/√m for white noise (correlated noise leaves the means noisier than
  // that and the floor too low; the means' own range must still stay below Δs/(2·E_HIGH), which a channel that
  // follows the specimen cannot do).
  for (const m of L.noisyHeldMeans) {
    if (f < m * L.noisyHeldSamples + 2) break;
    // A coarse channel's step is a floor no mean lowers (a held reading is the same in every window).
    const c = heldRun(strain, stress, f, carrying, heldChange, Math.max((8 * sigmaE) / Math.sqrt(m), resolution), m);
    if (c >= 0) return c;
  }
  return -1;
}

/**
 * One pass of {@link noisyHeld} on the means of `m` consecutive strain samples (m = 1: the samples themselves):
 * walked back from the last window ending at f − 1 while the window means stay within max(floor, Δs/(2·E_HIGH)),
 * then the evidence over the run before the force falls to half its highest. Returns the run's first sample (for
 * m > 1 the run starts up to about m samples early: where the windows first mix in the advancing samples), or −1.
 */
function heldRun(strain: ArrayLike<number>, stress: ArrayLike<number>, f: number, carrying: number, heldChange: number, floor: number, m: number): number {
  const L = EXTENSOMETER_END;
  const perMPa = 1 / (2 * L.highestModulus);
  // Window k holds samples k … k + m − 1; its mean by a running sum (m = 1: the sample itself, no rounding).
  let sum = 0;
  for (let k = f - m; k < f; k++) sum += strain[k]!;
  const mean = (k: number) => (m === 1 ? strain[k]! : sum / m);
  let c = f - m;
  let lo = mean(c), hi = lo, slo = Infinity, shi = -Infinity;
  for (let k = c; k < f; k++) { const s = stress[k]!; if (s < slo) slo = s; if (s > shi) shi = s; }
  while (c > 0) {
    if (m > 1) sum += strain[c - 1]! - strain[c + m - 1]!;
    const e = mean(c - 1), s = stress[c - 1]!;
    const nlo = e < lo ? e : lo, nhi = e > hi ? e : hi, nslo = s < slo ? s : slo, nshi = s > shi ? s : shi;
    if (!(nhi - nlo <= Math.max(floor, (nshi - nslo) * perMPa)) || !(s >= carrying)) break;
    lo = nlo; hi = nhi; slo = nslo; shi = nshi;
    c--;
  }
  // The evidence is taken before the force falls to half the run's highest (a fracture fall, at about constant strain,
  // must not count), as the exact test takes it: the windows that end before that fall.
  let top = 0;
  for (let k = c; k < f; k++) if (stress[k]! > top) top = stress[k]!;
  let g = c, ylo = stress[c]!, yhi = ylo;
  for (; g < f && stress[g]! >= 0.5 * top; g++) {
    const s = stress[g]!;
    if (s < ylo) ylo = s; else if (s > yhi) yhi = s;
  }
  let elo = Infinity, ehi = -Infinity;
  if (m === 1) for (let k = c; k < g; k++) { const e = strain[k]!; if (e < elo) elo = e; if (e > ehi) ehi = e; }
  else {
    let w = 0;
    for (let k = c; k < c + m && k < f; k++) w += strain[k]!;
    for (let k = c; k + m <= g; k++) {
      const e = w / m;
      if (e < elo) elo = e; if (e > ehi) ehi = e;
      if (k + m < f) w += strain[k + m]! - strain[k]!;
    }
  }
  const ds = yhi - ylo, bound = ds * perMPa;
  return g - c >= Math.max(L.noisyHeldSamples, 2 * m) && ds > heldChange && bound > ehi - elo && bound > floor ? c : -1;
}

/**
 * Noise of a strain channel on samples [from, to): the median absolute second difference
 * |e[i+1] − 2e[i] + e[i−1]| over 1.4826·√6 (a MAD-scaled estimate of the sample noise σ that a straight or slowly
 * curving advance does not inflate; Gasser, Sroka & Jennen-Steinmetz, *Biometrika* 73 (1986) 625–633 — from memory).
 * 0 for fewer than 3 samples. Units: strain.
 */
function strainNoise(strain: ArrayLike<number>, from: number, to: number): number {
  const d: number[] = [];
  for (let i = from + 1; i < to - 1; i++) d.push(Math.abs(strain[i + 1]! - 2 * strain[i]! + strain[i - 1]!));
  if (!d.length) return 0;
  d.sort((a, b) => a - b);
  return (1.4826 * d[d.length >> 1]!) / Math.sqrt(6);
}
