/**
 * Reduction of num/den (integer polynomials from the elimination) to a canonical RationalFunction,
 * fast in the common case where num and den are coprime.
 *
 * The coprimality certificate is modular: for a prime p dividing neither leading coefficient,
 * deg gcd(num mod p, den mod p) >= deg gcd(num, den) over Q (the true gcd G divides both, and p does not
 * divide lc(G), which divides the leading coefficients; see J. von zur Gathen and J. Gerhard, "Modern
 * Computer Algebra", 3rd ed., section 6.4, on modular gcd). So a constant gcd modulo one such prime
 * proves num and den coprime over Q, and the Euclidean algorithm over Q, whose intermediate coefficients
 * grow to thousands of digits for degree-20 inputs with 300-digit coefficients, is not needed.
 * Otherwise the general reduction of RationalFunction.fromPolys runs.
 */
import { Fraction, Poly, RationalFunction } from '../algebra/index';
import { ipContent, type IntPoly } from './int-poly';

/** Primes below 2^26, so a product of two residues stays below 2^52 and is exact in a double. */
const PRIME_LIMIT = 2 ** 26;
/** How many primes to try before falling back; a random-looking prime divides a leading coefficient rarely. */
const PRIMES_TRIED = 3;

let primes: number[] | null = null;
function modularPrimes(): number[] {
  if (primes) return primes;
  const out: number[] = [];
  for (let c = PRIME_LIMIT - 1; out.length < PRIMES_TRIED; c -= 2) {
    let prime = true;
    for (let d = 3; d * d <= c; d += 2) {
      if (c % d === 0) {
        prime = false;
        break;
      }
    }
    if (prime) out.push(c);
  }
  primes = out;
  return out;
}

/** num/den reduced and normalised (monic denominator). Throws nothing for a nonzero den. */
export function reduceToRational(num: IntPoly, den: IntPoly): RationalFunction {
  if (num.length === 0) return RationalFunction.ZERO;
  const cn = ipContent(num);
  const cd = ipContent(den);
  const pn = num.map((x) => x / cn);
  const pd = den.map((x) => x / cd);
  if (pn.length > 1 && pd.length > 1 && !provablyCoprime(pn, pd)) {
    return RationalFunction.fromPolys(Poly.fromCoefficients(pn), Poly.fromCoefficients(pd)).scale(new Fraction(cn, cd));
  }
  // Coprime: only normalise. N/D = (cn pn) / (cd pd); divide through by cd * lead(pd).
  const lead = pd[pd.length - 1];
  const scaleDen = cd * lead;
  const n = Poly.fromCoefficients(pn.map((x) => new Fraction(x * cn, scaleDen)));
  const d = Poly.fromCoefficients(pd.map((x) => new Fraction(x, lead)));
  return coprimeRational(n, d);
}

/**
 * A RationalFunction from a numerator and a monic denominator already known to be coprime, without the
 * gcd that RationalFunction.fromPolys would recompute. The result is exactly what fromPolys would
 * return (the same reduced, monic representation); only the redundant work is skipped.
 */
function coprimeRational(num: Poly, den: Poly): RationalFunction {
  const out = Object.create(RationalFunction.prototype) as { num: Poly; den: Poly };
  out.num = num;
  out.den = den;
  return out as unknown as RationalFunction;
}

/** True when some prime not dividing either leading coefficient gives a constant gcd. */
function provablyCoprime(a: IntPoly, b: IntPoly): boolean {
  for (const p of modularPrimes()) {
    const P = BigInt(p);
    const am = a.map((x) => Number(((x % P) + P) % P));
    const bm = b.map((x) => Number(((x % P) + P) % P));
    if (am[am.length - 1] === 0 || bm[bm.length - 1] === 0) continue;
    return gcdDegreeMod(am, bm, p) === 0;
  }
  return false;
}

/** Degree of gcd(a, b) over GF(p), ascending residues with nonzero leading entries. */
function gcdDegreeMod(a0: number[], b0: number[], p: number): number {
  let a = a0.slice();
  let b = b0.slice();
  trimMod(a);
  trimMod(b);
  if (a.length < b.length) [a, b] = [b, a];
  while (b.length > 0) {
    // a <- a mod b
    const inv = invMod(b[b.length - 1], p);
    while (a.length >= b.length) {
      const f = (a[a.length - 1] * inv) % p;
      const shift = a.length - b.length;
      for (let j = 0; j < b.length; j++) a[shift + j] = (a[shift + j] - ((f * b[j]) % p) + p) % p;
      trimMod(a);
      if (a.length === 0) break;
    }
    [a, b] = [b, a];
  }
  return a.length - 1;
}

function trimMod(a: number[]): void {
  while (a.length > 0 && a[a.length - 1] === 0) a.pop();
}

/** x^-1 mod p by the extended Euclidean algorithm (x nonzero mod p). */
function invMod(x: number, p: number): number {
  let [r0, r1] = [p, x % p];
  let [t0, t1] = [0, 1];
  while (r1 !== 0) {
    const q = Math.floor(r0 / r1);
    [r0, r1] = [r1, r0 - q * r1];
    [t0, t1] = [t1, t0 - q * t1];
  }
  return ((t0 % p) + p) % p;
}
