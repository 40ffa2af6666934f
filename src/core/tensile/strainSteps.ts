/** Limits of {@link strainSteps} and {@link spreadStrainSteps}, stated once. */
export const STRAIN_STEPS = {
  /**
   * Two readings closer than this are one recorded value. Equal decimals in a file parse (and convert) to equal
   * numbers; this only absorbs a unit conversion's rounding (1e-12 strain is far below any channel's resolution).
   */
  same: 1e-12,
  /** The channel moves on a lattice when at least this share of its moves are whole multiples of the smallest. */
  lattice: 0.99,
  /** How close to a whole multiple of the step a move must be, in steps. */
  wholeTol: 0.01,
  /** Coarse: at least this share of the loaded samples repeat the reading before them (the strain is then read between its steps). */
  heldShare: 0.05,
  /**
   * Rounded: at least this share of the samples (or half the moves, if fewer) move by a whole multiple of the step
   * next to the one before them (held then stepped, one step then two): a regular channel that advances by the same
   * amount every sample is on a lattice of that amount too, but carries no rounding, nor does one that is later held.
   */
  turnShare: 0.05,
  /** Moves off the lattice tolerated before the share rule may stop the pass early (a few at the start, before the smallest step has come). */
  offSlack: 16,
  /** Fewest moves for a lattice to be told (fewer: not judged). */
  minMoves: 8,
  /**
   * A step that is not coarse still matters (is reported, and allowed for on the elastic rise) when its rounding
   * error on the rise, E·q/√12, exceeds this share of the load's noise.
   */
  materialShare: 0.5,
} as const;

/** A strain channel whose readings move in whole steps larger than its samples' advance ({@link strainSteps}). */
export interface StrainSteps {
  /** The channel's step (its resolution in this file), strain fraction. */
  step: number;
  /** Share of the samples examined that repeat the reading before them, 0–1. */
  heldShare: number;
  /** Mean number of samples a reading is held for, over the samples examined (1: every sample moves). */
  samplesPerReading: number;
  /** Mean number of samples a reading is held for on the rise (samples [from, riseTo)); 1 when none are given. */
  riseSamplesPerReading: number;
  /** Coarse: at least 5 % of the samples repeat the reading before them (the strain is then read between its steps, {@link spreadStrainSteps}). */
  coarse: boolean;
}

/**
 * The step a record's strain channel moves in (the resolution the file was written with), and whether it is coarse —
 * written with fewer digits than its samples' advance needs, so that it holds each reading for several samples and
 * then moves by one whole step.
 *
 * The channel moves in steps when, over samples [from, to), at least 99 % of its moves (changes of more than 1e-12)
 * are whole multiples (within 0.01 step) of the smallest move, which is then the step q; it is coarse when also at
 * least 5 % of the samples repeat the reading before them. Rounding must also show: at least 5 % of the samples (or
 * half the moves, if fewer) move by a multiple next to the one before them — held then stepped, one step then two. A
 * channel that advances by exactly one amount every sample, as a regular or noise-free one does, is on a lattice of
 * that amount but carries no rounding, nor does it when later held once (an extensometer taken off): neither is
 * reported. The
 * mean number of samples per reading is also counted
 * over [from, riseTo) (the rise), where the strain's rounding weighs most. A channel of continuous readings (a noisy fine one, one
 * computed from a load cell and a travel) moves by arbitrary amounts: no lattice; so does a channel that merely holds
 * (an extensometer taken off, a pause) when it moves.
 *
 * Why it matters (common practice): a strain column exported as percent with two decimals moves in steps of 1e-4;
 * the elastic rise of a steel to 300 MPa then spans 15 readings, each held over many samples while the stress
 * climbs by E·q ≈ 20 MPa — a staircase whose treads read as a bend, a toe or a knee to any test that takes the
 * strain as exact.
 * The same test serves a stress column written in coarse steps (analyzeRecord's `stressSteps`; the step is then in MPa).
 * Units: those of the column (strain fraction). Valid: finite values. Cost: one pass over [from, to), stopped once more than 16 moves and 1 %
 * of the moves so far are off the lattice (a continuous channel: within its first few dozen moves).
 * @returns the step and how coarse the channel is, or null when its moves are not on a lattice (or fewer than 8).
 * @example strainSteps(Array.from({ length: 20 }, (_, i) => Math.floor(i / 2) * 1e-4))?.step // 0.0001 (to rounding)
 */
