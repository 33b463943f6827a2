/**
 * Global conformity-assessment risks (JCGM 106:2012, clause 9, "The role of measurement uncertainty in
 * conformity assessment"; equation numbers from memory): with the true value Y of a board's quantity
 * distributed as the process (prior) density g0(y) and the measured value Ym = Y + E, E ~ N(0, u^2),
 *   R_C (consumer's risk) = P(Y outside T, Ym inside A) = int_{y not in T} g0(y) P(A | y) dy
 *   R_P (producer's risk) = P(Y inside T, Ym outside A) = int_{y in T} g0(y) (1 - P(A | y)) dy
 * with P(A | y) = Phi((AU - y)/u) - Phi((AL - y)/u). The integrals are done numerically (adaptive
 * Gauss-Legendre, panels starting at the limits and at a few u around the acceptance limits, where the
 * integrand bends) for a normal process and for a histogram (uniform density within each bin), and
 * exactly against the empirical measure for Monte Carlo samples (the average of P(A | y_i) over the
 * non-conforming samples, and so on).
 * Identity checked by the tests: P(accept) = P(conform) - R_P + R_C.
 * Kernels: NaN inputs give NaN results, no throw.
 */
import type { Interval } from './interval';
import { normalCdf, normalPdf, normalSf } from '../algebra/normal';
import { integrate } from './quadrature';

/** The distribution of a test point's true value over the production population. */
export type ProcessModel =
  | { readonly kind: 'normal'; readonly mean: number; readonly sd: number }
  | { readonly kind: 'samples'; readonly values: ArrayLike<number> }
  /** Counts in bins [edges[i], edges[i+1]), the density uniform within a bin (edges ascending, one more than counts). */
  | { readonly kind: 'histogram'; readonly edges: ArrayLike<number>; readonly counts: ArrayLike<number> };

export interface GlobalRisks {
  /** P(true value inside the tolerance): the yield a perfect measurement would find. */
  readonly conformance: number;
  /** P(measured value inside the acceptance interval): the yield the test will report. */
  readonly acceptance: number;
  /** Global consumer's risk (probability of false acceptance), JCGM 106 9.5. */
  readonly consumerRisk: number;
  /** Global producer's risk (probability of false rejection), JCGM 106 9.5. */
  readonly producerRisk: number;
}

/** Integration reach of a normal process: beyond 40 sd the density is below 1e-347 (zero in doubles). */
const NORMAL_REACH_SD = 40;
/** Extra panel starts at these multiples of u around each acceptance limit (where P(A | y) steps). */
const STEP_BREAKS_U = [-6, -3, -1, 0, 1, 3, 6];
/** Relative accuracy asked of each integral: well inside what the fixture (mpmath, 40 digits) can show. */
const REL_TOL = 1e-11;

/** P(Ym in A | y), without cancellation far outside (complement forms); u = 0 gives the indicator. */
export function acceptanceGivenTrue(y: number, acceptance: Interval, u: number): number {
  if (acceptance.lower > acceptance.upper) return 0;
  if (!(u > 0)) return Number.isNaN(y) ? NaN : y >= acceptance.lower && y <= acceptance.upper ? 1 : 0;
  return Math.max(0, intervalProbability(y, u, acceptance));
}

/** P(Ym outside A | y) = Phi((AL - y)/u) + Phi((y - AU)/u), each a small tail where it matters. */
export function rejectionGivenTrue(y: number, acceptance: Interval, u: number): number {
  if (acceptance.lower > acceptance.upper) return 1;
  if (!(u > 0)) return Number.isNaN(y) ? NaN : y >= acceptance.lower && y <= acceptance.upper ? 0 : 1;
  const below = Number.isFinite(acceptance.lower) ? normalCdf((acceptance.lower - y) / u) : 0;
  const above = Number.isFinite(acceptance.upper) ? normalCdf((y - acceptance.upper) / u) : 0;
  return below + above;
}

/** The global risks of accepting by `acceptance` a quantity that must lie in `tolerance`, measured with standard uncertainty u. */
export function globalRisks(process: ProcessModel, tolerance: Interval, acceptance: Interval, u: number): GlobalRisks {
  switch (process.kind) {
    case 'normal':
      return normalRisks(process.mean, process.sd, tolerance, acceptance, u);
    case 'samples':
      return sampleRisks(process.values, tolerance, acceptance, u);
    case 'histogram':
      return histogramRisks(process.edges, process.counts, tolerance, acceptance, u);
  }
}

const NAN_RISKS: GlobalRisks = { conformance: NaN, acceptance: NaN, consumerRisk: NaN, producerRisk: NaN };

/**
 * A histogram (e.g. tolerance's streamed Monte Carlo bins): in each bin the density is count / (N w);
 * the integrals over the bin's parts inside and outside the tolerance are done by the same quadrature.
 */
