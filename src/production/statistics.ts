/**
 * Sample statistics of a Monte Carlo distribution: mean, standard deviation, extremes and quantiles.
 *
 * Quantiles are Hyndman and Fan's type 7 (linear interpolation between order statistics at
 * h = (n - 1) p; R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", The American
 * Statistician 50(4), 1996, definition 7), the default of R and numpy, so a reader can reproduce them.
 * Non-finite samples (a board whose response could not be solved) are counted and left out.
 * Kernels: an empty sample gives NaN, never a throw.
 */
import { sortedQuantile } from '../tolerance/streaming-stats';

/** Probabilities reported by default: the 99.73 % and 95 % two-sided coverages, the quartiles and the median. */
export const DEFAULT_QUANTILE_PROBABILITIES: readonly number[] = [0.00135, 0.025, 0.25, 0.5, 0.75, 0.975, 0.99865];

export interface SampleQuantile {
  readonly probability: number;
  readonly value: number;
}

export interface SampleSummary {
  /** Finite samples used. */
  readonly count: number;
  /** Samples left out because they were NaN or infinite. */
  readonly nonFinite: number;
  readonly mean: number;
  /** Standard deviation with the n - 1 divisor (NaN for fewer than two samples). */
  readonly sd: number;
  readonly min: number;
  readonly max: number;
  readonly quantiles: readonly SampleQuantile[];
}

/** The finite samples, sorted ascending (a new array). */
export function sortedFinite(samples: ArrayLike<number>): Float64Array {
  let n = 0;
  for (let i = 0; i < samples.length; i++) if (Number.isFinite(samples[i])) n++;
  const out = new Float64Array(n);
  let j = 0;
  for (let i = 0; i < samples.length; i++) if (Number.isFinite(samples[i])) out[j++] = samples[i];
  return out.sort();
}

/** The type-7 quantile of an ascending array (tolerance's sortedQuantile); NaN when it is empty or p is outside [0, 1]. */
export function quantileOfSorted(sorted: ArrayLike<number>, p: number): number {
  return p >= 0 && p <= 1 ? sortedQuantile(sorted, p) : NaN;
}

/** Mean, sd (two-pass, so no cancellation), extremes and quantiles of the finite samples. */
export function summarizeSamples(samples: ArrayLike<number>, probabilities: readonly number[] = DEFAULT_QUANTILE_PROBABILITIES): SampleSummary {
  const sorted = sortedFinite(samples);
  const n = sorted.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += sorted[i];
  const mean = n > 0 ? sum / n : NaN;
  let ss = 0;
  let comp = 0;
  for (let i = 0; i < n; i++) {
    const d = sorted[i] - mean;
    ss += d * d;
    comp += d;
  }
  // Corrected two-pass formula (T. F. Chan, G. H. Golub, R. J. LeVeque, "Algorithms for computing the
  // sample variance", The American Statistician 37(3), 1983, Eq. 1.7): the second term removes the
  // rounding error of the mean.
  const variance = n > 1 ? (ss - (comp * comp) / n) / (n - 1) : NaN;
  return {
    count: n,
    nonFinite: samples.length - n,
    mean,
    sd: Math.sqrt(Math.max(0, variance)),
    min: n > 0 ? sorted[0] : NaN,
    max: n > 0 ? sorted[n - 1] : NaN,
    quantiles: probabilities.map((p) => ({ probability: p, value: quantileOfSorted(sorted, p) })),
  };
}
