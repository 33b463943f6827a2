/**
 * The reflection zeros of a prototype given only as zeros/poles/gain, for terminations lossless at the
 * passband maxima: there they are the frequencies of the maxima of |H(jw)|, i.e. the positive roots x
 * of the stationary polynomial N(x) (peak-gain.ts) at which |H|^2 reaches its peak. Those are simple
 * roots of an exact polynomial, so Newton in fixed point (precise-roots.ts) locates them to the working
 * precision, where the double roots of E(s)E(-s) - sigma^2 P(s)P(-s) give only ~sqrt(eps). The result
 * feeds the same route as the approximation's analytic zeros (characteristic-factorization.ts), which
 * checks that the poles fit; a response whose maxima are not reflection zeros on the axis (Bessel)
 * fails that check and falls back to reflection.ts.
 *
 * A kernel: returns undefined when the maxima cannot be classified.
 */
import { Poly } from '../algebra/poly';
import { Fraction } from '../algebra/rational';
import { aberthRoots } from '../algebra/roots';
import type { LowpassCharacteristic } from '../approximation/index';
import { normalizedMagnitude, stationaryPolynomial } from './peak-gain';
import { fixedToNumber, polishAllRoots, polishRealRoot, toFixedCoefficients } from './precise-roots';
import type { PrototypeZpk } from './prototype-polynomials';

/** |Im x| / |x| below which a float stationary point counts as real. */
const REAL_RELATIVE = 1e-6;
/**
 * |H|^2 within this fraction of the peak marks a maximum: the ripple valleys lie lower by the ripple
 * factor eps^2 (2.3e-4 for a 0.001 dB ripple), the maxima equal the peak to rounding.
 */
const AT_PEAK_RELATIVE = 1e-8;

/** A coefficient of N below this fraction of the terms it sums is rounding noise (as in reflection.ts). */
const NOISE_RELATIVE = new Fraction(1n, 10n ** 12n);

export function inferCharacteristic(zpk: PrototypeZpk, E: Poly, P: Poly, peak: number): LowpassCharacteristic | undefined {
  const n = E.degree;
  const N = stationaryPolynomial(E, P);
  // Low coefficients that are rounding noise (Butterworth: all but the top; the poles are doubles) would
  // give spurious stationary points near DC: zero them, as reflection.ts does for D.
  const noise = stationaryPolynomial(E, P, true);
  let k = 0;
  while (k < N.degree && N.coefficient(k).abs().compare(noise.coefficient(k).mul(NOISE_RELATIVE)) <= 0) k++;
  const stripped = Poly.fromCoefficients(N.coefficients.slice(k));
  if (stripped.degree < 1) return peak <= 1 + AT_PEAK_RELATIVE ? { originMultiplicity: n, reflectionOmegasRadPerS: [] } : undefined;
  const fixed = toFixedCoefficients(stripped);
  const omegas: number[] = [];
  const floatRoots = aberthRoots(stripped.toFloatCoefficients(), { polish: false });
  if (floatRoots.some((x) => !Number.isFinite(x.re) || !Number.isFinite(x.im))) return undefined;
  // All roots refined together in fixed point, then classified: the float roots of N near the band edge
  // are off by ~1e-3 or not even real at order 13 (measured), enough to miss the peaks.
  for (const z of polishAllRoots(fixed, floatRoots)) {
    const x = { re: fixedToNumber(z.re), im: fixedToNumber(z.im) };
    if (!(x.re > 0 && Math.abs(x.im) <= REAL_RELATIVE * x.re)) continue;
    const xp = fixedToNumber(polishRealRoot(fixed, z.re));
    if (!(xp > 0)) continue;
    const m = normalizedMagnitude(zpk, { re: 0, im: Math.sqrt(xp) });
    if (Math.abs((m * m) / peak - 1) > AT_PEAK_RELATIVE) continue;
    omegas.push(Math.sqrt(xp));
  }
  omegas.sort((a, b) => a - b);
  const originMultiplicity = n - 2 * omegas.length;
  if (originMultiplicity < 0 || omegas.some((w, i) => i > 0 && !(w > omegas[i - 1]))) return undefined;
  // DC is a maximum exactly when the origin is a reflection zero.
  if ((originMultiplicity > 0) !== (peak <= 1 + AT_PEAK_RELATIVE)) return undefined;
  return { originMultiplicity, reflectionOmegasRadPerS: omegas };
}
