// strainledger core: pure computation (numbers in, numbers out; no I/O, no DOM, no clock).

// Errors and numerics
export { InputError, ComputationError, checkRange, finite } from './errors.js';
export { brent } from './numeric/brent.js';
export type { RootResult } from './numeric/brent.js';
export { integrate } from './numeric/quadrature.js';
export type { QuadResult } from './numeric/quadrature.js';

// Hardening laws
export { hollomon } from './flow/hollomon.js';
export { ludwik } from './flow/ludwik.js';
export { swift } from './flow/swift.js';
export { voce } from './flow/voce.js';
export { hockettSherby } from './flow/hockettSherby.js';
export { swiftVoce } from './flow/swiftVoce.js';
export { makeLaw, lawSpec } from './flow/makeLaw.js';
export { LAW_PARAMETERS, LAW_NAMES } from './flow/params.js';
export { considereNumeric, tensileStrengthOf, uniformElongationOf, CONSIDERE_SEARCH_LIMIT } from './flow/considere.js';
export type * from './flow/types.js';

// Material
export { chordModulus } from './material/modulus.js';
export type { ModulusDecay } from './material/modulus.js';

// Routes and the ledger
export {
  rollingStrain, drawingStrain, biaxialStrain, shearStrain, upsetStrain, trueFromEngineering, coldWorkPct, PLANE_STRAIN_FACTOR,
} from './route/strain.js';
export { STEP_KINDS, STEP_KIND_NAMES, stockOf, reductionPctFromStrain, MAX_STEP_STRAIN } from './route/steps.js';
export type { StepKindDef, StepContext, StepEffect, ReductionBasis } from './route/steps.js';
export { stateProperties, PROOF_OFFSET } from './route/state.js';
export { evaluateRoute } from './route/ledger.js';
export type { LedgerOptions } from './route/ledger.js';
export { checkTargets, validateTargets, TARGET_DEFS, TARGET_NAMES } from './route/targets.js';
export { coldWorkWindow } from './route/window.js';
export type * from './route/types.js';
