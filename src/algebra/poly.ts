/**
 * Exact polynomials in s over the rationals Q. Immutable; coefficients ascending (index i holds the
 * coefficient of s^i) and trimmed, so the zero polynomial has no coefficients and degree -1, and two
 * equal polynomials have identical coefficient lists.
 */
import { Fraction, Q0, Q1, toFraction, fractionToNumber, type RationalLike } from './rational';
import type { Complex } from './complex';
import { ArithmeticError } from '../errors';
import { gcdBig as gcdInt, ipContent, ipExactQuotient, ipGcd, ipLinear, ipMul, ipPseudoDivide, ipTrim, type IntPoly } from './integer-poly';

/** A Gaussian rational re + j*im with exact parts. */
export interface GaussianRational {
  readonly re: Fraction;
  readonly im: Fraction;
}

export class Poly {
  /**
   * Internal form: integer coefficients `ints` (ascending, trimmed) over one positive common
   * denominator `scale`, reduced so that gcd(content(ints), scale) = 1. The representation is canonical,
   * arithmetic runs on bigint arrays (no per-coefficient rational gcd), and `coefficients` is built
   * lazily.
   */
  private readonly ints: IntPoly;
  private readonly scaleDen: bigint;
  private cachedCoefficients: readonly Fraction[] | null = null;
  private cachedFloat: number[] | null = null;

  private constructor(ints: IntPoly, den: bigint, normalised = false) {
    const t = ipTrim(ints);
    if (normalised || t.length === 0) {
      this.ints = t;
      this.scaleDen = t.length === 0 ? 1n : den;
      return;
    }
    let d = den;
    let n = t;
    if (d < 0n) {
      d = -d;
      n = n.map((c) => -c);
    }
    const g = gcdInt(ipContent(n), d);
    this.ints = g === 1n ? n : n.map((c) => c / g);
    this.scaleDen = g === 1n ? d : d / g;
  }

  private static fromFractions(fs: readonly Fraction[]): Poly {
    let lcm = 1n;
    for (const c of fs) if (c.n !== 0n) lcm = (lcm / gcdInt(lcm, c.d)) * c.d;
    return new Poly(
      fs.map((c) => (c.s * c.n * lcm) / c.d),
      lcm,
    );
  }

  static readonly ZERO = new Poly([], 1n, true);
  static readonly ONE = new Poly([1n], 1n, true);
  /** The polynomial s. */
  static readonly S = new Poly([0n, 1n], 1n, true);

  /** Ascending coefficients, trimmed: the last one (the leading coefficient) is never zero. */
  get coefficients(): readonly Fraction[] {
    if (this.cachedCoefficients === null) {
      const d = this.scaleDen;
      this.cachedCoefficients = Object.freeze(this.ints.map((c) => (c === 0n ? Q0 : new Fraction(c, d))));
    }
    return this.cachedCoefficients;
  }

  /** The integer numerator coefficients and the common denominator: p = ints / den, reduced. */
  toIntegerForm(): { ints: readonly bigint[]; den: bigint } {
    return { ints: this.ints, den: this.scaleDen };
  }

  /** From integer coefficients over a common denominator (default 1). */
  static fromIntegers(ascending: readonly bigint[], den: bigint = 1n): Poly {
    if (den === 0n) throw new ArithmeticError('DIVISION_BY_ZERO', 'den', '0', 'polynomial with zero denominator');
    return new Poly(ascending.slice(), den);
  }

  /** From ascending coefficients; numbers are taken exactly (every double is a rational), strings as written. */
  static fromCoefficients(ascending: readonly RationalLike[]): Poly {
    return Poly.fromFractions(ascending.map((c, i) => toFraction(c, `coefficients[${i}]`)));
  }

  /** From descending coefficients (highest power first), as polynomials are usually written. */
  static fromDescending(descending: readonly RationalLike[]): Poly {
    return Poly.fromCoefficients([...descending].reverse());
  }

