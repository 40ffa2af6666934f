import { trueFromEngineering } from '../route/strain.js';

/**
 * True strain and stress of a whole record from engineering values, at constant volume:
 * ε = ln(1 + e), σ = s·(1 + e) (Dieter, *Mechanical Metallurgy*, SI ed., §8-3; Dowling, *Mechanical
 * Behavior of Materials*, §4.5). Units: strains dimensionless, stress in the record's unit. Valid in
 * uniform deformation (before necking), in tension or compression, for e > −1.
 * @example trueCurve([0.02], [300]) // { strain: [0.019803], stress: [306] }
 */
export function trueCurve(e: ArrayLike<number>, s: ArrayLike<number>): { strain: Float64Array; stress: Float64Array } {
  const strain = new Float64Array(e.length);
  const stress = new Float64Array(e.length);
  for (let i = 0; i < e.length; i++) {
    strain[i] = trueFromEngineering(e[i]!);
    stress[i] = s[i]! * (1 + e[i]!);
  }
  return { strain, stress };
}
