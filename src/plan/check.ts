import { validate as planCheck } from './generated/planCheck.js';
import type { Located } from './parse.js';
import type { PlanDoc } from './schema.js';

/**
 * The plan's fast validity check: code generated from the plan JSON Schema (itself made from the zod
 * schema in src/plan/schema.ts) by Ajv's standalone generator, committed as
 * src/plan/generated/planCheck.ts and tested to be current. It answers only "valid or not", and fills
 * the schema's defaults as zod does; on a valid plan the runner never loads zod (about 30 ms of
 * start-up: bench/RESULTS.md, "Runner cold start"). Every refused plan goes to zod, which words all
 * its problems; if zod accepts what the check refused, zod's result is used, so the check can only
 * make the runner faster, never change what is valid.
 */

/**
 * The validated plan with defaults filled, or undefined when the check refuses it. Does not change
 * `data`. Example: `fastPlanCheck({ name: 'a', material: {...}, steps: [] })?.units` → `'SI'`.
 */
export function fastPlanCheck(data: unknown): PlanDoc | undefined {
  const copy = structuredClone(data);
  return (planCheck as (d: unknown) => boolean)(copy) ? (copy as PlanDoc) : undefined;
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
