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
  /** Runs of up to two bad samples are read on any record; longer ones up to one sample in this many of the record… */
  samplesPerRunSample: 500,
  /** …and never longer than this (a longer gap is the export's to mend, not the analysis's to fill). */
  longestRun: 8,
  /**
   * An unload–reload reversal caught on the run moves the other column the same way by an elastic amount: the
   * stress change over the strain change lies between these moduli (MPa), the softest and stiffest metals (40 and
   * 450 GPa, common practice) with a factor of 4 each way for noise and a reversal caught mid-way.
   */
  reversalModulus: [10_000, 1_800_000],
} as const;

/**
 * The longest run of consecutive bad samples {@link findGlitches} reads as a glitch in a record of `n` samples:
 * min(GLITCH.longestRun, max(2, ⌊n / GLITCH.samplesPerRunSample⌋)) — 2 up to 1,499 samples, 3 from 1,500, 8 from
 * 4,000. A run then spans at most 0.2 % of the samples (two on a shorter record), so the straight line it is read
 * on cannot stand in for a feature of the curve (a yield drop, the top) that the samples around it do not show.
 * @example glitchRun(5000) // 8
 */
export function glitchRun(n: number): number {
  return Math.min(GLITCH.longestRun, Math.max(2, Math.floor(n / GLITCH.samplesPerRunSample)));
}

/**
 * Samples an acquisition glitch put far off the curve (an electrical spike, a dropped reading of 0, a dropped row
 * with both columns 0), alone or a few in a row: a run of L ≤ {@link glitchRun}(N) samples i…i+L−1 (1 ≤ i,
 * i + L ≤ N − 1) each standing off the straight line between the samples on either side, a = v[i−1] and b = v[i+L],
 * by more than the limit — 10 % of the highest stress, or 0.2 % strain — all on the same side and each beyond both a
 * and b, while a and b agree (|b − a| < ¼ of the smallest offset) and the specimen is loaded (max(a, b) > 10 % of the
 * highest stress, for stress), unless the other column turns the same way there by an elastic amount (an
 * unload–reload reversal caught on a few samples: stress change / strain change between 10 and 1,800 GPa,
 * GLITCH.reversalModulus). A specimen cannot do that for a few samples and return: a yield drop or a fracture stays
 * down (the sample after it is far from the one before), a serration or the noise is far smaller, and an unloading
 * takes the strain back by the elastic amount only (a dropped row, exactly 0 in both columns, is never read as one).
 * Each sample of a run is read as the line between a and b (for one sample, their mean). Longer runs are not
 * recognised (the analysis refuses a run of zero stress on the plastic part, or a block of dropped rows, naming it).
 * `candidates` (per column, ascending indices where the value moved from the sample before by more than a limit
 * below 7/8 of the glitch limit — the move into a run of any length is at least 1 − 1/(4(L + 1)) ≥ 7/8 of its
 * offset — collected by a pass the caller makes anyway) limits the search to the same hits; a column without them
 * has every sample tested.
 * Units: strain fraction, stress MPa. Cost: O(candidates), or O(N).
 * @example findGlitches([0, 0.01, 0.02, 0.03, 0.04], [100, 300, 900, 310, 320], 320).map((g) => g.index) // [2]
 */
export function findGlitches(strain: ArrayLike<number>, stress: ArrayLike<number>, sMax: number, candidates?: { strain?: readonly number[] | null; stress?: readonly number[] | null }): Glitch[] {
  const N = strain.length;
  const longest = glitchRun(N);
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
      // An unload–reload reversal caught on a few samples is a V in stress AND in strain, the same way, in the ratio
      // of an elastic modulus (within a factor of 4 of 40–450 GPa): the specimen's own, not a glitch (the invented
      // loop record's four reversals had read as glitches). A dropped row reads exactly 0 in both columns: no
      // reversal reaches both zeros exactly (the permanent strain, the noise), whatever the ratio of the two falls
      // (one at 2.5 % and 369 MPa falls at 14.8 GPa), so it is a glitch.
      const o = other[k]! - line(other, i, L, k);
      if (o * dev > 0 && !(v === 0 && other[k] === 0)) {
        const modulus = isStress ? Math.abs(dev / o) : Math.abs(o / dev);
        if (modulus >= GLITCH.reversalModulus[0] && modulus <= GLITCH.reversalModulus[1]) return null;
      }
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
    for (let L = 1; L <= longest; L++) {
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

/** A block of rows that read 0 in both columns inside the loaded record ({@link droppedRows}). */
export interface DroppedRows {
  /** First and last sample of the block. */
  from: number;
  to: number;
}

/**
 * A block of dropped rows too long for {@link findGlitches} (more than {@link glitchRun}(N) samples): samples
 * i…j−1 that read exactly 0 in strain AND stress, where the sample before is loaded (stress above 10 % of the
 * highest, strain above 0.2 %) and the sample after comes back to it (stress and strain each within a quarter of
 * the sample before's). A specimen cannot do that: an unloading to zero force keeps its permanent strain and an
 * extensometer reset restarts the strain from 0 (it does not return to where it was), so the rows were lost by the
 * acquisition or the export. Read as an unload–reload cycle they had given an unloading modulus of 5.6 GPa, a
 * negative permanent strain, the strain channel's "end" at the block and Ag −0.003 % (an INVENTED 5,000-sample
 * record, a block of 9). `candidates`: ascending indices where the strain moved by more than 0.16 % from the sample
 * before (the move into such a block), or null to look at every sample. Units: strain fraction, stress MPa.
 * Cost: O(candidates + block), or O(N).
 * @example droppedRows([0, 0.11, 0.12, 0, 0, 0, 0.13, 0.14], [0, 300, 310, 0, 0, 0, 312, 313], 313) // { from: 3, to: 5 }
 */
export function droppedRows(strain: ArrayLike<number>, stress: ArrayLike<number>, sMax: number, candidates?: readonly number[] | null): DroppedRows | null {
  const N = strain.length;
  const at = (i: number): DroppedRows | null => {
    if (i < 1 || strain[i] !== 0 || stress[i] !== 0) return null;
    const e0 = strain[i - 1]!, s0 = stress[i - 1]!;
    if (!(s0 > 0.1 * sMax && e0 > GLITCH.strainOff)) return null;
    let j = i;
    while (j < N && strain[j] === 0 && stress[j] === 0) j++;
    if (j === N) return null; // zeros to the end: the record's own end, read by the fracture and end rules
    const e1 = strain[j]!, s1 = stress[j]!;
    return Math.abs(s1 - s0) < 0.25 * s0 && Math.abs(e1 - e0) < 0.25 * e0 ? { from: i, to: j - 1 } : null;
  };
  if (candidates) {
    for (const i of candidates) { const d = at(i); if (d) return d; }
    return null;
  }
  for (let i = 1; i < N; i++) if (strain[i] === 0 && stress[i] === 0) { const d = at(i); if (d) return d; }
  return null;
}
