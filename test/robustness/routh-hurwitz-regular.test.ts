/**
 * Regression guard for the exact stability test on large circuits. designFilter's last step counts the
 * roots of the MNA determinant exactly (spec/stability.ts -> algebra/routh-hurwitz.ts). With exactly
 * valued parts (selection 'exact', an impedance level given as a double) the determinant's
 * coefficients have ~1000 decimal digits, and the Routh array in rationals (a gcd per operation) took
 * 24 s to 260 s for one design of order 3 to 4 (a fuzzing run found them; see FIGURES.md). The regular
 * case now goes through the Hurwitz minors by fraction-free elimination.
 *
 * Oracle: polynomials built from known factors, so the root counts are known by construction
 * (independent of any Routh array): (s - r) with rational r != 0, (s^2 - 2 a s + a^2 + b^2) with
 * a != 0, (s^2 + w^2) on the imaginary axis, and s^k at the origin.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Poly, routhHurwitz } from '../../src/algebra/index';
import { designFilter } from '../../src/spec/design-filter';

/** A nonzero rational n/d as [n, d]. */
const rational = fc.tuple(fc.integer({ min: -40, max: 40 }).filter((n) => n !== 0), fc.integer({ min: 1, max: 9 }));
const constant = ([n, d]: [number, number]): Poly => Poly.constant(`${n}/${d}`);
const S2 = Poly.S.mul(Poly.S);
const factor = fc.oneof(
  { weight: 3, arbitrary: rational.map((r) => ({ poly: Poly.S.sub(constant(r)), rhp: r[0] > 0 ? 1 : 0, jw: 0 })) },
  {
    weight: 3,
    arbitrary: fc.tuple(rational, rational).map(([a, b]) => {
      const pa = constant(a);
      const pb = constant(b);
      return { poly: S2.sub(Poly.S.mul(pa.scale(2))).add(pa.mul(pa)).add(pb.mul(pb)), rhp: a[0] > 0 ? 2 : 0, jw: 0 };
    }),
  },
  { weight: 1, arbitrary: rational.map((w) => ({ poly: S2.add(constant(w).mul(constant(w))), rhp: 0, jw: 2 })) },
);

describe('routhHurwitz on polynomials of known roots', () => {
  it('counts right-half-plane, imaginary-axis and left-half-plane roots exactly (regular and singular arrays)', () => {
    fc.assert(
      fc.property(fc.array(factor, { minLength: 1, maxLength: 7 }), fc.integer({ min: 0, max: 2 }), fc.integer({ min: -5, max: 5 }).filter((c) => c !== 0), (factors, originRoots, scale) => {
        let p = Poly.monomial(scale, originRoots);
        for (const f of factors) p = p.mul(f.poly);
        const rhp = factors.reduce((n, f) => n + f.rhp, 0);
        const jw = factors.reduce((n, f) => n + f.jw, 0) + originRoots;
        const r = routhHurwitz(p);
        expect(r.degree).toBe(p.degree);
        expect(r.rightHalfPlane).toBe(rhp);
        expect(r.imaginaryAxis).toBe(jw);
        expect(r.leftHalfPlane).toBe(p.degree - rhp - jw);
        expect(r.stable).toBe(rhp === 0 && jw === 0);
      }),
      { numRuns: 400 },
    );
  });

  it('first-column signs: a_n, then sign(D_k / D_(k-1)) from the Hurwitz minors (hand-computed cubic)', () => {
    // p = s^3 + 2 s^2 + 3 s + 10: D1 = 2, D2 = 2*3 - 1*10 = -4, D3 = 10 * D2 = -40 (hand computation).
    // Column: 1, 2, -4/2, -40/-4 -> signs +, +, -, +: two right-half-plane roots.
    const r = routhHurwitz(Poly.fromCoefficients([10, 3, 2, 1]));
    expect(r.firstColumnSigns).toEqual([1, 1, -1, 1]);
    expect(r.rightHalfPlane).toBe(2);
  });

  it('a design whose exact determinant has ~1000-digit coefficients is checked for stability (once took 24 s in the Routh array alone)', () => {
    const d = designFilter({
      name: 'narrow bessel bandpass at 1 Hz, exact parts',
      response: { type: 'bandpass', family: 'bessel', order: 4, passbandEdgeHz: [1, 1.17023], passbandRippleDb: 0.010610820286924422 },
      realization: { method: 'auto', impedanceOhms: 100.00000000000011 },
      parts: { opamp: { model: 'single-pole', gainBandwidthHz: 276965.5640716533, openLoopGainDb: 73.95797470768007 }, selection: 'exact' },
      evaluation: { sweepPoints: 16 },
    });
    expect(d.stability.characteristicPolynomial.some((c) => c.length > 500)).toBe(true);
    expect(d.stability.degree).toBeGreaterThan(10);
    expect(d.stability.leftHalfPlane + d.stability.rightHalfPlane + d.stability.imaginaryAxis).toBe(d.stability.degree);
    expect(d.stability.stable).toBe(true);
  });
});
