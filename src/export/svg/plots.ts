/**
 * The four standard plots of a design as {@link PlotModel}s: gain (with the spec mask, the Monte Carlo
 * envelope and the production-test limits), phase, group delay, and op-amp output swing against the
 * clipping level. Inputs are plain arrays, as frequencyResponse, the tolerance stage and the production
 * stage give them; render with renderPlotSvg.
 */
import { InvalidInputError } from '../../errors';
import type { PlotBand, PlotMarkers, PlotMask, PlotModel, PlotRegion, PlotSeries } from './plot-model';
import { PLOT_PALETTE } from './plot-model';
import { niceRange, phaseStep } from './ticks';

/** A band of the spec: the gain must stay within [minDb, maxDb] from fromHz to toHz (either bound optional). */
export interface GainMaskBand {
  readonly fromHz: number;
  readonly toHz: number;
  readonly minDb?: number;
  readonly maxDb?: number;
}

/** A quantile band, e.g. the 0.5 % and 99.5 % quantiles of a Monte Carlo run. */
export interface EnvelopeInput {
  readonly label: string;
  readonly frequencyHz: ArrayLike<number>;
  readonly lower: ArrayLike<number>;
  readonly upper: ArrayLike<number>;
}

export interface TestLimitInput {
  readonly frequencyHz: number;
  readonly gainDb: number;
  readonly lowDb: number;
  readonly highDb: number;
}

export interface GainPlotInput {
  readonly title?: string;
  readonly frequencyHz: ArrayLike<number>;
  readonly gainDb: ArrayLike<number>;
  readonly label?: string;
  readonly mask?: readonly GainMaskBand[];
  readonly envelope?: EnvelopeInput;
  readonly testLimits?: readonly TestLimitInput[];
  /** Dynamic range shown below the highest value (default 100 dB): deep notches do not squash the plot. */
  readonly rangeDb?: number;
}

/** Below the top of the plot, this much of the response is shown by default (a stopband of 80-90 dB fits). */
const DEFAULT_GAIN_RANGE_DB = 100;

/** Gain in dB against log frequency, with mask, envelope and test limits. */
export function gainPlot(input: GainPlotInput): PlotModel {
  checkSweep(input.frequencyHz, input.gainDb, 'gainDb');
  const masks: PlotMask[] = [];
  if (input.mask && input.mask.length > 0) {
    const regions: PlotRegion[] = [];
    input.mask.forEach((b, i) => {
      if (!(b.toHz > b.fromHz) || !(b.fromHz >= 0)) throw new InvalidInputError('OUT_OF_RANGE', `mask[${i}].toHz`, b, 'needs 0 <= fromHz < toHz');
      if (b.maxDb !== undefined) regions.push({ x0: b.fromHz, x1: b.toHz, y0: b.maxDb, y1: Infinity });
      if (b.minDb !== undefined) regions.push({ x0: b.fromHz, x1: b.toHz, y0: -Infinity, y1: b.minDb });
    });
    masks.push({ label: 'Spec mask (forbidden)', regions });
  }
  const bands: PlotBand[] = [];
  if (input.envelope) {
    checkSweep(input.envelope.frequencyHz, input.envelope.lower, 'envelope.lower');
    checkSweep(input.envelope.frequencyHz, input.envelope.upper, 'envelope.upper');
    bands.push({ label: input.envelope.label, x: input.envelope.frequencyHz, lower: input.envelope.lower, upper: input.envelope.upper });
  }
  const markers: PlotMarkers[] = [];
  if (input.testLimits && input.testLimits.length > 0) {
    markers.push({
      label: 'Test points and limits',
      color: '#000000',
      points: input.testLimits.map((t) => ({ x: t.frequencyHz, y: t.gainDb, low: t.lowDb, high: t.highDb })),
    });
  }
  const values: number[] = [];
  const collect = (a: ArrayLike<number>) => {
    for (let k = 0; k < a.length; k++) if (Number.isFinite(a[k])) values.push(a[k]);
  };
  collect(input.gainDb);
  if (input.envelope) collect(input.envelope.upper);
  for (const t of input.testLimits ?? []) collect([t.highDb, t.lowDb]);
  for (const b of input.mask ?? []) collect([b.maxDb ?? NaN, b.minDb ?? NaN]);
  const top = maxOf(values);
  const bottom = Math.max(minOf(values), top - (input.rangeDb ?? DEFAULT_GAIN_RANGE_DB));
  return {
    title: input.title ?? 'Gain',
    xLabel: 'Frequency (Hz)',
    yLabel: 'Gain (dB)',
    yRange: values.length ? niceRange(bottom, top + 1) : undefined,
    series: [{ label: input.label ?? 'Gain', x: input.frequencyHz, y: input.gainDb, style: { color: PLOT_PALETTE[0] } }],
    bands,
    masks,
    markers,
  };
}

export interface PhasePlotInput {
  readonly title?: string;
  readonly frequencyHz: ArrayLike<number>;
  readonly phaseDeg: ArrayLike<number>;
  readonly label?: string;
  readonly envelope?: EnvelopeInput;
}