  static constant(c: RationalLike): Poly {
    return Poly.fromFractions([toFraction(c)]);
  }

  /** c * s^k. */
  static monomial(c: RationalLike, k: number): Poly {
    const f = toFraction(c);
    const ints: bigint[] = new Array(k + 1).fill(0n);
    ints[k] = f.s * f.n;
    return new Poly(ints, f.d);
  }

  /** prod (s - r_i) for rational roots. */
  static fromRoots(roots: readonly RationalLike[]): Poly {
    return roots.reduce<Poly>((acc, r) => {
      const f = toFraction(r);
      return acc.mul(new Poly([-f.s * f.n, f.d], f.d));
    }, Poly.ONE);
  }

  /** Degree; -1 for the zero polynomial. */
  get degree(): number {
    return this.ints.length - 1;
  }

  isZero(): boolean {
    return this.ints.length === 0;
  }

  /** The coefficient of s^i (zero beyond the degree). */
  coefficient(i: number): Fraction {
    return i < this.ints.length ? this.coefficients[i] : Q0;
  }

  /** The leading coefficient; zero for the zero polynomial. */
  get leading(): Fraction {
    return this.ints.length === 0 ? Q0 : new Fraction(this.ints[this.ints.length - 1], this.scaleDen);
  }

  add(other: Poly): Poly {
    if (other.isZero()) return this;
    if (this.isZero()) return other;
    const g = gcdInt(this.scaleDen, other.scaleDen);
    const ka = other.scaleDen / g;
    const kb = this.scaleDen / g;
    return new Poly(ipLinear(this.ints, ka, other.ints, kb), this.scaleDen * ka);
  }

  sub(other: Poly): Poly {
    return this.add(other.neg());
  }

  neg(): Poly {
    return new Poly(this.ints.map((c) => -c), this.scaleDen, true);
  }

  /** Multiplies every coefficient by the rational c. */
  scale(c: RationalLike): Poly {
    const k = toFraction(c);
    if (k.n === 0n) return Poly.ZERO;
    const kn = k.s * k.n;
    return new Poly(this.ints.map((x) => x * kn), this.scaleDen * k.d);
  }

  mul(other: Poly): Poly {
    if (this.isZero() || other.isZero()) return Poly.ZERO;
    return new Poly(ipMul(this.ints, other.ints), this.scaleDen * other.scaleDen);
  }

  /** this^k for a non-negative integer k, by repeated squaring. */
  pow(k: number): Poly {
    let result: Poly = Poly.ONE;
    let base: Poly = this;
    let e = k;
    while (e > 0) {
      if (e & 1) result = result.mul(base);
      base = base.mul(base);
      e >>= 1;
    }
    return result;
  }

  /** Multiplies by s^k (shifts coefficients up). */
  shift(k: number): Poly {
    if (this.isZero() || k === 0) return this;
    return new Poly([...new Array<bigint>(k).fill(0n), ...this.ints], this.scaleDen, true);
  }

  /**
   * Euclidean division over Q: this = quotient * divisor + remainder, deg remainder < deg divisor.
   * Computed by integer pseudo-division and one rescaling. Throws ArithmeticError when the divisor is
   * the zero polynomial.
   */
  divmod(divisor: Poly): { quotient: Poly; remainder: Poly } {
    if (divisor.isZero()) throw new ArithmeticError('DIVISION_BY_ZERO', 'divisor', '0', 'polynomial division by zero');
    if (this.degree < divisor.degree) return { quotient: Poly.ZERO, remainder: this };
    // A = An/Ad, B = Bn/Bd; lead^k An = Qz Bn + Rz, so A = (Qz Bd / (lead^k Ad)) B + Rz / (lead^k Ad).
    const exact = ipExactQuotient(this.ints, divisor.ints);
    if (exact) return { quotient: new Poly(exact.map((c) => c * divisor.scaleDen), this.scaleDen), remainder: Poly.ZERO };
    const { q, r, k } = ipPseudoDivide(this.ints, divisor.ints);
    const lk = divisor.ints[divisor.ints.length - 1] ** BigInt(k);
    return {
      quotient: new Poly(q.map((c) => c * divisor.scaleDen), lk * this.scaleDen),
      remainder: new Poly(r, lk * this.scaleDen),
    };
  }

