import * as Plot from '@observablehq/plot';
import { CHART_STYLE, MARGIN_BOTTOM, PALETTE } from './palette.js';
import { DEFAULT_CHART_WIDTH, stepAxis, stepSeries, targetBand, type Point } from './ledger.js';

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
    const f = (v: number) => String(+v.toPrecision(4));
    const label = lo !== undefined && hi !== undefined ? `hardness target ${f(lo)}–${f(hi)} HV` : lo !== undefined ? `hardness target ≥ ${f(lo)} HV` : `hardness target ≤ ${f(hi!)} HV`;
    marks.push(...targetBand(lo, hi, dataMax * 1.1, 0, label));
  }
  marks.push(Plot.ruleY([0], { stroke: PALETTE.grid }), ...stepSeries(data, ''));
  return Plot.plot({
    ...(o.document ? { document: o.document } : {}),
    width,
    height: o.height ?? 260,
    marginRight: 24,
    marginBottom: MARGIN_BOTTOM,
    style: CHART_STYLE,
    x: stepAxis(last, width),
    y: { label: 'Vickers hardness HV (Tabor estimate)', grid: true, domain: [0, dataMax * 1.1] },
    color: { domain: [HV], range: [PALETTE.strength] },
    marks,
  });
}
