import * as Plot from '@observablehq/plot';
import { chartFrame, PALETTE, X_AXIS } from './palette.js';
import { sig4 } from '../core/numeric/sig4.js';

/** The numbers a ledger chart needs, in the plan's units (what the JSON report's steps hold). */
export interface LedgerChartStep {
  index: number;
  kind: string;
  reloadYield: number;
  tensileStrength: number;
  remainingUniformElongationPct: number;
  coldWorkPct: number;
}

/** The starting stock (before step 1), drawn at step 0 on every step chart. */
export interface LedgerChartStart {
  reloadYield: number;
  tensileStrength: number;
  remainingUniformElongationPct: number;
  /** %CW of the starting stock; 0 for annealed stock (the default). */
  coldWorkPct?: number;
}

export interface LedgerChartOptions {
  stressUnit: string;
  /** The starting stock, plotted at step 0. */
  start?: LedgerChartStart;
  minYield?: number;
  maxYield?: number;
  /** Width in px: the notebooks pass their container's width, reports {@link REPORT_CHART_WIDTH}. */
  width?: number;
  height?: number;
  /** A DOM document; in Node pass linkedom's, in the browser omit. */
  document?: Document;
}

/** Width (px) of the charts in the HTML report: its text column (body max-width 72rem at 16 px). */
export const REPORT_CHART_WIDTH = 1152;
/** Width (px) used when none is given (a notebook before it has measured its container). */
export const DEFAULT_CHART_WIDTH = 640;
/** Least horizontal room (px) per labelled tick on a step axis. */
const PX_PER_STEP_TICK = 44;

/**
 * The ticks of a step axis 0..last: integers only (a step is a whole event), every step when they
 * fit at {@link PX_PER_STEP_TICK} px each, else every 2nd, 5th, 10th, ... step, always from 0.
 * @example stepTicks(5, 600) // [0, 1, 2, 3, 4, 5]
 * @example stepTicks(40, 600) // [0, 5, 10, 15, 20, 25, 30, 35, 40]
 */
export function stepTicks(last: number, width: number): number[] {
  const n = Math.max(0, Math.floor(last));
  const room = Math.max(1, Math.floor(width / PX_PER_STEP_TICK));
  const strides = [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000];
  const stride = strides.find((s) => Math.floor(n / s) + 1 <= room) ?? Math.ceil((n + 1) / room);
  const ticks: number[] = [];
  for (let i = 0; i <= n; i += stride) ticks.push(i);
  return ticks;
}


/** One value of one series at one step (step 0: the starting stock). */
interface Point { index: number; value: number; what: string }

/**
 * The marks every step chart shares: a value holds from the step that set it until the next step,
 * so each series is drawn as a staircase (`step-after`: flat while the value holds, a vertical jump
 * at the step that changes it) with a dot at each step; step 0 is the starting stock.
 */
function stepSeries(data: readonly Point[], dashed: string): Plot.Markish[] {
  // The second series is dashed: where the two coincide (yield ratio near 1, %CW equal to the
  // remaining elongation) both colours still show.
  return [
    Plot.line(data.filter((d) => d.what !== dashed), { x: 'index', y: 'value', stroke: 'what', z: 'what', curve: 'step-after', strokeWidth: 2 }),
    Plot.line(data.filter((d) => d.what === dashed), { x: 'index', y: 'value', stroke: 'what', z: 'what', curve: 'step-after', strokeWidth: 2, strokeDasharray: '7,4' }),
    Plot.dot(data, { x: 'index', y: 'value', stroke: 'what', fill: 'white', r: 3.5, strokeWidth: 2 }),
  ];
}

