import { InputError } from '../errors.js';
import { HARDNESS_DEFAULTS } from '../hardness/defaults.js';
import { STEEL_TABLE } from '../hardness/conversionTables.js';
import { strainForHardness } from '../hardness/taborHardness.js';
import type { HardnessModel } from '../hardness/types.js';
import type { FlowLaw } from '../flow/types.js';
import { PLANE_STRAIN_FACTOR } from '../route/strain.js';
import { strainForTensile } from '../route/strainForTensile.js';
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
 * Cold-rolled carbon steel strip tempers by Rockwell B hardness, ASTM A109 (FROM MEMORY, not checked
 * against a printed copy): No. 5 dead soft B55 max; No. 4 skin rolled B65 max; No. 3 quarter hard
 * B60–B75; No. 2 half hard B70–B85; No. 1 hard B84 min. The published ranges overlap, so a state is
 * given the hardest temper whose MINIMUM it reaches; No. 4 has no published minimum and begins above
 * No. 5's maximum. The third column is each temper's lower boundary in HRB (null: from zero).
 */
export const STEEL_STRIP_TEMPERS: readonly (readonly [string, string, number | null])[] = [
  ['No. 5', 'dead soft', null], ['No. 4', 'skin rolled', 55], ['No. 3', 'quarter hard', 60], ['No. 2', 'half hard', 70], ['No. 1', 'hard', 84],
];

/**
 * Vickers number of a Rockwell B number by the steel conversion table (ISO 18265 / ASTM E140, see
 * {@link STEEL_TABLE}; values from memory), inverse linear interpolation between its rows — the same
 * table the report's `hardnessHRB` uses, so a boundary here and a row's converted HRB agree.
 * @throws InputError outside the table's HRB range.
 * @example hvOfRockwellB(70) // ≈ 127.3
 */
export function hvOfRockwellB(hrb: number): number {
  const hv = STEEL_TABLE.hv;
  const col = STEEL_TABLE.values.HRB;
  for (let i = 0; i + 1 < hv.length; i++) {
    const a = col[i];
    const b = col[i + 1];
    if (a === null || a === undefined || b === null || b === undefined) continue;
    if (hrb >= a && hrb <= b) return hv[i]! + ((hv[i + 1]! - hv[i]!) * (hrb - a)) / (b - a);
  }
  throw new InputError('hrb', hrb, `a Rockwell B number inside the steel conversion table, HRB ${Math.min(...col.filter((v): v is number => typeof v === 'number'))} to ${Math.max(...col.filter((v): v is number => typeof v === 'number'))}`);
}

/** Relative tolerance at a temper boundary: a value this close below a boundary counts as on it (round-off of sizes). */
export const TEMPER_BOUNDARY_TOL = 1e-9;

/**
 * The temper scale of a system for one material. `rmO` is the tensile strength of the annealed
 * material (the law at ε̄ = 0, {@link stateProperties}), needed by `aluminiumH1x` only.
 * - `copperRolled`: boundaries 100·(1 − 1.1229^(−N)) % thickness reduction, N the B&S numbers
 *   of {@link COPPER_ROLLED_TEMPERS} (H02 = 20.70 %, H04 = 37.13 %);
 * - `aluminiumH1x`: boundaries in MPa of Rm by {@link aluminiumH1xBoundaries};
 * - `steelStrip`: boundaries in HV, the A109 Rockwell B minima of {@link STEEL_STRIP_TEMPERS}
 *   converted by {@link hvOfRockwellB}.
 * Units: percent or MPa. @example temperScale('copperRolled', 220).bands[1].from // 20.70
 * @throws InputError (`material.temperSystem`) for an unknown system.
 */
export function temperScale(system: TemperSystemName, rmO: number, path = 'material.temperSystem'): TemperScale {
  // Copper and steel scales do not depend on the material: built once (measured: rebuilding them on
  // every ledger run cost about a tenth of a 10-step route; bench/tempers.mjs).
  if (system === 'copperRolled') return (COPPER_SCALE ??= Object.freeze(buildScale(system, rmO, path)));
  if (system === 'steelStrip') return (STEEL_SCALE ??= Object.freeze(buildScale(system, rmO, path)));
  return buildScale(system, rmO, path);
}

let COPPER_SCALE: TemperScale | undefined;
let STEEL_SCALE: TemperScale | undefined;

