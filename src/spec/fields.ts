/**
 * Field builders of the design-file schema: quantities that may be written as numbers or as strings
 * with SI prefixes, units and IEC 60062 codes ('4k7', '10n', '2.2 kHz'), read by parseQuantity with the
 * field's unit, and positive finite numbers. A value that does not parse becomes a zod issue at the
 * field's path (never a thrown error), so that every problem of a file is reported at once.
 */
import { z } from 'zod';
import { GicladderError } from '../errors';
import { parseQuantity } from '../units/parse';

/** Longest quantity string accepted: '1.00000000000000000001 kHz' fits with room; a paragraph does not. */
export const MAX_QUANTITY_LENGTH = 64;

export type QuantityUnit = 'ohm' | 'F' | 'H' | 'Hz' | 's' | 'V';

/**
 * The range a quantity of each unit must lie in (zero aside, where allowed). Far beyond any GIC filter
 * (a µHz seismic lowpass to a 10 GHz band; 1 fF to 1 F; 1 mohm to 1 Tohm), and inside it every stage's
 * float boundary stays finite: outside, part values overflow or underflow the C header's float, the
 * exact design frequencies round to zero, and the errors name internal fields instead of the file's
 * (found by the robustness fuzzing, test/robustness).
 */
export const QUANTITY_RANGES: Readonly<Partial<Record<QuantityUnit, readonly [number, number]>>> = Object.freeze({
  Hz: [1e-6, 1e10],
  F: [1e-15, 1],
  ohm: [1e-3, 1e12],
});

export interface QuantityOptions {
  /** Accept zero (default false: the value must be greater than zero). */
  allowZero?: boolean;
}

/**
 * A quantity in `unit`: a finite number (in base units) or a quantity string. Output: the number.
 * Strings with another unit ('10 nF' where Hz is expected) are refused.
 */
export function quantity(unit: QuantityUnit, options: QuantityOptions = {}) {
  const allowZero = options.allowZero ?? false;
  return z
    .union([
      z.number(),
      z
        .string()
        .max(MAX_QUANTITY_LENGTH)
        .describe(`A quantity string in ${unit}: digits with an optional SI prefix and unit ('2.2 k${unit}', '4k7')`),
    ])
    .transform((v, ctx): number => {
      let x: number;
      if (typeof v === 'number') x = v;
      else {
        try {
          x = parseQuantity(v, { unit, allowZero });
        } catch (e) {
          const reason = e instanceof GicladderError ? e.message.replace(/^quantity: /, '').replace(/\s*\(got .*\)$/s, '') : 'does not parse';
          ctx.issues.push({ code: 'custom', message: `not a quantity in ${unit}: ${reason}`, input: v });
          return z.NEVER;
        }
      }
      if (!Number.isFinite(x) || (allowZero ? x < 0 : x <= 0)) {
        ctx.issues.push({ code: 'custom', message: allowZero ? 'must be a finite number >= 0' : 'must be a finite number > 0', input: v });
        return z.NEVER;
      }
      const range = QUANTITY_RANGES[unit];
      if (range && x !== 0 && (x < range[0] || x > range[1])) {
        ctx.issues.push({ code: 'custom', message: `must be from ${range[0]} to ${range[1]} ${unit}`, input: v });
        return z.NEVER;
      }
      return x;
    });
}

/** A finite number > 0 (no unit: dB, percent, ppm/K, counts). */
export const positiveNumber = () => z.number().positive().finite();

/** A pair [low, high] of frequencies in Hz, low < high. */
export function frequencyPair() {
  return z
    .tuple([quantity('Hz'), quantity('Hz')])
    .refine(([a, b]) => a < b, { message: 'must be increasing: [low, high]' });
}

/** One frequency or a [low, high] pair, in Hz. */
export function frequencyOrPair() {
  return z.union([quantity('Hz'), frequencyPair()]);
}
