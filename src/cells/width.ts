/**
 * The content width (px) of a page element as an async generator, for charts that use the width they
 * are given: the current width first, then a new value whenever the element's width changes (window
 * resize, panel layout), at most once per animation frame. Widths are whole pixels; an element not
 * laid out yet (width 0) gives `fallback`. The ResizeObserver is disconnected when the runtime ends
 * the generator. The element's width must not depend on its content (a grid or block container),
 * or a redrawn chart would resize it again.
 */
export async function* widthStream(el: HTMLElement, fallback = 640): AsyncGenerator<number, void, unknown> {
  const measure = () => {
    const w = Math.floor(el.clientWidth);
    return w > 0 ? w : fallback;
  };
  let current = measure();
  let wake: (() => void) | null = null;
  let frame = 0;
  const ro = new ResizeObserver(() => {
    if (frame) return;
    frame = requestAnimationFrame(() => {
      frame = 0;
      const w = measure();
      if (w !== current) {
        current = w;
        wake?.();
      }
    });
  });
  ro.observe(el);
  try {
    yield current;
    for (;;) {
      await new Promise<void>((r) => { wake = r; });
      wake = null;
      yield current;
    }
  } finally {
    ro.disconnect();
    if (frame) cancelAnimationFrame(frame);
  }
}
