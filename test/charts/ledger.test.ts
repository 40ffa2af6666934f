// The step charts drawn on linkedom's DOM (as the HTML report draws them): integer step ticks,
// step 0 = the starting stock, values held after each step drawn as steps, labelled target bands.
// The numbers come from the runner's own ledger (evaluateRoute) for an INVENTED route; the chart
// conventions themselves are common practice for quantities that change only at discrete events.
import { parseHTML } from 'linkedom';
import { describe, expect, it } from 'vitest';
import { ductilityByStepChart, stepTicks, strengthByStepChart, type LedgerChartStep } from '../../src/charts/ledger.js';
import { pathPoints } from '../helpers.js';

const doc = () => parseHTML('<!DOCTYPE html><html><body></body></html>').document as unknown as Document;

/** An INVENTED 12-step route's ledger numbers (MPa, %): strength rises, one anneal at step 7. */
const steps: LedgerChartStep[] = Array.from({ length: 12 }, (_, i) => {
  const k = i + 1;
  const sinceAnneal = k <= 6 ? k : k - 7;
  return {
    index: k, kind: k === 7 ? 'anneal' : 'roll',
    reloadYield: 120 + 40 * sinceAnneal, tensileStrength: 260 + 25 * sinceAnneal,
    remainingUniformElongationPct: Math.max(0, 40 - 7 * sinceAnneal), coldWorkPct: 10 * sinceAnneal,
  };
});
const start = { reloadYield: 120, tensileStrength: 260, remainingUniformElongationPct: 40 };

const tickLabels = (svg: Element) => [...svg.querySelectorAll('g[aria-label="x-axis tick label"] text')].map((t) => t.textContent ?? '');
describe('stepTicks', () => {
  it('gives whole steps from 0, every step when they fit, else a round stride', () => {
    expect(stepTicks(5, 600)).toEqual([0, 1, 2, 3, 4, 5]);
    expect(stepTicks(40, 600)).toEqual([0, 5, 10, 15, 20, 25, 30, 35, 40]);
    for (const [last, width] of [[1, 200], [9, 300], [37, 640], [250, 1152], [3, 40]] as const) {
      const t = stepTicks(last, width);
      expect(t[0]).toBe(0);
      expect(t.every((x) => Number.isInteger(x) && x <= last)).toBe(true);
      expect(t.length).toBeLessThanOrEqual(Math.max(1, Math.floor(width / 44)));
    }
  });
});

describe('step charts (linkedom, as in the HTML report)', () => {
  it('strength chart: integer ticks only, step 0 present, lines made of flat and vertical runs only, target band labelled', () => {
    const chart = strengthByStepChart(steps, { stressUnit: 'MPa', start, minYield: 300, maxYield: 380, width: 1152, document: doc() });
    const svg = chart.tagName.toLowerCase() === 'svg' ? chart : chart.querySelector('svg[class]')!;
    const ticks = tickLabels(svg);
    expect(ticks).toEqual(['0', '1', '2', '3', '4', '5', '6', '7', '8', '9', '10', '11', '12']);
    expect(svg.getAttribute('width')).toBe('1152');
    // 13 states (start + 12 steps) × 2 series.
    expect(svg.querySelectorAll('g[aria-label="dot"] circle').length).toBe(26);
    const lines = [...svg.querySelectorAll('g[aria-label="line"] path')];
    expect(lines.length).toBe(2);
    for (const path of lines) {
      const pts = pathPoints(path.getAttribute('d')!);
      // A sloping join (the old picture) would move x and y at once.
      for (let i = 1; i < pts.length; i++) {
        const [x0, y0] = pts[i - 1]!;
        const [x1, y1] = pts[i]!;
        expect(Math.abs(x1 - x0) < 1e-6 || Math.abs(y1 - y0) < 1e-6, `segment ${i}: (${x0},${y0}) → (${x1},${y1})`).toBe(true);
      }
    }
    expect(chart.outerHTML).toContain('yield target 300–380 MPa');
    expect(chart.outerHTML).toContain('step (0 = starting stock)');
  });
  it('ductility chart: starts at step 0 with the starting stock and labels the elongation target', () => {
    const chart = ductilityByStepChart(steps, { stressUnit: 'MPa', start, minRemainingElongationPct: 5, width: 640, document: doc() });
    const svg = chart.querySelector('svg[class]') ?? chart;
    expect(tickLabels(svg)[0]).toBe('0');
    expect(tickLabels(svg).every((t) => /^\d+$/.test(t))).toBe(true);
    expect(svg.querySelectorAll('g[aria-label="dot"] circle').length).toBe(26);
    expect(chart.outerHTML).toContain('elongation target ≥ 5 %');
  });
  it('a long route keeps integer ticks at a round stride', () => {
    const long = Array.from({ length: 40 }, (_, i) => ({ ...steps[0]!, index: i + 1 }));
    const svg = strengthByStepChart(long, { stressUnit: 'MPa', start, width: 600, document: doc() });
    const s = svg.querySelector('svg[class]') ?? svg;
    expect(tickLabels(s)).toEqual(['0', '5', '10', '15', '20', '25', '30', '35', '40']);
  });
});
