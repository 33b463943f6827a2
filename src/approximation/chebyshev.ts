/**
 * Chebyshev (type I) lowpass prototype: equiripple passband of `rippleDb`, the edge of the ripple band at
 * 1 rad/s; even orders have DC gain 10^(-rippleDb/20), odd orders 1 (the normalisation of
 * scipy.signal.cheb1ap).
 *
 * eps^2 = 10^(rippleDb/10) - 1, mu = asinh(1/eps)/N,
 * p_k = -sinh(mu) sin(theta_k) + j cosh(mu) cos(theta_k), theta_k = (2k - 1) pi / (2N)
 * [Huelsman, Active and Passive Analog Filter Design (1993), ch. 2; A. I. Zverev, Handbook of Filter
 * Synthesis (1967), ch. 2].
 */

import type { Complex } from '../algebra/complex.js';
import { conjugateRootSet, type Zpk } from './zpk.js';

/** 10^(db/10) - 1 without cancellation for small db. */
export function powerRatioMinusOne(db: number): number {
  return Math.expm1((db * Math.LN10) / 10);
}

/**
 * The poles of the Chebyshev I response with ripple factor `eps`, split into upper-half-plane poles and
 * the real pole of odd orders. Shared with the inverse Chebyshev prototype, whose poles are the
 * reciprocals of these with eps = 1/sqrt(10^(A/10) - 1).
 */
export function chebyshevPoleSet(order: number, eps: number): { upper: Complex[]; real: number[] } {
  const mu = Math.asinh(1 / eps) / order;
  const sh = Math.sinh(mu);
  const ch = Math.cosh(mu);
  const upper: Complex[] = [];
  for (let k = 1; 2 * k <= order; k++) {
    const theta = ((2 * k - 1) * Math.PI) / (2 * order);
    upper.push({ re: -sh * Math.sin(theta), im: ch * Math.cos(theta) });
  }
  return { upper, real: order % 2 === 1 ? [-sh] : [] };
}

export function chebyshevPrototype(order: number, rippleDb: number): Zpk {
  const { upper, real } = chebyshevPoleSet(order, Math.sqrt(powerRatioMinusOne(rippleDb)));
  let gain = order % 2 === 0 ? 10 ** (-rippleDb / 20) : 1; // even orders: H(0) = 1/sqrt(1 + eps^2)
  for (const p of upper) gain *= p.re * p.re + p.im * p.im; // prod(-p) over a conjugate pair
  for (const r of real) gain *= -r;
  return { zeros: [], poles: conjugateRootSet(upper, real), gain };
}
