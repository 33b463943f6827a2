/**
 * The levels the DC-path (dc-path.ts) and DC-reference (dc-reference.ts) searches try for their large
 * resistors, in multiples of a reactance or impedance: 10, 20, 50, 100, ... up to the decade of 1e9,
 * the smallest first (the first one within the error bound is taken).
 */

/** The 1-2-5 multipliers of one decade. */
const STEPS = [1, 2, 5] as const;
/** The smallest level: a resistor of ten reactances (or working impedances) already departs clearly from the ladder. */
export const MIN_LEVEL = 10;
/** The decade of the largest level: beyond 1e9 reactances the resistors are no longer buildable; reaching it is reported as a bound not met. */
export const MAX_LEVEL = 1e9;

/** 10, 20, 50, 100, ..., 5e9. */
export function* oneTwoFiveLevels(): Generator<number> {
  for (let decade = MIN_LEVEL; decade <= MAX_LEVEL; decade *= 10) for (const step of STEPS) yield decade * step;
}
