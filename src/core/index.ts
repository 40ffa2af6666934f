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
export { LAW_PARAMETERS, LAW_NAMES, LAW_TITLES } from './flow/params.js';
export { considereNumeric, forcePeaks, tensileStrengthOf, uniformElongationOf, CONSIDERE_SEARCH_LIMIT } from './flow/considere.js';
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
export { stateProperties } from './route/state.js';
export { reloadYield, strainForReloadYield, PROOF_OFFSET, PROOF_SECTION_FACTOR } from './route/reloadYield.js';
export { strainForTensile } from './route/strainForTensile.js';
export { evaluateRoute } from './route/ledger.js';
export type { LedgerOptions } from './route/ledger.js';
export { checkTargets, checkSpringbackTarget, validateTargets, TARGET_DEFS, TARGET_NAMES } from './route/targets.js';
export { coldWorkWindow } from './route/window.js';
export { checkTemperTarget, hardnessCaution } from './route/targets.js';
export { TARGET_LABELS, targetLabel, WARNING_LABELS } from './route/targetLabels.js';
export { DEFAULT_GRAIN_GROWTH_STRAIN, validateGrainGrowthStrain, inGrainGrowthRange } from './route/grainGrowth.js';

// Standard tempers: copper strip by B&S numbers, strain-hardened aluminium, carbon steel strip
export { BS_NUMBER_RATIO, bsReductionPct } from './temper/bsNumbers.js';
export { h18Increase, aluminiumH1xBoundaries, H18_INCREASE, H19_ABOVE_H18 } from './temper/aluminiumH1x.js';
export {
  TEMPER_SYSTEMS, COPPER_ROLLED_TEMPERS, STEEL_STRIP_TEMPERS, hvOfRockwellB, TEMPER_BOUNDARY_TOL, temperScale, temperBandIndex, temperBasisValue, temperOf, temperStrainBand,
} from './temper/scale.js';
export { materialTemperScale, COPPER_WIRE_REFUSAL } from './temper/materialScale.js';
export type * from './temper/types.js';
export type * from './route/types.js';

// Hardness: Tabor's relation, the Tabor-factor fit from readings, conversion tables (issue 15)
export { STANDARD_GRAVITY, VICKERS_CONTACT_RATIO, HARDNESS_DEFAULTS, HARDNESS_RANGES, HARDNESS_MODEL_REL_ERROR } from './hardness/defaults.js';
export { taborHardness, strainForHardness, validateHardnessModel, defaultHardnessModel } from './hardness/taborHardness.js';
export { fitTaborFactor } from './hardness/fitTaborFactor.js';
export type { TaborFit } from './hardness/fitTaborFactor.js';
export { convertHardness, hardnessConversions, hardnessTableRange } from './hardness/convertHardness.js';
export type { ConvertedHardness } from './hardness/convertHardness.js';
export { STEEL_TABLE, CONVERSION_TABLES, CONVERSION_GROUPS, HARDNESS_SCALES } from './hardness/conversionTables.js';
export type { ConversionTable } from './hardness/conversionTables.js';
export type * from './hardness/types.js';

// Load paths with reversal: 1-D return mapping, Armstrong–Frederick backstresses
export { createPathStepper, integratePath, PATH_DEFAULTS } from './path/integrate.js';
export type { PathStepper } from './path/integrate.js';
export { isotropicPart, validateKinematic, backstressAfter } from './path/hardening.js';
export type * from './path/types.js';
export { fitKinematic, KINEMATIC_FIT_BOUNDS } from './path/fitKinematic.js';
export type { KinematicFit, KinematicFitOptions } from './path/fitKinematic.js';

// Bending springback: moment–curvature through the thickness, unloading, the inverse
export { momentCurvature } from './bend/momentCurvature.js';
export type { MomentResult } from './bend/momentCurvature.js';
export { springback, RESIDUAL_POINTS } from './bend/springback.js';
export type { BendTool, SpringbackResult } from './bend/springback.js';
export { overbendAngle, overbendRadius } from './bend/overbend.js';
export type { OverbendResult } from './bend/overbend.js';
export type { BendSection } from './bend/section.js';

