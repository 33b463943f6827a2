/**
 * Exact polynomials in s over the rationals Q. Immutable; coefficients ascending (index i holds the
 * coefficient of s^i) and trimmed, so the zero polynomial has no coefficients and degree -1, and two
 * equal polynomials have identical coefficient lists.
 */
import { Fraction, Q0, Q1, toFraction, fractionToNumber, type RationalLike } from './rational';
import type { Complex } from './complex';
import { ArithmeticError } from '../errors';

/** A Gaussian rational re + j*im with exact parts. */
export interface GaussianRational {
  readonly re: Fraction;
  readonly im: Fraction;
}

export class Poly {
  /** Ascending coefficients, trimmed: the last one (the leading coefficient) is never zero. */
  readonly coefficients: readonly Fraction[];

  private constructor(coefficients: Fraction[]) {
    let n = coefficients.length;
    while (n > 0 && coefficients[n - 1].n === 0n) n--;
    this.coefficients = Object.freeze(n === coefficients.length ? coefficients : coefficients.slice(0, n));
  }

  static readonly ZERO = new Poly([]);
  static readonly ONE = new Poly([Q1]);
  /** The polynomial s. */
  static readonly S = new Poly([Q0, Q1]);

  /** From ascending coefficients; numbers are taken exactly (every double is a rational), strings as written. */
  static fromCoefficients(ascending: readonly RationalLike[]): Poly {
    return new Poly(ascending.map((c, i) => toFraction(c, `coefficients[${i}]`)));
  }

  /** From descending coefficients (highest power first), as polynomials are usually written. */
  static fromDescending(descending: readonly RationalLike[]): Poly {
    return Poly.fromCoefficients([...descending].reverse());
  }

  static constant(c: RationalLike): Poly {
    return new Poly([toFraction(c)]);
  }

  /** c * s^k. */
  static monomial(c: RationalLike, k: number): Poly {
    const out: Fraction[] = new Array(k + 1).fill(Q0);
    out[k] = toFraction(c);
    return new Poly(out);
  }

  /** prod (s - r_i) for rational roots. */
  static fromRoots(roots: readonly RationalLike[]): Poly {
    return roots.reduce<Poly>((acc, r) => acc.mul(new Poly([toFraction(r).neg(), Q1])), Poly.ONE);
  }

  /** Degree; -1 for the zero polynomial. */
  get degree(): number {
    return this.coefficients.length - 1;
  }

  isZero(): boolean {
    return this.coefficients.length === 0;
  }

  /** The coefficient of s^i (zero beyond the degree). */
  coefficient(i: number): Fraction {
    return this.coefficients[i] ?? Q0;
  }

  /** The leading coefficient; zero for the zero polynomial. */
  get leading(): Fraction {
    return this.coefficients[this.coefficients.length - 1] ?? Q0;
  }

  add(other: Poly): Poly {
    const a = this.coefficients;
    const b = other.coefficients;
    const n = Math.max(a.length, b.length);
    const out: Fraction[] = new Array(n);
    for (let i = 0; i < n; i++) out[i] = i >= a.length ? b[i] : i >= b.length ? a[i] : a[i].add(b[i]);
    return new Poly(out);
  }

  sub(other: Poly): Poly {
    return this.add(other.neg());
  }

  neg(): Poly {
    return new Poly(this.coefficients.map((c) => c.neg()));
  }

  /** Multiplies every coefficient by the rational c. */
  scale(c: RationalLike): Poly {
    const k = toFraction(c);
    if (k.n === 0n) return Poly.ZERO;
    return new Poly(this.coefficients.map((x) => x.mul(k)));
  }

  mul(other: Poly): Poly {
    const a = this.coefficients;
    const b = other.coefficients;
    if (a.length === 0 || b.length === 0) return Poly.ZERO;
    const out: Fraction[] = new Array(a.length + b.length - 1).fill(Q0);
    for (let i = 0; i < a.length; i++) {
      if (a[i].n === 0n) continue;
      for (let j = 0; j < b.length; j++) out[i + j] = out[i + j].add(a[i].mul(b[j]));
    }
    return new Poly(out);
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
    return new Poly([...new Array(k).fill(Q0), ...this.coefficients]);
  }

  /**
   * Euclidean division: this = quotient * divisor + remainder, deg remainder < deg divisor.
   * Throws ArithmeticError when the divisor is the zero polynomial.
   */
  divmod(divisor: Poly): { quotient: Poly; remainder: Poly } {
    if (divisor.isZero()) throw new ArithmeticError('DIVISION_BY_ZERO', 'divisor', '0', 'polynomial division by zero');
    const r = this.coefficients.slice();
    const d = divisor.coefficients;
    const dn = d.length - 1;
    const lead = d[dn];
    if (r.length - 1 < dn) return { quotient: Poly.ZERO, remainder: this };
    const qc: Fraction[] = new Array(r.length - dn).fill(Q0);
    for (let k = r.length - 1; k >= dn; k--) {
      if (r[k].n === 0n) continue;
      const f = r[k].div(lead);
      qc[k - dn] = f;
      for (let j = 0; j <= dn; j++) r[k - dn + j] = r[k - dn + j].sub(f.mul(d[j]));
    }
    return { quotient: new Poly(qc), remainder: new Poly(r.slice(0, dn)) };
  }

