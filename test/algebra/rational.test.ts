import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Fraction, fractionFromDouble, fractionToNumber, toFraction } from '../../src/algebra/rational';
import { GicladderError, InvalidInputError } from '../../src/errors';

describe('exact rationals', () => {
  it('converts every finite double exactly and back to the same double', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        const f = fractionFromDouble(x);
        expect(Object.is(fractionToNumber(f), x === 0 ? 0 : x) || (x === 0 && fractionToNumber(f) === 0)).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it('takes 0.1 as the double nearest 1/10, not as 1/10 (IEEE 754 binary64: 0x3FB999999999999A)', () => {
    const f = fractionFromDouble(0.1);
    expect(f.n).toBe(3602879701896397n);
    expect(f.d).toBe(36028797018963968n);
  });

  it('takes decimal strings as written', () => {
    expect(toFraction('4.7e-9').equals(new Fraction(47n, 10_000_000_000n))).toBe(true);
    expect(toFraction('-1/3').equals(new Fraction(-1n, 3n))).toBe(true);
    expect(toFraction('.5').equals(new Fraction(1n, 2n))).toBe(true);
  });

  it('rounds big fractions correctly to the nearest double (checked against the double nearest 1/3 and 2/3)', () => {
    expect(fractionToNumber(new Fraction(1n, 3n))).toBe(1 / 3);
    expect(fractionToNumber(new Fraction(2n, 3n))).toBe(2 / 3);
    const huge = new Fraction(10n ** 400n + 1n, 10n ** 399n);
    expect(fractionToNumber(huge)).toBe(10);
    expect(fractionToNumber(new Fraction(1n, 10n ** 400n))).toBe(0);
    expect(fractionToNumber(new Fraction(10n ** 400n))).toBe(Infinity);
  });

  it('agrees with parseFloat on random decimal strings (correct rounding on both sides)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 999999999 }), fc.integer({ min: -30, max: 30 }), (m, e) => {
        const s = `${m}e${e}`;
        expect(fractionToNumber(toFraction(s))).toBe(parseFloat(s));
      }),
      { numRuns: 2000 },
    );
  });

  it('rejects NaN, Infinity and garbage with a typed error naming the path', () => {
    for (const bad of [NaN, Infinity, -Infinity, 'abc', '1.2.3', '', '1/0']) {
      let err: unknown;
      try {
        toFraction(bad as number | string, 'coefficients[2]');
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(GicladderError);
      expect((err as InvalidInputError).path).toBe('coefficients[2]');
      expect(['INVALID_NUMBER', 'DIVISION_BY_ZERO']).toContain((err as InvalidInputError).code);
    }
  });
});
