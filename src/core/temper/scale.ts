import { InputError } from '../errors.js';
import type { FlowLaw } from '../flow/types.js';
import { PLANE_STRAIN_FACTOR } from '../route/strain.js';
import type { StateProperties } from '../route/types.js';
import { aluminiumH1xBoundaries } from './aluminiumH1x.js';
import { bsReductionPct } from './bsNumbers.js';
import type { TemperBand, TemperScale, TemperState, TemperSystemName } from './types.js';

/** The temper systems, in the order the plan schema lists them. */
export const TEMPER_SYSTEMS: readonly TemperSystemName[] = ['copperRolled', 'aluminiumH1x', 'steelStrip'];

/**
 * Rolled tempers of copper and copper-alloy strip: designation, name, B&S numbers of thickness
 * reduction from the annealed state. Source: ASTM B601 (temper designations; from memory, as listed
 * in the project's CHECKS.md: H01 quarter hard 1 … H10 extra spring 10).
 */
export const COPPER_ROLLED_TEMPERS: readonly (readonly [string, string, number])[] = [
  ['H01', 'quarter hard', 1], ['H02', 'half hard', 2], ['H03', 'three-quarter hard', 3], ['H04', 'hard', 4],
  ['H06', 'extra hard', 6], ['H08', 'spring', 8], ['H10', 'extra spring', 10],
];

/**
 * Cold-rolled carbon steel strip tempers, lower boundary as thickness reduction from the annealed
 * state, %. ASTM A109 defines these tempers by Rockwell B hardness ranges (No. 1 hard … No. 5 dead
 * soft), not by reduction; the reductions below are APPROXIMATE mill practice FROM MEMORY, a
 * stand-in until the temper is read from the row's hardness (see DEVELOPERS.md, issue 15).
 */
export const STEEL_STRIP_TEMPERS: readonly (readonly [string, string, number])[] = [
  ['No. 5', 'dead soft', 0], ['No. 4', 'skin rolled', 0.5], ['No. 3', 'quarter hard', 3], ['No. 2', 'half hard', 15], ['No. 1', 'hard', 35],
];

/** Relative tolerance at a temper boundary: a value this close below a boundary counts as on it (round-off of sizes). */
export const TEMPER_BOUNDARY_TOL = 1e-9;

/**
 * The temper scale of a system for one material. `rmO` is the tensile strength of the annealed
 * material (the law at ε̄ = 0, {@link stateProperties}), needed by `aluminiumH1x` only.
 * - `copperRolled`: boundaries 100·(1 − 1.1229^(−N)) % thickness reduction, N the B&S numbers
 *   of {@link COPPER_ROLLED_TEMPERS} (H02 = 20.70 %, H04 = 37.13 %);
 * - `aluminiumH1x`: boundaries in MPa of Rm by {@link aluminiumH1xBoundaries};
 * - `steelStrip`: {@link STEEL_STRIP_TEMPERS} (approximate, from memory).
 * Units: percent or MPa. @example temperScale('copperRolled', 220).bands[1].from // 20.70
 * @throws InputError (`material.temperSystem`) for an unknown system.
 */
export function temperScale(system: TemperSystemName, rmO: number, path = 'material.temperSystem'): TemperScale {
  const bands = (rows: readonly (readonly [string, string, number])[], from: (x: number) => number): TemperBand[] =>
    rows.map(([designation, name, x]) => ({ designation, name, from: from(x) }));
  switch (system) {
    case 'copperRolled':
      return { system, basis: 'thicknessReductionPct', bands: bands(COPPER_ROLLED_TEMPERS, bsReductionPct) };
    case 'steelStrip':
      return { system, basis: 'thicknessReductionPct', bands: bands(STEEL_STRIP_TEMPERS, (x) => x) };
    case 'aluminiumH1x': {
      const b = aluminiumH1xBoundaries(rmO);
      return {
        system, basis: 'tensileStrength', bands: [
          { designation: 'H12', name: 'quarter hard', from: b.H12 }, { designation: 'H14', name: 'half hard', from: b.H14 },
          { designation: 'H16', name: 'three-quarter hard', from: b.H16 }, { designation: 'H18', name: 'full hard', from: b.H18 },
          { designation: 'H19', name: 'extra hard', from: b.H19 },
        ],
      };
    }
    default:
      throw new InputError(path, system, `one of ${TEMPER_SYSTEMS.join(', ')}`);
  }
}