  /** The monic polynomial with the same roots (the zero polynomial stays zero). */
  monic(): Poly {
    if (this.isZero()) return this;
    const lead = this.leading;
    if (lead.equals(Q1)) return this;
    return new Poly(this.coefficients.map((c) => c.div(lead)));
  }

  /**
   * Greatest common divisor, monic (gcd(0, 0) = 0). Euclid's algorithm on primitive integer
   * polynomials: each remainder is divided by its content, which keeps the coefficient growth of exact
   * Euclid in check without changing the result up to a constant.
   */
  gcd(other: Poly): Poly {
    let a: Poly = this.primitive();
    let b: Poly = other.primitive();
    if (a.degree < b.degree) [a, b] = [b, a];
    while (!b.isZero()) {
      const r = a.pseudoRemainder(b).primitive();
      a = b;
      b = r;
    }
    return a.monic();
  }

  /** Remainder of lead(b)^(deg a - deg b + 1) * a divided by b: stays in Z[s] for integer inputs. */
  private pseudoRemainder(b: Poly): Poly {
    return this.divmod(b).remainder;
  }

  /**
   * The primitive part over Z: this polynomial scaled by a positive rational so that its coefficients
   * are coprime integers. Leaves the roots unchanged; the zero polynomial stays zero.
   */
  primitive(): Poly {
    if (this.isZero()) return this;
    let lcm = 1n;
    for (const c of this.coefficients) lcm = (lcm / gcdBig(lcm, c.d)) * c.d;
    let g = 0n;
    for (const c of this.coefficients) g = gcdBig(g, (c.n * lcm) / c.d);
    return new Poly(this.coefficients.map((c) => new Fraction(c.s * ((c.n * lcm) / c.d / g))));
  }

  derivative(): Poly {
    return new Poly(this.coefficients.slice(1).map((c, i) => c.mul(i + 1)));
  }

  /** p(q(s)): composition with another polynomial, by Horner's rule. */
  compose(inner: Poly): Poly {
    let acc: Poly = Poly.ZERO;
    for (let i = this.coefficients.length - 1; i >= 0; i--) acc = acc.mul(inner).add(new Poly([this.coefficients[i]]));
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
      const c = this.coefficients[i];
      if (c.n !== 0n) acc = acc.add(numPowers[i].mul(denPower).scale(c));
      denPower = denPower.mul(den);
    }
    return acc;
  }

  /** s^deg * p(1/s): the coefficients reversed. */
  reverse(): Poly {
    return new Poly(this.coefficients.slice().reverse());
  }

  /** p(k*s) for a rational k: coefficient i times k^i. */
  scaleVariable(k: RationalLike): Poly {
    const f = toFraction(k);
    let p = Q1;
    return new Poly(
      this.coefficients.map((c) => {
        const out = c.mul(p);
        p = p.mul(f);
        return out;
      }),
    );
  }

  /** p(-s): the sign of odd coefficients flipped. */
  negateVariable(): Poly {
    return new Poly(this.coefficients.map((c, i) => (i % 2 === 1 ? c.neg() : c)));
  }

  /** The even part as a polynomial in s^2's place: p_even(s) = sum a_2k s^2k. */
  evenPart(): Poly {
    return new Poly(this.coefficients.map((c, i) => (i % 2 === 0 ? c : Q0)));
  }

  /** The odd part: sum a_(2k+1) s^(2k+1). */
  oddPart(): Poly {
    return new Poly(this.coefficients.map((c, i) => (i % 2 === 1 ? c : Q0)));
  }

  /** Exact value at a rational point, by Horner's rule. */
  evaluate(x: RationalLike): Fraction {
    const v = toFraction(x, 'x');
    let acc = Q0;
    for (let i = this.coefficients.length - 1; i >= 0; i--) acc = acc.mul(v).add(this.coefficients[i]);
    return acc;
  }

  /** Exact value at a Gaussian rational re + j*im, by Horner's rule in Q[j]. */
  evaluateGaussian(x: { re: RationalLike; im: RationalLike }): GaussianRational {
    const xr = toFraction(x.re, 'x.re');
    const xi = toFraction(x.im, 'x.im');
    let re = Q0;
    let im = Q0;
    for (let i = this.coefficients.length - 1; i >= 0; i--) {
      const nr = re.mul(xr).sub(im.mul(xi)).add(this.coefficients[i]);
      im = re.mul(xi).add(im.mul(xr));
      re = nr;
    }
    return { re, im };
  }

  /** The coefficients as doubles, each correctly rounded. This is the algebra's float boundary. */
  toFloatCoefficients(): number[] {
    return this.coefficients.map(fractionToNumber);
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
    const a = this.coefficients;
    const b = other.coefficients;
    if (a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!a[i].equals(b[i])) return false;
    return true;
  }

  /** Human-readable, highest power first: '2*s^2 - 1/3*s + 5'. */
  toString(variable = 's'): string {
    if (this.isZero()) return '0';
    const parts: string[] = [];
    for (let i = this.coefficients.length - 1; i >= 0; i--) {
      const c = this.coefficients[i];
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

export function gcdBig(a: bigint, b: bigint): bigint {
  let x = a < 0n ? -a : a;
  let y = b < 0n ? -b : b;
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}
