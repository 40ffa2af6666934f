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
 * tolerance bound dashed, and the probability of meeting all targets in the caption line. Same code
 * for notebooks (browser DOM) and reports (linkedom).
 */
export function yieldHistogram(values: ArrayLike<number>, o: YieldHistogramOptions): SVGSVGElement | HTMLElement {
  const data = Array.from(values);
  const marks: Plot.Markish[] = [
    Plot.rectY(data, { ...Plot.binX({ y: 'count' }, { x: (d: number) => d, thresholds: 40 }), fill: PALETTE.strength, fillOpacity: 0.8 }),
    Plot.ruleY([0], { stroke: PALETTE.grid }),
  ];
  const rules = [
    // Target labels sit left of their rule, the tolerance bound's label right of its rule and lower,
    // so a bound just above the minimum does not cover the minimum's label.
    ...(o.minYield !== undefined ? [{ x: o.minYield, label: `target min ${o.minYield}`, anchor: 'end', dx: -4 }] : []),
    ...(o.maxYield !== undefined ? [{ x: o.maxYield, label: `target max ${o.maxYield}`, anchor: 'end', dx: -4 }] : []),
  ];
  if (rules.length) {
    marks.push(Plot.ruleX(rules, { x: 'x', stroke: PALETTE.missed, strokeWidth: 2 }));
    for (const r of rules) {
      marks.push(Plot.text([r], { x: 'x', text: 'label', frameAnchor: 'top', dy: 4, dx: r.dx, textAnchor: r.anchor as 'end', fill: PALETTE.missed, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }));
    }
  }
  if (o.bound !== undefined) {
    marks.push(Plot.ruleX([o.bound], { stroke: PALETTE.ink, strokeDasharray: '5,3' }));
    marks.push(Plot.text([{ x: o.bound, label: 'lower tolerance bound' }], { x: 'x', text: 'label', frameAnchor: 'top', dy: 22, dx: 4, textAnchor: 'start', fill: PALETTE.ink, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }));
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
