import { PlanError } from '../plan/problems.js';

/**
 * Invalid record input: a PlanError (so the runner exits 2 and prints `file:line:column: field: message`)
 * naming the line, the column (number and name) and what was expected.
 */
export function recordError(file: string, line: number | undefined, column: number | undefined, field: string, message: string): PlanError {
  return new PlanError([{ file, ...(line !== undefined ? { line } : {}), ...(column !== undefined ? { column } : {}), path: field, message }]);
}

/** A value shown in a message: quoted, shortened, control characters escaped. */
export function show(v: string): string {
  const s = v.length > 40 ? v.slice(0, 37) + '...' : v;
  return JSON.stringify(s);
}
