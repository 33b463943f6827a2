/**
 * lowpassPrototype against scipy.signal's analog prototypes. Expected values: test/fixtures/scipy/
 * prototypes.json, made by scripts/fixtures/approximation.py from scipy.signal.buttap, cheb1ap, cheb2ap,
 * ellipap and besselap (scipy version recorded in the file).
 */

import { describe, expect, it } from 'vitest';
import { lowpassPrototype, type LowpassPrototypeParams } from '../../src/approximation/index.js';
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
