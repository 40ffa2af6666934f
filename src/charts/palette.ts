/**
 * strainledger's own colours and chart style (one place for notebooks and the HTML report).
 * Chosen for contrast on white and for colour-blind readers (no red/green pair carries meaning
 * alone: states are also written in words).
 */
export const PALETTE = {
  ink: '#1f2a36',
  grid: '#d9dee4',
  /** Reload yield and other strengths. */
  strength: '#2b5d8a',
  /** Ductility (remaining uniform elongation). */
  ductility: '#b5651d',
  /** Cold work. */
  coldWork: '#6a5d8f',
  /** Elastic quantities (recovery, springback). */
  elastic: '#2f7f6f',
  /** Target band fill (with opacity) and target met / not met marks. */
  band: '#8fb3d1',
  met: '#2f7f6f',
  missed: '#a8322d',
  /** Series colours for comparing laws side by side. */
  laws: ['#2b5d8a', '#b5651d', '#2f7f6f', '#6a5d8f', '#8a6d1f', '#a8322d'],
} as const;

export const CHART_STYLE = {
  fontFamily: 'system-ui, -apple-system, "Segoe UI", sans-serif',
  fontSize: '12px',
  color: PALETTE.ink,
  background: 'white',
} as const;

/**
 * The x axis every chart shares: its label centred under the axis, below the tick labels (Plot's
 * default puts it at the right end, where it can run into the last tick), with room kept for it.
 */
export const X_AXIS = { labelAnchor: 'center', labelArrow: 'none', labelOffset: 34 } as const;
/** Bottom margin (px) that leaves room for {@link X_AXIS}'s label. */
export const MARGIN_BOTTOM = 42;
/**
 * Left margin (px) that holds a five-character tick label ("1,200" MPa of a quenched and tempered steel, "12,000"
 * less its comma) at {@link CHART_STYLE}'s 12 px: Plot's default of 40 px cut the first digit off.
 */
export const MARGIN_LEFT = 50;

/**
 * The frame every chart shares: the caller's `document` (linkedom's in Node, the page's by default),
 * the width and height it asks for in px (else the chart's own defaults), {@link CHART_STYLE}, and
 * room under the x axis for its label ({@link MARGIN_BOTTOM}) and left of the y axis for its ticks ({@link MARGIN_LEFT}).
 * Spread it into `Plot.plot`'s options.
 * @example Plot.plot({ ...chartFrame(o, 560, 320), x: { ...X_AXIS, label: 'strain (–)' }, marks })
 */
export function chartFrame(o: { document?: Document; width?: number; height?: number }, width: number, height: number) {
  return { ...(o.document ? { document: o.document } : {}), width: o.width ?? width, height: o.height ?? height, style: CHART_STYLE, marginBottom: MARGIN_BOTTOM, marginLeft: MARGIN_LEFT };
}
