/**
 * Compensated (double-double) Horner evaluation of a real polynomial at a complex point: the residual
 * that Newton polishing needs where plain Horner loses digits (reverse Bessel polynomials of order
 * 11..15 lost 1e-12..2e-10 with it). Error-free transformations of T. J. Dekker, "A floating-point
 * technique for extending the available precision", Numer. Math. 18 (1971) 224-242; compensated Horner
 * as in S. Graillat, N. Louvet, P. Langlois, "Compensated Horner scheme", 2005.
 */
import type { Complex } from './complex';

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

