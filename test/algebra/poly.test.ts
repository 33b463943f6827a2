import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Poly } from '../../src/algebra/poly';
import { Fraction } from '../../src/algebra/rational';
import { ArithmeticError } from '../../src/errors';
import { nonzeroPoly, poly, smallRational } from './arbitraries';

describe('Poly: Euclidean division', () => {
  it('a = q*b + r with deg r < deg b (property)', () => {
    fc.assert(
      fc.property(poly(6), nonzeroPoly(4), (a, b) => {
        const { quotient, remainder } = a.divmod(b);
        expect(quotient.mul(b).add(remainder).equals(a)).toBe(true);
        expect(remainder.degree).toBeLessThan(b.degree);
      }),
      { numRuns: 300 },
    );
  });

  it('division by the zero polynomial is a DIVISION_BY_ZERO ArithmeticError', () => {
    try {
      Poly.S.divmod(Poly.ZERO);
      throw new Error('expected a throw');
    } catch (e) {
      expect(e).toBeInstanceOf(ArithmeticError);
      expect((e as ArithmeticError).code).toBe('DIVISION_BY_ZERO');
    }
  });
});

describe('Poly: gcd', () => {
  it('is monic and divides both (property)', () => {
    fc.assert(
      fc.property(poly(5), poly(5), (a, b) => {
        fc.pre(!a.isZero() || !b.isZero());
        const g = a.gcd(b);
        expect(g.leading.equals(new Fraction(1))).toBe(true);
        expect(a.divmod(g).remainder.isZero()).toBe(true);
        expect(b.divmod(g).remainder.isZero()).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('gcd(a*c, b*c) = gcd(a, b) * monic(c) (property)', () => {
    fc.assert(
      fc.property(poly(3), poly(3), nonzeroPoly(3), (a, b, c) => {
        fc.pre(!a.isZero() || !b.isZero());
        expect(a.mul(c).gcd(b.mul(c)).equals(a.gcd(b).mul(c.monic()))).toBe(true);
      }),
      { numRuns: 300 },
    );
  });

  it('gcd with a common factor built from known roots finds exactly that factor', () => {
    const common = Poly.fromRoots(['1/2', -3]);
    const a = common.mul(Poly.fromRoots([5]));
    const b = common.mul(Poly.fromRoots([7, '-1/3']));
    expect(a.gcd(b).equals(common)).toBe(true);
  });

  it('gcd(a, 0) = monic(a); gcd(0, 0) = 0', () => {
    const a = Poly.fromCoefficients([2, 4, 6]);
    expect(a.gcd(Poly.ZERO).equals(a.monic())).toBe(true);
    expect(Poly.ZERO.gcd(a).equals(a.monic())).toBe(true);
    expect(Poly.ZERO.gcd(Poly.ZERO).isZero()).toBe(true);
  });
});

describe('Poly: ring laws and evaluation', () => {
  it('evaluation is a ring homomorphism and composition evaluates as nesting (property)', () => {
    fc.assert(
      fc.property(poly(4), poly(4), smallRational, (a, b, x) => {
        expect(a.add(b).evaluate(x).equals(a.evaluate(x).add(b.evaluate(x)))).toBe(true);
        expect(a.mul(b).evaluate(x).equals(a.evaluate(x).mul(b.evaluate(x)))).toBe(true);
        expect(a.compose(b).evaluate(x).equals(a.evaluate(b.evaluate(x)))).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it('composeRatio(n, d) = d^deg(p) * p(n/d) at points where d != 0 (property)', () => {
    fc.assert(
      fc.property(nonzeroPoly(4), poly(2), nonzeroPoly(2), smallRational, (p, n, d, x) => {
        const dx = d.evaluate(x);
        fc.pre(dx.n !== 0n);
        const expected = dx.pow(p.degree).mul(p.evaluate(n.evaluate(x).div(dx)));
        expect(p.composeRatio(n, d).evaluate(x).equals(expected)).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it('mul distributes over add and commutes (property)', () => {
    fc.assert(
      fc.property(poly(3), poly(3), poly(3), (a, b, c) => {
        expect(a.mul(b.add(c)).equals(a.mul(b).add(a.mul(c)))).toBe(true);
        expect(a.mul(b).equals(b.mul(a))).toBe(true);
        expect(a.sub(a).isZero()).toBe(true);
      }),
      { numRuns: 200 },
    );
  });
});
