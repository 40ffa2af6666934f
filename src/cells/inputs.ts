import { h } from './dom.js';

/**
 * Inputs of our own, all labelled (`<label for>`) and usable from the keyboard (native range,
 * number and select elements). Each returns a wrapper element whose `value` property is the
 * current value and which dispatches a bubbling `input` event when it changes, so
 * {@link valueStream} can turn it into a reactive cell.
 */
export interface ValueElement<T> extends HTMLElement {
  value: T;
}

let counter = 0;
const uid = (prefix: string) => `${prefix}-${++counter}`;

function valueElement<T>(el: HTMLElement, get: () => T, set: (v: T) => void): ValueElement<T> {
  Object.defineProperty(el, 'value', { get, set, configurable: true });
  return el as ValueElement<T>;
}

export interface SliderOptions {
  label: string;
  min: number;
  max: number;
  step: number;
  value: number;
  /** Unit shown after the number box, e.g. 'MPa' or '(true strain)'. */
  unit?: string;
  /** Id prefix for tests and labels. */
  id?: string;
}

/**
 * A range slider and a number box for the same value, kept in step. The number box accepts any
 * value in [min, max]; out-of-range or non-numeric entries are marked invalid and not passed on.
 */
export function slider(o: SliderOptions): ValueElement<number> {
  const id = o.id ?? uid('slider');
  let current = o.value;
  const range = h('input', { type: 'range', id: `${id}-range`, min: o.min, max: o.max, step: o.step, value: o.value, 'aria-label': `${o.label} (slider)` });
  const num = h('input', { type: 'number', id: `${id}-number`, min: o.min, max: o.max, step: 'any', value: o.value, class: 'sl-number' });
  const wrap = h('div', { class: 'sl-input sl-slider', id },
    h('label', { for: `${id}-number` }, o.label), range, num, o.unit ? h('span', { class: 'sl-unit' }, o.unit) : null);
  const el = valueElement<number>(wrap, () => current, (v) => { current = v; range.value = String(v); num.value = String(v); });
  range.addEventListener('input', (e) => {
    e.stopPropagation();
    current = range.valueAsNumber;
    num.value = String(current);
    num.removeAttribute('aria-invalid');
    wrap.dispatchEvent(new Event('input', { bubbles: true }));
  });
  num.addEventListener('input', (e) => {
    e.stopPropagation();
    const v = num.valueAsNumber;
    if (!Number.isFinite(v) || v < o.min || v > o.max) {
      num.setAttribute('aria-invalid', 'true');
      num.title = `enter a number from ${o.min} to ${o.max}`;
      return;
    }
    num.removeAttribute('aria-invalid');
    num.title = '';
    current = v;
    range.value = String(v);
    wrap.dispatchEvent(new Event('input', { bubbles: true }));
  });
  return el;
}

export interface ChoiceOptions<T> {
  label: string;
  options: readonly { value: T; text: string }[];
  value?: T;
  id?: string;
}

/** A labelled drop-down list. */
export function choice<T>(o: ChoiceOptions<T>): ValueElement<T> {
  const id = o.id ?? uid('choice');
  const sel = h('select', { id: `${id}-select` }, ...o.options.map((opt, i) => h('option', { value: String(i) }, opt.text)));
  const start = Math.max(0, o.options.findIndex((x) => x.value === o.value));
  sel.selectedIndex = start;
  const wrap = h('div', { class: 'sl-input sl-choice', id }, h('label', { for: `${id}-select` }, o.label), sel);
  sel.addEventListener('input', (e) => { e.stopPropagation(); wrap.dispatchEvent(new Event('input', { bubbles: true })); });
  return valueElement<T>(wrap, () => o.options[sel.selectedIndex]!.value, (v) => {
    sel.selectedIndex = Math.max(0, o.options.findIndex((x) => x.value === v));
  });
}

/**
 * A slider over a few named positions (e.g. forming modes): keyboard arrows step through them and
 * the current name is shown and announced (`aria-valuetext`).
 */
export function stepSlider<T>(o: ChoiceOptions<T>): ValueElement<T> {
  const id = o.id ?? uid('steps');
  const start = Math.max(0, o.options.findIndex((x) => x.value === o.value));
  const range = h('input', { type: 'range', id: `${id}-range`, min: 0, max: o.options.length - 1, step: 1, value: start });
  const out = h('output', { for: `${id}-range`, class: 'sl-step-name' }, o.options[start]!.text);
  range.setAttribute('aria-valuetext', o.options[start]!.text);
  const wrap = h('div', { class: 'sl-input sl-step-slider', id }, h('label', { for: `${id}-range` }, o.label), range, out);
  const sync = () => {
    const t = o.options[range.valueAsNumber]!.text;
    out.textContent = t;
    range.setAttribute('aria-valuetext', t);
  };
  range.addEventListener('input', (e) => { e.stopPropagation(); sync(); wrap.dispatchEvent(new Event('input', { bubbles: true })); });
  return valueElement<T>(wrap, () => o.options[range.valueAsNumber]!.value, (v) => {
    range.value = String(Math.max(0, o.options.findIndex((x) => x.value === v)));
    sync();
  });
}

/**
 * The values of an input element as an async generator: the current value first, then one value
 * per `input` event. This is how an input becomes a reactive cell in @observablehq/runtime v6
 * (which has no `Generators.input`). The listener is removed when the runtime ends the generator.
 */
export async function* valueStream<T>(el: ValueElement<T>): AsyncGenerator<T, void, unknown> {
  let wake: (() => void) | null = null;
  let dirty = false;
  const onInput = () => { dirty = true; wake?.(); };
  el.addEventListener('input', onInput);
  try {
    yield el.value;
    for (;;) {
      if (!dirty) await new Promise<void>((r) => { wake = r; });
      wake = null;
      dirty = false;
      yield el.value;
    }
  } finally {
    el.removeEventListener('input', onInput);
  }
}
