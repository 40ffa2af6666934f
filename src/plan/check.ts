import { conforms, fillDefaults } from './conforms.js';
import { PLAN_VALIDITY_SCHEMA } from './generated/planSchema.js';
import type { Located } from './parse.js';
import type { PlanDoc } from './schema.js';

/**
 * The plan's fast validity check: the plan JSON Schema (made by zod from src/plan/schema.ts,
 * committed as src/plan/generated/planSchema.ts and tested to be current) walked by
 * src/plan/conforms.ts. It answers only "valid or not" and fills the schema's defaults as zod does,
 * so on a valid plan the runner never loads zod (about 50 ms to import on this machine: bench/RESULTS.md, "Runner
 * cold start"). Every refused plan goes to zod, which words all its problems; if zod accepts what the
 * check refused, zod's result is used, so the check can only make the runner faster, never change what
 * is valid. test/plan/check.test.ts holds the check to zod and to Ajv on thousands of edited plans.
 */

/**
 * The validated plan with defaults filled, or undefined when the check refuses it. Does not change
 * `data`. Example: `fastPlanCheck({ name: 'a', material: {...}, steps: [] })?.units` → `'SI'`.
 */
export function fastPlanCheck(data: unknown): PlanDoc | undefined {
  if (!conforms(PLAN_VALIDITY_SCHEMA, data)) return undefined;
  return fillDefaults(PLAN_VALIDITY_SCHEMA, structuredClone(data)) as PlanDoc;
}

/**
 * Validates parsed plan data: the fast check first, then zod (loaded only now) for the messages.
 * @throws PlanError listing every problem with file, line, column, field, value and what is allowed.
 */
export async function checkPlan(loc: Located, file: string): Promise<PlanDoc> {
  const fast = fastPlanCheck(loc.data);
  if (fast) return fast;
  const { validatePlan } = await import('./validate.js');
  return validatePlan(loc, file);
}
