import { formatNumber } from './numbers.js';
import { parseHTML } from 'linkedom';
import { REPORT_CHART_WIDTH, ductilityByStepChart, strengthByStepChart } from '../charts/ledger.js';
import { hardnessByStepChart } from '../charts/hardness.js';
import { PALETTE } from '../charts/palette.js';
import type { ReportV1 } from './build.js';
import { ledgerBasisNote, stepColumns, targetNumber, targetUnit, cautionedVerdict, targetName, targetNote, targetStatus, windowText } from './columns.js';
import { extraSections, provenance } from './fields.js';
import { scatterView } from './scatter.js';

/** Escapes text for HTML content and double-quoted attributes. */
export function htmlText(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

function table(header: string[], rows: string[][], numeric: boolean[]): string {
  const th = header.map((h, i) => `<th${numeric[i] ? ' class="num"' : ''}>${htmlText(h)}</th>`).join('');
  const trs = rows.map((r) => `<tr>${r.map((c, i) => `<td${numeric[i] ? ' class="num"' : ''}>${htmlText(c)}</td>`).join('')}</tr>`).join('\n');
  return `<table>\n<thead><tr>${th}</tr></thead>\n<tbody>\n${trs}\n</tbody>\n</table>`;
}

const STYLE = `body{font-family:system-ui,-apple-system,"Segoe UI",sans-serif;color:${PALETTE.ink};max-width:72rem;margin:2rem auto;padding:0 1rem;line-height:1.4}
table{border-collapse:collapse;margin:.5rem 0 1rem;font-size:.9rem}th,td{border-bottom:1px solid ${PALETTE.grid};padding:.25rem .6rem;text-align:left}
.num{text-align:right;font-variant-numeric:tabular-nums}.met{color:${PALETTE.met};font-weight:600}.missed{color:${PALETTE.missed};font-weight:600}
.caution{border-left:4px solid ${PALETTE.missed};background:#fbf3f2;padding:.5rem 1rem}dl{display:grid;grid-template-columns:max-content 1fr;gap:.2rem 1rem}dt{font-weight:600}dd{margin:0;overflow-wrap:anywhere}
figure{margin:1rem 0}`;

/**
 * One self-contained HTML file (no scripts, no external requests): provenance, the cautions, the
 * ledger and target tables, and two charts drawn as inline SVG by @observablehq/plot on linkedom's
 * DOM — the same chart functions the notebooks call with the browser's DOM. Numbers are rounded as
 * in {@link stepColumns}.
 */
export function htmlReport(r: ReportV1): string {
  const { document } = parseHTML('<!DOCTYPE html><html><head></head><body></body></html>');
  const chartSteps = r.steps.map((s) => ({ index: s.index, kind: s.kind, reloadYield: s.reloadYield, tensileStrength: s.tensileStrength, remainingUniformElongationPct: s.remainingUniformElongationPct, coldWorkPct: s.coldWorkPct }));
  const limit = (name: string) => r.targets.find((t) => t.name === name)?.limit;
  // A caption names the shaded band only when the plan has that target (and so the chart draws one).
  const band = (lo: string, hi: string | undefined, what: string) =>
    (limit(lo) !== undefined || (hi !== undefined && limit(hi) !== undefined) ? `; the shaded band is the ${what} target` : '');
  const opt = <T extends object>(o: T) => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
  const i0 = r.material.initial;
  const start = { reloadYield: i0.reloadYield, tensileStrength: i0.tensileStrength, remainingUniformElongationPct: i0.uniformElongationPct };
  // A fixed width (the report has no script to measure its page); the SVG scales down on narrower
  // screens (Plot's max-width: 100 %).
  const strength = strengthByStepChart(chartSteps, opt({ stressUnit: r.units.stress, start, minYield: limit('minYield'), maxYield: limit('maxYield'), width: REPORT_CHART_WIDTH, document: document as unknown as Document }));
  const ductility = ductilityByStepChart(chartSteps, opt({ stressUnit: r.units.stress, start, minRemainingElongationPct: limit('minRemainingElongationPct'), width: REPORT_CHART_WIDTH, document: document as unknown as Document }));
  const cols = stepColumns(r);
  const verdict = r.targets.length === 0 ? '<p>No targets given.</p>'
    : `<p class="${r.allTargetsMet ? 'met' : 'missed'}">${r.allTargetsMet ? htmlText(`All targets met${cautionedVerdict(r)}.`) : 'A target is NOT met.'}</p>`;
  const parts: string[] = [];
  parts.push(`<!DOCTYPE html>\n<html lang="en">\n<head>\n<meta charset="utf-8">\n<meta name="viewport" content="width=device-width, initial-scale=1">`);
  parts.push(`<title>${htmlText(r.plan.name)} — strainledger report</title>\n<style>\n${STYLE}\n</style>\n</head>\n<body>`);
  parts.push(`<h1>${htmlText(r.plan.name)}</h1>`);
  parts.push(`<div class="caution" role="note"><strong>Caution.</strong> ${htmlText(r.cautions[0] ?? '')} ${htmlText(r.cautions[1] ?? '')}</div>`);
  parts.push(verdict);
  parts.push('<h2>Provenance</h2>\n<dl>');
  for (const p of provenance(r)) parts.push(`<dt>${htmlText(p.label)}</dt><dd>${htmlText(p.value)}</dd>`);
  parts.push('</dl>');
  parts.push('<h2>Annealed state</h2>');
  parts.push(`<p>Rp0.2 ${formatNumber(r.material.initial.reloadYield, 'stress', r.units.stress)} ${htmlText(r.units.stress)}, Rm ${formatNumber(r.material.initial.tensileStrength, 'stress', r.units.stress)} ${htmlText(r.units.stress)}, uniform elongation ${r.material.initial.uniformElongationPct.toFixed(1)} %, Considère uniform true strain ${r.material.uniformStrain.toFixed(4)}.</p>`);
  parts.push('<h2>Ledger</h2>');
  parts.push(table(cols.map((c) => c.header), r.steps.map((s) => cols.map((c) => c.cell(s))), cols.map((c) => c.numeric)));
  parts.push(`<p>${htmlText(ledgerBasisNote(r))}</p>`);
  parts.push(`<figure>${strength.outerHTML}<figcaption>Reload yield Rp0.2 (solid) and tensile strength Rm (dashed) after each step (step 0: the starting stock). Each value holds until the next step changes it, so it is drawn as a step${band('minYield', 'maxYield', 'yield')}.</figcaption></figure>`);
  parts.push(`<figure>${ductility.outerHTML}<figcaption>Remaining uniform elongation (solid) and %CW since the last anneal (dashed) after each step (step 0: the starting stock), drawn as steps${band('minRemainingElongationPct', undefined, 'elongation')}.</figcaption></figure>`);
  if (r.steps.some((s) => s.hardnessHV !== undefined)) {
    const hv = hardnessByStepChart(r.steps, opt({ initialHV: r.material.hardness?.initialHV, minHardnessHV: limit('minHardnessHV'), maxHardnessHV: limit('maxHardnessHV'), width: REPORT_CHART_WIDTH, document: document as unknown as Document }));
    parts.push(`<figure>${hv.outerHTML}<figcaption>Vickers hardness estimated by Tabor's relation after each step (step 0: the starting stock), drawn as steps${band('minHardnessHV', 'maxHardnessHV', 'hardness')}. An estimate: release parts by measured hardness.</figcaption></figure>`);
  }
  parts.push('<h2>Targets</h2>');
  if (r.targets.length === 0) parts.push('<p>No targets given.</p>');
  else {
    parts.push(table(['target', 'status', 'limit', 'predicted', 'margin', 'unit'],
      r.targets.map((t) => [targetName(t) + targetNote(r, t), targetStatus(t), targetNumber(r, t.name, t.limit), targetNumber(r, t.name, t.predicted), targetNumber(r, t.name, t.margin), targetUnit(r, t.name)]),
      [false, false, true, true, true, false]));
  }
  parts.push(`<p><strong>Cold-work window:</strong> ${htmlText(windowText(r))}</p>`);
  const warned = r.steps.flatMap((s) => s.warnings.map((w) => `step ${s.index}: ${w.message}`));
  if (warned.length) parts.push('<h2>Warnings</h2>\n<ul>\n' + warned.map((w) => `<li>${htmlText(w)}</li>`).join('\n') + '\n</ul>');
  if (r.scatter) {
    const v = scatterView(r.scatter, r.units.stress);
    parts.push('<h2>Scatter</h2>', ...v.sentences.map((x) => `<p>${htmlText(x)}</p>`));
    for (const t of v.tables) parts.push(`<h3>${htmlText(t.title)}</h3>`, table(t.header, t.rows, t.numeric));
    parts.push(`<div class="caution" role="note">${v.cautions.map((c) => `<p><strong>Caution.</strong> ${htmlText(c)}</p>`).join('')}</div>`);
  }
  for (const [k, v] of extraSections(r)) if (k !== 'scatter') parts.push(`<h2>${htmlText(k)}</h2>\n<pre>${htmlText(JSON.stringify(v, null, 2))}</pre>`);
  parts.push('<h2>Cautions</h2>\n<ul>\n' + r.cautions.map((c) => `<li>${htmlText(c)}</li>`).join('\n') + '\n</ul>');
  parts.push('</body>\n</html>\n');
  return stableIds(parts.join('\n'));
}

/**
 * Plot numbers the ids of markers, clip paths and patterns from a counter that lives as long as the
 * process (`plot-marker-7`), so the same report would differ with what was drawn before it (in a
 * batch, and between `--jobs 1` and `--jobs 2`). Renumbered here in order of first appearance: still
 * unique within the file, and the same file for the same report.
 */
export function stableIds(html: string): string {
  const seen = new Map<string, string>();
  const next = new Map<string, number>();
  return html.replace(/\bplot-(marker|clip|pattern)-(\d+)\b/g, (id, kind: string) => {
    let s = seen.get(id);
    if (s === undefined) {
      const k = (next.get(kind) ?? 0) + 1;
      next.set(kind, k);
      s = `plot-${kind}-${k}`;
      seen.set(id, s);
    }
    return s;
  });
}
