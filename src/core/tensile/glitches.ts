/** One sample that an acquisition glitch put far off its neighbours. */
export interface Glitch {
  /** Sample index in the record. */
  index: number;
  column: 'strain' | 'stress';
  /** The value recorded, and the mean of its two neighbours it is read as. */
  value: number;
  readAs: number;
}

/** Limits of {@link findGlitches}, stated once. */
export const GLITCH = {
  /** A stress glitch stands off the mean of its neighbours by more than this fraction of the highest stress. */
  stressOff: 0.1,
  /** A strain glitch stands off by more than this strain (0.2 %, the extensometer end's reset margin). */
  strainOff: 0.002,
  /** The two neighbours agree: they differ by less than this fraction of the glitch's offset. */
  neighboursAgree: 0.25,
} as const;

/**
 * Single samples an acquisition glitch put far off the curve (an electrical spike, a dropped reading of 0): sample
 * i (1 ≤ i ≤ N − 2) whose value v stands off the mean m of its two neighbours a, b by more than the limit — 10 % of
 * the highest stress, or 0.2 % strain — on the same side of both, while the neighbours agree (|b − a| < ¼ |v − m|)
 * and the specimen is loaded (max(a, b) > 10 % of the highest stress, for stress), unless the other column turns the
 * same way at i by at least a quarter of the elastic amount (an unload–reload reversal caught on one sample). A
 * specimen cannot do that in one sample and return the next: a yield drop or a fracture stays down (its next sample
 * is far from the one before), a serration or the noise is far smaller. Two or more bad samples in a row are not recognised.
 * `candidates` (per column, ascending indices where the value moved from the sample before by more than a limit
 * below 7/8 of the glitch limit — the move into a glitch is at least that — collected by a pass the caller makes
 * anyway) limits the search to the same hits; a column without them has every sample tested.
 * Units: strain fraction, stress MPa. Cost: O(candidates), or O(N).
 * @example findGlitches([0, 0.01, 0.02, 0.03, 0.04], [100, 300, 900, 310, 320], 320).map((g) => g.index) // [2]
 */
export function findGlitches(strain: ArrayLike<number>, stress: ArrayLike<number>, sMax: number, candidates?: { strain?: readonly number[] | null; stress?: readonly number[] | null }): Glitch[] {
  const N = strain.length;
  const out: Glitch[] = [];
  // Off the mean of the two neighbours, at sample i of a column.
  const offMean = (col: ArrayLike<number>, i: number) => col[i]! - 0.5 * (col[i - 1]! + col[i + 1]!);
  const test = (col: ArrayLike<number>, i: number, off: number, isStress: boolean) => {
    if (i < 1 || i > N - 2) return null;
    const a = col[i - 1]!, v = col[i]!, b = col[i + 1]!;
    const m = 0.5 * (a + b);
    const dev = v - m;
    if (!(Math.abs(dev) > off) || !(Math.abs(b - a) < GLITCH.neighboursAgree * Math.abs(dev)) || (v - a) * (v - b) <= 0) return null;
    if (isStress && !(Math.max(a, b) > 0.1 * sMax)) return null;
    // An unload–reload reversal caught on one sample is a V in stress AND in strain, the same way, by at least a
    // quarter of the elastic amount (the strain by Δs/450 GPa, the stiffest metal; the stress by Δe·40 GPa, the
    // softest): the specimen's own, not a glitch (the invented loop record's four reversals had read as glitches).
    const other = offMean(isStress ? strain : stress, i);
    if (other * dev > 0 && Math.abs(other) >= (isStress ? (0.25 * Math.abs(dev)) / 450000 : 0.25 * Math.abs(dev) * 40000)) return null;
    return m;
  };
  const scan = (column: 'strain' | 'stress', col: ArrayLike<number>, off: number, idx: readonly number[] | null | undefined) => {
    const add = (k: number) => {
      const m = test(col, k, off, column === 'stress');
      if (m !== null) out.push({ index: k, column, value: col[k]!, readAs: m });
    };
    if (idx) {
      // A candidate marks the move into the glitch (i) or out of it (i − 1 is the glitch).
      const seen = new Set<number>();
      for (const i of idx) for (const k of [i, i - 1]) if (!seen.has(k)) { seen.add(k); add(k); }
    } else {
      for (let i = 1; i < N - 1; i++) add(i);
    }
  };
  scan('stress', stress, GLITCH.stressOff * sMax, candidates?.stress);
  scan('strain', strain, GLITCH.strainOff, candidates?.strain);
  return out.sort((x, y) => x.index - y.index);
}
