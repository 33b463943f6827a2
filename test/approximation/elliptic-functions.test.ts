/**
 * Elliptic integrals and functions. Expected values: test/fixtures/mpmath/elliptic.json, computed by
 * scripts/fixtures/approximation.py with mpmath at 60 significant digits (mpmath.ellipk, ellipfun, qfrom,
 * mfrom; mpmath uses the parameter m = k^2) and rounded to Float64. Identities from Abramowitz-Stegun
 * 16.9.1 (sn^2 + cn^2 = 1, dn^2 + k^2 sn^2 = 1) and 17.3.11 (K(1/sqrt 2) = K').
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  arithmeticGeometricMean,
  complementaryModulus,
  completeEllipticK,
  ellipticDegree,
  ellipticDiscrimination,
  inverseJacobiSc,
  jacobiElliptic,
  modulusFromPeriodRatio,
  periodRatio,
} from '../../src/approximation/index.js';
import oracle from '../fixtures/mpmath/elliptic.json';

const EPS = Number.EPSILON;

/** |got - expected| <= tol * max(|expected|, tiny), with a message that shows everything. */
function expectClose(got: number, expected: number, tol: number, what: string): void {
  const diff = Math.abs(got - expected);
  const bound = tol * Math.max(Math.abs(expected), 1e-300);
  expect(diff, `${what}: got ${got}, expected ${expected}, diff ${diff}, tolerance ${bound}`).toBeLessThanOrEqual(bound);
}

describe('complete elliptic integral K by the AGM', () => {
  it.each(oracle.K.map((r) => [r.k, r] as const))('K and K\' at k = %s against mpmath', (_k, r) => {
    const k = Number(r.k);
    const kp = complementaryModulus(k);
    expectClose(kp, r.kp, 4 * EPS, "k' = sqrt((1 - k)(1 + k))");
    expectClose(completeEllipticK(k, kp), r.K, 64 * EPS, 'K');
    expectClose(completeEllipticK(kp, k), r.Kp, 64 * EPS, "K'");
  });

  it('K(1/sqrt 2) = K\' (A&S 17.3.11) and K(0) = pi/2', () => {
    expectClose(completeEllipticK(Math.SQRT1_2, Math.SQRT1_2), 1.854074677301372, 4 * EPS, 'K(1/sqrt2), mpmath value');
    expect(completeEllipticK(0)).toBe(Math.PI / 2);
    expect(completeEllipticK(1, 0)).toBe(Number.POSITIVE_INFINITY);
    expect(Number.isNaN(completeEllipticK(1.5))).toBe(true);
  });

  it('AGM(1, 0) = 0 and AGM(a, a) = a', () => {
    expect(arithmeticGeometricMean(1, 0)).toBe(0);
    expect(arithmeticGeometricMean(3, 3)).toBe(3);
  });
});

