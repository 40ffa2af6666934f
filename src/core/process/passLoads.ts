import { InputError } from '../errors.js';
import type { FlowLaw } from '../flow/types.js';
import type { PassLoadFields } from '../route/types.js';
import { PROCESS_DEFAULTS, RAD_PER_DEG } from './defaults.js';
import { drawingStress } from './drawingStress.js';
import { maxDrawReduction } from './maxDrawReduction.js';
import { rollingLoad } from './rollingLoad.js';
import { sheetFormability } from './sheetFormability.js';
import { temperatureRise } from './temperatureRise.js';
import { sig4 } from '../numeric/sig4.js';

/** Strain ratio β = ε2/ε1 of the sheet (strip) step kinds that stretch the sheet; others have none. */
export const SHEET_STRAIN_RATIO: Readonly<Record<string, number>> = {
  stretch: -0.5,
  stretchBiaxial: 1,
  bend: 0,
};

/** What a pass needs for its loads: the step as given (process options included) and the state around it. */
export interface PassInput {
  step: {
    kind: string;
    dieHalfAngleDeg?: number;
    friction?: number;
    rollRadius?: number;
    width?: number;
    forceCapacity?: number;
  };
  stock: 'strip' | 'wire' | 'specimen';
  law: FlowLaw;
  density?: number;
  specificHeat?: number;
  sizeBefore: { thickness?: number; width?: number; diameter?: number };
  sizeAfter: { thickness?: number; width?: number; diameter?: number };
  strainBefore: number;
  strainAfter: number;
  meanFlowStress: number;
  plasticWork: number;
  path: string;
  /** Formats a force in N in the plan's unit, for warnings. */
  force?: (n: number) => string;
}

/** The optional ledger fields of a pass (present only where they apply) and its warnings. */
export interface PassLoads extends PassLoadFields {
  warnings: { code: 'drawability' | 'capacity' | 'heating' | 'bite' | 'sheetLimit'; message: string }[];
}

const fmtN = (n: number) => `${sig4(n)} N`;

/** The optional numeric fields {@link passLoads} may set, in report order. */
export const PASS_LOAD_FIELDS = [
  'drawingStress', 'drawingForce', 'drawabilityRatio', 'maxAreaReductionPct', 'rollForce', 'rollTorque', 'temperatureRise', 'formingLimitMajorStrain',
] as const;

/**
 * Whether {@link passLoads} has anything to add for this step: die data on a draw, roll data on a
 * roll, density and specific heat on the material, or a sheet-stretching step on strip. The ledger
 * asks first, so routes without process data keep the ledger's hot path free of this work.
 */
export function hasPassLoads(step: PassInput['step'], stock: PassInput['stock'], material: { density?: number; specificHeat?: number }): boolean {
  if (material.density !== undefined && material.specificHeat !== undefined) return true;
  if (step.kind === 'draw') return step.dieHalfAngleDeg !== undefined || step.friction !== undefined;
  if (step.kind === 'roll') return step.rollRadius !== undefined || step.friction !== undefined;
  return stock === 'strip' && SHEET_STRAIN_RATIO[step.kind] !== undefined;
}

/**
 * Loads, heating and sheet limits of one forming step, from the formulas of this folder:
 * - draw with `dieHalfAngleDeg` and `friction`: drawing stress ({@link drawingStress}), force σd·A1
 *   (N), drawability ratio σd/σ(ε1) against {@link PROCESS_DEFAULTS}.maxDrawabilityRatio, and the
 *   largest reduction of the pass under the same conditions ({@link maxDrawReduction});
 * - roll with `rollRadius` and `friction` (width from the step or the strip): {@link rollingLoad};
 * - either with `forceCapacity` (N): a warning when the force exceeds it;
 * - every forming step when the material gives density and specific heat: {@link temperatureRise}
 *   of the work per volume (the drawing stress for a draw with loads — all external work, an upper
 *   bound — else the step's plastic work), warning above {@link PROCESS_DEFAULTS}.maxTemperatureRise;
 * - sheet-stretching steps on strip: remaining major strain in the step's own strain ratio after the
 *   step ({@link sheetFormability}).
 * Units: MPa, mm, N, N·m, K.
 * @throws InputError naming `steps[i].field` for a missing or out-of-range option.
 */
