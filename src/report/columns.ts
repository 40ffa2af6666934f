import { extraFieldHeader, formatNumber, targetUnit as unitOfTarget, targetUnitKind } from './numbers.js';
import type { ReportStep, ReportV1 } from './build.js';
import { conversionHeader, extraStepFields, sizeText, stepNumber } from './fields.js';
import { sig4 } from '../core/numeric/sig4.js';

/** One column of the human-readable step tables (Markdown, HTML), rounded as a reader needs it. */
export interface StepColumn {
  header: string;
  numeric: boolean;
  cell(s: ReportStep): string;
}

/**
 * The step columns of every human-readable report (text table, Markdown, HTML), in the plan's units,
 * each at its kind's precision in `DISPLAY_DIGITS` (numbers.ts: strains 4 decimals, stresses 0.1 MPa
 * or 0.01 ksi, percentages 0.1, elastic recovery in percent 3 decimals, HV 0.1); then every extra numeric step field (4 significant figures), then the warning codes
 * joined by `warningSeparator`.
 */
export function stepColumns(r: ReportV1, warningSeparator = ', '): StepColumn[] {
  const S = r.units.stress;
  const cols: StepColumn[] = [
    { header: 'step', numeric: true, cell: (s) => String(s.index) },
    { header: 'kind', numeric: false, cell: (s) => (s.label ? `${s.kind} (${s.label})` : s.kind) },
    { header: `size ${r.units.length}`, numeric: false, cell: (s) => sizeText(s.size) },
    { header: 'Δε', numeric: true, cell: (s) => formatNumber(s.strainIncrement, 'strain') },
    { header: 'ε̄ since anneal', numeric: true, cell: (s) => formatNumber(s.accumulatedStrain, 'strain') },
    { header: '%CW', numeric: true, cell: (s) => formatNumber(s.coldWorkPct, 'percent') },
    { header: `Rp0.2 ${S}`, numeric: true, cell: (s) => formatNumber(s.reloadYield, 'stress', S) },
    { header: `Rm ${S}`, numeric: true, cell: (s) => formatNumber(s.tensileStrength, 'stress', S) },
    { header: 'Rp/Rm', numeric: true, cell: (s) => formatNumber(s.yieldRatio, 'ratio') },
    { header: 'Ag left %', numeric: true, cell: (s) => formatNumber(s.remainingUniformElongationPct, 'percent') },
    { header: 'recovery %', numeric: true, cell: (s) => formatNumber(s.elasticRecoveryStrain * 100, 'recoveryPct') },
  ];
  // Vickers hardness (Tabor estimate) to 0.1 HV, in its own column when the report has it.
  if (r.steps.some((s) => s.hardnessHV !== undefined)) cols.push({ header: 'HV', numeric: true, cell: (s) => formatNumber(s.hardnessHV, 'hardness') });
  for (const key of extraStepFields(r.steps).filter((k) => k !== 'hardnessHV')) cols.push({ header: conversionHeader(key, S) ?? extraFieldHeader(key, r.units), numeric: true, cell: (s) => sig4(stepNumber(s, key)) });
  if (hasTemper(r)) cols.push({ header: 'temper', numeric: false, cell: temperText });
  cols.push({ header: 'warnings', numeric: false, cell: (s) => s.warnings.map((w) => w.code).join(warningSeparator) });
  return cols;
}

/** One sentence under every ledger table: the basis of its stresses and strains (docs/bases-and-units.md). */
export function ledgerBasisNote(r: ReportV1): string {
  const kin = extraStepFields(r.steps).some((k) => /ReloadYield$/.test(k));
  return `Rp0.2, Rm${kin ? ' and the reload yields' : ''}: engineering stresses on the part's own section after the step; Δε, ε̄ since anneal: true equivalent plastic strain (a full anneal resets ε̄ to 0).`;
}

/** The cold-work window in one sentence. */
export function windowText(r: ReportV1): string {
  const w = r.coldWorkWindow;
  if (w.empty) return `empty — ${w.note}`;
  const red = w.reductionBasis && w.reductionPctFrom !== null
    ? `; ${w.reductionBasis} reduction ${w.reductionPctFrom.toFixed(1)} % to ${w.reductionPctTo === null ? 'no limit' : w.reductionPctTo.toFixed(1) + ' %'}`
    : '';
  return w.note + red;
}

/** Whether the report's steps carry tempers (the material names a temper system). */
export function hasTemper(r: ReportV1): boolean {
  return r.steps.some((s) => s.temper !== undefined);
}

/**
 * A step's temper for a human report: the designation and how far it is toward the next temper,
 * `H02 (49 % to H03)`; the top temper alone (`H10`); `—` outside the system or without one.
 */
export function temperText(s: ReportStep): string {
  const t = s.temper;
  if (!t) return '—';
  return t.next === null || t.towardNext === null ? t.designation : `${t.designation} (${Math.floor(t.towardNext * 100)} % of the way to ${t.next})`;
}

/** For a temper target, the tempers wanted and reached in words (` — H04 wanted, H02 reached`); '' for other targets. */
export function temperTargetNote(t: ReportV1['targets'][number]): string {
  return t.temper ? ` — ${t.temper.wanted} wanted, ${t.temper.got ?? 'none of the system'} reached` : '';
}

/** The basis of a report's temper target (what its limit and margin measure), if it has one. */
function temperBasisOf(r: ReportV1, name: string): string | undefined {
  return name === 'temper' ? r.targets.find((t) => t.name === 'temper')?.temper?.basis : undefined;
}

/** The unit of a target's limit, predicted value and margin (see `numbers.ts`). */
export function targetUnit(r: ReportV1, name: string): string {
  return unitOfTarget(name, r.units.stress, temperBasisOf(r, name));
}

/** A target's limit, predicted value or margin at its kind's precision, without the unit. */
export function targetNumber(r: ReportV1, name: string, x: number): string {
  return formatNumber(x, targetUnitKind(name, temperBasisOf(r, name)), r.units.stress);
}
