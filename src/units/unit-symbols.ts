/**
 * The unit symbols gicladder reads and writes, and their spellings. A quantity string may carry one
 * of these after its number and SI prefix ('2.2 kHz', '4k7ohm', '10nF'); an expected unit given to
 * the parser may be any spelling, and a text's unit must name the same canonical unit.
 */
import { InvalidInputError } from '../errors';

/** Canonical unit names. */
export type UnitName = 'ohm' | 'F' | 'H' | 'Hz' | 's' | 'V' | 'A';

/**
 * Every accepted spelling -> its canonical unit. Case-sensitive on purpose: 'F' (farad) must not be
 * confused with the prefix 'f' (femto), nor 'H' (henry) with 'h'. Ohm has several common spellings;
 * both the ohm sign U+2126 and the Greek capital omega U+03A9 are accepted because keyboards give either.
 */
export const UNIT_SPELLINGS: Readonly<Record<string, UnitName>> = Object.freeze({
  ohm: 'ohm',
  ohms: 'ohm',
  Ohm: 'ohm',
  Ohms: 'ohm',
  '\u2126': 'ohm',
  '\u03a9': 'ohm',
  F: 'F',
  H: 'H',
  Hz: 'Hz',
  s: 's',
  V: 'V',
  A: 'A',
});

/** The canonical unit of a spelling, or undefined when the spelling is unknown. */
export function canonicalUnit(spelling: string): UnitName | undefined {
  return Object.prototype.hasOwnProperty.call(UNIT_SPELLINGS, spelling) ? UNIT_SPELLINGS[spelling] : undefined;
}

/** The canonical unit of a spelling; throws InvalidInputError 'INVALID_ARGUMENT' for an unknown one. */
export function requireUnit(spelling: unknown, path: string): UnitName {
  const u = typeof spelling === 'string' ? canonicalUnit(spelling) : undefined;
  if (u === undefined) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, spelling, `must be a unit symbol: ${Object.keys(UNIT_SPELLINGS).join(', ')}`);
  }
  return u;
}
