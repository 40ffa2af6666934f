import type { FlowLaw } from '../flow/types.js';
import type { ModulusDecay } from '../material/modulus.js';
import type { KinematicSpec } from '../path/types.js';
import type { TemperState, TemperSystemName } from '../temper/types.js';
import type { HardnessModel } from '../hardness/types.js';

/** Cross-section and height of the stock, mm inside the core. Strip has `thickness`, wire and bar `diameter`. */
export interface Size {
  thickness?: number;
  width?: number;
  diameter?: number;
  height?: number;
}

/** What the stock is, from the starting size: strip (thickness), wire or bar (diameter), or a specimen. */
export type StockKind = 'strip' | 'wire' | 'specimen';

/** A resolved material: everything in MPa, validated. */
export interface Material {
  name: string;
  /** Young's modulus of the annealed material, MPa. */
  elasticModulus: number;
  /** Poisson's ratio, dimensionless; defaults to 0.3 (common practice for steels, copper alloys, aluminium). */
  poissonRatio: number;
  law: FlowLaw;
  modulusDecay?: ModulusDecay;
  /** Armstrong–Frederick backstresses (combined hardening, see core/path/hardening.ts); without them hardening is isotropic. */
  kinematic?: KinematicSpec;
  /** Range of true plastic strain the law was fitted on; beyond it the ledger warns. */
  fittedStrainRange?: readonly [number, number];
  /** Where the law came from, for provenance: `given`, or `fitted from FILE`. */
  source?: string;
  /** Density, kg/m³, for the temperature rise of a pass (optional). */
  density?: number;
  /** Specific heat, J/(kg·K), for the temperature rise of a pass (optional). */
  specificHeat?: number;
  /** Temper system each row is named in (core/temper); without it rows carry no temper. */
  temperSystem?: TemperSystemName;
  /**
   * Equivalent plastic strain since the previous anneal within which a full anneal risks coarse
   * grains, [from, to]; default {@link DEFAULT_GRAIN_GROWTH_STRAIN} (core/route/grainGrowth.ts).
   */
  grainGrowthStrain?: readonly [number, number];
  /** Tabor hardness model (core/hardness); without it the defaults (c ≈ 2.78, εr 0.08) apply. */
  hardness?: HardnessModel;
}

export type StepKind = 'roll' | 'draw' | 'stretch' | 'stretchBiaxial' | 'upset' | 'shear' | 'strain' | 'anneal' | 'reverse' | 'bend';

/** A resolved step, sizes in mm. Exactly one way to give the size change where there is a choice. */
export type Step =
  | { kind: 'roll'; thickness?: number; reductionPct?: number; rollRadius?: number; width?: number; friction?: number; forceCapacity?: number }
  | { kind: 'draw'; diameter?: number; areaReductionPct?: number; dieHalfAngleDeg?: number; friction?: number; forceCapacity?: number }
  | { kind: 'stretch'; strain?: number; engineeringStrain?: number }
  | { kind: 'stretchBiaxial'; strain: number }
  | { kind: 'upset'; height?: number; reductionPct?: number }
  | { kind: 'shear'; shearStrain: number }
  | { kind: 'strain'; strain: number }
  | { kind: 'anneal'; softeningFraction?: number }
  /** Reversed uniaxial strain (compression along the forming direction), true strain magnitude. */
  | { kind: 'reverse'; strain: number }
  /** Bend of strip on a tool: inner radius (mm), bend angle (degrees); `reverse` bends the other way (reverse bending). */
  | { kind: 'bend'; radius: number; angle: number; reverse?: boolean };

/** Designer's limits on the final state, in MPa and percent. */
export interface Targets {
  minYield?: number;
  maxYield?: number;
  minTensile?: number;
  minRemainingElongationPct?: number;
  /** Vickers hardness limits of the final state, HV (kgf/mm²), by Tabor's relation. */
  minHardnessHV?: number;
  maxHardnessHV?: number;
  /** Largest acceptable springback of any bend step, degrees. */
  maxSpringbackDeg?: number;
  /** Temper designation the final state must have, in the material's `temperSystem` (e.g. "H04"). */
  temper?: string;
}

export type TargetName = keyof Targets;

/** Targets that limit a property of the final state (every target but maxSpringbackDeg). */
export type StateTargetName = Exclude<TargetName, 'maxSpringbackDeg' | 'temper'>;

/** One target checked: margin > 0 means met with room; margin is in the target's own unit. */
export interface TargetResult {
  name: TargetName;
  limit: number;
  predicted: number;
  margin: number;
  met: boolean;
  /**
   * For the `temper` target only: the temper wanted and the one reached (null outside the system).
   * `limit` is then the temper's lower boundary, `predicted` the state's value and `margin` the
   * distance to the nearer boundary of the temper, all in the system's basis (% reduction or stress).
   */
  temper?: { wanted: string; got: string | null; basis: 'thicknessReductionPct' | 'tensileStrength' | 'hardnessHV' };
}

