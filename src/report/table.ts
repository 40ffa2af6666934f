import type { ReportV1 } from './build.js';
import { hardnessText } from './fields.js';
import { ledgerBasisNote, stepColumns, temperTargetNote, windowText } from './columns.js';
import { fixed, flowCurveText, formatNumber, formatTargetValue } from './numbers.js';
import { scatterLines } from './scatter.js';


/**
 * Pads cells into aligned columns: numbers right, text left. `numeric` says which columns hold
 * numbers (the step columns know it); without it a column is numeric when every cell looks like one.
 */
export function alignTable(header: string[], rows: string[][], numeric: readonly boolean[] = header.map((_, i) => rows.every((r) => /^[-+]?[\d.]+%?$|^—$/.test(r[i] ?? '')))): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) => cells.map((c, i) => (numeric[i] ? c.padStart(widths[i]!) : c.padEnd(widths[i]!))).join('  ').trimEnd();
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

/** A plain aligned text report for a terminal. `color` adds ANSI colours (only on a TTY). */
export function tableReport(r: ReportV1, color = false): string {
  const S = r.units.stress;
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
  // The same columns as the Markdown and HTML ledgers (columns.ts); codes comma-joined without a space to keep the terminal table narrow.
  const cols = stepColumns(r, ',');
  out.push(alignTable(cols.map((c) => c.header), r.steps.map((s) => cols.map((c) => c.cell(s))), cols.map((c) => c.numeric)));
  out.push(ledgerBasisNote(r));
  out.push('');
  if (r.targets.length === 0) out.push('targets: none given');
  for (const t of r.targets) {
    const v = (x: number) => formatTargetValue(x, t.name, S, t.temper?.basis);
    out.push(paint(t.met, `${t.met ? 'MET    ' : 'NOT MET'} ${t.name}: predicted ${v(t.predicted)}, limit ${v(t.limit)}, margin ${v(t.margin)}${temperTargetNote(t)}`));
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
