/**
 * lowpassPrototype against scipy.signal's analog prototypes. Expected values: test/fixtures/scipy/
 * prototypes.json, made by scripts/fixtures/approximation.py from scipy.signal.buttap, cheb1ap, cheb2ap,
 * ellipap and besselap (scipy version recorded in the file), and an independent mpmath oracle.
 */

import { describe, expect, it } from 'vitest';
import { lowpassPrototype, reverseBesselCoefficients, type LowpassPrototypeParams } from '../../src/approximation/index.js';
import oracle from '../fixtures/mpmath/elliptic.json';
import fixture from '../fixtures/scipy/prototypes.json';
import { rootTolerance, worstRootError, type Pair } from './helpers.js';

interface Entry {
  family: LowpassPrototypeParams['family'];
  order: number;
  passbandRippleDb?: number;
  stopbandAttenuationDb?: number;
  normalization?: LowpassPrototypeParams['normalization'];
  zeros: Pair[];
  poles: Pair[];
  gain: number;
}

const entries = fixture.prototypes as Entry[];

function label(e: Entry): string {
  const extra = [e.passbandRippleDb, e.stopbandAttenuationDb, e.normalization].filter((x) => x !== undefined);
  return `${e.family} N=${e.order}${extra.length ? ` (${extra.join(', ')})` : ''}`;
}

describe(`lowpassPrototype matches scipy ${fixture.versions.scipy}`, () => {
  it('covers every family and order', () => {
    expect(new Set(entries.map((e) => e.family)).size).toBe(5);
    expect(entries.length).toBeGreaterThan(150);
  });

  it.each(entries.map((e) => [label(e), e] as const))('%s', (_name, e) => {
    const { zeros, poles, gain, ...params } = e;
    const got = lowpassPrototype(params);
    const tolerance = rootTolerance(e.order);
    const z = worstRootError(zeros, got.zeros);
    const p = worstRootError(poles, got.poles);
    expect(z.error, `zeros: ${z.detail}, tolerance ${tolerance}`).toBeLessThanOrEqual(tolerance);
    expect(p.error, `poles: ${p.detail}, tolerance ${tolerance}`).toBeLessThanOrEqual(tolerance);
    const gainError = Math.abs(got.gain - gain) / Math.abs(gain);
    expect(gainError, `gain: expected ${gain}, got ${got.gain}, tolerance ${tolerance}`).toBeLessThanOrEqual(tolerance);
  });
});

describe('elliptic prototype against an mpmath oracle (60 digits)', () => {
  // test/fixtures/mpmath/elliptic.json, ellipticPrototypes: the same formulas evaluated in mpmath. For
  // N = 13..15 at 3 dB / 20 dB (k within 1e-7 of 1) scipy's float64 roots are off by up to 1e-9; ours
  // hold 1e-13 (the complement forms of elliptic-functions.ts).
  it.each(oracle.ellipticPrototypes.map((e) => [`N=${e.order} (${e.passbandRippleDb}, ${e.stopbandAttenuationDb})`, e] as const))(
    '%s',
    (_name, e) => {
      const got = lowpassPrototype({ family: 'elliptic', order: e.order, passbandRippleDb: e.passbandRippleDb,
        stopbandAttenuationDb: e.stopbandAttenuationDb });
      const z = worstRootError(e.zeros as Pair[], got.zeros);
      const p = worstRootError(e.poles as Pair[], got.poles);
      expect(z.error, z.detail).toBeLessThanOrEqual(1e-13);
      expect(p.error, p.detail).toBeLessThanOrEqual(1e-13);
      expect(Math.abs(got.gain - e.gain) / e.gain).toBeLessThanOrEqual(1e-13);
    },
  );
});

describe('Bessel delay-normalised poles against mpmath roots of the reverse Bessel polynomial', () => {
  // test/fixtures/mpmath/elliptic.json, besselDelayRoots: mpmath.polyroots at 60 digits of the exact
  // integer coefficients, which must equal reverseBesselCoefficients.
  it.each(oracle.besselDelayRoots.map((e) => [e.order, e] as const))('N=%i', (_n, e) => {
    expect(reverseBesselCoefficients(e.order).map(String)).toEqual(e.coefficients);
    const got = lowpassPrototype({ family: 'bessel', order: e.order, normalization: 'delay' });
    const p = worstRootError(e.roots as Pair[], got.poles);
    expect(p.error, p.detail).toBeLessThanOrEqual(8 * Number.EPSILON);
  });
});
