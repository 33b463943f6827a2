import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { gicImpedance, idealGicImpedance, validateGicImpedances, validateGicInputs } from '../../src/converter/gic';
import { gicImpedanceNonideal, type GicImpedances, type GicInputs } from '../../src/converter/gic-nonideal';
import { isIdealOpamp, validateOpampModel, type OpampModel } from '../../src/converter/opamp-model';
import { capacitorImpedance, inductorImpedance, resistorImpedance } from '../../src/converter/impedances';
import { RationalFunction } from '../../src/algebra/rational-function';
import { Fraction } from '../../src/algebra/rational';
import { ArithmeticError, InvalidInputError } from '../../src/errors';
import { evaluateNetwork, network, networkImpedance, positiveRational, type Network } from './arbitraries';
import { expectInvalid } from '../helpers/expect-error';

const five = fc.tuple(network(2), network(2), network(2), network(2), network(2));
const asZ = (ns: Network[]): GicImpedances => ({
  z1: networkImpedance(ns[0]),
  z2: networkImpedance(ns[1]),
  z3: networkImpedance(ns[2]),
  z4: networkImpedance(ns[3]),
  z5: networkImpedance(ns[4]),
});

describe('gicImpedance: the ideal identity Zin = Z1 Z3 Z5 / (Z2 Z4) (Antoniou 1969)', () => {
  it('agrees with the element laws evaluated directly at random rational points (property)', () => {
    fc.assert(
      fc.property(five, positiveRational(9, 5), positiveRational(9, 5), (ns, x1, x2) => {
        const zin = gicImpedance(asZ(ns));
        for (const x of [x1, x2]) {
          const v = ns.map((n) => evaluateNetwork(n, x));
          const expected = v[0].mul(v[2]).mul(v[4]).div(v[1].mul(v[3]));
          // Poly.evaluate of the reduced Zin is a path independent of the direct element arithmetic.
          expect(zin.evaluate(x).equals(expected)).toBe(true);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('Zin * Z2 * Z4 equals Z1 * Z3 * Z5 exactly (property)', () => {
    fc.assert(
      fc.property(five, (ns) => {
        const z = asZ(ns);
        expect(gicImpedance(z).mul(z.z2).mul(z.z4).equals(z.z1.mul(z.z3).mul(z.z5))).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it('equals the exact nodal analysis of the netlist with ideal op-amps, for every valid input pairing', () => {
    // The circuit engine's exact MNA (src/analysis via gic-nonideal) is an independent oracle.
    const z: GicImpedances = {
      z1: resistorImpedance(3),
      z2: resistorImpedance(5),
      z3: capacitorImpedance('1/7'),
      z4: inductorImpedance(11),
      z5: resistorImpedance(13),
    };
    const pairs = [
      { plus: 5, minus: 3 },
      { plus: 3, minus: 5 },
      { plus: 1, minus: 3 },
      { plus: 3, minus: 1 },
      { plus: 1, minus: 5 },
      { plus: 5, minus: 1 },
    ] as const;
    let checked = 0;
    for (const a of pairs) {
      for (const b of pairs) {
        if (new Set([a.plus, a.minus, b.plus, b.minus]).size < 3) continue; // same pair: singular
        const inputs: GicInputs = { a, b };
        const mine = gicImpedance(z, { inputs });
        expect(mine.equals(gicImpedanceNonideal(z, { opamps: { model: 'ideal' }, inputs }))).toBe(true);
        checked++;
      }
    }
    expect(checked).toBe(24);
  });

  it('the simulated inductor with C in position 4 is sL with L = C4 R1 R3 R5 / R2', () => {
    const r = resistorImpedance(1000);
    const zin = gicImpedance({ z1: r, z2: r, z3: r, z4: capacitorImpedance('10n'), z5: r });
    expect(zin.equals(inductorImpedance('0.01'))).toBe(true);
    expect(zin.toString()).toBe('1/100*s');
  });

  it('idealGicImpedance equals gicImpedance with explicit ideal models (single and pair)', () => {
    const z = asZ(fc.sample(five, { numRuns: 1, seed: 7 })[0]);
    const ideal: OpampModel = { model: 'ideal' };
    expect(gicImpedance(z, { opamps: ideal }).equals(idealGicImpedance(z))).toBe(true);
    expect(gicImpedance(z, { opamps: [ideal, ideal] }).equals(idealGicImpedance(z))).toBe(true);
  });

  it('with finite-gain op-amps delegates to the exact nodal analysis and differs from the ideal identity', () => {
    const r = resistorImpedance(1000);
    const z: GicImpedances = { z1: r, z2: r, z3: r, z4: capacitorImpedance('10n'), z5: r };
    const opamps: OpampModel = { model: 'finite-gain', gain: 1e5 };
    const real = gicImpedance(z, { opamps });
    expect(real.equals(gicImpedanceNonideal(z, { opamps }))).toBe(true);
    expect(real.equals(idealGicImpedance(z))).toBe(false);
  });
});

describe('gicImpedance: bad input', () => {
  const r = resistorImpedance(1);
  const good: GicImpedances = { z1: r, z2: r, z3: r, z4: r, z5: r };

  it('names a missing or non-RationalFunction impedance', () => {
    expectInvalid(() => gicImpedance(null as unknown as GicImpedances), 'INVALID_ARGUMENT', 'z');
    expectInvalid(() => gicImpedance({ ...good, z3: undefined } as unknown as GicImpedances), 'INVALID_ARGUMENT', 'z.z3');
    expectInvalid(() => gicImpedance({ ...good, z5: 1000 } as unknown as GicImpedances), 'INVALID_ARGUMENT', 'z.z5');
    expectInvalid(() => validateGicImpedances('x', 'p'), 'INVALID_ARGUMENT', 'p');
  });

  it('Z2 or Z4 zero is a DIVISION_BY_ZERO ArithmeticError', () => {
    for (const key of ['z2', 'z4'] as const) {
      try {
        gicImpedance({ ...good, [key]: RationalFunction.ZERO });
        throw new Error('expected a throw');
      } catch (e) {
        expect(e).toBeInstanceOf(ArithmeticError);
        expect((e as ArithmeticError).code).toBe('DIVISION_BY_ZERO');
        expect((e as ArithmeticError).path).toBe(`z.${key}`);
      }
    }
  });

  it('rejects bad op-amp models with the field path', () => {
    expectInvalid(() => gicImpedance(good, { opamps: { model: 'perfect' } as unknown as OpampModel }), 'INVALID_ARGUMENT', 'options.opamps.model');
    expectInvalid(() => gicImpedance(good, { opamps: { model: 'integrator', gainBandwidthHz: NaN } }), 'INVALID_NUMBER', 'options.opamps.gainBandwidthHz');
    expectInvalid(() => gicImpedance(good, { opamps: { model: 'integrator', gainBandwidthHz: -1 } }), 'OUT_OF_RANGE', 'options.opamps.gainBandwidthHz');
    expectInvalid(
      () => gicImpedance(good, { opamps: [{ model: 'ideal' }, { model: 'single-pole', gainBandwidthHz: Infinity, openLoopGainDb: 100 }] }),
      'INVALID_NUMBER',
      'options.opamps[1].gainBandwidthHz',
    );
    expectInvalid(() => gicImpedance(good, { opamps: [{ model: 'ideal' }] as unknown as OpampModel }), 'INVALID_ARGUMENT', 'options.opamps');
    expectInvalid(() => gicImpedance(good, null as unknown as object), 'INVALID_ARGUMENT', 'options');
  });

  it('rejects bad inputs: wrong node, plus = minus, both op-amps on one pair', () => {
    const bad = (inputs: unknown) => () => gicImpedance(good, { inputs: inputs as GicInputs });
    expectInvalid(bad({ a: { plus: 2, minus: 3 }, b: { plus: 1, minus: 3 } }), 'INVALID_ARGUMENT', 'options.inputs.a.plus');
    expectInvalid(bad({ a: { plus: 5, minus: 3 }, b: { plus: 1, minus: 1 } }), 'INVALID_ARGUMENT', 'options.inputs.b');
    expectInvalid(bad({ a: { plus: 5, minus: 3 }, b: { plus: 3, minus: 5 } }), 'INVALID_ARGUMENT', 'options.inputs');
    expectInvalid(bad({ a: { plus: 5, minus: 3 } }), 'INVALID_ARGUMENT', 'options.inputs.b');
    expectInvalid(bad('default'), 'INVALID_ARGUMENT', 'options.inputs');
    expectInvalid(() => validateGicInputs({ a: { plus: 5, minus: 3 }, b: { plus: 5, minus: 3 } }, 'i'), 'INVALID_ARGUMENT', 'i');
    // With finite gains the same pair is left to the nodal analysis, so only the ideal check rejects it.
    expect(validateGicInputs({ a: { plus: 5, minus: 3 }, b: { plus: 5, minus: 3 } }, 'i', false).b.plus).toBe(5);
  });
});

describe('OpampModel (re-exported from the netlist)', () => {
  it('validateOpampModel accepts every DESIGN.md model and isIdealOpamp tells the nullor', () => {
    const models: OpampModel[] = [
      { model: 'ideal' },
      { model: 'finite-gain', gain: 1e5 },
      { model: 'integrator', gainBandwidthHz: 1e6 },
      { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 },
      { model: 'two-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100, secondPoleHz: 2e7 },
    ];
    for (const m of models) expect(validateOpampModel(m, 'm')).toEqual(m);
    expect(models.map(isIdealOpamp)).toEqual([true, false, false, false, false]);
  });

  it('validateOpampModel rejects non-objects, unknown models and bad numbers', () => {
    expectInvalid(() => validateOpampModel(null, 'parts.opamp'), 'INVALID_ARGUMENT', 'parts.opamp');
    expectInvalid(() => validateOpampModel({ model: 'x' }, 'parts.opamp'), 'INVALID_ARGUMENT', 'parts.opamp.model');
    expectInvalid(() => validateOpampModel({ model: 'finite-gain', gain: NaN }, 'p'), 'INVALID_NUMBER', 'p.gain');
    expectInvalid(() => validateOpampModel({ model: 'two-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100, secondPoleHz: 0 }, 'p'), 'OUT_OF_RANGE', 'p.secondPoleHz');
  });
});

describe('fraction sanity for the oracle', () => {
  it('evaluateNetwork of a single capacitor is 1/(xC)', () => {
    expect(evaluateNetwork({ type: 'leaf', kind: 'C', value: new Fraction(2) }, new Fraction(3)).equals(new Fraction(1, 6))).toBe(true);
  });
});
