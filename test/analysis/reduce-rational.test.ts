/**
 * The fast reduction of eliminated num/den pairs: the same canonical RationalFunction as the general
 * reduction in algebra/, with and without common factors (fast-check over random integer polynomials).
 */
import { expect, it } from 'vitest';
import fc from 'fast-check';
import { Poly, RationalFunction } from '../../src/algebra/index';
import { reduceToRational } from '../../src/analysis/reduce-rational';
import { ipMul } from '../../src/analysis/int-poly';

const intPoly = (maxDeg: number) =>
  fc.array(fc.bigInt({ min: -(10n ** 30n), max: 10n ** 30n }), { minLength: 1, maxLength: maxDeg + 1 }).filter((a) => a[a.length - 1] !== 0n);

it('equals RationalFunction.fromPolys for coprime and non-coprime pairs', () => {
  fc.assert(
    fc.property(intPoly(6), intPoly(6), intPoly(3), (a, b, c) => {
      const expected = RationalFunction.fromPolys(Poly.fromCoefficients(a), Poly.fromCoefficients(b));
      expect(reduceToRational(a, b).equals(expected)).toBe(true);
      // with a common factor c
      expect(reduceToRational(ipMul(a, c), ipMul(b, c)).equals(expected)).toBe(true);
    }),
    { numRuns: 60 },
  );
});

it('the zero numerator gives the zero function; a constant denominator is normalised', () => {
  expect(reduceToRational([], [3n, 1n]).isZero()).toBe(true);
  expect(reduceToRational([2n, 4n], [6n]).equals(RationalFunction.fromCoefficients(['1/3', '2/3'], [1]))).toBe(true);
});
