import { InputError } from '../core/errors.js';
import { LAW_PARAMETERS } from '../core/flow/params.js';
import { lawSpec } from '../core/flow/makeLaw.js';
import type { RouteInput } from '../core/route/types.js';
import { START_FIELDS, type ScatterInputSpec, type ScatterProblem } from '../core/scatter/problem.js';
import type { ScatterDoc } from './scatterSchema.js';
import type { Units } from './units.js';

/**
 * Turns a plan's `scatter` section into a core {@link ScatterProblem}: means from the resolved
 * route (MPa, mm), spreads from cv or sd (sd converted from plan units), the correlation matrix in
 * input order (law parameters in the law's table order, then start sizes).
 * @throws InputError naming `scatter.params.X`, `scatter.start.X` or `scatter.correlation.A,B`.
 */
export function resolveScatter(sc: ScatterDoc, route: RouteInput, units: Units): ScatterProblem {
  if (sc.records) throw new InputError('scatter.records', sc.records, 'records read by the runner (strainledger run); where files cannot be read (notebooks), give params and correlation instead');
  const law = route.material.law;
  const inputs: ScatterInputSpec[] = [];
  const lawParams = LAW_PARAMETERS[law.law];
  const spreadSd = (at: string, spread: { cv?: number | undefined; sd?: number | undefined }, mean: number, toCore: (x: number) => number) => {
    if ((spread.cv === undefined) === (spread.sd === undefined)) throw new InputError(at, spread, 'exactly one of cv or sd');
    return spread.cv !== undefined ? spread.cv * Math.abs(mean) : toCore(spread.sd!);
  };
  const names = Object.keys(sc.params);
  for (const name of names) {
    if (!lawParams.some((p) => p.name === name)) {
      throw new InputError(`scatter.params.${name}`, name, `a parameter of the ${law.law} law: one of ${lawParams.map((p) => p.name).join(', ')}`);
    }
  }
  for (const p of lawParams) {
    const spread = sc.params[p.name];
    if (!spread) continue;
    const mean = law.params[p.name]!;
    inputs.push({ name: p.name, mean, sd: spreadSd(`scatter.params.${p.name}`, spread, mean, p.kind === 'stress' ? units.toMPa : (x) => x) });
  }
  for (const f of START_FIELDS) {
    const spread = sc.start?.[f];
    if (!spread) continue;
    const mean = route.start[f];
    if (mean === undefined) throw new InputError(`scatter.start.${f}`, spread, `a spread only for a size given in start (${START_FIELDS.filter((g) => route.start[g] !== undefined).join(', ') || 'none given'})`);
    inputs.push({ name: `start.${f}`, mean, sd: spreadSd(`scatter.start.${f}`, spread, mean, units.toMm) });
  }
  const idx = new Map(inputs.map((inp, i) => [inp.name, i]));
  const R: number[][] = inputs.map((_, i) => inputs.map((__, j) => (i === j ? 1 : 0)));
  for (const [key, r] of Object.entries(sc.correlation)) {
    const parts = key.split(',').map((s) => s.trim());
    const at = `scatter.correlation.${key}`;
    if (parts.length !== 2 || parts[0] === parts[1]) throw new InputError(at, key, 'a key "A,B" naming two different scattering inputs');
    const [a, b] = parts.map((s) => idx.get(s));
    if (a === undefined || b === undefined) throw new InputError(at, key, `two of the inputs that scatter: ${inputs.map((i) => i.name).join(', ') || 'none'}`);
    if (R[a]![b] !== 0) throw new InputError(at, r, 'each pair once');
    R[a]![b] = r;
    R[b]![a] = r;
  }
  const m = route.material;
  return {
    material: {
      name: m.name, elasticModulus: m.elasticModulus, poissonRatio: m.poissonRatio, flowCurve: lawSpec(law),
      ...(m.modulusDecay ? { modulusDecay: m.modulusDecay } : {}),
      ...(m.fittedStrainRange ? { fittedStrainRange: m.fittedStrainRange } : {}),
      ...(m.hardness ? { hardness: m.hardness } : {}),
    },
    start: route.start,
    steps: route.steps,
    targets: route.targets ?? {},
    inputs,
    correlation: R,
    samples: sc.samples,
    seed: sc.seed,
    coverage: sc.coverage,
    confidence: sc.confidence,
  };
}