  /** The monic polynomial with the same roots (the zero polynomial stays zero). */
  monic(): Poly {
    if (this.isZero()) return this;
    const lead = this.ints[this.ints.length - 1];
    if (lead === this.scaleDen) return this;
    return new Poly(this.ints, lead);
  }

  /** Greatest common divisor, monic (gcd(0, 0) = 0), by the modular algorithm of integer-poly.ts. */
  gcd(other: Poly): Poly {
    if (this.isZero() && other.isZero()) return Poly.ZERO;
    return new Poly(ipGcd(this.ints, other.ints), 1n).monic();
  }

  /**
   * The primitive part over Z: this polynomial scaled by a positive rational so that its coefficients
   * are coprime integers. Leaves the roots unchanged; the zero polynomial stays zero.
   */
  primitive(): Poly {
    if (this.isZero()) return this;
    return new Poly(this.ints, 1n);
  }

  derivative(): Poly {
    return new Poly(this.ints.slice(1).map((c, i) => c * BigInt(i + 1)), this.scaleDen);
  }

  /** p(q(s)): composition with another polynomial, by Horner's rule. */
  compose(inner: Poly): Poly {
    let acc: Poly = Poly.ZERO;
    for (let i = this.ints.length - 1; i >= 0; i--) acc = acc.mul(inner).add(new Poly([this.ints[i]], this.scaleDen));
    return acc;
  }

  /**
   * The homogenised composition with a ratio: returns P with p(num/den) = P / den^deg(p). Used by every
   * rational substitution (s -> k/s, s -> (s^2 + w0^2)/(B s), ...).
   */
  composeRatio(num: Poly, den: Poly): Poly {
    const n = this.degree;
    if (n < 0) return Poly.ZERO;
    const numPowers: Poly[] = [Poly.ONE];
    for (let i = 1; i <= n; i++) numPowers.push(numPowers[i - 1].mul(num));
    let denPower: Poly = Poly.ONE;
    let acc: Poly = Poly.ZERO;
    for (let i = n; i >= 0; i--) {
      // term a_i * num^i * den^(n - i)
      const c = this.ints[i];
      if (c !== 0n) acc = acc.add(numPowers[i].mul(denPower).scale(new Fraction(c, this.scaleDen)));
      denPower = denPower.mul(den);
    }
    return acc;
  }

  /** s^deg * p(1/s): the coefficients reversed. */
  reverse(): Poly {
    return new Poly(this.ints.slice().reverse(), this.scaleDen);
  }

  /** p(k*s) for a rational k: coefficient i times k^i. */
  scaleVariable(k: RationalLike): Poly {
    const f = toFraction(k);
    const kn = f.s * f.n;
    const n = this.ints.length;
    // coefficient i times kn^i kd^(n-1-i) over kd^(n-1)
    const out: bigint[] = new Array(n);
    let pn = 1n;
    const dPowers: bigint[] = [1n];
    for (let i = 1; i < n; i++) dPowers.push(dPowers[i - 1] * f.d);
    for (let i = 0; i < n; i++) {
      out[i] = this.ints[i] * pn * dPowers[n - 1 - i];
      pn *= kn;
    }
    return new Poly(out, this.scaleDen * (n > 0 ? dPowers[n - 1] : 1n));
  }

  /** p(-s): the sign of odd coefficients flipped. */
  negateVariable(): Poly {
    return new Poly(this.ints.map((c, i) => (i % 2 === 1 ? -c : c)), this.scaleDen, true);
  }

