/** Every invalid argument of lowpassPrototype and estimateOrder: class, code and path (never the message). */

import { describe, expect, it } from 'vitest';
import { estimateOrder, lowpassPrototype, type OrderMask } from '../../src/approximation/index.js';
import { GicladderError, InvalidInputError, UnrealizableError } from '../../src/errors.js';

function thrown(f: () => unknown): GicladderError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(GicladderError);
    return e as GicladderError;
  }
  throw new Error('expected a throw');
}

function expectError(f: () => unknown, cls: typeof InvalidInputError | typeof UnrealizableError, code: string, path: string): GicladderError {
  const e = thrown(f);
  expect(e).toBeInstanceOf(cls);
  expect(e.code).toBe(code);
  expect(e.path).toBe(path);
  return e;
}

describe('lowpassPrototype rejects', () => {
  const call = (p: unknown) => () => lowpassPrototype(p as never);
  it.each([
    ['a non-object', null, InvalidInputError, 'INVALID_ARGUMENT', 'prototype'],
    ['an unknown family', { family: 'cauer', order: 3 }, InvalidInputError, 'INVALID_ARGUMENT', 'family'],
    ['a missing family', { order: 3 }, InvalidInputError, 'INVALID_ARGUMENT', 'family'],
    ['order 0', { family: 'butterworth', order: 0 }, InvalidInputError, 'OUT_OF_RANGE', 'order'],
    ['order 16', { family: 'chebyshev', order: 16, passbandRippleDb: 1 }, InvalidInputError, 'OUT_OF_RANGE', 'order'],
    ['a fractional order', { family: 'bessel', order: 2.5 }, InvalidInputError, 'OUT_OF_RANGE', 'order'],
    ['a NaN order', { family: 'bessel', order: Number.NaN }, InvalidInputError, 'INVALID_NUMBER', 'order'],
    ['a string order', { family: 'bessel', order: '3' }, InvalidInputError, 'INVALID_NUMBER', 'order'],
    ['elliptic order 1', { family: 'elliptic', order: 1, passbandRippleDb: 1, stopbandAttenuationDb: 40 }, InvalidInputError, 'OUT_OF_RANGE', 'order'],
    ['a missing Chebyshev ripple', { family: 'chebyshev', order: 3 }, InvalidInputError, 'INVALID_NUMBER', 'passbandRippleDb'],
    ['a zero ripple', { family: 'chebyshev', order: 3, passbandRippleDb: 0 }, InvalidInputError, 'OUT_OF_RANGE', 'passbandRippleDb'],
    ['a negative ripple', { family: 'elliptic', order: 3, passbandRippleDb: -1, stopbandAttenuationDb: 40 }, InvalidInputError, 'OUT_OF_RANGE', 'passbandRippleDb'],
    ['an infinite ripple', { family: 'chebyshev', order: 3, passbandRippleDb: Infinity }, InvalidInputError, 'INVALID_NUMBER', 'passbandRippleDb'],
    ['a missing inverse Chebyshev attenuation', { family: 'inverse-chebyshev', order: 3 }, InvalidInputError, 'INVALID_NUMBER', 'stopbandAttenuationDb'],
    ['a zero attenuation', { family: 'inverse-chebyshev', order: 3, stopbandAttenuationDb: 0 }, InvalidInputError, 'OUT_OF_RANGE', 'stopbandAttenuationDb'],
    ['a missing elliptic attenuation', { family: 'elliptic', order: 3, passbandRippleDb: 1 }, InvalidInputError, 'INVALID_NUMBER', 'stopbandAttenuationDb'],
    ['an elliptic attenuation equal to the ripple', { family: 'elliptic', order: 3, passbandRippleDb: 3, stopbandAttenuationDb: 3 }, UnrealizableError, 'UNREALIZABLE', 'stopbandAttenuationDb'],
    ['an unknown Bessel normalisation', { family: 'bessel', order: 3, normalization: 'mag' }, InvalidInputError, 'INVALID_ARGUMENT', 'normalization'],
  ] as const)('%s', (_name, p, cls, code, path) => {
    expectError(call(p), cls, code, path);
  });

  it('names both numbers when the attenuation does not exceed the ripple', () => {
    const e = expectError(call({ family: 'elliptic', order: 4, passbandRippleDb: 2, stopbandAttenuationDb: 1 }), UnrealizableError, 'UNREALIZABLE', 'stopbandAttenuationDb');
    expect(e.value).toEqual({ passbandRippleDb: 2, stopbandAttenuationDb: 1 });
  });
});

