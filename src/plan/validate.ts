import type { z } from 'zod';
import type { Located } from './parse.js';
import { formatValue, PlanError, pathToString, type Problem } from './problems.js';
import { PlanSchema, type PlanDoc } from './schema.js';

/**
 * Validation with zod: every problem of a plan at once, each worded with file, line, column, field,
 * value and what is allowed. The runner reaches this module only when the generated fast check
 * (src/plan/check.ts) refuses a plan, so a valid plan never loads zod.
 */

/** Words for what a zod issue allows. */
function allowedOf(issue: z.core.$ZodIssue): string {
  switch (issue.code) {
    case 'too_small': return issue.origin === 'array' || issue.origin === 'string'
      ? `at least ${issue.minimum} ${issue.origin === 'string' ? 'characters' : 'items'}`
      : `a number ${issue.inclusive ? '≥' : '>'} ${issue.minimum}`;
    case 'too_big': return issue.origin === 'array' || issue.origin === 'string'
      ? `at most ${issue.maximum} ${issue.origin === 'string' ? 'characters' : 'items'}`
      : `a number ${issue.inclusive ? '≤' : '<'} ${issue.maximum}`;
    case 'invalid_type': return `${/^[aeiou]/.test(issue.expected) ? 'an' : 'a'} ${issue.expected}`;
    case 'invalid_value': return `one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`;
    case 'invalid_union': return 'options' in issue && Array.isArray((issue as { options?: unknown[] }).options)
      ? `one of ${(issue as { options: unknown[] }).options.map((v) => JSON.stringify(v)).join(', ')}`
      : 'one of the documented forms';
    default: return issue.message;
  }
}

/**
 * Validates parsed plan data against {@link PlanSchema}; returns the plan or throws every problem at
 * once, each with file, line, column, field path, the value and what is allowed.
 */
export function validatePlan(loc: Located, file: string): PlanDoc {
  return validateWith(PlanSchema, loc, file);
}

/**
 * Replaces each failed union (e.g. a flow curve given as law parameters or as a record) by the issues
 * of its closest branch — the one with the fewest issues — with full paths, so the message names the
 * wrong field and its allowed values instead of "one of the documented forms".
 */
function closestBranch(issues: readonly z.core.$ZodIssue[]): z.core.$ZodIssue[] {
  const out: z.core.$ZodIssue[] = [];
  for (const issue of issues) {
    const branches = issue.code === 'invalid_union' ? (issue as { errors?: z.core.$ZodIssue[][] }).errors : undefined;
    if (branches && branches.length > 0) {
      const best = branches.reduce((a, b) => (b.length < a.length ? b : a));
      if (best.length > 0) {
        out.push(...closestBranch(best.map((e) => ({ ...e, path: [...issue.path, ...e.path] }) as z.core.$ZodIssue)));
        continue;
      }
    }
    out.push(issue);
  }
  return out;
}

/** Validates parsed data against any zod schema (plans, design specs), with the same located messages as {@link validatePlan}. */
export function validateWith<S extends z.ZodType>(schema: S, loc: Located, file: string, fieldsDoc = '`strainledger schema`'): z.output<S> {
  const r = schema.safeParse(loc.data, { reportInput: true });
  if (r.success) return r.data;
  const problems: Problem[] = [];
  for (const issue of closestBranch(r.error.issues)) {
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        const path = [...issue.path.map((k) => (typeof k === 'symbol' ? String(k) : k)), key] as (string | number)[];
        problems.push({ file, ...loc.locate(path), path: pathToString(path), message: `unknown field ${JSON.stringify(key)}; allowed only the documented fields (see ${fieldsDoc})` });
      }
      continue;
    }
    const path = issue.path.map((k) => (typeof k === 'symbol' ? String(k) : k)) as (string | number)[];
    const input = (issue as { input?: unknown }).input;
    const got = issue.code === 'invalid_union' && input && typeof input === 'object' ? (input as Record<string, unknown>)[path[path.length - 1] as string] ?? input : input;
    problems.push({ file, ...loc.locate(path), path: pathToString(path), message: `got ${issue.code === 'invalid_type' && input === undefined ? 'nothing (the field is required)' : formatValue(got)}, allowed ${allowedOf(issue)}` });
  }
  throw new PlanError(problems);
}