/** A labelled target band from `lo` to `hi` (either may be open), with its label inside the band. */
function targetBand(lo: number | undefined, hi: number | undefined, top: number, bottom: number, label: string): Plot.Markish[] {
  const y1 = lo ?? bottom;
  const y2 = hi ?? top;
  return [
    Plot.rectY([{ y1, y2 }], { y1: 'y1', y2: 'y2', fill: PALETTE.band, fillOpacity: 0.25 }),
    ...(lo !== undefined ? [Plot.ruleY([lo], { stroke: PALETTE.band, strokeWidth: 1.5 })] : []),
    ...(hi !== undefined ? [Plot.ruleY([hi], { stroke: PALETTE.band, strokeWidth: 1.5 })] : []),
    // The label sits inside the band at its left end (over the starting stock, usually soft and
    // well below a strength target), just below the band's upper edge; a band open at the top is
    // labelled just above its floor.
    Plot.text([{ x: 0, y: hi !== undefined ? y2 : y1 }], {
      x: 'x', y: 'y', text: () => label, textAnchor: 'start', lineAnchor: hi !== undefined ? 'top' : 'bottom',
      dx: 4, dy: hi !== undefined ? 3 : -3, fill: PALETTE.ink, fontWeight: 600, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke',
    }),
  ];
}

function stepAxis(last: number, width: number): Plot.ScaleOptions {
  return { label: 'step (0 = starting stock)', domain: [0, Math.max(1, last)], ticks: stepTicks(last, width), tickFormat: 'd', inset: 14, ...X_AXIS };
}

/**
 * Reload yield (solid) and tensile strength (dashed) after each step (step 0: the starting stock),
 * drawn as steps, with the yield target as a labelled band. Same code in the notebooks (browser DOM) and in the
 * runner's HTML report (linkedom).
 */
export function strengthByStepChart(steps: readonly LedgerChartStep[], o: LedgerChartOptions): SVGSVGElement | HTMLElement {
  const RP = 'reload yield Rp0.2';
  const RM = 'tensile strength Rm';
  const data: Point[] = [
    ...(o.start ? [{ index: 0, value: o.start.reloadYield, what: RP }, { index: 0, value: o.start.tensileStrength, what: RM }] : []),
    ...steps.flatMap((s) => [{ index: s.index, value: s.reloadYield, what: RP }, { index: s.index, value: s.tensileStrength, what: RM }]),
  ];
  const last = steps.length ? steps[steps.length - 1]!.index : 0;
  const width = o.width ?? DEFAULT_CHART_WIDTH;
  const dataMax = Math.max(0, ...data.map((d) => d.value), o.minYield ?? 0, o.maxYield ?? 0);
  const marks: Plot.Markish[] = [];
  if (o.minYield !== undefined || o.maxYield !== undefined) {
    const label = o.minYield !== undefined && o.maxYield !== undefined ? `yield target ${sig4(o.minYield)}–${sig4(o.maxYield)} ${o.stressUnit}`
      : o.minYield !== undefined ? `yield target ≥ ${sig4(o.minYield)} ${o.stressUnit}` : `yield target ≤ ${sig4(o.maxYield!)} ${o.stressUnit}`;
    marks.push(...targetBand(o.minYield, o.maxYield, dataMax * 1.1, 0, label));
  }
  marks.push(Plot.ruleY([0], { stroke: PALETTE.grid }), ...stepSeries(data, RM));
  return Plot.plot({
    ...chartFrame(o, DEFAULT_CHART_WIDTH, 320),
    marginRight: 24,
    x: stepAxis(last, width),
    y: { label: `stress (${o.stressUnit})`, grid: true, domain: [0, dataMax * 1.1] },
    color: { domain: [RP, RM], range: [PALETTE.strength, PALETTE.ductility], legend: true },
    marks,
  });
}

/**
 * Remaining uniform elongation (%, solid) and %CW since the last anneal (dashed) after each step
 * (step 0: the starting stock), drawn as steps, with the elongation target as a labelled band.
 */
