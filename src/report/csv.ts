import type { ReportV1 } from './build.js';
import { extraStepFields, stepNumber } from './fields.js';

/** One CSV field per RFC 4180: quoted when it holds a comma, quote, CR or LF; quotes doubled. */
export function csvField(v: string | number | boolean | null | undefined): string {
  if (v === null || v === undefined) return '';
  const s = typeof v === 'number' ? String(v) : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One CSV line ending in CRLF (RFC 4180 §2). */
export function csvLine(cells: (string | number | boolean | null | undefined)[]): string {
  return cells.map(csvField).join(',') + '\r\n';
}

const V1_NUMERIC = [
  'strainIncrement', 'accumulatedStrain', 'coldWorkPct', 'flowStress', 'reloadYield', 'tensileStrength', 'yieldRatio',
  'remainingUniformStrain', 'remainingUniformElongationPct', 'elasticRecoveryStrain', 'recoveredElasticEnergy',
  'meanFlowStress', 'plasticWork',
] as const;

/** Header of {@link csvReport}'s rows for a report (extra numeric step fields included). */
export function csvHeader(extras: readonly string[], tempers = false): string[] {
  return ['plan', 'stressUnit', 'lengthUnit', 'index', 'kind', 'label', 'thickness', 'width', 'diameter', 'height', ...V1_NUMERIC, ...extras, ...(tempers ? TEMPER_COLUMNS : []), 'warnings'];
}

/** Temper columns (present when a step carries a temper): designation, its name, the next temper, the fraction of the way to it. */
export const TEMPER_COLUMNS = ['temper', 'temperName', 'temperNext', 'temperTowardNext'] as const;

/**
 * The ledger as CSV (RFC 4180, CRLF line ends, header row): one row per step, numbers at full
 * double precision in the plan's units (stress unit and length unit in their own columns), extra
 * numeric step fields after report v1's, warning codes joined by `;`. Machine-readable: no cautions
 * here; the human-readable formats carry them.
 */
export function csvReport(r: ReportV1, opts: { header?: boolean; extras?: readonly string[]; tempers?: boolean } = {}): string {
  const extras = opts.extras ?? extraStepFields(r.steps);
  const tempers = opts.tempers ?? r.steps.some((s) => s.temper !== undefined);
  let out = opts.header === false ? '' : csvLine(csvHeader(extras, tempers));
  for (const s of r.steps) {
    const row = s as unknown as Record<string, number>;
    out += csvLine([
      r.plan.name, r.units.stress, r.units.length, s.index, s.kind, s.label ?? '',
      s.size.thickness, s.size.width, s.size.diameter, s.size.height,
      ...V1_NUMERIC.map((k) => row[k]), ...extras.map((k) => stepNumber(s, k)),
      ...(tempers ? [s.temper?.designation, s.temper?.name, s.temper?.next, s.temper?.towardNext] : []), s.warnings.map((w) => w.code).join(';'),
    ]);
  }
  return out;
}
