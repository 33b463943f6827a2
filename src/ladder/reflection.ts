/**
 * The reflection polynomial F(s) of the Darlington synthesis: given the exact even polynomial
 * D(s) = E(s)E(-s) - sigma^2 P(s)P(-s) (the Feldtkeller equation |S11|^2 = 1 - |S21|^2 with S21 =
 * sigma P/E and S11 = F/E; V. Belevitch, "Classical Network Theory", 1968, ch. 9; the same in
 * W.-K. Chen, "Passive and Active Filters", 1986, sec. 4.2), find F with F(s)F(-s) = D(s).
 *
 * D is a polynomial in y = s^2. Its roots are found in float (Aberth), then sorted by structure:
 * - roots at y = 0: the lowest coefficients of D that are zero within their rounding noise are set to
 *   zero (Butterworth: all but the highest; odd orders of the equiripple families: the constant), and F
 *   gets s^m;
 * - roots on the negative y axis (the j-axis of s: the reflection zeros of equiripple passbands) must be
 *   double, since D >= 0 there for a passive network. Rounded poles split each double root into two
 *   roots some 1e-8 apart; the pair is replaced by its mean, which the split leaves correct to O(eps),
 *   and the mean is polished as the simple root of D'(y) it is. F gets (s^2 + w^2) once;
 * - every other root gives s = +-sqrt(y); F takes the left-half-plane one (minimum phase) or the
 *   right-half-plane one (maximum phase), polished by Newton on D(s) in 256-bit fixed point.
 * Without the pairing and polishing, element values of order-11 Chebyshev ladders came out wrong in
 * the 8th digit (measured). The pairing of split double roots stays fragile above order 11; the
 * synthesis therefore takes this path only where no j-axis reflection zeros are known or inferred
 * (characteristic-factorization.ts, inferred-characteristic.ts): unequal terminations, whose reflection
 * zeros are simple and off the axis, and Bessel.
 *
 * Returns null when D changes sign on the j-axis (a simple root there): the response then exceeds the
 * available power gain and no passive ladder realises it.
 */
import { Fraction, Q0, Q1 } from '../algebra/rational';
import { Poly } from '../algebra/poly';
import { aberthRoots as polynomialRoots } from '../algebra/roots';
import { evenToSquareVariable } from './prototype-polynomials';
import { fixedToFraction, fixedToNumber, hornerFixed, polishAllRoots, polishComplexRoot, polishRealRoot, toFixedCoefficients } from './precise-roots';
import { cSqrt, type Complex } from '../algebra/complex';
import type { ReflectionZeroChoice } from './types';

/**
 * A coefficient of D whose magnitude is below this fraction of the sum of the magnitudes of the terms it
 * was formed from is rounding noise: the poles are doubles (relative error ~1e-16) and a coefficient
 * sums products of up to 30 of them, so noise stays below ~1e-14; a response that needs a relative
 * coefficient under 1e-12 to be nonzero is not distinguishable from its rounded poles anyway.
 */
const SNAP_RELATIVE = new Fraction(1n, 10n ** 12n);
/**
 * |Im y| / |y| below which a float root may lie on the negative real y axis (the j-axis in s). Float
 * roots of a split double root scatter by ~sqrt(eps * cond), up to 1e-5 at order 15.
 */
const AXIS_RELATIVE = 1e-4;
/** Relative distance below which two such roots are candidates for one split double root. */
const DOUBLE_ROOT_RELATIVE = 1e-4;
/**
 * |S11|^2 at a candidate double root (the root of D' between the pair) under which the pair is taken as
 * one double root: the prototype's own rounding leaves ~1e-15 there, the float map of the even-order
 * modification up to ~2e-12 (measured, elliptic order 8); snapping then changes |H| by at most 5e-11
 * relative, inside the 1e-9 the ladder is checked to.
 */
const SNAP_REFLECTED_POWER = new Fraction(1n, 10n ** 10n);
/** |Re s| / |Im s| under which a polished simple root sits on the j-axis. */
const ON_AXIS_RELATIVE = new Fraction(1n, 10n ** 30n);

export interface ReflectionFactorization {
  /** F(s), monic, with F(s)F(-s) = D(s) up to the polishing precision. */
  readonly F: Poly;
  /** Multiplicity of the root s = 0 of F. */
  readonly originMultiplicity: number;
  /** w^2 of the j-axis reflection zeros (F has s^2 + w^2), ascending. */
  readonly jAxisOmegaSquared: readonly Fraction[];
}

const absPoly = (p: Poly): Poly => Poly.fromCoefficients(p.coefficients.map((c) => c.abs()));

/**
 * Factors D(s) = E(s)E(-s) - sigma2 P(s)P(-s) into F(s)F(-s). `E` monic, deg P < deg E.
 */
