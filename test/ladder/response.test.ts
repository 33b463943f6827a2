import { describe, expect, it } from 'vitest';
import { lowpassPrototype, type LowpassPrototypeParams } from '../../src/approximation/index';
import { synthesizeLadder } from '../../src/ladder/darlington';
import { designLadderPrototype } from '../../src/ladder/ladder-prototype';
import { ladderTransferFunction } from '../../src/ladder/response';
import { RationalFunction } from '../../src/algebra/rational-function';
import { responseError } from './helpers';

/**
 * Self-check (common practice, no source): the exact chain-matrix response of every synthesised ladder
 * equals T0 |H(jw)|/|H(0)| of the prototype it realises, at 200 frequencies from 0.01 to 100 rad/s.
 * Tolerance 1e-9 of the passband level to order 11 and 1e-6 above (the accuracy targets); the
 * element values are rounded to doubles, which alone moves |T| by ~1e-15.
 */
const tolerance = (n: number): number => (n <= 11 ? 1e-9 : 1e-6);

const FAMILIES: { name: string; params: (n: number) => LowpassPrototypeParams; orders: number[] }[] = [
  { name: 'butterworth', params: (n) => ({ family: 'butterworth', order: n }), orders: range(1, 15) },
  { name: 'chebyshev 0.5 dB', params: (n) => ({ family: 'chebyshev', order: n, passbandRippleDb: 0.5 }), orders: range(1, 15) },
  { name: 'bessel (delay)', params: (n) => ({ family: 'bessel', order: n }), orders: range(1, 15) },
  // Orders 11, 13 and 15 at 60 dB have no positive ladder of this structure in the tank orders searched
  // (mpmath agrees: test/fixtures/mpmath/elliptic-ladders.json); see high-order.test.ts.
  {
    name: 'inverse-chebyshev 60 dB',
    params: (n) => ({ family: 'inverse-chebyshev', order: n, stopbandAttenuationDb: 60 }),
    orders: [...range(1, 10), 12, 14],
  },
  { name: 'elliptic 0.1 dB / 50 dB', params: (n) => ({ family: 'elliptic', order: n, passbandRippleDb: 0.1, stopbandAttenuationDb: 50 }), orders: range(2, 15) },
];

function range(a: number, b: number): number[] {
  return Array.from({ length: b - a + 1 }, (_, i) => a + i);
}

describe('ladder response equals the prototype (doubly terminated, equal or computed load)', () => {
  for (const f of FAMILIES) {
    for (const n of f.orders) {
      it.each(['series-first', 'shunt-first'] as const)(`${f.name}, order ${n}, %s`, (form) => {
        // designLadderPrototype passes the approximation's reflection zeros (the route the pipeline takes).
        const s = designLadderPrototype({ ...f.params(n), form });
        expect(responseError(s)).toBeLessThan(tolerance(n));
      });
    }
  }
});

describe('unequal terminations and singly terminated ladders', () => {
  const cases: [string, LowpassPrototypeParams][] = [
    ['butterworth 5', { family: 'butterworth', order: 5 }],
    ['butterworth 6', { family: 'butterworth', order: 6 }],
    ['chebyshev 5, 1 dB', { family: 'chebyshev', order: 5, passbandRippleDb: 1 }],
    ['bessel 4', { family: 'bessel', order: 4 }],
    ['elliptic 5', { family: 'elliptic', order: 5, passbandRippleDb: 0.5, stopbandAttenuationDb: 40 }],
  ];
  for (const [name, params] of cases) {
    it.each([
      [1, 2],
      [1, 0.25],
      [50, 75],
    ])(`${name}: Rs = %d, RL = %d (series-first for RL > Rs, shunt-first below)`, (Rs, RL) => {
      const form = RL > Rs ? 'series-first' : 'shunt-first';
      const s = synthesizeLadder(lowpassPrototype(params), { sourceOhms: Rs, loadOhms: RL, form });
      expect(s.ladder.loadOhms).toBe(RL);
      expect(responseError(s)).toBeLessThan(1e-9);
    });
    it(`${name}: open load`, () => {
      const s = synthesizeLadder(lowpassPrototype(params), { sourceOhms: 1, loadOhms: 'open' });
      expect(s.ladder.loadOhms).toBe('open');
      expect(s.dcTransfer).toBe(1);
      expect(responseError(s)).toBeLessThan(1e-9);
    });
    it(`${name}: zero-ohm source`, () => {
      const s = synthesizeLadder(lowpassPrototype(params), { sourceOhms: 0, loadOhms: 1 });
      expect(s.ladder.branches[0].placement).toBe('series');
      expect(responseError(s)).toBeLessThan(1e-9);
    });
  }
});

describe('ladderTransferFunction', () => {
  it('gives 1/2 / (s + 1) for a 2 F shunt capacitor between 1 ohm terminations (hand analysis)', () => {
    const T = ladderTransferFunction({ sourceOhms: 1, loadOhms: 1, branches: [{ placement: 'shunt', capacitanceF: 2 }] });
    expect(T.equals(RationalFunction.fromCoefficients(['1/2'], [1, 1]))).toBe(true);
  });
  it('puts the transmission zero of a series tank at 1/sqrt(LC) (hand analysis)', () => {
    const T = ladderTransferFunction({
      sourceOhms: 1,
      loadOhms: 'open',
      branches: [
        { placement: 'series', inductanceH: 1, capacitanceF: 4, arrangement: 'parallel' },
        { placement: 'shunt', capacitanceF: 1 },
      ],
    });
    // Z = s/(1 + 4 s^2), Y = s, Rs = 1: T = 1/(1 + Z Y + Rs Y) = (1 + 4 s^2)/(1 + s + 5 s^2 + 4 s^3)
    expect(T.equals(RationalFunction.fromCoefficients([1, 0, 4], [1, 1, 5, 4]))).toBe(true);
  });
});