function histogramRisks(edges: ArrayLike<number>, counts: ArrayLike<number>, t: Interval, a: Interval, u: number): GlobalRisks {
  if (edges.length !== counts.length + 1 || counts.length === 0) return NAN_RISKS;
  let total = 0;
  for (let i = 0; i < counts.length; i++) total += counts[i];
  if (!(total > 0)) return NAN_RISKS;
  const breaks: number[] = [t.lower, t.upper];
  if (u > 0) for (const limit of [a.lower, a.upper]) if (Number.isFinite(limit)) for (const k of STEP_BREAKS_U) breaks.push(limit + k * u);
  const accept = (y: number) => acceptanceGivenTrue(y, a, u);
  const reject = (y: number) => rejectionGivenTrue(y, a, u);
  let conformance = 0;
  let consumerRisk = 0;
  let producerRisk = 0;
  for (let i = 0; i < counts.length; i++) {
    const lo = edges[i];
    const hi = edges[i + 1];
    if (!(hi > lo) || counts[i] === 0) continue;
    const density = counts[i] / (total * (hi - lo));
    const inLo = Math.max(lo, t.lower);
    const inHi = Math.min(hi, t.upper);
    if (inHi > inLo) {
      conformance += density * (inHi - inLo);
      producerRisk += density * integrate(reject, inLo, inHi, breaks, REL_TOL);
    }
    if (t.lower > lo) consumerRisk += density * integrate(accept, lo, Math.min(hi, t.lower), breaks, REL_TOL);
    if (t.upper < hi) consumerRisk += density * integrate(accept, Math.max(lo, t.upper), hi, breaks, REL_TOL);
  }
  return { conformance, acceptance: conformance - producerRisk + consumerRisk, consumerRisk, producerRisk };
}

function sampleRisks(values: ArrayLike<number>, t: Interval, a: Interval, u: number): GlobalRisks {
  let n = 0;
  let conform = 0;
  let rc = 0;
  let rp = 0;
  for (let i = 0; i < values.length; i++) {
    const y = values[i];
    if (Number.isNaN(y)) continue; // an unsolvable board: counted by the caller, not here
    n++;
    if (y >= t.lower && y <= t.upper) {
      conform++;
      rp += rejectionGivenTrue(y, a, u);
    } else {
      rc += acceptanceGivenTrue(y, a, u);
    }
  }
  if (n === 0) return NAN_RISKS;
  return { conformance: conform / n, acceptance: (conform - rp + rc) / n, consumerRisk: rc / n, producerRisk: rp / n };
}

function normalRisks(mean: number, sd: number, t: Interval, a: Interval, u: number): GlobalRisks {
  if (!Number.isFinite(mean) || !(sd >= 0) || !(u >= 0) || Number.isNaN(t.lower) || Number.isNaN(t.upper)) return NAN_RISKS;
  if (sd === 0) {
    const inT = mean >= t.lower && mean <= t.upper;
    const pa = acceptanceGivenTrue(mean, a, u);
    return { conformance: inT ? 1 : 0, acceptance: pa, consumerRisk: inT ? 0 : pa, producerRisk: inT ? 1 - pa : 0 };
  }
  const conformance = intervalProbability(mean, sd, t);
  const combined = Math.hypot(sd, u); // Ym ~ N(mean, sd^2 + u^2)
  const acceptance = a.lower > a.upper ? 0 : intervalProbability(mean, combined, a);
  const lo = mean - NORMAL_REACH_SD * sd;
  const hi = mean + NORMAL_REACH_SD * sd;
  const breaks = [mean, mean - 3 * sd, mean + 3 * sd, t.lower, t.upper];
  if (u > 0) {
    for (const limit of [a.lower, a.upper]) if (Number.isFinite(limit)) for (const k of STEP_BREAKS_U) breaks.push(limit + k * u);
  }
  const density = (y: number) => normalPdf((y - mean) / sd) / sd;
  const accept = (y: number) => density(y) * acceptanceGivenTrue(y, a, u);
  const reject = (y: number) => density(y) * rejectionGivenTrue(y, a, u);
  let consumerRisk = 0;
  if (t.lower > lo) consumerRisk += integrate(accept, lo, Math.min(t.lower, hi), breaks, REL_TOL);
  if (t.upper < hi) consumerRisk += integrate(accept, Math.max(t.upper, lo), hi, breaks, REL_TOL);
  const producerRisk = integrate(reject, Math.max(t.lower, lo), Math.min(t.upper, hi), breaks, REL_TOL);
  return { conformance, acceptance, consumerRisk, producerRisk };
}

/** P(lower <= X <= upper) for X ~ N(mean, sd), in the complement form on the side where it is small. */
export function intervalProbability(mean: number, sd: number, i: Interval): number {
  if (i.lower > i.upper) return 0;
  const zl = (i.lower - mean) / sd;
  const zu = (i.upper - mean) / sd;
  if (zl > 0) return normalSf(zl) - normalSf(zu); // both in the upper tail
  if (zu < 0) return normalCdf(zu) - normalCdf(zl); // both in the lower tail
  return 1 - normalCdf(zl) - normalSf(zu);
}
