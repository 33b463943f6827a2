import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { damerauLevenshtein, suggestKey } from '../../src/spec/suggest';

describe('damerauLevenshtein (optimal string alignment)', () => {
  it('counts single edits as 1, adjacent transposition as 1', () => {
    expect(damerauLevenshtein('', '')).toBe(0);
    expect(damerauLevenshtein('abc', '')).toBe(3);
    expect(damerauLevenshtein('order', 'oder')).toBe(1); // deletion
    expect(damerauLevenshtein('order', 'ordre')).toBe(1); // transposition
    expect(damerauLevenshtein('kitten', 'sitting')).toBe(3); // textbook example, from memory
    expect(damerauLevenshtein('ca', 'abc')).toBe(3); // OSA, not the unrestricted distance (2)
  });
  it('is symmetric, zero only for equal strings, and bounded by the longer length', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 12 }), fc.string({ maxLength: 12 }), (a, b) => {
        const d = damerauLevenshtein(a, b);
        expect(d).toBe(damerauLevenshtein(b, a));
        expect(d === 0).toBe(a === b);
        expect(d).toBeLessThanOrEqual(Math.max(a.length, b.length));
        expect(d).toBeGreaterThanOrEqual(Math.abs(a.length - b.length));
      }),
    );
  });
});

describe('suggestKey', () => {
  const keys = ['passbandEdgeHz', 'stopbandEdgeHz', 'passbandRippleDb', 'order'];
  it('suggests the nearest key for typical slips', () => {
    expect(suggestKey('passbandEdgeHZ', keys)).toBe('passbandEdgeHz');
    expect(suggestKey('stopbandEdgHz', keys)).toBe('stopbandEdgeHz');
    expect(suggestKey('oredr', keys)).toBe('order');
  });
  it('suggests nothing for an unrelated or huge key', () => {
    expect(suggestKey('colour', keys)).toBeUndefined();
    expect(suggestKey('x'.repeat(500), keys)).toBeUndefined();
  });
});
