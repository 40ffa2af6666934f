import { z } from 'zod';

/**
 * The JSON report, version 1, as a zod schema: the published contract (`schema/report-v1.json` is
 * generated from it by `strainledger schema --report`, and a test checks the two agree and that
 * real reports validate). Fields are additive: a later optional field (an extra numeric step value,
 * a new top-level section) does not break a v1 reader, so objects allow extra properties; every
 * field listed here is required exactly as shown. Numbers are finite (no NaN or Infinity).
 */
const num = (what: string) => z.number().describe(what);
/** The unit of a target's limit, predicted value and margin (src/report/numbers.ts `targetUnit`). */
const TARGET_UNIT_TEXT = 'in the target\'s own unit: the report stress unit for minYield, maxYield and minTensile (engineering stresses), % for minRemainingElongationPct, degrees for maxSpringbackDeg, HV for minHardnessHV and maxHardnessHV; a temper target in its basis (% thickness reduction, stress unit or HV)';
const warning = z.strictObject({ code: z.string().min(1), message: z.string() });
const size = z.strictObject({
  thickness: z.number().positive().optional(),
  width: z.number().positive().optional(),
  diameter: z.number().positive().optional(),
  height: z.number().positive().optional(),
}).describe('Size after the step, in the report length unit');

export const ReportStepSchema = z.looseObject({
  index: z.number().int().positive().describe('1-based step number'),
  kind: z.string().min(1),
  label: z.string().optional(),
  size,
  strainIncrement: num('von Mises equivalent plastic strain added by the step'),
  accumulatedStrain: num('accumulated equivalent plastic strain after the step'),
  coldWorkPct: num('%CW since the last anneal (geometric)'),
  flowStress: num('flow stress σ(ε̄) at the accumulated strain: TRUE stress (stress unit)'),
  reloadYield: num('reload yield Rp0.2: ENGINEERING 0.2 % proof strength on the part\'s own section after the step, σ(ε̄ + 0.002)·e^(−0.002) (stress unit); never above tensileStrength'),
  tensileStrength: num('tensile strength Rm: ENGINEERING, maximum force over the part\'s own section after the step (stress unit)'),
  yieldRatio: num('reloadYield / tensileStrength, both engineering on the same section; 0 to 1'),
  remainingUniformStrain: num('TRUE plastic strain left before diffuse necking in uniaxial tension (Considère)'),
  remainingUniformElongationPct: num('remaining uniform elongation: ENGINEERING plastic elongation left to maximum force, % of the part\'s own length'),
  elasticRecoveryStrain: num('elastic strain recovered on unloading, σ(ε̄)/E(ε̄) (true stress over the chord modulus; dimensionless)'),
  recoveredElasticEnergy: num('elastic energy recovered per volume (stress unit)'),
  meanFlowStress: num('mean flow stress over the step: TRUE stress (stress unit)'),
  plasticWork: num('plastic work per volume of the step (stress unit)'),
  temper: z.strictObject({
    designation: z.string().min(1).describe('temper designation, e.g. H02'),
    name: z.string().describe('its name, e.g. half hard'),
    next: z.string().nullable().describe('the next harder temper; null at the top of the scale'),
    towardNext: z.number().gte(0).lt(1).nullable().describe('fraction of the way from this temper\'s lower boundary to the next\'s, in the scale\'s basis'),
  }).nullable().optional().describe('temper in material.temperSystem (null outside the system); present only when the material names one'),
  hardnessHV: num("Vickers hardness by Tabor's relation, HV (kgf/mm²; the same in SI and US reports); an estimate").optional(),
  hardnessHB: num('Brinell hardness converted from hardnessHV by the material group\'s table, approximate; only inside the table range').optional(),
  hardnessHRB: num('Rockwell B converted from hardnessHV, approximate; only inside the table range').optional(),
  hardnessHRC: num('Rockwell C converted from hardnessHV, approximate; only inside the table range').optional(),
  tensileFromHardness: num('tensile strength estimated from hardnessHV by the conversion table, approximate (stress unit)').optional(),
  warnings: z.array(warning),
});

