/**
 * Reduction of num/den (integer polynomials from the elimination) to a canonical RationalFunction.
 * The gcd is the algebra core's modular algorithm (algebra/integer-poly.ts), whose first prime already
 * proves coprimality in the common case, so the elimination's large coefficients cost little here.
 */
import { Poly, RationalFunction } from '../algebra/index';
import type { IntPoly } from './int-poly';

/** num/den reduced and normalised (monic denominator). Throws nothing for a nonzero den. */
export function reduceToRational(num: IntPoly, den: IntPoly): RationalFunction {
  if (num.length === 0) return RationalFunction.ZERO;
  return RationalFunction.fromPolys(Poly.fromIntegers(num), Poly.fromIntegers(den));
}
