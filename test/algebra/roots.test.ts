import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { polynomialRoots, quadraticRoots } from '../../src/algebra/roots';
import { Poly } from '../../src/algebra/poly';

/** ascending coefficients of prod (s - r) for complex roots given as conjugate-closed lists. */
function expand(roots: { re: number; im: number }[]): number[] {
  let re = [1];
  let im = [0];
  for (const r of roots) {
    const nre = new Array(re.length + 1).fill(0);
    const nim = new Array(re.length + 1).fill(0);
    for (let i = 0; i < re.length; i++) {
      nre[i + 1] += re[i];
      nim[i + 1] += im[i];
      nre[i] -= r.re * re[i] - r.im * im[i];
      nim[i] -= r.re * im[i] + r.im * re[i];
    }
    re = nre;
    im = nim;
  }
  return re;
}

describe('polynomialRoots', () => {
  it('finds the roots of the Butterworth polynomial of order 7 (closed form: exp(j*pi*(2k+n-1)/(2n)))', () => {
    const n = 7;
    const expected = Array.from({ length: n }, (_, k) => {
      const t = (Math.PI * (2 * k + n + 1)) / (2 * n);
      return { re: Math.cos(t), im: Math.sin(t) };
    });
    const roots = polynomialRoots(expand(expected));
    expect(roots).toHaveLength(n);
    for (const e of expected) {
      const best = Math.min(...roots.map((r) => Math.hypot(r.re - e.re, r.im - e.im)));
      expect(best).toBeLessThan(1e-13); // well-conditioned simple roots on the unit circle: a few eps
    }
  });

  it('returns exact conjugate pairs, exactly real real roots, in a deterministic order', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -5, max: -0.1, noNaN: true }), fc.double({ min: 0.2, max: 5, noNaN: true })), { minLength: 1, maxLength: 5 }),
        fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { maxLength: 3 }),
        (pairs, reals) => {
          const roots = [
            ...pairs.flatMap(([re, im]) => [{ re, im }, { re, im: -im }]),
            ...reals.map((re) => ({ re, im: 0 })),
          ];
          const got = polynomialRoots(expand(roots));
          expect(got).toHaveLength(roots.length);
          for (const z of got) {
            if (z.im !== 0) expect(got.some((w) => w.re === z.re && w.im === -z.im)).toBe(true);
          }
          for (let i = 1; i < got.length; i++) expect(got[i - 1].re <= got[i].re).toBe(true);
          expect(polynomialRoots(expand(roots))).toEqual(got);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('recovers well-separated roots to a tolerance set by their conditioning', () => {
    const roots = [-1, -2, -3, -4, -5].map((re) => ({ re, im: 0 }));
    const got = polynomialRoots(expand(roots));
    got.forEach((z, i) => expect(Math.abs(z.re - (-5 + i))).toBeLessThan(1e-10));
  });

  it('handles roots at the origin exactly and takes Poly input', () => {
    const p = Poly.fromDescending([1, 3, 2, 0, 0]); // s^2 (s+1)(s+2)
    expect(polynomialRoots(p)).toEqual([
      { re: -2, im: 0 },
      { re: -1, im: 0 },
      { re: 0, im: 0 },
      { re: 0, im: 0 },
    ]);
  });

  it('uses the cancellation-free quadratic formula (x^2 - 1e8 x + 1: small root 1e-8 to full precision)', () => {
    const [big, small] = quadraticRoots(1, -1e8, 1);
    expect(big.re).toBeCloseTo(1e8, 0);
    expect(Math.abs(small.re - 1e-8) / 1e-8).toBeLessThan(1e-15);
  });

  it('is a kernel: NaN coefficients give NaN roots, constants give none', () => {
    expect(polynomialRoots([NaN, 1, 1]).every((z) => Number.isNaN(z.re))).toBe(true);
    expect(polynomialRoots([3])).toEqual([]);
    expect(polynomialRoots([])).toEqual([]);
  });
});
