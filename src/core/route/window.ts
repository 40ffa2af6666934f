import type { FlowLaw } from '../flow/types.js';
import { HARDNESS_DEFAULTS } from '../hardness/defaults.js';
import { strainForHardness } from '../hardness/taborHardness.js';
import type { HardnessModel } from '../hardness/types.js';
import { PROOF_OFFSET } from './state.js';
import { strainForReloadYield } from './reloadYield.js';
import { strainForTensile } from './strainForTensile.js';
import { reductionPctFromStrain, type ReductionBasis } from './steps.js';
import type { ColdWorkWindow, TargetName, Targets } from './types.js';
import { targetLabel } from './targetLabels.js';

/**
 * Cold-work window: the range of equivalent strain s added since the last anneal (on top of the
 * strain ε_b left by that anneal) for which all targets hold together. Each target is monotone in
 * the accumulated strain ε = ε_b + s, so each gives one bound, found with the law's inverse:
 * - minYield Y: Rp0.2(ε) = σ(ε + 0.002)·e^(−0.002) ≥ Y ⇒ ε ≥ σ⁻¹(Y·e^(0.002)) − 0.002
 *   ({@link strainForReloadYield}, the inverse of the ledger's own `reloadYield`); maxYield likewise
 *   gives an upper bound;
 * - minTensile T: T ≤ σ(εu)·e^(ε−εu) ⇒ ε ≥ εu + ln(T/σ(εu)) when T ≤ σ(εu), else ε ≥ σ⁻¹(T);
 * - minRemainingElongationPct P: εu − ε ≥ ln(1 + P/100) ⇒ ε ≤ εu − ln(1 + P/100);
 * - minHardnessHV H: c·σ(ε + εr)/g₀ ≥ H ⇒ ε ≥ σ⁻¹(H·g₀/c) − εr; maxHardnessHV likewise an upper bound
 *   (Tabor's relation, {@link strainForHardness}; `hardness` is the material's model, defaults otherwise).
 * - temper D: the accumulated-strain interval of that temper ({@link temperStrainBand}), passed in as
 *   `temper` (null when the law cannot reach it).
 * The window is reported as strains and, for rolling, drawing and upsetting, as percent reduction
 * (see {@link reductionPctFromStrain}). Units: dimensionless strain, percent.
 * @example coldWorkWindow(hollomon({K: 530, n: 0.44}), 0, { minYield: 300 }, 'thickness').strainFrom
 */
export function coldWorkWindow(
  law: FlowLaw, base: number, targets: Targets, basis: ReductionBasis,
  hardness: Pick<HardnessModel, 'taborFactor' | 'representativeStrain'> = HARDNESS_DEFAULTS,
  temper?: { from: number; to: number | null } | null,
): ColdWorkWindow {
  const eu = law.uniformStrain();
  let lo = 0;
  let hi = Infinity;
  let loBy: TargetName | null = null;
  let hiBy: TargetName | null = null;
  const unreachable: string[] = [];
  const raise = (eps: number, by: TargetName) => {
    const s = eps - base;
    if (s > lo) { lo = s; loBy = by; }
  };
  const lower = (eps: number, by: TargetName) => {
    const s = eps - base;
    if (s < hi) { hi = s; hiBy = by; }
  };
  if (targets.minYield !== undefined) {
    const e = strainForReloadYield(law, targets.minYield);
    if (e === null) unreachable.push(`the ${targetLabel('minYield')} target is above the law's saturation stress (as a reload yield)`);
    else raise(e, 'minYield');
  }
  if (targets.maxYield !== undefined) {
    const e = strainForReloadYield(law, targets.maxYield);
    if (e !== null) lower(e, 'maxYield');
  }
  if (targets.minTensile !== undefined) {
    const T = targets.minTensile;
    const e = strainForTensile(law, T);
    if (e === null) unreachable.push(`the ${targetLabel('minTensile')} target is above the law's saturation stress`);
    else raise(e, 'minTensile');
  }
  if (targets.minRemainingElongationPct !== undefined) {
    lower(eu - Math.log1p(targets.minRemainingElongationPct / 100), 'minRemainingElongationPct');
  }
  if (targets.temper !== undefined && temper !== undefined) {
    if (temper === null) unreachable.push(`${targetLabel('temper', targets.temper)} is above the law's saturation stress`);
    else {
      raise(temper.from, 'temper');
      if (temper.to !== null) lower(temper.to, 'temper');
    }
  }
  if (targets.minHardnessHV !== undefined) {
    const e = strainForHardness(law, targets.minHardnessHV, hardness);
    if (e === null) unreachable.push(`the ${targetLabel('minHardnessHV')} target ${targets.minHardnessHV} HV is above the hardness of the law's saturation stress`);
    else raise(e, 'minHardnessHV');
  }
  if (targets.maxHardnessHV !== undefined) {
    const e = strainForHardness(law, targets.maxHardnessHV, hardness);
    if (e !== null) lower(e, 'maxHardnessHV');
  }
  const label = (n: TargetName | null) => (n === null ? 'unknown' : targetLabel(n, targets.temper));
  const emptyWindow = (note: string): ColdWorkWindow => ({
    empty: true, strainFrom: null, strainTo: null, reductionBasis: basis, reductionPctFrom: null, reductionPctTo: null,
    limitedBy: { from: loBy, to: hiBy }, note,
  });
  if (unreachable.length > 0) return emptyWindow(`no cold work reaches the targets: ${unreachable.join('; ')}`);
  if (hi < 0) return emptyWindow(`the ${label(hiBy)} target is already exceeded before any cold work since the last anneal`);
  if (lo > hi) return emptyWindow(`the ${label(loBy)} target needs at least ${fmt(lo)} strain but the ${label(hiBy)} target allows at most ${fmt(hi)}`);
  const to = Number.isFinite(hi) ? hi : null;
  const pctOf = (s: number | null) => (s === null || basis === null ? null : reductionPctFromStrain(basis, s));
  return {
    empty: false,
    strainFrom: lo,
    strainTo: to,
    reductionBasis: basis,
    reductionPctFrom: pctOf(lo),
    reductionPctTo: pctOf(to),
    limitedBy: { from: loBy, to: hiBy },
    note: `strain since the last anneal from ${fmt(lo)}${loBy ? ` (set by the ${label(loBy)} target)` : ''} to ${to === null ? 'no upper limit' : fmt(to) + ` (set by the ${label(hiBy)} target)`}`,
  };
}

function fmt(x: number): string {
  return x.toFixed(4);
}
