import { z } from 'zod';
import { InputError } from '../core/errors.js';
import { designRoute, type DesignResult, type DesignSpec } from '../core/process/designRoute.js';
import type { Step } from '../core/route/types.js';
import { parseLocated, type Located } from './parse.js';
import { validateWith } from './validate.js';
import { parseYamlLocated } from './yaml.js';
import { resolvePlan, withLocation } from './resolve.js';
import { MaterialSchema, TargetsSchema, type PlanInput } from './schema.js';
import { unitsOf, type Units } from './units.js';
import { formatOf } from './load.js';
import { sig4 } from '../core/numeric/sig4.js';

/**
 * The design specification file (JSON or YAML), our own format: what a route must do, from which the
 * `design` command proposes ranked routes. Numbers are in the spec's units (`SI`: MPa, mm, N; `US`:
 * ksi, in, lbf); density and specific heat stay SI. Converted to core units once, in
 * {@link loadDesignSpecText}.
 */
const positive = (what: string) => z.number().positive().describe(what);

export const DesignSpecSchema = z.strictObject({
  name: z.string().min(1).max(200).describe('Name of the specification'),
  units: z.enum(['SI', 'US']).default('SI').describe('SI: MPa, mm, N; US: ksi, in, lbf'),
  description: z.string().max(5000).optional(),
  material: MaterialSchema,
  process: z.discriminatedUnion('kind', [
    z.strictObject({
      kind: z.literal('draw'),
      dieHalfAngleDeg: z.number().gt(0).lte(45).describe('die half-angle of every pass, degrees'),
      friction: z.number().gte(0).lte(0.5).describe('Coulomb friction coefficient die–wire'),
      forceCapacity: positive('drawing-block pull capacity (N or lbf)').optional(),
    }),
    z.strictObject({
      kind: z.literal('roll'),
      rollRadius: positive('work-roll radius (mm or in)'),
      friction: z.number().gte(0).lte(0.6).describe('Coulomb friction coefficient roll–strip'),
      forceCapacity: positive('mill force capacity (N or lbf)').optional(),
    }),
  ]).describe('How every pass is made'),
  start: z.strictObject({
    diameter: positive('starting wire or rod diameter, annealed (mm or in)').optional(),
    thickness: positive('starting strip thickness, annealed (mm or in)').optional(),
    width: positive('strip width (mm or in), for the roll force').optional(),
  }),
  final: z.strictObject({
    diameter: positive('finished diameter (mm or in)').optional(),
    thickness: positive('finished thickness (mm or in)').optional(),
  }),
  limits: z.strictObject({
    maxPassReductionPct: z.number().gt(0).lt(100).describe('largest reduction of one pass, % (area for drawing, thickness for rolling)'),
    maxStrainBeforeAnneal: z.number().gt(0).lte(10).optional().describe('largest equivalent strain between anneals'),
    ductilityStrain: z.number().gt(0).lte(10).optional().describe('equivalent strain the material stands before it must be annealed'),
    ductilityMargin: z.number().gte(0).lt(1).optional().describe('fraction of ductilityStrain kept in reserve; default 0.2'),
    maxDrawabilityRatio: z.number().gt(0).lte(1).optional().describe('largest drawing stress / exit flow stress; default 0.8 (safety factor 1.25)'),
    maxTemperatureRise: z.number().gt(0).optional().describe('largest adiabatic temperature rise of a pass, K; default 150'),
    maxAnneals: z.number().int().gte(0).lte(100).optional().describe('most anneals; default 8'),
    maxPasses: z.number().int().gte(1).lte(1000).optional().describe('most passes; default 60'),
  }),
  window: TargetsSchema.describe('Final property window (becomes the targets of each designed plan)'),
  routes: z.number().int().gte(1).lte(100).default(5).describe('how many ranked routes to propose'),
});

export type DesignSpecDoc = z.output<typeof DesignSpecSchema>;

/** A specification read from text: validated, in core units, with its locator. */
export interface LoadedDesignSpec {
  doc: DesignSpecDoc;
  units: Units;
  spec: DesignSpec;
  file: string;
  loc: Located;
}

/**
 * Reads a design specification (JSON or YAML): parse, validate, convert units.
 * @throws PlanError listing problems with file, line, column, field, value and what is allowed.
 */
