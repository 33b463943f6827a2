/**
 * Fixed-point (Q15 / Q31) forms of digital second-order sections for the C header.
 *
 * First the numerators are balanced ({@link balanceNumerators}): each is rescaled so that all have the
 * same largest coefficient magnitude (the geometric mean of the originals), which keeps the product, H,
 * unchanged. Without it the overall gain of a narrow lowpass (1e-5 and less) sits in the first numerator
 * and rounds to a few steps, or to zero, in Q15. (Equal scaling is a simple rule, no L-infinity scaling
 * of the internal signals; common practice, no source.)
 *
 * One shift for the whole table: the smallest S >= 0 with |c| < 2^S for every coefficient, so each
 * c / 2^S lies in (-1, 1) and is stored as the signed integer q = round(c 2^(F - S)), F = 15 or 31
 * fractional bits; the real coefficient is q 2^(S - F). Rounding is to nearest with ties away from
 * zero; the result is saturated to [-2^F, 2^F - 1] (only c / 2^S just below 1 can round up to 2^F and
 * saturate). Scaling by a power of two is exact in binary floating point, so the only error is the
 * rounding: at most half a step, 2^(S - F - 1), unless saturated (one step). Coefficients much smaller
 * than 2^(S - F) lose their relative precision (a narrow lowpass's numerator): use Q31 or float there.
 * (Common practice for fixed-point biquads, no source.)
 */
import { InvalidInputError } from '../errors';
import type { DigitalSection } from './sos';

export type FixedPointFormat = 'Q15' | 'Q31';

/** Fractional bits of each format. */
export const FRACTION_BITS: Record<FixedPointFormat, 15 | 31> = { Q15: 15, Q31: 31 };

export interface QuantisedSections {
  readonly format: FixedPointFormat;
  /** The balanced sections that were quantised (same H as the input). */
  readonly balanced: readonly DigitalSection[];
  readonly fractionBits: 15 | 31;
  /** Real coefficient = q 2^(shift - fractionBits). */
  readonly shift: number;
  /** One row [b0, b1, b2, a1, a2] per section. */
  readonly rows: readonly (readonly number[])[];
}

/** Shift, round and saturate (see the module comment). */
export function quantiseSections(sections: readonly DigitalSection[], format: FixedPointFormat): QuantisedSections {
  const fractionBits = FRACTION_BITS[format];
  if (fractionBits === undefined) throw new InvalidInputError('INVALID_ARGUMENT', 'fixedPoint', format, "must be 'Q15' or 'Q31'");
  sections.forEach((s, i) =>
    [s.b0, s.b1, s.b2, s.a1, s.a2].forEach((c, j) => {
      if (!Number.isFinite(c)) throw new InvalidInputError('INVALID_NUMBER', `digital.sections[${i}][${j}]`, c, 'must be finite');
    }),
  );
  const balanced = balanceNumerators(sections);
  const rows = balanced.map((s) => [s.b0, s.b1, s.b2, s.a1, s.a2]);
  const largest = Math.max(0, ...rows.flat().map(Math.abs));
  let shift = 0;
  while (largest >= 2 ** shift) shift++;
  const full = 2 ** fractionBits;
  const scale = 2 ** (fractionBits - shift);
  const quantise = (c: number) => {
    const q = Math.sign(c) * Math.round(Math.abs(c) * scale); // ties away from zero; exact power-of-two scaling
    return Math.min(full - 1, Math.max(-full, q)) + 0; // saturate; + 0 turns -0 into 0
  };
  return { format, fractionBits, balanced, shift, rows: rows.map((r) => r.map(quantise)) };
}

/**
 * The sections with every numerator rescaled to the same largest magnitude, the geometric mean of the
 * originals (computed through logarithms, so no product over- or underflows); the cascade is unchanged
 * up to rounding. A zero numerator (H = 0) is left as it is.
 */
export function balanceNumerators(sections: readonly DigitalSection[]): DigitalSection[] {
  const peaks = sections.map((s) => Math.max(Math.abs(s.b0), Math.abs(s.b1), Math.abs(s.b2)));
  if (sections.length === 0 || peaks.some((p) => p === 0)) return sections.slice();
  const target = 2 ** (peaks.reduce((acc, p) => acc + Math.log2(p), 0) / peaks.length);
  return sections.map((s, i) => {
    const k = target / peaks[i];
    return { b0: s.b0 * k, b1: s.b1 * k, b2: s.b2 * k, a1: s.a1, a2: s.a2 };
  });
}
