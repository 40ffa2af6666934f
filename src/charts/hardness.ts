// The hardness-by-step chart lives beside the other step charts (`ledger.ts`), sharing their marks
// and axes; this module keeps its import path.
export { hardnessByStepChart, type HardnessChartOptions, type HardnessChartStep } from './ledger.js';
