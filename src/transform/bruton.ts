/**
 * The Bruton transform (L. T. Bruton, "Network transfer functions using the concept of frequency-
 * dependent negative resistance", IEEE Trans. Circuit Theory CT-16(3), 1969): every impedance of the
 * network is multiplied by k/s. A voltage transfer function is a ratio of impedances, so it is
 * unchanged. NetworkElement by element (k in rad/s, exact):
 *   R -> C = 1/(k R)        (k R / s)
 *   L -> R = k L            (s L * k/s)
 *   C -> D = C / k          (k/(s^2 C) = 1/(s^2 D))
 * An FDNR would become an element of impedance k/(s^3 D), which does not exist: refused.
 */
import { Fraction, toFraction, type RationalLike } from '../algebra/rational';
import { InvalidInputError } from '../errors';
import { element, mapLadder, type Network, type NetworkLadder } from './network';

export function brutonTransform(l: NetworkLadder, kRadPerS: RationalLike = 1): NetworkLadder {
  const k: Fraction = toFraction(kRadPerS, 'kRadPerS');
  if (!(k.s > 0n && k.n > 0n)) throw new InvalidInputError('OUT_OF_RANGE', 'kRadPerS', typeof kRadPerS === 'object' ? kRadPerS.toString() : kRadPerS, 'must be greater than zero');
  return mapLadder(l, (e): Network => {
    switch (e.kind) {
      case 'R':
        return element('C', k.mul(e.value).inverse(), e.origin);
      case 'L':
        return element('R', k.mul(e.value), e.origin);
      case 'C':
        return element('D', e.value.div(k), e.origin);
      case 'D':
        throw new InvalidInputError('INVALID_ARGUMENT', e.origin, 'D', 'an FDNR has no image under the Bruton transform (k/(s^3 D) is no element)');
    }
  });
}
