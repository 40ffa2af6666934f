import * as Plot from '@observablehq/plot';
import { chartFrame, PALETTE, X_AXIS } from './palette.js';
import { LAW_TITLES } from '../core/flow/params.js';

/** Most points a chart draws from one series; longer records are thinned by a fixed stride. */
export const CHART_MAX_POINTS = 2000;

function thin(n: number): number[] {
  const stride = Math.max(1, Math.ceil(n / CHART_MAX_POINTS));
  const out: number[] = [];
  for (let i = 0; i < n; i += stride) out.push(i);
  if (out[out.length - 1] !== n - 1 && n > 0) out.push(n - 1);
  return out;
}

/**
 * The record as engineering stress against engineering strain (in %), with the elastic window
 * (where E was fitted) drawn thick. Strains are shown as recorded (before toe compensation). Where the
 * strain channel ended before fracture (extensometer taken off) the curve stops there, at a dotted line
 * that says so: the samples after it have force but no strain of the specimen. Of a record that holds several tests
 * (`furtherTests`) only the first, the one analysed, is drawn. A strain from the machine's travel whose compliance the
 * analysis took out (`machineCompliance`, c) is drawn as analysed, e − s·c, and the axis says so; where its plastic
 * part was also spread over the parallel length (`parallelLengthRatio`, r = L0/Lc), as s/E + (e − s·c − s/E)·r.
 * A change of the test rate (`rateChange`) is a dashed line labelled with the rate's factor and, where a step of the
 * flow stress was taken out before the laws were fitted, its size. The end of a yield plateau whose drop was not
 * reported (`yieldPlateau`), where the laws' flow curve starts, is a dashed line that says so.
 */
export function recordCurveChart(
  record: { strain: ArrayLike<number>; stress: ArrayLike<number> },
  analysis: { elasticWindow: { fromIndex: number; toIndex: number }; proofStrength: number | null; tensileStrength: number; strainChannelEnd?: { index: number; strain: number } | null; furtherTests?: readonly number[]; machineCompliance?: number | null; parallelLengthRatio?: number | null; elasticModulus?: number; rateChange?: { index: number; ratio: number; step: number | null; stressBefore: number; clear: boolean } | null; yieldPlateau?: { endIndex: number } | null },
  o: { width?: number; height?: number; document?: Document } = {},
): SVGSVGElement | HTMLElement {
  const end = analysis.strainChannelEnd ?? null;
  const rc = analysis.rateChange ?? null;
  const pl = analysis.yieldPlateau ?? null;
  // A record that holds several tests: the first, the one analysed (a line on to the next test's start would cross the chart).
  const samples = Math.min(record.strain.length, analysis.furtherTests?.[0] ?? Infinity);
  const idx = thin(end ? end.index : samples);
  const c = analysis.machineCompliance ?? 0;
  const r = analysis.parallelLengthRatio ?? 1, E = analysis.elasticModulus ?? 0;
  const at = r !== 1 && E > 0
    ? (i: number) => { const s = record.stress[i]!; return { e: (s / E + (record.strain[i]! - s * c - s / E) * r) * 100, s }; }
    : (i: number) => ({ e: (record.strain[i]! - record.stress[i]! * c) * 100, s: record.stress[i]! });
  const pts = idx.map(at);
  const w = analysis.elasticWindow;
  const win: { e: number; s: number }[] = [];
  for (let i = w.fromIndex; i < w.toIndex; i++) win.push(at(i));
  return Plot.plot({
    ...chartFrame(o, 520, 300),
    x: { ...X_AXIS, label: c ? (r !== 1 && E > 0 ? 'engineering strain, machine compliance taken out, plastic over Lc (%)' : 'engineering strain, machine compliance taken out (%)') : 'engineering strain (%)', grid: true },
    y: { label: 'engineering stress (MPa)', grid: true },
    marks: [
      Plot.ruleY([0], { stroke: PALETTE.grid }),
      Plot.line(pts, { x: 'e', y: 's', stroke: PALETTE.strength, strokeWidth: 1.5 }),
      Plot.line(win, { x: 'e', y: 's', stroke: PALETTE.elastic, strokeWidth: 6, strokeOpacity: 0.7 }),
      ...(end ? [
        Plot.ruleX([end.strain * 100], { stroke: PALETTE.ink, strokeDasharray: '1,3' }),
        Plot.text([end.strain * 100], { x: (d: number) => d, text: () => 'strain ends (extensometer off)', frameAnchor: 'bottom', textAnchor: 'end', dx: -4, dy: -8, fill: PALETTE.ink, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }),
      ] : []),
      // A change of the test rate (findRateChange): where, how much, and the step of the flow stress when one was taken out.
      ...(rc && rc.index < (end ? end.index : samples) ? [
        Plot.ruleX([at(rc.index).e], { stroke: PALETTE.ink, strokeDasharray: '2,4' }),
        Plot.text([at(rc.index).e], { x: (d: number) => d, text: () => rateLabel(rc), frameAnchor: 'top', textAnchor: 'start', dx: 4, dy: 10, fill: PALETTE.ink, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }),
      ] : []),
      // A yield plateau without a reported drop (yieldPlateau): the laws are fitted from its end.
      ...(pl && pl.endIndex < (end ? end.index : samples) ? [
        Plot.ruleX([at(pl.endIndex).e], { stroke: PALETTE.ink, strokeDasharray: '2,4' }),
        Plot.text([at(pl.endIndex).e], { x: (d: number) => d, text: () => 'yield plateau ends: laws fitted from here', frameAnchor: 'bottom', textAnchor: 'start', dx: 4, dy: -24, fill: PALETTE.ink, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }),
      ] : []),
      ...(analysis.proofStrength !== null ? [
        Plot.ruleY([analysis.proofStrength], { stroke: PALETTE.elastic, strokeDasharray: '4,3' }),
        Plot.text([analysis.proofStrength], { y: (d: number) => d, text: (d: number) => `Rp0.2 ${d.toFixed(0)} MPa`, frameAnchor: 'right', textAnchor: 'end', dx: -24, dy: 9, fill: PALETTE.elastic, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }),
      ] : []),
      // Rm's label above its line and Rp0.2's below its own, so the two stay apart when Rp0.2 is close to Rm.
      Plot.ruleY([analysis.tensileStrength], { stroke: PALETTE.ductility, strokeDasharray: '4,3' }),
      Plot.text([analysis.tensileStrength], { y: (d: number) => d, text: (d: number) => `Rm ${d.toFixed(0)} MPa`, frameAnchor: 'right', textAnchor: 'end', dx: -24, dy: -9, fill: PALETTE.ductility, stroke: 'white', strokeWidth: 3, paintOrder: 'stroke' }),
    ],
  });
}

