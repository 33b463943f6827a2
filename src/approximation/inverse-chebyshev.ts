/**
 * Inverse Chebyshev (Chebyshev type II) lowpass prototype: flat passband, equiripple stopband at least
 * `attenuationDb` down, the stopband edge at 1 rad/s, DC gain 1 (the normalisation of
 * scipy.signal.cheb2ap).
 *
 * The poles are the reciprocals of the Chebyshev I poles for eps = 1/sqrt(10^(A/10) - 1), and the zeros
 * are +-j / cos(theta_k), theta_k = (2k - 1) pi / (2N) (the reciprocals of the zeros of T_N)
 * [Huelsman, Active and Passive Analog Filter Design (1993), ch. 2; Zverev (1967), ch. 2].
 */

import type { Complex } from '../algebra/complex.js';
import { chebyshevPoleSet, powerRatioMinusOne } from './chebyshev.js';
import { conjugateRootSet, type Zpk } from './zpk.js';

export function inverseChebyshevPrototype(order: number, attenuationDb: number): Zpk {
  const { upper: cheb, real: chebReal } = chebyshevPoleSet(order, 1 / Math.sqrt(powerRatioMinusOne(attenuationDb)));
  const upperPoles: Complex[] = cheb.map((q) => {
    const m2 = q.re * q.re + q.im * q.im; // 1/q = conj(q)/|q|^2, still in the upper half-plane
    return { re: q.re / m2, im: q.im / m2 };
  });
  const realPoles = chebReal.map((r) => 1 / r);
  const upperZeros: Complex[] = [];
  for (let k = 1; 2 * k <= order; k++) {
    upperZeros.push({ re: 0, im: 1 / Math.cos(((2 * k - 1) * Math.PI) / (2 * order)) });
  }
  // gain = prod(-p)/prod(-z), so that H(0) = 1
  let gain = 1;
  for (let i = 0; i < upperPoles.length; i++) {
    const p = upperPoles[i];
    gain *= (p.re * p.re + p.im * p.im) / (upperZeros[i].im * upperZeros[i].im);
  }
  for (const r of realPoles) gain *= -r;
  return { zeros: conjugateRootSet(upperZeros), poles: conjugateRootSet(upperPoles, realPoles), gain };
}
