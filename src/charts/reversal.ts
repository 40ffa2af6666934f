import * as Plot from '@observablehq/plot';
import { chartFrame, PALETTE, X_AXIS } from './palette.js';

/** A stress–strain path to draw: true stress against total true strain. */
export interface PathSeries {
  label: string;
  points: readonly { strain: number; stress: number }[];
}

/**
 * Load paths with reversal, several models on one chart (e.g. combined kinematic–isotropic hardening
 * against isotropic only), true stress against total true strain, zero stress ruled. Same code in the
 * notebooks (browser DOM) and reports (linkedom via `document`).
 */
export function reversalChart(series: readonly PathSeries[], o: { stressUnit: string; width?: number; height?: number; document?: Document }): SVGSVGElement | HTMLElement {
  const data = series.flatMap((s) => s.points.map((p) => ({ ...p, model: s.label })));
  return Plot.plot({
    ...chartFrame(o, 560, 320),
    x: { ...X_AXIS, label: 'total true strain ε (–)', grid: true },
    y: { label: `true stress (${o.stressUnit})`, grid: true },
    color: { domain: series.map((s) => s.label), range: [PALETTE.strength, PALETTE.ductility, PALETTE.coldWork], legend: true },
    marks: [
      Plot.ruleY([0], { stroke: PALETTE.grid }),
      Plot.ruleX([0], { stroke: PALETTE.grid }),
      Plot.line(data, { x: 'strain', y: 'stress', stroke: 'model', strokeWidth: 2, clip: true }),
    ],
  });
}

/**
 * Residual stress through the thickness after springback: stress across, position (inner surface
 * −t/2 to outer +t/2) up, as in a through-thickness section.
 */
export function residualStressChart(profile: readonly { y: number; stress: number }[], o: { stressUnit: string; lengthUnit: string; width?: number; height?: number; document?: Document }): SVGSVGElement | HTMLElement {
  // Joined in order of position through the thickness (a profile given in any other order would
  // be drawn as a zigzag across the section).
  const sorted = [...profile].sort((a, b) => a.y - b.y);
  return Plot.plot({
    ...chartFrame(o, 360, 320),
    x: { ...X_AXIS, label: `residual stress (${o.stressUnit})`, grid: true },
    y: { label: `position through the thickness, outer side up (${o.lengthUnit})`, grid: true },
    marks: [
      Plot.ruleX([0], { stroke: PALETTE.grid }),
      Plot.line(sorted, { x: 'stress', y: 'y', stroke: PALETTE.elastic, strokeWidth: 2, curve: 'linear', clip: true }),
      Plot.dot(sorted, { x: 'stress', y: 'y', fill: PALETTE.elastic, r: 2, clip: true }),
    ],
  });
}
