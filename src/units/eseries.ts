/**
 * Preferred number series for resistors and capacitors, IEC 60063:2015 ("Preferred number series for
 * resistors and capacitors"), Tables 1 (E3..E24, two significant figures) and 2 (E48..E192, three).
 * The tables are the standard's published values, hard-coded, not the geometric formula
 * round(10^(i/n)): the standard keeps historical values that deviate from it (E24: 2.7, 3.0, 3.3, 3.6,
 * 3.9, 4.3, 4.7, 8.2; E192: 9.20 where the formula gives 9.19). The test suite checks every deviation.
 *
 * Values are held as integers in hundredths of the decade [1, 10), so every preferred value is an exact
 * decimal m * 10^(e - 2). Doubles are made from that decimal (Number('47e-10')), hence nearestPreferred
 * returns exactly parseFloat('4.7e-9'), not 4.7 * 1e-9; the `...Exact` variants return the decimal
 * itself as a Fraction.
 *
 * Rounding rule of {@link nearestPreferred}: nearest on a logarithmic scale. Between neighbours a < b the
 * boundary is the geometric midpoint sqrt(a*b), decided exactly as x^2 against a*b in rationals. A tie
 * (x^2 = a*b exactly) goes to the larger value: the log-domain counterpart of round-half-up, which keeps
 * the map monotone and deterministic. For the published tables the rule is moot, since no adjacent
 * pair has a*b a rational square, so sqrt(a*b) is irrational and no rational input ties (the tests
 * check this); it is stated so that the behaviour is defined should a table ever allow a tie.
 */
import { InvalidInputError, requireOneOf, requirePositive } from '../errors';
import { parseQuantityExact } from './parse';
import { Fraction, fractionFromDouble, fractionToNumber, toFraction, type RationalLike } from '../algebra/rational';

export type ESeriesName = 'E3' | 'E6' | 'E12' | 'E24' | 'E48' | 'E96' | 'E192';
export const E_SERIES_NAMES: readonly ESeriesName[] = Object.freeze(['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192']);

/** IEC 60063:2015 Table 1 (two significant figures), in hundredths. From memory; checked in tests. */
const E24_HUNDREDTHS = [
  100, 110, 120, 130, 150, 160, 180, 200, 220, 240, 270, 300, 330, 360, 390, 430, 470, 510, 560, 620, 680, 750, 820, 910,
];
const E12_HUNDREDTHS = [100, 120, 150, 180, 220, 270, 330, 390, 470, 560, 680, 820];
const E6_HUNDREDTHS = [100, 150, 220, 330, 470, 680];
const E3_HUNDREDTHS = [100, 220, 470];

/** IEC 60063:2015 Table 2 (three significant figures), E192, in hundredths. From memory; checked in tests. */
const E192_HUNDREDTHS = [
  100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118, 120, 121, 123, 124, 126, 127, 129, 130, 132,
  133, 135, 137, 138, 140, 142, 143, 145, 147, 149, 150, 152, 154, 156, 158, 160, 162, 164, 165, 167, 169, 172, 174, 176,
  178, 180, 182, 184, 187, 189, 191, 193, 196, 198, 200, 203, 205, 208, 210, 213, 215, 218, 221, 223, 226, 229, 232, 234,
  237, 240, 243, 246, 249, 252, 255, 258, 261, 264, 267, 271, 274, 277, 280, 284, 287, 291, 294, 298, 301, 305, 309, 312,
  316, 320, 324, 328, 332, 336, 340, 344, 348, 352, 357, 361, 365, 370, 374, 379, 383, 388, 392, 397, 402, 407, 412, 417,
  422, 427, 432, 437, 442, 448, 453, 459, 464, 470, 475, 481, 487, 493, 499, 505, 511, 517, 523, 530, 536, 542, 549, 556,
  562, 569, 576, 583, 590, 597, 604, 612, 619, 626, 634, 642, 649, 657, 665, 673, 681, 690, 698, 706, 715, 723, 732, 741,
  750, 759, 768, 777, 787, 796, 806, 816, 825, 835, 845, 856, 866, 876, 887, 898, 909, 920, 931, 942, 953, 965, 976, 988,
];
/** IEC 60063 Table 2 lists E96 as every second E192 value and E48 as every second E96 value. */
const E96_HUNDREDTHS = E192_HUNDREDTHS.filter((_, i) => i % 2 === 0);
const E48_HUNDREDTHS = E96_HUNDREDTHS.filter((_, i) => i % 2 === 0);

const HUNDREDTHS: Readonly<Record<ESeriesName, readonly number[]>> = Object.freeze({
  E3: Object.freeze(E3_HUNDREDTHS),
  E6: Object.freeze(E6_HUNDREDTHS),
  E12: Object.freeze(E12_HUNDREDTHS),
  E24: Object.freeze(E24_HUNDREDTHS),
  E48: Object.freeze(E48_HUNDREDTHS),
  E96: Object.freeze(E96_HUNDREDTHS),
  E192: Object.freeze(E192_HUNDREDTHS),
});

const VALUES: Readonly<Record<ESeriesName, readonly number[]>> = Object.freeze(
  Object.fromEntries(E_SERIES_NAMES.map((n) => [n, Object.freeze(HUNDREDTHS[n].map((h) => Number(`${h}e-2`)))])) as Record<
    ESeriesName,
    readonly number[]
  >,
);

/** The series' values in hundredths of the decade (100 = 1.00), as IEC 60063 lists them. */
export function preferredHundredths(series: ESeriesName): readonly number[] {
  return HUNDREDTHS[requireSeries(series)];
}

/** One decade of the series, [1, 10), ascending, as doubles of the exact decimals (1, 1.2, 1.5, ...). */
export function preferredValues(series: ESeriesName): readonly number[] {
  return VALUES[requireSeries(series)];
}

