/**
 * fast-check properties of the substitution stage: the exact-equality proof over random ladders
 * (random structures with random rational elements, and synthesised ladders of random family, order and
 * response type) under random scale factors and options. numRuns are chosen from measurement so this file
 * stays near 10 s: an exact analysis of a degree-18 circuit with 11 GICs costs up to ~0.8 s.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Fraction } from '../../src/algebra/rational';
import { fromLadder, type NetworkLadder } from '../../src/transform/index';
import type { Ladder } from '../../src/ladder/types';
import { realizeFdnr, realizeLadder, type BufferChoice, type FdnrCapacitorPositions } from '../../src/substitution/index';
import { circuitTransferFunction, expectExactRealization } from './helpers';
import { FAMILIES, MIN_ORDER, transformedLadder, type ResponseType } from './ladders';

const ratio = fc.tuple(fc.integer({ min: 1, max: 40 }), fc.integer({ min: 1, max: 12 })).map(([n, d]) => new Fraction(n, d));
/** E12 capacitors from 1 nF to 820 nF (IEC 60063 values). */
const capacitor = fc
  .tuple(fc.constantFrom('1', '1.2', '1.5', '1.8', '2.2', '2.7', '3.3', '3.9', '4.7', '5.6', '6.8', '8.2'), fc.constantFrom('n', '0n', '00n'))
  .map(([m, d]) => `${m}${d}`);
const buffers = fc.constantFrom<BufferChoice>('auto', 'none', 'input', 'output', 'both');
const level = fc.option(fc.integer({ min: 100, max: 100_000 }).map((r) => new Fraction(r)), { nil: undefined });
const scale = fc.record({
  omegaRadPerS: fc.integer({ min: 10, max: 200_000 }).map((w) => new Fraction(w)),
  bandwidthRadPerS: fc.integer({ min: 10, max: 50_000 }).map((w) => new Fraction(w)),
  ohms: fc.integer({ min: 50, max: 20_000 }).map((r) => new Fraction(r)),
});
const familyOrder = fc
  .record({ family: fc.constantFrom(...FAMILIES), order: fc.integer({ min: 1, max: 9 }) })
  .map(({ family, order }) => ({ family, order: Math.max(order, MIN_ORDER[family]) }));

describe('synthesised ladders, random family, order, scale and options', () => {
  it('fdnr (lowpass): exact without DC-path resistors, any capacitor positions and resistance level', () => {
    fc.assert(
      fc.property(familyOrder, scale, capacitor, fc.constantFrom<FdnrCapacitorPositions>('1-3', '1-5', '3-5'), level, buffers, (fo, sc, c, positions, r, b) => {
        const ladder = transformedLadder(fo.family, fo.order, 'lowpass', sc);
        expectExactRealization(realizeFdnr(ladder, { capacitorF: c, fdnrCapacitorPositions: positions, resistanceOhms: r, buffers: b, dcPathResistors: false }));
      }),
      { numRuns: 12 },
    );
  });

  it('fdnr with DC-path resistors: the reported passband error is within any stated bound and the DC gain is exact', () => {
    fc.assert(
      fc.property(familyOrder, scale, capacitor, fc.double({ min: 1e-4, max: 0.5, noNaN: true }), (fo, sc, c, bound) => {
        const ladder = transformedLadder(fo.family, fo.order, 'lowpass', sc);
        const r = realizeFdnr(ladder, { capacitorF: c, dcPathErrorDb: bound });
        expect(r.dcPath!.errorDb).toBeLessThanOrEqual(bound);
        expect(circuitTransferFunction(r).evaluate(0).equals(r.reference.transferFunction.evaluate(0))).toBe(true);
      }),
      { numRuns: 8 },
    );
  });

  it('simulated-inductor (highpass): exact with the capacitor in position 2 or 4', () => {
    fc.assert(
      fc.property(familyOrder, scale, capacitor, fc.constantFrom<2 | 4>(2, 4), level, buffers, fc.option(fc.integer({ min: 10, max: 1e5 }), { nil: undefined }), (fo, sc, c, pos, r, b, f) => {
        const ladder = transformedLadder(fo.family, fo.order, 'highpass', sc);
        expectExactRealization(
          realizeLadder(ladder, { method: 'simulated-inductor', capacitorF: c, inductorCapacitorPosition: pos, resistanceOhms: r, buffers: b, designFrequencyHz: f }),
        );
      }),
      { numRuns: 12 },
    );
  });

  it('gic-embedding: exact for every response type', () => {
    fc.assert(
      fc.property(
        familyOrder,
        fc.constantFrom<ResponseType>('lowpass', 'highpass', 'bandpass', 'bandstop'),
        scale,
        capacitor,
        fc.constantFrom<2 | 4>(2, 4),
        level,
        (fo, type, sc, c, pos, r) => {
          // Band types double the degree; keep their order to 6 here (proofs.test.ts runs 1..9).
          const order = type === 'bandpass' || type === 'bandstop' ? Math.min(fo.order, 6) : fo.order;
          const ladder = transformedLadder(fo.family, Math.max(order, MIN_ORDER[fo.family]), type, sc);
          expectExactRealization(realizeLadder(ladder, { method: 'gic-embedding', capacitorF: c, inductorCapacitorPosition: pos, resistanceOhms: r }));
        },
      ),
      { numRuns: 10 },
    );
  });
});

