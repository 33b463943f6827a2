/**
 * The peak of |H(jw)|^2 / |H(0)|^2 over w >= 0 for a prototype, which fixes how much termination
 * mismatch the response allows (Feldtkeller: |S21|^2 = t |H|^2/|H(0)|^2 <= 1 needs t <= 1/peak).
 * Stationary points of A(x)/B(x), x = w^2, A = |P(jw)|^2, B = |E(jw)|^2, are the positive roots of
 * A'B - AB' (exact polynomial, float roots); the ratio is then evaluated in product form.
 * A kernel: returns NaN if the roots cannot be found.
 */
import { Poly } from '../algebra/poly';
import { cAbs, cMul, cDiv, cSub, type Complex } from '../algebra/complex';
import { aberthRoots as polynomialRoots } from '../algebra/roots';
import { evenToSquareVariable, type PrototypeZpk } from './prototype-polynomials';

/** |Im x| / |x| below which a stationary point counts as real. */
const REAL_RELATIVE = 1e-6;

/** |H(s)| / |H(0)| from zeros and poles, factor by factor (no overflow). */
export function normalizedMagnitude(zpk: PrototypeZpk, s: Complex): number {
  let h: Complex = { re: 1, im: 0 };
  const n = Math.max(zpk.zeros.length, zpk.poles.length);
  for (let i = 0; i < n; i++) {
    if (i < zpk.zeros.length) {
      const z = zpk.zeros[i];
      h = cMul(h, cDiv(cSub(s, z), { re: -z.re, im: -z.im }));
    }
    if (i < zpk.poles.length) {
      const p = zpk.poles[i];
      h = cDiv(h, cDiv(cSub(s, p), { re: -p.re, im: -p.im }));
    }
  }
  return cAbs(h);
}

/** max over w of |H(jw)|^2 / |H(0)|^2 (at least 1: w = 0 counts). */
/**
 * N(x) = A'(x) B(x) - A(x) B'(x), x = w^2, A = |P(jw)|^2, B = |E(jw)|^2: its positive roots are the
 * stationary points of |H|^2 (exact; the maxima are simple roots, so well conditioned, unlike the double
 * roots of the Feldtkeller polynomial there).
 */
export function stationaryPolynomial(E: Poly, P: Poly, magnitudes = false): Poly {
  if (magnitudes) {
    // Every product with its magnitude, no cancellation: a bound on the terms each coefficient sums.
    const pos = (p: Poly): Poly => Poly.fromCoefficients(p.coefficients.map((c) => c.abs()));
    const A = evenToSquareVariable(pos(P).mul(pos(P)));
    const B = evenToSquareVariable(pos(E).mul(pos(E)));
    return A.derivative().mul(B).add(A.mul(B.derivative()));
  }
  const A = evenToSquareVariable(P.mul(P.negateVariable())).negateVariable(); // |P(jw)|^2 in x = w^2
  const B = evenToSquareVariable(E.mul(E.negateVariable())).negateVariable();
  return A.derivative().mul(B).sub(A.mul(B.derivative()));
}

export function peakPowerRatio(zpk: PrototypeZpk, E: Poly, P: Poly): number {
  const N = stationaryPolynomial(E, P);
  let peak = 1;
  if (N.degree < 1) return peak;
  // Strip roots at x = 0 (a flat DC response), which are not interior maxima.
  let k = 0;
  while (N.coefficient(k).n === 0n) k++;
  const stripped = Poly.fromCoefficients(N.coefficients.slice(k));
  if (stripped.degree < 1) return peak;
  for (const x of polynomialRoots(stripped.toFloatCoefficients(), { polish: false })) {
    if (!Number.isFinite(x.re) || !Number.isFinite(x.im)) return NaN;
    if (x.re > 0 && Math.abs(x.im) <= REAL_RELATIVE * x.re) {
      const m = normalizedMagnitude(zpk, { re: 0, im: Math.sqrt(x.re) });
      peak = Math.max(peak, m * m);
    }
  }
  return peak;
}
