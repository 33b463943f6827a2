/**
 * Yield against a specification mask: the fraction of Monte Carlo trials whose gain stays inside the
 * passband and stopband limits at every frequency of a grid, with a confidence interval for the
 * underlying proportion by the Wilson score method (E. B. Wilson, "Probable inference, the law of
 * succession, and statistical inference", JASA 22(158), 1927), which keeps its coverage near the
 * nominal level even for yields close to 100 %, where the Wald interval collapses.
 *
 * The gain is that of the analysed transfer V(output)/V(input) in dB, as the circuit has it (a doubly
 * terminated ladder sits at -6.02 dB in its passband: write the mask for that).
 */
import { InvalidInputError, requireFinite, requireInteger } from '../errors';
import { normalQuantile } from '../algebra/normal';

export interface PassbandLimit {
  readonly fromHz: number;
  readonly toHz: number;
  readonly minGainDb: number;
  readonly maxGainDb: number;
}

export interface StopbandLimit {
  readonly fromHz: number;
  readonly toHz: number;
  readonly maxGainDb: number;
}

export interface SpecMask {
  readonly passband: readonly PassbandLimit[];
  readonly stopband: readonly StopbandLimit[];
}

/** The limits at each frequency: the strictest of every band that contains it (bands are closed intervals). */
export interface MaskLimits {
  readonly frequencyHz: Float64Array;
  /** -Infinity where no band sets a lower limit. */
  readonly minGainDb: Float64Array;
  /** +Infinity where no band sets an upper limit. */
  readonly maxGainDb: Float64Array;
}

export function validateMask(mask: SpecMask, path = 'mask'): SpecMask {
  if (typeof mask !== 'object' || mask === null || !Array.isArray(mask.passband) || !Array.isArray(mask.stopband)) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, mask, 'must be { passband: [...], stopband: [...] }');
  }
  const band = (b: { fromHz: number; toHz: number }, p: string) => {
    if (typeof b !== 'object' || b === null) throw new InvalidInputError('INVALID_ARGUMENT', p, b, 'must be a band object');
    const from = requireFinite(b.fromHz, `${p}.fromHz`);
    const to = requireFinite(b.toHz, `${p}.toHz`);
    if (!(from >= 0)) throw new InvalidInputError('OUT_OF_RANGE', `${p}.fromHz`, from, 'must not be negative');
    if (!(to >= from)) throw new InvalidInputError('OUT_OF_RANGE', `${p}.toHz`, to, 'must not be below fromHz');
  };
  mask.passband.forEach((b, i) => {
    const p = `${path}.passband[${i}]`;
    band(b, p);
    const lo = requireFinite(b.minGainDb, `${p}.minGainDb`);
    const hi = requireFinite(b.maxGainDb, `${p}.maxGainDb`);
    if (!(hi >= lo)) throw new InvalidInputError('OUT_OF_RANGE', `${p}.maxGainDb`, hi, 'must not be below minGainDb');
  });
  mask.stopband.forEach((b, i) => {
    const p = `${path}.stopband[${i}]`;
    band(b, p);
    requireFinite(b.maxGainDb, `${p}.maxGainDb`);
  });
  if (mask.passband.length + mask.stopband.length === 0) throw new InvalidInputError('INVALID_ARGUMENT', path, mask, 'must have at least one band');
  return mask;
}

/** The mask's limits at the given frequencies. */
export function maskLimits(mask: SpecMask, frequenciesHz: ArrayLike<number>): MaskLimits {
  validateMask(mask);
  const m = frequenciesHz.length;
  const frequencyHz = Float64Array.from(frequenciesHz);
  const minGainDb = new Float64Array(m).fill(-Infinity);
  const maxGainDb = new Float64Array(m).fill(Infinity);
  for (let i = 0; i < m; i++) {
    const f = frequencyHz[i];
    for (const b of mask.passband) {
      if (f < b.fromHz || f > b.toHz) continue;
      minGainDb[i] = Math.max(minGainDb[i], b.minGainDb);
      maxGainDb[i] = Math.min(maxGainDb[i], b.maxGainDb);
    }
    for (const b of mask.stopband) if (f >= b.fromHz && f <= b.toHz) maxGainDb[i] = Math.min(maxGainDb[i], b.maxGainDb);
  }
  return { frequencyHz, minGainDb, maxGainDb };
}

/** Default grid density: 8 points per band, log-spaced, edges included (common practice, no source). */
export const DEFAULT_POINTS_PER_BAND = 8;

/**
 * A frequency grid for the mask: `pointsPerBand` log-spaced points in each band (linear when a band
 * starts at 0 Hz), edges included, sorted, duplicates removed.
 */
export function maskFrequencyGrid(mask: SpecMask, pointsPerBand = DEFAULT_POINTS_PER_BAND): Float64Array {
  validateMask(mask);
  requireInteger(pointsPerBand, 'pointsPerBand', 1, 10_000);
  const out: number[] = [];
  for (const b of [...mask.passband, ...mask.stopband]) {
    if (pointsPerBand === 1 || b.toHz === b.fromHz) {
      out.push(b.fromHz === b.toHz ? b.fromHz : Math.sqrt(b.fromHz * b.toHz) || (b.fromHz + b.toHz) / 2);
      continue;
    }
    for (let i = 0; i < pointsPerBand; i++) {
      const t = i / (pointsPerBand - 1);
      out.push(b.fromHz > 0 ? b.fromHz * (b.toHz / b.fromHz) ** t : b.fromHz + t * (b.toHz - b.fromHz));
    }
  }
  out.sort((a, b) => a - b);
  return Float64Array.from(out.filter((f, i) => i === 0 || f !== out[i - 1]));
}

/** k with P(|Z| <= k) = confidence for a standard normal Z: the normal quantile at (1 + confidence)/2. */
export function twoSidedNormalQuantile(confidence: number): number {
  requireFinite(confidence, 'confidence');
  if (!(confidence > 0 && confidence < 1)) throw new InvalidInputError('OUT_OF_RANGE', 'confidence', confidence, 'must be between 0 and 1 (exclusive)');
  return normalQuantile((1 + confidence) / 2);
}

export interface ProportionInterval {
  readonly estimate: number;
  readonly low: number;
  readonly high: number;
  readonly confidence: number;
  readonly method: 'wilson-score';
}

/**
 * The Wilson score interval for a proportion: with p^ = x/n and z the two-sided normal quantile,
 * centre (p^ + z^2/(2n)) / (1 + z^2/n), half-width z sqrt(p^(1-p^)/n + z^2/(4n^2)) / (1 + z^2/n).
 */
export function wilsonInterval(successes: number, trials: number, confidence = 0.95): ProportionInterval {
  requireInteger(trials, 'trials', 1, Number.MAX_SAFE_INTEGER);
  requireInteger(successes, 'successes', 0, trials);
  const z = twoSidedNormalQuantile(confidence);
  const n = trials;
  const p = successes / n;
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom; // Eq. (Wilson 1927, score interval centre)
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / denom;
  // at x = 0 (x = n) the lower (upper) end is exactly 0 (1); the formula gives it only up to rounding
  const low = successes === 0 ? 0 : Math.max(0, centre - half);
  const high = successes === trials ? 1 : Math.min(1, centre + half);
  return { estimate: p, low, high, confidence, method: 'wilson-score' };
}
