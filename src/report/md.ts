import type { ReportV1 } from './build.js';
import { ledgerBasisNote, stepColumns, targetNumber, targetUnit, cautionedVerdict, targetName, targetNote, targetStatus, windowText } from './columns.js';
import { extraSections, provenance } from './fields.js';
import { scatterView } from './scatter.js';

/** Escapes text for a Markdown table cell or line (pipes, backslashes, HTML-significant brackets). */
export function mdText(s: string): string {
  return s.replace(/\\/g, '\\\\').replace(/\|/g, '\\|').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/\r?\n/g, ' ');
}

function mdTable(header: string[], rows: string[][], numeric: boolean[]): string {
  const lines = [`| ${header.map(mdText).join(' | ')} |`, `| ${numeric.map((n) => (n ? '---:' : '---')).join(' | ')} |`];
  for (const r of rows) lines.push(`| ${r.map(mdText).join(' | ')} |`);
  return lines.join('\n');
}

/**
 * A readable Markdown report (CommonMark with GFM tables): provenance, the annealed state, the
 * ledger table, the targets with margins, the cold-work window, warnings, the scatter section when
 * the plan has one, and the cautions. Numbers
 * are rounded as in {@link stepColumns}; targets to 2 decimals.
 */
export function mdReport(r: ReportV1): string {
  const S = r.units.stress;
  const out: string[] = [];
  out.push(`# ${mdText(r.plan.name)}`, '');
  out.push(`**Verdict:** ${r.targets.length === 0 ? 'no targets given' : r.allTargetsMet ? `all targets met${cautionedVerdict(r)}` : 'a target is NOT met'}`, '');
  out.push('## Provenance', '');
  for (const p of provenance(r)) out.push(`- ${p.label}: ${mdText(p.value)}`);
  out.push('', '## Annealed state', '');
  out.push(`Rp0.2 ${r.material.initial.reloadYield.toFixed(1)} ${S}, Rm ${r.material.initial.tensileStrength.toFixed(1)} ${S}, uniform elongation ${r.material.initial.uniformElongationPct.toFixed(1)} %, Considère uniform true strain ${r.material.uniformStrain.toFixed(4)}.`);
  out.push('', '## Ledger', '');
  const cols = stepColumns(r);
  out.push(mdTable(cols.map((c) => c.header), r.steps.map((s) => cols.map((c) => c.cell(s))), cols.map((c) => c.numeric)));
  out.push('', mdText(ledgerBasisNote(r)));
  out.push('', '## Targets', '');
  if (r.targets.length === 0) out.push('No targets given.');
  else {
    out.push(mdTable(['target', 'status', 'limit', 'predicted', 'margin', 'unit'],
      r.targets.map((t) => [targetName(t) + targetNote(r, t), targetStatus(t), targetNumber(r, t.name, t.limit), targetNumber(r, t.name, t.predicted), targetNumber(r, t.name, t.margin), targetUnit(r, t.name)]),
      [false, false, true, true, true, false]));
  }
  out.push('', `**Cold-work window:** ${mdText(windowText(r))}`);
  const warned = r.steps.flatMap((s) => s.warnings.map((w) => `step ${s.index}: ${w.message}`));
  if (warned.length) {
    out.push('', '## Warnings', '');
    for (const w of warned) out.push(`- ${mdText(w)}`);
  }
  if (r.scatter) {
    const v = scatterView(r.scatter, S);
    out.push('', '## Scatter');
    for (const x of v.sentences) out.push('', mdText(x));
    for (const t of v.tables) out.push('', `**${mdText(t.title)}**`, '', mdTable(t.header, t.rows, t.numeric));
    out.push('');
    for (const c of v.cautions) out.push(`- **Caution:** ${mdText(c)}`);
  }
  for (const [k, v] of extraSections(r)) {
    if (k === 'scatter') continue;
    out.push('', `## ${mdText(k)}`, '', '```json', JSON.stringify(v, null, 2), '```');
  }
  out.push('', '## Cautions', '');
  for (const c of r.cautions) out.push(`- ${mdText(c)}`);
  return out.join('\n') + '\n';
}
