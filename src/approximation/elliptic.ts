/**
 * Elliptic (Cauer) lowpass prototype: equiripple passband of `rippleDb` with its edge at 1 rad/s,
 * equiripple stopband at least `attenuationDb` down; even orders have DC gain 10^(-rippleDb/20) (the
 * normalisation of scipy.signal.ellipap).
 *
 * Method: S. J. Orfanidis, "Lecture notes on elliptic filter design" (2006), sec. 3-4 (the same route as
 * scipy.signal.ellipap; equation numbers below are those of the lecture notes' analog design section):
 *   k1 = eps / sqrt(10^(A/10) - 1) (discrimination modulus), k from the degree equation (Eq. (49)),
 *   zeros  j / (k sn(i K / N, k)) for i = N-1, N-3, ... > 0,
 *   poles  j cd((i/N - j v0) K, k), expanded by the addition theorems [Abramowitz-Stegun 16.17] into
 *          -(cn dn sn' cn' + j sn dn') / (1 - dn^2 sn'^2), primed functions of (v0 K, k'),
 *   v0 K = K(k) sc^-1(1/eps, k1') / (N K(k1)).
 */

import type { Complex } from '../algebra/complex.js';
import { powerRatioMinusOne } from './chebyshev.js';
import { completeEllipticK, ellipticDegree, inverseJacobiSc, jacobiElliptic } from './elliptic-functions.js';
import { conjugateRootSet, type Zpk } from './zpk.js';

/**
 * sn, cn, dn at u = i K / N. Past K/2 they come from the reflected argument x = (N - i) K / N, formed
 * without cancellation, through sn(K - x) = cd(x), cn(K - x) = k' sd(x), dn(K - x) = k' nd(x)
 * [Abramowitz-Stegun 16.8.1]: cn is small there and would otherwise carry the absolute rounding error of
 * the AGM phase as a large relative error.
 */
function jacobiNearQuarterPeriod(i: number, order: number, capK: number, k: number, kp: number) {
  if (2 * i <= order) return jacobiElliptic((i * capK) / order, k, kp);
  const { sn, cn, dn } = jacobiElliptic(((order - i) * capK) / order, k, kp);
  return { sn: cn / dn, cn: (kp * sn) / dn, dn: kp / dn };
}

/** The moduli of an elliptic design: ripple factor eps, discrimination k1 (with k1'), selectivity k (with k'), K(k). */
function ellipticModuli(order: number, rippleDb: number, attenuationDb: number) {
  const epsSq = powerRatioMinusOne(rippleDb);
  const stopSq = powerRatioMinusOne(attenuationDb);
  const eps = Math.sqrt(epsSq);
  const k1 = Math.sqrt(epsSq / stopSq);
  const k1p = Math.sqrt((stopSq - epsSq) / stopSq); // sqrt(1 - k1^2), complement form
  const { k, kp } = ellipticDegree(order, k1, k1p);
  return { eps, k1, k1p, k, kp, capK: completeEllipticK(k, kp) };
}

/**
 * The positive zeros of the elliptic rational function R_N(w) (the reflection zeros of the equally
 * terminated ladder: the passband frequencies of zero loss), ascending: sn(i K/N, k) for
 * i = N-1, N-3, ... > 0 [O, sec. 3: R_N has zeros at cd((2l-1) K/N) = sn((N-2l+1) K/N) and poles at
 * 1/(k cd(...)), so each reflection zero is 1/(k w_z) of its transmission zero w_z]. Odd orders also
 * have a zero at w = 0 (i = 0), not listed.
 */
export function ellipticReflectionOmegas(order: number, rippleDb: number, attenuationDb: number): number[] {
  const { k, kp, capK } = ellipticModuli(order, rippleDb, attenuationDb);
  const out: number[] = [];
  for (let i = 1 + (order % 2); i < order; i += 2) out.push(jacobiNearQuarterPeriod(i, order, capK, k, kp).sn);
  return out;
}

export function ellipticPrototype(order: number, rippleDb: number, attenuationDb: number): Zpk {
  const { eps, k1, k1p, k, kp, capK } = ellipticModuli(order, rippleDb, attenuationDb);
  const v0 = (capK * inverseJacobiSc(1 / eps, k1p, k1)) / (order * completeEllipticK(k1, k1p)); // v0 K
  const { sn: sv, cn: cv, dn: dv } = jacobiElliptic(v0, kp, k);

  const upperZeros: Complex[] = [];
  const upperPoles: Complex[] = [];
  const realPoles: number[] = [];
  if (order % 2 === 1) realPoles.push(-sv / cv); // i = 0: sn = 0, cn = dn = 1
  for (let i = 1 + (order % 2); i < order; i += 2) {
    const { sn: s, cn: c, dn: d } = jacobiNearQuarterPeriod(i, order, capK, k, kp);
    upperZeros.push({ re: 0, im: 1 / (k * s) }); // j / (k sn)
    const ds = d * sv;
    const den = (1 - ds) * (1 + ds);
    upperPoles.push({ re: -(c * d * sv * cv) / den, im: (s * dv) / den }); // conj of -(c d sv cv + j s dv)/den
  }

  // gain = prod(-p)/prod(-z); even orders scaled to H(0) = 1/sqrt(1 + eps^2)
  let gain = order % 2 === 0 ? 10 ** (-rippleDb / 20) : 1;
  for (let i = 0; i < upperPoles.length; i++) {
    const p = upperPoles[i];
    gain *= (p.re * p.re + p.im * p.im) / (upperZeros[i].im * upperZeros[i].im);
  }
  for (const r of realPoles) gain *= -r;
  return { zeros: conjugateRootSet(upperZeros), poles: conjugateRootSet(upperPoles, realPoles), gain };
}
