import { InputError } from '../errors.js';
import { stateProperties } from '../route/state.js';
import type { Material, StockKind } from '../route/types.js';
import { temperScale } from './scale.js';
import type { TemperScale } from './types.js';

/**
 * Why copper wire gets no temper names, and what to do instead. Decision (DEVELOPERS.md, "Code and
 * test quality"): copper wire tempers — hard-drawn, medium-hard drawn, soft (annealed) — are defined
 * by ASTM B1, B2 and B3 (from memory) through tensile-strength and elongation limits that change with
 * the wire's diameter, not by a reduction count; those tables are not at hand to check, so they are not
 * built in. The user's wire specification gives the limits as `minTensile` and
 * `minRemainingElongationPct` targets.
 */
export const COPPER_WIRE_REFUSAL = {
  allowed: 'copperRolled for strip or a specimen without a size; aluminiumH1x or steelStrip for wire or bar',
  why: 'copperRolled names rolled-strip tempers (ASTM B601: H01–H10 by B&S numbers of thickness reduction); copper wire tempers (hard-drawn, medium-hard, soft: ASTM B1, B2, B3) are set by tensile and elongation limits that depend on the diameter and are not built in — leave out temperSystem and give minTensile and minRemainingElongationPct targets from the wire specification',
} as const;

/**
 * The temper scale of a material: {@link temperScale} of `material.temperSystem`, with the annealed
 * tensile strength Rm(O) = {@link stateProperties}(material, 0).tensileStrength that `aluminiumH1x`
 * needs (the other systems do not depend on the material). The one place the ledger
 * (`evaluateRoute`) and the route designer (`designRoute`) get a material's scale from.
 * Units: the scale's basis (percent thickness reduction, MPa of Rm, or HV).
 * @param wanted a temper the caller must find in the scale (a `temper` target): with no temper
 * system on the material this is an InputError at `wanted.path`.
 * @param stock the stock the route forms: `copperRolled` (ASTM B601 rolled-strip tempers, counted in
 * B&S numbers of THICKNESS reduction) is refused for wire and bar, with {@link COPPER_WIRE_REFUSAL}.
 * @param eu the law's uniform strain when the caller has it (saves one Considère solve).
 * @returns undefined when the material names no temper system and no temper is wanted.
 * @throws InputError (`wanted.path`) for a wanted temper without a temper system; InputError
 * (`material.temperSystem`) for `copperRolled` on wire or bar.
 * @example materialTemperScale({ ...copper, temperSystem: 'copperRolled' })!.bands[3]!.designation // "H04"
 */
export function materialTemperScale(material: Material, stock: StockKind, wanted?: { designation: string; path: string }, eu?: number): TemperScale | undefined {
  const system = material.temperSystem;
  if (system === undefined) {
    if (wanted) throw new InputError(wanted.path, wanted.designation, 'a temper target only with material.temperSystem set');
    return undefined;
  }
  if (system === 'copperRolled' && stock === 'wire') throw new InputError('material.temperSystem', system, COPPER_WIRE_REFUSAL.allowed, COPPER_WIRE_REFUSAL.why);
  return temperScale(system, system === 'aluminiumH1x' ? stateProperties(material, 0, eu ?? material.law.uniformStrain()).tensileStrength : 0);
}
