import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  capacitorImpedance,
  elementImpedance,
  fdncImpedance,
  fdnrImpedance,
  inductorImpedance,
  parallelImpedance,
  resistorImpedance,
  seriesImpedance,
  type ElementKind,
} from '../../src/converter/impedances';
import { toPositiveValue } from '../../src/converter/component-value';
import { RationalFunction } from '../../src/algebra/rational-function';
import { Fraction } from '../../src/algebra/rational';
import { ArithmeticError, InvalidInputError } from '../../src/errors';
import { evaluateNetwork, network, networkImpedance, positiveRational } from './arbitraries';
import { expectInvalid } from '../helpers/expect-error';

const rf = (num: (number | string)[], den: (number | string)[]) => RationalFunction.fromCoefficients(num, den);

describe('element impedances (exact)', () => {
  it('R, 1/(sC), sL, 1/(s^2 D), s^2 E', () => {
    expect(resistorImpedance('4k7').equals(RationalFunction.constant(4700))).toBe(true);
    expect(capacitorImpedance('10n').equals(rf([1], [0, '1e-8']))).toBe(true);
    expect(inductorImpedance('2.2m').equals(rf([0, '0.0022'], [1]))).toBe(true);
    expect(fdnrImpedance('1e-9').equals(rf([1], [0, 0, '1e-9']))).toBe(true);
    expect(fdncImpedance(3).equals(rf([0, 0, 3], [1]))).toBe(true);
  });

  it('takes numbers exactly, decimal strings as decimals', () => {
    expect(capacitorImpedance(0.1).equals(capacitorImpedance('0.1'))).toBe(false);
    expect(capacitorImpedance('1/10').equals(capacitorImpedance('0.1'))).toBe(true);
    expect(capacitorImpedance('100 nF').equals(capacitorImpedance('0.1u'))).toBe(true);
    expect(resistorImpedance(10n).equals(resistorImpedance(new Fraction(10)))).toBe(true);
  });

  it('series R + L and parallel R || C have the textbook forms R + sL and R/(1 + sRC)', () => {
    expect(seriesImpedance(resistorImpedance(3), inductorImpedance(2)).equals(rf([3, 2], [1]))).toBe(true);
    expect(parallelImpedance(resistorImpedance(2), capacitorImpedance(5)).equals(rf([2], [1, 10]))).toBe(true);
    // L || C: sL / (1 + s^2 LC), the tank (common practice, no source).
    expect(parallelImpedance(inductorImpedance(2), capacitorImpedance(3)).equals(rf([0, 2], [1, 0, 6]))).toBe(true);
    expect(seriesImpedance(resistorImpedance(7)).equals(resistorImpedance(7))).toBe(true);
    expect(parallelImpedance(resistorImpedance(7), RationalFunction.ZERO).isZero()).toBe(true);
  });

  it('network impedances agree with direct evaluation of the element laws at rational points (property)', () => {
    fc.assert(
      fc.property(network(3), positiveRational(20, 7), (n, x) => {
        expect(networkImpedance(n).evaluate(x).equals(evaluateNetwork(n, x))).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('series and parallel are commutative and parallel of two equal resistors halves them (property)', () => {
    fc.assert(
      fc.property(network(1), network(1), positiveRational(), (a, b, r) => {
        const za = networkImpedance(a);
        const zb = networkImpedance(b);
        expect(seriesImpedance(za, zb).equals(seriesImpedance(zb, za))).toBe(true);
        expect(parallelImpedance(za, zb).equals(parallelImpedance(zb, za))).toBe(true);
        expect(parallelImpedance(resistorImpedance(r), resistorImpedance(r)).equals(resistorImpedance(r.div(2)))).toBe(true);
      }),
      { numRuns: 60 },
    );
  });
});

describe('impedances: bad input', () => {
  const makers: [string, (v: never) => RationalFunction, string][] = [
    ['resistorImpedance', resistorImpedance as (v: never) => RationalFunction, 'ohms'],
    ['capacitorImpedance', capacitorImpedance as (v: never) => RationalFunction, 'farads'],
    ['inductorImpedance', inductorImpedance as (v: never) => RationalFunction, 'henries'],
    ['fdnrImpedance', fdnrImpedance as (v: never) => RationalFunction, 'd'],
    ['fdncImpedance', fdncImpedance as (v: never) => RationalFunction, 'e'],
  ];
  it.each(makers)('%s rejects NaN, Infinity, zero, negatives and garbage', (_name, make, path) => {
    expectInvalid(() => make(NaN as never), 'INVALID_NUMBER', path);
    expectInvalid(() => make(Infinity as never), 'INVALID_NUMBER', path);
    expectInvalid(() => make(0 as never), 'OUT_OF_RANGE', path);
    expectInvalid(() => make(-1 as never), 'OUT_OF_RANGE', path);
    expectInvalid(() => make('-1k' as never), 'OUT_OF_RANGE', path);
    expectInvalid(() => make('0' as never), 'OUT_OF_RANGE', path);
    expectInvalid(() => make('-1/3' as never), 'OUT_OF_RANGE', path);
    expectInvalid(() => make('abc' as never), 'INVALID_QUANTITY', path);
    expectInvalid(() => make(null as never), 'INVALID_NUMBER', path);
  });

  it('a quantity string with the wrong unit is INVALID_QUANTITY', () => {
    expectInvalid(() => capacitorImpedance('10 mH'), 'INVALID_QUANTITY', 'farads');
    expectInvalid(() => inductorImpedance('10 nF'), 'INVALID_QUANTITY', 'henries');
    expectInvalid(() => resistorImpedance('1 uF'), 'INVALID_QUANTITY', 'ohms');
  });

  it('elementImpedance names the element path and rejects unknown kinds', () => {
    expectInvalid(() => elementImpedance('X' as ElementKind, 1, 'parts.r1'), 'INVALID_ARGUMENT', 'parts.r1.kind');
    expectInvalid(() => elementImpedance('R', -1, 'parts.r1'), 'OUT_OF_RANGE', 'parts.r1.value');
    expectInvalid(() => elementImpedance('C', NaN, 'parts.c1'), 'INVALID_NUMBER', 'parts.c1.value');
  });

  it('series and parallel need at least one RationalFunction', () => {
    expectInvalid(() => seriesImpedance(), 'INVALID_ARGUMENT', 'seriesImpedance');
    expectInvalid(() => parallelImpedance(), 'INVALID_ARGUMENT', 'parallelImpedance');
    expectInvalid(() => seriesImpedance(resistorImpedance(1), 5 as unknown as RationalFunction), 'INVALID_ARGUMENT', 'seriesImpedance[1]');
    expectInvalid(() => parallelImpedance({} as RationalFunction), 'INVALID_ARGUMENT', 'parallelImpedance[0]');
  });

  it('parallel of admittances that cancel is an ArithmeticError', () => {
    expect(() => parallelImpedance(resistorImpedance(1), RationalFunction.constant(-1))).toThrow(ArithmeticError);
  });

  it('toPositiveValue rejects non-numeric types', () => {
    expectInvalid(() => toPositiveValue({} as never, 'v'), 'INVALID_NUMBER', 'v');
    expectInvalid(() => toPositiveValue('1/0', 'v'), 'DIVISION_BY_ZERO', 'v');
  });
});
