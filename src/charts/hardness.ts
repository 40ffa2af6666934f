import * as Plot from '@observablehq/plot';
import { CHART_STYLE, PALETTE } from './palette.js';

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
 * Vickers hardness (Tabor estimate) against step, with the hardness target drawn as a band.
 * Same code in the route planner (browser DOM) and in the runner's HTML report (linkedom).
 */
export function hardnessByStepChart(steps: readonly HardnessChartStep[], o: HardnessChartOptions = {}): SVGSVGElement | HTMLElement {
  const data = [
    ...(o.initialHV !== undefined ? [{ index: 0, hv: o.initialHV }] : []),
    ...steps.filter((s) => s.hardnessHV !== undefined).map((s) => ({ index: s.index, hv: s.hardnessHV! })),
  ];
  const marks: Plot.Markish[] = [];
  const lo = o.minHardnessHV;
  const hi = o.maxHardnessHV;
  if (lo !== undefined || hi !== undefined) {
    const top = hi ?? Math.max(lo ?? 0, ...data.map((d) => d.hv)) * 1.1;
    marks.push(Plot.rectY([{ y1: lo ?? 0, y2: top }], { y1: 'y1', y2: 'y2', fill: PALETTE.band, fillOpacity: 0.25 }));
    for (const [v, what] of [[lo, 'min'], [hi, 'max']] as const) {
      // Labelled inside the band at its right end, clear of the axis label and of the line's start.
      if (v !== undefined) marks.push(Plot.text([{ y: v }], { y: 'y', frameAnchor: 'right', textAnchor: 'end', dx: -4, dy: what === 'min' ? -7 : 8, text: () => `${what} ${v} HV`, fill: PALETTE.ink }));
    }
  }
  marks.push(
    Plot.ruleY([0], { stroke: PALETTE.grid }),
    Plot.line(data, { x: 'index', y: 'hv', stroke: PALETTE.strength, marker: 'circle-stroke' }),
  );
  return Plot.plot({
    ...(o.document ? { document: o.document } : {}),
    width: o.width ?? 640,
    height: o.height ?? 240,
    style: CHART_STYLE,
    // One tick per step, at whole numbers (a tick count can land between steps and repeat a label).
    x: { label: 'step', ticks: data.map((d) => d.index), tickFormat: 'd' },
    y: { label: 'Vickers hardness HV (Tabor estimate)', grid: true },
    marks,
  });
}