/** Random ladders of random structure (values rational, as the transforms' tests draw them). */
type Kind = 'L' | 'C' | 'LCs' | 'LCp';
const branchArb = (placement: 'series' | 'shunt', kinds: readonly Kind[]) =>
  fc.record({ kind: fc.constantFrom(...kinds), l: ratio, c: ratio }).map(({ kind, l, c }) => {
    const L = Number(l.valueOf());
    const C = Number(c.valueOf());
    if (kind === 'L') return { placement, inductanceH: L };
    if (kind === 'C') return { placement, capacitanceF: C };
    return { placement, inductanceH: L, capacitanceF: C, arrangement: kind === 'LCs' ? ('series' as const) : ('parallel' as const) };
  });

function ladderArb(seriesKinds: readonly Kind[], shuntKinds: readonly Kind[], allowSingle = true): fc.Arbitrary<NetworkLadder> {
  return fc
    .record({
      shuntFirst: fc.boolean(),
      n: fc.integer({ min: 1, max: 5 }),
      series: fc.array(branchArb('series', seriesKinds), { minLength: 3, maxLength: 3 }),
      shunt: fc.array(branchArb('shunt', shuntKinds), { minLength: 3, maxLength: 3 }),
      rs: allowSingle ? fc.oneof(ratio, fc.constant(new Fraction(0))) : ratio,
      rl: allowSingle ? fc.oneof(ratio, fc.constant('open' as const)) : ratio,
    })
    .filter((r) => !(r.rs.n === 0n && r.rl === 'open'))
    .map((r): NetworkLadder => {
      const branches = Array.from({ length: r.n }, (_, i) => ((i % 2 === 0) === r.shuntFirst ? r.shunt[i >> 1] : r.series[i >> 1]));
      const lad: Ladder = { sourceOhms: Number(r.rs.valueOf()), loadOhms: r.rl === 'open' ? 'open' : Number(r.rl.valueOf()), branches };
      return fromLadder(lad);
    })
    .filter((l) => l.source !== null || l.branches.some((b) => b.placement === 'series'));
}

describe('random ladder structures', () => {
  it('gic-embedding realises any LC ladder exactly (floating and grounded inductors, tanks, arms)', () => {
    fc.assert(
      fc.property(ladderArb(['L', 'C', 'LCs', 'LCp'], ['L', 'C', 'LCs', 'LCp']), capacitor, fc.integer({ min: 1, max: 1e5 }), (l, c, f) => {
        expectExactRealization(realizeLadder(l, { method: 'gic-embedding', capacitorF: c, designFrequencyHz: f }));
      }),
      { numRuns: 40 },
    );
  });

  it('simulated-inductor realises every ladder whose inductors can be grounded exactly', () => {
    fc.assert(
      fc.property(ladderArb(['C'], ['L', 'C', 'LCs', 'LCp']), capacitor, (l, c) => {
        expectExactRealization(realizeLadder(l, { method: 'simulated-inductor', capacitorF: c }));
      }),
      { numRuns: 40 },
    );
  });

  it('fdnr realises every lowpass-shaped ladder (series L, shunt C or series-L-C arms) exactly', () => {
    fc.assert(
      fc.property(ladderArb(['L'], ['C', 'LCs'], false), capacitor, (l, c) => {
        expectExactRealization(realizeFdnr(l, { capacitorF: c, dcPathResistors: false }));
      }),
      { numRuns: 30 },
    );
  });
});
