import { checkRange, InputError } from '../errors.js';
import { makeLaw } from '../flow/makeLaw.js';
import { LAW_PARAMETERS } from '../flow/params.js';
import type { FlowLaw, LawSpec } from '../flow/types.js';
import type { ModulusDecay } from '../material/modulus.js';
import type { HardnessModel } from '../hardness/types.js';
import { STEP_KINDS, stockOf, type StepEffect } from '../route/steps.js';
import { TARGET_DEFS, TARGET_NAMES, validateTargets } from '../route/targets.js';
import type { Material, Size, StateProperties, Step, StockKind, TargetName, Targets } from '../route/types.js';
import { stateProperties } from '../route/state.js';
import { cholesky } from './cholesky.js';

/** Samples per block. Each block has its own random stream, so results do not depend on how blocks are shared out. */
export const SCATTER_BLOCK = 8192;

/** Defaults of the scatter section (one place; the plan schema reads these). */
export const SCATTER_DEFAULTS = { samples: 10000, seed: 1, coverage: 0.9, confidence: 0.95 } as const;

/** Start-size fields that may scatter, as input names `start.<field>`. */
export const START_FIELDS = ['thickness', 'width', 'diameter', 'height'] as const;

/** One scattering input: a law parameter by its name (`K`, `n`, ...) or a start size `start.thickness`; MPa and mm. */
export interface ScatterInputSpec {
  name: string;
  mean: number;
  /** Standard deviation, same unit as the mean; 0 allowed (no spread). */
  sd: number;
}

/** Plain material (no functions), so a problem can be sent to a worker thread or web worker. */
export interface ScatterMaterialSpec {
  name: string;
  elasticModulus: number;
  poissonRatio: number;
  flowCurve: LawSpec;
  modulusDecay?: ModulusDecay;
  fittedStrainRange?: readonly [number, number];
  /** Tabor hardness model (plain data); the same c and εr for every sample. */
  hardness?: HardnessModel;
}

/**
 * A scatter problem in the core's units (MPa, mm): the route with its nominal material, the inputs
 * that scatter (normal, mean and standard deviation, with a correlation matrix in the order of
 * `inputs`), the number of samples and the seed, and the coverage and confidence of the tolerance
 * bound. Plain data: structured-clone safe.
 */
export interface ScatterProblem {
  material: ScatterMaterialSpec;
  start: Size;
  steps: readonly Step[];
  targets: Targets;
  inputs: readonly ScatterInputSpec[];
  correlation: readonly (readonly number[])[];
  samples: number;
  seed: number;
  coverage: number;
  confidence: number;
}

/** A problem checked and prepared for sampling (Cholesky factor, nominal law, fixed step effects). */
export interface PreparedScatter {
  problem: ScatterProblem;
  /** Lower Cholesky factor of the correlation matrix. */
  chol: number[][];
  /** For each input: index into the law spec (`law`) or the start size (`start`). */
  slots: Array<{ kind: 'law'; param: string } | { kind: 'start'; field: (typeof START_FIELDS)[number] }>;
  baseMaterial: Omit<Material, 'law'>;
  lawSpec: LawSpec;
  stock: StockKind;
  targets: Targets;
  /** Step effects when no start size scatters (then they are the same for every sample). */
  fixedEffects: StepEffect[] | null;
  /** The targets in the order of `checkTargets`, with the state property each limits. */
  targetChecks: Array<{ name: TargetName; property: keyof StateProperties; min: boolean; limit: number }>;
  /** Number of blocks of {@link SCATTER_BLOCK} samples. */
  blocks: number;
}

/**
 * Checks a scatter problem and prepares it for sampling. Every error names the field (`scatter.…`),
 * the value and what is allowed.
 * @throws InputError for an unknown input, a negative spread, a mean outside the parameter's range,
 * a correlation outside [−1, 1], a correlation matrix that is not positive definite, or samples,
 * seed, coverage or confidence out of range.
 */