export function loadDesignSpecText(text: string, file = 'spec.json', format = formatOf(file)): LoadedDesignSpec {
  const loc = parseLocated(text, file, format, parseYamlLocated);
  const doc = validateWith(DesignSpecSchema, loc, file, 'docs/process-planning.md, "Route design"');
  const units = unitsOf(doc.units);
  const spec = withLocation(file, loc, () => {
    // The material is checked exactly as a plan's (law ranges, modulus decay).
    const material = resolvePlan({ name: doc.name, units: doc.units, material: doc.material, start: {}, steps: [], targets: {} }, file, loc).route.material;
    const draw = doc.process.kind === 'draw';
    const sizeName = draw ? 'diameter' : 'thickness';
    const other = draw ? 'thickness' : 'diameter';
    if (doc.start[sizeName] === undefined) throw new InputError(`start.${sizeName}`, undefined, `the starting ${sizeName} for process ${doc.process.kind}`);
    if (doc.final[sizeName] === undefined) throw new InputError(`final.${sizeName}`, undefined, `the finished ${sizeName} for process ${doc.process.kind}`);
    if (doc.start[other] !== undefined) throw new InputError(`start.${other}`, doc.start[other], `nothing: process ${doc.process.kind} works on ${sizeName}`);
    if (doc.final[other] !== undefined) throw new InputError(`final.${other}`, doc.final[other], `nothing: process ${doc.process.kind} works on ${sizeName}`);
    if (doc.final[sizeName]! >= doc.start[sizeName]!) throw new InputError(`final.${sizeName}`, doc.final[sizeName], `a size below the starting ${sizeName} ${doc.start[sizeName]}`);
    const l = doc.limits;
    if (l.maxStrainBeforeAnneal === undefined && l.ductilityStrain === undefined) throw new InputError('limits.maxStrainBeforeAnneal', undefined, 'a strain in (0, 10], or limits.ductilityStrain (with limits.ductilityMargin)');
    const w = doc.window;
    if (w.minYield !== undefined && w.maxYield !== undefined && w.minYield > w.maxYield) throw new InputError('window.maxYield', w.maxYield, `a value ≥ minYield (${w.minYield})`);
    const window: DesignSpec['window'] = {};
    if (w.minYield !== undefined) window.minYield = units.toMPa(w.minYield);
    if (w.maxYield !== undefined) window.maxYield = units.toMPa(w.maxYield);
    if (w.minTensile !== undefined) window.minTensile = units.toMPa(w.minTensile);
    if (w.minRemainingElongationPct !== undefined) window.minRemainingElongationPct = w.minRemainingElongationPct;
    if (w.temper !== undefined) window.temper = w.temper;
    // Vickers numbers are the same in SI and US plans (kgf/mm²): not converted.
    if (w.minHardnessHV !== undefined && w.maxHardnessHV !== undefined && w.minHardnessHV > w.maxHardnessHV) throw new InputError('window.maxHardnessHV', w.maxHardnessHV, `a value ≥ minHardnessHV (${w.minHardnessHV})`);
    if (w.minHardnessHV !== undefined) window.minHardnessHV = w.minHardnessHV;
    if (w.maxHardnessHV !== undefined) window.maxHardnessHV = w.maxHardnessHV;
    const p = doc.process;
    const s: DesignSpec = {
      material,
      process: p.kind,
      startSize: units.toMm(doc.start[sizeName]!),
      finalSize: units.toMm(doc.final[sizeName]!),
      maxPassReductionPct: l.maxPassReductionPct,
      window,
      friction: p.friction,
      // Sizes land on 0.001 mm or 0.0001 in, so a written plan holds exactly the sizes that were checked.
      sizeResolution: units.toMm(doc.units === 'US' ? 1e-4 : 1e-3),
      maxRoutes: doc.routes,
      length: (mm) => `${+units.fromMm(mm).toPrecision(5)} ${units.length}`,
      force: (n) => `${sig4(units.fromN(n))} ${units.force}`,
    };
    if (p.kind === 'draw') s.dieHalfAngleDeg = p.dieHalfAngleDeg;
    else {
      s.rollRadius = units.toMm(p.rollRadius);
      if (doc.start.width === undefined) throw new InputError('start.width', undefined, 'a strip width > 0 for the roll force');
      s.width = units.toMm(doc.start.width);
    }
    if (p.forceCapacity !== undefined) s.forceCapacity = units.toN(p.forceCapacity);
    for (const k of ['maxStrainBeforeAnneal', 'ductilityStrain', 'ductilityMargin', 'maxDrawabilityRatio', 'maxTemperatureRise', 'maxAnneals', 'maxPasses'] as const) {
      if (l[k] !== undefined) s[k] = l[k];
    }
    return s;
  });
  return { doc, units, spec, file, loc };
}

/** Runs the design for a loaded specification; core errors are located in the spec file. */
export function runDesign(spec: LoadedDesignSpec): DesignResult {
  return withLocation(spec.file, spec.loc, () => designRoute(spec.spec));
}

/** Rounds a converted size so a written plan shows 0.001 mm or 0.0001 in, not binary noise. */
const clean = (x: number) => +x.toPrecision(10);

/**
 * A designed route as a plan file the runner can run (plan units, labels saying where each pass and
 * anneal came from; the window as the plan's targets).
 */
export function routeToPlan(spec: LoadedDesignSpec, steps: readonly Step[], rank: number): PlanInput {
  const u = spec.units;
  const d = spec.doc;
  let pass = 0;
  const planSteps = steps.map((st) => {
    if (st.kind === 'anneal') return { kind: 'anneal' as const, label: `anneal after pass ${pass}` };
    pass++;
    if (st.kind === 'draw') {
      return { kind: 'draw' as const, label: `pass ${pass}`, diameter: clean(u.fromMm(st.diameter!)), dieHalfAngleDeg: st.dieHalfAngleDeg!, friction: st.friction!,
        ...(st.forceCapacity !== undefined ? { forceCapacity: clean(u.fromN(st.forceCapacity)) } : {}) };
    }
    if (st.kind === 'roll') {
      return { kind: 'roll' as const, label: `pass ${pass}`, thickness: clean(u.fromMm(st.thickness!)), rollRadius: clean(u.fromMm(st.rollRadius!)), friction: st.friction!,
        ...(st.forceCapacity !== undefined ? { forceCapacity: clean(u.fromN(st.forceCapacity)) } : {}) };
    }
    throw new InputError('steps', st.kind, 'draw, roll or anneal steps in a designed route');
  });
  const start: Record<string, number> = {};
  for (const k of ['diameter', 'thickness', 'width'] as const) if (d.start[k] !== undefined) start[k] = d.start[k]!;
  return {
    name: `${d.name} — designed route ${rank}`,
    units: d.units,
    description: `Designed by strainledger design from ${spec.file} (rank ${rank}). ${d.description ?? ''}`.trim(),
    material: d.material,
    start,
    steps: planSteps,
    targets: d.window,
  };
}
