import { describe, expect, it } from 'vitest';
import { lowpassPrototype } from '../../src/approximation/index';
import { synthesizeLadder } from '../../src/ladder/darlington';
import { ladderPrototype, designLadderPrototype } from '../../src/ladder/ladder-prototype';
import { InvalidInputError, UnrealizableError } from '../../src/errors';
import { normalizedMagnitude } from '../../src/ladder/peak-gain';
import { responseError } from './helpers';

function thrown(f: () => unknown): { error: unknown } {
  try {
    f();
  } catch (error) {
    return { error };
  }
  return { error: undefined };
}

describe('refusals', () => {
  it('refuses equal terminations for even-order Chebyshev, naming loadOhms', () => {
    const { error } = thrown(() => ladderPrototype({ family: 'chebyshev', order: 4, passbandRippleDb: 0.5, loadOhms: 1 }));
    expect(error).toBeInstanceOf(UnrealizableError);
    expect((error as UnrealizableError).path).toBe('loadOhms');
  });
  it('refuses a load on the wrong side of the source for the form (even order, series-first needs RL > Rs)', () => {
    const { error } = thrown(() => ladderPrototype({ family: 'butterworth', order: 2, loadOhms: 0.5, form: 'series-first' }));
    expect(error).toBeInstanceOf(UnrealizableError);
    expect((error as UnrealizableError).path).toBe('loadOhms');
  });
  it('refuses an explicit tank order that gives a negative element, naming tankOrder', () => {
    // Inverse Chebyshev order 7 at 40 dB has no positive minimum-inductor ladder in any order.
    const { error } = thrown(() => ladderPrototype({ family: 'inverse-chebyshev', order: 7, stopbandAttenuationDb: 40, tankOrder: [2, 0, 1] }));
    expect(error).toBeInstanceOf(UnrealizableError);
    expect((error as UnrealizableError).path).toBe('tankOrder');
    expect((error as UnrealizableError).code).toBe('UNREALIZABLE');
  });
  it('refuses the other form of a singly terminated ladder', () => {
    const { error } = thrown(() => ladderPrototype({ family: 'butterworth', order: 3, loadOhms: 'open', form: 'series-first' }));
    expect(error).toBeInstanceOf(UnrealizableError);
    expect((error as UnrealizableError).path).toBe('form');
  });
  it("refuses a nonzero gain at infinity with evenOrder 'none'", () => {
    const { error } = thrown(() => ladderPrototype({ family: 'elliptic', order: 4, passbandRippleDb: 0.5, stopbandAttenuationDb: 40, evenOrder: 'none' }));
    expect(error).toBeInstanceOf(UnrealizableError);
    expect((error as UnrealizableError).path).toBe('evenOrder');
  });
  it.each([
    [{ sourceOhms: -1 }, 'sourceOhms', 'OUT_OF_RANGE'],
    [{ loadOhms: 0 }, 'loadOhms', 'OUT_OF_RANGE'],
    [{ sourceOhms: 0, loadOhms: 'open' as const }, 'loadOhms', 'INVALID_ARGUMENT'],
    [{ form: 'middle-first' as never }, 'form', 'INVALID_ARGUMENT'],
    [{ reflectionZeros: 'random' as never }, 'reflectionZeros', 'INVALID_ARGUMENT'],
    [{ tankOrder: [0, 0] }, 'tankOrder', 'INVALID_ARGUMENT'],
  ])('validates options %j', (options, path, code) => {
    const p = lowpassPrototype({ family: 'elliptic', order: 5, passbandRippleDb: 0.5, stopbandAttenuationDb: 40 });
    const { error } = thrown(() => synthesizeLadder(p, options));
    expect(error).toBeInstanceOf(InvalidInputError);
    expect((error as InvalidInputError).path).toBe(path);
    expect((error as InvalidInputError).code).toBe(code);
  });
  it('refuses right-half-plane poles and off-axis zeros', () => {
    expect(thrown(() => synthesizeLadder({ zeros: [], poles: [{ re: 1, im: 0 }], gain: 1 })).error).toBeInstanceOf(UnrealizableError);
    const offAxis = { zeros: [{ re: -0.1, im: 2 }, { re: -0.1, im: -2 }], poles: [{ re: -1, im: 0 }, { re: -1, im: 1 }, { re: -1, im: -1 }], gain: 1 };
    expect(thrown(() => synthesizeLadder(offAxis)).error).toBeInstanceOf(UnrealizableError);
  });
});

