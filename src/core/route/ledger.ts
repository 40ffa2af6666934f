import { ComputationError } from '../errors.js';
import { hasPassLoads, PASS_LOAD_FIELDS, passLoads } from '../process/passLoads.js';
import { PROOF_OFFSET } from './reloadYield.js';
import { stateProperties } from './state.js';
import { STEP_KINDS, stockOf, type ReductionBasis } from './steps.js';
import { checkSpringbackTarget, checkTargets, checkTemperTarget, validateTargets } from './targets.js';
import { inGrainGrowthRange, validateGrainGrowthStrain } from './grainGrowth.js';
import { temperBasisValue, temperOf, temperStrainBand } from '../temper/scale.js';
import { materialTemperScale } from '../temper/materialScale.js';
import { backstressAfter, isotropicPart } from '../path/hardening.js';
import type { Ledger, LedgerRow, RouteInput, Size, StockKind, Warning } from './types.js';
import { coldWorkWindow } from './window.js';

/** Options of {@link evaluateRoute}. */
export interface LedgerOptions {
  /** Formats a length given in mm in the plan's unit, for messages; defaults to `"<x> mm"`. */
  length?: (mm: number) => string;
}

const defaultLength = (mm: number) => `${+mm.toPrecision(6)} mm`;

/**
 * Percent cold work since the last anneal (the trade's %CW): thickness reduction for strip, area
 * reduction for wire and bar (Callister's %CW = (A0 − A)/A0·100), and for a specimen the area
 * reduction a uniaxial strain of the same size would give, 100·(1 − exp(−ε̄)).
 */
function coldWork(stock: StockKind, ref: Size, size: Size, strainSince: number): number {
  if (stock === 'strip' && ref.thickness !== undefined && size.thickness !== undefined) return (1 - size.thickness / ref.thickness) * 100;
  if (stock === 'wire' && ref.diameter !== undefined && size.diameter !== undefined) return (1 - (size.diameter / ref.diameter) ** 2) * 100;
  return -Math.expm1(-strainSince) * 100;
}

/**
 * Carries a material through a route of forming steps and anneals and returns the ledger: one row per
 * step with the accumulated von Mises plastic strain, %CW since the last anneal and the properties of
 * {@link stateProperties}, the mean flow stress and plastic work of the step, warnings, the targets
 * checked on the final state, and the cold-work window.
 *
 * Hardening is isotropic and the same loading direction is assumed for the reload yield. An anneal
 * with softening fraction f lowers the flow stress to σ(ε̄) − f·(σ(ε̄) − σ(0)) and sets the strain to the
 * one the law gives for that stress ("fractional softening", the measure used for static recovery
 * and recrystallisation, e.g. Humphreys & Hatherly, *Recrystallization and Related Annealing
 * Phenomena*, 2nd ed., §6.2); f = 1 is a full anneal to the starting state.
 * Units: MPa, mm, dimensionless strain, MJ/m³ for work and energy.
 * @throws InputError naming `steps[i].field` for a step that cannot happen; ComputationError for a
 * number that cannot be computed (never a NaN in the result).
 */
