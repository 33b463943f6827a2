import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  E_SERIES_NAMES,
  nearestPreferred,
  nearestPreferredExact,
  nextPreferredDown,
  nextPreferredDownExact,
  nextPreferredUp,
  nextPreferredUpExact,
  preferredHundredths,
  preferredValues,
  preferredValuesExact,
  type ESeriesName,
} from '../../src/units/eseries';
import { InvalidInputError } from '../../src/errors';
import { Fraction, fractionFromDouble } from '../../src/algebra/rational';
import { expectInvalid } from '../helpers/expect-error';

const SIZES: Record<ESeriesName, number> = { E3: 3, E6: 6, E12: 12, E24: 24, E48: 48, E96: 96, E192: 192 };

/** round(10^(i/n)) to the series' significant figures, in hundredths: the geometric formula the standard departs from. */
function formulaHundredths(series: ESeriesName): number[] {
  const n = SIZES[series];
  const step = n <= 24 ? 10 : 1; // two significant figures up to E24, three above (IEC 60063 Tables 1 and 2)
  // No value lies within 0.004 of a rounding boundary (checked with mpmath at 40 digits), so Math.pow is safe here.
  return Array.from({ length: n }, (_, i) => Math.round((100 * 10 ** (i / n)) / step) * step);
}

function deviations(series: ESeriesName): number[] {
  const f = formulaHundredths(series);
  return preferredHundredths(series).filter((v, i) => v !== f[i]);
}

/** floor(sqrt(n)) for a non-negative bigint, by Newton's iteration. */
function isqrt(n: bigint): bigint {
  if (n < 2n) return n;
  // Start above the root (float estimate times 2) and descend: Newton's iterates decrease to floor(sqrt(n)).
  let x = BigInt(Math.ceil(Math.sqrt(Number(n)))) * 2n + 1n;
  for (;;) {
    const y = (x + n / x) / 2n;
    if (y >= x) return x;
    x = y;
  }
}

describe('E-series tables (IEC 60063:2015 Tables 1 and 2, from memory)', () => {
  it('have the standard sizes, ascend strictly and lie in [1, 10)', () => {
    for (const s of E_SERIES_NAMES) {
      const v = preferredValues(s);
      expect(v.length).toBe(SIZES[s]);
      expect(v[0]).toBe(1);
      for (let i = 1; i < v.length; i++) expect(v[i]).toBeGreaterThan(v[i - 1]);
      expect(v[v.length - 1]).toBeLessThan(10);
    }
  });

  it('E24 departs from round(10^(i/24)) at exactly 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2 (IEC 60063:2015 Table 1)', () => {
    expect(deviations('E24')).toEqual([270, 300, 330, 360, 390, 430, 470, 820]);
  });

  it('E192 departs from round(10^(i/192)) only at 9.20, where the formula gives 9.19 (IEC 60063:2015 Table 2)', () => {
    expect(deviations('E192')).toEqual([920]);
    expect(formulaHundredths('E192')[185]).toBe(919);
  });

  it('E96 and E48 follow the formula exactly (IEC 60063:2015 Table 2)', () => {
    expect(deviations('E96')).toEqual([]);
    expect(deviations('E48')).toEqual([]);
  });

  it('E12, E6, E3 inherit the E24 deviations they contain', () => {
    expect(deviations('E12')).toEqual([270, 330, 390, 470, 820]);
    expect(deviations('E6')).toEqual([330, 470]);
    expect(deviations('E3')).toEqual([470]);
  });

  it('nest: E3 in E6 in E12 in E24 and E48 in E96 in E192, each every second value of the next', () => {
    const chains: ESeriesName[][] = [
      ['E3', 'E6', 'E12', 'E24'],
      ['E48', 'E96', 'E192'],
    ];
    for (const chain of chains) {
      for (let k = 0; k + 1 < chain.length; k++) {
        const small = preferredHundredths(chain[k]);
        const big = preferredHundredths(chain[k + 1]);
        expect(big.filter((_, i) => i % 2 === 0)).toEqual(small);
      }
    }
  });

  it('doubles are the exact decimals: preferredValues equal parseFloat of the printed value', () => {
    expect(preferredValues('E12')).toEqual([1, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]);
    expect(preferredValuesExact('E6').map((f) => f.toFraction())).toEqual(['1', '3/2', '11/5', '33/10', '47/10', '34/5']);
  });

  it('tables are frozen', () => {
    expect(Object.isFrozen(preferredValues('E24'))).toBe(true);
    expect(Object.isFrozen(preferredHundredths('E192'))).toBe(true);
  });
});

