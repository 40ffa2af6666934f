/** Defaults of {@link testStarts}, stated once. */
export const TEST_START = {
  /** The first test must have stretched the specimen at least this far (engineering strain) before a new one can start. */
  minStrain: 0.01,
  /** A new test starts where the strain is back below this fraction of the largest strain so far ... */
  strainBack: 0.1,
  /** ... and the stress below this fraction of the highest stress so far ... */
  stressBack: 0.25,
  /** ... and from there the stress rises again to at least this fraction of that highest stress ... */
  riseAgain: 0.5,
  /** ... while the strain is still below this fraction of that largest strain (a new specimen's elastic rise). */
  riseStrain: 0.5,
} as const;

/**
 * Where a record starts over: the samples at which a further tensile test begins in the same file (a lab export
 * of several specimens one after another, with no header between them). A test starts at sample k when, with
 * e_max and s_max the largest strain and stress since the previous start, e_max ≥ 1 % (TEST_START.minStrain), the
 * strain at k is back below 10 % of e_max and the stress below 25 % of s_max, and the stress later rises again to
 * at least half of s_max while the strain is still below half of e_max (a new specimen's elastic rise: a dropped
 * reading in the middle of one test, both channels zero for a sample or two, comes back at the strain it left).
 * Why this cannot be an unload–reload cycle of one test: an unloaded specimen keeps its plastic strain e − s/E
 * (elastic unloading along E, common practice), so reloaded it reaches half of s_max at about e_max − s_max/(2E),
 * above half of e_max since e_max ≥ 1 % > s_max/E (s_max/E < 0.9 % even for a 600 MPa aluminium alloy at 70 GPa);
 * and unloaded to a quarter of the highest stress its strain stays above e_max − 0.75·s_max/E, more than a third of
 * e_max, so the cheaper first test (strain below a tenth) already passes it by. A strain channel that resets while
 * the specimen is still loaded (extensometer taken off) keeps a high stress and is not a start; the samples after
 * fracture (force near zero) do not rise again and are not one.
 * Units: engineering strain (fraction) and stress (MPa). Valid: any finite record (non-finite samples are skipped).
 * @returns the start index of every test after the first, ascending (empty for one test).
 * @example testStarts([0, 0.005, 0.05, 0.1, 0.0001, 0.004, 0.05], [0, 300, 420, 450, 2, 280, 430]) // [4]
 */
export function testStarts(strain: ArrayLike<number>, stress: ArrayLike<number>): number[] {
  const n = Math.min(strain.length, stress.length);
  const starts: number[] = [];
  let eMax = 0, sMax = 0;
  // Candidates before `noRise` were looked past by a forward search that found no rise (the samples after fracture):
  // none of them can rise either (the same level, the same strain limit, and no sample on the way changes e_max or
  // s_max: each is below both limits), so the search is made once, not per sample.
  let noRise = 0;
  for (let k = 0; k < n; k++) {
    const e = strain[k]!, s = stress[k]!;
    if (!(Number.isFinite(e) && Number.isFinite(s))) continue;
    if (k >= noRise && eMax >= TEST_START.minStrain && e < TEST_START.strainBack * eMax && s < TEST_START.stressBack * sMax) {
      const rise = riseAfter(strain, stress, k, n, TEST_START.riseAgain * sMax, TEST_START.riseStrain * eMax);
      if (rise > 0) {
        starts.push(k);
        eMax = e > 0 ? e : 0; sMax = s > 0 ? s : 0;
        continue;
      }
      noRise = -rise;
    }
    if (e > eMax) eMax = e;
    if (s > sMax) sMax = s;
  }
  return starts;
}

/**
 * The first sample after k whose stress reaches `level` while the strain stays below `eLimit` (a new test loading
 * up), or −i when there is none, i the sample where the search stopped (the strain passed eLimit, or n).
 */
function riseAfter(strain: ArrayLike<number>, stress: ArrayLike<number>, k: number, n: number, level: number, eLimit: number): number {
  for (let i = k + 1; i < n; i++) {
    if (!(strain[i]! < eLimit)) return -i;
    if (stress[i]! >= level) return i;
  }
  return -n;
}
