/**
 * Process capability indices of one test point against its tolerance (specification) interval, and
 * the defect rate a normal process with those indices has (D. C. Montgomery, Introduction to
 * Statistical Quality Control, 7th ed., 2013, chapter 8, "Process and measurement system capability
 * analysis"; from memory):
 *   Cp  = (USL - LSL) / (6 sigma)                                  (two-sided only)
 *   Cpk = min(USL - mu, mu - LSL) / (3 sigma)                      (the one present, if one-sided)
 *   defect fraction = Phi((LSL - mu)/sigma) + 1 - Phi((USL - mu)/sigma)
 * Kernels: NaN for sigma <= 0 or non-finite inputs, no throw.
 */
import type { Interval } from './interval';
import { normalCdf, normalSf } from '../algebra/normal';

export interface ProcessCapability {
  /** Potential capability (spread against width); NaN when a limit is open. */
  readonly cp: number;
  /** Actual capability (worst side, centring included). */
  readonly cpk: number;
  /** (mu - LSL) / (3 sigma); Infinity for an open lower limit. */
  readonly cpl: number;
  /** (USL - mu) / (3 sigma); Infinity for an open upper limit. */
  readonly cpu: number;
  /** Expected non-conforming parts per million of a normal process with this mean and sd. */
  readonly defectPpm: number;
}

/** Cp, Cpk and the normal-model defect rate of a process (mean, sd) against `spec`. */
export function processCapability(mean: number, sd: number, spec: Interval): ProcessCapability {
  if (!(sd > 0) || !Number.isFinite(mean) || !Number.isFinite(sd)) {
    return { cp: NaN, cpk: NaN, cpl: NaN, cpu: NaN, defectPpm: NaN };
  }
  const cpl = (mean - spec.lower) / (3 * sd);
  const cpu = (spec.upper - mean) / (3 * sd);
  const twoSided = Number.isFinite(spec.lower) && Number.isFinite(spec.upper);
  const below = normalCdf((spec.lower - mean) / sd);
  const above = normalSf((spec.upper - mean) / sd);
  return {
    cp: twoSided ? (spec.upper - spec.lower) / (6 * sd) : NaN,
    cpk: Math.min(cpl, cpu),
    cpl,
    cpu,
    defectPpm: 1e6 * (below + above),
  };
}

/** The defect rate (ppm) of a centred two-sided normal process with index Cpk (= Cp): 2 Phi(-3 Cpk). */
export function centredDefectPpm(cpk: number): number {
  return 2e6 * normalCdf(-3 * cpk);
}