export function prepareScatter(problem: ScatterProblem, path = 'scatter'): PreparedScatter {
  const { inputs, correlation } = problem;
  if (!Number.isInteger(problem.samples) || problem.samples < 2 || problem.samples > 1e7) {
    throw new InputError(`${path}.samples`, problem.samples, 'an integer in [2, 10000000]');
  }
  if (!Number.isInteger(problem.seed) || problem.seed < 0 || problem.seed > 0xffffffff) {
    throw new InputError(`${path}.seed`, problem.seed, 'an integer in [0, 4294967295]');
  }
  checkRange(`${path}.coverage`, problem.coverage, 0, 1, { loOpen: true, hiOpen: true });
  checkRange(`${path}.confidence`, problem.confidence, 0, 1, { loOpen: true, hiOpen: true });
  const lawSpec = problem.material.flowCurve;
  const lawParams = LAW_PARAMETERS[lawSpec.law];
  if (!lawParams) throw new InputError('material.flowCurve.law', lawSpec.law, 'a known law');
  const allowedNames = [...lawParams.map((p) => p.name), ...START_FIELDS.filter((f) => problem.start[f] !== undefined).map((f) => `start.${f}`)];
  const slots: PreparedScatter['slots'] = [];
  const seen = new Set<string>();
  inputs.forEach((inp, i) => {
    const at = inp.name.startsWith('start.') ? `${path}.start.${inp.name.slice(6)}` : `${path}.params.${inp.name}`;
    if (!allowedNames.includes(inp.name)) throw new InputError(at, inp.name, `one of ${allowedNames.join(', ')} (the parameters of the ${lawSpec.law} law and the start sizes given)`);
    if (seen.has(inp.name)) throw new InputError(at, inp.name, 'each input once');
    seen.add(inp.name);
    checkRange(`${at}.sd`, inp.sd, 0, Math.abs(inp.mean) > 0 ? Math.abs(inp.mean) : Infinity);
    if (inp.name.startsWith('start.')) {
      slots.push({ kind: 'start', field: inp.name.slice(6) as (typeof START_FIELDS)[number] });
    } else {
      const info = lawParams.find((p) => p.name === inp.name)!;
      checkRange(`${at}.mean`, inp.mean, info.lo, info.hi, { loOpen: info.loOpen, hiOpen: info.hiOpen });
      slots.push({ kind: 'law', param: inp.name });
    }
    void i;
  });
  const p = inputs.length;
  if (correlation.length !== p) throw new InputError(`${path}.correlation`, correlation.length, `a ${p}×${p} matrix (one row per scattering input)`);
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < p; j++) {
      const r = correlation[i]![j];
      const key = `${path}.correlation.${inputs[Math.min(i, j)]!.name},${inputs[Math.max(i, j)]!.name}`;
      if (i === j) {
        if (r !== 1) throw new InputError(key, r, '1 on the diagonal');
      } else checkRange(key, r, -1, 1);
    }
  }
  const chol = cholesky(correlation, `${path}.correlation`);
  const targets = validateTargets(problem.targets);
  const stock = stockOf(problem.start);
  const m = problem.material;
  const baseMaterial: Omit<Material, 'law'> = {
    name: m.name, elasticModulus: m.elasticModulus, poissonRatio: m.poissonRatio,
    ...(m.modulusDecay ? { modulusDecay: m.modulusDecay } : {}),
    ...(m.fittedStrainRange ? { fittedStrainRange: m.fittedStrainRange } : {}),
    ...(m.hardness ? { hardness: m.hardness } : {}),
  };
  // Bend steps need the material state of each sample (springback); scatter samples share
  // precomputed step effects, so a bend is refused clearly here rather than failing inside.
  problem.steps.forEach((st, i) => {
    if (st.kind === 'bend') {
      throw new InputError(`steps[${i}].kind`, st.kind, 'with a scatter section: roll, draw, stretch, stretchBiaxial, upset, shear, strain, reverse, anneal', 'scatter through bend steps is not supported');
    }
  });
  if (targets.temper !== undefined) {
    throw new InputError('targets.temper', targets.temper, 'no temper target with a scatter section (give the temper\'s property limits, e.g. minTensile, instead)', 'scatter does not sample tempers');
  }
  const hasStart = slots.some((s) => s.kind === 'start');
  const fixedEffects = hasStart ? null : stepEffects(problem.start, stock, problem.steps);
  const nominal = stateProperties({ ...baseMaterial, law: makeLaw(lawSpec, 'material.flowCurve') } as Material, 0);
  for (const t of TARGET_NAMES) {
    if (targets[t] !== undefined && typeof nominal[TARGET_DEFS[t].property] !== 'number') {
      throw new InputError(`targets.${t}`, targets[t], 'with a scatter section, only targets on the final state\'s properties (minYield, maxYield, minTensile, minRemainingElongationPct, minHardnessHV, maxHardnessHV)');
    }
  }
  const targetChecks = TARGET_NAMES.filter((t) => targets[t] !== undefined)
    .map((name) => ({ name, property: TARGET_DEFS[name].property, min: TARGET_DEFS[name].sense === 'min', limit: targets[name]! }));
  return {
    problem, chol, slots, baseMaterial, lawSpec, stock, targets, fixedEffects, targetChecks,
    blocks: Math.ceil(problem.samples / SCATTER_BLOCK),
  };
}

const lengthMm = (mm: number) => `${+mm.toPrecision(6)} mm`;
const PATHS: string[] = [];
const pathOf = (i: number) => PATHS[i] ?? (PATHS[i] = `steps[${i}]`);

/**
 * The effect of every step on a stock of the given start size (the ledger's own step functions,
 * applied in order). Runs once per sample when a start size scatters, so it reuses one context
 * object and the step paths (the step functions keep neither).
 */
export function stepEffects(start: Size, stock: StockKind, steps: readonly Step[]): StepEffect[] {
  const out: StepEffect[] = new Array(steps.length);
  const ctx = { stock, size: { ...start } as Size, path: '', length: lengthMm };
  for (let i = 0; i < steps.length; i++) {
    const step = steps[i]!;
    ctx.path = pathOf(i);
    const e = STEP_KINDS[step.kind].apply(step, ctx);
    out[i] = e;
    ctx.size = e.size;
  }
  return out;
}

/** Builds the law of one sample: the nominal spec with the sampled law parameters. */
export function sampleLaw(prep: PreparedScatter, x: ArrayLike<number>): FlowLaw {
  const spec: Record<string, unknown> = { ...prep.lawSpec };
  for (let i = 0; i < prep.slots.length; i++) {
    const s = prep.slots[i]!;
    if (s.kind === 'law') spec[s.param] = x[i];
  }
  return makeLaw(spec as unknown as LawSpec, 'material.flowCurve');
}

/** The start size of one sample. */
export function sampleStart(prep: PreparedScatter, x: ArrayLike<number>): Size {
  const start: Size = { ...prep.problem.start };
  for (let i = 0; i < prep.slots.length; i++) {
    const s = prep.slots[i]!;
    if (s.kind === 'start') start[s.field] = x[i]!;
  }
  return start;
}