export function evaluateRoute(input: RouteInput, opts: LedgerOptions = {}): Ledger {
  const { material, start, steps } = input;
  const length = opts.length ?? defaultLength;
  const law = material.law;
  const eu = law.uniformStrain();
  const targets = validateTargets(input.targets ?? {});
  const stock = stockOf(start);
  const fitted = material.fittedStrainRange;
  const grainRange = validateGrainGrowthStrain(material.grainGrowthStrain);
  // Temper scale (core/temper): thickness-reduction systems name strip tempers and refuse wire and bar.
  const scale = materialTemperScale(material, stock, targets.temper === undefined ? undefined : { designation: targets.temper, path: 'targets.temper' }, eu);

  let size: Size = { ...start };
  let eps = 0;
  let annealSize: Size = size;
  let strainSince = 0;
  let epsAfterAnneal = 0;
  let basis: ReductionBasis = null;
  const rows: LedgerRow[] = new Array(steps.length);
  // Kinematic state (issue 6): backstresses along the forming axis, advanced in closed form over each
  // step's plastic strain in its direction (+1 forward, −1 reverse); see core/path/hardening.ts.
  const kin = material.kinematic;
  const iso = kin ? isotropicPart(law, kin, 'material.kinematic') : undefined;
  const back: number[] = kin ? kin.backstresses.map(() => 0) : [];
  let dir: 1 | -1 = 1;

  for (let i = 0; i < steps.length; i++) {
    const step = steps[i]!;
    const path = `steps[${i}]`;
    const def = STEP_KINDS[step.kind];
    const effect = def.apply(step, { stock, size, path, length, state: { material, strain: eps, backstresses: [...back] } });
    const before = eps;
    let meanFlowStress = 0;
    let plasticWork = 0;
    let coarseGrain = false;
    const strainBeforeAnneal = strainSince;
    if (effect.softeningFraction !== undefined) {
      const f = effect.softeningFraction;
      // Only a full anneal recrystallises throughout; a partial one (f < 1) is modelled as softening only.
      coarseGrain = f >= 1 && inGrainGrowthRange(strainSince, grainRange);
      if (f >= 1) eps = 0;
      else {
        const s0 = law.stress(0);
        eps = law.strainAt(law.stress(eps) - f * (law.stress(eps) - s0));
      }
      for (let k = 0; k < back.length; k++) back[k] = f >= 1 ? 0 : back[k]! * (1 - f);
      annealSize = effect.size;
      strainSince = 0;
      epsAfterAnneal = eps;
    } else {
      const d = effect.strainIncrement;
      eps = before + d;
      const sdir = effect.direction ?? 1;
      if (kin) for (let k = 0; k < back.length; k++) back[k] = backstressAfter(back[k]!, kin.backstresses[k]!.C, kin.backstresses[k]!.gamma, sdir, d);
      if (d > 0) dir = sdir;
      strainSince += d;
      plasticWork = law.work(eps) - law.work(before);
      meanFlowStress = d > 1e-12 ? plasticWork / d : law.stress(eps);
      basis = def.reductionBasis;
    }
    size = effect.size;
    const p = stateProperties(material, eps, eu);
    const warnings: Warning[] = [];
    if (eps >= eu && effect.softeningFraction === undefined) {
      warnings.push({ code: 'necking', message: `accumulated strain ${eps.toFixed(4)} is at or past the uniform strain ${eu.toFixed(4)}: necking risk in tension, no uniform elongation left` });
    }
    if (coarseGrain) {
      warnings.push({ code: 'grainGrowth', message: `full anneal after only ${strainBeforeAnneal.toFixed(4)} strain since the previous anneal, inside the critical range ${grainRange[0]}–${grainRange[1]} for grain growth: coarse grains (orange peel, lower strength) are likely; give more cold work before this anneal, or leave it out` });
    }
    if (fitted && eps + PROOF_OFFSET > fitted[1]) {
      warnings.push({ code: 'extrapolated', message: `law used beyond the strain range it was fitted on (${(eps + PROOF_OFFSET).toFixed(4)} > ${fitted[1].toFixed(4)})` });
    }
    const row: LedgerRow = {
      index: i + 1,
      kind: step.kind,
      size,
      strainIncrement: effect.strainIncrement,
      accumulatedStrain: eps,
      coldWorkPct: coldWork(stock, annealSize, size, strainSince),
      flowStress: p.flowStress,
      reloadYield: p.reloadYield,
      tensileStrength: p.tensileStrength,
      yieldRatio: p.yieldRatio,
      remainingUniformStrain: p.remainingUniformStrain,
      remainingUniformElongationPct: p.remainingUniformElongationPct,
      elasticModulus: p.elasticModulus,
      elasticRecoveryStrain: p.elasticRecoveryStrain,
      recoveredElasticEnergy: p.recoveredElasticEnergy,
      hardnessHV: p.hardnessHV,
      meanFlowStress,
      plasticWork,
      warnings,
    };
    if (scale) row.temper = temperOf(scale, temperBasisValue(scale, eps, p));
    if (kin && iso) {
      // 0.2 % proof stress reloading along s, engineering on the part's own section: the true stress
      // s·ΣXᵢ(after 0.002 along s) + R(ε̄ + 0.002), magnitude, times exp(−s·0.002). Convention: +1 is
      // tension along the forming axis (the section shrinks by e^−0.002), −1 compression (the section
      // grows by e^+0.002, so the compressive proof strength on the part's section is the larger).
      const proofAlong = (s: 1 | -1) => {
        let x = 0;
        for (let k = 0; k < back.length; k++) x += backstressAfter(back[k]!, kin.backstresses[k]!.C, kin.backstresses[k]!.gamma, s, PROOF_OFFSET);
        return (s * x + iso.size(eps + PROOF_OFFSET)) * Math.exp(-s * PROOF_OFFSET);
      };
      row.kinematicReloadYield = proofAlong(dir);
      row.reverseReloadYield = proofAlong(-dir as 1 | -1);
      if (!Number.isFinite(row.kinematicReloadYield + row.reverseReloadYield)) throw new ComputationError(`${path}.reverseReloadYield`, 'not a finite number; check material.kinematic');
    } else if (step.kind === 'reverse' || (step.kind === 'bend' && step.reverse === true)) {
      warnings.push({ code: 'reversal', message: 'reversed loading with isotropic hardening only: the yield in the reversed direction is overstated (Bauschinger effect); give material.kinematic to estimate it' });
    }
    if (effect.bend) {
      const b = effect.bend;
      row.outerFibreStrain = b.outerFibreStrain;
      row.springbackDeg = b.springbackDeg;
      row.finalAngleDeg = b.finalAngleDeg;
      row.finalRadius = b.finalRadius;
      if (!Number.isFinite(b.outerFibreStrain + b.springbackDeg + b.finalAngleDeg + (b.finalRadius ?? 0))) throw new ComputationError(`${path}.springbackDeg`, 'not a finite number; check the bend and the material');
      const t = size.thickness ?? 0;
      const Ri = (step as { radius: number }).radius;
      if (Ri < 2 * t) warnings.push({ code: 'bend', message: `sharp bend (inner radius ${length(Ri)} < 2 × thickness ${length(t)}): thin-bending theory (strain y/ρ, neutral surface at mid-thickness, no thinning) is approximate here` });
      if (b.reverseYield) warnings.push({ code: 'bend', message: 'the residual stress after springback reaches reverse yield in part of the thickness; unloading is not purely elastic and the springback given is somewhat overstated' });
      warnings.push({ code: 'bend', message: 'after a bend the ledger follows the outer fibre (the most strained); strength varies through the thickness and the mid-plane keeps its earlier state' });
    }
    if (effect.softeningFraction === undefined && hasPassLoads(step, stock, material)) {
      // Pass loads, heating and sheet limits, present only where the step and material give what they need.
      const loads = passLoads({
        step, stock, law, density: material.density, specificHeat: material.specificHeat, sizeBefore: rows[i - 1]?.size ?? start, sizeAfter: size,
        strainBefore: before, strainAfter: eps, meanFlowStress, plasticWork, path,
      });
      for (const k of PASS_LOAD_FIELDS) {
        const v = loads[k];
        if (v === undefined) continue;
        if (!Number.isFinite(v)) throw new ComputationError(`${path}.${k}`, `not a finite number (${v}); check the process data of the step`);
        row[k] = v;
      }
      if (loads.warnings.length > 0) warnings.push(...loads.warnings);
    }
    // One sum finds any non-finite field cheaply; only then look for which one.
    const sum = row.accumulatedStrain + row.coldWorkPct + row.flowStress + row.reloadYield + row.tensileStrength + row.yieldRatio +
      row.remainingUniformElongationPct + row.elasticRecoveryStrain + row.recoveredElasticEnergy + row.hardnessHV + row.meanFlowStress + row.plasticWork +
      (size.thickness ?? 0) + (size.diameter ?? 0) + (size.width ?? 0) + (size.height ?? 0);
    if (!Number.isFinite(sum)) {
      for (const [k, v] of Object.entries(row)) if (typeof v === 'number' && !Number.isFinite(v)) throw new ComputationError(`${path}.${k}`, `not a finite number (${v}); check the law parameters and the step size`);
      throw new ComputationError(`${path}.size`, 'size is not finite; check the step size');
    }
    rows[i] = row;
  }

  const initial = stateProperties(material, 0, eu);
  const final = rows.length > 0 ? rows[rows.length - 1]! : initial;
  const results = checkTargets(final, targets);
  if (scale && targets.temper !== undefined) results.push(checkTemperTarget(scale, temperBasisValue(scale, final === initial ? 0 : rows[rows.length - 1]!.accumulatedStrain, final), targets.temper));
  const band = scale && targets.temper !== undefined ? temperStrainBand(scale, law, targets.temper, 'targets.temper', material.hardness) : undefined;
  let window = coldWorkWindow(law, epsAfterAnneal, targets, basis, material.hardness, band);
  if (targets.maxSpringbackDeg !== undefined) {
    results.push(checkSpringbackTarget(rows, targets.maxSpringbackDeg));
    window = { ...window, note: `${window.note}; maxSpringbackDeg is checked on the route's bend steps but sets no bound here (springback is not monotone in cold work)` };
  }
  return {
    stock,
    uniformStrain: eu,
    initial,
    rows,
    targets: results,
    allTargetsMet: results.every((t) => t.met),
    coldWorkWindow: window,
  };
}
