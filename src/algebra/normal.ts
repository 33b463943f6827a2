/**
 * The standard normal distribution in Float64: erfc, the CDF, the survival function and the quantile.
 * Written here (not taken from a library) so that the risk integrals and statistical limits rest on
 * functions whose accuracy is measured in test/production/normal.test.ts against mpmath.
 *
 * erfc(x), x >= 0, by two classical expansions (M. Abramowitz and I. A. Stegun, Handbook of
 * Mathematical Functions, 1964, section 7.1):
 * - for x < {@link SERIES_LIMIT}: erf(x) = 2/sqrt(pi) exp(-x^2) sum_n 2^n x^(2n+1) / (1*3*...*(2n+1))
 *   (Eq. 7.1.6), a series of positive terms with no cancellation; erfc = 1 - erf loses nothing there
 *   because erfc(x) > 0.3 for x < 0.75.
 * - otherwise the Laplace continued fraction erfc(x) = exp(-x^2)/sqrt(pi) * 1/(x + (1/2)/(x + 1/(x +
 *   (3/2)/(x + 2/(x + ...))))) (Eq. 7.1.14), evaluated by the modified Lentz algorithm (W. H. Press et
 *   al., Numerical Recipes, 3rd ed., section 5.2). It converges for every x > 0 and faster as x grows.
 * exp(-x^2) is formed as exp(-h^2) exp(-(x-h)(x+h)) with h = x rounded to 1/16 (so h^2 is exact), which
 * keeps the relative error near eps where x^2 itself would be rounded (the trick of W. J. Cody's CALERF).
 * Measured error against mpmath: below 2e-15 relative over [-8, 27] (see the test).
 *
 * The quantile: P. J. Acklam's rational approximation (2003; relative error about 1.15e-9, coefficients
 * from memory, checked by the test), then two Halley steps on the tail probability, which bring it to a
 * few eps (Halley's method: J. M. Ortega and W. C. Rheinboldt, Iterative Solution of Nonlinear
 * Equations, 1970).
 *
 * Kernels: NaN in, NaN out; never throw.
 */

/** Below this, erfc from the erf series (fast there: about 30 terms at 0.75); above, the continued fraction. */
const SERIES_LIMIT = 0.75;
/** erfc underflows to zero beyond this (erfc(27.3) is about 5e-326, below the smallest subnormal). */
const ERFC_ZERO_BEYOND = 27.3;
/** Series and continued-fraction stop when the relative change is below this (half an ulp of 1). */
const CONVERGED = 1.1e-16;
/** Iteration cap: the continued fraction needs about 300 steps at x = 0.75 (measured), far fewer above. */
const MAX_ITERATIONS = 2000;
/** Lentz's guard against a zero denominator. */
const TINY = 1e-300;
const TWO_OVER_SQRT_PI = 1.1283791670955126;
const ONE_OVER_SQRT_PI = 0.5641895835477563;
const SQRT2 = Math.SQRT2;
const SQRT_2PI = 2.5066282746310002;

/** exp(-x^2) with the square split so that the large part is exact (x >= 0). */
function expMinusSquare(x: number): number {
  const h = Math.trunc(x * 16) / 16;
  return Math.exp(-h * h) * Math.exp(-(x - h) * (x + h));
}

/** exp(-z^2/2), split the same way on z itself (so Phi's tail does not inherit the rounding of z/sqrt 2). */
function expMinusHalfSquare(z: number): number {
  const h = Math.trunc(z * 16) / 16;
  return Math.exp(-0.5 * h * h) * Math.exp(-0.5 * (z - h) * (z + h));
}

/** erf by the series (A&S Eq. 7.1.6), for 0 <= x < SERIES_LIMIT. */
function erfSeries(x: number): number {
  const x2 = 2 * x * x;
  let term = x;
  let sum = x;
  for (let n = 1; n < MAX_ITERATIONS; n++) {
    term *= x2 / (2 * n + 1);
    sum += term;
    if (term < CONVERGED * sum) break;
  }
  return TWO_OVER_SQRT_PI * expMinusSquare(x) * sum;
}

/**
 * The scaled erfc, erfc(x) exp(x^2) (the Laplace continued fraction, A&S Eq. 7.1.14, modified Lentz),
 * for x >= SERIES_LIMIT. Its relative sensitivity to x is only about 1/x, unlike erfc's 2x^2.
 */
