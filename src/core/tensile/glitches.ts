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

/** The longest run of consecutive bad samples {@link findGlitches} reads as a glitch. */
export const GLITCH_RUN = 2;

/**
 * Samples an acquisition glitch put far off the curve (an electrical spike, a dropped reading of 0), alone or two in a
 * row: a run of L ≤ 2 samples i…i+L−1 (1 ≤ i, i + L ≤ N − 1) each standing off the straight line between the
 * samples on either side, a = v[i−1] and b = v[i+L], by more than the limit — 10 % of the highest stress, or 0.2 %
 * strain — all on the same side and each beyond both a and b, while a and b agree (|b − a| < ¼ of the smallest
 * offset) and the specimen is loaded (max(a, b) > 10 % of the highest stress, for stress), unless the other column
 * turns the same way there by at least a quarter of the elastic amount (an unload–reload reversal caught on one or two
 * samples). A specimen cannot do that for a sample or two and return: a yield drop or a fracture stays down (the
 * sample after it is far from the one before), a serration or the noise is far smaller. Each sample of a run is read
 * as the line between a and b (for one sample, their mean). Three or more bad samples in a row are not recognised.
 * `candidates` (per column, ascending indices where the value moved from the sample before by more than a limit
 * below 7/8 of the glitch limit — the move into a run is at least 7/8 of its offset for one sample, 11/12 for two —
 * collected by a pass the caller makes anyway) limits the search to the same hits; a column without them has every sample tested.
 * Units: strain fraction, stress MPa. Cost: O(candidates), or O(N).
 * @example findGlitches([0, 0.01, 0.02, 0.03, 0.04], [100, 300, 900, 310, 320], 320).map((g) => g.index) // [2]
 */
export function findGlitches(strain: ArrayLike<number>, stress: ArrayLike<number>, sMax: number, candidates?: { strain?: readonly number[] | null; stress?: readonly number[] | null }): Glitch[] {
  const N = strain.length;
  const out: Glitch[] = [];
  // Off the line between samples i − 1 and i + L at sample k of the run starting at i, in a column.
  const line = (col: ArrayLike<number>, i: number, L: number, k: number) => L === 1 ? 0.5 * (col[i - 1]! + col[i + 1]!) : col[i - 1]! + ((col[i + L]! - col[i - 1]!) * (k - i + 1)) / (L + 1);
  /** The values the run i…i+L−1 of `col` is read as, or null when it is not a glitch. */
  const test = (col: ArrayLike<number>, i: number, L: number, off: number, isStress: boolean): number[] | null => {
    if (i < 1 || i + L > N - 1) return null;
    const a = col[i - 1]!, b = col[i + L]!;
    if (isStress && !(Math.max(a, b) > 0.1 * sMax)) return null;
    const other = isStress ? strain : stress;
    const readAs: number[] = [];
    let least = Infinity, sign = 0;
    for (let k = i; k < i + L; k++) {
      const v = col[k]!, m = line(col, i, L, k), dev = v - m;
      if (!(Math.abs(dev) > off) || (v - a) * (v - b) <= 0) return null;
      if (sign === 0) sign = Math.sign(dev); else if (Math.sign(dev) !== sign) return null;
      least = Math.min(least, Math.abs(dev));
      // An unload–reload reversal caught on a sample or two is a V in stress AND in strain, the same way, by at least
      // a quarter of the elastic amount (the strain by Δs/450 GPa, the stiffest metal; the stress by Δe·40 GPa, the
      // softest): the specimen's own, not a glitch (the invented loop record's four reversals had read as glitches).
      const o = other[k]! - line(other, i, L, k);
      if (o * dev > 0 && Math.abs(o) >= (isStress ? (0.25 * Math.abs(dev)) / 450000 : 0.25 * Math.abs(dev) * 40000)) return null;
      readAs.push(m);
    }
    return Math.abs(b - a) < GLITCH.neighboursAgree * least ? readAs : null;
  };
  const scan = (column: 'strain' | 'stress', col: ArrayLike<number>, off: number, idx: readonly number[] | null | undefined) => {
    const found = new Set<number>();
    const add = (k: number, L: number) => {
      if (found.has(k)) return;
      const m = test(col, k, L, off, column === 'stress');
      if (m) m.forEach((r, j) => { found.add(k + j); out.push({ index: k + j, column, value: col[k + j]!, readAs: r }); });
    };
    for (let L = 1; L <= GLITCH_RUN; L++) {
      if (idx) {
        // A candidate marks the move into the run (i) or out of it (i − L is where the run starts).
        const seen = new Set<number>();
        for (const i of idx) for (const k of [i, i - L]) if (!seen.has(k)) { seen.add(k); add(k, L); }
      } else {
        for (let i = 1; i + L < N; i++) add(i, L);
      }
    }
  };
  scan('stress', stress, GLITCH.stressOff * sMax, candidates?.stress);
  scan('strain', strain, GLITCH.strainOff, candidates?.strain);
  return out.sort((x, y) => x.index - y.index);
}
