import { z } from 'zod';
import { LAW_PARAMETERS, LAW_NAMES } from '../core/flow/params.js';
import type { LawName } from '../core/flow/types.js';
import { ScatterSchema } from './scatterSchema.js';

/**
 * The plan file: material + starting size + route + targets. One schema validates plans (JSON or
 * YAML), produces `strainledger schema` (JSON Schema), and types the plan layer. Numbers are in the
 * plan's own units (`SI`: MPa, mm; `US`: ksi, in); conversion to the core's MPa and mm happens once,
 * in {@link resolvePlan}.
 */

const positive = (what: string) => z.number().positive().describe(what);
const nonNeg = (what: string) => z.number().nonnegative().describe(what);

function lawSchema(law: LawName) {
  const shape: Record<string, z.ZodType> = { law: z.literal(law) };
  for (const p of LAW_PARAMETERS[law]) {
    let s = z.number();
    s = p.loOpen ? s.gt(p.lo) : s.gte(p.lo);
    if (Number.isFinite(p.hi)) s = p.hiOpen ? s.lt(p.hi) : s.lte(p.hi);
    shape[p.name] = s.describe(`${p.meaning}${p.kind === 'stress' ? ' (plan stress unit)' : ' (dimensionless)'}`);
  }
  return z.strictObject(shape);
}

export const LawSchema = z.discriminatedUnion('law', LAW_NAMES.map(lawSchema) as unknown as [ReturnType<typeof lawSchema>, ...ReturnType<typeof lawSchema>[]])
  .describe('A hardening law in true stress versus true plastic strain');

/**
 * A flow curve named by a tensile record instead of law parameters (issue 3): the runner reads the
 * file (relative to the plan's folder), fits `law` to it when the plan runs, and records
 * `fitted from FILE` and the fitted strain range. Read in the CLI layer (src/cli/recordLaw.ts), never here.
 */
export const RecordFlowCurveSchema = z.strictObject({
  record: z.string().min(1).max(1000).describe('tensile record file (CSV or tab-separated), relative to the plan'),
  law: z.enum(LAW_NAMES as [LawName, ...LawName[]]).describe('the law to fit to the record'),
  options: z.strictObject({
    stressUnit: z.string().max(20).optional().describe('unit of the stress column when the header does not say'),
    strainUnit: z.enum(['-', '%']).optional().describe('strain column as a fraction (-) or in per cent (%)'),
    area: positive('cross-section of a force–extension record, mm²').optional(),
    diameter: positive('specimen diameter of a force–extension record, mm').optional(),
    width: positive('specimen width of a force–extension record, mm').optional(),
    thickness: positive('specimen thickness of a force–extension record, mm').optional(),
    gaugeLength: positive('extensometer gauge length of a force–extension record, mm').optional(),
    parallelLength: positive("specimen's parallel length Lc of a record whose extension is the machine's travel (crosshead), mm: its plastic part is spread over Lc, its compliance taken out with elasticModulus").optional(),
  }).optional().describe('how to read the record when its header and metadata do not say'),
}).describe('A law fitted to a tensile record when the plan runs');

