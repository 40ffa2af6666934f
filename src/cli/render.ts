import type { ReportV1 } from '../report/build.js';

/** Report formats of `run`. */
export const FORMATS = ['table', 'json', 'csv', 'md', 'html', 'junit'] as const;
export type Format = (typeof FORMATS)[number];

/** File extension of each format when written with `--out`. */
export const EXTENSION: Record<Format, string> = { table: 'txt', json: 'json', csv: 'csv', md: 'md', html: 'html', junit: 'junit.xml' };

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
