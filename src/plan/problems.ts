import { formatValue } from '../core/errors.js';

/** One thing wrong with an input file, located as exactly as the parser allows. */
export interface Problem {
  file: string;
  line?: number;
  column?: number;
  /** Field path, e.g. `steps[2].thickness`; empty for a problem with the whole file. */
  path: string;
  message: string;
}

/** Invalid input (exit code 2): every problem found, each naming file, line, field, value, and what is allowed. */
export class PlanError extends Error {
  override readonly name = 'PlanError';
  readonly problems: Problem[];
  constructor(problems: Problem[]) {
    super(problems.map(formatProblem).join('\n'));
    this.problems = problems;
  }
}

export function formatProblem(p: Problem): string {
  const where = p.line !== undefined ? `${p.file}:${p.line}:${p.column ?? 1}` : p.file;
  return `${where}: ${p.path ? p.path + ': ' : ''}${p.message}`;
}

/** `['steps', 2, 'thickness']` → `steps[2].thickness`. */
export function pathToString(path: readonly PropertyKey[]): string {
  let out = '';
  for (const k of path) {
    if (typeof k === 'number') out += `[${k}]`;
    else out += out ? `.${String(k)}` : String(k);
  }
  return out;
}

/** `steps[2].thickness` → `['steps', 2, 'thickness']`. */
export function stringToPath(s: string): (string | number)[] {
  const out: (string | number)[] = [];
  for (const m of s.matchAll(/([^.[\]]+)|\[(\d+)\]/g)) {
    if (m[2] !== undefined) out.push(Number(m[2]));
    else if (m[1] !== undefined) out.push(m[1]);
  }
  return out;
}

export { formatValue };
