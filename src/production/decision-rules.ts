/**
 * Decision rules for conformity statements (ILAC-G8:09/2019, "Guidelines on decision rules and
 * statements of conformity", section 4; also JCGM 106:2012, "Evaluation of measurement data - The role
 * of measurement uncertainty in conformity assessment", clause 8; section numbers from memory).
 *
 * A tolerance interval [TL, TU] is what the true value must satisfy (the spec mask at a test point, or a
 * statistical interval). The acceptance interval [AL, AU] = [TL + w, TU - w] is what the *measured* value
 * must satisfy; w is the guard band:
 * - simple acceptance (shared risk): w = 0;
 * - guarded acceptance: w = r U with U = k u the expanded uncertainty (r = 1 is ILAC-G8's
 *   "w = U" rule: with k = 2 the probability of false acceptance at the limit is at most 2.3 %);
 * - guarded rejection: w = -r U (the acceptance interval is wider than the tolerance; the producer is
 *   protected, the consumer is not);
 * - an explicit guard band w in the quantity's unit.
 * The non-binary statement of ILAC-G8 (pass, conditional pass, conditional fail, fail, with the zones
 * set by U) is {@link classifyWithUncertainty}.
 */
import { InvalidInputError, requireFinite } from '../errors';
import type { Interval } from './interval';
import { normalCdf } from '../algebra/normal';

export type DecisionRule =
  | { readonly rule: 'simple-acceptance' }
  | { readonly rule: 'guarded-acceptance'; readonly multiple?: number }
  | { readonly rule: 'guarded-rejection'; readonly multiple?: number }
  | { readonly rule: 'guard-band'; readonly width: number };

/** The measuring system's uncertainty at a test point, in the unit of the quantity (dB or degrees). */
export interface MeasurementUncertainty {
  /** Standard uncertainty u (one standard deviation of the measurement error, normal model). */
  readonly standardUncertainty: number;
  /** Coverage factor k: U = k u. Default {@link DEFAULT_COVERAGE_FACTOR}. */
  readonly coverageFactor?: number;
}

/** k = 2: about 95 % coverage for a normal measurement error (JCGM 100:2008, 6.3.3; common practice). */
export const DEFAULT_COVERAGE_FACTOR = 2;

/** The ILAC-G8 default guarded-acceptance multiple (w = U). */
export const DEFAULT_GUARD_MULTIPLE = 1;

const RULES = ['simple-acceptance', 'guarded-acceptance', 'guarded-rejection', 'guard-band'] as const;

/** Expanded uncertainty U = k u; validates. */
export function expandedUncertainty(m: MeasurementUncertainty, path = 'uncertainty'): number {
  const u = requireFinite(m?.standardUncertainty, `${path}.standardUncertainty`);
  if (u < 0) throw new InvalidInputError('OUT_OF_RANGE', `${path}.standardUncertainty`, u, 'must not be negative');
  const k = m.coverageFactor === undefined ? DEFAULT_COVERAGE_FACTOR : requireFinite(m.coverageFactor, `${path}.coverageFactor`);
  if (!(k > 0)) throw new InvalidInputError('OUT_OF_RANGE', `${path}.coverageFactor`, k, 'must be greater than zero');
  return k * u;
}

/** The guard band w (unit of the quantity) that `rule` sets for `uncertainty`; validates. */
export function guardBandWidth(rule: DecisionRule, uncertainty: MeasurementUncertainty, path = 'rule'): number {
  if (typeof rule !== 'object' || rule === null || !(RULES as readonly string[]).includes((rule as { rule: string }).rule)) {
    throw new InvalidInputError('INVALID_ARGUMENT', `${path}.rule`, (rule as { rule?: unknown } | null)?.rule, `must be one of ${RULES.join(', ')}`);
  }
  const bigU = expandedUncertainty(uncertainty);
  switch (rule.rule) {
    case 'simple-acceptance':
      return 0;
    case 'guard-band':
      return requireFinite(rule.width, `${path}.width`);
    case 'guarded-acceptance':
    case 'guarded-rejection': {
      const r = rule.multiple === undefined ? DEFAULT_GUARD_MULTIPLE : requireFinite(rule.multiple, `${path}.multiple`);
      if (r < 0) throw new InvalidInputError('OUT_OF_RANGE', `${path}.multiple`, r, 'must not be negative (choose the other rule)');
      return rule.rule === 'guarded-acceptance' ? r * bigU : -r * bigU;
    }
  }
}

/** [TL + w, TU - w]; an open end stays open. Empty (lower > upper) when 2w exceeds the width. */
export function acceptanceInterval(tolerance: Interval, guardBand: number): Interval {
  return { lower: tolerance.lower + guardBand, upper: tolerance.upper - guardBand };
}

/**
 * The specific (conditional) probability of false acceptance for one measured value: the probability
 * that the true value lies outside the tolerance given the measurement, with a normal measurement error
 * of standard uncertainty u and no prior knowledge of the process (the posterior is N(measured, u);
 * JCGM 106:2012, 9.3, with a flat prior). At a measured value k u inside a limit it is Phi(-k).
 */
export function specificFalseAcceptance(measured: number, tolerance: Interval, standardUncertainty: number): number {
  const u = standardUncertainty;
  if (!(u > 0)) return inToleranceOrNaN(measured, tolerance);
  const below = Number.isFinite(tolerance.lower) ? normalCdf((tolerance.lower - measured) / u) : 0;
  const above = Number.isFinite(tolerance.upper) ? normalCdf((measured - tolerance.upper) / u) : 0;
  return below + above;
}

function inToleranceOrNaN(x: number, t: Interval): number {
  if (Number.isNaN(x)) return NaN;
  return x >= t.lower && x <= t.upper ? 0 : 1;
}

/** ILAC-G8's non-binary statement for a measured value, with the zones set by the expanded uncertainty U. */
export type ConformityZone = 'pass' | 'conditional-pass' | 'conditional-fail' | 'fail';

/** pass: inside [TL + U, TU - U]; conditional pass: inside T but within U of a limit; conditional fail: outside T by at most U; fail: beyond. */
export function classifyWithUncertainty(measured: number, tolerance: Interval, expanded: number): ConformityZone {
  if (measured >= tolerance.lower + expanded && measured <= tolerance.upper - expanded) return 'pass';
  if (measured >= tolerance.lower && measured <= tolerance.upper) return 'conditional-pass';
  if (measured >= tolerance.lower - expanded && measured <= tolerance.upper + expanded) return 'conditional-fail';
  return 'fail';
}
