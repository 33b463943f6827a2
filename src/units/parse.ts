/**
 * Reading quantities as engineers write them: '4.7k', '2.2 kHz', '10nF', '1e-9', and the RKM codes of
 * IEC 60062:2016 clause 4 (marking codes for resistors and capacitors), where the prefix letter stands
 * in the place of the decimal point: 4K7 = 4.7e3, R47 = 0.47, 1n5 = 1.5e-9, 2M2 = 2.2e6, 4R7 = 4.7,
 * 47R = 47, 0R = 0 (the zero-ohm link). The letter R (multiplier 1) is only for resistance: it implies
 * the unit ohm.
 *
 * Grammar (surrounding whitespace ignored):
 *   decimal:  [sign] digits [. digits] [e|E [sign] digits] [space] [prefix] [unit]
 *   RKM:      [sign] [digits] letter [digits] [space] [unit]     (at least one digit; letter one of
 *             R f p n u µ m k K M G T)
 * Prefixes are listed in ./prefixes (f..T, 'meg' for mega, case-sensitive: m milli, M mega); units in
 * ./unit-symbols (ohm, ohms, Ω, F, H, Hz, s, V, A).
 *
 * The double is the correctly rounded value of the decimal as written (the text's digits with the
 * prefix folded into the exponent are handed to Number), so '4.7n' gives exactly parseFloat('4.7e-9'),
 * not 4.7 * 1e-9. {@link parseQuantityExact} returns the decimal itself as a Fraction.
 */
import { InvalidInputError } from '../errors';
import { Fraction, toFraction } from '../algebra/rational';
import { prefixExponent, SI_PREFIX_EXPONENTS } from './prefixes';
import { canonicalUnit, requireUnit, type UnitName } from './unit-symbols';

export interface ParseQuantityOptions {
  /** The unit the quantity must have, in any accepted spelling. A text without a unit is accepted. */
  unit?: string;
  /** Accept zero and negative values (default false: the value must be greater than zero). */
  allowNegative?: boolean;
  /** Accept zero, e.g. '0R' (default false). Implied by allowNegative. */
  allowZero?: boolean;
  /** The field path named in errors (default 'quantity'). */
  path?: string;
}

const DECIMAL_FORM = /^([+-]?)(\d+)?(?:\.(\d*))?(?:[eE]([+-]?\d+))?\s*(\S*)$/;
const RKM_FORM = /^([+-]?)(\d*)([RfpnuµμmkKMGT])(\d*)\s*(\S*)$/;

/** The pieces of a parsed quantity: value = (negative ? -1 : 1) * digits * 10^exponent. */
interface QuantityParts {
  negative: boolean;
  digits: string;
  exponent: number;
  unit: UnitName | undefined;
}

/**
 * Parses a quantity to a double. Throws InvalidInputError: 'INVALID_QUANTITY' for text that does not
 * parse or whose unit differs from `options.unit`; 'OUT_OF_RANGE' for a negative or zero value where
 * not allowed, or one that overflows or underflows a double; 'INVALID_ARGUMENT' for an unknown
 * `options.unit`.
 *
 * @example parseQuantity('4k7') // 4700
 * @example parseQuantity('2.2 uF', { unit: 'F' }) // 2.2e-6
 */
export function parseQuantity(text: string, options: ParseQuantityOptions = {}): number {
  const parts = parseParts(text, options);
  return partsToNumber(parts, text, options.path ?? 'quantity');
}

/**
 * Parses a quantity to the exact decimal it writes, as a Fraction: '4k7' is 4700, '1n5' is
 * 3/2000000000. Accepts and rejects exactly the texts {@link parseQuantity} does, and
 * fractionToNumber of the result equals parseQuantity's result.
 *
 * @example parseQuantityExact('1n5').toFraction() // '3/2000000000'
 */
export function parseQuantityExact(text: string, options: ParseQuantityOptions = {}): Fraction {
  const parts = parseParts(text, options);
  const path = options.path ?? 'quantity';
  partsToNumber(parts, text, path); // range check, identical to parseQuantity
  return toFraction(`${parts.negative ? '-' : ''}${parts.digits}e${parts.exponent}`, path);
}