export function passLoads(p: PassInput): PassLoads {
  const out: PassLoads = { warnings: [] };
  const s = p.step;
  const force = p.force ?? fmtN;
  const d = p.strainAfter - p.strainBefore;
  let work = p.plasticWork;
  if (s.kind === 'draw' && (s.dieHalfAngleDeg !== undefined || s.friction !== undefined)) {
    if (s.dieHalfAngleDeg === undefined) throw new InputError(`${p.path}.dieHalfAngleDeg`, undefined, 'a die half-angle in degrees (0, 45] together with friction');
    if (s.friction === undefined) throw new InputError(`${p.path}.friction`, undefined, 'a friction coefficient in [0, 0.5] together with dieHalfAngleDeg');
    const a = s.dieHalfAngleDeg * RAD_PER_DEG;
    const ds = drawingStress(p.meanFlowStress, d, a, s.friction, p.path);
    const exitFlow = p.law.stress(p.strainAfter);
    out.drawingStress = ds.stress;
    out.drawabilityRatio = exitFlow > 0 ? ds.stress / exitFlow : 0;
    out.maxAreaReductionPct = maxDrawReduction(p.law, p.strainBefore, a, s.friction, p.path).areaReductionPct;
    work = ds.stress;
    if (out.drawabilityRatio > PROCESS_DEFAULTS.maxDrawabilityRatio) {
      out.warnings.push({ code: 'drawability', message: `drawing stress is ${(out.drawabilityRatio * 100).toFixed(1)} % of the exit flow stress, above ${PROCESS_DEFAULTS.maxDrawabilityRatio * 100} % (safety factor ${+(1 / PROCESS_DEFAULTS.maxDrawabilityRatio).toFixed(3)}); the wire may yield or break outside the die` });
    }
    const dia = p.sizeAfter.diameter;
    if (dia !== undefined) {
      out.drawingForce = ds.stress * (Math.PI / 4) * dia * dia;
      if (s.forceCapacity !== undefined && out.drawingForce > s.forceCapacity) {
        out.warnings.push({ code: 'capacity', message: `drawing force ${force(out.drawingForce)} exceeds the stated capacity ${force(s.forceCapacity)}` });
      }
    }
  }
  if (s.kind === 'roll' && (s.rollRadius !== undefined || s.friction !== undefined)) {
    if (s.rollRadius === undefined) throw new InputError(`${p.path}.rollRadius`, undefined, 'a roll radius > 0 together with friction');
    if (s.friction === undefined) throw new InputError(`${p.path}.friction`, undefined, 'a friction coefficient in [0, 0.6] together with rollRadius');
    const width = s.width ?? p.sizeBefore.width;
    if (width === undefined) throw new InputError(`${p.path}.width`, undefined, 'a strip width > 0 (on the step or in start.width) for the roll force');
    const h0 = p.sizeBefore.thickness;
    const h1 = p.sizeAfter.thickness;
    if (h0 !== undefined && h1 !== undefined) {
      const r = rollingLoad(p.meanFlowStress, s.rollRadius, h0, h1, width, s.friction, p.path);
      out.rollForce = r.force;
      out.rollTorque = r.torque;
      if (s.forceCapacity !== undefined && r.force > s.forceCapacity) {
        out.warnings.push({ code: 'capacity', message: `roll force ${force(r.force)} exceeds the stated mill capacity ${force(s.forceCapacity)}` });
      }
      if (h0 - h1 > r.maxBiteDraft) {
        out.warnings.push({ code: 'bite', message: `draft ${sig4(h0 - h1)} mm is above μ²·R = ${sig4(r.maxBiteDraft)} mm: the rolls may not bite the strip unaided` });
      }
    }
  }
  if (p.density !== undefined && p.specificHeat !== undefined && d > 0) {
    out.temperatureRise = temperatureRise(work, p.density, p.specificHeat, PROCESS_DEFAULTS.heatToWorkFraction, p.path);
    if (out.temperatureRise > PROCESS_DEFAULTS.maxTemperatureRise) {
      out.warnings.push({ code: 'heating', message: `adiabatic temperature rise ${out.temperatureRise.toFixed(0)} K is above ${PROCESS_DEFAULTS.maxTemperatureRise} K` });
    }
  }
  const beta = SHEET_STRAIN_RATIO[s.kind];
  if (p.stock === 'strip' && beta !== undefined) {
    const f = sheetFormability(p.law, p.strainAfter, beta, p.path);
    out.formingLimitMajorStrain = f.remainingMajorStrain;
    if (f.remainingMajorStrain <= 0) out.warnings.push({ code: 'sheetLimit', message: `no formability left at strain ratio ${beta} (${f.criterion === 'hillLocalized' ? "Hill's local neck" : "Swift's diffuse neck"})` });
  }
  return out;
}