describe('Jacobi sn, cn, dn', () => {
  it.each(oracle.jacobi.map((r) => [`k=${r.k} u=${r.u}`, r] as const))('%s against mpmath', (_n, r) => {
    const got = jacobiElliptic(r.u, Number(r.k));
    // absolute tolerance scaled by the function range (all three are bounded by 1)
    expect(Math.abs(got.sn - r.sn), 'sn').toBeLessThanOrEqual(64 * EPS);
    expect(Math.abs(got.cn - r.cn), 'cn').toBeLessThanOrEqual(64 * EPS);
    expect(Math.abs(got.dn - r.dn), 'dn').toBeLessThanOrEqual(64 * EPS);
  });

  it('satisfies sn^2 + cn^2 = 1 and dn^2 + k^2 sn^2 = 1 (A&S 16.9.1)', () => {
    fc.assert(
      fc.property(fc.double({ min: -20, max: 20, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (u, k) => {
        const { sn, cn, dn } = jacobiElliptic(u, k);
        expect(Math.abs(sn * sn + cn * cn - 1)).toBeLessThanOrEqual(8 * EPS);
        expect(Math.abs(dn * dn + k * k * sn * sn - 1)).toBeLessThanOrEqual(8 * EPS);
      }),
    );
  });

  it('has quarter period K: sn(K) = 1, cn(K) = 0 (to rounding)', () => {
    for (const k of [0.1, 0.5, 0.9, 0.999]) {
      const { sn, cn, dn } = jacobiElliptic(completeEllipticK(k), k);
      expect(Math.abs(sn - 1)).toBeLessThanOrEqual(8 * EPS);
      expect(Math.abs(cn)).toBeLessThanOrEqual(1e-7); // cn ~ k' (K - u): rounding of K moves it this much
      expectClose(dn, complementaryModulus(k), 1e-7, 'dn(K) = k\'');
    }
  });

  it('reduces to circular and hyperbolic functions at k = 0 and k = 1 (A&S 16.6)', () => {
    expect(jacobiElliptic(0.7, 0)).toEqual({ sn: Math.sin(0.7), cn: Math.cos(0.7), dn: 1 });
    const h = jacobiElliptic(0.7, 1, 0);
    expect(h.sn).toBe(Math.tanh(0.7));
    expect(h.cn).toBe(1 / Math.cosh(0.7));
  });
});

describe('inverse sc', () => {
  it('inverts sc(u, k) = sn/cn on (0, K), also for k very close to 1', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 0.95, noNaN: true }), fc.double({ min: 1e-4, max: 0.5, noNaN: true }), (frac, kp) => {
        const k = complementaryModulus(kp);
        const u = frac * completeEllipticK(k, kp);
        const { sn, cn } = jacobiElliptic(u, k, kp);
        // k' >= 1e-4 (elliptic designs up to order 15 need k' >= ~1e-3): the check goes through the AGM
        // cn, whose back-substitution takes asin of arguments near 1 when k -> 1, so cn keeps an absolute
        // error of ~1e-14 — a large relative error where cn is small (1e-11 at k' = 1e-6). The inverse
        // itself is accurate further out (see the sinh case below, k' = 1e-9).
        expectClose(inverseJacobiSc(sn / cn, k, kp), u, 1e-12, `u for frac = ${frac}, k' = ${kp}`);
      }),
    );
    expect(inverseJacobiSc(2, 1, 0)).toBe(Math.asinh(2)); // sc(u, 1) = sinh u
    // mpmath.ellipf(atan(sinh(2.5)), 1 - 1e-18) = 2.500000000000000016 (60 digits)
    expectClose(inverseJacobiSc(Math.sinh(2.5), 1, 1e-9), 2.5, 4 * EPS, "sc^-1 at k' = 1e-9");
  });
});

describe('nome series and the degree equation', () => {
  it.each(oracle.degree.map((r) => [`N=${r.order} k1=${r.k1}`, r] as const))('%s against mpmath', (_n, r) => {
    const { k, kp } = ellipticDegree(r.order, Number(r.k1));
    expectClose(k, r.k, 64 * EPS, 'k');
    expectClose(kp, r.kp, 64 * EPS, "k'");
  });

  it('modulusFromPeriodRatio inverts periodRatio on both sides of tau = 1', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.05, max: 8, noNaN: true }), (tau) => {
        const { k, kp } = modulusFromPeriodRatio(tau);
        expectClose(periodRatio(k, kp), tau, 1e-13, 'tau');
      }),
    );
    const { k, kp } = modulusFromPeriodRatio(1);
    expectClose(k, Math.SQRT1_2, 4 * EPS, 'k at tau = 1');
    expectClose(kp, Math.SQRT1_2, 4 * EPS, "k' at tau = 1");
  });

  it('ellipticDiscrimination undoes ellipticDegree', () => {
    for (const order of [2, 5, 9, 15]) {
      for (const k1 of [1e-6, 1e-3, 0.1]) {
        const { k, kp } = ellipticDegree(order, k1);
        expectClose(ellipticDiscrimination(order, k, kp).k, k1, 1e-12, `N=${order} k1=${k1}`);
      }
    }
  });
});
