import type { ReportV1 } from './build.js';
import { targetName, targetNote } from './columns.js';
import { formatTargetValue } from './numbers.js';

/** Escapes text for XML 1.0 content and attributes; drops characters XML 1.0 forbids. */
export function xmlText(s: string): string {
  return s
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, '')
    .replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;');
}

/** What a plan contributes to a JUnit document: one suite, one test case per target. */
export interface JunitSuite {
  name: string;
  /** The report, or the problems that made the plan invalid, or the message of an internal error (one error case each). */
  report?: ReportV1;
  invalid?: string;
  /** An internal error (runner exit 3): the error case has type `internal`, which `merge` maps back to exit 3. */
  internal?: string;
}

function suiteXml(s: JunitSuite): string {
  const name = xmlText(s.name);
  if (!s.report) {
    const [message, type, text] = s.internal !== undefined ? ['internal error', 'internal', s.internal] : ['invalid input', 'invalid', s.invalid ?? 'invalid input'];
    return `  <testsuite name="${name}" tests="1" failures="0" errors="1" skipped="0">\n`
      + `    <testcase classname="${name}" name="plan is valid input">\n`
      + `      <error message="${message}" type="${type}">${xmlText(text)}</error>\n    </testcase>\n  </testsuite>\n`;
  }
  const r = s.report;
  const failures = r.targets.filter((t) => !t.met).length;
  let x = `  <testsuite name="${name}" tests="${r.targets.length}" failures="${failures}" errors="0" skipped="0">\n`;
  x += '    <properties>\n';
  for (const [k, v] of [['plan.file', r.plan.file], ['plan.sha256', r.plan.hash], ['tool', r.plan.tool], ['material', r.material.name], ['law.source', r.material.source]] as const) {
    x += `      <property name="${k}" value="${xmlText(v)}"/>\n`;
  }
  // The basis of the hardness estimate, when hardness targets are judged (Tabor factor and where it came from).
  const h = r.material.hardness;
  if (h && r.targets.some((t) => t.name === 'minHardnessHV' || t.name === 'maxHardnessHV')) {
    x += `      <property name="hardness.taborFactor" value="${h.taborFactor.toFixed(4)}"/>\n`;
    x += `      <property name="hardness.basis" value="${xmlText(h.basis)}"/>\n`;
  }
  // A plan with a scatter section: the chance of meeting every target and the lower bound, as
  // properties a dashboard can chart (not test cases: the targets are judged on the nominal route).
  if (r.scatter) {
    const sc = r.scatter;
    for (const [k, v] of [['scatter.probabilityAllTargetsMet', String(sc.probabilityAllTargetsMet)], ['scatter.samples', String(sc.samples)],
      [`scatter.toleranceBound.reloadYield.${r.units.stress}`, sc.toleranceBound.value.toFixed(2)]] as const) {
      x += `      <property name="${xmlText(k)}" value="${xmlText(v)}"/>\n`;
    }
  }
  x += '    </properties>\n';
  for (const t of r.targets) {
    const v = (x: number) => formatTargetValue(x, t.name, r.units.stress, t.temper?.basis);
    const text = `${targetName(t)}: predicted ${v(t.predicted)}, limit ${v(t.limit)}, margin ${v(t.margin)}${targetNote(r, t)}`;
    x += `    <testcase classname="${name}" name="${xmlText(targetName(t))}">\n`;
    if (!t.met) x += `      <failure message="${xmlText(text)}" type="targetMissed">${xmlText(text)}</failure>\n`;
    else x += `      <system-out>${xmlText(text)}</system-out>\n`;
    x += '    </testcase>\n';
  }
  return x + '  </testsuite>\n';
}

/**
 * JUnit XML (the de-facto schema read by CI dashboards): a `<testsuites>` element with one
 * `<testsuite>` per plan and one `<testcase>` per target; a missed target is a `<failure>` whose
 * message gives predicted value, limit and margin (each in the target's own unit: the plan's stress
 * unit, % or degrees, at the precision of `numbers.ts`); an invalid plan is one
 * `<error>` case. Plan hash, tool and law source are suite properties, and for a plan with a scatter
 * section the probability of meeting every target and the lower tolerance bound on the final yield.
 */
export function junitReport(suites: readonly JunitSuite[]): string {
  const tests = suites.reduce((n, s) => n + (s.report ? s.report.targets.length : 1), 0);
  const failures = suites.reduce((n, s) => n + (s.report ? s.report.targets.filter((t) => !t.met).length : 0), 0);
  const errors = suites.filter((s) => !s.report).length;
  return `<?xml version="1.0" encoding="UTF-8"?>\n<testsuites name="strainledger" tests="${tests}" failures="${failures}" errors="${errors}">\n`
    + suites.map(suiteXml).join('') + '</testsuites>\n';
}
