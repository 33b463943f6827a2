/**
 * The zeros of the characteristic function K(s) = F(s)/P(s) of a lowpass prototype, |H|^2 = 1/(1 + |K|^2)
 * up to the DC normalisation: the reflection zeros of the ladder that realises the prototype between
 * terminations lossless at the passband maxima (equal terminations for odd orders; V. Belevitch,
 * "Classical Network Theory", 1968, ch. 9). They are where they are from the approximation's own
 * formulas, exactly on the j-axis, which a numerical factorisation of E(s)E(-s) - P(s)P(-s) (double roots
 * there) finds only to about the square root of the rounding:
 * - Butterworth: |K|^2 = w^(2N): F = s^N.
 * - Chebyshev I: |K|^2 = eps^2 T_N(w)^2: zeros of T_N, w = cos((2i-1) pi/(2N)), taken as
 *   sin((N-2i+1) pi/(2N)) so the small ones keep their relative accuracy (plus w = 0 for odd N).
 * - Inverse Chebyshev: |K|^2 = 1/(eps^2 T_N(1/w)^2) = w^(2N) / (eps^2 (w^N T_N(1/w))^2): F = s^N, the
 *   zeros of w^N T_N(1/w) being the transmission zeros.
 * - Elliptic: the zeros of the elliptic rational function, sn(i K/N, k) (elliptic.ts).
 * - Bessel: no closed form (the zeros are off the axis); null.
 * (Huelsman, "Active and Passive Analog Filter Design", 1993, ch. 2, for the first three.)
 */

import { ellipticReflectionOmegas } from './elliptic.js';
import { lowpassPrototype, type LowpassPrototypeParams } from './prototype.js';

/** F(s) = s^originMultiplicity * prod_i (s^2 + reflectionOmegasRadPerS[i]^2), monic. */
export interface LowpassCharacteristic {
  readonly originMultiplicity: number;
  /** The positive reflection-zero frequencies in rad/s, ascending (each stands for the pair +-jw). */
  readonly reflectionOmegasRadPerS: readonly number[];
}

/**
 * The reflection zeros of the prototype `lowpassPrototype(p)` would return (the same validation), or
 * null for Bessel.
 *
 * @example
 * lowpassCharacteristic({ family: 'chebyshev', order: 3, passbandRippleDb: 1 })
 * // { originMultiplicity: 1, reflectionOmegasRadPerS: [0.8660254037844387] }  (cos(pi/6))
 */
export function lowpassCharacteristic(p: LowpassPrototypeParams): LowpassCharacteristic | null {
  lowpassPrototype(p); // validates exactly as the prototype does
  const n = p.order;
  switch (p.family) {
    case 'butterworth':
    case 'inverse-chebyshev':
      return { originMultiplicity: n, reflectionOmegasRadPerS: [] };
    case 'chebyshev': {
      const omegas: number[] = [];
      for (let i = Math.floor(n / 2); i >= 1; i--) omegas.push(Math.sin(((n - 2 * i + 1) * Math.PI) / (2 * n)));
      return { originMultiplicity: n % 2, reflectionOmegasRadPerS: omegas };
    }
    case 'elliptic':
      return { originMultiplicity: n % 2, reflectionOmegasRadPerS: ellipticReflectionOmegas(n, p.passbandRippleDb!, p.stopbandAttenuationDb!) };
    case 'bessel':
      return null;
  }
}
