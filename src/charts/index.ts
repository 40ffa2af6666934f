// strainledger/charts: @observablehq/plot figures for anyone's own page or notebook.
// Each returns an SVG (or a figure element); in Node pass `document` (e.g. from linkedom's parseHTML).

export { strengthByStepChart, ductilityByStepChart, hardnessByStepChart, stepTicks, REPORT_CHART_WIDTH } from './ledger.js';
export type { LedgerChartStep, LedgerChartStart, LedgerChartOptions, HardnessChartStep, HardnessChartOptions } from './ledger.js';
export { flowCurveChart, loadUnloadChart, markPrestrain } from './prestrain.js';
export type { CurveSeries, FlowChartOptions, LoadUnloadPath } from './prestrain.js';
export { recordCurveChart, residualChart, CHART_MAX_POINTS } from './records.js';
export { reversalChart, residualStressChart } from './reversal.js';
export type { PathSeries } from './reversal.js';
export { yieldHistogram } from './scatter.js';
export type { YieldHistogramOptions } from './scatter.js';
export { PALETTE, CHART_STYLE } from './palette.js';