export function factorFeldtkeller(E: Poly, P: Poly, sigma2: Fraction, choice: ReflectionZeroChoice): ReflectionFactorization | null {
  const D = E.mul(E.negateVariable()).sub(P.mul(P.negateVariable()).scale(sigma2));
  const noise = absPoly(E).mul(absPoly(E)).add(absPoly(P).mul(absPoly(P)).scale(sigma2));
  const Dy = evenToSquareVariable(D);
  const By = evenToSquareVariable(noise);
  let m0 = 0;
  while (m0 < Dy.degree && Dy.coefficient(m0).abs().compare(By.coefficient(m0).mul(SNAP_RELATIVE)) <= 0) m0++;
  const rest = Poly.fromCoefficients(Dy.coefficients.slice(m0));
  let F: Poly = Poly.monomial(1, m0);
  const jAxis: Fraction[] = [];
  if (rest.degree <= 0) return { F, originMultiplicity: m0, jAxisOmegaSquared: jAxis };

  const floatRoots = polynomialRoots(rest.toFloatCoefficients(), { polish: false });
  if (floatRoots.some((r) => !Number.isFinite(r.re) || !Number.isFinite(r.im))) return null;
  const restFixed = toFixedCoefficients(rest);
  const fixedRoots = polishAllRoots(restFixed, floatRoots);
  const roots = fixedRoots.map((r, index) => ({ re: fixedToNumber(r.re), im: fixedToNumber(r.im), index }));
  type Root = (typeof roots)[number];
  const size = (r: Root): number => Math.hypot(r.re, r.im);
  const nearAxis = (r: Root): boolean => r.re < 0 && Math.abs(r.im) <= AXIS_RELATIVE * size(r);
  const candidates = roots.filter(nearAxis).sort((a, b) => a.re - b.re);
  const simple: Root[] = roots.filter((r) => !nearAxis(r));

  const restDerivative = toFixedCoefficients(rest.derivative());
  const powerY = evenToSquareVariable(E.mul(E.negateVariable()));
  for (let i = 0; i < candidates.length; i++) {
    const a = candidates[i];
    const b = candidates[i + 1];
    if (b !== undefined && Math.hypot(a.re - b.re, a.im - b.im) <= DOUBLE_ROOT_RELATIVE * size(a)) {
      const start = (fixedRoots[a.index].re + fixedRoots[b.index].re) / 2n;
      const yFixed = polishRealRoot(restDerivative, start);
      const y = fixedToFraction(yFixed);
      // D(y) / E(s)E(-s) at s^2 = y is |S11|^2 there: snapping to a double root changes it by that much.
      const reflected = fixedToFraction(hornerFixed(restFixed, yFixed)).mul(y.pow(m0)).div(powerY.evaluate(y)).abs();
      if (reflected.compare(SNAP_REFLECTED_POWER) <= 0) {
        jAxis.push(y.neg());
        F = F.mul(Poly.fromCoefficients([y.neg(), Q0, Q1])); // s^2 - y = s^2 + w^2
        i++;
        continue;
      }
    }
    simple.push(a);
  }

  // Simple roots: s = +-sqrt(y), polished on D(s) / s^(2 m0), which has them as simple roots.
  const sPoly = toFixedCoefficients(Poly.fromCoefficients(D.coefficients.slice(2 * m0)));
  const sign = choice === 'minimum-phase' ? -1 : 1;
  for (const y of simple) {
    if (y.re > 0 && Math.abs(y.im) <= AXIS_RELATIVE * y.re) {
      const r = fixedToFraction(polishRealRoot(sPoly, sign * Math.sqrt(y.re)));
      F = F.mul(Poly.fromCoefficients([r.neg(), Q1]));
      continue;
    }
    if (y.im < 0 || (y.im === 0 && y.re < 0)) {
      if (y.im === 0) return null; // a simple root on the j-axis: D changes sign there
      continue; // the conjugate of an upper root
    }
    const root = cSqrt(y); // principal: Re >= 0
    const z = polishComplexRoot(sPoly, { re: sign * root.re, im: sign * root.im });
    const a = fixedToFraction(z.re);
    const b = fixedToFraction(z.im);
    if (a.abs().compare(b.abs().mul(ON_AXIS_RELATIVE)) <= 0) return null; // converged onto the j-axis: a sign change of D
    F = F.mul(Poly.fromCoefficients([a.mul(a).add(b.mul(b)), a.mul(-2), Q1]));
  }
  if (F.degree !== Dy.degree) return null;
  jAxis.sort((x, y) => x.compare(y));
  return { F, originMultiplicity: m0, jAxisOmegaSquared: jAxis };
}
