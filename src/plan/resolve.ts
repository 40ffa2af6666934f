import { ComputationError, InputError } from '../core/errors.js';
import { evaluateRoute } from '../core/route/ledger.js';
import { LAW_PARAMETERS } from '../core/flow/params.js';
import { makeLaw } from '../core/flow/makeLaw.js';
import { isotropicPart, validateKinematic } from '../core/path/hardening.js';
import { validateGrainGrowthStrain } from '../core/route/grainGrowth.js';
import type { FlowLaw, LawSpec } from '../core/flow/types.js';
import { HARDNESS_DEFAULTS } from '../core/hardness/defaults.js';
import { fitTaborFactor } from '../core/hardness/fitTaborFactor.js';
import { validateHardnessModel } from '../core/hardness/taborHardness.js';
import type { HardnessModel } from '../core/hardness/types.js';
import type { Ledger, Material, RouteInput, Size, Step, Targets } from '../core/route/types.js';
import { prepareScatter, type ScatterProblem } from '../core/scatter/problem.js';
import type { Located } from './parse.js';
import { resolveScatter } from './scatterResolve.js';
import { PlanError, stringToPath, type Problem } from './problems.js';
import type { PlanDoc } from './schema.js';
import { unitsOf, type Units } from './units.js';

/** A plan converted to the core's units (MPa, mm), ready for {@link evaluateRoute}. */
export interface ResolvedPlan {
  doc: PlanDoc;
  units: Units;
  route: RouteInput;
  /** The plan's scatter section in core units (present only when the plan has one). */
  scatter?: ScatterProblem;
}

/** A plan read from text: validated, resolved, with its file and a locator for messages. */
export interface LoadedPlan extends ResolvedPlan {
  file: string;
  loc: Located;
}

/** Evaluates a loaded plan's route; step errors are located in the plan file. */
export function runPlan(plan: LoadedPlan): Ledger {
  const u = plan.units;
  return withLocation(plan.file, plan.loc, () =>
    evaluateRoute(plan.route, { length: (mm) => `${+u.fromMm(mm).toPrecision(6)} ${u.length}` }));
}

/** Adds the resolved scatter section when the plan has one (src/plan/scatterResolve.ts). */
function withScatter(r: ResolvedPlan): ResolvedPlan {
  if (r.doc.scatter) {
    r.scatter = resolveScatter(r.doc.scatter, r.route, r.units);
    prepareScatter(r.scatter); // validates spreads and the correlation matrix here, where errors get a file line
  }
  return r;
}

/** Converts a law spec's stress parameters with `f` (e.g. ksi → MPa). */
export function convertLaw(spec: LawSpec, f: (x: number) => number): LawSpec {
  const out: Record<string, unknown> = { law: spec.law };
  for (const p of LAW_PARAMETERS[spec.law]) {
    const v = (spec as unknown as Record<string, number>)[p.name];
    out[p.name] = p.kind === 'stress' && typeof v === 'number' ? f(v) : v;
  }
  return out as unknown as LawSpec;
}

function convertSize(s: Size, f: (x: number) => number): Size {
  const out: Size = {};
  for (const k of ['thickness', 'width', 'diameter', 'height'] as const) if (s[k] !== undefined) out[k] = f(s[k]!);
  return out;
}

/** Converts a step's lengths with `f` (and forces with `force`, plan unit → N); percentages, strains, angles and friction are unit-free. */
export function convertStep(step: PlanDoc['steps'][number], f: (x: number) => number, force: (x: number) => number = (x) => x): Step {
  const { label: _label, ...s } = step as typeof step & { label?: string };
  const out: Record<string, unknown> = { ...s };
  for (const k of ['thickness', 'diameter', 'height', 'rollRadius', 'width', 'radius'] as const) if (typeof out[k] === 'number') out[k] = f(out[k] as number);
  if (typeof out.forceCapacity === 'number') out.forceCapacity = force(out.forceCapacity);
  return out as Step;
}

/**
 * Turns a validated plan into core input: laws built and checked, everything in MPa and mm. The
 * checks that do not depend on each other (the flow curve, the modulus decay, the backstresses, the
 * fitted range, the targets) all run, so a plan with several such problems hears of all of them at
 * once; the scatter section is checked once the material is sound.
 * @throws PlanError (core InputErrors located in the file when `loc` is given).
 */
