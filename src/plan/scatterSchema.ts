import { z } from 'zod';
import { SCATTER_DEFAULTS } from '../core/scatter/problem.js';

/**
 * The plan's `scatter` section: Monte Carlo through the route. Spreads are normal, given per input
 * as a coefficient of variation `cv` (sd / mean, dimensionless) or a standard deviation `sd` (plan
 * units: stress parameters in the plan stress unit, start sizes in its length unit). Means are the
 * plan's own values (material.flowCurve, start).
 */
const Spread = z.strictObject({
  cv: z.number().gte(0).lte(1).optional().describe('coefficient of variation, sd / mean (dimensionless), e.g. 0.04'),
  sd: z.number().gte(0).optional().describe('standard deviation in the parameter\'s own plan unit (instead of cv)'),
}).describe('Normal spread of one input: exactly one of cv or sd');

export const ScatterSchema = z.strictObject({
  samples: z.number().int().gte(2).lte(1e7).default(SCATTER_DEFAULTS.samples).describe('number of Monte Carlo samples'),
  seed: z.number().int().gte(0).lte(4294967295).default(SCATTER_DEFAULTS.seed).describe('seed of the random streams; the same plan and seed give the same report'),
  params: z.record(z.string(), Spread).default({}).describe('spread of law parameters by name (e.g. K, n for hollomon)'),
  start: z.strictObject({
    thickness: Spread.optional(), width: Spread.optional(), diameter: Spread.optional(), height: Spread.optional(),
  }).optional().describe('spread of the starting size (only sizes given in start)'),
  correlation: z.record(z.string(), z.number().gte(-1).lte(1)).default({})
    .describe('correlation between two inputs, keyed "A,B" (e.g. "K,n": -0.5; start sizes as start.thickness); others 0'),
  records: z.array(z.string().min(1).max(1000)).min(2).max(1000).optional()
    .describe('tensile records of several specimens of one material (files relative to the plan, read by the runner): the law of material.flowCurve is fitted to each, and the means, spreads and correlations of its parameters replace material.flowCurve, params and their correlations'),
  coverage: z.number().gt(0).lt(1).default(SCATTER_DEFAULTS.coverage).describe('fraction of parts the lower tolerance bound must cover, e.g. 0.90'),
  confidence: z.number().gt(0).lt(1).default(SCATTER_DEFAULTS.confidence).describe('confidence of the lower tolerance bound, e.g. 0.95'),
}).describe('Scatter of the stock: Monte Carlo through the route, probability of meeting the targets, tolerance bound on the final yield');

export type ScatterDoc = z.output<typeof ScatterSchema>;