/** Unwrapped phase in degrees against log frequency. */
export function phasePlot(input: PhasePlotInput): PlotModel {
  checkSweep(input.frequencyHz, input.phaseDeg, 'phaseDeg');
  const finite: number[] = [];
  for (let k = 0; k < input.phaseDeg.length; k++) if (Number.isFinite(input.phaseDeg[k])) finite.push(input.phaseDeg[k]);
  const step = phaseStep(maxOf(finite) - minOf(finite));
  return {
    yStep: step,
    title: input.title ?? 'Phase',
    xLabel: 'Frequency (Hz)',
    yLabel: 'Phase (deg)',
    series: [{ label: input.label ?? 'Phase', x: input.frequencyHz, y: input.phaseDeg, style: { color: PLOT_PALETTE[0] } }],
    bands: input.envelope ? [{ label: input.envelope.label, x: input.envelope.frequencyHz, lower: input.envelope.lower, upper: input.envelope.upper }] : [],
  };
}

export interface GroupDelayPlotInput {
  readonly title?: string;
  readonly frequencyHz: ArrayLike<number>;
  readonly groupDelayS: ArrayLike<number>;
  readonly label?: string;
}

/** Time units for the delay axis, largest first: the first whose scale is at most the largest delay. */
const DELAY_UNITS: readonly [number, string][] = [
  [1, 's'],
  [1e-3, 'ms'],
  [1e-6, '\u00b5s'],
  [1e-9, 'ns'],
];

/** Group delay against log frequency, in s, ms, us or ns as the values need. */
export function groupDelayPlot(input: GroupDelayPlotInput): PlotModel {
  checkSweep(input.frequencyHz, input.groupDelayS, 'groupDelayS');
  const finite: number[] = [];
  for (let k = 0; k < input.groupDelayS.length; k++) if (Number.isFinite(input.groupDelayS[k])) finite.push(Math.abs(input.groupDelayS[k]));
  const largest = maxOf(finite);
  const [scale, unit] = DELAY_UNITS.find(([s]) => largest >= s) ?? DELAY_UNITS[DELAY_UNITS.length - 1];
  const y = Array.from({ length: input.groupDelayS.length }, (_, k) => input.groupDelayS[k] / scale);
  return {
    title: input.title ?? 'Group delay',
    xLabel: 'Frequency (Hz)',
    yLabel: `Group delay (${unit})`,
    series: [{ label: input.label ?? 'Group delay', x: input.frequencyHz, y, style: { color: PLOT_PALETTE[0] } }],
  };
}

export interface SwingPlotInput {
  readonly title?: string;
  readonly frequencyHz: ArrayLike<number>;
  /** Peak output voltage of each op-amp for the stated input level. */
  readonly outputs: readonly { readonly label: string; readonly peakV: ArrayLike<number> }[];
  /** The output level where the op-amp clips (peak, V). */
  readonly clippingV: number;
  /** Stated in the title, e.g. '1 V peak input'. */
  readonly inputLevel?: string;
}

/** Each op-amp's peak output against log frequency, the clipping level as a dashed line with the region above it shaded. */
export function swingPlot(input: SwingPlotInput): PlotModel {
  if (!(input.clippingV > 0) || !Number.isFinite(input.clippingV)) throw new InvalidInputError('OUT_OF_RANGE', 'clippingV', input.clippingV, 'must be a positive finite voltage');
  const series: PlotSeries[] = input.outputs.map((o, i) => {
    checkSweep(input.frequencyHz, o.peakV, `outputs[${i}].peakV`);
    return { label: o.label, x: input.frequencyHz, y: o.peakV, style: { color: PLOT_PALETTE[(i + 2) % PLOT_PALETTE.length] } };
  });
  const values: number[] = [input.clippingV, 0];
  for (const o of input.outputs) for (let k = 0; k < o.peakV.length; k++) if (Number.isFinite(o.peakV[k])) values.push(o.peakV[k]);
  return {
    title: input.title ?? `Op-amp output swing${input.inputLevel ? ` (${input.inputLevel})` : ''}`,
    xLabel: 'Frequency (Hz)',
    yLabel: 'Peak output (V)',
    yRange: niceRange(0, maxOf(values) * 1.1),
    series,
    levels: [{ label: `Clipping ${Number(input.clippingV.toPrecision(4))} V`, y: input.clippingV, style: { color: '#d62728', dash: 'dashed' } }],
    masks: [{ label: 'Clipped', regions: [{ x0: 0, x1: Infinity, y0: input.clippingV, y1: Infinity }], color: '#d62728' }],
  };
}

function checkSweep(x: ArrayLike<number>, y: ArrayLike<number>, path: string): void {
  if (!x || !y || typeof x.length !== 'number' || typeof y.length !== 'number') throw new InvalidInputError('INVALID_ARGUMENT', path, y, 'must be an array of numbers');
  if (x.length !== y.length) throw new InvalidInputError('INVALID_ARGUMENT', path, y.length, `must have one value per frequency (${x.length})`);
}

function maxOf(a: readonly number[]): number {
  let m = -Infinity;
  for (const v of a) if (v > m) m = v;
  return m === -Infinity ? 0 : m;
}

function minOf(a: readonly number[]): number {
  let m = Infinity;
  for (const v of a) if (v < m) m = v;
  return m === Infinity ? 0 : m;
}
