import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { complex as mComplex, add as mAdd, multiply as mMultiply, divide as mDivide, abs as mAbs, type Complex as MComplex } from 'mathjs';
import { RationalFunction } from '../../src/algebra/rational-function';
import { Poly } from '../../src/algebra/poly';
import { Fraction } from '../../src/algebra/rational';
import { nonzeroPoly, nonzeroRationalFunction, poly, positiveRational, rationalFunction, smallRational } from './arbitraries';

const S = RationalFunction.S;
const degree = (h: RationalFunction): number => Math.max(h.num.degree, h.den.degree);

describe('RationalFunction: field laws (exact equality)', () => {
  it('add and mul commute and associate; mul distributes over add (property)', () => {
    fc.assert(
      fc.property(rationalFunction(2), rationalFunction(2), rationalFunction(2), (a, b, c) => {
        expect(a.add(b).equals(b.add(a))).toBe(true);
        expect(a.mul(b).equals(b.mul(a))).toBe(true);
        expect(a.add(b).add(c).equals(a.add(b.add(c)))).toBe(true);
        expect(a.mul(b).mul(c).equals(a.mul(b.mul(c)))).toBe(true);
        expect(a.mul(b.add(c)).equals(a.mul(b).add(a.mul(c)))).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('a / b * b = a and a - a = 0 (property)', () => {
    fc.assert(
      fc.property(rationalFunction(3), nonzeroRationalFunction(3), (a, b) => {
        expect(a.div(b).mul(b).equals(a)).toBe(true);
        expect(a.sub(a).isZero()).toBe(true);
        expect(b.mul(b.inverse()).equals(RationalFunction.ONE)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('is canonical: a common factor and a scale leave the representation unchanged (property)', () => {
    fc.assert(
      fc.property(poly(3), nonzeroPoly(3), nonzeroPoly(2), (n, d, c) => {
        const h = RationalFunction.fromPolys(n, d);
        expect(RationalFunction.fromPolys(n.mul(c), d.mul(c)).equals(h)).toBe(true);
        expect(h.den.leading.equals(new Fraction(1))).toBe(true);
        expect(h.num.gcd(h.den).degree).toBeLessThanOrEqual(0);
      }),
      { numRuns: 150 },
    );
  });

  it('exact evaluation is a homomorphism away from poles (property)', () => {
    fc.assert(
      fc.property(rationalFunction(3), rationalFunction(3), smallRational, (a, b, x) => {
        fc.pre(a.den.evaluate(x).n !== 0n && b.den.evaluate(x).n !== 0n);
        expect(a.mul(b).evaluate(x).equals(a.evaluate(x).mul(b.evaluate(x)))).toBe(true);
        expect(a.add(b).evaluate(x).equals(a.evaluate(x).add(b.evaluate(x)))).toBe(true);
      }),
      { numRuns: 150 },
    );
  });
});

describe('RationalFunction: substitutions', () => {
  it('H(s) composed with s is H, and H(1/(1/s)) = H (property)', () => {
    const reciprocal = S.substituteReciprocal(); // 1/s
    fc.assert(
      fc.property(rationalFunction(3), (h) => {
        expect(h.compose(S).equals(h)).toBe(true);
        expect(h.compose(reciprocal.compose(reciprocal)).equals(h)).toBe(true);
        expect(h.compose(reciprocal).compose(reciprocal).equals(h)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('LP -> HP twice (s -> k/s) returns the original (property)', () => {
    fc.assert(
      fc.property(rationalFunction(4), positiveRational, (h, k) => {
        expect(h.substituteReciprocal(k).substituteReciprocal(k).equals(h)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('the bandpass and bandstop maps double the degree (degree of a rational map is multiplicative) (property)', () => {
    fc.assert(
      fc.property(nonzeroRationalFunction(3), positiveRational, positiveRational, (h, w0Squared, bw) => {
        expect(degree(h.substituteBandpass(w0Squared, bw))).toBe(2 * degree(h));
        expect(degree(h.substituteBandstop(w0Squared, bw))).toBe(2 * degree(h));
      }),
      { numRuns: 150 },
    );
  });

  it('scaleVariable(k) then scaleVariable(1/k) is the identity; compose agrees with point evaluation (property)', () => {
    fc.assert(
      fc.property(rationalFunction(3), positiveRational, rationalFunction(2), smallRational, (h, k, g, x) => {
        expect(h.scaleVariable(k).scaleVariable(new Fraction(1).div(k)).equals(h)).toBe(true);
        fc.pre(g.den.evaluate(x).n !== 0n);
        const gx = g.evaluate(x);
        fc.pre(h.den.evaluate(gx).n !== 0n);
        const hg = h.compose(g);
        fc.pre(hg.den.evaluate(x).n !== 0n);
        expect(hg.evaluate(x).equals(h.evaluate(gx))).toBe(true);
      }),
      { numRuns: 150 },
    );
  });
});

describe('RationalFunction.evaluateComplex against mathjs complex arithmetic (reference: mathjs 15)', () => {
  /** Horner's rule in mathjs complex numbers on the same float coefficients. */
  function mathjsHorner(ascending: readonly number[], s: MComplex): MComplex {
    let acc = mComplex(0, 0);
    for (let i = ascending.length - 1; i >= 0; i--) acc = mAdd(mMultiply(acc, s), mComplex(ascending[i], 0)) as MComplex;
    return acc;
  }
  /** sum |a_i| |s|^i: the condition term of Horner's rule. */
  const absSum = (ascending: readonly number[], r: number): number => ascending.reduce((acc, a, i) => acc + Math.abs(a) * r ** i, 0);
  const EPS = Number.EPSILON;

  it('agrees within a Horner error bound at random complex points (property)', () => {
    fc.assert(
      fc.property(
        nonzeroRationalFunction(5),
        fc.double({ min: -4, max: 4, noNaN: true }),
        fc.double({ min: -4, max: 4, noNaN: true }),
        (h, re, im) => {
          const s = { re, im };
          const r = Math.hypot(re, im);
          fc.pre(r > 1e-3);
          const f = h.toFloat();
          const n = mathjsHorner(f.num, mComplex(re, im));
          const d = mathjsHorner(f.den, mComplex(re, im));
          const nAbs = mAbs(n) as unknown as number;
          const dAbs = mAbs(d) as unknown as number;
          fc.pre(nAbs > 0 && dAbs > 0);
          const ref = mDivide(n, d) as MComplex;
          const got = h.evaluateComplex(s);
          // Tolerance: Horner's rule errs by at most gamma_2n * sum |a_i||s|^i (Higham, "Accuracy and
          // Stability of Numerical Algorithms", 2nd ed., eq. (5.3)); complex products add a small factor,
          // both sides err, and the |s| > 1 path of evaluateComplex rescales by s^k through exp/log
          // (relative error ~ |k log|s|| eps). Factor 16 covers the constants.
          const deg = Math.max(f.num.length, f.den.length);
          const k = f.num.length - f.den.length;
          const rel =
            16 * deg * EPS * (absSum(f.num, r) / nAbs + absSum(f.den, r) / dAbs) + 16 * EPS * (1 + Math.abs(k * Math.log(r)));
          const refAbs = Math.hypot(ref.re, ref.im);
          const diff = Math.hypot(got.re - ref.re, got.im - ref.im);
          expect(diff, `H=${h.toString()} s=${re}+${im}j got=${got.re}+${got.im}j ref=${ref.re}+${ref.im}j`).toBeLessThanOrEqual(rel * refAbs);
        },
      ),
      { numRuns: 500 },
    );
  });

  it('gainDb and phaseDeg agree with mathjs at j*omega (property)', () => {
    fc.assert(
      fc.property(nonzeroRationalFunction(4), fc.double({ min: 0.01, max: 100, noNaN: true }), (h, w) => {
        const f = h.toFloat();
        const n = mathjsHorner(f.num, mComplex(0, w));
        const d = mathjsHorner(f.den, mComplex(0, w));
        const nAbs = mAbs(n) as unknown as number;
        const dAbs = mAbs(d) as unknown as number;
        fc.pre(nAbs > 0 && dAbs > 0);
        const cond = absSum(f.num, w) / nAbs + absSum(f.den, w) / dAbs;
        fc.pre(cond < 1e6); // keep away from zeros and poles, where both sides are meaningless
        const ref = mDivide(n, d) as MComplex;
        const refDb = 20 * Math.log10(Math.hypot(ref.re, ref.im));
        // dB error = 20/ln(10) * relative error; same bound as above.
        const rel = 16 * f.den.length * EPS * cond + 16 * EPS * (1 + Math.abs((f.num.length - f.den.length) * Math.log(w)));
        expect(Math.abs(h.gainDb(w) - refDb)).toBeLessThanOrEqual(8.686 * rel + 1e-13);
        const refDeg = (Math.atan2(ref.im, ref.re) * 180) / Math.PI;
        let dp = Math.abs(h.phaseDeg(w) - refDeg);
        if (dp > 180) dp = 360 - dp; // the branch cut at +-180
        expect(dp).toBeLessThanOrEqual((180 / Math.PI) * rel * 2 + 1e-12);
      }),
      { numRuns: 300 },
    );
  });
});

describe('RationalFunction: known forms', () => {
  it('1/(s+1) + 1/(s-1) = 2s/(s^2-1)', () => {
    const a = RationalFunction.fromCoefficients([1], [1, 1]);
    const b = RationalFunction.fromCoefficients([1], [-1, 1]);
    expect(a.add(b).equals(RationalFunction.fromCoefficients([0, 2], [-1, 0, 1]))).toBe(true);
  });

  it('the lowpass 1/(s+1) maps to the highpass s/(s+1) under s -> 1/s', () => {
    const lp = RationalFunction.fromCoefficients([1], [1, 1]);
    expect(lp.substituteReciprocal().equals(RationalFunction.fromCoefficients([0, 1], [1, 1]))).toBe(true);
  });

  it('a first-order lowpass maps to the second-order bandpass B s/(s^2 + B s + w0^2)', () => {
    const lp = RationalFunction.fromCoefficients([1], [1, 1]);
    const bp = lp.substituteBandpass(4, 3);
    expect(bp.equals(RationalFunction.fromPolys(Poly.fromCoefficients([0, 3]), Poly.fromCoefficients([4, 3, 1])))).toBe(true);
  });
});
