import { formatOf, loadPlanText, type LoadedPlan } from './load.js';
import { parseLocated, type Located } from './parse.js';
import { validatePlan } from './validate.js';
import { parseYamlLocated } from './yaml.js';
import { resolvePlan } from './resolve.js';

/**
 * Reads either a whole plan or a material file (the plan's `material` object on its own, with an
 * optional `units: SI|US` beside it) and returns a loaded plan holding that material (and, for a
 * material file, an empty route). Errors keep their file, line and column; for a material file they
 * are named `material.FIELD`.
 * @throws PlanError listing every problem.
 */
export function loadPlanOrMaterial(text: string, file: string): LoadedPlan {
  const format = formatOf(file);
  const inner = parseLocated(text, file, format, parseYamlLocated);
  const d = inner.data;
  if (d !== null && typeof d === 'object' && !Array.isArray(d) && 'material' in d) return loadPlanText(text, file, format);
  const { units, ...material } = (d !== null && typeof d === 'object' && !Array.isArray(d) ? d : { value: d }) as Record<string, unknown>;
  const wrapped: Located = {
    data: { name: `material from ${file}`, ...(units !== undefined ? { units } : {}), material, steps: [] },
    locate: (path) => (path[0] === 'material' ? inner.locate(path.slice(1)) : inner.locate(path)),
  };
  const doc = validatePlan(wrapped, file);
  return { ...resolvePlan(doc, file, wrapped), file, loc: wrapped };
}
