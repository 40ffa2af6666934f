import { mean, sampleCorrelation, sampleStandardDeviation } from 'simple-statistics';
import { InputError } from '../errors.js';
import { fitAllLaws, type LawComparison } from '../fit/fitAllLaws.js';
import { LAW_PARAMETERS } from '../flow/params.js';
import type { LawName } from '../flow/types.js';
import { analyzeRecord, type AnalyzeOptions } from './analyzeRecord.js';
import type { TensileAnalysis, TensileData } from './types.js';

/** Per-property summary over specimens: mean, sample standard deviation (n − 1), count. */
export interface PropertySummary {
  mean: number;
  sd: number | null;
  n: number;
  /** Specimens whose value is only a lower bound (TensileAnalysis.lowerBounds), left out of mean, sd and n. */
  lowerBoundsLeftOut: number;
}

/** The scalar properties summarised over specimens. */
export const SPECIMEN_PROPERTIES = [
  'elasticModulus', 'proofStrength', 'totalExtensionStrength', 'upperYield', 'lowerYield', 'yieldPointElongationPct',
  'tensileStrength', 'uniformElongationPct', 'uniformTotalElongationPct', 'totalElongationPct', 'nValue', 'K',
] as const;
export type SpecimenProperty = (typeof SPECIMEN_PROPERTIES)[number];

export interface SpecimenSet {
  specimens: { name: string; analysis: TensileAnalysis }[];
  /** Mean and sd of each property over the specimens where it exists. */
  summary: Partial<Record<SpecimenProperty, PropertySummary>>;
  /** The chosen law's parameters over specimens: mean, sd, and the correlation matrix (rows/cols in `names` order). */
  lawParameters: { law: LawName; names: string[]; mean: number[]; sd: (number | null)[]; correlation: (number | null)[][]; specimens: number } | null;
  /** All laws fitted to the pooled flow curves of every specimen. */
  jointFit: LawComparison | null;
}

/**
 * Several specimens of one material: {@link analyzeRecord} for each, mean and sample standard
 * deviation (simple-statistics `mean`, `sampleStandardDeviation`) of every property over the specimens that
 * measured it (a lower bound — a test stopped early, a strain channel ended early — is left out and counted), the mean, sd and
 * Pearson correlations (`sampleCorrelation`) of the chosen law's parameters across specimens, and a
 * joint fit of every law to all flow curves pooled. This is the input scatter analysis uses.
 * Units as in {@link analyzeRecord}. `recordOptions[i]`, where given, adds to `opts` for record i alone (a machine-travel
 * record's modulus and lengths). Valid: at least one record; sd needs two, correlations three.
 * @throws InputError naming the specimen for an invalid record.
 * @example analyzeSpecimens([{ name: 'A', strain, stress }, { name: 'B', strain: s2, stress: t2 }], { law: 'swift' }).summary.proofStrength
 */
export function analyzeSpecimens(records: readonly (TensileData & { name: string })[], opts: AnalyzeOptions & { law?: LawName; recordOptions?: readonly AnalyzeOptions[] } = {}): SpecimenSet {
  if (records.length === 0) throw new InputError('records', 0, 'at least one record');
  const law = opts.law ?? 'swift';
  const { recordOptions, ...common } = opts;
  const specimens = records.map((r, i) => {
    try {
      return { name: r.name, analysis: analyzeRecord(r, { ...common, ...recordOptions?.[i], laws: opts.laws ?? [law] }) };
    } catch (e) {
      if (e instanceof InputError) throw new InputError(`records[${i}] (${r.name}).${e.path}`, e.value, e.allowed);
      throw e;
    }
  });
  return summarizeSpecimens(specimens, { ...opts, law });
}

/**
 * The second half of {@link analyzeSpecimens}, for specimens already analysed (the command line analyses each
 * record once for its own table and summarises those analyses here, rather than analysing them again): the
 * property summary, the chosen law's parameters over specimens and the joint fit of `opts.laws` (all laws when
 * absent) to the pooled flow curves. Units as in {@link analyzeRecord}.
 * @throws InputError when `specimens` is empty.
 * @example summarizeSpecimens([{ name: 'A', analysis: analyzeRecord(a) }, { name: 'B', analysis: analyzeRecord(b) }], { law: 'voce' }).summary.tensileStrength!.mean
 */
export function summarizeSpecimens(specimens: { name: string; analysis: TensileAnalysis }[], opts: { law?: LawName; laws?: readonly LawName[]; fit?: boolean } = {}): SpecimenSet {
  if (specimens.length === 0) throw new InputError('specimens', 0, 'at least one analysed specimen');
  const law = opts.law ?? 'swift';
  const summary: Partial<Record<SpecimenProperty, PropertySummary>> = {};
  for (const p of SPECIMEN_PROPERTIES) {
    // A lower bound (a test stopped before maximum force or fracture, a strain channel that ended early) is no
    // measurement: it is left out of the mean and sd (it would pull both down), and counted.
    const bound = (a: TensileAnalysis) => (a.lowerBounds as readonly string[]).includes(p);
    const v = specimens.filter((s) => !bound(s.analysis)).map((s) => s.analysis[p]).filter((x): x is number => typeof x === 'number' && Number.isFinite(x));
    const lowerBoundsLeftOut = specimens.filter((s) => bound(s.analysis)).length;
    // (Every specimen a lower bound: no entry, as for a property no specimen has.)
    if (v.length) summary[p] = { mean: mean(v), sd: v.length >= 2 ? sampleStandardDeviation(v) : null, n: v.length, lowerBoundsLeftOut };
  }
  const names = LAW_PARAMETERS[law].map((p) => p.name);
  const rows = specimens.map((s) => s.analysis.fits?.fits.find((f) => f.law === law)).filter((f) => f && f.converged).map((f) => names.map((n) => f!.params[n]!));
  let lawParameters: SpecimenSet['lawParameters'] = null;
  if (rows.length) {
    const col = (j: number) => rows.map((r) => r[j]!);
    const sd = names.map((_, j) => (rows.length >= 2 ? sampleStandardDeviation(col(j)) : null));
    lawParameters = {
      law, names,
      mean: names.map((_, j) => mean(col(j))),
      sd,
      correlation: names.map((_, a) => names.map((__, b) => {
        if (a === b) return 1;
        if (rows.length < 3 || !sd[a] || !sd[b]) return null;
        const c = sampleCorrelation(col(a), col(b));
        return Number.isFinite(c) ? c : null;
      })),
      specimens: rows.length,
    };
  }
  const px: number[] = [], py: number[] = [];
  for (const s of specimens) {
    const fc = s.analysis.flowCurve;
    for (let i = 0; i < fc.strain.length; i++) { px.push(fc.strain[i]!); py.push(fc.stress[i]!); }
  }
  const jointFit = opts.fit !== false && px.length >= 9 ? fitAllLaws(px, py, { ...(opts.laws ? { laws: opts.laws } : {}) }) : null;
  return { specimens, summary, lawParameters, jointFit };
}