/** The rate change's label: `rate ×8.0` (or `rate ÷4.0`), with the step of the flow stress when one was taken out. */
function rateLabel(rc: { ratio: number; step: number | null; stressBefore: number; clear: boolean }): string {
  const how = rc.ratio >= 1 ? `rate ×${rc.ratio.toFixed(1)}` : `rate ÷${(1 / rc.ratio).toFixed(1)}`;
  if (!rc.clear || rc.step === null) return how;
  const pct = (rc.step / rc.stressBefore) * 100;
  return `${how}, flow stress ${pct >= 0 ? '+' : '−'}${Math.abs(pct).toFixed(1)} %`;
}

/** Residuals (fit − data, MPa) of each law against true plastic strain. */
export function residualChart(
  strain: readonly number[],
  fits: readonly { law: string; residuals: ArrayLike<number> }[],
  o: { width?: number; height?: number; document?: Document } = {},
): SVGSVGElement | HTMLElement {
  const idx = thin(strain.length);
  // Laws by their names as people write them (Hockett–Sherby); any other label as given.
  const title = (law: string) => (Object.prototype.hasOwnProperty.call(LAW_TITLES, law) ? LAW_TITLES[law as keyof typeof LAW_TITLES] : law);
  const data = fits.flatMap((f) => idx.filter((i) => f.residuals[i] !== undefined).map((i) => ({ eps: strain[i]!, r: f.residuals[i]!, law: title(f.law) })));
  return Plot.plot({
    ...chartFrame(o, 520, 300),
    x: { ...X_AXIS, label: 'true plastic strain (–)', grid: true },
    y: { label: 'residual, law − record (MPa)', grid: true },
    color: { domain: fits.map((f) => title(f.law)), range: [...PALETTE.laws], legend: true },
    marks: [Plot.ruleY([0], { stroke: PALETTE.ink }), Plot.line(data, { x: 'eps', y: 'r', stroke: 'law', z: 'law', strokeWidth: 1.2 })],
  });
}
