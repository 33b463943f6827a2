/**
 * A closed interval of a measured quantity (gain in dB, phase in degrees) with optional open ends:
 * `lower` may be -Infinity and `upper` Infinity (a stopband point has an upper gain limit only).
 * An interval with lower > upper is empty (a guard band that ate the whole tolerance): nothing is in it.
 */
export interface Interval {
  readonly lower: number;
  readonly upper: number;
}

/** True when x lies in the closed interval. NaN is in no interval. */
export function inInterval(x: number, interval: Interval): boolean {
  return x >= interval.lower && x <= interval.upper;
}

/** Signed distances of x to the ends: positive inside (x - lower, upper - x); +Infinity for an open end. */
export function marginsTo(x: number, interval: Interval): { readonly lower: number; readonly upper: number } {
  return { lower: x - interval.lower, upper: interval.upper - x };
}
