/**
 * Test limits of one quantity (gain in dB or phase in degrees) at one test point, and what they imply:
 * the tolerance interval the true value must satisfy, the acceptance interval for the measured value
 * (the tolerance narrowed by the guard band of the decision rule, decision-rules.ts), the predicted
 * yield, the global false-accept and false-reject probabilities (risk.ts) and the process capability
 * (capability.ts).
 *
 * Tolerance interval sources:
 * - 'mask': the spec mask's window at the frequency (given by the caller: maskLimits of tolerance/yield.ts);
 * - 'nominal': nominal +- a stated tolerance;
 * - 'statistical': the central `coverage` of the Monte Carlo distribution (e.g. 0.9973), by its
 *   sample quantiles (Hyndman-Fan type 7) or by mean +- z sd with z = Phi^-1((1 + coverage)/2)
 *   ('normal'). One-sided (upper only, at quantile `coverage`) where `oneSided: 'upper'` (a stopband
 *   point, whose mask has a ceiling only); likewise 'lower'.
 * The process model of the risk integrals is the Monte Carlo samples when given (the empirical
 * distribution, no normality assumed), else normal from mean and sd.
 */
import { InvalidInputError, requireFinite } from '../errors';
import { acceptanceInterval, guardBandWidth, type DecisionRule, type MeasurementUncertainty } from './decision-rules';
import type { Interval } from './interval';
import { normalQuantile } from '../algebra/normal';
import { globalRisks, type ProcessModel } from './risk';
import { processCapability, type ProcessCapability } from './capability';
import { quantileOfSorted, sortedFinite, summarizeSamples, type SampleSummary } from './statistics';

export type LimitSource =
  | { readonly kind: 'mask'; readonly limits: Interval }
  | { readonly kind: 'nominal'; readonly tolerance: number }
  | { readonly kind: 'statistical'; readonly coverage: number; readonly method?: 'quantile' | 'normal'; readonly oneSided?: 'upper' | 'lower' };

/** 99.73 %: the +-3 sigma coverage of a normal process (common practice, no source). */
export const DEFAULT_STATISTICAL_COVERAGE = 0.9973;

export interface QuantityLimitInput {
  readonly nominal: number;
  /** Monte Carlo values of the quantity at this point (one per board); or give `normal`. */
  readonly samples?: ArrayLike<number>;
  /** Mean and sd when no samples are kept (e.g. tolerance's streamed statistics). */
  readonly normal?: { readonly mean: number; readonly sd: number };
  readonly source: LimitSource;
  readonly rule: DecisionRule;
  readonly uncertainty: MeasurementUncertainty;
}

export interface QuantityLimits {
  readonly nominal: number;
  /** The Monte Carlo distribution (null when only mean and sd were given). */
  readonly distribution: SampleSummary | null;
  readonly mean: number;
  readonly sd: number;
  /** What the true value must satisfy. */
  readonly tolerance: Interval;
  /** w of the decision rule (positive narrows). */
  readonly guardBand: number;
  /** What the measured value must satisfy: the test limits. */
  readonly acceptance: Interval;
  /** P(measured value accepted): the yield the test will show at this point. */
  readonly predictedYield: number;
  /** P(true value inside the tolerance). */
  readonly conformance: number;
  /** Global probability of false acceptance (JCGM 106 9.5). */
  readonly falseAccept: number;
  /** Global probability of false rejection. */
  readonly falseReject: number;
  readonly capability: ProcessCapability;
}

