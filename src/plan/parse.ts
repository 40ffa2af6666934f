import { isMap, isSeq, LineCounter, parseDocument, type Document } from 'yaml';
import type { z } from 'zod';
import { formatValue, PlanError, pathToString, type Problem } from './problems.js';
import { PlanSchema, type PlanDoc } from './schema.js';

/** Largest plan file read, in bytes (plans are small; this bounds memory on hostile input). */
export const MAX_PLAN_BYTES = 5 * 1024 * 1024;

/** A parsed document that can say where a field path stands in the text. */
export interface Located {
  data: unknown;
  locate(path: readonly (string | number)[]): { line: number; column: number } | undefined;
}

/**
 * Parses JSON or YAML text keeping positions. JSON is read by YAML 1.2's JSON-compatible parser with
 * duplicate keys rejected, and additionally by `JSON.parse` so that only strict JSON passes as `.json`.
 * @throws PlanError with line and column for syntax errors and duplicate keys.
 */
export function parseLocated(text: string, file: string, format: 'json' | 'yaml'): Located {
  if (text.length > MAX_PLAN_BYTES) throw new PlanError([{ file, path: '', message: `file is ${text.length} bytes; allowed at most ${MAX_PLAN_BYTES} bytes for a plan` }]);
  if (text.includes('\uFFFD')) {
    const lc = position(text, text.indexOf('\uFFFD'));
    throw new PlanError([{ file, ...lc, path: '', message: 'invalid UTF-8 byte sequence; allowed UTF-8 text' }]);
  }
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lineCounter = new LineCounter();
  const doc: Document = parseDocument(src, { lineCounter, uniqueKeys: true, prettyErrors: false, strict: true });
  if (doc.errors.length > 0) {
    throw new PlanError(doc.errors.slice(0, 20).map((e) => {
      const lp = lineCounter.linePos(e.pos[0]);
      return { file, line: lp.line, column: lp.col, path: '', message: `${format === 'json' ? 'JSON' : 'YAML'} syntax: ${e.message.split('\n')[0]}` };
    }));
  }
  if (format === 'json') {
    try {
      JSON.parse(src);
    } catch (e) {
      const m = /position (\d+)/.exec(String((e as Error).message));
      const at = m ? position(src, Number(m[1])) : {};
      throw new PlanError([{ file, ...at, path: '', message: `JSON syntax: ${(e as Error).message.split('\n')[0]}` }]);
    }
  }
  const data = doc.toJS({ maxAliasCount: 100 });
  return {
    data,
    locate(path) {
      let node: unknown = doc.contents;
      let best: unknown = node;
      for (const key of path) {
        if (isMap(node)) {
          const pair = node.items.find((it) => (it.key as { value?: unknown } | null)?.value === key);
          if (!pair) break;
          best = pair.key ?? best;
          node = pair.value;
          if (node) best = node;
        } else if (isSeq(node) && typeof key === 'number') {
          node = node.items[key];
          if (!node) break;
          best = node;
        } else break;
      }
      const range = (best as { range?: [number, number, number] } | null)?.range;
      if (!range) return undefined;
      const lp = lineCounter.linePos(range[0]);
      return { line: lp.line, column: lp.col };
    },
  };
}

function position(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let last = -1;
  for (let i = 0; i < offset && i < text.length; i++) if (text.charCodeAt(i) === 10) { line++; last = i; }
  return { line, column: offset - last };
}

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
