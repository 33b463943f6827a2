import { describe, expect, it } from 'vitest';
import { formatQuantity } from '../../src/units/format';
import { InvalidInputError } from '../../src/errors';
import { expectInvalid as expectCode } from '../helpers/expect-error';

describe('formatQuantity', () => {
  // The documented form '<mantissa> <prefix><unit>' (SI Brochure 9th ed. 5.4.3 for the space).
  it.each([
    [4700, 'ohm', undefined, '4.7 kohm'],
    [4700, '\u2126', undefined, '4.7 k\u2126'],
    [1e-8, 'F', undefined, '10 nF'],
    [2200, 'Hz', undefined, '2.2 kHz'],
    [4.7e-9, 'F', undefined, '4.7 nF'],
    [0.47, 'ohm', undefined, '470 mohm'],
    [1, 'H', undefined, '1 H'],
    [1000, '', undefined, '1k'],
    [123456, 'ohm', undefined, '123 kohm'],
    [123456, 'ohm', 6, '123.456 kohm'],
    [999.96, 'Hz', undefined, '1 kHz'],
    [999.4, 'Hz', undefined, '999 Hz'],
    [1.5e-6, 'F', undefined, '1.5 uF'],
    [0, 'F', undefined, '0 F'],
    [-2.2e3, 'ohm', undefined, '-2.2 kohm'],
    [1.5e-18, 'F', undefined, '1.5e-18 F'],
    [2e15, 'Hz', undefined, '2e15 Hz'],
    [1e12, 'Hz', undefined, '1 THz'],
    [1e-15, 'F', undefined, '1 fF'],
    [100, 'ohm', 1, '100 ohm'],
    [150, 'ohm', 1, '200 ohm'],
  ] as [number, string, number | undefined, string][])('%s %s digits=%s -> %s', (v, u, digits, expected) => {
    expect(formatQuantity(v, u, digits === undefined ? {} : { digits })).toBe(expected);
  });

  it('rejects NaN and Infinity', () => {
    expectCode(() => formatQuantity(NaN, 'F'), 'INVALID_NUMBER', 'value');
    expectCode(() => formatQuantity(Infinity, 'F'), 'INVALID_NUMBER', 'value');
    expectCode(() => formatQuantity('1' as unknown as number, 'F'), 'INVALID_NUMBER', 'value');
  });

  it('rejects digits outside 1..17 and non-integer digits', () => {
    for (const d of [0, 18, 2.5, NaN, -1]) {
      try {
        formatQuantity(1, 'F', { digits: d });
        throw new Error('expected a throw');
      } catch (e) {
        expect(e).toBeInstanceOf(InvalidInputError);
        expect(['OUT_OF_RANGE', 'INVALID_NUMBER']).toContain((e as InvalidInputError).code);
        expect((e as InvalidInputError).path).toBe('options.digits');
      }
    }
  });

  it('rejects a unit parseQuantity cannot read back', () => {
    expectCode(() => formatQuantity(1, 'furlong'), 'INVALID_ARGUMENT', 'unit');
    expectCode(() => formatQuantity(1, 3 as unknown as string), 'INVALID_ARGUMENT', 'unit');
  });
});