describe('estimateOrder rejects', () => {
  const base: OrderMask = { type: 'lowpass', family: 'butterworth', passbandEdgeHz: 1000, stopbandEdgeHz: 2000,
    passbandRippleDb: 1, stopbandAttenuationDb: 40 };
  const band: OrderMask = { ...base, type: 'bandpass', passbandEdgeHz: [900, 1100], stopbandEdgeHz: [500, 2000] };
  const call = (m: unknown) => () => estimateOrder(m as OrderMask);
  it.each([
    ['a non-object', null, InvalidInputError, 'INVALID_ARGUMENT', 'mask'],
    ['an unknown type', { ...base, type: 'allpass' }, InvalidInputError, 'INVALID_ARGUMENT', 'type'],
    ['an unknown family', { ...base, family: 'gaussian' }, InvalidInputError, 'INVALID_ARGUMENT', 'family'],
    ['a zero ripple', { ...base, passbandRippleDb: 0 }, InvalidInputError, 'OUT_OF_RANGE', 'passbandRippleDb'],
    ['a NaN ripple', { ...base, passbandRippleDb: Number.NaN }, InvalidInputError, 'INVALID_NUMBER', 'passbandRippleDb'],
    ['a missing attenuation', { ...base, stopbandAttenuationDb: undefined }, InvalidInputError, 'INVALID_NUMBER', 'stopbandAttenuationDb'],
    ['an attenuation below the ripple', { ...base, stopbandAttenuationDb: 0.5 }, UnrealizableError, 'UNREALIZABLE', 'stopbandAttenuationDb'],
    ['a negative edge', { ...base, passbandEdgeHz: -1 }, InvalidInputError, 'OUT_OF_RANGE', 'passbandEdgeHz'],
    ['a pair for a lowpass', { ...base, stopbandEdgeHz: [1, 2] }, InvalidInputError, 'INVALID_NUMBER', 'stopbandEdgeHz'],
    ['a number for a bandpass', { ...band, passbandEdgeHz: 1000 }, InvalidInputError, 'INVALID_ARGUMENT', 'passbandEdgeHz'],
    ['a decreasing pair', { ...band, passbandEdgeHz: [1100, 900] }, InvalidInputError, 'OUT_OF_RANGE', 'passbandEdgeHz'],
    ['a non-finite pair member', { ...band, stopbandEdgeHz: [500, Infinity] }, InvalidInputError, 'INVALID_NUMBER', 'stopbandEdgeHz[1]'],
    ['a lowpass stopband edge inside the passband', { ...base, stopbandEdgeHz: 900 }, UnrealizableError, 'UNREALIZABLE', 'stopbandEdgeHz'],
    ['a highpass stopband edge inside the passband', { ...base, type: 'highpass', stopbandEdgeHz: 1100 }, UnrealizableError, 'UNREALIZABLE', 'stopbandEdgeHz'],
    ['a bandpass stopband inside the passband', { ...band, stopbandEdgeHz: [950, 2000] }, UnrealizableError, 'UNREALIZABLE', 'stopbandEdgeHz'],
    ['a bandstop stopband wider than the passband', { ...band, type: 'bandstop', passbandEdgeHz: [500, 2000], stopbandEdgeHz: [400, 1100] }, UnrealizableError, 'UNREALIZABLE', 'stopbandEdgeHz'],
    ['a mask that needs order > 15', { ...base, stopbandEdgeHz: 1100 }, UnrealizableError, 'UNREALIZABLE', 'order'],
    ['a Bessel mask that needs order > 15', { ...base, family: 'bessel' }, UnrealizableError, 'UNREALIZABLE', 'order'],
  ] as const)('%s', (_name, m, cls, code, path) => {
    expectError(call(m), cls, code, path);
  });

  it('names the required order when it is above 15', () => {
    const e = expectError(call({ ...base, stopbandEdgeHz: 1100 }), UnrealizableError, 'UNREALIZABLE', 'order');
    expect((e.value as { requiredOrder: number }).requiredOrder).toBeGreaterThan(15);
    expect((e.value as { maxOrder: number }).maxOrder).toBe(15);
  });
});
