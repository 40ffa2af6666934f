import * as Plot from '@observablehq/plot';
import { chartFrame, PALETTE, X_AXIS } from './palette.js';

/** One law's flow curve, sampled: points of true stress against true plastic strain. */
export interface CurveSeries {
  label: string;
  points: readonly { strain: number; stress: number }[];
}

export interface FlowChartOptions {
  stressUnit: string;
  /** Accumulated equivalent plastic strain to mark (dashed rule); omit and use {@link markPrestrain} to move a marker without redrawing. */
  prestrain?: number;
  /** Strain range the law rests on (the tensile test's range), drawn as a band. */
  testedRange?: readonly [number, number];
  /** The reload yield of each law at the prestrain, marked with a dot. */
  reloadYields?: readonly { label: string; strain: number; stress: number }[];
  width?: number;
  height?: number;
  document?: Document;
}

/**
 * Flow curves of one or more laws (true stress vs true plastic strain) with the prestrain marked
 * and the tested strain range as a band, so it shows where laws that agree on the test part ways.
 * Same code in the notebooks (browser DOM) and reports (linkedom).
 */
export function flowCurveChart(series: readonly CurveSeries[], o: FlowChartOptions): SVGSVGElement | HTMLElement {
  const data = series.flatMap((s) => s.points.map((p) => ({ ...p, law: s.label })));
  const marks: Plot.Markish[] = [];
  if (o.testedRange) {
    marks.push(Plot.rectX([{ x1: o.testedRange[0], x2: o.testedRange[1] }], { x1: 'x1', x2: 'x2', fill: PALETTE.band, fillOpacity: 0.25 }));
  }
  marks.push(
    Plot.ruleY([0], { stroke: PALETTE.grid }),
    Plot.line(data, { x: 'strain', y: 'stress', stroke: 'law', strokeWidth: 2 }),
  );
  if (o.prestrain !== undefined) marks.push(Plot.ruleX([o.prestrain], { stroke: PALETTE.ink, strokeDasharray: '5,4' }));
  if (o.reloadYields) marks.push(Plot.dot(o.reloadYields, { x: 'strain', y: 'stress', stroke: 'label', fill: 'white', r: 4, strokeWidth: 2 }));
  return Plot.plot({
    ...chartFrame(o, 560, 320),
    x: { ...X_AXIS, label: 'true plastic strain ε̄ (–)', grid: true },
    y: { label: `true stress (${o.stressUnit})`, grid: true },
    color: { domain: series.map((s) => s.label), range: [...PALETTE.laws], legend: true },
    marks,
  });
}

/** The three legs of the load–unload–reload picture, points in total true strain and true stress. */
export interface LoadUnloadPath {
  loading: readonly { strain: number; stress: number }[];
  unloading: readonly { strain: number; stress: number }[];
  reloading: readonly { strain: number; stress: number }[];
  /** Elastic recovery on unloading (strain), drawn as a bracket on the strain axis. */
  recovery: { from: number; to: number };
}

/** Load to the prestrain, unload along E(ε̄), reload to the raised yield. */
export function loadUnloadChart(path: LoadUnloadPath, o: { stressUnit: string; width?: number; height?: number; document?: Document }): SVGSVGElement | HTMLElement {
  const tag = (pts: LoadUnloadPath['loading'], leg: string) => pts.map((p) => ({ ...p, leg }));
  const legs = ['loading', 'unloading along E(ε̄)', 'reloading'];
  const data = [...tag(path.loading, legs[0]!), ...tag(path.unloading, legs[1]!), ...tag(path.reloading, legs[2]!)];
  return Plot.plot({
    ...chartFrame(o, 560, 320),
    x: { ...X_AXIS, label: 'total true strain (–)', grid: true },
    y: { label: `true stress (${o.stressUnit})`, grid: true },
    color: { domain: legs, range: [PALETTE.strength, PALETTE.elastic, PALETTE.ductility], legend: true },
    marks: [
      Plot.ruleY([0], { stroke: PALETTE.grid }),
      Plot.line(data.filter((d) => d.leg !== legs[2]), { x: 'strain', y: 'stress', stroke: 'leg', z: 'leg', strokeWidth: 2 }),
      Plot.line(data.filter((d) => d.leg === legs[2]), { x: 'strain', y: 'stress', stroke: 'leg', strokeWidth: 2, strokeDasharray: '6,3' }),
      Plot.ruleY([{ x1: path.recovery.from, x2: path.recovery.to, y: 0 }], { x1: 'x1', x2: 'x2', y: 'y', stroke: PALETTE.elastic, strokeWidth: 5 }),
      Plot.text([{ x: (path.recovery.from + path.recovery.to) / 2, y: 0 }], { x: 'x', y: 'y', text: () => 'elastic recovery', dy: -10, fill: PALETTE.elastic }),
    ],
  });
}

type ScaledChart = (SVGSVGElement | HTMLElement) & { scale(name: 'x' | 'y'): { apply(v: number): number } | undefined };

/**
 * Moves the prestrain marker (a dashed rule and one dot per law at the reload yield) on a chart
 * from {@link flowCurveChart} drawn without `prestrain`, using the chart's own scales: a slider
 * move updates a few SVG attributes instead of redrawing every curve (see bench/notebook-latency.mjs).
 */
export function markPrestrain(chart: SVGSVGElement | HTMLElement, prestrain: number, dots: readonly { stress: number; strain: number }[], colors: readonly string[] = PALETTE.laws): void {
  const c = chart as ScaledChart;
  const x = c.scale('x');
  const y = c.scale('y');
  const svg = (chart.tagName.toLowerCase() === 'svg' ? chart : chart.querySelector(':scope > svg')) as SVGSVGElement | null;
  if (!x || !y || !svg) return;
  const doc = svg.ownerDocument;
  const NS = 'http://www.w3.org/2000/svg';
  let g = svg.querySelector<SVGGElement>('g[data-marker="prestrain"]');
  if (!g) {
    g = doc.createElementNS(NS, 'g') as SVGGElement;
    g.setAttribute('data-marker', 'prestrain');
    svg.appendChild(g);
  }
  const [y0, y1] = [y.apply(0), y.apply(Math.max(...dots.map((d) => d.stress), 0) * 1.0)];
  const top = Math.min(y0, y1, 20);
  const px = x.apply(prestrain);
  const parts: SVGElement[] = [];
  const line = doc.createElementNS(NS, 'line');
  for (const [k, v] of Object.entries({ x1: px, x2: px, y1: y0, y2: top, stroke: PALETTE.ink, 'stroke-dasharray': '5,4' })) line.setAttribute(k, String(v));
  parts.push(line);
  dots.forEach((d, i) => {
    const dot = doc.createElementNS(NS, 'circle');
    for (const [k, v] of Object.entries({ cx: x.apply(d.strain), cy: y.apply(d.stress), r: 4, fill: 'white', stroke: colors[i % colors.length]!, 'stroke-width': 2 })) dot.setAttribute(k, String(v));
    parts.push(dot);
  });
  g.replaceChildren(...parts);
}