  /** The even part: sum a_2k s^2k. */
  evenPart(): Poly {
    return new Poly(this.ints.map((c, i) => (i % 2 === 0 ? c : 0n)), this.scaleDen);
  }

  /** The odd part: sum a_(2k+1) s^(2k+1). */
  oddPart(): Poly {
    return new Poly(this.ints.map((c, i) => (i % 2 === 1 ? c : 0n)), this.scaleDen);
  }

  /** Exact value at a rational point, by Horner's rule in integers. */
  evaluate(x: RationalLike): Fraction {
    const v = toFraction(x, 'x');
    const vn = v.s * v.n;
    // sum c_i vn^i vd^(n-i) / (vd^n den)
    let acc = 0n;
    let dPow = 1n;
    for (let i = this.ints.length - 1; i >= 0; i--) {
      acc = acc * vn + this.ints[i] * dPow;
      dPow *= v.d;
    }
    if (this.ints.length === 0) return Q0;
    return new Fraction(acc, this.scaleDen * (dPow / v.d));
  }

  /** Exact value at a Gaussian rational re + j*im, by Horner's rule in Q[j]. */
  evaluateGaussian(x: { re: RationalLike; im: RationalLike }): GaussianRational {
    const xr = toFraction(x.re, 'x.re');
    const xi = toFraction(x.im, 'x.im');
    const cs = this.coefficients;
    let re = Q0;
    let im = Q0;
    for (let i = cs.length - 1; i >= 0; i--) {
      const nr = re.mul(xr).sub(im.mul(xi)).add(cs[i]);
      im = re.mul(xi).add(im.mul(xr));
      re = nr;
    }
    return { re, im };
  }

  /** The coefficients as doubles, each correctly rounded. This is the algebra's float boundary. */
  toFloatCoefficients(): number[] {
    if (this.cachedFloat === null) this.cachedFloat = this.coefficients.map(fractionToNumber);
    return this.cachedFloat.slice();
  }

  /**
   * Float value at complex s, by Horner's rule on the correctly rounded coefficients. Returns NaN or
   * Infinity parts when the value overflows; never throws. For large |s| and high degree, evaluate the
   * reversed polynomial at 1/s instead: see {@link RationalFunction.evaluateComplex}.
   */
  evaluateComplex(s: Complex): Complex {
    return hornerComplex(this.toFloatCoefficients(), s);
  }

  equals(other: Poly): boolean {
    if (this === other) return true;
    const a = this.ints;
    const b = other.ints;
    if (a.length !== b.length || this.scaleDen !== other.scaleDen) return false;
    for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
    return true;
  }

  /** Human-readable, highest power first: '2*s^2 - 1/3*s + 5'. */
  toString(variable = 's'): string {
    if (this.isZero()) return '0';
    const parts: string[] = [];
    const cs = this.coefficients;
    for (let i = cs.length - 1; i >= 0; i--) {
      const c = cs[i];
      if (c.n === 0n) continue;
      const mag = c.abs();
      const sign = c.s < 0n ? '-' : '+';
      const power = i === 0 ? '' : i === 1 ? variable : `${variable}^${i}`;
      const coeff = i > 0 && mag.equals(Q1) ? '' : mag.toFraction();
      const term = coeff && power ? `${coeff}*${power}` : coeff || power;
      parts.push(parts.length === 0 ? (sign === '-' ? `-${term}` : term) : `${sign} ${term}`);
    }
    return parts.join(' ');
  }
}

/** Horner's rule at complex s on float coefficients (ascending). Shared by the float evaluators. */
export function hornerComplex(ascending: readonly number[], s: Complex): Complex {
  let re = 0;
  let im = 0;
  for (let i = ascending.length - 1; i >= 0; i--) {
    const nr = re * s.re - im * s.im + ascending[i];
    im = re * s.im + im * s.re;
    re = nr;
  }
  return { re, im };
}

export { gcdInt as gcdBig };
