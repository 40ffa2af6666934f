// A chart cell's answer to a slider move, shared by the notebooks: retrace the kept chart at once,
// redraw it with Plot when the slider rests (see chartStreams).
import type { Notebook } from '../../src/cells/index.js';
import { retrace } from '../../src/charts/retrace.js';

/** The charts are redrawn by Plot once a slider has rested this long (ms); moves in between retrace the kept chart. */
export const REFINE_AFTER_MS = 120;
/** `?redraw` in the address: Plot redraws on every move, as before (the latency bench compares the two). */
const REDRAW = new URLSearchParams(location.search).has('redraw');
const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));
export type Pts = readonly { x: number; y: number }[];

/**
 * A generator per chart cell: when the chart on screen has the same frame (width and series), its
 * lines (and dots) are moved to the new values on its present axes at once (`retrace`, marked
 * `data-resolution="preview"`; `hide` lists marks the preview cannot move, hidden until the redraw),
 * and Plot redraws the whole chart (axes fitted to the new values) once the slider rests; otherwise
 * Plot draws it at once. Fires `strainledger:refine` before the redraw (the latency bench separates
 * the two by it); `nb.track` makes `idle()` wait for it.
 */
export function chartStreams(notebook: () => Notebook) {
  const kept = new Map<string, { el: Element; frame: string }>();
  const latestRun = new Map<string, number>();
  return async function* chartStream(cell: string, frame: string, lines: Pts[], dots: Pts | undefined, draw: () => Element, hide: readonly string[] = []): AsyncGenerator<Element, void, unknown> {
    const run = (latestRun.get(cell) ?? 0) + 1;
    latestRun.set(cell, run);
    const old = kept.get(cell);
    if (!REDRAW && old && old.frame === frame && retrace(old.el, lines, dots)) {
      for (const q of hide) old.el.querySelectorAll(q).forEach((m) => m.setAttribute('visibility', 'hidden'));
      old.el.setAttribute('data-resolution', 'preview');
      yield old.el;
      await notebook().track(sleep(REFINE_AFTER_MS));
      if (latestRun.get(cell) !== run) return;
      window.dispatchEvent(new Event('strainledger:refine'));
    }
    const el = draw();
    el.setAttribute('data-resolution', 'full');
    kept.set(cell, { el, frame });
    yield el;
  };
}