export function strainSteps(strain: ArrayLike<number>, from = 0, to = strain.length, riseTo = from): StrainSteps | null {
  const L = STRAIN_STEPS;
  let held = 0, moves = 0, off = 0, q = Infinity, riseMoves = 0, turns = 0, mPrev = -1;
  for (let i = Math.max(1, from); i < to; i++) {
    const d = Math.abs(strain[i]! - strain[i - 1]!);
    let m = 0;
    if (d > L.same) {
      moves++;
      if (i < riseTo) riseMoves++;
      // The smallest move so far is the step; a smaller one replaces it, and the moves judged so far stay on the
      // lattice only if the old step is a whole multiple of the new.
      if (d < q) {
        if (q < Infinity && !whole(q / d)) off++;
        q = d;
      }
      const k = d / q;
      m = Math.round(k);
      if (!whole(k)) off++;
      // A continuous channel is off any lattice within its first few dozen moves: stop there (one pass over a
      // 1,000,000-row record had cost 3–5 ms warm, 9 ms cold, on every record).
      if (off > L.offSlack && off > (1 - L.lattice) * moves) return null;
    } else held++;
    // Rounding shows as neighbouring multiples in turn (0 and 1: a reading held, then a step; 1 and 2; …); a channel
    // advancing by the same amount every sample (a regular or noise-free one) moves by one multiple only, a change
    // of rate by another from then on.
    if (mPrev >= 0 && Math.abs(m - mPrev) === 1) turns++;
    mPrev = m;
  }
  const n = held + moves;
  if (moves < L.minMoves || off > (1 - L.lattice) * moves || turns < Math.min(L.turnShare * n, 0.5 * moves)) return null;
  const riseN = Math.max(0, Math.min(riseTo, to) - Math.max(1, from));
  return { step: q, heldShare: held / n, samplesPerReading: n / moves, riseSamplesPerReading: riseMoves > 0 ? riseN / riseMoves : 1, coarse: held >= L.heldShare * n };
}

/** True when k is within STRAIN_STEPS.wholeTol of a whole number. */
function whole(k: number): boolean {
  return Math.abs(k - Math.round(k)) <= STRAIN_STEPS.wholeTol;
}

/**
 * The strain of a coarse channel ({@link strainSteps}) read between its steps: each run of samples that hold one
 * reading v between a reading below it and one above it (or above and below, on an unloading) is spread on a line in
 * sample order from v − q/2, where the channel crossed into the reading (half a sample before the run), to v + q/2,
 * where it crossed out (half a sample after), for a channel that rounds to the nearest step. Every value stays inside
 * its recorded step — it rounds back to what the file holds — so no reading is contradicted; with samples uniform in
 * time and the strain advancing steadily over the run, it is the strain the channel would have written with more
 * digits. Runs that begin or end the record, and runs between two readings on the same side (a turn of the strain,
 * noise dithering across a step) are left as recorded. The record's own values are not changed (a copy is returned).
 * Units: strain fraction (`step` too). Valid: finite values, step > 0.
 * Cost: one pass.
 * @example spreadStrainSteps([0, 0.001, 0.001, 0.001, 0.001, 0.002], 0.001)
 *   // [0, 0.000625, 0.000875, 0.001125, 0.001375, 0.002]
 */
export function spreadStrainSteps(strain: ArrayLike<number>, step: number): Float64Array {
  const N = strain.length;
  const out = Float64Array.from(strain as ArrayLike<number>);
  const same = STRAIN_STEPS.same;
  let a = 1;
  while (a < N - 1) {
    const v = strain[a]!;
    let b = a;
    while (b + 1 < N && Math.abs(strain[b + 1]! - v) <= same) b++;
    if (b > a && b + 1 < N) {
      const vp = strain[a - 1]!, vn = strain[b + 1]!;
      const dir = vp < v - same && vn > v + same ? 1 : vp > v + same && vn < v - same ? -1 : 0;
      if (dir !== 0) {
        const len = b - a + 1;
        for (let k = a; k <= b; k++) out[k] = v + dir * step * ((k - a + 0.5) / len - 0.5);
      }
    }
    a = b + 1;
  }
  return out;
}