function buildScale(system: TemperSystemName, rmO: number, path: string): TemperScale {
  const bands = (rows: readonly (readonly [string, string, number])[], from: (x: number) => number): TemperBand[] =>
    rows.map(([designation, name, x]) => ({ designation, name, from: from(x) }));
  switch (system) {
    case 'copperRolled':
      return { system, basis: 'thicknessReductionPct', bands: bands(COPPER_ROLLED_TEMPERS, bsReductionPct) };
    case 'steelStrip':
      return { system, basis: 'hardnessHV', bands: STEEL_STRIP_TEMPERS.map(([designation, name, hrb]) => ({ designation, name, from: hrb === null ? 0 : hvOfRockwellB(hrb) })) };
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
 * annealed stock; MDH §3.4 plane strain), or the state's tensile strength or Vickers hardness (the
 * same {@link stateProperties} values the ledger row reports). Units: percent, MPa or HV.
 * @example temperBasisValue(scale, 0.2, props) // 15.9 for a thickness-reduction scale
 */
export function temperBasisValue(scale: TemperScale, eps: number, props: Pick<StateProperties, 'tensileStrength' | 'hardnessHV'>): number {
  if (scale.basis === 'tensileStrength') return props.tensileStrength;
  if (scale.basis === 'hardnessHV') return props.hardnessHV;
  return -Math.expm1(-eps / PLANE_STRAIN_FACTOR) * 100;
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
 * Where a designation stands in a scale: the index of its band (tempers in increasing order).
 * The one lookup of a temper by name (the temper target, its strain band).
 * @throws InputError (`path`) naming the designation and the scale's tempers when it is not one of them.
 * @example temperBandIndex(temperScale('copperRolled', 0), 'H04') // 3
 */
export function temperBandIndex(scale: TemperScale, designation: string, path = 'targets.temper'): number {
  const k = scale.bands.findIndex((b) => b.designation === designation);
  if (k < 0) throw new InputError(path, designation, `a temper of ${scale.system}: ${scale.bands.map((b) => b.designation).join(', ')}`);
  return k;
}

/**
 * The accumulated-strain interval [from, to] whose states have temper `designation`: each boundary
 * of the scale mapped to a strain by the basis' inverse (thickness reduction r: ε̄ = −(2/√3)·ln(1 − r/100);
 * tensile strength T: ε̄ = εu + ln(T/σ(εu)) for T ≤ σ(εu), else σ⁻¹(T), as in {@link coldWorkWindow};
 * hardness H: ε̄ = σ⁻¹(H·g₀/c) − εr, {@link strainForHardness}, with the material's hardness model).
 * The upper end is the next temper's boundary less 2·{@link TEMPER_BOUNDARY_TOL} (relative, in the
 * basis), so a state at either end reports the temper. `to` is null for the top temper; the interval
 * is null when the law cannot reach the temper (above saturation).
 * @throws InputError (`path`) for a designation not in the scale.
 */
export function temperStrainBand(
  scale: TemperScale, law: FlowLaw, designation: string, path = 'targets.temper',
  hardness: Pick<HardnessModel, 'taborFactor' | 'representativeStrain'> = HARDNESS_DEFAULTS,
): { from: number; to: number | null } | null {
  const k = temperBandIndex(scale, designation, path);
  const lo = strainOfBasis(scale, law, scale.bands[k]!.from, hardness);
  if (lo === null) return null;
  const next = scale.bands[k + 1];
  if (!next) return { from: lo, to: null };
  const hi = strainOfBasis(scale, law, next.from * (1 - 2 * TEMPER_BOUNDARY_TOL), hardness);
  return { from: lo, to: hi };
}

function strainOfBasis(scale: TemperScale, law: FlowLaw, x: number, hardness: Pick<HardnessModel, 'taborFactor' | 'representativeStrain'>): number | null {
  if (scale.basis === 'thicknessReductionPct') return x <= 0 ? 0 : PLANE_STRAIN_FACTOR * -Math.log1p(-x / 100);
  if (scale.basis === 'hardnessHV') {
    const e = strainForHardness(law, x, hardness);
    return e === null ? null : Math.max(0, e);
  }
  const e = strainForTensile(law, x);
  return e === null ? null : Math.max(0, e);
}