/** The tolerance interval from its source (validates). */
export function toleranceInterval(source: LimitSource, nominal: number, sorted: Float64Array | null, normal: { mean: number; sd: number }, path = 'source'): Interval {
  if (typeof source !== 'object' || source === null) throw new InvalidInputError('INVALID_ARGUMENT', path, source, 'must be a limit source');
  switch (source.kind) {
    case 'mask': {
      const { lower, upper } = source.limits ?? ({} as Interval);
      if (typeof lower !== 'number' || typeof upper !== 'number' || Number.isNaN(lower) || Number.isNaN(upper) || lower > upper) {
        throw new InvalidInputError('INVALID_ARGUMENT', `${path}.limits`, source.limits, 'must be { lower, upper } with lower <= upper');
      }
      return { lower, upper };
    }
    case 'nominal': {
      const t = requireFinite(source.tolerance, `${path}.tolerance`);
      if (!(t > 0)) throw new InvalidInputError('OUT_OF_RANGE', `${path}.tolerance`, t, 'must be greater than zero');
      return { lower: nominal - t, upper: nominal + t };
    }
    case 'statistical': {
      const p = requireFinite(source.coverage, `${path}.coverage`);
      if (!(p > 0 && p < 1)) throw new InvalidInputError('OUT_OF_RANGE', `${path}.coverage`, p, 'must be between 0 and 1 (exclusive)');
      const method = source.method ?? (sorted ? 'quantile' : 'normal');
      if (method !== 'quantile' && method !== 'normal') throw new InvalidInputError('INVALID_ARGUMENT', `${path}.method`, method, "must be 'quantile' or 'normal'");
      if (method === 'quantile' && !sorted) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.method`, method, 'needs Monte Carlo samples');
      const side = source.oneSided;
      if (side !== undefined && side !== 'upper' && side !== 'lower') throw new InvalidInputError('INVALID_ARGUMENT', `${path}.oneSided`, side, "must be 'upper' or 'lower'");
      const [pl, pu] = side === 'upper' ? [0, p] : side === 'lower' ? [1 - p, 1] : [(1 - p) / 2, (1 + p) / 2];
      const at = (q: number, open: number) => {
        if (q === 0 || q === 1) return open;
        return method === 'quantile' ? quantileOfSorted(sorted!, q) : normal.mean + normal.sd * normalQuantile(q);
      };
      return { lower: at(pl, -Infinity), upper: at(pu, Infinity) };
    }
    default:
      throw new InvalidInputError('INVALID_ARGUMENT', `${path}.kind`, (source as { kind?: unknown }).kind, "must be 'mask', 'nominal' or 'statistical'");
  }
}

/** Limits, yield, risks and capability of one quantity at one test point. */
export function quantityLimits(input: QuantityLimitInput, path = 'limits'): QuantityLimits {
  const nominal = requireFinite(input?.nominal, `${path}.nominal`);
  let distribution: SampleSummary | null = null;
  let sorted: Float64Array | null = null;
  let mean: number;
  let sd: number;
  if (input.samples !== undefined) {
    sorted = sortedFinite(input.samples);
    if (sorted.length < 2) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.samples`, input.samples.length, 'needs at least two finite samples');
    distribution = summarizeSamples(sorted);
    mean = distribution.mean;
    sd = distribution.sd;
  } else if (input.normal !== undefined) {
    mean = requireFinite(input.normal.mean, `${path}.normal.mean`);
    sd = requireFinite(input.normal.sd, `${path}.normal.sd`);
    if (!(sd >= 0)) throw new InvalidInputError('OUT_OF_RANGE', `${path}.normal.sd`, sd, 'must not be negative');
  } else {
    throw new InvalidInputError('INVALID_ARGUMENT', path, input, 'needs samples or normal { mean, sd }');
  }
  const tolerance = toleranceInterval(input.source, nominal, sorted, { mean, sd }, `${path}.source`);
  const guardBand = guardBandWidth(input.rule, input.uncertainty, `${path}.rule`);
  const acceptance = acceptanceInterval(tolerance, guardBand);
  const u = input.uncertainty.standardUncertainty;
  const model: ProcessModel = sorted ? { kind: 'samples', values: sorted } : { kind: 'normal', mean, sd };
  const risks = globalRisks(model, tolerance, acceptance, u);
  return {
    nominal,
    distribution,
    mean,
    sd,
    tolerance,
    guardBand,
    acceptance,
    predictedYield: risks.acceptance,
    conformance: risks.conformance,
    falseAccept: risks.consumerRisk,
    falseReject: risks.producerRisk,
    capability: processCapability(mean, sd, tolerance),
  };
}
