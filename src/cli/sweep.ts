import { PlanError, type Problem } from '../plan/problems.js';
import { CAUTIONS } from '../report/cautions.js';
import type { ReportV1 } from '../report/build.js';
import { csvLine } from '../report/csv.js';
import { provenance } from '../report/fields.js';
import { mdText } from '../report/md.js';
import { alignTable } from '../report/table.js';
import { evaluateSource, type PlanSource } from './evaluate.js';
import { showPath, type Override, type Sweep } from './overrides.js';
import type { Progress } from './progress.js';
import { formatNumber, targetUnit, targetUnitKind } from '../report/numbers.js';
import { targetLabel } from '../report/labels.js';

/** One value of a sweep: the final state's strengths and each target's margin, or why it is invalid. */
export interface SweepRow {
  value: number;
  exit: 0 | 1 | 2;
  allTargetsMet: boolean | null;
  reloadYield: number | null;
  tensileStrength: number | null;
  remainingUniformElongationPct: number | null;
  targets: { name: string; margin: number; met: boolean; temperBasis?: string }[];
  problem?: string;
}

export interface SweepResult {
  path: string;
  sweep: { from: number; to: number; step: number };
  report: ReportV1 | undefined;
  rows: SweepRow[];
}

/**
 * Runs one plan once per sweep value (the sweep is one more `--set` after the others). A value that
 * makes the plan invalid (e.g. a reduction of 100 %) gives a row marked invalid with the reason;
 * the sweep goes on. Rows come in the order of the values.
 */
export async function runSweep(src: PlanSource, sweep: Sweep, overrides: readonly Override[], progress: Progress): Promise<SweepResult> {
  const rows: SweepRow[] = [];
  let first: ReportV1 | undefined;
  for (const value of sweep.values) {
    try {
      const r = await evaluateSource(src, [...overrides, { text: `${showPath(sweep.path)}=${value}`, path: sweep.path, value }]);
      first ??= r;
      const last = r.steps[r.steps.length - 1];
      rows.push({
        value, exit: r.allTargetsMet ? 0 : 1, allTargetsMet: r.allTargetsMet,
        reloadYield: last?.reloadYield ?? r.material.initial.reloadYield,
        tensileStrength: last?.tensileStrength ?? r.material.initial.tensileStrength,
        remainingUniformElongationPct: last?.remainingUniformElongationPct ?? r.material.initial.uniformElongationPct,
        targets: r.targets.map((t) => ({ name: t.name, margin: t.margin, met: t.met, ...(t.temper ? { temperBasis: t.temper.basis } : {}) })),
      });
    } catch (e) {
      if (!(e instanceof PlanError)) throw e;
      // A bad --set path or plan-wide problem is the same for every value: stop at once.
      if (e.problems.some((p: Problem) => p.file === '(command line)')) throw e;
      rows.push({ value, exit: 2, allTargetsMet: null, reloadYield: null, tensileStrength: null, remainingUniformElongationPct: null, targets: [], problem: e.problems.map((p) => `${p.path ? p.path + ': ' : ''}${p.message}`).join('; ') });
    }
    progress.tick();
  }
  return { path: showPath(sweep.path), sweep: { from: sweep.from, to: sweep.to, step: sweep.step }, report: first, rows };
}

function targetNames(res: SweepResult): string[] {
  const names: string[] = [];
  for (const r of res.rows) for (const t of r.targets) if (!names.includes(t.name)) names.push(t.name);
  return names;
}

/** The basis of a temper target's margin (its unit), from the first row that has it. */
function temperBasisOf(rows: readonly SweepRow[], name: string): string | undefined {
  for (const r of rows) for (const t of r.targets) if (t.name === name && t.temperBasis !== undefined) return t.temperBasis;
  return undefined;
}

function header(res: SweepResult): string[] {
  const S = res.report?.units.stress ?? '';
  return [res.path, `Rp0.2 ${S}`, `Rm ${S}`, 'Ag left %', ...targetNames(res).map((n) => `margin ${targetLabel(n)} ${targetUnit(n, S, temperBasisOf(res.rows, n))}`), 'verdict'];
}

