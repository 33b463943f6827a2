/** fast-check generators for exact polynomials and rational functions with small rational coefficients. */
import fc from 'fast-check';
import { Fraction } from '../../src/algebra/rational';
import { Poly } from '../../src/algebra/poly';
import { RationalFunction } from '../../src/algebra/rational-function';

/** Small rationals, zero and negatives included. */
export const smallRational: fc.Arbitrary<Fraction> = fc
  .tuple(fc.integer({ min: -9, max: 9 }), fc.integer({ min: 1, max: 6 }))
  .map(([n, d]) => new Fraction(BigInt(n), BigInt(d)));

export const positiveRational: fc.Arbitrary<Fraction> = fc
  .tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 6 }))
  .map(([n, d]) => new Fraction(BigInt(n), BigInt(d)));

export const poly = (maxDegree = 4): fc.Arbitrary<Poly> =>
  fc.array(smallRational, { maxLength: maxDegree + 1 }).map((c) => Poly.fromCoefficients(c));

export const nonzeroPoly = (maxDegree = 4): fc.Arbitrary<Poly> => poly(maxDegree).filter((p) => !p.isZero());

export const rationalFunction = (maxDegree = 3): fc.Arbitrary<RationalFunction> =>
  fc.tuple(poly(maxDegree), nonzeroPoly(maxDegree)).map(([n, d]) => RationalFunction.fromPolys(n, d));

export const nonzeroRationalFunction = (maxDegree = 3): fc.Arbitrary<RationalFunction> =>
  fc.tuple(nonzeroPoly(maxDegree), nonzeroPoly(maxDegree)).map(([n, d]) => RationalFunction.fromPolys(n, d));