// Scatter: seeded Monte Carlo through the route, tolerance bounds
export { xoshiro128ss } from './scatter/rng.js';
export type { Rng } from './scatter/rng.js';
export { normalSampler, normalCdf } from './scatter/normal.js';
export { normalQuantile } from './scatter/normalQuantile.js';
export { cholesky } from './scatter/cholesky.js';
export { noncentralTCdf } from './scatter/noncentralT.js';
export { normalToleranceFactor } from './scatter/toleranceFactor.js';
export type { ToleranceFactorResult } from './scatter/toleranceFactor.js';
export { orderStatisticLowerRank } from './scatter/orderStatisticBound.js';

// Process planning: pass loads, heating, sheet limits, route design
export { PROCESS_DEFAULTS, RAD_PER_DEG } from './process/defaults.js';
export { drawingStress } from './process/drawingStress.js';
export type { DrawingStress } from './process/drawingStress.js';
export { maxDrawReduction } from './process/maxDrawReduction.js';
export type { MaxDrawReduction } from './process/maxDrawReduction.js';
export { rollingLoad } from './process/rollingLoad.js';
export type { RollingLoad } from './process/rollingLoad.js';
export { temperatureRise } from './process/temperatureRise.js';
export { hillLocalizedLimit, hillInstabilityRate, equivalentPerMajor } from './process/hillLocalizedLimit.js';
export { swiftDiffuseLimit, swiftInstabilityRate } from './process/swiftDiffuseLimit.js';
export { sheetFormability } from './process/sheetFormability.js';
export type { SheetFormability } from './process/sheetFormability.js';
export { passLoads, hasPassLoads, PASS_LOAD_FIELDS, SHEET_STRAIN_RATIO } from './process/passLoads.js';
export type { PassInput, PassLoads } from './process/passLoads.js';
export { designRoute } from './process/designRoute.js';
export type { DesignSpec, DesignResult, DesignedRoute, AnnealNote } from './process/designRoute.js';
export { prepareScatter, stepEffects, SCATTER_BLOCK, SCATTER_DEFAULTS, START_FIELDS } from './scatter/problem.js';
export type { ScatterProblem, ScatterInputSpec, ScatterMaterialSpec, PreparedScatter } from './scatter/problem.js';
export { evaluateScatterSample, scatterRouteInput, sampleScatterBlock, MAX_CONSECUTIVE_REJECTS } from './scatter/sample.js';
export type { SampleOutcome, ScatterBlock } from './scatter/sample.js';
export { summarizeScatter, scatterPercentile } from './scatter/summarize.js';
export type { ScatterSummary, Distribution, InputSensitivity, ToleranceBound } from './scatter/summarize.js';
export { deltaMethod } from './scatter/delta.js';
export type { DeltaResult } from './scatter/delta.js';
export { runScatter } from './scatter/run.js';
export type { RunScatterOptions } from './scatter/run.js';

