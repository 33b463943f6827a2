/**
 * Exact rational functions N(s)/D(s) over Q. Always reduced (gcd(N, D) = 1) and normalised (D monic;
 * the zero function is 0/1), so the representation is canonical and {@link RationalFunction.equals} is
 * structural equality of coefficient lists.
 */
import { Poly, hornerComplex as horner } from './poly';
import { Fraction, Q0, Q1, fractionToNumber, toFraction, type RationalLike } from './rational';
import { cDiv, cAbs, cArg, type Complex } from './complex';
import { ArithmeticError } from '../errors';

export class RationalFunction {
  readonly num: Poly;
  readonly den: Poly;

  private constructor(num: Poly, den: Poly) {
    this.num = num;
    this.den = den;
  }

  /** Reduces and normalises num/den. Throws ArithmeticError for a zero denominator. */
  static fromPolys(num: Poly, den: Poly): RationalFunction {
    if (den.isZero()) throw new ArithmeticError('DIVISION_BY_ZERO', 'den', '0', 'rational function with zero denominator');
    if (num.isZero()) return RationalFunction.ZERO;
    let n = num;
    let d = den;
    if (d.degree > 0 && n.degree > 0) {
      const g = n.gcd(d);
      if (g.degree > 0) {
        n = n.divmod(g).quotient;
        d = d.divmod(g).quotient;
      }
    }
    const lead = d.leading;
    if (!lead.equals(Q1)) {
      const inv = Q1.div(lead);
      n = n.scale(inv);
      d = d.scale(inv);
    }
    return new RationalFunction(n, d);
  }

  static readonly ZERO = new RationalFunction(Poly.ZERO, Poly.ONE);
  static readonly ONE = new RationalFunction(Poly.ONE, Poly.ONE);
  /** The function s. */
  static readonly S = new RationalFunction(Poly.S, Poly.ONE);

  static constant(c: RationalLike): RationalFunction {
    return RationalFunction.fromPolys(Poly.constant(c), Poly.ONE);
  }

  static fromPoly(p: Poly): RationalFunction {
    return new RationalFunction(p, Poly.ONE);
  }

  /** From ascending coefficient lists of numerator and denominator. */
  static fromCoefficients(num: readonly RationalLike[], den: readonly RationalLike[]): RationalFunction {
    return RationalFunction.fromPolys(Poly.fromCoefficients(num), Poly.fromCoefficients(den));
  }

  isZero(): boolean {
    return this.num.isZero();
  }

  add(o: RationalFunction): RationalFunction {
    if (this.den.equals(o.den)) return RationalFunction.fromPolys(this.num.add(o.num), this.den);
    return RationalFunction.fromPolys(this.num.mul(o.den).add(o.num.mul(this.den)), this.den.mul(o.den));
  }

  sub(o: RationalFunction): RationalFunction {
    return this.add(o.neg());
  }

  neg(): RationalFunction {
    return new RationalFunction(this.num.neg(), this.den);
  }

  mul(o: RationalFunction): RationalFunction {
    return RationalFunction.fromPolys(this.num.mul(o.num), this.den.mul(o.den));
  }

  /** Throws ArithmeticError when dividing by the zero function. */
  div(o: RationalFunction): RationalFunction {
    if (o.isZero()) throw new ArithmeticError('DIVISION_BY_ZERO', 'divisor', '0', 'division by the zero rational function');
    return RationalFunction.fromPolys(this.num.mul(o.den), this.den.mul(o.num));
  }

  /** 1 / this. Throws ArithmeticError for the zero function. */
  inverse(): RationalFunction {
    return RationalFunction.ONE.div(this);
  }

  scale(c: RationalLike): RationalFunction {
    return RationalFunction.fromPolys(this.num.scale(c), this.den);
  }

  pow(k: number): RationalFunction {
    if (k < 0) return this.inverse().pow(-k);
    return RationalFunction.fromPolys(this.num.pow(k), this.den.pow(k));
  }

