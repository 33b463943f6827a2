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
