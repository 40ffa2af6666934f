import * as Plot from '@observablehq/plot';
import { chartFrame, PALETTE, X_AXIS } from './palette.js';

export interface YieldHistogramOptions {
  stressUnit: string;
  minYield?: number;
  maxYield?: number;
  /** Lower tolerance bound to mark (dashed). */
  bound?: number;
  /** Probability that all targets are met, written on the chart. */
  probability?: number;
  width?: number;
  height?: number;
  /** A DOM document; in Node pass linkedom's, in the browser omit. */
  document?: Document;
}

/**
 * Histogram of the Monte Carlo final reload yield, with the yield targets as solid rules, the lower
 * tolerance bound dashed, and the probability of meeting all targets in the caption line. Each label
 * sits on the inner side of its rule, so it stays inside the chart wherever the target lies
 * (test/notebooks/labels.test.ts measures the boxes in Chromium). Same code for notebooks (browser DOM)
 * and reports (linkedom).
 */
export function yieldHistogram(values: ArrayLike<number>, o: YieldHistogramOptions): SVGSVGElement | HTMLElement {
  const data = Array.from(values);
  const marks: Plot.Markish[] = [
    Plot.rectY(data, { ...Plot.binX({ y: 'count' }, { x: (d: number) => d, thresholds: 40 }), fill: PALETTE.strength, fillOpacity: 0.8 }),
    Plot.ruleY([0], { stroke: PALETTE.grid }),
  ];
  // Labels go on the inner side of their rule (right of a rule in the left half of the x range, left
  // of one in the right half), so a target or bound at either edge keeps its label inside the chart.
  const xs = [...data, ...[o.minYield, o.maxYield, o.bound].filter((x): x is number => x !== undefined)];
  let lo = Infinity, hi = -Infinity;
  for (const x of xs) { if (x < lo) lo = x; if (x > hi) hi = x; }
  const side = (x: number): { textAnchor: 'start' | 'end'; dx: number } =>
    (hi > lo && (x - lo) / (hi - lo) < 0.5 ? { textAnchor: 'start', dx: 4 } : { textAnchor: 'end', dx: -4 });
  const fmt = (x: number) => `${+x.toPrecision(6)} ${o.stressUnit}`;
  const rules = [
    ...(o.minYield !== undefined ? [{ x: o.minYield, label: `minimum ${fmt(o.minYield)}` }] : []),
    ...(o.maxYield !== undefined ? [{ x: o.maxYield, label: `maximum ${fmt(o.maxYield)}` }] : []),
  ];
  if (rules.length) {
    marks.push(Plot.ruleX(rules, { x: 'x', stroke: PALETTE.missed, strokeWidth: 2 }));
    for (const r of rules) {
      marks.push(Plot.text([r], { x: 'x', text: 'label', frameAnchor: 'top', dy: 4, ...side(r.x), fill: PALETTE.missed, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }));
    }
  }
  if (o.bound !== undefined) {
    // The bound's label sits a line lower, so a bound just beside a target does not cover its label.
    marks.push(Plot.ruleX([o.bound], { stroke: PALETTE.ink, strokeDasharray: '5,3' }));
    marks.push(Plot.text([{ x: o.bound, label: 'lower tolerance bound' }], { x: 'x', text: 'label', frameAnchor: 'top', dy: 22, ...side(o.bound), fill: PALETTE.ink, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }));
  }
  return Plot.plot({
    ...chartFrame(o, 640, 300),
    marginLeft: 56,
    ...(o.probability !== undefined ? { caption: `probability all targets met: ${(o.probability * 100).toFixed(1)} %` } : {}),
    x: { ...X_AXIS, label: `final reload yield Rp0.2 (${o.stressUnit})`, grid: true },
    y: { label: 'samples', grid: true },
    marks,
  });
}