function cells(res: SweepRow, names: string[], S: string): string[] {
  return [
    String(res.value), formatNumber(res.reloadYield, 'stress', S), formatNumber(res.tensileStrength, 'stress', S), formatNumber(res.remainingUniformElongationPct, 'percent'),
    ...names.map((n) => { const t = res.targets.find((x) => x.name === n); return t ? formatNumber(t.margin, targetUnitKind(n, t.temperBasis), S) : '—'; }),
    res.exit === 2 ? `invalid: ${res.problem}` : res.allTargetsMet ? 'met' : 'NOT MET',
  ];
}


/** Plan, file hash and tool, the law and its source: the provenance lines of a sweep. */
function provenanceLines(res: SweepResult): string[] {
  return res.report ? provenance(res.report).filter((p) => p.label !== 'overrides').map((p) => `${p.label}: ${p.value}`) : [];
}

/** The sweep as an aligned table with provenance and cautions (each margin in its target's unit, `numbers.ts` precision). */
export function sweepTable(res: SweepResult): string {
  const names = targetNames(res);
  const out = [...provenanceLines(res), `sweep: ${res.path} from ${res.sweep.from} to ${res.sweep.to} step ${res.sweep.step}; margin > 0 is room to spare`, ''];
  out.push(alignTable(header(res), res.rows.map((r) => cells(r, names, res.report?.units.stress ?? 'MPa'))));
  out.push('', 'cautions:', ...(res.report?.cautions ?? CAUTIONS).map((c) => `  - ${c}`));
  return out.join('\n') + '\n';
}

/** The sweep as CSV (RFC 4180): one row per value, numbers at full precision, margins per target. */
export function sweepCsv(res: SweepResult): string {
  const names = targetNames(res);
  let s = csvLine([res.path, 'reloadYield', 'tensileStrength', 'remainingUniformElongationPct', ...names.flatMap((n) => [`${n}.margin`, `${n}.met`]), 'allTargetsMet', 'exit', 'problem']);
  for (const r of res.rows) {
    s += csvLine([r.value, r.reloadYield, r.tensileStrength, r.remainingUniformElongationPct,
      ...names.flatMap((n) => { const t = r.targets.find((x) => x.name === n); return [t?.margin, t?.met]; }), r.allTargetsMet, r.exit, r.problem ?? '']);
  }
  return s;
}

/** The sweep as JSON: path and range, the base plan's provenance and units, one row per value, cautions. */
export function sweepJson(res: SweepResult): string {
  const r = res.report;
  return JSON.stringify({
    sweep: { path: res.path, ...res.sweep },
    plan: r ? { name: r.plan.name, file: r.plan.file, tool: r.plan.tool } : null,
    units: r?.units ?? null,
    rows: res.rows,
    cautions: r?.cautions ?? CAUTIONS,
  }, null, 2) + '\n';
}

/** The sweep as Markdown, with provenance and cautions. */
export function sweepMd(res: SweepResult): string {
  const names = targetNames(res);
  const h = header(res);
  const out = [`# Sweep of ${mdText(res.path)}: ${mdText(res.report?.plan.name ?? '')}`, ''];
  for (const l of provenanceLines(res)) out.push(`- ${mdText(l)}`);
  out.push('', `From ${res.sweep.from} to ${res.sweep.to} in steps of ${res.sweep.step}; margin > 0 is room to spare.`, '');
  out.push(`| ${h.map(mdText).join(' | ')} |`, `| ${h.map((_, i) => (i === h.length - 1 ? '---' : '---:')).join(' | ')} |`);
  for (const r of res.rows) out.push(`| ${cells(r, names, res.report?.units.stress ?? 'MPa').map(mdText).join(' | ')} |`);
  out.push('', '## Cautions', '', ...(res.report?.cautions ?? CAUTIONS).map((c) => `- ${mdText(c)}`));
  return out.join('\n') + '\n';
}
