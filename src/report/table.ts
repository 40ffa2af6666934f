import type { ReportV1 } from './build.js';
import { conversionHeader, extraStepFields, hardnessText, sig4, stepNumber } from './fields.js';
import { ledgerBasisNote } from './columns.js';
import { extraFieldHeader, flowCurveText, formatNumber, formatTargetValue } from './numbers.js';
import { scatterLines } from './scatter.js';
import { WARNING_LABELS } from './labels.js';
import { hasTemper, targetUnit, targetName, targetNote, temperText, windowText } from './columns.js';

/** Fixed-decimal formatting used by all human-readable reports. */
export function fixed(x: number | null | undefined, digits: number): string {
  if (x === null || x === undefined) return '—';
  return x.toFixed(digits);
}

/** Pads cells into aligned columns: text left, numbers right. */
export function alignTable(header: string[], rows: string[][]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const numeric = header.map((_, i) => rows.every((r) => /^[-+]?[\d.]+%?$|^—$/.test(r[i] ?? '')));
  const line = (cells: string[]) => cells.map((c, i) => (numeric[i] ? c.padStart(widths[i]!) : c.padEnd(widths[i]!))).join('  ').trimEnd();
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

/** A plain aligned text report for a terminal. `color` adds ANSI colours (only on a TTY). */
export function tableReport(r: ReportV1, color = false): string {
  const S = r.units.stress;
  const L = r.units.length;
  const paint = (ok: boolean, s: string) => (color ? `\x1b[${ok ? 32 : 31}m${s}\x1b[0m` : s);
  const out: string[] = [];
  out.push(`${r.plan.name}  (${r.plan.file}, sha256 ${r.plan.hash.slice(0, 12)}, ${r.plan.tool})`);
  const fc = flowCurveText(r.material.flowCurve, S);
  const overrides = (r.plan as { overrides?: string[] }).overrides;
  if (overrides?.length) out.push(`overrides (--set): ${overrides.join('; ')}`);
  out.push(`material: ${r.material.name}; E = ${fixed(r.material.elasticModulus, 0)} ${S}; ${fc} (true stress vs true plastic strain; ${r.material.source})`);
  if (r.material.hardness) out.push(`hardness: ${hardnessText(r.material.hardness)}`);
  out.push(`annealed: Rp0.2 ${formatNumber(r.material.initial.reloadYield, 'stress', S)} ${S}, Rm ${formatNumber(r.material.initial.tensileStrength, 'stress', S)} ${S}, uniform elongation ${fixed(r.material.initial.uniformElongationPct, 1)} %`);
  out.push('');
  const size = (s: Record<string, number | undefined>) => s.thickness !== undefined ? `t ${fixed(s.thickness, 3)}` : s.diameter !== undefined ? `d ${fixed(s.diameter, 3)}` : s.height !== undefined ? `h ${fixed(s.height, 3)}` : '—';
  // Extra numeric step fields added after report v1 (4 significant figures), blank where absent.
  const extras = extraStepFields(r.steps).filter((k) => k !== 'hardnessHV');
  // Vickers hardness (Tabor estimate) to 0.1 HV, in its own column when the report has it.
  const tempers = hasTemper(r);
  const hv = r.steps.some((s) => s.hardnessHV !== undefined) ? ['HV'] : [];
  const rows = r.steps.map((s) => [
    String(s.index), s.label ? `${s.kind} (${s.label})` : s.kind, size(s.size as Record<string, number | undefined>), fixed(s.strainIncrement, 4), fixed(s.accumulatedStrain, 4),
    fixed(s.coldWorkPct, 1), formatNumber(s.reloadYield, 'stress', S), formatNumber(s.tensileStrength, 'stress', S), fixed(s.yieldRatio, 3),
    fixed(s.remainingUniformElongationPct, 1), fixed(s.elasticRecoveryStrain * 100, 3), ...hv.map(() => fixed(s.hardnessHV, 1)), ...extras.map((k) => sig4(stepNumber(s, k))),
    ...(tempers ? [temperText(s)] : []), [...new Set(s.warnings.map((w) => WARNING_LABELS[w.code]))].join(', '),
  ]);
  out.push(alignTable(['step', 'kind', `size ${L}`, 'Δε', 'ε̄ since anneal', '%CW', `Rp0.2 ${S}`, `Rm ${S}`, 'Rp/Rm', 'Ag left %', 'recovery %', ...hv, ...extras.map((k) => conversionHeader(k, S) ?? extraFieldHeader(k, r.units)), ...(tempers ? ['temper'] : []), 'warnings'], rows));
  out.push(ledgerBasisNote(r));
  out.push('');
  if (r.targets.length === 0) out.push('targets: none given');
  for (const t of r.targets) {
    const v = (x: number) => formatTargetValue(x, t.name, S, t.temper?.basis);
    out.push(paint(t.met, `${t.met ? (t.caution ? 'MET?   ' : 'MET    ') : 'NOT MET'} ${targetName(t)}: predicted ${v(t.predicted)}, limit ${v(t.limit)}, margin ${v(t.margin)}${targetNote(r, t)}`));
  }
  out.push(`cold-work window: ${windowText(r)}`);
  const warned = r.steps.flatMap((s) => s.warnings.map((x) => `step ${s.index}: ${x.message}`));
  if (warned.length) {
    out.push('');
    out.push('warnings:');
    for (const x of warned) out.push(`  ${x}`);
  }
  out.push('');
  if (r.scatter) out.push(...scatterLines(r.scatter, r.units.stress), ''); // src/report/scatter.ts
  out.push('cautions:');
  for (const c of r.cautions) out.push(`  - ${c}`);
  return out.join('\n') + '\n';
}
