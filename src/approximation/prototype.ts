/**
 * The entry point of the approximation stage: a validated lowpass prototype in zeros/poles/gain form,
 * normalised as scipy.signal's analog prototypes (see DESIGN.md, conventions):
 * - butterworth: -3.01 dB at 1 rad/s (buttap);
 * - chebyshev: the edge of the ripple band at 1 rad/s, even orders with DC gain 10^(-ripple/20) (cheb1ap);
 * - inverse-chebyshev: the stopband edge at 1 rad/s (cheb2ap);
 * - elliptic: the passband edge at 1 rad/s, even orders with DC gain 10^(-ripple/20) (ellipap);
 * - bessel: `normalization` 'delay' (the default: 1 s group delay at DC), 'magnitude' (-3.01 dB at
 *   1 rad/s) or 'phase' (besselap's norm='delay' | 'mag' | 'phase').
 *
 * Roots are sorted by imaginary part, then real part; conjugate pairs are bit-exact conjugates and real
 * roots have `im === 0`. Fields that a family does not use (a ripple for Butterworth...) are ignored.
 */

import { InvalidInputError, UnrealizableError, requireInteger, requireOneOf, requirePositive } from '../errors.js';
import { besselPrototype, type BesselNormalization } from './bessel.js';
import { butterworthPrototype } from './butterworth.js';
import { chebyshevPrototype } from './chebyshev.js';
import { ellipticPrototype } from './elliptic.js';
import { inverseChebyshevPrototype } from './inverse-chebyshev.js';
import type { Zpk } from './zpk.js';

export const APPROXIMATION_FAMILIES = ['butterworth', 'chebyshev', 'inverse-chebyshev', 'elliptic', 'bessel'] as const;
export type ApproximationFamily = (typeof APPROXIMATION_FAMILIES)[number];
export const BESSEL_NORMALIZATIONS: readonly BesselNormalization[] = ['delay', 'magnitude', 'phase'];

/**
 * Highest order supported. Above it the float roots (Bessel) and the ladder element values downstream
 * lose more digits than a 1 % part tolerance can hide, and no practical GIC ladder is built that long.
 */
export const MAX_ORDER = 15;
/** Lowest elliptic order: an order-1 elliptic response has no stopband zero and is Chebyshev order 1. */
export const MIN_ELLIPTIC_ORDER = 2;

export interface LowpassPrototypeParams {
  family: ApproximationFamily;
  order: number;
  /** Passband ripple in dB (> 0): chebyshev, elliptic. */
  passbandRippleDb?: number;
  /** Minimum stopband attenuation in dB (> 0, and above the ripple for elliptic): inverse-chebyshev, elliptic. */
  stopbandAttenuationDb?: number;
  /** Bessel only; default 'delay'. */
  normalization?: BesselNormalization;
}

/** Families whose order can be 1. */
function minimumOrder(family: ApproximationFamily): number {
  return family === 'elliptic' ? MIN_ELLIPTIC_ORDER : 1;
}

/**
 * Throws unless the attenuation exceeds the ripple (a stopband at least as high as the passband floor
 * asks for nothing, and the elliptic discrimination modulus would be >= 1). Shared with order estimation.
 */
export function requireAttenuationAboveRipple(passbandRippleDb: number, stopbandAttenuationDb: number): void {
  if (!(stopbandAttenuationDb > passbandRippleDb)) {
    throw new UnrealizableError(
      'UNREALIZABLE',
      'stopbandAttenuationDb',
      { passbandRippleDb, stopbandAttenuationDb },
      `stopband attenuation ${stopbandAttenuationDb} dB must exceed the passband ripple ${passbandRippleDb} dB`,
    );
  }
}

/**
 * The normalised lowpass prototype of `family` and `order`.
 *
 * @example
 * const { poles, gain } = lowpassPrototype({ family: 'butterworth', order: 2 });
 * // poles = [{ re: -0.7071..., im: -0.7071... }, { re: -0.7071..., im: 0.7071... }], gain = 1
 */
export function lowpassPrototype(p: LowpassPrototypeParams): Zpk {
  if (typeof p !== 'object' || p === null) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'prototype', p, 'must be an object');
  }
  const family = requireOneOf(p.family, 'family', APPROXIMATION_FAMILIES);
  const order = requireInteger(p.order, 'order', minimumOrder(family), MAX_ORDER);
  switch (family) {
    case 'butterworth':
      return butterworthPrototype(order);
    case 'chebyshev':
      return chebyshevPrototype(order, requirePositive(p.passbandRippleDb, 'passbandRippleDb'));
    case 'inverse-chebyshev':
      return inverseChebyshevPrototype(order, requirePositive(p.stopbandAttenuationDb, 'stopbandAttenuationDb'));
    case 'elliptic': {
      const rippleDb = requirePositive(p.passbandRippleDb, 'passbandRippleDb');
      const attenuationDb = requirePositive(p.stopbandAttenuationDb, 'stopbandAttenuationDb');
      requireAttenuationAboveRipple(rippleDb, attenuationDb);
      return ellipticPrototype(order, rippleDb, attenuationDb);
    }
    case 'bessel':
      return besselPrototype(
        order,
        p.normalization === undefined ? 'delay' : requireOneOf(p.normalization, 'normalization', BESSEL_NORMALIZATIONS),
      );
  }
}
