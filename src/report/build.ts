import type { TemperState } from '../core/temper/types.js';
import type { BendFields, KinematicFields, Ledger, LedgerRow, PassLoadFields, Size, TargetResult, Warning } from '../core/route/types.js';
import { LAW_PARAMETERS } from '../core/flow/params.js';
import { CONVERSION_TABLES } from '../core/hardness/conversionTables.js';
import { hardnessConversions } from '../core/hardness/convertHardness.js';
import { defaultHardnessModel } from '../core/hardness/taborHardness.js';
import type { LoadedPlan } from '../plan/load.js';
import { convertLaw, withLocation } from '../plan/resolve.js';
import { runScatter } from '../core/scatter/run.js';
import type { ScatterSummary } from '../core/scatter/summarize.js';
import { scatterReport, type ReportScatter } from './scatter.js';
import { CAUTIONS, TEMPER_CAUTION } from './cautions.js';

/** Version of the JSON report contract. Bump only when a field changes meaning or is removed. */
export const REPORT_VERSION = 1;

/**
 * One step of the report. The optional kinematic, bend and pass-load fields are the ledger's, converted
 * to the plan's units: stresses in its stress unit, lengths in its length unit, forces N or lbf,
 * torque N·m or lbf·ft, temperature rise K, strains true.
 */
export interface ReportStep extends KinematicFields, BendFields, PassLoadFields {
  index: number;
  kind: string;
  label?: string;
  size: Size;
  strainIncrement: number;
  accumulatedStrain: number;
  coldWorkPct: number;
  flowStress: number;
  reloadYield: number;
  tensileStrength: number;
  yieldRatio: number;
  remainingUniformStrain: number;
  remainingUniformElongationPct: number;
  elasticRecoveryStrain: number;
  recoveredElasticEnergy: number;
  meanFlowStress: number;
  plasticWork: number;
  /** The step's temper in the material's temper system (null outside it); present only when the material names one. */
  temper?: TemperState | null;
  /** Vickers hardness by Tabor's relation, HV (kgf/mm², the same in SI and US reports). */
  hardnessHV?: number;
  /** Approximate conversions of hardnessHV by the material group's table (only inside its range; `material.hardness.conversionTable`). */
  hardnessHB?: number;
  hardnessHRB?: number;
  hardnessHRC?: number;
  /** Tensile strength estimated from hardnessHV by the conversion table, approximate (stress unit). */
  tensileFromHardness?: number;
  warnings: Warning[];
}

/** The hardness model of the report's material: Tabor's relation and where its factor came from. */
export interface ReportHardness {
  relation: string;
  taborFactor: number;
  representativeStrain: number;
  /** `default` (Tabor's 3 × the Vickers contact ratio), `given` in the plan, or `fitted` to readings. */
  basis: 'default' | 'given' | 'fitted';
  /** 95 % interval of the fitted factor (basis `fitted`). */
  taborFactorInterval?: [number, number];
  readings?: number;
  /** Hardness of the annealed state, HV. */
  initialHV: number;
  conversionTable?: { group: string; source: string; note: string };
}

/** The JSON report, version 1: stresses (and work per volume) in the plan's stress unit, sizes in its length unit. */
export interface ReportV1 {
  reportVersion: 1;
  plan: { name: string; file: string; hash: string; tool: string };
  units: { system: 'SI' | 'US'; stress: string; length: string; strain: string; work: string };
  material: {
    name: string;
    elasticModulus: number;
    flowCurve: Record<string, unknown>;
    source: string;
    /** The material's temper system, when the plan names one. */
    temperSystem?: string;
    /** The grain-growth strain range of the material, when the plan sets one (else the default [0.02, 0.10]). */
    grainGrowthStrain?: [number, number];
    uniformStrain: number;
    initial: { reloadYield: number; tensileStrength: number; uniformElongationPct: number };
    hardness?: ReportHardness;
  };
  steps: ReportStep[];
  targets: TargetResult[];
  allTargetsMet: boolean;
  coldWorkWindow: Ledger['coldWorkWindow'];
  /** Monte Carlo scatter (present only when the plan has a `scatter` section; src/report/scatter.ts). */
  scatter?: ReportScatter;
  cautions: string[];
}