export const MaterialSchema = z.strictObject({
  name: z.string().min(1).max(200).describe('Name of the material and temper'),
  elasticModulus: positive("Young's modulus (plan stress unit)"),
  poissonRatio: z.number().gte(0).lt(0.5).optional().describe("Poisson's ratio; default 0.3"),
  flowCurve: z.union([LawSchema, RecordFlowCurveSchema]).describe('A hardening law with its parameters, or a tensile record to fit it to'),
  modulusDecay: z.strictObject({
    Ea: positive('saturated chord modulus after large prestrain (plan stress unit)'),
    xi: positive('rate of the fall of the chord modulus with plastic strain'),
  }).optional().describe('Fall of the unloading modulus with plastic strain: E = E0 − (E0 − Ea)(1 − exp(−xi·ε̄))'),
  kinematic: z.strictObject({
    backstresses: z.array(z.strictObject({
      C: z.number().gt(0).lte(1e7).describe('Armstrong–Frederick hardening modulus C (plan stress unit)'),
      gamma: z.number().gt(0).lte(1e5).describe('Armstrong–Frederick recall rate γ (dimensionless); the backstress saturates at C/γ'),
    })).min(1).max(3).describe('one to three backstresses, summed'),
  }).optional().describe('Kinematic hardening for reversals (Bauschinger effect); the flow curve stays the monotonic response'),
  fittedStrainRange: z.tuple([nonNeg('from'), nonNeg('to')]).optional()
    .describe('True plastic strain range the law was fitted on; the ledger warns beyond it'),
  density: z.number().gte(500).lte(25000).optional().describe('density, kg/m³ (SI in both unit systems), for the temperature rise of a pass'),
  specificHeat: z.number().gte(50).lte(5000).optional().describe('specific heat, J/(kg·K) (SI in both unit systems), for the temperature rise of a pass'),
  temperSystem: z.enum(['copperRolled', 'aluminiumH1x', 'steelStrip']).optional()
    .describe('Standard tempers to name each step in: copperRolled (ASTM B601 H01–H10, strip only), aluminiumH1x (H12–H19 by tensile strength), steelStrip (ASTM A109 No. 5–No. 1 by hardness)'),
  grainGrowthStrain: z.tuple([z.number().gte(0).lte(1).describe('from'), z.number().gt(0).lte(1).describe('to')]).optional()
    .describe('Equivalent strain since the previous anneal within which a full anneal risks coarse grains; default [0.02, 0.10] (common practice)'),
  hardness: z.strictObject({
    taborFactor: z.number().gte(1).lte(5).optional()
      .describe("Tabor factor c: Vickers hardness in MPa over the flow stress at the accumulated strain plus representativeStrain; default 3·sin(68°) ≈ 2.78 (Tabor's 3, Vickers contact area). Not with readings"),
    representativeStrain: z.number().gte(0).lte(0.3).optional()
      .describe('strain the indentation adds to the accumulated strain; default 0.08 (Tabor, Vickers pyramid)'),
    readings: z.array(z.strictObject({
      strain: z.number().gte(0).lte(5).describe('accumulated equivalent plastic strain of the state read (true)'),
      hv: z.number().gte(1).lte(3000).describe('Vickers hardness read on that state, HV (kgf/mm², the same in SI and US plans)'),
    })).min(2).max(1000).optional()
      .describe('your own hardness readings of states of known strain; c is fitted to them (least squares through the origin, 95 % interval). Not with taborFactor'),
    conversionTable: z.enum(['steel']).optional()
      .describe('material group of a published hardness conversion table (ISO 18265 / ASTM E140); gives approximate HB, HRB, HRC and Rm inside the table range. Only non-austenitic steels are included'),
  }).optional().describe('Vickers hardness after every step by Tabor\'s relation HV = c·σ(ε̄ + εr)/9.80665 (HV in kgf/mm²)'),
});

export const StartSchema = z.strictObject({
  thickness: positive('strip thickness (plan length unit)').optional(),
  width: positive('strip width (plan length unit)').optional(),
  diameter: positive('wire or bar diameter (plan length unit)').optional(),
  height: positive('height of a billet or slug, for upsetting (plan length unit)').optional(),
}).describe('Starting size: thickness for strip, diameter for wire and bar, nothing for a specimen');

const label = z.string().max(200).optional().describe('Your name for this step, e.g. "pass 3"');
const pctBelow100 = (what: string) => z.number().gte(0).lt(100).describe(what);

