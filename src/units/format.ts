/**
 * Writing quantities: `formatQuantity(4700, 'ohm')` is '4.7 kohm', `formatQuantity(1e-8, 'F')` is
 * '10 nF', `formatQuantity(2200, 'Hz')` is '2.2 kHz'.
 *
 * The form is `<mantissa> <prefix><unit>`: an engineering prefix (exponent a multiple of three, so the
 * mantissa lies in [1, 1000)), ASCII 'u' for micro, the unit exactly as the caller spelled it (so 'Ω'
 * gives '4.7 kΩ' and 'ohm' gives '4.7 kohm'), and a single space before the prefix, as SI writing
 * rules ask (BIPM SI Brochure, 9th ed., 5.4.3). Without a unit ('') there is no space: '4.7k'.
 * Significant digits are rounded (to nearest, ties away from zero as Number.prototype.toExponential
 * does) and trailing zeros after the decimal point trimmed. Outside the prefix range (below 1e-15 or
 * at 1e15 and above) the mantissa carries an exponent instead of a prefix: '1.5e-18 F'.
 *
 * Every output is read back by parseQuantity; with 17 digits the round trip returns the same double.
 */
import { InvalidInputError, requireFinite, requireInteger } from '../errors';
import { MAX_PREFIX_EXPONENT, MIN_PREFIX_EXPONENT, PREFIX_FOR_EXPONENT } from './prefixes';
import { requireUnit } from './unit-symbols';

export interface FormatQuantityOptions {
  /** Significant digits, 1..17 (default 3). 17 digits identify every double uniquely. */
  digits?: number;
}

/** Default significant digits: enough for E96/E192 values (three digits), short enough to read. */
export const DEFAULT_FORMAT_DIGITS = 3;
/** 17 significant decimal digits always round-trip a binary64 double (IEEE 754-2019, 5.12.2). */
const MAX_FORMAT_DIGITS = 17;

/**
 * Formats a finite value with an engineering prefix and a unit ('' for none). Throws
 * InvalidInputError 'INVALID_NUMBER' for NaN or Infinity, 'OUT_OF_RANGE' for digits outside 1..17,
 * 'INVALID_ARGUMENT' for a unit that parseQuantity would not read back.
 *
 * @example formatQuantity(4700, 'ohm') // '4.7 kohm'
 */
export function formatQuantity(value: number, unit: string, options: FormatQuantityOptions = {}): string {
  requireFinite(value, 'value');
  if (typeof unit !== 'string') throw new InvalidInputError('INVALID_ARGUMENT', 'unit', unit, 'must be a unit symbol or empty');
  if (unit !== '') requireUnit(unit, 'unit');
  const digits = requireInteger(options.digits ?? DEFAULT_FORMAT_DIGITS, 'options.digits', 1, MAX_FORMAT_DIGITS);
  const separator = unit === '' ? '' : ' ';
  if (value === 0) return `0${separator}${unit}`;

  // toExponential rounds once, correctly, to `digits` significant digits: 'd.ddde+N'.
  const [mantissaText, exponentText] = Math.abs(value).toExponential(digits - 1).split('e');
  const exponent = Number(exponentText);
  const sign = value < 0 ? '-' : '';
  const engineering = Math.floor(exponent / 3) * 3;
  if (engineering < MIN_PREFIX_EXPONENT || engineering > MAX_PREFIX_EXPONENT) {
    return `${sign}${trimZeros(mantissaText)}e${exponent}${separator}${unit}`;
  }
  const mantissa = shiftDecimalPoint(mantissaText, exponent - engineering);
  return `${sign}${mantissa}${separator}${PREFIX_FOR_EXPONENT[engineering]}${unit}`;
}

/** 'd.ddd' with the point moved right by 0, 1 or 2 places (padding with zeros), trailing zeros trimmed. */
function shiftDecimalPoint(mantissa: string, places: number): string {
  const allDigits = mantissa.replace('.', '');
  const padded = allDigits.padEnd(1 + places, '0');
  const intPart = padded.slice(0, 1 + places);
  const fracPart = padded.slice(1 + places);
  return trimZeros(fracPart === '' ? intPart : `${intPart}.${fracPart}`);
}

function trimZeros(text: string): string {
  if (!text.includes('.')) return text;
  return text.replace(/0+$/, '').replace(/\.$/, '');
}
