/** Sample statistics against mathjs (mean, std with n - 1, quantileSeq's linear interpolation = type 7). */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { mean, quantileSeq, std } from 'mathjs';
import { summarizeSamples } from '../../src/production/statistics';

describe('summarizeSamples', () => {
  it('agrees with mathjs on random samples (mathjs: mean, std unbiased, quantileSeq)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 2, maxLength: 200 }), (xs) => {
        const s = summarizeSamples(xs, [0.00135, 0.5, 0.975]);
        const scale = Math.max(1, ...xs.map(Math.abs));
        expect(Math.abs(s.mean - (mean(xs) as number))).toBeLessThan(1e-12 * scale);
        expect(Math.abs(s.sd - (std(xs) as unknown as number))).toBeLessThan(1e-9 * scale);
        for (const q of s.quantiles) expect(Math.abs(q.value - (quantileSeq(xs, q.probability) as number))).toBeLessThan(1e-12 * scale);
      }),
      { numRuns: 50 },
    );
  });
  it('leaves out and counts non-finite samples; empty gives NaN', () => {
    const s = summarizeSamples([1, NaN, 3, Infinity]);
    expect([s.count, s.nonFinite, s.mean, s.min, s.max]).toEqual([2, 2, 2, 1, 3]);
    expect(summarizeSamples([]).mean).toBeNaN();
  });
});