const targetName = z.enum(['minYield', 'maxYield', 'minTensile', 'minRemainingElongationPct', 'maxSpringbackDeg', 'minHardnessHV', 'maxHardnessHV', 'temper']);

const probability = (what: string) => z.number().gte(0).lte(1).describe(what);
const distribution = z.looseObject({ mean: z.number(), sd: z.number().nonnegative(), min: z.number(), p05: z.number(), p50: z.number(), p95: z.number(), max: z.number() });
const meanSd = z.looseObject({ mean: z.number(), sd: z.number().nonnegative() });

/** The `scatter` section (src/report/scatter.ts), present only when the plan has one. Stresses in the report stress unit. */
export const ReportScatterSchema = z.looseObject({
  samples: z.number().int().min(2),
  seed: z.number().int().nonnegative(),
  rejectedDraws: z.number().int().nonnegative().describe('draws outside what the law or route allows, redrawn (truncated normal)'),
  inputs: z.array(z.looseObject({ name: z.string().min(1), mean: z.number(), sd: z.number().nonnegative(), cv: z.number().nonnegative(), unit: z.string() })),
  correlation: z.record(z.string(), z.number().gte(-1).lte(1)).describe('given correlations, keyed "A,B"'),
  probabilityAllTargetsMet: probability('share of samples meeting every target'),
  probabilityStdError: z.number().nonnegative().describe('binomial standard error of that share'),
  targets: z.array(z.looseObject({ name: targetName, limit: z.number(), probabilityMet: probability('share of samples meeting this target') })),
  finalReloadYield: distribution.describe('final reload yield Rp0.2 over the samples: engineering, on the part\'s own section (stress unit)'),
  tensileStrength: distribution.describe('final Rm over the samples: engineering (stress unit)'),
  remainingElongationPct: distribution.describe('final remaining uniform elongation over the samples: engineering, %'),
  hardnessHV: distribution.optional().describe('final Vickers hardness by Tabor\'s relation, HV (the same in SI and US reports)'),
  toleranceBound: z.looseObject({
    value: z.number().describe('lower tolerance bound on the final reload yield'),
    coverage: probability('share of parts covered'), confidence: probability('confidence of the bound'), method: z.string(),
    normalK: z.number(), normalValue: z.number(), distributionFreeRank: z.number().int().nullable(), distributionFreeValue: z.number().nullable(), note: z.string(),
  }),
  sensitivity: z.looseObject({ output: z.string(), method: z.string(), linearR2: z.number(), inputs: z.array(z.looseObject({ input: z.string(), src: z.number(), correlation: z.number() })) }),
  deltaMethod: z.looseObject({ finalReloadYield: meanSd, tensileStrength: meanSd, remainingElongationPct: meanSd }),
  cautions: z.array(z.string()).min(1),
}).describe('Monte Carlo scatter through the route (present only when the plan has a scatter section)');

