/**
 * Exact polynomials of a lowpass prototype given in zeros/poles/gain: E(s) (monic, from the poles) and
 * P(s) (monic, from the j-axis transmission zeros), built in rationals from the float roots taken exactly
 * (every double is a rational). This is where the ladder stage crosses from float to exact; conjugate
 * pairs are formed from the upper root only, so E and P are exactly real.
 */
import { Fraction, Q0, Q1, fractionFromDouble } from '../algebra/rational';
import { Poly } from '../algebra/poly';
import type { Complex } from '../algebra/complex';
import type { Zpk } from '../approximation/zpk';
import { InvalidInputError, UnrealizableError } from '../errors';

/** A lowpass prototype in zeros/poles/gain form: the approximation stage's Zpk. */
export type PrototypeZpk = Zpk;

export interface PrototypePolynomials {
  /** prod (s - p_i), exact, monic, strictly Hurwitz. */
  readonly E: Poly;
  /** prod (s^2 + w_k^2) over the finite transmission zeros, exact, monic, even. */
  readonly P: Poly;
  /** The squared frequencies w_k^2 of the finite transmission zeros, ascending, one per conjugate pair. */
  readonly zeroOmegaSquared: readonly Fraction[];
}

/**
 * Relative distance within which a root and the conjugate of another count as one conjugate pair, and a
 * zero's real part counts as zero: the approximation stage gives bit-exact pairs, so this only forgives
 * roots a caller computed with a few ulps of asymmetry.
 */
const PAIR_TOLERANCE = 1e-9;

function isFiniteComplex(z: unknown): z is Complex {
  return typeof z === 'object' && z !== null && Number.isFinite((z as Complex).re) && Number.isFinite((z as Complex).im);
}

/** Splits roots into upper-half-plane representatives (one per conjugate pair) and real roots. */
function pairConjugates(roots: readonly Complex[], path: string): { upper: Complex[]; real: number[] } {
  const upper: Complex[] = [];
  const lower: Complex[] = [];
  const real: number[] = [];
  roots.forEach((z, i) => {
    if (!isFiniteComplex(z)) throw new InvalidInputError('INVALID_NUMBER', `${path}[${i}]`, z, 'must be a { re, im } of finite numbers');
    if (z.im > 0) upper.push(z);
    else if (z.im < 0) lower.push(z);
    else real.push(z.re);
  });
  if (upper.length !== lower.length) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, roots, 'complex roots must come in conjugate pairs');
  }
  const unmatched = lower.slice();
  for (const u of upper) {
    let best = -1;
    let bestDistance = Infinity;
    unmatched.forEach((l, j) => {
      const d = Math.hypot(u.re - l.re, u.im + l.im);
      if (d < bestDistance) [best, bestDistance] = [j, d];
    });
    if (best < 0 || bestDistance > PAIR_TOLERANCE * Math.hypot(u.re, u.im)) {
      throw new InvalidInputError('INVALID_ARGUMENT', path, u, 'has no conjugate partner');
    }
    unmatched.splice(best, 1);
  }
  return { upper, real };
}

/** Builds E(s), P(s) and the transmission-zero frequencies; validates the prototype. */
export function prototypePolynomials(zpk: PrototypeZpk, path = 'prototype'): PrototypePolynomials {
  if (typeof zpk !== 'object' || zpk === null || !Array.isArray(zpk.poles) || !Array.isArray(zpk.zeros)) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, zpk, 'must be { zeros: Complex[], poles: Complex[], gain: number }');
  }
  if (zpk.poles.length < 1) throw new InvalidInputError('OUT_OF_RANGE', `${path}.poles`, zpk.poles, 'needs at least one pole');
  const poles = pairConjugates(zpk.poles, `${path}.poles`);
  let E: Poly = Poly.ONE;
  for (const u of poles.upper) {
    if (!(u.re < 0)) throw new UnrealizableError('UNSTABLE', `${path}.poles`, u, 'every pole must lie in the open left half-plane');
    const a = fractionFromDouble(u.re);
    const b = fractionFromDouble(u.im);
    E = E.mul(Poly.fromCoefficients([a.mul(a).add(b.mul(b)), a.mul(-2), Q1])); // (s - a)^2 + b^2
  }
  for (const r of poles.real) {
    if (!(r < 0)) throw new UnrealizableError('UNSTABLE', `${path}.poles`, r, 'every pole must lie in the open left half-plane');
    E = E.mul(Poly.fromCoefficients([fractionFromDouble(r).neg(), Q1]));
  }
  const zeros = pairConjugates(zpk.zeros, `${path}.zeros`);
  if (zeros.real.length > 0) {
    throw new UnrealizableError(
      'UNREALIZABLE',
      `${path}.zeros`,
      zeros.real,
      'a ladder of this kind has transmission zeros only on the j-axis away from DC (real-axis zeros need a lattice or bridged network)',
    );
  }
  const zeroOmegaSquared: Fraction[] = [];
  let P: Poly = Poly.ONE;
  for (const z of zeros.upper) {
    if (Math.abs(z.re) > PAIR_TOLERANCE * z.im) {
      throw new UnrealizableError('UNREALIZABLE', `${path}.zeros`, z, 'transmission zeros must lie on the j-axis for a ladder');
    }
    const w = fractionFromDouble(z.im);
    const w2 = w.mul(w);
    zeroOmegaSquared.push(w2);
    P = P.mul(Poly.fromCoefficients([w2, Q0, Q1]));
  }
  zeroOmegaSquared.sort((x, y) => x.compare(y));
  if (!Number.isFinite(zpk.gain) || zpk.gain === 0) {
    throw new InvalidInputError('INVALID_NUMBER', `${path}.gain`, zpk.gain, 'must be a finite nonzero number');
  }
  return { E, P, zeroOmegaSquared };
}

/** The polynomial q(y) with q(s^2) = p(s) for an even polynomial p (odd coefficients are ignored). */
export function evenToSquareVariable(p: Poly): Poly {
  return Poly.fromCoefficients(p.coefficients.filter((_, i) => i % 2 === 0));
}

/** p(s) = q(s^2): the inverse of {@link evenToSquareVariable}. */
export function squareVariableToEven(q: Poly): Poly {
  const out: Fraction[] = [];
  q.coefficients.forEach((c, i) => {
    out[2 * i] = c;
    out[2 * i + 1] = Q0;
  });
  return Poly.fromCoefficients(out.length ? out : [Q0]);
}
