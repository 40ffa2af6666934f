import { TARGET_DEFS } from '../core/route/targets.js';
import { targetLabel } from './labels.js';
import { formatTargetValue } from './numbers.js';
import { LAW_PARAMETERS } from '../core/flow/params.js';
import type { ScatterProblem } from '../core/scatter/problem.js';
import type { Distribution, ScatterSummary } from '../core/scatter/summarize.js';
import type { Units } from '../plan/units.js';

/** Cautions that belong to every scatter section (a probability is only as good as the spreads fed in). */
export const SCATTER_CAUTIONS: readonly string[] = [
  'The probability and the tolerance bound cover only the spreads and correlations given in the plan, taken as known; spreads estimated from a few specimens are themselves uncertain, and test error, model error and process variation add to the scatter.',
  'A lower bound is not a guaranteed minimum: release parts against tests of the real material and the applicable codes and standards.',
];

type Dist = Distribution;

/** The report's `scatter` section (report version 1; present only when the plan has `scatter`): stresses in the plan's stress unit. */
export interface ReportScatter {
  samples: number;
  seed: number;
  rejectedDraws: number;
  inputs: Array<{ name: string; mean: number; sd: number; cv: number; unit: string }>;
  correlation: Record<string, number>;
  probabilityAllTargetsMet: number;
  probabilityStdError: number;
  targets: Array<{ name: string; limit: number; probabilityMet: number }>;
  finalReloadYield: Dist;
  tensileStrength: Dist;
  remainingElongationPct: Dist;
  /** Final Vickers hardness (Tabor estimate), HV: the same in SI and US reports. */
  hardnessHV?: Dist;
  toleranceBound: {
    value: number; coverage: number; confidence: number; method: string;
    normalK: number; normalValue: number; distributionFreeRank: number | null; distributionFreeValue: number | null; note: string;
  };
  sensitivity: { output: string; method: string; linearR2: number; inputs: Array<{ input: string; src: number; correlation: number }> };
  deltaMethod: { finalReloadYield: { mean: number; sd: number }; tensileStrength: { mean: number; sd: number }; remainingElongationPct: { mean: number; sd: number } };
  cautions: string[];
}

/**
 * Builds the report's scatter section from a summary, converting stresses (MPa) and start sizes
 * (mm) back to the plan's units. Deterministic: the same summary gives the same section.
 */
export function scatterReport(problem: ScatterProblem, s: ScatterSummary, u: Units): ReportScatter {
  const S = u.fromMPa;
  const dist = (d: Dist): Dist => ({ mean: S(d.mean), sd: S(d.sd), min: S(d.min), p05: S(d.p05), p50: S(d.p50), p95: S(d.p95), max: S(d.max) });
  const law = problem.material.flowCurve.law;
  const kindOf = (name: string): 'stress' | 'length' | 'none' => name.startsWith('start.')
    ? 'length'
    : LAW_PARAMETERS[law].find((p) => p.name === name)?.kind === 'stress' ? 'stress' : 'none';
  const conv = (name: string, x: number) => { const k = kindOf(name); return k === 'stress' ? S(x) : k === 'length' ? u.fromMm(x) : x; };
  const correlation: Record<string, number> = {};
  problem.inputs.forEach((a, i) => problem.inputs.forEach((b, j) => {
    if (j > i && problem.correlation[i]![j] !== 0) correlation[`${a.name},${b.name}`] = problem.correlation[i]![j]!;
  }));
  const stressTarget = (n: string) => (TARGET_DEFS as Record<string, { unit: string } | undefined>)[n]?.unit === 'stress';
  const tb = s.toleranceBound;
  return {
    samples: s.samples,
    seed: s.seed,
    rejectedDraws: s.rejected,
    inputs: s.inputs.map((i) => ({ name: i.name, mean: conv(i.name, i.mean), sd: conv(i.name, i.sd), cv: i.cv,
      unit: kindOf(i.name) === 'stress' ? u.stress : kindOf(i.name) === 'length' ? u.length : '1' })),
    correlation,
    probabilityAllTargetsMet: s.probabilityAllTargetsMet,
    probabilityStdError: s.probabilityStdError,
    targets: s.targets.map((t) => ({ name: t.name, limit: stressTarget(t.name) ? S(t.limit) : t.limit, probabilityMet: t.probabilityMet })),
    finalReloadYield: dist(s.finalReloadYield),
    tensileStrength: dist(s.tensileStrength),
    remainingElongationPct: s.remainingElongationPct,
    hardnessHV: s.hardnessHV,
    toleranceBound: {
      value: S(tb.value), coverage: tb.coverage, confidence: tb.confidence,
      method: tb.method === 'distribution-free' ? 'distribution-free order statistic (Wilks 1941)' : 'normal tolerance factor, noncentral t (NIST/SEMATECH e-Handbook §7.2.6.3)',
      normalK: tb.normalK, normalValue: S(tb.normalValue), distributionFreeRank: tb.distributionFreeRank,
      distributionFreeValue: tb.distributionFreeValue === null ? null : S(tb.distributionFreeValue), note: tb.note,
    },
    sensitivity: { output: s.sensitivity.output, method: s.sensitivity.method, linearR2: s.sensitivity.linearR2, inputs: s.sensitivity.inputs.map((i) => ({ ...i })) },
    deltaMethod: {
      finalReloadYield: { mean: S(s.deltaMethod.finalReloadYield.mean), sd: S(s.deltaMethod.finalReloadYield.sd) },
      tensileStrength: { mean: S(s.deltaMethod.tensileStrength.mean), sd: S(s.deltaMethod.tensileStrength.sd) },
      remainingElongationPct: { ...s.deltaMethod.remainingElongationPct },
    },
    cautions: [...SCATTER_CAUTIONS],
  };
}