/** One decade of the series, [1, 10), ascending, as exact Fractions (6/5, 3/2, ...). */
export function preferredValuesExact(series: ESeriesName): readonly Fraction[] {
  return preferredHundredths(series).map((h) => new Fraction(BigInt(h), 100n));
}

/**
 * The preferred value nearest to `value` on a logarithmic scale (ties to the larger), in any decade.
 * Throws InvalidInputError for a value that is not finite and positive, an unknown series, or a result
 * beyond the largest double.
 *
 * @example nearestPreferred(9.9e3, 'E12') // 10000
 * @example nearestPreferred(4.6e-9, 'E12') // 4.7e-9
 */
export function nearestPreferred(value: number, series: ESeriesName): number {
  requirePositive(value, 'value');
  return toDouble(nearestPreferredExact(value, series), value);
}

/**
 * {@link nearestPreferred} returning the exact decimal. `value` may be any positive RationalLike; a
 * string may also be a quantity ('4k7', '4.7nF'), read by parseQuantityExact.
 */
export function nearestPreferredExact(value: RationalLike, series: ESeriesName): Fraction {
  const name = requireSeries(series);
  const x = requirePositiveRational(value);
  const { below, above } = bracket(x, name);
  if (below.equals(above)) return below;
  // Eq.: x >= sqrt(below * above)  <=>  x^2 >= below * above (all positive), decided exactly.
  return x.mul(x).compare(below.mul(above)) >= 0 ? above : below;
}

/**
 * The smallest preferred value not below `value` (the value itself when it is preferred). The
 * comparison is made on doubles, so 4.7e-9 counts as the preferred value 4.7e-9 although the double is
 * not exactly 47/10^10.
 */
export function nextPreferredUp(value: number, series: ESeriesName): number {
  requirePositive(value, 'value');
  return toDouble(nextPreferredUpExact(value, series), value);
}

/** The largest preferred value not above `value` (the value itself when it is preferred). */
export function nextPreferredDown(value: number, series: ESeriesName): number {
  requirePositive(value, 'value');
  return toDouble(nextPreferredDownExact(value, series), value);
}

/**
 * {@link nextPreferredUp} returning the exact decimal. A number input is compared as a double (as
 * nextPreferredUp does); strings, bigints and Fractions are compared exactly.
 */
export function nextPreferredUpExact(value: RationalLike, series: ESeriesName): Fraction {
  const name = requireSeries(series);
  const x = requirePositiveRational(value);
  const { below, above } = bracket(x, name);
  return isAtOrBelow(value, x, below) ? below : above;
}

/** {@link nextPreferredDown} returning the exact decimal; inputs compared as in {@link nextPreferredUpExact}. */
export function nextPreferredDownExact(value: RationalLike, series: ESeriesName): Fraction {
  const name = requireSeries(series);
  const x = requirePositiveRational(value);
  const { below, above } = bracket(x, name);
  return isAtOrAbove(value, x, above) ? above : below;
}

/** input <= p, compared as doubles for number inputs (see nextPreferredUp) and exactly otherwise. */
function isAtOrBelow(input: RationalLike, x: Fraction, p: Fraction): boolean {
  return typeof input === 'number' ? input <= fractionToNumber(p) : x.compare(p) <= 0;
}

/** input >= p, compared as in {@link isAtOrBelow}. */
function isAtOrAbove(input: RationalLike, x: Fraction, p: Fraction): boolean {
  return typeof input === 'number' ? input >= fractionToNumber(p) : x.compare(p) >= 0;
}

/**
 * The preferred values just below-or-equal and just above-or-equal to x: equal when x is preferred.
 * Works in exact rationals: the decade exponent e with 10^e <= x < 10^(e+1) is estimated from the
 * double and then corrected by exact comparisons.
 */
function bracket(x: Fraction, series: ESeriesName): { below: Fraction; above: Fraction } {
  let e = Math.floor(Math.log10(fractionToNumber(x)));
  if (!Number.isFinite(e)) e = 0;
  while (pow10(e).compare(x) > 0) e--;
  while (pow10(e + 1).compare(x) <= 0) e++;
  const values = HUNDREDTHS[series];
  const scale = pow10(e - 2);
  let below = scale.mul(values[0]);
  for (let i = 0; i < values.length; i++) {
    const v = scale.mul(values[i]);
    const c = v.compare(x);
    if (c === 0) return { below: v, above: v };
    if (c > 0) return { below, above: v };
    below = v;
  }
  return { below, above: pow10(e + 1) };
}

function pow10(e: number): Fraction {
  return e >= 0 ? new Fraction(10n ** BigInt(e)) : new Fraction(1n, 10n ** BigInt(-e));
}

function requireSeries(series: unknown): ESeriesName {
  return requireOneOf(series, 'series', E_SERIES_NAMES);
}

function requirePositiveRational(value: RationalLike): Fraction {
  let x: Fraction;
  if (typeof value === 'number') x = fractionFromDouble(requirePositive(value, 'value'), 'value');
  else if (typeof value === 'string' && !value.includes('/')) x = parseQuantityExact(value, { path: 'value' });
  else x = toFraction(value, 'value');
  if (x.s < 0n || x.n === 0n) throw new InvalidInputError('OUT_OF_RANGE', 'value', value, 'must be greater than zero');
  return x;
}

/** The double of an exact preferred value; throws when it lies beyond the largest double. */
function toDouble(f: Fraction, input: number): number {
  const d = fractionToNumber(f);
  if (!Number.isFinite(d)) throw new InvalidInputError('OUT_OF_RANGE', 'value', input, 'has no preferred value within the range of a double');
  return d;
}
