/**
 * The frequencies a design is evaluated at: log-spaced over the passband and the stopband (with the
 * band edges themselves included, where the errors are largest), and which of them lie in the passband
 * and in the stopband of the spec's mask.
 */
import type { FilterType } from '../approximation/order';
import type { Edge } from './pipeline-stages';

/** How far beyond the outermost edge the sweep extends, as a frequency ratio (two octaves and more). */
const SWEEP_MARGIN = 4;
/** How far into a passband that extends to DC or infinity the sweep reaches, as a ratio (two decades). */
const PASSBAND_REACH = 100;

export interface EvaluationGrid {
  readonly frequencyHz: readonly number[];
  readonly passband: readonly boolean[];
  readonly stopband: readonly boolean[];
}

/** Log-spaced points from a to b (both included). */
export function logSpace(a: number, b: number, n: number): number[] {
  const la = Math.log10(a);
  const lb = Math.log10(b);
  return Array.from({ length: n }, (_, i) => 10 ** (la + ((lb - la) * i) / (n - 1)));
}

/** Whether f lies in the passband of a mask with these edges (edges included). */
export function inPassband(type: FilterType, pass: Edge, f: number): boolean {
  if (type === 'lowpass') return f <= (pass as number);
  if (type === 'highpass') return f >= (pass as number);
  const [a, b] = pass as [number, number];
  return type === 'bandpass' ? f >= a && f <= b : f <= a || f >= b;
}

/** Whether f lies in the stopband (edges included); false everywhere without a stopband edge. */
export function inStopband(type: FilterType, stop: Edge | undefined, f: number): boolean {
  if (stop === undefined) return false;
  if (type === 'lowpass') return f >= (stop as number);
  if (type === 'highpass') return f <= (stop as number);
  const [a, b] = stop as [number, number];
  return type === 'bandpass' ? f <= a || f >= b : f >= a && f <= b;
}

/** The evaluation grid of `points` log-spaced frequencies plus every edge. */
export function evaluationGrid(type: FilterType, pass: Edge, stop: Edge | undefined, points: number): EvaluationGrid {
  const edges = [pass, stop].flatMap((e) => (e === undefined ? [] : Array.isArray(e) ? e : [e]));
  const lo = Math.min(...edges);
  const hi = Math.max(...edges);
  const fmin = type === 'lowpass' || type === 'bandstop' ? lo / PASSBAND_REACH : lo / SWEEP_MARGIN;
  const fmax = type === 'highpass' || type === 'bandstop' ? hi * PASSBAND_REACH : hi * SWEEP_MARGIN;
  const frequencyHz = [...new Set([...logSpace(fmin, fmax, points), ...edges])].sort((a, b) => a - b);
  return {
    frequencyHz,
    passband: frequencyHz.map((f) => inPassband(type, pass, f)),
    stopband: frequencyHz.map((f) => inStopband(type, stop, f)),
  };
}
