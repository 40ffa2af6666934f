import type { ReportStep, ReportV1 } from './build.js';
import { flowCurveText } from './numbers.js';

/** The step fields of report v1 as first published; anything else numeric is an extra field. */
export const STEP_FIELDS_V1: readonly string[] = [
  'index', 'kind', 'label', 'size', 'strainIncrement', 'accumulatedStrain', 'coldWorkPct', 'flowStress',
  'reloadYield', 'tensileStrength', 'yieldRatio', 'remainingUniformStrain', 'remainingUniformElongationPct',
  'elasticRecoveryStrain', 'recoveredElasticEnergy', 'meanFlowStress', 'plasticWork', 'warnings',
];

/** The top-level fields of report v1 as first published. */
export const REPORT_FIELDS_V1: readonly string[] = [
  'reportVersion', 'plan', 'units', 'material', 'steps', 'targets', 'allTargetsMet', 'coldWorkWindow', 'cautions',
];

/**
 * Numeric step fields beyond report v1's own (e.g. `springbackDeg`, `rollForce` added by later steps),
 * in order of first appearance over all steps. Writers show them as extra columns, blank where a step
 * has none, so a new optional field appears in every format without touching the writers.
 */
export function extraStepFields(steps: readonly ReportStep[]): string[] {
  const out: string[] = [];
  for (const s of steps) {
    for (const [k, v] of Object.entries(s)) {
      if (typeof v === 'number' && !STEP_FIELDS_V1.includes(k) && !out.includes(k)) out.push(k);
    }
  }
  return out;
}

/** Top-level report sections beyond report v1's own (e.g. a `scatter` section), in report order. */
export function extraSections(r: ReportV1): [string, unknown][] {
  return Object.entries(r).filter(([k]) => !REPORT_FIELDS_V1.includes(k));
}

/** Column headers of the approximate hardness conversions (`≈`: converted by a table, an estimate). */
export function conversionHeader(key: string, stressUnit: string): string | undefined {
  return ({ hardnessHB: '≈HB', hardnessHRB: '≈HRB', hardnessHRC: '≈HRC', tensileFromHardness: `≈Rm from HV ${stressUnit}` } as Record<string, string>)[key];
}

/** A step's extra numeric field, or undefined. */
export function stepNumber(s: ReportStep, key: string): number | undefined {
  const v = (s as unknown as Record<string, unknown>)[key];
  return typeof v === 'number' ? v : undefined;
}

/** The size of a step in words for a human report: `t 1.600`, `d 0.218`, `h 10.000`. */
export function sizeText(s: ReportStep['size']): string {
  if (s.thickness !== undefined) return `t ${s.thickness.toFixed(3)}`;
  if (s.diameter !== undefined) return `d ${s.diameter.toFixed(3)}`;
  if (s.height !== undefined) return `h ${s.height.toFixed(3)}`;
  return '—';
}

/** Provenance lines every human-readable report carries: plan, hash, tool, law and where it came from. */
export function provenance(r: ReportV1): { label: string; value: string }[] {
  const fc = flowCurveText(r.material.flowCurve, r.units.stress);
  const overrides = (r.plan as { overrides?: string[] }).overrides;
  return [
    { label: 'plan', value: r.plan.name },
    { label: 'file', value: r.plan.file },
    { label: 'SHA-256', value: r.plan.hash },
    { label: 'tool', value: r.plan.tool },
    ...(overrides && overrides.length ? [{ label: 'overrides', value: overrides.join('; ') }] : []),
    { label: 'material', value: r.material.name },
    { label: 'elastic modulus', value: `${+r.material.elasticModulus.toPrecision(6)} ${r.units.stress}` },
    { label: 'hardening law', value: `${fc} (true stress in ${r.units.stress} vs true plastic strain)` },
    { label: 'law source', value: r.material.source },
    ...(r.material.hardness ? [{ label: 'hardness', value: hardnessText(r.material.hardness) }] : []),
  ];
}

/** The hardness model in one line: relation, factor and its basis, representative strain, table. */
export function hardnessText(h: NonNullable<ReportV1['material']['hardness']>): string {
  const basis = h.basis === 'fitted'
    ? `fitted to ${h.readings} readings, 95 % interval ${h.taborFactorInterval!.map((x) => x.toFixed(3)).join('–')}`
    : h.basis === 'given' ? 'given in the plan' : "default: Tabor's 3 × Vickers contact ratio 0.927";
  const table = h.conversionTable ? `; conversions (approximate) by ${h.conversionTable.source}` : '; no conversion table (HV only)';
  return `HV = c·σ(ε̄ + εr)/9.80665 (Tabor), c = ${h.taborFactor.toFixed(3)} (${basis}), εr = ${h.representativeStrain}; annealed ${h.initialHV.toFixed(1)} HV${table}`;
}