function erfcScaledContinuedFraction(x: number): number {
  // 1/(x + a1/(x + a2/(x + ...))) with a_n = n/2.
  let f = x;
  let c = x;
  let d = 0;
  for (let n = 1; n < MAX_ITERATIONS; n++) {
    const a = n / 2;
    d = x + a * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = x + a / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < CONVERGED) break;
  }
  return ONE_OVER_SQRT_PI / f;
}

/** The complementary error function erfc(x) = 1 - erf(x). */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x < 0) return 2 - erfc(-x);
  if (x >= ERFC_ZERO_BEYOND) return 0;
  if (x < SERIES_LIMIT) return 1 - erfSeries(x);
  return erfcScaledContinuedFraction(x) * expMinusSquare(x);
}

/** The error function erf(x); accurate in relative terms near zero (series), and odd. */
export function erf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  const a = Math.abs(x);
  const v = a < SERIES_LIMIT ? erfSeries(a) : 1 - erfc(a);
  return x < 0 ? -v : v;
}

/** The standard normal density phi(z). */
export function normalPdf(z: number): number {
  return Math.exp(-0.5 * z * z) / SQRT_2PI;
}

/**
 * The standard normal CDF Phi(z) = erfc(-z / sqrt 2) / 2, accurate in relative terms in the lower tail:
 * there the Gaussian factor is exp(-z^2/2) formed from z itself, and only the slowly varying scaled
 * erfc sees the rounded z / sqrt 2.
 */
export function normalCdf(z: number): number {
  return normalSf(-z);
}

/** The survival function 1 - Phi(z), accurate in relative terms in the upper tail. */
export function normalSf(z: number): number {
  if (Number.isNaN(z)) return NaN;
  const x = z / SQRT2;
  if (x < SERIES_LIMIT) return 0.5 * erfc(x);
  if (x >= ERFC_ZERO_BEYOND) return 0;
  return 0.5 * erfcScaledContinuedFraction(x) * expMinusHalfSquare(z);
}

// P. J. Acklam, "An algorithm for computing the inverse normal cumulative distribution function" (2003).
const A = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239];
const B = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1];
const C = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
const D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416];
/** Acklam's break point between the central and the tail approximations. */
const P_LOW = 0.02425;
/** Halley steps after Acklam's start: one takes 1e-9 to about 1e-16; the second is insurance. */
const HALLEY_STEPS = 2;

/** Acklam's starting value for the lower-tail quantile, 0 < q <= 0.5. */
function acklamLower(q: number): number {
  if (q < P_LOW) {
    const r = Math.sqrt(-2 * Math.log(q));
    return (((((C[0] * r + C[1]) * r + C[2]) * r + C[3]) * r + C[4]) * r + C[5]) / ((((D[0] * r + D[1]) * r + D[2]) * r + D[3]) * r + 1);
  }
  const t = q - 0.5;
  const r = t * t;
  return ((((((A[0] * r + A[1]) * r + A[2]) * r + A[3]) * r + A[4]) * r + A[5]) * t) / (((((B[0] * r + B[1]) * r + B[2]) * r + B[3]) * r + B[4]) * r + 1);
}

/**
 * The standard normal quantile Phi^-1(p). Computed on the smaller tail q = min(p, 1 - p) so that tiny
 * upper-tail probabilities given as 1 - p keep what accuracy 1 - p has. Returns -Infinity at 0,
 * Infinity at 1, NaN outside [0, 1].
 */
export function normalQuantile(p: number): number {
  if (!(p >= 0 && p <= 1)) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  const upper = p > 0.5;
  const q = upper ? 1 - p : p;
  let z = acklamLower(q);
  for (let i = 0; i < HALLEY_STEPS; i++) {
    // f(z) = Phi(z) - q; f' = phi(z); f''/f' = -z. Halley: z -= e / (1 + z e / 2), e = f / f'.
    const e = (normalCdf(z) - q) / normalPdf(z);
    if (!Number.isFinite(e)) break;
    z -= e / (1 + (z * e) / 2);
  }
  return upper ? -z : z;
}

/** The quantile of the upper tail: z with 1 - Phi(z) = q (accurate for tiny q). */
export function normalSfQuantile(q: number): number {
  return -normalQuantile(q);
}
