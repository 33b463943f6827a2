/**
 * The three part distributions: their standard uncertainties (for linear propagation, JCGM 100:2008)
 * and their sampling (for Monte Carlo, JCGM 101:2008 clause 6.4 and annex C). All values are relative
 * deviations; `tolerance` is the half-width a of the permitted interval.
 *
 * Sampling draws only from the pure-rand generator passed in, in a fixed order, so a trial's values
 * depend on nothing but the generator's state (see random.ts for how trials get their generators).
 */
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import type { ResolvedDistribution } from './spec';
import { erf } from '../algebra/normal';

/** sqrt(3): the standard deviation of a rectangular distribution of half-width a is a / sqrt(3) (GUM 4.3.7). */
const SQRT3 = Math.sqrt(3);

/** P(|Z| <= k) for a standard normal Z: erf(k / sqrt 2) (algebra/normal.ts). */
export function normalCentralMass(k: number): number {
  return erf(k / Math.SQRT2);
}

/**
 * The standard deviation of a standard normal truncated to [-k, k]: by parts,
 * E[Z^2 | |Z| <= k] = 1 - 2 k phi(k) / P(|Z| <= k) (e.g. N. L. Johnson, S. Kotz, N. Balakrishnan,
 * "Continuous Univariate Distributions", vol. 1, 2nd ed., 1994, section 10.1; from memory).
 */
export function truncatedNormalStandardDeviation(k: number): number {
  const phiK = Math.exp(-0.5 * k * k) / Math.sqrt(2 * Math.PI);
  return Math.sqrt(1 - (2 * k * phiK) / normalCentralMass(k));
}

/** The relative standard uncertainty u of a distribution (GUM 4.3.7 rectangular, 4.3.4 normal). */
export function standardUncertainty(d: ResolvedDistribution): number {
  switch (d.distribution) {
    case 'uniform':
      return d.tolerance / SQRT3; // u = a / sqrt(3)
    case 'gaussian':
      return d.tolerance / d.sigmaK; // u = a / k
    case 'truncated-gaussian':
      return (d.tolerance / d.sigmaK) * truncatedNormalStandardDeviation(d.sigmaK);
  }
}

/** A uniform deviate in (0, 1]: Box-Muller takes its logarithm. */
function uniformOpen0(rng: RandomGenerator): number {
  return 1 - uniformFloat64(rng);
}

/**
 * A standard normal deviate by the Box-Muller transform (G. E. P. Box, M. E. Muller, Ann. Math.
 * Statist. 29(2), 1958), the cosine branch only, so every normal costs exactly two uniforms.
 */
export function sampleStandardNormal(rng: RandomGenerator): number {
  const r = Math.sqrt(-2 * Math.log(uniformOpen0(rng)));
  return r * Math.cos(2 * Math.PI * uniformFloat64(rng));
}

/** One relative deviation from the distribution (JCGM 101 6.4.2 rectangular, 6.4.7 Gaussian; truncation by rejection). */
export function sampleDeviation(rng: RandomGenerator, d: ResolvedDistribution): number {
  switch (d.distribution) {
    case 'uniform':
      return d.tolerance * (2 * uniformFloat64(rng) - 1);
    case 'gaussian':
      return (d.tolerance / d.sigmaK) * sampleStandardNormal(rng);
    case 'truncated-gaussian': {
      // acceptance P(|Z| <= k) >= 0.38 for k >= 0.5 (spec.ts MIN_SIGMA_K), so the loop ends quickly
      let z = sampleStandardNormal(rng);
      while (Math.abs(z) > d.sigmaK) z = sampleStandardNormal(rng);
      return (d.tolerance / d.sigmaK) * z;
    }
  }
}
