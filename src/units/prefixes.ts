/**
 * SI prefixes (BIPM, The International System of Units, 9th ed. 2019, Table 7), restricted to the
 * range component values and frequencies occupy: femto to tera. Atto and below, peta and above are
 * not accepted: no passive part or filter frequency needs them, and a stray 'a' or 'P' in a design
 * file is more likely a typing error than a value. 'K' is accepted for kilo (IEC 60062 RKM codes
 * write 4K7) and 'meg' (any case) for mega as SPICE does; 'm' is always milli and 'M' always mega
 * (unlike SPICE, which ignores case). Micro may be written 'u', the micro sign U+00B5 or the Greek
 * small mu U+03BC.
 */

/** Prefix spelling -> power of ten. */
export const SI_PREFIX_EXPONENTS: Readonly<Record<string, number>> = Object.freeze({
  f: -15,
  p: -12,
  n: -9,
  u: -6,
  '\u00b5': -6,
  '\u03bc': -6,
  m: -3,
  k: 3,
  K: 3,
  M: 6,
  meg: 6,
  Meg: 6,
  MEG: 6,
  G: 9,
  T: 12,
});

/** The prefix written for each engineering exponent by formatQuantity (ASCII 'u' for micro). */
export const PREFIX_FOR_EXPONENT: Readonly<Record<number, string>> = Object.freeze({
  [-15]: 'f',
  [-12]: 'p',
  [-9]: 'n',
  [-6]: 'u',
  [-3]: 'm',
  0: '',
  3: 'k',
  6: 'M',
  9: 'G',
  12: 'T',
});

/** Smallest and largest engineering exponent that has a prefix. */
export const MIN_PREFIX_EXPONENT = -15;
export const MAX_PREFIX_EXPONENT = 12;

/** Power of ten of a prefix spelling ('' is 0), or undefined when unknown. */
export function prefixExponent(spelling: string): number | undefined {
  if (spelling === '') return 0;
  return Object.prototype.hasOwnProperty.call(SI_PREFIX_EXPONENTS, spelling) ? SI_PREFIX_EXPONENTS[spelling] : undefined;
}
