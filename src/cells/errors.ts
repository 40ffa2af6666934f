import { InputError, ComputationError } from '../core/errors.js';
import { PlanError } from '../plan/problems.js';
import { h } from './dom.js';

/**
 * A message a user can act on, from any error a cell may throw: every problem of a plan (file,
 * line, field, value, what is allowed), a core input error (field, value, range), or the message.
 */
export function errorLines(e: unknown): string[] {
  if (e instanceof PlanError) return e.problems.map((p) => `${p.line !== undefined ? `line ${p.line}${p.column !== undefined ? `, column ${p.column}` : ''}: ` : ''}${p.path ? p.path + ': ' : ''}${p.message}`);
  if (e instanceof InputError || e instanceof ComputationError) return [e.message];
  if (e instanceof Error) return [e.message || e.name];
  // The runtime rejects with RuntimeError for cells whose inputs failed; strings may come from user code.
  return [typeof e === 'string' ? e : 'this cell could not be computed'];
}

/**
 * The error cell: a readable message in place of a cell's output (role="alert", so screen readers
 * announce it). User text in the message is shown as text, never markup.
 */
export function errorBox(e: unknown, title = 'This cell could not be computed'): HTMLElement {
  const lines = errorLines(e);
  return h('div', { class: 'sl-error', role: 'alert' },
    h('strong', {}, title),
    h('ul', {}, ...lines.map((l) => h('li', {}, l))));
}
