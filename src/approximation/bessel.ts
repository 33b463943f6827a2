/**
 * Bessel (Thomson) lowpass prototype: maximally flat group delay. Same normalisations as
 * scipy.signal.besselap:
 * - `'delay'`: the poles are the roots of the reverse Bessel polynomial
 *   theta_N(s) = sum_k (2N - k)! / (2^(N-k) k! (N - k)!) s^k, gain theta_N(0), so H(0) = 1 and the group
 *   delay at DC is 1 s [W. E. Thomson, "Delay networks having maximally flat frequency characteristics",
 *   Proc. IEE 96 (1949) 487-490; Huelsman (1993), ch. 2];
 * - `'magnitude'`: scaled so that |H(j)| = 1/sqrt(2) (-3.01 dB at 1 rad/s), found by bisection on the
 *   monotone magnitude;
 * - `'phase'`: scaled by theta_N(0)^(-1/N), so the denominator is monic with constant term 1 and the
 *   gain is 1; the phase then tends to that of a delay of 1 s at high frequency, -N pi/4 at 1 rad/s
 *   asymptotically (scipy's `norm='phase'`).
 *
 * The coefficients are exact integers (BigInt, all below 2^53 up to N = 15, so exact in Float64 too); the
 * roots come from {@link polynomialRoots} and are made exactly conjugate afterwards.
 */

import type { Complex } from '../algebra/complex.js';
import { aberthRoots as polynomialRoots, polishRoot } from '../algebra/roots';
import { compareRoots, conjugateRootSet, frequencyAtAttenuation, type Zpk } from './zpk.js';

export type BesselNormalization = 'delay' | 'magnitude' | 'phase';

/** theta_N coefficients, ascending: a_k = (2N - k)! / (2^(N-k) k! (N - k)!), exact. */
export function reverseBesselCoefficients(order: number): bigint[] {
  const coefficients: bigint[] = [];
  // a_N = 1; a_{k-1} = a_k * (2N - k + 1) * k / (2 (N - k + 1))  (ratio of consecutive terms)
  let a = 1n;
  const n = BigInt(order);
  const descending: bigint[] = [a];
  for (let k = n; k >= 1n; k--) {
    a = (a * (2n * n - k + 1n) * k) / (2n * (n - k + 1n));
    descending.push(a);
  }
  for (let i = descending.length - 1; i >= 0; i--) coefficients.push(descending[i]);
  return coefficients;
}

/** -10*log10(2): the -3.01 dB point of the magnitude normalisation, exactly |H| = 1/sqrt(2). */
const HALF_POWER_DB = 10 * Math.log10(2);

export function besselPrototype(order: number, normalization: BesselNormalization): Zpk {
  const exact = reverseBesselCoefficients(order);
  const coefficients = exact.map((c) => Number(c));
  const a0 = coefficients[0];
  const roots = polynomialRoots(coefficients).sort(compareRoots);
  // Pair the i-th root from the top with the i-th from the bottom; average them into one upper root and
  // polish it again, so that the pair is exactly conjugate. Odd orders: the middle root is real.
  const half = Math.floor(order / 2);
  const upper: Complex[] = [];
  for (let i = 0; i < half; i++) {
    const top = roots[order - 1 - i];
    const bottom = roots[i];
    upper.push(polishRoot(coefficients, { re: (top.re + bottom.re) / 2, im: (top.im - bottom.im) / 2 }));
  }
  const real: number[] = [];
  if (order % 2 === 1) real.push(polishRoot(coefficients, { re: roots[half].re, im: 0 }).re);
  const delayNormalised: Zpk = { zeros: [], poles: conjugateRootSet(upper, real), gain: a0 };
  if (normalization === 'delay') return delayNormalised;

  const scale =
    normalization === 'phase'
      ? 10 ** (-Math.log10(a0) / order) // theta_N(0)^(-1/N)
      : 1 / frequencyAtAttenuation(delayNormalised, HALF_POWER_DB);
  return {
    zeros: [],
    poles: conjugateRootSet(
      upper.map((p) => ({ re: p.re * scale, im: p.im * scale })),
      real.map((r) => r * scale),
    ),
    gain: normalization === 'phase' ? 1 : a0 * scale ** order,
  };
}
