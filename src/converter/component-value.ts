/**
 * Component values entering the converter: exact positive rationals. A number is taken exactly (every
 * double is a rational), a string is a decimal or a/b ratio ('4.7e-9', '1/3') or a quantity in the
 * units grammar ('4n7', '4.7 nF', '4k7'), a bigint or Fraction as is.
 */
import { InvalidInputError } from '../errors';
import { Fraction, fractionFromDouble, toFraction, type RationalLike } from '../algebra/rational';
import { parseQuantityExact } from '../units/parse';

/**
 * The exact positive value of x. Throws InvalidInputError 'INVALID_NUMBER' for NaN, Infinity or a
 * non-numeric value, 'INVALID_QUANTITY' for an unreadable string, 'OUT_OF_RANGE' for zero or negative.
 * `unit` (e.g. 'ohm', 'F', 'H') is the unit a quantity string may carry.
 */
export function toPositiveValue(x: RationalLike, path: string, unit?: string): Fraction {
  let f: Fraction;
  if (typeof x === 'number') f = fractionFromDouble(x, path);
  else if (typeof x === 'string' && !x.includes('/')) f = parseQuantityExact(x, { path, unit, allowNegative: true });
  else if (typeof x === 'string' || typeof x === 'bigint' || x instanceof Fraction) f = toFraction(x, path);
  else throw new InvalidInputError('INVALID_NUMBER', path, x, 'must be a number, decimal string, bigint or Fraction');
  if (f.s < 0n || f.n === 0n) throw new InvalidInputError('OUT_OF_RANGE', path, x, 'must be greater than zero');
  return f;
}
