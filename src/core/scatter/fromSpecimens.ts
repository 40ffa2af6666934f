import { InputError } from '../errors.js';
import type { LawName } from '../flow/types.js';

/** Per-specimen law fits summarised over specimens (the `lawParameters` of `analyzeSpecimens`). */
export interface SpecimenLawParameters {
  law: LawName;
  names: string[];
  mean: number[];
  sd: (number | null)[];
  correlation: (number | null)[][];
  specimens: number;
}

/** The scatter a set of specimens gives: the law at the specimen means, spreads and correlations (MPa for stresses). */
export interface SpecimenScatter {
  law: LawName;
  mean: Record<string, number>;
  sd: Record<string, number>;
  /** Correlations keyed "A,B" in the law's parameter order; 0 where too few specimens to estimate one. */
  correlation: Record<string, number>;
  specimens: number;
  notes: string[];
}

/**
 * Scatter of a law's parameters from several specimens of one material: the nominal law at the
 * mean of the per-specimen fits, each parameter's sample standard deviation (n − 1 divisor) and the
 * Pearson correlation between parameters (e.g. K and n, usually negative), as computed by
 * `analyzeSpecimens` with simple-statistics. Correlations need at least 3 specimens; with fewer, or
 * a parameter without spread, the pair is taken as uncorrelated and a note says so.
 * Source: sample mean, variance and Pearson correlation (e.g. NIST/SEMATECH e-Handbook §1.3.5);
 * treating specimen-to-specimen spread of fitted parameters as the material's scatter is common practice.
 * Units: those of the fits (MPa for stresses). Valid: at least 2 specimens with converged fits.
 * @throws InputError naming `path` when fewer than 2 specimens were fitted.
 * @example scatterFromSpecimens(analyzeSpecimens(records, { law: 'hollomon' }).lawParameters!).sd.K
 */
export function scatterFromSpecimens(lp: SpecimenLawParameters, path = 'scatter.records'): SpecimenScatter {
  if (lp.specimens < 2) throw new InputError(path, lp.specimens, 'at least 2 specimens whose law fits converged (3 or more for correlations)', 'too few fitted specimens for a spread');
  const mean: Record<string, number> = {};
  const sd: Record<string, number> = {};
  const correlation: Record<string, number> = {};
  const notes: string[] = [];
  lp.names.forEach((n, i) => {
    mean[n] = lp.mean[i]!;
    sd[n] = lp.sd[i] ?? 0;
  });
  for (let a = 0; a < lp.names.length; a++) {
    for (let b = a + 1; b < lp.names.length; b++) {
      const r = lp.correlation[a]![b];
      if (r === null || r === undefined || !Number.isFinite(r)) {
        if (sd[lp.names[a]!]! > 0 && sd[lp.names[b]!]! > 0) notes.push(`${lp.names[a]},${lp.names[b]}: too few specimens (${lp.specimens}) to estimate a correlation; taken as 0`);
        continue;
      }
      // A sample correlation of exactly ±1 (e.g. 3 specimens on a line) makes the matrix singular: clip it.
      const c = Math.max(-0.999, Math.min(0.999, r));
      if (c !== r) notes.push(`${lp.names[a]},${lp.names[b]}: sample correlation ${r.toFixed(4)} clipped to ${c} (a perfectly correlated pair cannot be sampled)`);
      if (c !== 0) correlation[`${lp.names[a]},${lp.names[b]}`] = c;
    }
  }
  if (lp.specimens < 10) notes.push(`spreads from only ${lp.specimens} specimens are themselves uncertain; a tolerance factor for n = ${lp.specimens} (strainledger tolerance-factor --n ${lp.specimens}) shows how much`);
  return { law: lp.law, mean, sd, correlation, specimens: lp.specimens, notes };
}