  /**
   * this(inner(s)): general rational substitution. With this = N/D of degrees n, m and inner = P/Q:
   * N(P/Q)/D(P/Q) = [N~ * Q^m] / [D~ * Q^n] where N~ = Q^n N(P/Q) (the homogenised numerator).
   */
  compose(inner: RationalFunction): RationalFunction {
    const n = this.num.degree;
    const m = this.den.degree;
    const P = inner.num;
    const Qd = inner.den;
    if (n < 0) return RationalFunction.ZERO;
    const numH = this.num.composeRatio(P, Qd);
    const denH = this.den.composeRatio(P, Qd);
    const top = m > n ? numH.mul(Qd.pow(m - n)) : numH;
    const bottom = n > m ? denH.mul(Qd.pow(n - m)) : denH;
    return RationalFunction.fromPolys(top, bottom);
  }

  /** Substitutes s -> k/s (the lowpass-to-highpass map and, with k = 1, s -> 1/s). */
  substituteReciprocal(k: RationalLike = 1): RationalFunction {
    return this.compose(RationalFunction.fromPolys(Poly.constant(k), Poly.S));
  }

  /**
   * Substitutes s -> (s^2 + w0^2)/(B s): the lowpass-to-bandpass map with centre w0 (rad/s) and
   * bandwidth B (rad/s). Its reciprocal, s -> B s/(s^2 + w0^2), is the lowpass-to-bandstop map.
   */
  substituteBandpass(w0Squared: RationalLike, bandwidth: RationalLike): RationalFunction {
    const inner = RationalFunction.fromPolys(
      Poly.fromCoefficients([toFraction(w0Squared, 'w0Squared'), 0, 1]),
      Poly.fromCoefficients([0, toFraction(bandwidth, 'bandwidth')]),
    );
    return this.compose(inner);
  }

  /** Substitutes s -> B s/(s^2 + w0^2): the lowpass-to-bandstop map. */
  substituteBandstop(w0Squared: RationalLike, bandwidth: RationalLike): RationalFunction {
    const inner = RationalFunction.fromPolys(
      Poly.fromCoefficients([0, toFraction(bandwidth, 'bandwidth')]),
      Poly.fromCoefficients([toFraction(w0Squared, 'w0Squared'), 0, 1]),
    );
    return this.compose(inner);
  }

  /** Substitutes s -> k*s (frequency scaling by 1/k). */
  scaleVariable(k: RationalLike): RationalFunction {
    return RationalFunction.fromPolys(this.num.scaleVariable(k), this.den.scaleVariable(k));
  }

  derivative(): RationalFunction {
    // (N/D)' = (N'D - N D') / D^2
    return RationalFunction.fromPolys(this.num.derivative().mul(this.den).sub(this.num.mul(this.den.derivative())), this.den.mul(this.den));
  }

  /**
   * Exact value at a rational point; Infinity is not representable, so a pole throws ArithmeticError.
   */
  evaluate(x: RationalLike): Fraction {
    const d = this.den.evaluate(x);
    if (d.n === 0n) throw new ArithmeticError('DIVISION_BY_ZERO', 'x', String(x), 'evaluation at a pole');
    return this.num.evaluate(x).div(d);
  }

  /** Exact value at a Gaussian rational, as { re, im } Fractions. Throws ArithmeticError at a pole. */
  evaluateGaussian(x: { re: RationalLike; im: RationalLike }): { re: Fraction; im: Fraction } {
    const n = this.num.evaluateGaussian(x);
    const d = this.den.evaluateGaussian(x);
    const mag2 = d.re.mul(d.re).add(d.im.mul(d.im));
    if (mag2.n === 0n) throw new ArithmeticError('DIVISION_BY_ZERO', 'x', x, 'evaluation at a pole');
    return {
      re: n.re.mul(d.re).add(n.im.mul(d.im)).div(mag2),
      im: n.im.mul(d.re).sub(n.re.mul(d.im)).div(mag2),
    };
  }