describe('even-order elliptic: the modified responses', () => {
  const params = { family: 'elliptic' as const, order: 6, passbandRippleDb: 0.5, stopbandAttenuationDb: 50 };
  it('with equal terminations moves the highest zero to infinity and the lowest reflection zero to DC', () => {
    const s = designLadderPrototype(params);
    const codes = s.diagnostics.map((d) => d.code);
    expect(codes).toContain('EVEN_ORDER_ZERO_MOVED');
    expect(codes).toContain('EVEN_ORDER_REFLECTION_ZERO_MOVED');
    expect(s.ladder.loadOhms).toBe(1);
    expect(s.realizedPrototype.zeros.length).toBe(4);
    // The map keeps the band edge: |H'(j1)| = |H(j1)| (the ripple edge); common practice, no source.
    // normalizedMagnitude is |H(jw)|/|H(0)|; the old H(0) is 10^(-0.5/20) (scipy ellipap convention),
    // the new H'(0) is the passband peak 1.
    const before = normalizedMagnitude(s.prototype, { re: 0, im: 1 }) * 10 ** (-0.5 / 20);
    const after = normalizedMagnitude(s.realizedPrototype, { re: 0, im: 1 });
    expect(Math.abs(after - before)).toBeLessThan(1e-9);
    expect(responseError(s)).toBeLessThan(1e-9);
  });
  it("with 'move-zero' keeps the DC gain and computes the load", () => {
    const s = designLadderPrototype({ ...params, evenOrder: 'move-zero' });
    const codes = s.diagnostics.map((d) => d.code);
    expect(codes).toContain('EVEN_ORDER_ZERO_MOVED');
    expect(codes).not.toContain('EVEN_ORDER_REFLECTION_ZERO_MOVED');
    expect(codes).toContain('LOAD_COMPUTED');
    expect(responseError(s)).toBeLessThan(1e-9);
  });
  it('even-order inverse Chebyshev only needs the zero moved', () => {
    const s = designLadderPrototype({ family: 'inverse-chebyshev', order: 6, stopbandAttenuationDb: 60 });
    expect(s.diagnostics.map((d) => d.code)).toContain('EVEN_ORDER_ZERO_MOVED');
    expect(s.ladder.loadOhms).toBe(1);
    expect(responseError(s)).toBeLessThan(1e-9);
  });
});

describe('Bessel ladders', () => {
  it('order 2 (delay-normalised) has the elements 1.5774 and 0.4226, Zverev 1967 table (from memory)', () => {
    const s = synthesizeLadder(lowpassPrototype({ family: 'bessel', order: 2 }));
    const values = s.ladder.branches.map((b) => (b.inductanceH ?? b.capacitanceF) as number);
    expect(values[0]).toBeCloseTo(1.5774, 4);
    expect(values[1]).toBeCloseTo(0.4226, 4);
  });
  it('minimum- and maximum-phase reflection zeros give different ladders with the same response', () => {
    const p = lowpassPrototype({ family: 'bessel', order: 5 });
    const a = synthesizeLadder(p, { reflectionZeros: 'minimum-phase' });
    const b = synthesizeLadder(p, { reflectionZeros: 'maximum-phase' });
    expect(a.ladder.branches[0].inductanceH).not.toBeCloseTo(b.ladder.branches[0].inductanceH as number, 3);
    expect(responseError(a)).toBeLessThan(1e-9);
    expect(responseError(b)).toBeLessThan(1e-9);
  });
});