/** The scatter section as plain text lines for the table report. */
export function scatterLines(s: ReportScatter, stress: string): string[] {
  const f = (x: number, d = 1) => x.toFixed(d);
  const pct = (x: number) => `${(x * 100).toFixed(1)} %`;
  const y = s.finalReloadYield;
  const tb = s.toleranceBound;
  const top = [...s.sensitivity.inputs].sort((a, b) => Math.abs(b.src) - Math.abs(a.src));
  return [
    `scatter: ${s.samples} samples, seed ${s.seed}; inputs ${s.inputs.length === 0 ? 'none (no spread given)' : ''}${s.inputs.map((i) => `${i.name} ${+i.mean.toPrecision(6)} ± ${+i.sd.toPrecision(3)} ${i.unit === '1' ? '' : i.unit}`.trim()).join(', ')}` +
      (Object.keys(s.correlation).length ? `; correlation ${Object.entries(s.correlation).map(([k, v]) => `${k} ${v}`).join(', ')}` : ''),
    `  probability all targets met: ${pct(s.probabilityAllTargetsMet)} (± ${pct(s.probabilityStdError)} sampling error)` +
      (s.targets.length ? `; ${s.targets.map((t) => `${targetLabel(t.name)} ${pct(t.probabilityMet)}`).join(', ')}` : ''),
    `  final Rp0.2 ${stress}: mean ${f(y.mean)}, sd ${f(y.sd)}, 5 % ${f(y.p05)}, 50 % ${f(y.p50)}, 95 % ${f(y.p95)} (first-order: mean ${f(s.deltaMethod.finalReloadYield.mean)}, sd ${f(s.deltaMethod.finalReloadYield.sd)})`,
    `  lower bound on Rp0.2, ${pct(tb.coverage)} coverage at ${pct(tb.confidence)} confidence: ${f(tb.value)} ${stress} (${tb.method}); normal theory ${f(tb.normalValue)} (k = ${tb.normalK.toFixed(4)})`,
    top.length ? `  spread driven by: ${top.map((i) => `${i.input} (SRC ${i.src.toFixed(2)})`).join(', ')}; linear R² ${s.sensitivity.linearR2.toFixed(3)}` : '  spread driven by: nothing scatters',
    ...(s.rejectedDraws > 0 ? [`  ${s.rejectedDraws} draws fell outside what the law or route allows and were redrawn (truncated normal)`] : []),
    ...s.cautions.map((c) => `  caution: ${c}`),
  ];
}