export function ductilityByStepChart(steps: readonly LedgerChartStep[], o: Omit<LedgerChartOptions, 'minYield' | 'maxYield'> & { minRemainingElongationPct?: number }): SVGSVGElement | HTMLElement {
  const EL = 'remaining uniform elongation (%)';
  const CW = '%CW since the last anneal';
  const data: Point[] = [
    ...(o.start ? [{ index: 0, value: o.start.remainingUniformElongationPct, what: EL }, { index: 0, value: o.start.coldWorkPct ?? 0, what: CW }] : []),
    ...steps.flatMap((s) => [{ index: s.index, value: s.remainingUniformElongationPct, what: EL }, { index: s.index, value: s.coldWorkPct, what: CW }]),
  ];
  const last = steps.length ? steps[steps.length - 1]!.index : 0;
  const width = o.width ?? DEFAULT_CHART_WIDTH;
  const marks: Plot.Markish[] = [];
  if (o.minRemainingElongationPct !== undefined) {
    marks.push(...targetBand(o.minRemainingElongationPct, undefined, 100, 0, `elongation target ≥ ${sig4(o.minRemainingElongationPct)} %`));
  }
  marks.push(Plot.ruleY([0], { stroke: PALETTE.grid }), ...stepSeries(data, CW));
  return Plot.plot({
    ...chartFrame(o, DEFAULT_CHART_WIDTH, 280),
    marginRight: 24,
    x: stepAxis(last, width),
    y: { label: 'percent (%)', grid: true, domain: [0, 100] },
    color: { domain: [EL, CW], range: [PALETTE.ductility, PALETTE.coldWork], legend: true },
    marks,
  });
}

/** What the hardness chart needs of a step: its number and the Tabor estimate (HV). */
export interface HardnessChartStep {
  index: number;
  kind: string;
  hardnessHV?: number;
}

export interface HardnessChartOptions {
  /** Hardness of the annealed state, HV, plotted at step 0. */
  initialHV?: number;
  /** Hardness target band, HV. */
  minHardnessHV?: number;
  maxHardnessHV?: number;
  width?: number;
  height?: number;
  /** A DOM document; in Node pass linkedom's, in the browser omit. */
  document?: Document;
}

/**
 * Vickers hardness (Tabor estimate) after each step (step 0: the starting stock), drawn as steps like
 * the other step charts (`ledger.ts`: integer step ticks, a value holds until the next step), with
 * the hardness target as a labelled band. Same code in the route planner (browser DOM) and in the
 * runner's HTML report (linkedom).
 */
export function hardnessByStepChart(steps: readonly HardnessChartStep[], o: HardnessChartOptions = {}): SVGSVGElement | HTMLElement {
  const HV = 'Vickers hardness (Tabor estimate)';
  const data: Point[] = [
    ...(o.initialHV !== undefined ? [{ index: 0, value: o.initialHV, what: HV }] : []),
    ...steps.filter((s) => s.hardnessHV !== undefined).map((s) => ({ index: s.index, value: s.hardnessHV!, what: HV })),
  ];
  const last = steps.length ? steps[steps.length - 1]!.index : 0;
  const width = o.width ?? DEFAULT_CHART_WIDTH;
  const lo = o.minHardnessHV;
  const hi = o.maxHardnessHV;
  const dataMax = Math.max(0, ...data.map((d) => d.value), lo ?? 0, hi ?? 0);
  const marks: Plot.Markish[] = [];
  if (lo !== undefined || hi !== undefined) {
    const label = lo !== undefined && hi !== undefined ? `hardness target ${sig4(lo)}–${sig4(hi)} HV` : lo !== undefined ? `hardness target ≥ ${sig4(lo)} HV` : `hardness target ≤ ${sig4(hi)} HV`;
    marks.push(...targetBand(lo, hi, dataMax * 1.1, 0, label));
  }
  marks.push(Plot.ruleY([0], { stroke: PALETTE.grid }), ...stepSeries(data, ''));
  return Plot.plot({
    ...chartFrame(o, DEFAULT_CHART_WIDTH, 260),
    marginRight: 24,
    x: stepAxis(last, width),
    y: { label: 'Vickers hardness HV (Tabor estimate)', grid: true, domain: [0, dataMax * 1.1] },
    color: { domain: [HV], range: [PALETTE.strength] },
    marks,
  });
}