/**
 * Builds the versioned report from a plan and its ledger, converting back to the plan's units.
 * Pure and deterministic: the same plan gives the same report byte for byte.
 */
export function buildReport(plan: LoadedPlan, ledger: Ledger, meta: { hash: string; tool: string; scatter?: ScatterSummary; recordCautions?: readonly string[] }): ReportV1 {
  const u = plan.units;
  const S = u.fromMPa;
  const L = (s: Size): Size => {
    const out: Size = {};
    for (const k of ['thickness', 'width', 'diameter', 'height'] as const) if (s[k] !== undefined) out[k] = u.fromMm(s[k]!);
    return out;
  };
  const m = plan.route.material;
  const stressTargets = new Set(['minYield', 'maxYield', 'minTensile']);
  const step = (r: LedgerRow, i: number): ReportStep => {
    const label = (plan.doc.steps[i] as { label?: string } | undefined)?.label;
    return {
      index: r.index,
      kind: r.kind,
      ...(label !== undefined ? { label } : {}),
      size: L(r.size),
      strainIncrement: r.strainIncrement,
      accumulatedStrain: r.accumulatedStrain,
      coldWorkPct: r.coldWorkPct,
      flowStress: S(r.flowStress),
      reloadYield: S(r.reloadYield),
      tensileStrength: S(r.tensileStrength),
      yieldRatio: r.yieldRatio,
      remainingUniformStrain: r.remainingUniformStrain,
      remainingUniformElongationPct: r.remainingUniformElongationPct,
      elasticRecoveryStrain: r.elasticRecoveryStrain,
      recoveredElasticEnergy: S(r.recoveredElasticEnergy),
      meanFlowStress: S(r.meanFlowStress),
      plasticWork: S(r.plasticWork),
      ...(r.drawingStress !== undefined ? { drawingStress: S(r.drawingStress) } : {}),
      ...(r.drawingForce !== undefined ? { drawingForce: u.fromN(r.drawingForce) } : {}),
      ...(r.drawabilityRatio !== undefined ? { drawabilityRatio: r.drawabilityRatio } : {}),
      ...(r.maxAreaReductionPct !== undefined ? { maxAreaReductionPct: r.maxAreaReductionPct } : {}),
      ...(r.rollForce !== undefined ? { rollForce: u.fromN(r.rollForce) } : {}),
      ...(r.rollTorque !== undefined ? { rollTorque: u.fromNm(r.rollTorque) } : {}),
      ...(r.temperatureRise !== undefined ? { temperatureRise: r.temperatureRise } : {}),
      ...(r.formingLimitMajorStrain !== undefined ? { formingLimitMajorStrain: r.formingLimitMajorStrain } : {}),
      ...(r.reverseReloadYield !== undefined ? { reverseReloadYield: S(r.reverseReloadYield) } : {}),
      ...(r.kinematicReloadYield !== undefined ? { kinematicReloadYield: S(r.kinematicReloadYield) } : {}),
      ...(r.outerFibreStrain !== undefined ? { outerFibreStrain: r.outerFibreStrain } : {}),
      ...(r.springbackDeg !== undefined ? { springbackDeg: r.springbackDeg } : {}),
      ...(r.finalAngleDeg !== undefined ? { finalAngleDeg: r.finalAngleDeg } : {}),
      ...(r.finalRadius !== undefined ? { finalRadius: r.finalRadius === null ? null : u.fromMm(r.finalRadius) } : {}),
      ...(r.temper !== undefined ? { temper: r.temper } : {}),
      hardnessHV: r.hardnessHV,
      ...conversions(r.hardnessHV),
      warnings: r.warnings,
    };
  };
  // Approximate conversions of the Vickers estimate, only where the material's table covers the value.
  const group = m.hardness?.conversionGroup;
  const conversions = (hv: number): Partial<ReportStep> => {
    if (!group) return {};
    const c = hardnessConversions(hv, group);
    const out: Partial<ReportStep> = {};
    if (c.HB !== undefined) out.hardnessHB = c.HB;
    if (c.HRB !== undefined) out.hardnessHRB = c.HRB;
    if (c.HRC !== undefined) out.hardnessHRC = c.HRC;
    if (c.Rm !== undefined) out.tensileFromHardness = S(c.Rm);
    return out;
  };
  const hm = m.hardness ?? defaultHardnessModel();
  const hardness: ReportHardness = {
    relation: 'HV = c·σ(ε̄ + εr)/9.80665 (Tabor), σ the flow curve in MPa, HV in kgf/mm²',
    taborFactor: hm.taborFactor,
    representativeStrain: hm.representativeStrain,
    basis: hm.basis,
    ...(hm.taborFactorInterval ? { taborFactorInterval: [hm.taborFactorInterval[0], hm.taborFactorInterval[1]] as [number, number] } : {}),
    ...(hm.readings !== undefined ? { readings: hm.readings } : {}),
    initialHV: ledger.initial.hardnessHV,
    ...(group ? { conversionTable: { group, source: CONVERSION_TABLES[group].source, note: `approximate; given only inside the table's range (HB, HRB, HRC, Rm each have their own), blank outside it` } } : {}),
  };
  const lawOut = convertLaw({ law: m.law.law, ...m.law.params } as never, S) as unknown as Record<string, unknown>;
  // Keep parameter order as in the law's table, for stable output.
  const flowCurve: Record<string, unknown> = { law: m.law.law };
  for (const p of LAW_PARAMETERS[m.law.law]) flowCurve[p.name] = lawOut[p.name];
  return {
    reportVersion: REPORT_VERSION,
    plan: { name: plan.doc.name, file: plan.file, hash: meta.hash, tool: meta.tool },
    units: { system: u.system, stress: u.stress, length: u.length, strain: 'true (logarithmic), dimensionless', work: `${u.stress} (energy per volume)` },
    material: {
      name: m.name,
      elasticModulus: S(m.elasticModulus),
      flowCurve,
      source: m.source ?? 'given in the plan',
      ...(m.temperSystem !== undefined ? { temperSystem: m.temperSystem } : {}),
      ...(m.grainGrowthStrain !== undefined ? { grainGrowthStrain: [m.grainGrowthStrain[0], m.grainGrowthStrain[1]] as [number, number] } : {}),
      uniformStrain: ledger.uniformStrain,
      initial: {
        reloadYield: S(ledger.initial.reloadYield),
        tensileStrength: S(ledger.initial.tensileStrength),
        uniformElongationPct: ledger.initial.remainingUniformElongationPct,
      },
      hardness,
    },
    steps: ledger.rows.map(step),
    targets: ledger.targets.map((t) => stressTargets.has(t.name) || t.temper?.basis === 'tensileStrength'
      ? { ...t, limit: S(t.limit), predicted: S(t.predicted), margin: S(t.margin), ...(t.temper ? { temper: { ...t.temper, from: S(t.temper.from), to: t.temper.to === null ? null : S(t.temper.to) } } : {}) }
      : { ...t }),
    allTargetsMet: ledger.allTargetsMet,
    coldWorkWindow: ledger.coldWorkWindow,
    // Scatter: computed here on one thread unless the runner already sampled it on worker threads (same numbers).
    ...(plan.scatter ? { scatter: scatterReport(plan.scatter, meta.scatter ?? withLocation(plan.file, plan.loc, () => runScatter(plan.scatter!)), u) } : {}),
    // What the analysis of a record the law was fitted to warned (src/cli/recordLaw.ts, recordCautions), after the usual ones.
    cautions: [...CAUTIONS, ...(m.temperSystem !== undefined ? [TEMPER_CAUTION] : []), ...(meta.recordCautions ?? [])],
  };
}