export const StepSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('roll'), label,
    thickness: positive('exit thickness (plan length unit)').optional(),
    reductionPct: pctBelow100('thickness reduction of this pass, %').optional(),
    rollRadius: positive('work-roll radius (plan length unit); with friction, gives roll force and torque').optional(),
    width: positive('strip width for the roll force (plan length unit); default start.width').optional(),
    friction: z.number().gte(0).lte(0.6).optional().describe('Coulomb friction coefficient between roll and strip'),
    forceCapacity: positive('mill force capacity (plan force unit: N or lbf); a warning above it').optional() }),
  z.strictObject({ kind: z.literal('draw'), label,
    diameter: positive('exit diameter (plan length unit)').optional(),
    areaReductionPct: pctBelow100('area reduction of this pass, %').optional(),
    dieHalfAngleDeg: z.number().gte(0).lte(45).optional().describe('die half-angle, degrees; with friction, gives the drawing stress and force'),
    friction: z.number().gte(0).lte(0.5).optional().describe('Coulomb friction coefficient between die and wire'),
    forceCapacity: positive('drawing-block pull capacity (plan force unit: N or lbf); a warning above it').optional() }),
  z.strictObject({ kind: z.literal('stretch'), label,
    strain: nonNeg('uniaxial true strain').optional(),
    engineeringStrain: nonNeg('uniaxial engineering strain').optional() }),
  z.strictObject({ kind: z.literal('stretchBiaxial'), label, strain: nonNeg('major true strain ε1 of equibiaxial stretching') }),
  z.strictObject({ kind: z.literal('upset'), label,
    height: positive('height after upsetting (plan length unit)').optional(),
    reductionPct: pctBelow100('height reduction, %').optional() }),
  z.strictObject({ kind: z.literal('shear'), label, shearStrain: nonNeg('engineering shear strain γ') }),
  z.strictObject({ kind: z.literal('strain'), label, strain: nonNeg('von Mises equivalent plastic strain') }),
  z.strictObject({ kind: z.literal('anneal'), label,
    softeningFraction: z.number().gt(0).lte(1).optional().describe('fraction of the work hardening removed; 1 (default) is a full anneal') }),
  z.strictObject({ kind: z.literal('reverse'), label, strain: z.number().gte(0).lte(1).describe('reversed uniaxial true strain (compression along the forming direction)') }),
  z.strictObject({ kind: z.literal('bend'), label,
    radius: positive('inner bend radius on the tool (plan length unit)'),
    angle: z.number().gt(0).lte(180).describe('bend angle on the tool, degrees'),
    reverse: z.boolean().optional().describe('bend the other way (reverse bending): the outer side is loaded against the forming direction') }),
]);

export const TargetsSchema = z.strictObject({
  minYield: nonNeg('lowest acceptable reload yield Rp0.2 of the final state (plan stress unit)').optional(),
  maxYield: nonNeg('highest acceptable reload yield of the final state (plan stress unit)').optional(),
  minTensile: nonNeg('lowest acceptable tensile strength of the final state (plan stress unit)').optional(),
  minRemainingElongationPct: nonNeg('lowest acceptable remaining uniform elongation, %').optional(),
  minHardnessHV: z.number().gte(0).lte(3000).optional().describe('lowest acceptable Vickers hardness of the final state, HV (kgf/mm², the same in SI and US plans)'),
  maxHardnessHV: z.number().gte(0).lte(3000).optional().describe('highest acceptable Vickers hardness of the final state, HV'),
  maxSpringbackDeg: z.number().gte(0).lte(180).optional().describe('largest acceptable springback of any bend step, degrees'),
  temper: z.string().min(1).max(20).optional().describe('temper the final state must have, in material.temperSystem, e.g. "H04"'),
});

export const PlanSchema = z.strictObject({
  name: z.string().min(1).max(200).describe('Name of the plan'),
  units: z.enum(['SI', 'US']).default('SI').describe('SI: MPa and mm; US: ksi and in'),
  description: z.string().max(5000).optional(),
  material: MaterialSchema,
  start: StartSchema.default({}),
  steps: z.array(StepSchema).max(10000).describe('The route, in order'),
  targets: TargetsSchema.default({}),
  scatter: ScatterSchema.optional(),
});

/** A plan as written (plan units), after validation. */
export type PlanDoc = z.output<typeof PlanSchema>;
export type PlanInput = z.input<typeof PlanSchema>;
export type PlanStep = z.output<typeof StepSchema>;

/** The JSON Schema of the plan file (draft 2020-12), for editors and for `strainledger schema`. */
export function planJsonSchema(): unknown {
  return {
    ...(z.toJSONSchema(PlanSchema, { io: 'input' }) as object),
    $id: 'https://strainledger.invalid/schema/plan-v1.json',
    title: 'strainledger plan',
  };
}