// Tensile records: standard properties (issue 3)
export { analyzeRecord, ANALYZE_DEFAULTS, removeMachineCompliance, spreadOverParallelLength } from './tensile/analyzeRecord.js';
export type { AnalyzeOptions } from './tensile/analyzeRecord.js';
export { analyzeSpecimens, summarizeSpecimens, SPECIMEN_PROPERTIES } from './tensile/analyzeSpecimens.js';
export type { SpecimenSet, PropertySummary, SpecimenProperty } from './tensile/analyzeSpecimens.js';
export { elasticModulus, ELASTIC_WINDOW } from './tensile/elasticModulus.js';
export type { ElasticResult } from './tensile/elasticModulus.js';
export { proofStrength, totalExtensionStrength } from './tensile/proofStrength.js';
export { yieldPoint, yieldPlateau, YIELD_DROP, YIELD_PLATEAU } from './tensile/yieldPoint.js';
export { noiseLag1, recordNoise, recordNoiseWide } from './tensile/recordNoise.js';
export { forceMaximum, LAW_GATE_CHI2 } from './tensile/forceMaximum.js';
export type { ForceMaximum } from './tensile/forceMaximum.js';
export { findRateChange, rateStep, RATE_CHANGE } from './tensile/rateChange.js';
export type { RateJump, RateStep } from './tensile/rateChange.js';
export { extensometerEnd, EXTENSOMETER_END } from './tensile/extensometerEnd.js';
export type { ExtensometerEnd } from './tensile/extensometerEnd.js';
export { strainSteps, spreadStrainSteps, STRAIN_STEPS } from './tensile/strainSteps.js';
export type { StrainSteps } from './tensile/strainSteps.js';
export { testStarts, TEST_START } from './tensile/testStarts.js';
export { droppedRows, findGlitches, glitchRun, GLITCH } from './tensile/glitches.js';
export type { DroppedRows, Glitch } from './tensile/glitches.js';
export { quadraticFit, movingAverage } from './tensile/localFit.js';
export type { YieldPointResult, YieldPlateau } from './tensile/yieldPoint.js';
export { nValueFit } from './tensile/nValue.js';
export { trueCurve } from './tensile/trueCurve.js';
export { findCycles, fitModulusDecay, UNLOAD_MIN_DROP } from './tensile/cycles.js';
export type * from './tensile/types.js';

// Law fitting and statistics (issue 3)
export { levenbergMarquardt, levenbergMarquardtNormal, LM_DEFAULTS } from './fit/levenbergMarquardt.js';
export type { Model, LmOptions, LmResult, NormalProblem, NormalLmResult } from './fit/levenbergMarquardt.js';
export { lawData, lawNormalProblem, lawResidualPass, lawResidualStats } from './fit/lawNormalEquations.js';
export type { LawData } from './fit/lawNormalEquations.js';
export { blockAverage, reductionBlockSize, REDUCTION_DEFAULTS } from './fit/blockAverage.js';
export { blockMoments, MOMENT_STRIDE, type BlockMoments } from './fit/blockMoments.js';
export { curveResidualStats, momentResidualStats, upperResidualSquares, type CurveResidualStats, type MomentResidualStats } from './fit/momentResidualStats.js';
export type { BlockAverages } from './fit/blockAverage.js';
export { effectivePoints } from './fit/effectivePoints.js';
export type { EffectivePoints } from './fit/effectivePoints.js';
export { fitLaw, lawBounds, lawModel, lawModelFast, START_SAMPLE } from './fit/fitLaw.js';
export { lawJacobian } from './fit/lawJacobian.js';
export type { FitLawOptions } from './fit/fitLaw.js';
export { fitAllLaws, FIT_DEFAULTS } from './fit/fitAllLaws.js';
export type { LawComparison, ExtrapolationPoint, FitAllOptions } from './fit/fitAllLaws.js';
export { fitStatistics, parameterErrors } from './fit/fitStatistics.js';
export type { FitStatistics, ParameterErrors } from './fit/fitStatistics.js';
export { linearFit } from './fit/linearFit.js';
export type { LinearFit } from './fit/linearFit.js';
export { studentTQuantile, studentTCdf, incompleteBeta, lnGamma } from './fit/studentT.js';
export { startValues } from './fit/startValues.js';
export type * from './fit/types.js';
export { synthesizeRecord } from './tensile/synthesize.js';
export type { SynthSpec, SynthRecord } from './tensile/synthesize.js';
export { synthesizeLabRecord } from './tensile/synthesizeLabRecord.js';
export type { LabRecordSpec, LabRecord, LabRecordTruth } from './tensile/synthesizeLabRecord.js';
export { scatterFromSpecimens } from './scatter/fromSpecimens.js';
export type { SpecimenLawParameters, SpecimenScatter } from './scatter/fromSpecimens.js';