export interface Warning {
  code: 'necking' | 'extrapolated' | 'yieldRatio' | 'drawability' | 'capacity' | 'heating' | 'bite' | 'sheetLimit' | 'reversal' | 'bend' | 'grainGrowth';
  message: string;
}

/** Kinematic-hardening results of a step; present only when the material has `kinematic` parameters. MPa in the core. */
export interface KinematicFields {
  /**
   * Reload yield (0.2 % proof) against the direction of the last step, with the kinematic parameters:
   * engineering, magnitude, on the part's own section. Convention: +1 along the forming axis is
   * tension (true stress × e^(−0.002) at the proof point), −1 compression (× e^(+0.002)).
   */
  reverseReloadYield?: number;
  /** Reload yield (0.2 % proof) in the direction of the last step, with the kinematic parameters; basis as `reverseReloadYield`. */
  kinematicReloadYield?: number;
}

/** Results of a bend step; present only on bend steps. */
export interface BendFields {
  /** Outer-fibre bending strain t/(2ρ) (thin-bending theory, ρ the mid-surface radius). */
  outerFibreStrain?: number;
  /** Springback angle, degrees. */
  springbackDeg?: number;
  /** Bend angle after springback, degrees. */
  finalAngleDeg?: number;
  /** Inner radius after springback (mm in the core); null when the strip springs back flat. */
  finalRadius?: number | null;
}

/** Pass loads, heating and sheet limits (core/process/passLoads.ts); present only where they apply. MPa, N, N·m, K in the core. */
export interface PassLoadFields {
  drawingStress?: number;
  drawingForce?: number;
  drawabilityRatio?: number;
  maxAreaReductionPct?: number;
  rollForce?: number;
  rollTorque?: number;
  temperatureRise?: number;
  formingLimitMajorStrain?: number;
}

/** The state after one step: one row of the ledger (MPa, mm, strains true and dimensionless). */
export interface LedgerRow extends StateProperties, KinematicFields, BendFields, PassLoadFields {
  index: number;
  kind: StepKind;
  size: Size;
  strainIncrement: number;
  accumulatedStrain: number;
  coldWorkPct: number;
  meanFlowStress: number;
  plasticWork: number;
  /** The state's temper in the material's `temperSystem`; null outside the system; absent without a system. */
  temper?: TemperState | null;
  warnings: Warning[];
}

/** Properties of a state that depend only on the accumulated strain (see {@link stateProperties}). */
export interface StateProperties {
  /** True stress σ(ε̄), MPa. */
  flowStress: number;
  /** Engineering 0.2 % proof strength on the part's own section, σ(ε̄ + 0.002)·e^(−0.002), MPa (see `reloadYield`). */
  reloadYield: number;
  /** Engineering tensile strength Rm on the part's own section, MPa. */
  tensileStrength: number;
  /** reloadYield / tensileStrength, both engineering on the same section; ≤ 1. */
  yieldRatio: number;
  remainingUniformStrain: number;
  remainingUniformElongationPct: number;
  elasticModulus: number;
  elasticRecoveryStrain: number;
  /** Elastic energy recovered on unloading per unit volume, σ²/(2E), MJ/m³ (numerically MPa). */
  recoveredElasticEnergy: number;
  /** Vickers hardness estimate by Tabor's relation, HV (kgf/mm²); see core/hardness/taborHardness.ts. */
  hardnessHV: number;
}

export interface ColdWorkWindow {
  /** True when no strain since the last anneal meets all the targets together. */
  empty: boolean;
  /** Equivalent strain since the last anneal, lower and upper end; null when empty (upper: null when unbounded). */
  strainFrom: number | null;
  strainTo: number | null;
  /** The same window as percent reduction for the last forming step's kind, or null. */
  reductionBasis: 'thickness' | 'area' | 'height' | null;
  reductionPctFrom: number | null;
  reductionPctTo: number | null;
  /** Which target sets each end (null: the end is 0 strain or unbounded). */
  limitedBy: { from: TargetName | null; to: TargetName | null };
  /** In words, why the window is what it is. */
  note: string;
}

export interface Ledger {
  stock: StockKind;
  /** Considère uniform true plastic strain of the annealed material. */
  uniformStrain: number;
  initial: StateProperties;
  rows: LedgerRow[];
  targets: TargetResult[];
  allTargetsMet: boolean;
  coldWorkWindow: ColdWorkWindow;
}

export interface RouteInput {
  material: Material;
  start: Size;
  steps: readonly Step[];
  targets?: Targets;
}
