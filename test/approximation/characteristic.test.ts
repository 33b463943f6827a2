import { describe, expect, it } from 'vitest';
import { lowpassCharacteristic, lowpassPrototype, evaluateZpk, type LowpassPrototypeParams } from '../../src/approximation/index';
import { cAbs } from '../../src/algebra/complex';
import { InvalidInputError } from '../../src/errors';
import ladders from '../fixtures/mpmath/elliptic-ladders.json';

const orders = Array.from({ length: 15 }, (_, i) => i + 1);

describe('lowpassCharacteristic: the reflection zeros', () => {
  // At a zero of K the response is at its passband maximum, 1 in scipy's normalisation (even orders of
  // Chebyshev and elliptic peak at 1 with H(0) = 10^(-ripple/20)); common practice, no source.
  const families: LowpassPrototypeParams[] = [];
  for (const n of orders) {
    families.push({ family: 'chebyshev', order: n, passbandRippleDb: 0.5 });
    if (n >= 2) families.push({ family: 'elliptic', order: n, passbandRippleDb: 0.5, stopbandAttenuationDb: 60 });
    if (n >= 2) families.push({ family: 'elliptic', order: n, passbandRippleDb: 0.1, stopbandAttenuationDb: 40 });
  }
  it.each(families.map((p) => [`${p.family} ${p.order} (${p.passbandRippleDb}, ${p.stopbandAttenuationDb})`, p] as const))(
    '%s: |H(jw)| = 1 at every reflection zero, and the zeros count to the order',
    (_, p) => {
      const c = lowpassCharacteristic(p)!;
      expect(c.originMultiplicity + 2 * c.reflectionOmegasRadPerS.length).toBe(p.order);
      expect(c.originMultiplicity).toBe(p.order % 2);
      const zpk = lowpassPrototype(p);
      for (const w of c.reflectionOmegasRadPerS) {
        expect(w).toBeGreaterThan(0);
        expect(w).toBeLessThan(1);
        // 1e-12: the prototype's rounding times the flatness near a maximum (none: |H| is stationary there).
        expect(Math.abs(cAbs(evaluateZpk(zpk, { re: 0, im: w })) - 1)).toBeLessThan(1e-12);
      }
      const sorted = [...c.reflectionOmegasRadPerS].sort((a, b) => a - b);
      expect(c.reflectionOmegasRadPerS).toEqual(sorted);
    },
  );

  it('puts elliptic reflection zeros where mpmath does (test/fixtures/mpmath/elliptic-ladders.json, 50 digits)', () => {
    const odd = (ladders.cases as { family: string; order: number; form: string; passbandRippleDb?: number; stopbandAttenuationDb: number; realizedReflectionOmegaSquared: number[] }[]).filter(
      (c) => c.family === 'elliptic' && c.order % 2 === 1 && c.form === 'series-first',
    );
    expect(odd.length).toBeGreaterThan(10);
    for (const c of odd) {
      const got = lowpassCharacteristic({ family: 'elliptic', order: c.order, passbandRippleDb: c.passbandRippleDb, stopbandAttenuationDb: c.stopbandAttenuationDb })!;
      const squares = got.reflectionOmegasRadPerS.map((w) => w * w);
      const want = [...c.realizedReflectionOmegaSquared].sort((a, b) => a - b); // the fixture lists a multiset
      expect(squares.length).toBe(want.length);
      // 1e-13 relative: the moduli in double (complement forms), as for the prototype's zeros.
      squares.forEach((x, i) => expect(Math.abs(x / want[i] - 1)).toBeLessThan(1e-13));
    }
  });

  it('puts every reflection zero of Butterworth and inverse Chebyshev at the origin, and has none for Bessel', () => {
    expect(lowpassCharacteristic({ family: 'butterworth', order: 7 })).toEqual({ originMultiplicity: 7, reflectionOmegasRadPerS: [] });
    expect(lowpassCharacteristic({ family: 'inverse-chebyshev', order: 6, stopbandAttenuationDb: 40 })).toEqual({ originMultiplicity: 6, reflectionOmegasRadPerS: [] });
    expect(lowpassCharacteristic({ family: 'bessel', order: 4 })).toBeNull();
  });

  it('gives the Chebyshev nodes cos((2i-1) pi/(2N)) (Chebyshev polynomial zeros, closed form)', () => {
    const c = lowpassCharacteristic({ family: 'chebyshev', order: 6, passbandRippleDb: 1 })!;
    const want = [5, 3, 1].map((k) => Math.cos((k * Math.PI) / 12));
    c.reflectionOmegasRadPerS.forEach((w, i) => expect(w).toBeCloseTo(want[i], 15));
  });

  it('validates like lowpassPrototype', () => {
    expect(() => lowpassCharacteristic({ family: 'elliptic', order: 16, passbandRippleDb: 1, stopbandAttenuationDb: 40 })).toThrow(InvalidInputError);
  });
});
