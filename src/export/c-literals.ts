/**
 * C literals and identifiers that are always valid and that user text cannot break out of.
 *
 * Numbers (ISO/IEC 9899:1999, 6.4.4.2 floating constants):
 * - `float`: the value is first rounded to binary32 (Math.fround), then printed with 9 significant
 *   digits and an `f` suffix; `double`: 17 significant digits. 9 and 17 digits are the smallest counts
 *   that make every binary32 / binary64 value round-trip through a correctly rounded decimal conversion
 *   (IEEE 754-2008, section 5.12.2), which is what C compilers do (gcc and clang use correctly rounded
 *   conversion). Trailing zeros of the digits are dropped (the value is unchanged) but a `.` always
 *   stays, so 5 is `5.0f`, never `5f` (an invalid constant).
 * - `hex`: C99 hexadecimal constants (`0x1.8p+3`), exact by construction; they need C99 or C++17.
 * - Negative zero prints as `-0.0` (unary minus on 0.0 gives -0.0 in IEEE arithmetic); subnormal values
 *   are printed (they are legal constants and convert exactly); NaN and Infinity are refused, and so is
 *   a finite double that would overflow to Infinity or underflow to zero in the target type (a nonzero
 *   coefficient silently becoming 0 is a firmware bug): InvalidInputError with code INVALID_NUMBER or
 *   OUT_OF_RANGE and the field's path.
 *
 * Text: strings escape backslash, quote and every `?` (so no trigraph such as `??/` can form; C99
 * 5.2.1.1), and write every byte outside printable ASCII, including the UTF-8 bytes of non-ASCII text,
 * as a three-digit octal escape (octal escapes end after three digits, unlike `\x`, so the next
 * character can never join them). Comments keep printable ASCII only, with `* /` and `/ *` split and
 * `??` broken up; everything else becomes `_`.
 */
import { InvalidInputError } from '../errors';

export type CFloatType = 'float' | 'double';
export type CNumberFormat = 'decimal' | 'hex';

/** Significant digits that make every value of the type round-trip (IEEE 754-2008, 5.12.2). */
const ROUND_TRIP_DIGITS: Record<CFloatType, number> = { float: 9, double: 17 };
/** Decimal exponents in [-3, 7) print positionally (0.0047, 4700000.0); others in exponent form (easier to read). */
const POSITIONAL_MIN_EXPONENT = -3;
const POSITIONAL_MAX_EXPONENT = 7;
/** C99 5.2.4.1: 63 significant initial characters in an internal identifier or macro name. */
export const MAX_C_IDENTIFIER_LENGTH = 63;

/** The value as the target type holds it (binary32 for float). */
export function toCTypeValue(x: number, type: CFloatType): number {
  return type === 'float' ? Math.fround(x) : x;
}

/**
 * A valid C floating constant for `x` in the target type (see the module comment); `path` names the field in errors.
 *
 * @example
 * formatCFloat(5, 'float'); // '5.0f'
 * formatCFloat(0.1, 'double'); // '0.10000000000000001'
 * formatCFloat(12, 'double', 'hex'); // '0x1.8p+3'
 */
export function formatCFloat(x: number, type: CFloatType, format: CNumberFormat = 'decimal', path = 'value'): string {
  if (typeof x !== 'number' || !Number.isFinite(x)) {
    throw new InvalidInputError('INVALID_NUMBER', path, x, 'a C header must never contain NaN or Infinity');
  }
  const v = toCTypeValue(x, type);
  if (!Number.isFinite(v)) throw new InvalidInputError('OUT_OF_RANGE', path, x, `overflows ${type}`);
  if (v === 0 && x !== 0) throw new InvalidInputError('OUT_OF_RANGE', path, x, `underflows to zero in ${type}`);
  const suffix = type === 'float' ? 'f' : '';
  if (Object.is(v, -0)) return `-0.0${suffix}`;
  if (v === 0) return `0.0${suffix}`;
  return (format === 'hex' ? hexFloat(v) : decimalFloat(v, ROUND_TRIP_DIGITS[type])) + suffix;
}

function decimalFloat(v: number, digits: number): string {
  const [mantissa, expText] = v.toExponential(digits - 1).split('e'); // correctly rounded (ECMA-262)
  const negative = mantissa.startsWith('-');
  const ds = mantissa.replace('-', '').replace('.', '').replace(/0+$/, '') || '0';
  const e = Number(expText);
  let body: string;
  if (e >= POSITIONAL_MIN_EXPONENT && e < POSITIONAL_MAX_EXPONENT) {
    if (e >= 0) {
      const int = ds.slice(0, e + 1).padEnd(e + 1, '0');
      body = `${int}.${ds.slice(e + 1) || '0'}`;
    } else {
      body = `0.${'0'.repeat(-e - 1)}${ds}`;
    }
  } else {
    body = `${ds[0]}.${ds.slice(1) || '0'}e${e < 0 ? '-' : '+'}${Math.abs(e)}`;
  }
  return negative ? `-${body}` : body;
}

