import { formatProblem } from '../plan/problems.js';
import { formatTargetValue } from '../report/numbers.js';
import { targetLabel } from '../report/labels.js';
import { alignTable } from '../report/table.js';
import type { Outcome } from './batch.js';

const VERDICT = { 0: 'met', 1: 'NOT MET', 2: 'invalid', 3: 'error' } as const;

/**
 * The tightest target of a report and its margin in that target's own unit (`4.1 MPa (minYield)`,
 * `0.41° (maxSpringbackDeg)`). Targets in different units are compared by margin relative to
 * their limit (margin / |limit|; the margin itself for a zero limit), never MPa against degrees.
 */
export function tightest(o: Outcome): string {
  const r = o.report;
  if (!r || r.targets.length === 0) return '—';
  const rel = (t: { margin: number; limit: number }) => (t.limit !== 0 ? t.margin / Math.abs(t.limit) : t.margin);
  const t = r.targets.reduce((a, b) => (rel(b) < rel(a) ? b : a));
  return `${formatTargetValue(t.margin, t.name, r.units.stress, t.temper?.basis)}, ${targetLabel(t.name, t.temper?.wanted, t.temper?.wantedName)}`;
}

/**
 * One summary table for a batch: plan file, plan name, verdict, targets met, the tightest margin and
 * the exit code, then a count line. Colour (green / red) only when asked (a TTY).
 */
export function summaryTable(outcomes: readonly Outcome[], color = false): string {
  const paint = (code: number, s: string) => (!color ? s : `\x1b[${code === 0 ? 32 : 31}m${s}\x1b[0m`);
  const rows = outcomes.map((o) => [
    o.file,
    o.report?.plan.name ?? '—',
    VERDICT[o.exit],
    o.report ? `${o.report.targets.filter((t) => t.met).length}/${o.report.targets.length}` : '—',
    tightest(o),
    String(o.exit),
  ]);
  const table = alignTable(['plan file', 'plan', 'verdict', 'targets met', 'tightest margin', 'exit'], rows).split('\n');
  const lines = table.map((l, i) => (i < 2 ? l : paint(outcomes[i - 2]!.exit, l)));
  const count = (c: number) => outcomes.filter((o) => o.exit === c).length;
  lines.push('', `${outcomes.length} plan${outcomes.length === 1 ? '' : 's'}: ${count(0)} met, ${count(1)} not met, ${count(2)} invalid${count(3) ? `, ${count(3)} internal errors` : ''}; exit ${worstExit(outcomes)}`);
  return lines.join('\n') + '\n';
}

/** The worst exit code: 3 internal > 2 invalid > 1 missed > 0 met. */
export function worstExit(outcomes: readonly { exit: number }[]): number {
  return outcomes.reduce((w, o) => Math.max(w, o.exit), 0);
}

/** The problems of invalid plans and internal errors, one line each, for stderr. */
export function problemLines(outcomes: readonly Outcome[]): string {
  return outcomes.flatMap((o) => o.problems?.map(formatProblem) ?? (o.internal ? [`${o.file}: internal error: ${o.internal}`] : [])).map((l) => l + '\n').join('');
}
