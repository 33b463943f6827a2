/**
 * Roots of a real polynomial in Float64 by the Aberth-Ehrlich simultaneous iteration with Newton
 * polishing, for the Bessel prototype (the only approximation without closed-form poles).
 *
 * O. Aberth, "Iteration methods for finding all zeros of a polynomial simultaneously", Math. Comp. 27
 * (1973) 339-344; L. W. Ehrlich, "A modified Newton method for polynomials", CACM 10 (1967) 107-108;
 * starting points on a circle as in D. A. Bini, "Numerical computation of polynomial zeros by means of
 * Aberth's method", Numer. Algorithms 13 (1996) 179-200.
 *
 * Polishing evaluates the polynomial in double-double arithmetic (compensated Horner: S. Graillat,
 * N. Louvet, P. Langlois, "Compensated Horner scheme", 2005; error-free transformations of T. J. Dekker,
 * "A floating-point technique for extending the available precision", Numer. Math. 18 (1971) 224-242),
 * so the Newton step sees an accurate residual and converges to the root rounded to Float64 even where
 * plain Horner loses digits (reverse Bessel polynomials of order 11..15 lost 1e-12..2e-10 with it).
 *
 * A kernel: no throws; a polynomial it cannot solve gives NaN roots.
 */

import { type Complex, cAbs, cAdd, cDiv, cInv, cMul, cSub } from '../algebra/complex.js';

/** p(z) and p'(z) by Horner's rule, coefficients ascending. */
function hornerWithDerivative(coefficients: readonly number[], z: Complex): { p: Complex; dp: Complex } {
  const n = coefficients.length - 1;
  let p: Complex = { re: coefficients[n], im: 0 };
  let dp: Complex = { re: 0, im: 0 };
  for (let i = n - 1; i >= 0; i--) {
    dp = cAdd(cMul(dp, z), p);
    p = cAdd(cMul(p, z), { re: coefficients[i], im: 0 });
  }
  return { p, dp };
}

/** Dekker's splitter for Float64: 2^27 + 1. */
const SPLITTER = 134217729;

/** A double-double number hi + lo with |lo| <= ulp(hi)/2. */
interface DD {
  hi: number;
  lo: number;
}

/** a + b exactly as hi + lo (Knuth's TwoSum). */
function twoSum(a: number, b: number): DD {
  const hi = a + b;
  const bb = hi - a;
  return { hi, lo: a - (hi - bb) + (b - bb) };
}

/** a * b exactly as hi + lo (Dekker's TwoProduct, no FMA in JavaScript). */
function twoProduct(a: number, b: number): DD {
  const hi = a * b;
  const ta = SPLITTER * a;
  const ah = ta - (ta - a);
  const al = a - ah;
  const tb = SPLITTER * b;
  const bh = tb - (tb - b);
  const bl = b - bh;
  return { hi, lo: ah * bh - hi + ah * bl + al * bh + al * bl };
}

function ddAdd(a: DD, b: DD): DD {
  const s = twoSum(a.hi, b.hi);
  const lo = s.lo + a.lo + b.lo;
  const hi = s.hi + lo;
  return { hi, lo: lo - (hi - s.hi) };
}

function ddTimes(a: DD, b: number): DD {
  const p = twoProduct(a.hi, b);
  const lo = p.lo + a.lo * b;
  const hi = p.hi + lo;
  return { hi, lo: lo - (hi - p.hi) };
}

const ddNeg = (a: DD): DD => ({ hi: -a.hi, lo: -a.lo });

/** p(z) by Horner's rule in double-double complex arithmetic, rounded to Float64 at the end. */
export function evaluateAccurately(coefficients: readonly number[], z: Complex): Complex {
  const n = coefficients.length - 1;
  let re: DD = { hi: coefficients[n], lo: 0 };
  let im: DD = { hi: 0, lo: 0 };
  for (let i = n - 1; i >= 0; i--) {
    const nextRe = ddAdd(ddAdd(ddTimes(re, z.re), ddNeg(ddTimes(im, z.im))), { hi: coefficients[i], lo: 0 });
    im = ddAdd(ddTimes(re, z.im), ddTimes(im, z.re));
    re = nextRe;
  }
  return { re: re.hi + re.lo, im: im.hi + im.lo };
}

/** Aberth sweeps allowed: convergence is cubic near simple roots; 200 covers bad starting circles. */
const MAX_ABERTH_SWEEPS = 200;
/** Newton polishing steps after Aberth: each doubles the digits; 4 is more than float needs. */
const POLISH_STEPS = 4;

/**
 * All roots of sum_i coefficients[i] z^i (ascending, real, leading and constant coefficient nonzero),
 * in no particular order.
 */
export function polynomialRoots(coefficients: readonly number[]): Complex[] {
  const n = coefficients.length - 1;
  if (n < 1) return [];
  // Starting circle: the geometric mean of the root moduli, |a0/an|^(1/n); angles offset from the real
  // axis so that no two starting points are conjugates of each other.
  const radius = Math.abs(coefficients[0] / coefficients[n]) ** (1 / n);
  const z: Complex[] = [];
  for (let i = 0; i < n; i++) {
    const angle = (2 * Math.PI * i) / n + 0.4;
    z.push({ re: radius * Math.cos(angle), im: radius * Math.sin(angle) });
  }
  for (let sweep = 0; sweep < MAX_ABERTH_SWEEPS; sweep++) {
    let largestStep = 0;
    for (let i = 0; i < n; i++) {
      const { p, dp } = hornerWithDerivative(coefficients, z[i]);
      if (p.re === 0 && p.im === 0) continue;
      const ratio = cDiv(p, dp); // Newton correction p/p'
      let sum: Complex = { re: 0, im: 0 };
      for (let j = 0; j < n; j++) if (j !== i) sum = cAdd(sum, cInv(cSub(z[i], z[j])));
      const step = cDiv(ratio, cSub({ re: 1, im: 0 }, cMul(ratio, sum)));
      z[i] = cSub(z[i], step);
      largestStep = Math.max(largestStep, cAbs(step) / Math.max(cAbs(z[i]), Number.MIN_VALUE));
    }
    if (largestStep <= 4 * Number.EPSILON) break;
  }
  return z.map((root) => polishRoot(coefficients, root));
}

/**
 * Newton steps on one root with the residual from {@link evaluateAccurately} (the derivative needs no
 * extra precision), keeping the last iterate whose residual did not grow.
 */
export function polishRoot(coefficients: readonly number[], start: Complex): Complex {
  let best = start;
  let p = evaluateAccurately(coefficients, start);
  let bestResidual = cAbs(p);
  let z = start;
  for (let i = 0; i < POLISH_STEPS && bestResidual > 0; i++) {
    z = cSub(z, cDiv(p, hornerWithDerivative(coefficients, z).dp));
    p = evaluateAccurately(coefficients, z);
    const residual = cAbs(p);
    if (!(residual < bestResidual)) break;
    best = z;
    bestResidual = residual;
  }
  return best;
}
