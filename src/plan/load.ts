import { evaluateRoute } from '../core/route/ledger.js';
import type { Ledger } from '../core/route/types.js';
import { parseLocated, validatePlan, type Located } from './parse.js';
import { resolvePlan, withLocation, type ResolvedPlan } from './resolve.js';

/** A plan read from text: validated, resolved, with its hash and a locator for messages. */
export interface LoadedPlan extends ResolvedPlan {
  file: string;
  loc: Located;
}

/** Format from the file name: `.yaml`/`.yml` → YAML, else JSON. */
export function formatOf(file: string): 'json' | 'yaml' {
  return /\.ya?ml$/i.test(file) ? 'yaml' : 'json';
}

/**
 * Reads a plan from its text (JSON or YAML): parse, validate, resolve units.
 * @throws PlanError listing every problem with file, line, column, field, value and what is allowed.
 */
export function loadPlanText(text: string, file = 'plan.json', format = formatOf(file)): LoadedPlan {
  const loc = parseLocated(text, file, format);
  const doc = validatePlan(loc, file);
  const resolved = resolvePlan(doc, file, loc);
  return { ...resolved, file, loc };
}

/** Evaluates a loaded plan's route; step errors are located in the plan file. */
export function runPlan(plan: LoadedPlan): Ledger {
  const u = plan.units;
  return withLocation(plan.file, plan.loc, () =>
    evaluateRoute(plan.route, { length: (mm) => `${+u.fromMm(mm).toPrecision(6)} ${u.length}` }));
}
