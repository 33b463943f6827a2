/**
 * Fixed-memory statistics of many output quantities over many trials, mergeable in a fixed order.
 *
 * - Mean and variance by Welford's update (B. P. Welford, Technometrics 4(3), 1962) within a block,
 *   and by the pairwise combination of T. F. Chan, G. H. Golub, R. J. LeVeque ("Algorithms for
 *   computing the sample variance", The American Statistician 37(3), 1983, eq. 2.1b) between blocks.
 *   Blocks are always combined in block order, so a run split over workers rounds exactly like the
 *   serial run.
 * - Quantiles: exact order statistics while every value can be kept (small runs), otherwise a
 *   fixed-bin histogram per quantity whose range is set from a pilot block (three times the pilot's
 *   span, centred on it) with underflow/overflow bins bounded by the running min and max; a quantile
 *   is interpolated linearly within its bin. Histogram counts are integers, so merging is exact and
 *   order-independent. Resolution: the bin width, reported as `quantileResolution`.
 */

/** Welford/Chan accumulators for q quantities (count shared). */
export interface MomentAccumulator {
  n: number;
  readonly mean: Float64Array;
  /** Sum of squared deviations from the mean. */
  readonly m2: Float64Array;
  readonly min: Float64Array;
  readonly max: Float64Array;
}

export function createMoments(q: number): MomentAccumulator {
  return { n: 0, mean: new Float64Array(q), m2: new Float64Array(q), min: new Float64Array(q).fill(Infinity), max: new Float64Array(q).fill(-Infinity) };
}

/** Adds one trial's values (Welford's update). */
export function addMoments(acc: MomentAccumulator, values: Float64Array): void {
  const n = ++acc.n;
  const { mean, m2, min, max } = acc;
  for (let k = 0; k < values.length; k++) {
    const x = values[k];
    const d = x - mean[k];
    mean[k] += d / n;
    m2[k] += d * (x - mean[k]);
    if (x < min[k]) min[k] = x;
    if (x > max[k]) max[k] = x;
  }
}

/** a := a combined with b (Chan, Golub, LeVeque eq. 2.1b). */
export function mergeMoments(a: MomentAccumulator, b: MomentAccumulator): void {
  if (b.n === 0) return;
  const n = a.n + b.n;
  for (let k = 0; k < a.mean.length; k++) {
    const d = b.mean[k] - a.mean[k];
    a.mean[k] += (d * b.n) / n;
    a.m2[k] += b.m2[k] + (d * d * a.n * b.n) / n;
    if (b.min[k] < a.min[k]) a.min[k] = b.min[k];
    if (b.max[k] > a.max[k]) a.max[k] = b.max[k];
  }
  a.n = n;
}

/** Sample standard deviation (divisor n - 1, JCGM 101 eq. (13)); NaN below two trials. */
export function standardDeviationOf(acc: MomentAccumulator, k: number): number {
  return acc.n > 1 ? Math.sqrt(acc.m2[k] / (acc.n - 1)) : NaN;
}

/** Histogram ranges per quantity: bins equal-width in [lo, hi), plus an underflow and an overflow bin. */
export interface HistogramRanges {
  readonly bins: number;
  readonly lo: Float64Array;
  readonly hi: Float64Array;
}

/** Bins per quantity: 4096 resolve a quantile to about 1/1000 of the spread (three pilot spans over 4096 bins). */
export const DEFAULT_HISTOGRAM_BINS = 4096;

/** The histogram span is the pilot's span widened by this factor on each side: 1 covers the tails of 10^6 trials seen from a 10^3-trial pilot with margin. */
const PILOT_SPAN_PAD = 1;

