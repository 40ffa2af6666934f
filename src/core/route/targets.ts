import { checkRange, InputError } from '../errors.js';
import { TEMPER_BOUNDARY_TOL, temperBandIndex, temperOf } from '../temper/scale.js';
import type { TemperScale } from '../temper/types.js';
import type { LedgerRow, StateProperties, StateTargetName, TargetResult, Targets } from './types.js';

/** Each target: the state property it limits and whether it is a lower (min) or upper (max) limit. */
export const TARGET_DEFS: Readonly<Record<StateTargetName, { property: keyof StateProperties; sense: 'min' | 'max'; unit: 'stress' | 'percent' | 'hardness' }>> = {
  minYield: { property: 'reloadYield', sense: 'min', unit: 'stress' },
  maxYield: { property: 'reloadYield', sense: 'max', unit: 'stress' },
  minTensile: { property: 'tensileStrength', sense: 'min', unit: 'stress' },
  minRemainingElongationPct: { property: 'remainingUniformElongationPct', sense: 'min', unit: 'percent' },
  minHardnessHV: { property: 'hardnessHV', sense: 'min', unit: 'hardness' },
  maxHardnessHV: { property: 'hardnessHV', sense: 'max', unit: 'hardness' },
};

/** Largest value a target may take, by its unit: MPa, percent, HV (Vickers numbers end near 2000 for the hardest steels; common practice). */
const TARGET_MAX = { stress: 1e5, percent: 1000, hardness: 3000 } as const;

export const TARGET_NAMES = Object.keys(TARGET_DEFS) as StateTargetName[];

/**
 * Validates targets: each a finite number ≥ 0, and no pair contradicts (minYield ≤ maxYield).
 * @throws InputError naming `targets.NAME`, the value and what is allowed.
 */
export function validateTargets(t: Targets, path = 'targets'): Targets {
  const out: Targets = {};
  for (const name of TARGET_NAMES) {
    const v = t[name];
    if (v === undefined) continue;
    out[name] = checkRange(`${path}.${name}`, v, 0, TARGET_MAX[TARGET_DEFS[name].unit]);
  }
  if (t.maxSpringbackDeg !== undefined) out.maxSpringbackDeg = checkRange(`${path}.maxSpringbackDeg`, t.maxSpringbackDeg, 0, 180);
  if (t.temper !== undefined) {
    if (typeof t.temper !== 'string' || t.temper.length === 0) throw new InputError(`${path}.temper`, t.temper, 'a temper designation of the material\'s temperSystem, e.g. "H04"');
    out.temper = t.temper;
  }
  if (out.minYield !== undefined && out.maxYield !== undefined && out.minYield > out.maxYield) {
    throw new InputError(`${path}.maxYield`, out.maxYield, `a value ≥ minYield (${out.minYield})`, 'contradictory targets');
  }
  if (out.minHardnessHV !== undefined && out.maxHardnessHV !== undefined && out.minHardnessHV > out.maxHardnessHV) {
    throw new InputError(`${path}.maxHardnessHV`, out.maxHardnessHV, `a value ≥ minHardnessHV (${out.minHardnessHV})`, 'contradictory targets');
  }
  return out;
}

/**
 * Checks targets against a final state. margin = predicted − limit for a minimum, limit − predicted
 * for a maximum; met when margin ≥ 0. Units: the target's own (MPa, % or HV).
 * @example checkTargets({ reloadYield: 320, ... }, { minYield: 300 })[0].margin // 20
 */
export function checkTargets(state: StateProperties, targets: Targets): TargetResult[] {
  const out: TargetResult[] = [];
  for (const name of TARGET_NAMES) {
    const limit = targets[name];
    if (limit === undefined) continue;
    const def = TARGET_DEFS[name];
    const predicted = state[def.property];
    const margin = def.sense === 'min' ? predicted - limit : limit - predicted;
    out.push({ name, limit, predicted, margin, met: margin >= 0 });
  }
  return out;
}

/**
 * Checks `maxSpringbackDeg` against the largest springback of any bend step of the route
 * (margin = limit − predicted, degrees). Springback is not a property of the final state alone (it
 * belongs to each bend), and it is not monotone in the cold work since the last anneal (it grows with
 * the flow stress but falls with the chord modulus and depends on each bend's radius), so it gives no
 * bound to the cold-work window: the window ignores it and says so in its note.
 * @throws InputError (`targets.maxSpringbackDeg`) when the route has no bend step.
 * @example checkSpringbackTarget(rows, 3).met
 */
export function checkSpringbackTarget(rows: readonly LedgerRow[], limit: number, path = 'targets.maxSpringbackDeg'): TargetResult {
  let worst: number | null = null;
  for (const r of rows) if (r.springbackDeg !== undefined && (worst === null || r.springbackDeg > worst)) worst = r.springbackDeg;
  if (worst === null) throw new InputError(path, limit, 'a springback target only for a route with a bend step');
  const margin = limit - worst;
  return { name: 'maxSpringbackDeg', limit, predicted: worst, margin, met: margin >= 0 };
}

/**
 * Checks the `temper` target on the final state's basis value `x` (core/temper): met when the state's
 * temper is the one wanted. `limit` is the wanted temper's lower boundary, `predicted` is x, and
 * `margin` the distance from x to the nearer boundary of the wanted temper (negative outside it), in
 * the scale's basis (percent reduction, or MPa of Rm).
 * @throws InputError (`targets.temper`) for a designation not in the scale.
 * @example checkTemperTarget(temperScale('copperRolled', 0), 25, 'H02').margin // 4.30 (to the H02 boundary 20.70 %)
 */
export function checkTemperTarget(scale: TemperScale, x: number, wanted: string, path = 'targets.temper'): TargetResult {
  const k = temperBandIndex(scale, wanted, path);
  const lo = scale.bands[k]!.from;
  const hi = scale.bands[k + 1]?.from;
  const got = temperOf(scale, x)?.designation ?? null;
  const met = got === wanted;
  let margin = hi === undefined ? x - lo : Math.min(x - lo, hi - x);
  // Inside the temper within the boundary tolerance: a margin of round-off size reads as 0, never negative.
  if (met && margin < 0) margin = 0;
  else if (!met && margin >= 0) margin = -Math.max(Math.abs(margin), TEMPER_BOUNDARY_TOL * Math.max(1, Math.abs(lo)));
  return { name: 'temper', limit: lo, predicted: x, margin, met, temper: { wanted, got, basis: scale.basis } };
}
