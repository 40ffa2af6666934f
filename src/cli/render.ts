import type { ReportV1 } from '../report/build.js';
import type { Problem } from '../plan/problems.js';

import type { Format } from './formats.js';
export { EXTENSION, FORMATS, type Format } from './formats.js';

/**
 * Renders one report. Writers are loaded only when asked for: the HTML writer pulls in Plot and
 * linkedom, which a JSON run should not pay for at start-up.
 */
export async function render(r: ReportV1, format: Format, color = false): Promise<string> {
  switch (format) {
    case 'json': return JSON.stringify(r, null, 2) + '\n';
    case 'table': return (await import('../report/table.js')).tableReport(r, color);
    case 'csv': return (await import('../report/csv.js')).csvReport(r);
    case 'md': return (await import('../report/md.js')).mdReport(r);
    case 'html': return (await import('../report/html.js')).htmlReport(r);
    case 'junit': return (await import('../report/junit.js')).junitReport([{ name: r.plan.name, report: r }]);
  }
}

/**
 * The per-plan file (`run --out` of several plans or a shard) of a plan that could not be evaluated, in
 * the formats `merge` reads: JSON `{ file, invalid }` (problems for invalid input, exit 2; a message for
 * an internal error, exit 3) and a one-suite JUnit document with an `<error>` of type `invalid` or
 * `internal`; the same entries a batch writes to stdout, so merge keeps the plan and its exit code.
 * undefined for the other formats (their reports are for people; the problems go to stderr).
 */
export async function renderInvalid(file: string, format: Format, problems: readonly Problem[] | undefined, internal: string | undefined): Promise<string | undefined> {
  if (format === 'json') return JSON.stringify([{ file, invalid: problems ?? internal }][0], null, 2) + '\n';
  if (format === 'junit') {
    const { formatProblem } = await import('../plan/problems.js');
    return (await import('../report/junit.js')).junitReport([problems ? { name: file, invalid: problems.map(formatProblem).join('\n') } : { name: file, internal: internal ?? 'internal error' }]);
  }
  return undefined;
}