describe('nearestPreferred', () => {
  it('rounds across decades and returns exact decimals as doubles', () => {
    expect(nearestPreferred(9.9e3, 'E12')).toBe(1e4);
    expect(nearestPreferred(0.0047, 'E12')).toBe(0.0047);
    expect(nearestPreferred(4.6e-9, 'E12')).toBe(4.7e-9);
    expect(nearestPreferred(4.6e-9, 'E12')).toBe(parseFloat('4.7e-9'));
    expect(nearestPreferred(1234, 'E96')).toBe(1240);
    expect(nearestPreferred(1e-300, 'E24')).toBe(1e-300);
    expect(nearestPreferred(3.14159e-12, 'E24')).toBe(3.0e-12);
    expect(nearestPreferred(5e-324, 'E3')).toBe(4.7e-324);
  });

  it('uses the geometric midpoint as boundary: sqrt(4.7*5.6) = 5.1303...', () => {
    expect(nearestPreferred(5.13, 'E12')).toBe(4.7);
    expect(nearestPreferred(5.131, 'E12')).toBe(5.6);
    // The arithmetic midpoint 5.15 would round up; the geometric one already did at 5.131.
    expect(nearestPreferred(5.14, 'E12')).toBe(5.6);
  });

  it('cannot meet an exact tie: no adjacent pair a, b has a*b a rational square (so the tie rule is moot)', () => {
    for (const s of E_SERIES_NAMES) {
      const h = [...preferredHundredths(s), 1000];
      for (let i = 0; i + 1 < h.length; i++) {
        const prod = BigInt(h[i] * h[i + 1]);
        const r = BigInt(Math.floor(Math.sqrt(Number(prod))));
        // sqrt(a*b) is rational iff the integer a*b (in hundredths^2) is a perfect square.
        expect([r - 1n, r, r + 1n].some((k) => k * k === prod)).toBe(false);
      }
    }
  });

  it('decides the geometric midpoint exactly, for rationals 1e-30 either side of it (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom(...E_SERIES_NAMES), fc.nat(), (s, k) => {
        const h = [...preferredHundredths(s), 1000];
        const i = k % (h.length - 1);
        const a = new Fraction(BigInt(h[i]), 100n);
        const b = new Fraction(BigInt(h[i + 1]), 100n);
        // floor(sqrt(a*b) * 10^30) / 10^30 lies below the midpoint, one unit more lies above it.
        const scaled = BigInt(h[i] * h[i + 1]) * 10n ** 56n; // (a*b) * 10^60 in hundredths^2 units
        const root = isqrt(scaled);
        const below = new Fraction(root, 10n ** 30n);
        const above = new Fraction(root + 1n, 10n ** 30n);
        expect(nearestPreferredExact(below, s).equals(a)).toBe(true);
        expect(nearestPreferredExact(above, s).equals(b)).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it('returns a preferred value, never farther (in log) than a neighbour (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-12, max: 1e12, noNaN: true }), fc.constantFrom(...E_SERIES_NAMES), (x, s) => {
        const p = nearestPreferred(x, s);
        const up = nextPreferredUp(x, s);
        const down = nextPreferredDown(x, s);
        expect(down).toBeLessThanOrEqual(x);
        expect(up).toBeGreaterThanOrEqual(x);
        expect([up, down]).toContain(p);
        // Log distance to p is at most that to the other neighbour (up to the double rounding of log).
        const other = p === up ? down : up;
        expect(Math.abs(Math.log(p / x))).toBeLessThanOrEqual(Math.abs(Math.log(other / x)) + 1e-15);
        // p is a decade-scaled table entry.
        const e = Math.floor(Math.log10(p) + 1e-12);
        const mantissa = Math.round((p / 10 ** e) * 100);
        expect(preferredHundredths(s)).toContain(mantissa === 1000 ? 100 : mantissa);
      }),
      { numRuns: 500 },
    );
  });

  it('is idempotent and maps every preferred value to itself (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom(...E_SERIES_NAMES), fc.integer({ min: -15, max: 15 }), fc.nat(), (s, e, k) => {
        const h = preferredHundredths(s);
        const v = Number(`${h[k % h.length]}e${e - 2}`);
        expect(nearestPreferred(v, s)).toBe(v);
        expect(nextPreferredUp(v, s)).toBe(v);
        expect(nextPreferredDown(v, s)).toBe(v);
      }),
      { numRuns: 300 },
    );
  });

  it('is monotone non-decreasing (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-9, max: 1e9, noNaN: true }), fc.double({ min: 1e-9, max: 1e9, noNaN: true }), (a, b) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        expect(nearestPreferred(lo, 'E24')).toBeLessThanOrEqual(nearestPreferred(hi, 'E24'));
      }),
      { numRuns: 300 },
    );
  });
});

