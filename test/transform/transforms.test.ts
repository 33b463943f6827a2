import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Fraction } from '../../src/algebra/rational';
import { Poly } from '../../src/algebra/poly';
import { RationalFunction } from '../../src/algebra/rational-function';
import {
  brutonTransform,
  fromLadder,
  ladderElements,
  lowpassToBandpass,
  lowpassToBandstop,
  lowpassToHighpass,
  networkLadderTransferFunction as H,
  scaleFrequency,
  scaleImpedance,
  transferFunctionMaps,
  type NetworkLadder,
} from '../../src/transform/index';
import type { Ladder } from '../../src/ladder/types';
import { GicladderError } from '../../src/errors';

const ratio = fc.tuple(fc.integer({ min: 1, max: 40 }), fc.integer({ min: 1, max: 12 })).map(([n, d]) => new Fraction(n, d));

/** Random lowpass-shaped ladders: alternating shunt and series branches, some with resonators. */
const ladderArb: fc.Arbitrary<Ladder> = fc
  .record({
    shuntFirst: fc.boolean(),
    n: fc.integer({ min: 1, max: 4 }),
    values: fc.array(fc.tuple(ratio, ratio, fc.boolean()), { minLength: 4, maxLength: 4 }),
    rs: fc.oneof(ratio, fc.constant(new Fraction(0))),
    rl: fc.oneof(ratio, fc.constant('open' as const)),
  })
  .filter((r) => !(r.rs.n === 0n && r.rl === 'open'))
  .map((r) => ({
    sourceOhms: Number(r.rs.valueOf()),
    loadOhms: r.rl === 'open' ? 'open' : Number(r.rl.valueOf()),
    branches: r.values.slice(0, r.n).map(([a, b, resonator], i) => {
      const shunt = (i % 2 === 0) === r.shuntFirst;
      const base = shunt ? { placement: 'shunt' as const, capacitanceF: Number(a.valueOf()) } : { placement: 'series' as const, inductanceH: Number(a.valueOf()) };
      if (!resonator) return base;
      return shunt
        ? { ...base, inductanceH: Number(b.valueOf()), arrangement: 'series' as const }
        : { ...base, capacitanceF: Number(b.valueOf()), arrangement: 'parallel' as const };
    }),
  }));

describe('network ladder transfer function', () => {
  it('an RC section: Rs = 1, shunt C = 1, open load gives 1/(s + 1) (by hand)', () => {
    const l = fromLadder({ sourceOhms: 1, loadOhms: 'open', branches: [{ placement: 'shunt', capacitanceF: 1 }] });
    expect(H(l).equals(RationalFunction.fromPolys(Poly.ONE, Poly.fromDescending([1, 1])))).toBe(true);
  });

  it('the 3rd-order Butterworth ladder 1, 2, 1 between 1-ohm terminations gives 1/(2 (s^3 + 2s^2 + 2s + 1)) (classical g-values, e.g. Matthaei, Young and Jones 1964, table 4.05-1, from memory)', () => {
    const l = fromLadder({
      sourceOhms: 1,
      loadOhms: 1,
      branches: [
        { placement: 'shunt', capacitanceF: 1 },
        { placement: 'series', inductanceH: 2 },
        { placement: 'shunt', capacitanceF: 1 },
      ],
    });
    expect(H(l).equals(RationalFunction.fromPolys(Poly.constant('1/2'), Poly.fromDescending([1, 2, 2, 1])))).toBe(true);
  });
});

describe('exact transforms preserve or map the transfer function exactly', () => {
  const k = ratio;
  it('frequency scaling s -> s/wc', () => {
    fc.assert(fc.property(ladderArb, k, (lad, wc) => {
      const l = fromLadder(lad);
      expect(H(scaleFrequency(l, wc)).equals(transferFunctionMaps.lowpass(H(l), wc))).toBe(true);
    }), { numRuns: 60 });
  });

  it('impedance scaling leaves H unchanged', () => {
    fc.assert(fc.property(ladderArb, k, (lad, r0) => {
      const l = fromLadder(lad);
      expect(H(scaleImpedance(l, r0)).equals(H(l))).toBe(true);
    }), { numRuns: 60 });
  });

  it('lowpass to highpass is H(wc/s)', () => {
    fc.assert(fc.property(ladderArb, k, (lad, wc) => {
      const l = fromLadder(lad);
      expect(H(lowpassToHighpass(l, wc)).equals(transferFunctionMaps.highpass(H(l), wc))).toBe(true);
    }), { numRuns: 60 });
  });

  it('lowpass to bandpass is H((s^2 + w0^2)/(B s))', () => {
    fc.assert(fc.property(ladderArb, k, k, (lad, w2, bw) => {
      const l = fromLadder(lad);
      expect(H(lowpassToBandpass(l, w2, bw)).equals(transferFunctionMaps.bandpass(H(l), w2, bw))).toBe(true);
    }), { numRuns: 40 });
  });

  it('lowpass to bandstop is H(B s/(s^2 + w0^2))', () => {
    fc.assert(fc.property(ladderArb, k, k, (lad, w2, bw) => {
      const l = fromLadder(lad);
      expect(H(lowpassToBandstop(l, w2, bw)).equals(transferFunctionMaps.bandstop(H(l), w2, bw))).toBe(true);
    }), { numRuns: 40 });
  });

  it('the Bruton transform leaves H unchanged and maps R -> C, L -> R, C -> D', () => {
    fc.assert(fc.property(ladderArb, k, (lad, kk) => {
      const l = fromLadder(lad);
      const b = brutonTransform(l, kk);
      expect(H(b).equals(H(l))).toBe(true);
      const before = ladderElements(l).map((e) => e.kind).join('');
      const after = ladderElements(b).map((e) => e.kind).join('');
      expect(after).toBe(before.replace(/R/g, 'c').replace(/L/g, 'R').replace(/C/g, 'D').replace(/c/g, 'C'));
    }), { numRuns: 60 });
  });
});

describe('transform input checks', () => {
  const l: NetworkLadder = fromLadder({ sourceOhms: 1, loadOhms: 1, branches: [{ placement: 'shunt', capacitanceF: 1 }] });
  it('rejects zero, negative and non-finite scale factors with a typed error naming the parameter', () => {
    for (const bad of [0, -1, NaN, Infinity]) {
      for (const f of [() => scaleFrequency(l, bad), () => scaleImpedance(l, bad), () => lowpassToHighpass(l, bad), () => brutonTransform(l, bad), () => lowpassToBandpass(l, bad, 1)]) {
        let err: unknown;
        try { f(); } catch (e) { err = e; }
        expect(err).toBeInstanceOf(GicladderError);
        expect(['OUT_OF_RANGE', 'INVALID_NUMBER']).toContain((err as GicladderError).code);
      }
    }
  });
  it('refuses to transform an FDNR again (no element has impedance k/(s^3 D))', () => {
    const b = brutonTransform(l);
    expect(() => brutonTransform(b)).toThrow(GicladderError);
    expect(() => lowpassToHighpass(b, 1)).toThrow(GicladderError);
  });
  it('rejects a branch with no part and non-positive element values, naming the field', () => {
    expect(() => fromLadder({ sourceOhms: 1, loadOhms: 1, branches: [{ placement: 'shunt' }] })).toThrow(/branches\[0\]/);
    try { fromLadder({ sourceOhms: 1, loadOhms: 1, branches: [{ placement: 'shunt', capacitanceF: -1 }] }); } catch (e) {
      expect((e as GicladderError).path).toBe('ladder.branches[0].capacitanceF');
    }
  });
});
