import { h } from './dom.js';
import { errorBox } from './errors.js';

/** What a cell's value is shown as: a DOM node as is, anything else by `render`. */
export type Render = (value: unknown) => Node | string | null;

/** Observer interface of @observablehq/runtime v6 (it ships none of its own). */
export interface CellObserver {
  pending(): void;
  fulfilled(value: unknown): void;
  rejected(error: unknown): void;
}

export interface ObserverHooks {
  onPending?: () => void;
  onSettled?: (ok: boolean) => void;
}

/** Default rendering: nodes as they are, numbers and strings as text, nothing for undefined. */
export function defaultRender(value: unknown): Node | string | null {
  if (value === undefined || value === null) return null;
  if (value instanceof Node) return value;
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean') return String(value);
  return JSON.stringify(value, null, 2);
}

/**
 * An observer that shows a cell's value in `el`, in place: while computing the element gets
 * `aria-busy="true"`; a value replaces the content; an error shows the error cell (see
 * {@link errorBox}) in its place while every other cell keeps working. Inputs (elements that
 * already live in the page) are not moved.
 */
export function cellObserver(el: HTMLElement, render: Render = defaultRender, hooks: ObserverHooks = {}): CellObserver {
  return {
    pending() {
      el.setAttribute('aria-busy', 'true');
      hooks.onPending?.();
    },
    fulfilled(value) {
      el.removeAttribute('aria-busy');
      el.classList.remove('sl-has-error');
      const out = render(value);
      if (out instanceof Node) {
        if (out.parentNode !== el || el.childNodes.length !== 1) el.replaceChildren(out);
      } else if (out === null) {
        el.replaceChildren();
      } else {
        el.replaceChildren(h('pre', { class: 'sl-value' }, out));
      }
      hooks.onSettled?.(true);
    },
    rejected(error) {
      el.removeAttribute('aria-busy');
      el.classList.add('sl-has-error');
      el.replaceChildren(errorBox(error));
      hooks.onSettled?.(false);
    },
  };
}