describe('nextPreferredUp / nextPreferredDown', () => {
  it('round up and down across decade boundaries', () => {
    expect(nextPreferredUp(8.3e3, 'E12')).toBe(1e4);
    expect(nextPreferredDown(9.99e3, 'E12')).toBe(8.2e3);
    expect(nextPreferredUp(4.71e-9, 'E12')).toBe(5.6e-9);
    expect(nextPreferredDown(4.69e-9, 'E12')).toBe(3.9e-9);
    expect(nextPreferredDown(1e-6, 'E6')).toBe(1e-6);
    expect(nextPreferredDown(0.99e-6, 'E6')).toBe(6.8e-7);
  });

  it('treat the double 4.7e-9 as the preferred value although it is not exactly 47/10^10', () => {
    const exact = new Fraction(47n, 10n ** 10n);
    expect(fractionFromDouble(4.7e-9).equals(exact)).toBe(false);
    expect(nextPreferredUp(4.7e-9, 'E12')).toBe(4.7e-9);
    expect(nextPreferredDown(4.7e-9, 'E12')).toBe(4.7e-9);
    expect(nextPreferredUpExact(4.7e-9, 'E12').equals(exact)).toBe(true);
    expect(nextPreferredDownExact(4.7e-9, 'E12').equals(exact)).toBe(true);
  });

  it('exact variants compare strings and Fractions exactly', () => {
    expect(nextPreferredUpExact('4.7e-9', 'E12').toFraction()).toBe('47/10000000000');
    expect(nextPreferredUpExact('4.7000001n', 'E12').toFraction()).toBe('7/1250000000');
    expect(nextPreferredDownExact('4.6999999n', 'E12').toFraction()).toBe('39/10000000000');
    expect(nearestPreferredExact('4k6', 'E12').toFraction()).toBe('4700');
    expect(nearestPreferredExact('1/3', 'E6').toFraction()).toBe('33/100');
    expect(nearestPreferredExact(10n ** 400n, 'E3').equals(new Fraction(10n ** 400n))).toBe(true);
  });

  it('exact variants agree with the double ones on doubles (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-20, max: 1e20, noNaN: true }), fc.constantFrom(...E_SERIES_NAMES), (x, s) => {
        expect(nearestPreferredExact(x, s).valueOf()).toBe(nearestPreferred(x, s));
        expect(nextPreferredUpExact(x, s).valueOf()).toBe(nextPreferredUp(x, s));
        expect(nextPreferredDownExact(x, s).valueOf()).toBe(nextPreferredDown(x, s));
      }),
      { numRuns: 300 },
    );
  });
});

describe('E-series bad input', () => {
  const fns = [nearestPreferred, nextPreferredUp, nextPreferredDown] as const;
  const exactFns = [nearestPreferredExact, nextPreferredUpExact, nextPreferredDownExact] as const;
  it('NaN and Infinity are INVALID_NUMBER; zero and negatives OUT_OF_RANGE', () => {
    for (const f of [...fns, ...exactFns]) {
      expectInvalid(() => f(NaN, 'E12'), 'INVALID_NUMBER', 'value');
      expectInvalid(() => f(Infinity, 'E12'), 'INVALID_NUMBER', 'value');
      expectInvalid(() => f(-Infinity, 'E12'), 'INVALID_NUMBER', 'value');
      expectInvalid(() => f(0, 'E12'), 'OUT_OF_RANGE', 'value');
      expectInvalid(() => f(-4.7, 'E12'), 'OUT_OF_RANGE', 'value');
    }
    for (const f of exactFns) {
      expectInvalid(() => f('-1k', 'E12'), 'OUT_OF_RANGE', 'value');
      expectInvalid(() => f('abc', 'E12'), 'INVALID_QUANTITY', 'value');
      expectInvalid(() => f(new Fraction(0), 'E12'), 'OUT_OF_RANGE', 'value');
      expectInvalid(() => f(-3n, 'E12'), 'OUT_OF_RANGE', 'value');
    }
  });

  it('an unknown series is INVALID_ARGUMENT at path series', () => {
    for (const f of [...fns, ...exactFns]) expectInvalid(() => f(1, 'E7' as ESeriesName), 'INVALID_ARGUMENT', 'series');
    expectInvalid(() => preferredValues('e12' as ESeriesName), 'INVALID_ARGUMENT', 'series');
    expectInvalid(() => preferredValuesExact(undefined as unknown as ESeriesName), 'INVALID_ARGUMENT', 'series');
    expectInvalid(() => preferredHundredths('E24 ' as ESeriesName), 'INVALID_ARGUMENT', 'series');
  });

  it('a preferred value beyond the largest double is OUT_OF_RANGE', () => {
    expectInvalid(() => nearestPreferred(Number.MAX_VALUE, 'E12'), 'OUT_OF_RANGE', 'value');
    expectInvalid(() => nextPreferredUp(Number.MAX_VALUE, 'E3'), 'OUT_OF_RANGE', 'value');
    expect(nextPreferredDown(Number.MAX_VALUE, 'E3')).toBe(1e308);
  });
});
