/**
 * The normal-distribution kernels against mpmath at 40 digits (test/fixtures/mpmath/normal.json, made by
 * scripts/fixtures/production.py), and their own identities.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { erf, erfc, normalCdf, normalQuantile, normalSf, normalSfQuantile } from '../../src/algebra/normal';

const fixture = JSON.parse(readFileSync(new URL('../fixtures/mpmath/normal.json', import.meta.url), 'utf8')) as {
  erfc: [number, number][];
  normalCdf: [number, number][];
  normalQuantile: [number, number][];
};

const EPS = Number.EPSILON;

function expectRel(got: number, expected: number, tol: number, what: string): void {
  const diff = Math.abs(got - expected);
  const scale = Math.abs(expected);
  if (!(diff <= tol * scale || (expected === 0 && got === 0))) {
    throw new Error(`${what}: got ${got}, expected ${expected}, rel diff ${diff / scale}, tol ${tol}`);
  }
}

describe('erfc against mpmath', () => {
  it('to 20 eps relative for x in [-6, 27] (the expansions sum positive terms; exp(-x^2) split exactly)', () => {
    for (const [x, expected] of fixture.erfc) expectRel(erfc(x), expected, 20 * EPS, `erfc(${x})`);
  });
  it('is 0 beyond the underflow point and 2 far left, NaN for NaN', () => {
    expect(erfc(30)).toBe(0);
    expect(erfc(-30)).toBe(2);
    expect(erfc(NaN)).toBeNaN();
  });
  it('erf is odd, erf + erfc = 1', () => {
    fc.assert(
      fc.property(fc.double({ min: -6, max: 6, noNaN: true }), (x) => {
        expect(erf(-x) + erf(x)).toBe(0);
        expect(Math.abs(erf(x) + erfc(x) - 1)).toBeLessThanOrEqual(4 * EPS);
      }),
    );
  });
  it('erf keeps relative accuracy near zero (erf(x) ~ 2x/sqrt(pi))', () => {
    expectRel(erf(1e-20), 1.1283791670955126e-20, 2 * EPS, 'erf(1e-20)');
  });
});

describe('Phi and its inverse against mpmath', () => {
  it('Phi to 20 eps relative down to z = -38 (lower tail relative accuracy)', () => {
    for (const [z, expected] of fixture.normalCdf) expectRel(normalCdf(z), expected, 20 * EPS, `Phi(${z})`);
  });
  it('the survival function is Phi(-z) exactly', () => {
    fc.assert(
      fc.property(fc.double({ min: -30, max: 30, noNaN: true }), (z) => {
        expect(normalSf(z)).toBe(normalCdf(-z));
      }),
    );
  });
  it('Phi^-1 to 64 eps relative (Acklam + two Halley steps), 1e-300 .. 0.999999', () => {
    for (const [p, expected] of fixture.normalQuantile) {
      // Near p = 1 the argument 1 - p carries the double's own rounding (up to eps/2 of 1): the
      // quantile's condition there is (1 - p) / (p phi(z)) ~ 1/z, so the bound is in absolute terms.
      const tol = p > 0.5 ? Math.max(64 * EPS, (EPS / (1 - p)) / (expected * expected + 1)) : 64 * EPS;
      expectRel(normalQuantile(p), expected, tol, `Phi^-1(${p})`);
    }
  });
  it('round trip Phi(Phi^-1(p)) = p on the lower tail (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-250, max: 0.5, noNaN: true }), (p) => {
        // Rounding z to a double (eps/2 relative) moves Phi by a relative |z| * |z| eps / 2 in the tail
        // (d ln Phi / dz ~ |z|): the bound is 4 (1 + z^2) eps.
        const z = normalQuantile(p);
        expectRel(normalCdf(z), p, 4 * (1 + z * z) * EPS, `p ${p}`);
      }),
    );
  });
  it('edge values: 0 -> -Infinity, 1 -> Infinity, outside -> NaN; upper-tail quantile', () => {
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(1)).toBe(Infinity);
    expect(normalQuantile(-0.1)).toBeNaN();
    expect(normalQuantile(1.5)).toBeNaN();
    expect(normalQuantile(NaN)).toBeNaN();
    // The 99.73 % two-sided coverage is +-3 sigma to 4 digits (common practice, no source).
    expect(normalSfQuantile((1 - 0.9973) / 2)).toBeCloseTo(3.0, 3);
  });
});