/** C99 hexadecimal constant of a finite nonzero double, exact: 0x1.<52 bits>p<exp>, normalised also for subnormals. */
function hexFloat(v: number): string {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, v);
  const bits = view.getBigUint64(0);
  const biased = Number((bits >> 52n) & 0x7ffn);
  let frac = bits & ((1n << 52n) - 1n);
  let exp: number;
  if (biased === 0) {
    const length = frac.toString(2).length; // subnormal: value = frac 2^-1074
    exp = length - 1 - 1074;
    frac = (frac << BigInt(53 - length)) & ((1n << 52n) - 1n);
  } else {
    exp = biased - 1023;
  }
  const hex = frac.toString(16).padStart(13, '0').replace(/0+$/, '');
  return `${v < 0 ? '-' : ''}0x1${hex ? `.${hex}` : ''}p${exp < 0 ? '-' : '+'}${Math.abs(exp)}`;
}

/** A C integer constant; `bits`-bit signed range checked; the minimum is written as (-max - 1), never as a negated unrepresentable constant. */
export function formatCInteger(n: number, bits: 16 | 32, path = 'value'): string {
  const max = 2 ** (bits - 1) - 1;
  if (typeof n !== 'number' || !Number.isInteger(n) || n < -max - 1 || n > max) {
    throw new InvalidInputError('OUT_OF_RANGE', path, n, `must be an integer in the int${bits}_t range`);
  }
  if (n === -max - 1) return `(-${max} - 1)`;
  if (n < 0) return `(${n})`;
  return `${n + 0}`; // + 0: -0 prints as 0
}

/**
 * A C string literal of `text` (UTF-8 bytes), see the module comment.
 *
 * @example
 * cStringLiteral('10 \u00b5F "x"??'); // '"10 \\302\\265F \\"x\\"\\?\\?"'
 */
export function cStringLiteral(text: string): string {
  let out = '"';
  for (const byte of new TextEncoder().encode(text)) {
    const ch = String.fromCharCode(byte);
    if (ch === '\\' || ch === '"' || ch === '?') out += `\\${ch}`;
    else if (byte >= 0x20 && byte < 0x7f) out += ch;
    else out += `\\${byte.toString(8).padStart(3, '0')}`;
  }
  return `${out}"`;
}

/** Comment-safe text: one line of printable ASCII, cut to `maxLength`; see the module comment. */
export function cCommentText(text: string, maxLength = 200): string {
  let s = '';
  for (const ch of String(text)) {
    const code = ch.codePointAt(0) ?? 0;
    s += code >= 0x20 && code < 0x7f && ch !== '\\' ? ch : '_';
  }
  if (s.length > maxLength) s = `${s.slice(0, maxLength - 3)}...`;
  // split comment delimiters and trigraph starts, again until none is left ('???' needs two passes)
  for (let prev = ''; prev !== s; ) {
    prev = s;
    s = s.replace(/\*\//g, '* /').replace(/\/\*/g, '/ *').replace(/\?\?/g, '?_?').replace(/\/\//g, '/ /');
  }
  return s;
}

/** C and C++ keywords (C99 6.4.1, C++11 2.12) and alternative tokens (C++11 2.6), lowercase. */
const KEYWORDS = new Set(
  (
    'auto break case char const continue default do double else enum extern float for goto if inline int long ' +
    'register restrict return short signed sizeof static struct switch typedef union unsigned void volatile while ' +
    'alignas alignof asm bool catch class constexpr const_cast decltype delete dynamic_cast explicit export false ' +
    'friend mutable namespace new noexcept nullptr operator private protected public reinterpret_cast static_assert ' +
    'static_cast template this thread_local throw true try typeid typename using virtual wchar_t char16_t char32_t ' +
    'and and_eq bitand bitor compl not not_eq or or_eq xor xor_eq'
  ).split(' '),
);

/**
 * Reserved prefixes of macro names from the C library headers a firmware file may include
 * (C99 7.26: E + digit/capital for errno.h, SIG/SIG_ + capital for signal.h, LC_ + capital for locale.h).
 */
const RESERVED_PREFIX = /^(E[0-9A-Z]|SIG_?[A-Z]|LC_[A-Z])/;

/**
 * A C identifier from arbitrary text: runs of characters outside [A-Za-z0-9_] become one `_`, no
 * leading or trailing `_` (so no `_X` or `__` reserved name), a leading digit gets `N`, upper case when
 * `upper` (macro and constant names), keywords and reserved library prefixes get a `G_` prefix, cut to
 * `maxLength`; empty text gives `fallback`.
 *
 * @example
 * sanitiseCIdentifier('shaker lowpass #2'); // 'SHAKER_LOWPASS_2'
 */
export function sanitiseCIdentifier(text: string, options: { upper?: boolean; fallback?: string; maxLength?: number } = {}): string {
  const { upper = true, fallback = 'GICLADDER', maxLength = MAX_C_IDENTIFIER_LENGTH } = options;
  let id = String(text).replace(/[^A-Za-z0-9]+/g, '_').replace(/^_+|_+$/g, '');
  if (upper) id = id.toUpperCase();
  if (id === '') id = fallback;
  if (/^[0-9]/.test(id)) id = `N${id}`;
  if (KEYWORDS.has(id) || RESERVED_PREFIX.test(id)) id = `G_${id}`;
  return id.slice(0, maxLength).replace(/_+$/, '');
}
