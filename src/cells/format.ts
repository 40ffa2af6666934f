import { DISPLAY_DIGITS, fixed } from '../report/numbers.js';
import { CAUTIONS } from '../report/cautions.js';
import { h } from './dom.js';

/**
 * Number formatting shared with the runner's text report (`fixed` from src/report/table.ts), so a
 * number shown in a notebook has the same digits as the runner prints for it.
 */
export { fixed };
export { formatNumber, formatTargetValue, formatLaw, formatLawParam, flowCurveText, targetUnit } from '../report/numbers.js';

/**
 * Displayed precision, one table for all notebooks (digits after the point), taken from the reports'
 * `DISPLAY_DIGITS` (src/report/numbers.ts). `stress` is for MPa; a stress in the plan's unit goes
 * through `formatNumber(x, 'stress', unit)`.
 */
export const DIGITS = {
  stress: DISPLAY_DIGITS.stress.MPa,
  strain: DISPLAY_DIGITS.strain,
  pct: DISPLAY_DIGITS.percent,
  ratio: DISPLAY_DIGITS.ratio,
  size: DISPLAY_DIGITS.size,
  recoveryPct: DISPLAY_DIGITS.recoveryPct,
} as const;

/** A labelled quantity: `<div><dt>reload yield Rp0.2</dt><dd>412.3 MPa</dd></div>`. */
export function quantity(label: string, value: number | null, digits: number, unit: string, id?: string): HTMLElement {
  return h('div', { class: 'sl-quantity' },
    h('dt', {}, label),
    h('dd', id ? { 'data-q': id } : {}, h('span', { class: 'sl-num' }, fixed(value, digits)), unit ? ` ${unit}` : ''));
}

/** The cautions every notebook shows (src/report/cautions.ts, the same list the reports carry). */
export function cautionsPanel(): HTMLElement {
  return h('aside', { class: 'sl-cautions', 'aria-label': 'Cautions' },
    h('strong', {}, 'Cautions — read before using these numbers'),
    h('ul', {}, ...CAUTIONS.map((c) => h('li', {}, c))));
}
