/**
 * Darlington data from the characteristic function, for terminations lossless at the passband maxima
 * (equal terminations of odd orders and of the modified even orders, the computed load of even-order
 * Chebyshev): there the reflection zeros lie on the j-axis, double roots of E(s)E(-s) - sigma^2 P(s)P(-s),
 * which a numerical factorisation locates only to ~sqrt(eps). The approximation stage knows them exactly
 * (approximation/characteristic.ts), so F(s) = s^m prod (s^2 + w_i^2) is formed from them directly, and
 * E(s) is re-derived from the characteristic function rather than F from E: the poles of the prototype are
 * polished as roots of the exact polynomial
 *
 *   G(s) = sigma^2 P(s)P(-s) + F(s)F(-s) = E(s)E(-s)          (the Feldtkeller equation, Belevitch 1968, ch. 9)
 *
 * in fixed point (precise-roots.ts; simple roots, Newton from the float poles). E, F and P then satisfy
 * the Feldtkeller equation to the polishing precision (2^-256 divided by |G'| at each pole: ~1e-60 even at the clustered poles of order 15), so the extraction realises exactly the
 * characteristic function whose zeros are the analytic ones rounded to doubles. This is the route of
 * H. J. Orchard and G. C. Temes, "Filter design using transformed variables", IEEE Trans. Circuit
 * Theory CT-15 (1968) 385-408: the element values are well conditioned in the zeros of F and P, badly in
 * the coefficients of E.
 *
 * A kernel: returns null (the caller falls back to the numerical factorisation) when the data do not fit:
 * F of the wrong degree, or a pole that does not polish onto a left-half-plane root of G nearby.
 */
import { Fraction, Q0, Q1, fractionFromDouble, fractionToNumber } from '../algebra/rational';
import { Poly } from '../algebra/poly';
import type { Complex } from '../algebra/complex';
import type { LowpassCharacteristic } from '../approximation/index';
import { fixedToFraction, polishComplexRoot, polishRealRoot, toFixedCoefficients } from './precise-roots';

/**
 * Largest relative move of a pole under the polishing that still counts as the same pole: the float
 * poles of the approximation stage are within ~1e-13 of the roots of G (their rounding times the
 * conditioning of high-Q poles); a larger move means the characteristic does not belong to the prototype.
 */
const POLE_MOVE_RELATIVE = 1e-7;

export interface CharacteristicFactorization {
  /** F(s), monic, from the analytic reflection zeros. */
  readonly F: Poly;
  /** E(s), monic, with E(s)E(-s) = sigma^2 P(s)P(-s) + F(s)F(-s) to the polishing precision. */
  readonly E: Poly;
  /** The roots of that E as doubles (the realised poles), conjugate pairs bit-exact. */
  readonly poles: Complex[];
  /** Largest relative move of a pole (diagnostic of the prototype's consistency). */
  readonly largestPoleMove: number;
}

/** F(s) = s^m prod (s^2 + w^2) with w^2 exact from the double w. */
export function reflectionPolynomial(characteristic: LowpassCharacteristic): Poly {
  let F = Poly.monomial(1, characteristic.originMultiplicity);
  for (const w of characteristic.reflectionOmegasRadPerS) {
    const w2 = fractionFromDouble(w).pow(2);
    F = F.mul(Poly.fromCoefficients([w2, Q0, Q1]));
  }
  return F;
}

export function factorFromCharacteristic(
  P: Poly,
  sigma2: Fraction,
  characteristic: LowpassCharacteristic,
  poles: readonly Complex[],
): CharacteristicFactorization | null {
  const n = poles.length;
  const F = reflectionPolynomial(characteristic);
  if (F.degree !== n || P.degree >= n) return null;
  const G = P.mul(P.negateVariable()).scale(sigma2).add(F.mul(F.negateVariable()));
  const g = toFixedCoefficients(G);
  let E: Poly = Poly.ONE;
  const out: Complex[] = [];
  let largestPoleMove = 0;
  for (const p of poles) {
    if (p.im < 0) continue;
    if (p.im === 0) {
      const r = fixedToFraction(polishRealRoot(g, p.re));
      const x = fractionToNumber(r);
      const move = Math.abs(x - p.re) / Math.abs(p.re);
      if (!(x < 0) || !(move <= POLE_MOVE_RELATIVE)) return null;
      largestPoleMove = Math.max(largestPoleMove, move);
      E = E.mul(Poly.fromCoefficients([r.neg(), Q1]));
      out.push({ re: x, im: 0 });
      continue;
    }
    const z = polishComplexRoot(g, p);
    const a = fixedToFraction(z.re);
    const b = fixedToFraction(z.im);
    const re = fractionToNumber(a);
    const im = fractionToNumber(b);
    const move = Math.hypot(re - p.re, im - p.im) / Math.hypot(p.re, p.im);
    if (!(re < 0) || !(im > 0) || !(move <= POLE_MOVE_RELATIVE)) return null;
    largestPoleMove = Math.max(largestPoleMove, move);
    E = E.mul(Poly.fromCoefficients([a.mul(a).add(b.mul(b)), a.mul(-2), Q1])); // (s - a)^2 + b^2
    out.push({ re, im }, { re, im: -im });
  }
  if (E.degree !== n) return null;
  out.sort((u, v) => u.im - v.im || u.re - v.re);
  return { F, E, poles: out, largestPoleMove };
}
