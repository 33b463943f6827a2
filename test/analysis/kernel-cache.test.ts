/**
 * The cache of generated kernels (analysis/lu-codegen.ts cachedFunction): one function per text,
 * bounded by count and by characters, and engines of one structure sharing their kernels.
 */
import { describe, expect, it } from 'vitest';
import { cachedFunction, KERNEL_CACHE_CHARS, KERNEL_CACHE_SIZE } from '../../src/analysis/lu-codegen';

describe('cachedFunction', () => {
  it('returns the same function for the same text and a different one for another text', () => {
    const a = cachedFunction(['x'], 'return x + 1;');
    const b = cachedFunction(['x'], 'return x + 1;');
    const c = cachedFunction(['y'], 'return y + 1;');
    expect(a).toBe(b);
    expect(c).not.toBe(a);
    expect((a as (x: number) => number)(2)).toBe(3);
  });

  it('drops the least recently used beyond its size, and keeps a refreshed one', () => {
    const first = cachedFunction(['x'], 'return x * 101;');
    const kept = cachedFunction(['x'], 'return x * 102;');
    for (let i = 0; i < KERNEL_CACHE_SIZE - 1; i++) {
      cachedFunction(['x'], `return x * ${1000 + i};`);
      cachedFunction(['x'], 'return x * 102;'); // used all along
    }
    expect(cachedFunction(['x'], 'return x * 102;')).toBe(kept);
    expect(cachedFunction(['x'], 'return x * 101;')).not.toBe(first); // compiled afresh
  });

  it('holds no more than its character bound of text', () => {
    const big = (k: number) => `return ${k};${' '.repeat(Math.ceil(KERNEL_CACHE_CHARS / 3))}`;
    const f0 = cachedFunction([], big(0));
    cachedFunction([], big(1));
    cachedFunction([], big(2));
    cachedFunction([], big(3)); // four texts of a third of the bound each: the oldest must have gone
    expect(cachedFunction([], big(0))).not.toBe(f0);
    expect((cachedFunction([], big(3)) as () => number)()).toBe(3);
  });
});
