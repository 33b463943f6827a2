/**
 * Typed errors shared by every stage. Design entry points validate their input and throw a subclass of
 * {@link GicladderError} carrying a machine-readable `code`, the offending `path` (a dotted field path
 * such as `response.passbandEdgeHz`, or a parameter name) and the offending `value`. Numerical kernels
 * never throw: they return NaN/Infinity per IEEE 754.
 *
 * Tests assert on `instanceof` and `code`, never on message text.
 */

/** Every error code the library throws. Stable: callers may switch on them. */
export type GicladderErrorCode =
  | 'INVALID_NUMBER' // NaN, Infinity, or a non-number where a number is needed
  | 'OUT_OF_RANGE' // a finite number outside the allowed range (zero or negative component values...)
  | 'INVALID_QUANTITY' // a quantity string that does not parse ('4.7.1k', 'abc')
  | 'INVALID_ARGUMENT' // a structurally wrong argument (unknown enum member, wrong shape)
  | 'DIVISION_BY_ZERO' // exact arithmetic asked to divide by the zero polynomial or zero rational
  | 'UNREALIZABLE' // a mask, ladder or circuit that cannot be built as asked
  | 'SINGULAR_CIRCUIT' // a circuit whose equations have no unique solution
  | 'UNSTABLE' // a circuit with poles in the right half-plane
  | 'INVALID_SPEC' // a design file that fails validation
  | 'INVALID_CSV' // measured data that cannot be read
  | 'IO'; // a file that cannot be read or written

/** Base class of every error gicladder throws on purpose. */
export class GicladderError extends Error {
  readonly code: GicladderErrorCode;
  /** Dotted path of the offending field or the parameter name. */
  readonly path: string;
  /** The offending value, as given (may be any type). */
  readonly value: unknown;

  constructor(code: GicladderErrorCode, path: string, value: unknown, message: string) {
    super(`${path}: ${message} (got ${describeValue(value)})`);
    this.name = new.target.name;
    this.code = code;
    this.path = path;
    this.value = value;
  }
}

/** A number, string or structure that is not acceptable where it was given. */
export class InvalidInputError extends GicladderError {}

/** An arithmetic operation with no defined result in exact algebra (division by zero). */
export class ArithmeticError extends GicladderError {}

/** A request that is valid in form but cannot be realised (mask, ladder, circuit). */
export class UnrealizableError extends GicladderError {}

/** Renders a value for a message without throwing on cycles, BigInt or huge strings. */
export function describeValue(value: unknown): string {
  try {
    if (typeof value === 'string') {
      const shown = value.length > 60 ? `${value.slice(0, 57)}...` : value;
      return JSON.stringify(shown);
    }
    if (typeof value === 'bigint') return `${value}n`;
    if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
    if (value === undefined) return 'undefined';
    if (typeof value === 'function') return 'a function';
    const json = JSON.stringify(value, (_k, v) => (typeof v === 'bigint' ? `${v}n` : v));
    if (json === undefined) return String(value);
    return json.length > 80 ? `${json.slice(0, 77)}...` : json;
  } catch {
    return Object.prototype.toString.call(value);
  }
}

/** Throws unless `value` is a finite number. Returns it, typed. */
export function requireFinite(value: unknown, path: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new InvalidInputError('INVALID_NUMBER', path, value, 'must be a finite number');
  }
  return value;
}

/** Throws unless `value` is a finite number greater than zero. */
export function requirePositive(value: unknown, path: string): number {
  const v = requireFinite(value, path);
  if (!(v > 0)) throw new InvalidInputError('OUT_OF_RANGE', path, value, 'must be greater than zero');
  return v;
}

/** Throws unless `value` is an integer in [min, max]. */
export function requireInteger(value: unknown, path: string, min: number, max: number): number {
  const v = requireFinite(value, path);
  if (!Number.isInteger(v) || v < min || v > max) {
    throw new InvalidInputError('OUT_OF_RANGE', path, value, `must be an integer from ${min} to ${max}`);
  }
  return v;
}

/** Throws unless `value` is one of `allowed`. */
export function requireOneOf<T extends string>(value: unknown, path: string, allowed: readonly T[]): T {
  if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value)) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, value, `must be one of ${allowed.map((a) => `'${a}'`).join(', ')}`);
  }
  return value as T;
}
