/**
 * Building page elements from user data without ever parsing it as HTML: every piece of text goes
 * through `textContent` (escaping by construction). `escapeHtml` is for the rare place that needs
 * an HTML string (e.g. a downloaded HTML snippet).
 */

type Child = Node | string | number | null | undefined | false;
type Attrs = Record<string, string | number | boolean | undefined | ((e: Event) => void)>;

/**
 * `h('td', { class: 'num' }, '12.5')`: an element with attributes, listeners (`onclick`, `oninput`
 * ...) and children; strings become text nodes, never markup.
 */
export function h<K extends keyof HTMLElementTagNameMap>(tag: K, attrs: Attrs = {}, ...children: Child[]): HTMLElementTagNameMap[K] {
  const el = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) {
    if (v === undefined || v === false) continue;
    if (typeof v === 'function') el.addEventListener(k.replace(/^on/, ''), v);
    else if (k === 'value' && 'value' in el) (el as HTMLInputElement).value = String(v);
    else el.setAttribute(k, v === true ? '' : String(v));
  }
  append(el, children);
  return el;
}

/** Appends children (text for strings and numbers). */
export function append(el: Node, children: readonly Child[]): void {
  for (const c of children) {
    if (c === null || c === undefined || c === false) continue;
    el.appendChild(typeof c === 'string' || typeof c === 'number' ? document.createTextNode(String(c)) : c);
  }
}

const ESC: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Escapes the five HTML-significant characters. `escapeHtml('<b>')` → `&lt;b&gt;`. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ESC[c]!);
}

/** Resolves an element by id (throws a readable error when the page lacks it). */
export function byId<T extends HTMLElement = HTMLElement>(id: string): T {
  const el = document.getElementById(id);
  if (!el) throw new Error(`the page has no element with id "${id}"`);
  return el as T;
}