/** The scatter section as sentences and tables, for the Markdown and HTML reports (same numbers as {@link scatterLines}). */
export interface ScatterView {
  /** Plain sentences, in order: what was sampled, the probability, the tolerance bound, redraws. */
  sentences: string[];
  tables: Array<{ title: string; header: string[]; rows: string[][]; numeric: boolean[] }>;
  cautions: string[];
}

/** Builds {@link ScatterView}: probabilities in per cent to 0.1, stresses to 0.1 in the plan's unit. */
export function scatterView(s: ReportScatter, stress: string): ScatterView {
  const f = (x: number, d = 1) => x.toFixed(d);
  const pct = (x: number) => `${(x * 100).toFixed(1)} %`;
  const tb = s.toleranceBound;
  const sentences = [
    `${s.samples} Monte Carlo samples (seed ${s.seed}) through the route.`,
    `Probability that all targets are met: ${pct(s.probabilityAllTargetsMet)} (± ${pct(s.probabilityStdError)} sampling error).`,
    `Lower tolerance bound on the final Rp0.2, covering ${pct(tb.coverage)} of parts at ${pct(tb.confidence)} confidence: ${f(tb.value)} ${stress} (${tb.method}); normal theory gives ${f(tb.normalValue)} ${stress} (k = ${tb.normalK.toFixed(4)}).`,
    ...(s.rejectedDraws > 0 ? [`${s.rejectedDraws} draws fell outside what the law or route allows and were redrawn (truncated normal).`] : []),
  ];
  const dist = (name: string, unit: string, d: Distribution, dm: { mean: number; sd: number }) =>
    [name, unit, f(d.mean), f(d.sd), f(d.p05), f(d.p50), f(d.p95), f(dm.mean), f(dm.sd)];
  const tables: ScatterView['tables'] = [
    { title: 'Inputs that scatter', header: ['input', 'mean', 'sd', 'cv', 'unit'], numeric: [false, true, true, true, false],
      rows: s.inputs.map((i) => [i.name, String(+i.mean.toPrecision(6)), String(+i.sd.toPrecision(3)), i.cv.toFixed(3), i.unit === '1' ? '—' : i.unit]) },
    { title: 'Probability of meeting each target', header: ['target', 'limit', 'probability met'], numeric: [false, true, true],
      rows: s.targets.map((t) => [targetLabel(t.name), t.name === 'temper' ? f(t.limit, 2) : formatTargetValue(t.limit, t.name, stress), pct(t.probabilityMet)]) },
    { title: 'Final state across the samples (first-order estimate beside)', header: ['quantity', 'unit', 'mean', 'sd', '5 %', '50 %', '95 %', 'first-order mean', 'first-order sd'],
      numeric: [false, false, true, true, true, true, true, true, true],
      rows: [
        dist('Rp0.2', stress, s.finalReloadYield, s.deltaMethod.finalReloadYield),
        dist('Rm', stress, s.tensileStrength, s.deltaMethod.tensileStrength),
        dist('remaining uniform elongation', '%', s.remainingElongationPct, s.deltaMethod.remainingElongationPct),
        // No first-order estimate is computed for the hardness: '—'.
        ...(s.hardnessHV ? [[...dist('Vickers hardness (Tabor estimate)', 'HV', s.hardnessHV, { mean: 0, sd: 0 }).slice(0, 7), '—', '—']] : []),
      ] },
    { title: `What drives the spread of ${s.sensitivity.output === 'finalReloadYield' ? 'the final Rp0.2' : s.sensitivity.output} (linear R² ${s.sensitivity.linearR2.toFixed(3)})`, header: ['input', 'standardised regression coefficient', 'correlation'], numeric: [false, true, true],
      rows: [...s.sensitivity.inputs].sort((a, b) => Math.abs(b.src) - Math.abs(a.src)).map((i) => [i.input, i.src.toFixed(2), i.correlation.toFixed(2)]) },
  ];
  if (Object.keys(s.correlation).length) {
    tables.splice(1, 0, { title: 'Correlations given', header: ['pair', 'correlation'], numeric: [false, true], rows: Object.entries(s.correlation).map(([k, v]) => [k, String(v)]) });
  }
  return { sentences, tables, cautions: [...s.cautions] };
}
