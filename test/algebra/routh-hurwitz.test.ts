import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Poly } from '../../src/algebra/poly';
import { routhHurwitz } from '../../src/algebra/routh-hurwitz';
import { polynomialRoots } from '../../src/algebra/roots';
import { GicladderError } from '../../src/errors';

const rh = (descending: (number | string)[]) => routhHurwitz(Poly.fromDescending(descending));

describe('routhHurwitz: textbook cases', () => {
  it('a zero in the first column (epsilon method): s^5 + 2s^4 + 3s^3 + 6s^2 + 5s + 3 has 2 right-half-plane roots (Nise, Control Systems Engineering, Example 6.2, from memory; checked against numpy.roots: two roots with real part +0.34)', () => {
    const r = rh([1, 2, 3, 6, 5, 3]);
    expect([r.rightHalfPlane, r.imaginaryAxis, r.leftHalfPlane]).toEqual([2, 0, 3]);
    expect(r.stable).toBe(false);
  });

  it('a row of zeros (auxiliary polynomial 7s^4 + 42s^2 + 56): s^5 + 7s^4 + 6s^3 + 42s^2 + 8s + 56 has 4 roots on the imaginary axis, at +-j*sqrt(2) and +-2j, and one at -7 (Nise, Example 6.4, from memory; the factorisation (s + 7)(s^2 + 2)(s^2 + 4) confirms it)', () => {
    const p = Poly.fromDescending([1, 7]).mul(Poly.fromDescending([1, 0, 2])).mul(Poly.fromDescending([1, 0, 4]));
    expect(p.equals(Poly.fromDescending([1, 7, 6, 42, 8, 56]))).toBe(true);
    const r = routhHurwitz(p);
    expect([r.rightHalfPlane, r.imaginaryAxis, r.leftHalfPlane]).toEqual([0, 4, 1]);
  });

  it('repeated imaginary-axis roots: (s^2 + 1)^2 has 4 on the axis and none elsewhere (by construction)', () => {
    const r = rh([1, 0, 2, 0, 1]);
    expect([r.rightHalfPlane, r.imaginaryAxis, r.leftHalfPlane]).toEqual([0, 4, 0]);
  });

  it('roots at the origin count as imaginary-axis roots: s^2 (s + 1)', () => {
    const r = rh([1, 1, 0, 0]);
    expect([r.rightHalfPlane, r.imaginaryAxis, r.leftHalfPlane]).toEqual([0, 2, 1]);
  });

  it('the Butterworth polynomials are stable (all roots on the left half of the unit circle, by construction)', () => {
    expect(rh([1, 2, 2, 1]).stable).toBe(true);
    expect(rh([1, '2.6131259297527532', '3.4142135623730951', '2.6131259297527532', 1]).stable).toBe(true);
  });

  it('symmetric pairs off the axis in a row of zeros: s^4 - 1 = (s-1)(s+1)(s^2+1): one RHP, two on the axis, one LHP', () => {
    const r = rh([1, 0, 0, 0, -1]);
    expect([r.rightHalfPlane, r.imaginaryAxis, r.leftHalfPlane]).toEqual([1, 2, 1]);
  });

  it('rejects the zero polynomial with a typed error', () => {
    expect(() => routhHurwitz(Poly.ZERO)).toThrow(GicladderError);
  });
});

describe('routhHurwitz agrees with counting float roots', () => {
  it('on random polynomials with well-separated roots off the imaginary axis', () => {
    const rootArb = fc.record({
      re: fc.integer({ min: -9, max: 9 }).filter((x) => x !== 0),
      im: fc.integer({ min: 0, max: 9 }),
    });
    fc.assert(
      fc.property(fc.uniqueArray(rootArb, { minLength: 1, maxLength: 6, selector: (r) => `${r.re},${r.im}` }), (roots) => {
        // Build an exact polynomial with integer roots: (s - re) for im = 0, (s^2 - 2re s + re^2 + im^2) otherwise.
        let p = Poly.ONE;
        for (const { re, im } of roots) {
          p = p.mul(im === 0 ? Poly.fromDescending([1, -re]) : Poly.fromDescending([1, -2 * re, re * re + im * im]));
        }
        const r = routhHurwitz(p);
        const floats = polynomialRoots(p);
        expect(r.rightHalfPlane).toBe(floats.filter((z) => z.re > 0).length);
        expect(r.leftHalfPlane).toBe(floats.filter((z) => z.re < 0).length);
        expect(r.imaginaryAxis).toBe(0);
      }),
      { numRuns: 300 },
    );
  });
});