function parseParts(text: string, options: ParseQuantityOptions): QuantityParts {
  const path = options.path ?? 'quantity';
  const expected = options.unit === undefined ? undefined : requireUnit(options.unit, 'options.unit');
  if (typeof text !== 'string') throw new InvalidInputError('INVALID_QUANTITY', path, text, 'must be a quantity string');
  const t = text.trim();
  const parts = parseDecimalForm(t) ?? parseRkmForm(t);
  if (parts === undefined) {
    throw new InvalidInputError('INVALID_QUANTITY', path, text, 'is not a quantity (number with optional SI prefix and unit, or an IEC 60062 code such as 4k7)');
  }
  if (parts === 'bad-unit') throw new InvalidInputError('INVALID_QUANTITY', path, text, 'has an unknown prefix or unit');
  if (expected !== undefined && parts.unit !== undefined && parts.unit !== expected) {
    throw new InvalidInputError('INVALID_QUANTITY', path, text, `has unit ${parts.unit} where ${expected} is expected`);
  }
  const isZero = /^0*$/.test(parts.digits);
  if (parts.negative && !isZero && !options.allowNegative) {
    throw new InvalidInputError('OUT_OF_RANGE', path, text, 'must not be negative');
  }
  if (isZero && !options.allowZero && !options.allowNegative) {
    throw new InvalidInputError('OUT_OF_RANGE', path, text, 'must be greater than zero');
  }
  return parts;
}

function parseDecimalForm(t: string): QuantityParts | 'bad-unit' | undefined {
  const m = DECIMAL_FORM.exec(t);
  if (m === null) return undefined;
  const [, sign, intDigits = '', fracDigits = '', expDigits, suffix] = m;
  if (intDigits === '' && fracDigits === '') return undefined;
  const split = splitSuffix(suffix);
  if (split === undefined) return RKM_FORM.test(t) ? undefined : 'bad-unit';
  const exponent = (expDigits === undefined ? 0 : Number(expDigits)) + split.exponent - fracDigits.length;
  return { negative: sign === '-', digits: intDigits + fracDigits || '0', exponent, unit: split.unit };
}

function parseRkmForm(t: string): QuantityParts | 'bad-unit' | undefined {
  const m = RKM_FORM.exec(t);
  if (m === null) return undefined;
  const [, sign, intDigits, letter, fracDigits, unitText] = m;
  if (intDigits === '' && fracDigits === '') return undefined;
  let unit: UnitName | undefined;
  if (unitText !== '') {
    unit = canonicalUnit(unitText);
    if (unit === undefined) return 'bad-unit';
  }
  if (letter === 'R') {
    if (unit !== undefined && unit !== 'ohm') return 'bad-unit';
    unit = 'ohm'; // IEC 60062: R marks the decimal point of a resistance
  }
  const letterExponent = letter === 'R' ? 0 : SI_PREFIX_EXPONENTS[letter];
  return { negative: sign === '-', digits: intDigits + fracDigits, exponent: letterExponent - fracDigits.length, unit };
}

/** Splits 'kHz' into prefix exponent 3 and unit Hz; undefined unless exactly one reading exists. */
function splitSuffix(suffix: string): { exponent: number; unit: UnitName | undefined } | undefined {
  const readings: { exponent: number; unit: UnitName | undefined }[] = [];
  for (let cut = 0; cut <= suffix.length; cut++) {
    const exponent = prefixExponent(suffix.slice(0, cut));
    if (exponent === undefined) continue;
    const rest = suffix.slice(cut);
    if (rest === '') readings.push({ exponent, unit: undefined });
    else {
      const unit = canonicalUnit(rest);
      if (unit !== undefined) readings.push({ exponent, unit });
    }
  }
  return readings.length === 1 ? readings[0] : undefined;
}

function partsToNumber(parts: QuantityParts, text: string, path: string): number {
  const isZero = /^0*$/.test(parts.digits);
  if (isZero) return 0;
  if (!Number.isSafeInteger(parts.exponent)) throw new InvalidInputError('OUT_OF_RANGE', path, text, 'is outside the range of a double');
  const value = Number(`${parts.negative ? '-' : ''}${parts.digits}e${parts.exponent}`);
  if (!Number.isFinite(value) || value === 0) {
    throw new InvalidInputError('OUT_OF_RANGE', path, text, 'is outside the range of a double');
  }
  return value;
}
