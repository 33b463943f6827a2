/**
 * The plot model: plain data that {@link renderPlotSvg} draws, so any stage (or a user) can build a
 * plot without knowing SVG. All coordinates are in data units (x in Hz on a log axis by default).
 */

/** A colour as #rrggbb (validated: nothing else can reach an SVG attribute). */
export type PlotColor = string;

export interface PlotStyle {
  readonly color?: PlotColor;
  readonly dash?: 'solid' | 'dashed' | 'dotted';
  /** Stroke width in px (default 2). */
  readonly widthPx?: number;
}

/** A curve; a NaN in x or y breaks it; +-Infinity in y is drawn just beyond the plot edge. */
export interface PlotSeries {
  readonly label: string;
  readonly x: ArrayLike<number>;
  readonly y: ArrayLike<number>;
  readonly style?: PlotStyle;
}

/** A shaded band between two curves (e.g. Monte Carlo quantiles). */
export interface PlotBand {
  readonly label: string;
  readonly x: ArrayLike<number>;
  readonly lower: ArrayLike<number>;
  readonly upper: ArrayLike<number>;
  readonly color?: PlotColor;
}

/** A rectangle in data units; y0/y1 may be -Infinity/+Infinity (the plot edge). */
export interface PlotRegion {
  readonly x0: number;
  readonly x1: number;
  readonly y0: number;
  readonly y1: number;
}

/** Shaded forbidden regions (e.g. a spec mask). */
export interface PlotMask {
  readonly label: string;
  readonly regions: readonly PlotRegion[];
  readonly color?: PlotColor;
}

/** Points with optional error bars from `low` to `high` (e.g. test points and their limits). */
export interface PlotMarkers {
  readonly label: string;
  readonly points: readonly { readonly x: number; readonly y: number; readonly low?: number; readonly high?: number }[];
  readonly color?: PlotColor;
}

/** A horizontal reference line (e.g. the clipping level). */
export interface PlotLevel {
  readonly label: string;
  readonly y: number;
  readonly style?: PlotStyle;
}

export interface PlotModel {
  readonly title: string;
  /** With the unit, e.g. 'Frequency (Hz)'. */
  readonly xLabel: string;
  readonly yLabel: string;
  /** Default 'log'. */
  readonly xScale?: 'log' | 'linear';
  /** Data range shown; default from the data (log: whole decades). */
  readonly xRange?: readonly [number, number];
  readonly yRange?: readonly [number, number];
  /** Spacing of the y ticks in data units (default a 1-2-5 step). */
  readonly yStep?: number;
  readonly series: readonly PlotSeries[];
  readonly bands?: readonly PlotBand[];
  readonly masks?: readonly PlotMask[];
  readonly markers?: readonly PlotMarkers[];
  readonly levels?: readonly PlotLevel[];
  /** Size in px (default 900 x 560). */
  readonly widthPx?: number;
  readonly heightPx?: number;
}

/**
 * Series colours: distinct in hue and lightness, readable on white, none grey (the mask colour) and
 * none close to another within the plot tests' colour tolerance.
 */
export const PLOT_PALETTE: readonly PlotColor[] = Object.freeze(['#1f5fbf', '#d62728', '#2ca02c', '#9467bd', '#ff7f0e', '#17becf', '#8c564b']);
/** Forbidden regions: neutral grey, drawn translucent. */
export const MASK_COLOR: PlotColor = '#808080';
/** Bands: a light blue, drawn translucent. */
export const BAND_COLOR: PlotColor = '#6fa8dc';