  /** Float coefficient arrays (ascending), correctly rounded: the exact-to-float boundary of a transfer function. */
  toFloat(): { num: number[]; den: number[] } {
    return { num: this.num.toFloatCoefficients(), den: this.den.toFloatCoefficients() };
  }

  /**
   * Float value at complex s. For |s| > 1 both polynomials are evaluated in 1/s (reversed coefficients)
   * and the ratio rescaled by s^(m - n), so high degrees do not overflow where the ratio is finite.
   * Never throws; poles give Infinity/NaN.
   */
  evaluateComplex(s: Complex): Complex {
    return evaluateRatioComplex(this.num.toFloatCoefficients(), this.den.toFloatCoefficients(), s);
  }

  /** 20 log10 |H(j omega)|. */
  gainDb(omegaRadPerS: number): number {
    return 20 * Math.log10(cAbs(this.evaluateComplex({ re: 0, im: omegaRadPerS })));
  }

  /** Principal phase of H(j omega) in degrees, (-180, 180]. */
  phaseDeg(omegaRadPerS: number): number {
    return (cArg(this.evaluateComplex({ re: 0, im: omegaRadPerS })) * 180) / Math.PI;
  }

  /**
   * Group delay -d(arg H(j omega))/d omega in seconds, exactly from the derivative:
   * tau = -Re[ N'(s)/N(s) - D'(s)/D(s) ] at s = j omega.
   */
  groupDelayS(omegaRadPerS: number): number {
    const s = { re: 0, im: omegaRadPerS };
    const f = this.toFloat();
    const dn = floatDerivative(f.num);
    const dd = floatDerivative(f.den);
    const a = evaluateRatioComplex(dn, f.num, s);
    const b = evaluateRatioComplex(dd, f.den, s);
    return -(a.re - b.re);
  }

  equals(o: RationalFunction): boolean {
    return this.num.equals(o.num) && this.den.equals(o.den);
  }

  toString(variable = 's'): string {
    if (this.den.degree === 0) return this.num.toString(variable);
    return `(${this.num.toString(variable)}) / (${this.den.toString(variable)})`;
  }
}

function floatDerivative(asc: readonly number[]): number[] {
  return asc.slice(1).map((c, i) => c * (i + 1));
}

/**
 * n(s)/d(s) for float ascending coefficient arrays at complex s. Uses Horner in s for |s| <= 1 and in
 * 1/s for |s| > 1 (with the s^(deg n - deg d) factor applied last), so neither polynomial overflows
 * before the division.
 */
export function evaluateRatioComplex(num: readonly number[], den: readonly number[], s: Complex): Complex {
  const r = Math.hypot(s.re, s.im);
  if (r <= 1) return cDiv(horner(num, s), horner(den, s));
  const inv = cDiv({ re: 1, im: 0 }, s);
  const nr = hornerReversed(num, inv);
  const dr = hornerReversed(den, inv);
  let ratio = cDiv(nr, dr);
  const k = num.length - den.length; // s^(deg n - deg d)
  if (k !== 0) {
    const logR = Math.log(r) * k;
    const theta = Math.atan2(s.im, s.re) * k;
    const mag = Math.exp(logR);
    ratio = {
      re: mag * (ratio.re * Math.cos(theta) - ratio.im * Math.sin(theta)),
      im: mag * (ratio.re * Math.sin(theta) + ratio.im * Math.cos(theta)),
    };
  }
  return ratio;
}


/** sum a_i * u^(n - i) for u = 1/s: Horner over the coefficients in ascending order. */
function hornerReversed(asc: readonly number[], u: Complex): Complex {
  let re = 0;
  let im = 0;
  for (let i = 0; i < asc.length; i++) {
    const nr = re * u.re - im * u.im + asc[i];
    im = re * u.im + im * u.re;
    re = nr;
  }
  return { re, im };
}

export { Q0, fractionToNumber };
