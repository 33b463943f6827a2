/**
 * Exact rational numbers: fraction.js (BigInt numerator and denominator) with the input forms the
 * library accepts. Every finite double is a rational, so numbers convert exactly (no decimal rounding):
 * `toFraction(0.1)` is 3602879701896397/36028797018963968, not 1/10. Strings convert as written
 * ('0.1' is 1/10, '1/3' is 1/3), which is how exact decimal component values (E-series) enter.
 */
import Fraction from 'fraction.js';
import { InvalidInputError } from '../errors';

export { Fraction };

/** What the exact core accepts for a rational: a finite number (taken exactly), a decimal or a/b string, a bigint or a Fraction. */
export type RationalLike = number | string | bigint | Fraction;

export const Q0 = new Fraction(0);
export const Q1 = new Fraction(1);

const TWO_POW_52 = 2n ** 52n;

/**
 * The exact value of a finite double as a Fraction. Splits the IEEE 754 bits into sign, exponent and
 * mantissa, so the conversion is exact (fraction.js's own number parser approximates by continued
 * fractions, which would silently change component values).
 */
export function fractionFromDouble(x: number, path = 'value'): Fraction {
  if (!Number.isFinite(x)) throw new InvalidInputError('INVALID_NUMBER', path, x, 'must be a finite number');
  if (x === 0) return Q0;
  if (Number.isInteger(x) && Math.abs(x) <= Number.MAX_SAFE_INTEGER) return new Fraction(BigInt(x));
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const hi = view.getUint32(0);
  const lo = view.getUint32(4);
  const negative = hi >>> 31 === 1;
  const biasedExponent = (hi >>> 20) & 0x7ff;
  let mantissa = (BigInt(hi & 0xfffff) << 32n) | BigInt(lo);
  let exponent: number;
  if (biasedExponent === 0) {
    exponent = -1074; // subnormal: value = mantissa * 2^-1074
  } else {
    mantissa += TWO_POW_52;
    exponent = biasedExponent - 1075;
  }
  const signed = negative ? -mantissa : mantissa;
  return exponent >= 0 ? new Fraction(signed * 2n ** BigInt(exponent)) : new Fraction(signed, 2n ** BigInt(-exponent));
}

const DECIMAL_OR_RATIO = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$|^[+-]?\d+\s*\/\s*\d+$/;

/** Converts any {@link RationalLike} to a Fraction exactly; throws InvalidInputError on NaN, Infinity or garbage. */
export function toFraction(x: RationalLike, path = 'value'): Fraction {
  if (x instanceof Fraction) return x;
  if (typeof x === 'number') return fractionFromDouble(x, path);
  if (typeof x === 'bigint') return new Fraction(x);
  if (typeof x === 'string') {
    const t = x.trim();
    if (!DECIMAL_OR_RATIO.test(t)) throw new InvalidInputError('INVALID_NUMBER', path, x, 'is not a decimal or a/b rational');
    if (t.includes('/')) {
      const [n, d] = t.split('/').map((p) => BigInt(p.trim()));
      if (d === 0n) throw new InvalidInputError('DIVISION_BY_ZERO', path, x, 'has a zero denominator');
      return new Fraction(n, d);
    }
    return decimalStringToFraction(t);
  }
  throw new InvalidInputError('INVALID_NUMBER', path, x, 'must be a number, decimal string, bigint or Fraction');
}

/** '1.5e-3' -> 3/2000 exactly, with BigInt so no digit is lost. */
function decimalStringToFraction(t: string): Fraction {
  const m = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(t)!;
  const sign = m[1] === '-' ? -1n : 1n;
  const intPart = m[2] || '0';
  const frac = m[3] ?? '';
  const exp = Number(m[4] ?? '0') - frac.length;
  const digits = BigInt(intPart + frac) * sign;
  if (Math.abs(exp) > 100_000) throw new InvalidInputError('OUT_OF_RANGE', 'value', t, 'exponent is too large');
  return exp >= 0 ? new Fraction(digits * 10n ** BigInt(exp)) : new Fraction(digits, 10n ** BigInt(-exp));
}

/**
 * The nearest double to a Fraction, correctly rounded for any size of numerator and denominator
 * (Number(n)/Number(d) would overflow to Infinity/Infinity for big operands and double-round otherwise).
 */
export function fractionToNumber(f: Fraction): number {
  const n = f.s * f.n;
  const d = f.d;
  if (n === 0n) return 0;
  const neg = n < 0n;
  const an = neg ? -n : n;
  // Scale so that the integer quotient has 64+ significant bits, then round once.
  const shift = bitLength(d) - bitLength(an) + 66;
  const q = shift >= 0 ? (an << BigInt(shift)) / d : an / (d << BigInt(-shift));
  const r = shift >= 0 ? (an << BigInt(shift)) % d : an % (d << BigInt(-shift));
  // Sticky bit so that round-half-even of the final conversion sees any nonzero remainder.
  const qs = r === 0n ? q : q | 1n;
  const value = bigintToNumberScaled(qs, -shift);
  return neg ? -value : value;
}

function bitLength(x: bigint): number {
  return x === 0n ? 0 : x.toString(2).length;
}

/** q * 2^e as a correctly rounded double, where q has at least 66 bits (so one rounding suffices). */
function bigintToNumberScaled(q: bigint, e: number): number {
  const bits = bitLength(q);
  // Keep 54 bits (53 + a round bit) plus sticky, round half to even manually.
  const drop = bits - 54;
  let top = q >> BigInt(drop);
  const sticky = (q & ((1n << BigInt(drop)) - 1n)) !== 0n;
  let exp = e + drop;
  // Handle subnormal results: the final exponent of the lowest kept bit must be >= -1075.
  const minExp = -1075;
  if (exp < minExp) {
    const extra = minExp - exp;
    if (extra > 60) return 0;
    const lost = top & ((1n << BigInt(extra)) - 1n);
    top >>= BigInt(extra);
    exp = minExp;
    if (lost !== 0n) top |= 1n; // fold into round/sticky
  }
  const roundBit = top & 1n;
  let mant = top >> 1n;
  if (roundBit === 1n && (sticky || (mant & 1n) === 1n)) mant += 1n;
  return Number(mant) * 2 ** (exp + 1);
}

/** Fraction from a RationalLike, also accepting negatives; short alias used across algebra. */
export const q = (x: RationalLike): Fraction => toFraction(x);