/**
 * The value of a scale's basis for a state: the thickness reduction of plane-strain rolling that
 * gives the accumulated strain, 100·(1 − e^(−(√3/2)·ε̄)) % (equal to the %CW of strip rolled from
 * annealed stock; MDH §3.4 plane strain), or the state's tensile strength (the same
 * {@link stateProperties} value the ledger row reports). Units: percent or MPa.
 * @example temperBasisValue(scale, 0.2, props) // 15.9 for a thickness-reduction scale
 */
export function temperBasisValue(scale: TemperScale, eps: number, props: Pick<StateProperties, 'tensileStrength'>): number {
  return scale.basis === 'tensileStrength' ? props.tensileStrength : -Math.expm1(-eps / PLANE_STRAIN_FACTOR) * 100;
}

/**
 * The temper of a basis value: the highest band whose lower boundary the value reaches (within
 * {@link TEMPER_BOUNDARY_TOL}, relative), with the next designation and the fraction of the way to it
 * ((x − from)/(next.from − from), clamped to [0, 1)); null below the first band.
 * @example temperOf(temperScale('copperRolled', 0), 20.75)?.designation // "H02"
 */
export function temperOf(scale: TemperScale, x: number): TemperState | null {
  const reaches = (b: TemperBand) => x >= b.from - TEMPER_BOUNDARY_TOL * Math.max(1, Math.abs(b.from));
  let k = -1;
  for (let i = 0; i < scale.bands.length; i++) if (reaches(scale.bands[i]!)) k = i;
  if (k < 0) return null;
  const band = scale.bands[k]!;
  const next = scale.bands[k + 1];
  if (!next) return { designation: band.designation, name: band.name, next: null, towardNext: null };
  const f = (x - band.from) / (next.from - band.from);
  return { designation: band.designation, name: band.name, next: next.designation, towardNext: Math.min(Math.max(f, 0), 1 - 1e-12) };
}

/**
 * The accumulated-strain interval [from, to] whose states have temper `designation`: each boundary
 * of the scale mapped to a strain by the basis' inverse (thickness reduction r: ε̄ = −(2/√3)·ln(1 − r/100);
 * tensile strength T: ε̄ = εu + ln(T/σ(εu)) for T ≤ σ(εu), else σ⁻¹(T), as in {@link coldWorkWindow}).
 * The upper end is the next temper's boundary less 2·{@link TEMPER_BOUNDARY_TOL} (relative, in the
 * basis), so a state at either end reports the temper. `to` is null for the top temper; the interval
 * is null when the law cannot reach the temper (above saturation).
 * @throws InputError (`path`) for a designation not in the scale.
 */
export function temperStrainBand(scale: TemperScale, law: FlowLaw, designation: string, path = 'targets.temper'): { from: number; to: number | null } | null {
  const k = scale.bands.findIndex((b) => b.designation === designation);
  if (k < 0) throw new InputError(path, designation, `a temper of ${scale.system}: ${scale.bands.map((b) => b.designation).join(', ')}`);
  const lo = strainOfBasis(scale, law, scale.bands[k]!.from);
  if (lo === null) return null;
  const next = scale.bands[k + 1];
  if (!next) return { from: lo, to: null };
  const hi = strainOfBasis(scale, law, next.from * (1 - 2 * TEMPER_BOUNDARY_TOL));
  return { from: lo, to: hi };
}

function strainOfBasis(scale: TemperScale, law: FlowLaw, x: number): number | null {
  if (scale.basis === 'thicknessReductionPct') return x <= 0 ? 0 : PLANE_STRAIN_FACTOR * -Math.log1p(-x / 100);
  const eu = law.uniformStrain();
  const su = law.stress(eu);
  if (x <= su) return Math.max(0, eu + Math.log(x / su));
  if (law.saturationStress !== undefined && x >= law.saturationStress) return null;
  try {
    return law.strainAt(x);
  } catch {
    return null;
  }
}