export function resolvePlan(doc: PlanDoc, file = 'plan', loc?: Located): ResolvedPlan {
  const units = unitsOf(doc.units);
  const problems: Problem[] = [];
  /** Runs one independent check; a located problem is kept and the next check still runs. */
  const check = <T>(fn: () => T): T | undefined => {
    try {
      return withLocation(file, loc, fn);
    } catch (e) {
      if (!(e instanceof PlanError)) throw e;
      problems.push(...e.problems);
      return undefined;
    }
  };
  const m = doc.material;
  // A record-form flow curve is fitted by the runner before resolution (src/cli/recordLaw.ts); the plan layer reads no files.
  const law = check(() => {
    if ('record' in m.flowCurve) throw new InputError('material.flowCurve.record', m.flowCurve.record, 'law parameters here: a record is fitted by `strainledger run` (the runner reads the file), not by the plan layer');
    return makeLaw(convertLaw(m.flowCurve as LawSpec, units.toMPa), 'material.flowCurve');
  });
  const elasticModulus = units.toMPa(m.elasticModulus);
  const modulusDecay = m.modulusDecay && check(() => {
    const Ea = units.toMPa(m.modulusDecay!.Ea);
    if (Ea > elasticModulus) throw new InputError('material.modulusDecay.Ea', m.modulusDecay!.Ea, `a modulus at most elasticModulus (${m.elasticModulus})`);
    return { Ea, xi: m.modulusDecay!.xi };
  });
  const kinematic = m.kinematic && check(() => {
    const kin = validateKinematic({ backstresses: m.kinematic!.backstresses.map((b) => ({ C: units.toMPa(b.C), gamma: b.gamma })) }, 'material.kinematic');
    if (law) isotropicPart(law, kin, 'material.kinematic');
    return kin;
  });
  const fittedStrainRange = m.fittedStrainRange && check((): [number, number] => {
    const [a, b] = m.fittedStrainRange!;
    if (!(b > a)) throw new InputError('material.fittedStrainRange', m.fittedStrainRange, 'a pair [from, to] with to > from');
    return [a, b];
  });
  const grainGrowthStrain = m.grainGrowthStrain && check(() => validateGrainGrowthStrain(m.grainGrowthStrain, 'material.grainGrowthStrain'));

  const targets: Targets = {};
  const t = doc.targets;
  if (t.minYield !== undefined) targets.minYield = units.toMPa(t.minYield);
  if (t.maxYield !== undefined) targets.maxYield = units.toMPa(t.maxYield);
  if (t.minTensile !== undefined) targets.minTensile = units.toMPa(t.minTensile);
  if (t.minRemainingElongationPct !== undefined) targets.minRemainingElongationPct = t.minRemainingElongationPct;
  if (t.maxSpringbackDeg !== undefined) targets.maxSpringbackDeg = t.maxSpringbackDeg;
  if (t.temper !== undefined) targets.temper = t.temper;
  check(() => {
    if (t.temper !== undefined && m.temperSystem === undefined) throw new InputError('targets.temper', t.temper, 'a temper target only with material.temperSystem set');
  });
  // Vickers numbers (kgf/mm²) are the same in SI and US plans: not converted (plan/units.ts).
  if (t.minHardnessHV !== undefined) targets.minHardnessHV = t.minHardnessHV;
  if (t.maxHardnessHV !== undefined) targets.maxHardnessHV = t.maxHardnessHV;
  check(() => {
    if (t.minHardnessHV !== undefined && t.maxHardnessHV !== undefined && t.minHardnessHV > t.maxHardnessHV) {
      throw new InputError('targets.maxHardnessHV', t.maxHardnessHV, `a value ≥ minHardnessHV (${t.minHardnessHV})`, 'contradictory targets');
    }
  });
  const hardness = m.hardness && law && check(() => resolveHardness(m.hardness!, law));
  check(() => {
    if (t.minYield !== undefined && t.maxYield !== undefined && t.minYield > t.maxYield) {
      throw new InputError('targets.maxYield', t.maxYield, `a value ≥ minYield (${t.minYield})`, 'contradictory targets');
    }
  });
  if (problems.length > 0 || !law) throw new PlanError(problems);
  const material: Material = { name: m.name, elasticModulus, poissonRatio: m.poissonRatio ?? 0.3, law, source: 'given in the plan' };
  if (m.density !== undefined) material.density = m.density;
  if (m.specificHeat !== undefined) material.specificHeat = m.specificHeat;
  if (modulusDecay) material.modulusDecay = modulusDecay;
  if (kinematic) material.kinematic = kinematic;
  if (fittedStrainRange) material.fittedStrainRange = fittedStrainRange;
  if (m.temperSystem !== undefined) material.temperSystem = m.temperSystem;
  if (grainGrowthStrain) material.grainGrowthStrain = grainGrowthStrain;
  if (hardness) material.hardness = hardness;
  return withLocation(file, loc, () => withScatter({
    doc,
    units,
    route: { material, start: convertSize(doc.start, units.toMm), steps: doc.steps.map((s) => convertStep(s, units.toMm, units.toN)), targets },
  }));
}

/**
 * The plan's `material.hardness` as a core hardness model: the given Tabor factor, or one fitted to
 * `readings` with its 95 % interval, or the defaults; the representative strain given or 0.08.
 * @throws InputError naming `material.hardness.readings` when both a factor and readings are given, or
 * when the readings do not fit (see fitTaborFactor).
 */
export function resolveHardness(h: NonNullable<PlanDoc['material']['hardness']>, law: FlowLaw): HardnessModel {
  const representativeStrain = h.representativeStrain ?? HARDNESS_DEFAULTS.representativeStrain;
  let model: HardnessModel;
  if (h.readings !== undefined) {
    if (h.taborFactor !== undefined) throw new InputError('material.hardness.readings', `${h.readings.length} readings`, 'either readings or taborFactor, not both', 'c is either given or fitted');
    const fit = fitTaborFactor(law, h.readings, representativeStrain, 'material.hardness.readings');
    model = { taborFactor: fit.taborFactor, representativeStrain, basis: 'fitted', taborFactorInterval: fit.interval, readings: fit.n };
  } else {
    model = { taborFactor: h.taborFactor ?? HARDNESS_DEFAULTS.taborFactor, representativeStrain, basis: h.taborFactor !== undefined ? 'given' : 'default' };
  }
  if (h.conversionTable !== undefined) model.conversionGroup = h.conversionTable;
  return validateHardnessModel(model);
}

/** Runs `fn`, turning core InputErrors and ComputationErrors into a located PlanError. */
export function withLocation<T>(file: string, loc: Located | undefined, fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof InputError || e instanceof ComputationError) {
      const path = stringToPath(e.path);
      const at = loc?.locate(path);
      const msg = e.message.startsWith(e.path + ': ') ? e.message.slice(e.path.length + 2) : e.message;
      throw new PlanError([{ file, ...at, path: e.path, message: msg }]);
    }
    throw e;
  }
}
