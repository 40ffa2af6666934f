import { InputError } from '../errors.js';
import { stateProperties } from '../route/state.js';
import type { Material } from '../route/types.js';
import { temperScale } from './scale.js';
import type { TemperScale } from './types.js';

/**
 * The temper scale of a material: {@link temperScale} of `material.temperSystem`, with the annealed
 * tensile strength Rm(O) = {@link stateProperties}(material, 0).tensileStrength that `aluminiumH1x`
 * needs (the other systems do not depend on the material). The one place the ledger
 * (`evaluateRoute`) and the route designer (`designRoute`) get a material's scale from.
 * Units: the scale's basis (percent thickness reduction, MPa of Rm, or HV).
 * @param wanted a temper the caller must find in the scale (a `temper` target): with no temper
 * system on the material this is an InputError at `wanted.path`.
 * @param eu the law's uniform strain when the caller has it (saves one Considère solve).
 * @returns undefined when the material names no temper system and no temper is wanted.
 * @throws InputError (`wanted.path`) for a wanted temper without a temper system.
 * @example materialTemperScale({ ...copper, temperSystem: 'copperRolled' })!.bands[3]!.designation // "H04"
 */
export function materialTemperScale(material: Material, wanted?: { designation: string; path: string }, eu?: number): TemperScale | undefined {
  const system = material.temperSystem;
  if (system === undefined) {
    if (wanted) throw new InputError(wanted.path, wanted.designation, 'a temper target only with material.temperSystem set');
    return undefined;
  }
  return temperScale(system, system === 'aluminiumH1x' ? stateProperties(material, 0, eu ?? material.law.uniformStrain()).tensileStrength : 0);
}
