// strainledger/plan: reading and validating plan files (JSON or YAML), browser-safe (no node:* imports).
// Errors are PlanErrors listing every problem with file, line, column, field, value and what is allowed.

// Read, validate and resolve a plan; evaluate its route into a ledger
export { loadPlanText, runPlan, formatOf } from './load.js';
export type { LoadedPlan } from './load.js';
export { loadPlanOrMaterial } from './material.js';
export { resolvePlan } from './resolve.js';
export type { ResolvedPlan } from './resolve.js';
export { parseLocated, MAX_PLAN_BYTES } from './parse.js';
export type { Located } from './parse.js';
export { parseYamlLocated } from './yaml.js';
export { validatePlan } from './validate.js';
export { fastPlanCheck } from './check.js';

// Problems (what a refused plan reports)
export { PlanError, formatProblem, pathToString, stringToPath } from './problems.js';
export type { Problem } from './problems.js';

// The plan's schema and units
export { PlanSchema, MaterialSchema, StartSchema, StepSchema, TargetsSchema, LawSchema, planJsonSchema } from './schema.js';
export type { PlanDoc, PlanInput, PlanStep } from './schema.js';
export { unitsOf, MPA_PER_KSI, MM_PER_IN, N_PER_LBF, NM_PER_LBF_FT } from './units.js';
export type { UnitSystem, Units } from './units.js';
