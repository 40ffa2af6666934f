import { formatOf, parseLocated } from './parse.js';
import { resolvePlan, type LoadedPlan } from './resolve.js';
import { validatePlan } from './validate.js';
import { parseYamlLocated } from './yaml.js';

export type { LoadedPlan };
export { formatOf };

/**
 * Reads a plan from its text (JSON or YAML): parse, validate, resolve units.
 * @throws PlanError listing every problem with file, line, column, field, value and what is allowed.
 */
export function loadPlanText(text: string, file = 'plan.json', format = formatOf(file)): LoadedPlan {
  const loc = parseLocated(text, file, format, parseYamlLocated);
  const doc = validatePlan(loc, file);
  const resolved = resolvePlan(doc, file, loc);
  return { ...resolved, file, loc };
}

export { runPlan } from './resolve.js';