export const ReportSchema = z.looseObject({
  reportVersion: z.literal(1),
  plan: z.looseObject({
    name: z.string(),
    file: z.string(),
    hash: z.string().regex(/^[0-9a-f]{64}$/).describe('SHA-256 of the plan file (and of the overrides, when given), hex'),
    tool: z.string(),
    overrides: z.array(z.string()).optional().describe('--set overrides applied for this run, PATH=VALUE'),
  }),
  units: z.strictObject({
    system: z.enum(['SI', 'US']),
    stress: z.enum(['MPa', 'ksi']),
    length: z.enum(['mm', 'in']),
    strain: z.string(),
    work: z.string(),
  }),
  material: z.looseObject({
    name: z.string(),
    elasticModulus: z.number().positive(),
    flowCurve: z.looseObject({ law: z.string() }),
    source: z.string(),
    temperSystem: z.enum(['copperRolled', 'aluminiumH1x', 'steelStrip']).optional().describe('temper system the steps are named in'),
    grainGrowthStrain: z.tuple([z.number(), z.number()]).optional().describe('strain range since the previous anneal in which a full anneal warns of coarse grains, when set in the plan'),
    uniformStrain: z.number(),
    initial: z.strictObject({
      reloadYield: num('annealed Rp0.2, engineering (stress unit)'),
      tensileStrength: num('annealed Rm, engineering (stress unit)'),
      uniformElongationPct: num('annealed uniform elongation Ag, engineering, %'),
    }),
    hardness: z.looseObject({
      relation: z.string(),
      taborFactor: z.number().positive().describe('c: Vickers hardness in MPa over the flow stress at the accumulated strain plus representativeStrain'),
      representativeStrain: z.number().nonnegative(),
      basis: z.enum(['default', 'given', 'fitted']).describe('default (Tabor), given in the plan, or fitted to the plan\'s readings'),
      taborFactorInterval: z.tuple([z.number(), z.number()]).optional().describe('95 % interval of a fitted factor (Student t)'),
      readings: z.number().int().min(2).optional(),
      initialHV: z.number().describe('hardness of the annealed state, HV'),
      conversionTable: z.looseObject({ group: z.string(), source: z.string(), note: z.string() }).optional(),
    }).optional().describe('The hardness model: Tabor\'s relation and the basis of its factor'),
  }),
  steps: z.array(ReportStepSchema),
  targets: z.array(z.strictObject({
    name: targetName,
    limit: num(TARGET_UNIT_TEXT),
    predicted: num(`predicted value on the same basis as the ledger field the target limits; ${TARGET_UNIT_TEXT}`),
    margin: num(`predicted − limit for a minimum, limit − predicted for a maximum (≥ 0 when met); ${TARGET_UNIT_TEXT}`),
    met: z.boolean(),
    temper: z.strictObject({
      wanted: z.string(), got: z.string().nullable(), basis: z.enum(['thicknessReductionPct', 'tensileStrength', 'hardnessHV']),
      wantedName: z.string().describe('the wanted temper\'s name in its system, e.g. "half hard"'),
      from: z.number().describe('the wanted temper\'s lower boundary (inclusive), in the basis; equals limit'),
      to: z.number().nullable().describe('the wanted temper\'s upper boundary (the next temper\'s lower one, exclusive), in the basis; null at the top of the scale'),
      marginTo: z.enum(['lower', 'upper']).describe('the boundary the margin is measured to (the nearer one)'),
    }).optional().describe('temper target only: limit is the temper\'s lower boundary, predicted the state\'s value, margin the distance to the nearer boundary, in the basis (% thickness reduction, stress unit, or HV)'),
    caution: z.strictObject({ code: z.enum(['withinModelError']), message: z.string() }).optional()
      .describe('a met target whose margin is smaller than the model\'s own error (hardness by Tabor\'s relation, ±15 %): the part may miss it; confirm by measurement'),
  })),
  allTargetsMet: z.boolean(),
  coldWorkWindow: z.strictObject({
    empty: z.boolean(),
    strainFrom: z.number().nullable(),
    strainTo: z.number().nullable(),
    reductionBasis: z.enum(['thickness', 'area', 'height']).nullable(),
    reductionPctFrom: z.number().nullable(),
    reductionPctTo: z.number().nullable(),
    limitedBy: z.strictObject({ from: targetName.nullable(), to: targetName.nullable() }),
    note: z.string(),
  }),
  scatter: ReportScatterSchema.optional(),
  cautions: z.array(z.string()).min(1),
});

/** The JSON Schema (draft 2020-12) of report v1, as checked in at `schema/report-v1.json`. */
export function reportJsonSchema(): Record<string, unknown> {
  return {
    ...(z.toJSONSchema(ReportSchema, { io: 'output', target: 'draft-2020-12' }) as object),
    $id: 'https://strainledger.invalid/schema/report-v1.json',
    title: 'strainledger report, version 1',
  };
}