/** Ranges from a pilot's min and max per quantity. A quantity that did not vary gets a tiny range around its value. */
export function histogramRangesFromPilot(min: Float64Array, max: Float64Array, bins = DEFAULT_HISTOGRAM_BINS): HistogramRanges {
  const lo = new Float64Array(min.length);
  const hi = new Float64Array(min.length);
  for (let k = 0; k < min.length; k++) {
    let span = max[k] - min[k];
    if (!(span > 0)) span = Math.max(Math.abs(min[k]) * 1e-12, 1e-300); // constant in the pilot
    lo[k] = min[k] - PILOT_SPAN_PAD * span;
    hi[k] = max[k] + PILOT_SPAN_PAD * span;
  }
  return { bins, lo, hi };
}

/** Counts, quantity-major: counts[k * (bins + 2) + 0] underflow, 1..bins the bins, bins + 1 overflow. */
export function createHistogram(q: number, ranges: HistogramRanges): Uint32Array {
  return new Uint32Array(q * (ranges.bins + 2));
}

export function addHistogram(counts: Uint32Array, ranges: HistogramRanges, values: Float64Array): void {
  const { bins, lo, hi } = ranges;
  const stride = bins + 2;
  for (let k = 0; k < values.length; k++) {
    const x = values[k];
    let b: number;
    if (x < lo[k]) b = 0;
    else if (x >= hi[k]) b = bins + 1;
    else b = 1 + Math.min(bins - 1, Math.floor(((x - lo[k]) / (hi[k] - lo[k])) * bins));
    counts[k * stride + b]++;
  }
}

export function mergeHistogram(a: Uint32Array, b: Uint32Array): void {
  for (let i = 0; i < a.length; i++) a[i] += b[i];
}

/**
 * The p-quantile of quantity k from its histogram, by linear interpolation of the empirical
 * distribution function within the bin holding rank p*n; the underflow bin spans [min, lo), the
 * overflow bin [hi, max].
 */
export function histogramQuantile(counts: Uint32Array, ranges: HistogramRanges, k: number, p: number, n: number, min: number, max: number): number {
  const { bins } = ranges;
  const stride = bins + 2;
  const lo = ranges.lo[k];
  const hi = ranges.hi[k];
  const width = (hi - lo) / bins;
  const target = p * n;
  let cum = 0;
  for (let b = 0; b < stride; b++) {
    const c = counts[k * stride + b];
    if (c > 0 && cum + c >= target) {
      const frac = Math.min(1, Math.max(0, (target - cum) / c));
      let left: number;
      let right: number;
      if (b === 0) {
        left = min;
        right = Math.min(lo, max);
      } else if (b === bins + 1) {
        left = Math.max(hi, min);
        right = max;
      } else {
        left = Math.max(lo + (b - 1) * width, min);
        right = Math.min(lo + b * width, max);
      }
      return left + frac * (right - left);
    }
    cum += c;
  }
  return max;
}

/** The histogram's resolution of quantity k (the bin width). */
export function histogramResolution(ranges: HistogramRanges, k: number): number {
  return (ranges.hi[k] - ranges.lo[k]) / ranges.bins;
}

/**
 * The p-quantile of sorted values by linear interpolation between order statistics at position
 * (n - 1) p (R. J. Hyndman, Y. Fan, "Sample quantiles in statistical packages", The American
 * Statistician 50(4), 1996: definition 7).
 */
export function sortedQuantile(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * p;
  const i = Math.floor(h);
  if (i >= n - 1) return sorted[n - 1];
  return sorted[i] + (h - i) * (sorted[i + 1] - sorted[i]);
}

/**
 * The probabilistically symmetric coverage interval from sorted values (JCGM 101:2008, 7.7.2):
 * q = pM rounded to an integer (pM + 1/2 truncated), r = (M - q)/2 (rounded up when M - q is odd,
 * the clause's choice of r for the symmetric interval), endpoints y_(r) and y_(r+q), 1-based.
 */
export function symmetricCoverageInterval(sorted: ArrayLike<number>, p: number): [number, number] {
  const m = sorted.length;
  if (m === 0) return [NaN, NaN];
  const q = Math.floor(p * m + 0.5);
  const r = Math.max(1, Math.ceil((m - q) / 2));
  const hiIndex = Math.min(m, r + q);
  return [sorted[r - 1], sorted[hiIndex - 1]];
}
