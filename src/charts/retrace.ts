// Moving a drawn chart's lines and dots to new data on its existing axes, without running Plot
// again: the cheap answer a notebook gives while a slider is dragged (a Plot redraw of a chart costs
// 3–9 ms median in bench/notebook-latency.mjs, most of a frame on a loaded machine; this costs well
// under 1 ms for a few hundred points). The notebook redraws the chart with Plot once the slider
// rests, so axes that no longer fit are corrected then; meanwhile the marks are clipped to the frame
// (`clip: true` on the marks), so a path that leaves the old axes is cut at the frame's edge.

interface Scale { apply(v: number): number }
type Plotted = Element & { scale?(name: string): Scale | undefined };

/**
 * Replaces the points of the chart's line mark (one path per series, in drawing order) and, when
 * given, its dot mark (one circle per point). Returns false, changing nothing, when the chart does
 * not have the same number of paths or dots (the caller then redraws it with Plot).
 */
export function retrace(chart: Element, lines: readonly (readonly { x: number; y: number }[])[], dots?: readonly { x: number; y: number }[]): boolean {
  const c = chart as Plotted;
  const sx = c.scale?.('x'), sy = c.scale?.('y');
  if (!sx || !sy) return false;
  const paths = chart.querySelectorAll('g[aria-label="line"] path');
  const circles = dots ? chart.querySelectorAll('g[aria-label="dot"] circle') : null;
  if (paths.length !== lines.length || (dots && circles!.length !== dots.length)) return false;
  const X = (v: number) => Math.round(sx.apply(v) * 100) / 100, Y = (v: number) => Math.round(sy.apply(v) * 100) / 100;
  lines.forEach((pts, i) => {
    let d = '';
    for (let k = 0; k < pts.length; k++) d += `${k ? 'L' : 'M'}${X(pts[k]!.x)},${Y(pts[k]!.y)}`;
    paths[i]!.setAttribute('d', d);
  });
  if (dots) dots.forEach((p, i) => { circles![i]!.setAttribute('cx', String(X(p.x))); circles![i]!.setAttribute('cy', String(Y(p.y))); });
  return true;
}
