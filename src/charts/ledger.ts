import * as Plot from '@observablehq/plot';
import { CHART_STYLE, PALETTE } from './palette.js';

/** The numbers a ledger chart needs, in the plan's units (what the JSON report's steps hold). */
export interface LedgerChartStep {
  index: number;
  kind: string;
  reloadYield: number;
  tensileStrength: number;
  remainingUniformElongationPct: number;
  coldWorkPct: number;
}

export interface LedgerChartOptions {
  stressUnit: string;
  /** Initial (annealed) reload yield, plotted at step 0. */
  initialYield?: number;
  minYield?: number;
  maxYield?: number;
  width?: number;
  height?: number;
  /** A DOM document; in Node pass linkedom's, in the browser omit. */
  document?: Document;
}

/**
 * Reload yield and tensile strength against step, with the yield target drawn as a band.
 * Same code in the notebooks (browser DOM) and in the runner's HTML report (linkedom).
 */
export function strengthByStepChart(steps: readonly LedgerChartStep[], o: LedgerChartOptions): SVGSVGElement | HTMLElement {
  const data = [
    ...(o.initialYield !== undefined ? [{ index: 0, value: o.initialYield, what: 'reload yield Rp0.2' }] : []),
    ...steps.flatMap((s) => [
      { index: s.index, value: s.reloadYield, what: 'reload yield Rp0.2' },
      { index: s.index, value: s.tensileStrength, what: 'tensile strength Rm' },
    ]),
  ];
  const lo = o.minYield;
  const hi = o.maxYield;
  const marks: Plot.Markish[] = [];
  if (lo !== undefined || hi !== undefined) {
    const top = hi ?? Math.max(...data.map((d) => d.value)) * 1.1;
    marks.push(Plot.rectY([{ y1: lo ?? 0, y2: top }], { y1: 'y1', y2: 'y2', fill: PALETTE.band, fillOpacity: 0.25 }));
  }
  marks.push(
    Plot.ruleY([0], { stroke: PALETTE.grid }),
    Plot.line(data, { x: 'index', y: 'value', stroke: 'what', marker: 'circle-stroke' }),
  );
  return Plot.plot({
    ...(o.document ? { document: o.document } : {}),
    width: o.width ?? 640,
    height: o.height ?? 300,
    style: CHART_STYLE,
    x: { label: 'step', ticks: steps.length + 1, tickFormat: 'd' },
    y: { label: `stress (${o.stressUnit})`, grid: true },
    color: { domain: ['reload yield Rp0.2', 'tensile strength Rm'], range: [PALETTE.strength, PALETTE.ductility], legend: true },
    marks,
  });
}

/** Remaining uniform elongation (%) and %CW since the last anneal against step. */
export function ductilityByStepChart(steps: readonly LedgerChartStep[], o: Omit<LedgerChartOptions, 'minYield' | 'maxYield'> & { minRemainingElongationPct?: number }): SVGSVGElement | HTMLElement {
  const data = steps.flatMap((s) => [
    { index: s.index, value: s.remainingUniformElongationPct, what: 'remaining uniform elongation %' },
    { index: s.index, value: s.coldWorkPct, what: '%CW since anneal' },
  ]);
  const marks: Plot.Markish[] = [];
  if (o.minRemainingElongationPct !== undefined) {
    marks.push(Plot.rectY([{ y1: o.minRemainingElongationPct, y2: 100 }], { y1: 'y1', y2: 'y2', fill: PALETTE.band, fillOpacity: 0.2 }));
  }
  marks.push(Plot.ruleY([0], { stroke: PALETTE.grid }), Plot.line(data, { x: 'index', y: 'value', stroke: 'what', marker: 'circle-stroke' }));
  return Plot.plot({
    ...(o.document ? { document: o.document } : {}),
    width: o.width ?? 640,
    height: o.height ?? 260,
    style: CHART_STYLE,
    x: { label: 'step', ticks: steps.length + 1, tickFormat: 'd' },
    y: { label: 'percent', grid: true, domain: [0, 100] },
    color: { domain: ['remaining uniform elongation %', '%CW since anneal'], range: [PALETTE.ductility, PALETTE.coldWork], legend: true },
    marks,
  });
}
