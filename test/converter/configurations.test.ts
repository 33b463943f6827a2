import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  GIC_CONFIGURATIONS,
  GIC_CONFIGURATION_NAMES,
  designCapacitanceScalerC1,
  designCapacitanceScalerC3,
  designCapacitanceScalerC5,
  designFdncC2C4,
  designFdnrC1C3,
  designFdnrC1C5,
  designFdnrC3C5,
  designGic,
  designInductorC2,
  designInductorC4,
  designResistanceScaler,
  gicElementOfParts,
  gicPartsImpedances,
  gicTargetImpedance,
  type GicConfiguration,
  type GicDesignChoices,
  type GicParts,
  type GicPositionNumber,
} from '../../src/converter/configurations';
import { gicImpedance } from '../../src/converter/gic';
import { Fraction, toFraction } from '../../src/algebra/rational';
import { InvalidInputError } from '../../src/errors';
import { positiveRational } from './arbitraries';
import { expectInvalid } from '../helpers/expect-error';

const F = (x: string | number) => toFraction(x);
const part = (kind: 'R' | 'C', v: string | number) => ({ kind, value: toFraction(v) });

describe('configurations: each formula, by hand-chosen parts (values derived by hand from Zin = Z1 Z3 Z5 / (Z2 Z4))', () => {
  // Parts 1..5 = 2, 3, 5, 7, 11 (ohms or farads by kind) so that every product is distinct.
  const values = [2, 3, 5, 7, 11];
  const build = (caps: number[]): GicParts =>
    Object.fromEntries(values.map((v, i) => [`z${i + 1}`, part(caps.includes(i + 1) ? 'C' : 'R', v)])) as unknown as GicParts;
  const cases: [GicConfiguration, string, Fraction][] = [
    ['inductor-c2', 'L = C2 R1 R3 R5 / R4', F(3 * 2 * 5 * 11).div(7)],
    ['inductor-c4', 'L = C4 R1 R3 R5 / R2', F(7 * 2 * 5 * 11).div(3)],
    ['fdnr-c1c3', 'D = C1 C3 R2 R4 / R5', F(2 * 5 * 3 * 7).div(11)],
    ['fdnr-c1c5', 'D = C1 C5 R2 R4 / R3', F(2 * 11 * 3 * 7).div(5)],
    ['fdnr-c3c5', 'D = C3 C5 R2 R4 / R1', F(5 * 11 * 3 * 7).div(2)],
    ['capacitance-scaler-c1', 'C = C1 R2 R4 / (R3 R5)', F(2 * 3 * 7).div(5 * 11)],
    ['capacitance-scaler-c3', 'C = C3 R2 R4 / (R1 R5)', F(5 * 3 * 7).div(2 * 11)],
    ['capacitance-scaler-c5', 'C = C5 R2 R4 / (R1 R3)', F(11 * 3 * 7).div(2 * 5)],
    ['resistance-scaler', 'R = R1 R3 R5 / (R2 R4)', F(2 * 5 * 11).div(3 * 7)],
    ['fdnc-c2c4', 'E = C2 C4 R1 R3 R5', F(3 * 7 * 2 * 5 * 11)],
  ];
  it.each(cases)('%s: %s', (name, _formula, expected) => {
    const cfg = GIC_CONFIGURATIONS[name];
    const parts = build([...cfg.capacitors]);
    const el = gicElementOfParts(parts);
    expect(el.kind).toBe(cfg.element);
    expect(el.value.equals(expected)).toBe(true);
    // And the identity presents exactly that element.
    expect(gicImpedance(gicPartsImpedances(parts)).equals(gicTargetImpedance({ element: cfg.element, target: expected }))).toBe(true);
  });

  it('reports no element for three odd-position capacitors (Zin ~ 1/s^3)', () => {
    const el = gicElementOfParts(build([1, 3, 5]));
    expect(el.kind).toBeUndefined();
    expect(el.powerOfS).toBe(-3);
  });
});

describe('inverse design round-trips exactly', () => {
  it('designGic: gicImpedance of the parts equals the target element impedance, for every configuration (property)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...GIC_CONFIGURATION_NAMES),
        positiveRational(1000, 999),
        positiveRational(),
        positiveRational(),
        (name, target, c, r) => {
          const d = designGic(name, target, { capacitorF: c, resistanceOhms: r });
          const zin = gicImpedance(gicPartsImpedances(d.parts));
          expect(zin.equals(gicTargetImpedance(d))).toBe(true);
          expect(d.target.equals(target)).toBe(true);
          // Default: every resistor equal to R except the solved one, every capacitor equal to C.
          const cfg = GIC_CONFIGURATIONS[name];
          expect(d.setBy).toBe(cfg.defaultSetBy);
          for (const [key, p] of Object.entries(d.parts)) {
            expect(p.value.s > 0n && p.value.n > 0n).toBe(true);
            if (key === `z${d.setBy}`) continue;
            expect(p.value.equals(p.kind === 'R' ? r : c)).toBe(true);
          }
        },
      ),
      { numRuns: 200 },
    );
  });

  it('with any solved position and random overrides (property)', () => {
    const positions = ['z1', 'z2', 'z3', 'z4', 'z5'] as const;
    fc.assert(
      fc.property(
        fc.constantFrom(...GIC_CONFIGURATION_NAMES),
        positiveRational(1000, 999),
        fc.constantFrom<GicPositionNumber>(1, 2, 3, 4, 5),
        fc.array(fc.tuple(fc.constantFrom(...positions), positiveRational()), { maxLength: 4 }),
        (name, target, setBy, overrides) => {
          const values = Object.fromEntries(overrides.filter(([k]) => k !== `z${setBy}`));
          const d = designGic(name, target, { capacitorF: '4.7n', resistanceOhms: '10k', setBy, values });
          expect(gicImpedance(gicPartsImpedances(d.parts)).equals(gicTargetImpedance(d))).toBe(true);
          for (const [k, v] of Object.entries(values)) expect(d.parts[k as (typeof positions)[number]].value.equals(v as Fraction)).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('per-configuration functions equal designGic', () => {
    const choices: GicDesignChoices = { capacitorF: '10n', resistanceOhms: '4k7' };
    const fns: [GicConfiguration, (t: string, c: GicDesignChoices) => ReturnType<typeof designGic>][] = [
      ['inductor-c2', designInductorC2],
      ['inductor-c4', designInductorC4],
      ['fdnr-c1c3', designFdnrC1C3],
      ['fdnr-c1c5', designFdnrC1C5],
      ['fdnr-c3c5', designFdnrC3C5],
      ['capacitance-scaler-c1', designCapacitanceScalerC1],
      ['capacitance-scaler-c3', designCapacitanceScalerC3],
      ['capacitance-scaler-c5', designCapacitanceScalerC5],
      ['resistance-scaler', designResistanceScaler],
      ['fdnc-c2c4', designFdncC2C4],
    ];
    for (const [name, fn] of fns) expect(fn('1/3', choices)).toEqual(designGic(name, '1/3', choices));
    expect(fns.length).toBe(GIC_CONFIGURATION_NAMES.length);
  });

  it('a worked FDNR: D = 1e-9 F*s with C = 10 nF, R = 10 kohm gives R5 = 10 ohm (D = C^2 R^2 / R5)', () => {
    const d = designFdnrC1C3('1e-9', { capacitorF: '10n', resistanceOhms: '10k' });
    expect(d.setBy).toBe(5);
    expect(d.parts.z5).toEqual({ kind: 'R', value: F(10) });
    expect(d.parts.z1.kind).toBe('C');
    expect(d.parts.z3.value.equals(F('1e-8'))).toBe(true);
  });

  it('a worked inductor: L = 10 mH with C4 = 10 nF, R = 1 kohm, solved R5 = 1 kohm', () => {
    const d = designInductorC4('10 mH', { capacitorF: '10 nF', resistanceOhms: '1k' });
    expect(d.parts.z5.value.equals(F(1000))).toBe(true);
  });

  it('solving a capacitor position gives its capacitance', () => {
    // inductor-c2 solved at the capacitor: C2 = L R4 / (R1 R3 R5) = 1 * 1 / 1 = 1 with all R = 1.
    const d = designInductorC2(1, { capacitorF: 5, resistanceOhms: 1, setBy: 2 });
    expect(d.parts.z2).toEqual({ kind: 'C', value: F(1) });
  });
});

describe('inverse design: bad input', () => {
  const ok: GicDesignChoices = { capacitorF: '10n', resistanceOhms: '10k' };
  it('target NaN, Infinity, zero, negative, garbage', () => {
    expectInvalid(() => designGic('inductor-c4', NaN, ok), 'INVALID_NUMBER', 'target');
    expectInvalid(() => designGic('inductor-c4', Infinity, ok), 'INVALID_NUMBER', 'target');
    expectInvalid(() => designGic('inductor-c4', 0, ok), 'OUT_OF_RANGE', 'target');
    expectInvalid(() => designGic('inductor-c4', -1, ok), 'OUT_OF_RANGE', 'target');
    expectInvalid(() => designGic('inductor-c4', '10nF', ok), 'INVALID_QUANTITY', 'target');
    expectInvalid(() => designGic('fdnr-c1c3', 'abc', ok), 'INVALID_QUANTITY', 'target');
  });

  it('unknown configuration', () => {
    expectInvalid(() => designGic('gyrator' as GicConfiguration, 1, ok), 'INVALID_ARGUMENT', 'configuration');
  });

  it('choices: missing or bad values', () => {
    expectInvalid(() => designGic('inductor-c4', 1, null as unknown as GicDesignChoices), 'INVALID_ARGUMENT', 'choices');
    expectInvalid(() => designGic('inductor-c4', 1, { resistanceOhms: '1k' }), 'INVALID_NUMBER', 'choices.capacitorF');
    expectInvalid(() => designGic('inductor-c4', 1, { capacitorF: 0, resistanceOhms: '1k' }), 'OUT_OF_RANGE', 'choices.capacitorF');
    expectInvalid(() => designGic('inductor-c4', 1, { capacitorF: '1n', resistanceOhms: NaN }), 'INVALID_NUMBER', 'choices.resistanceOhms');
    expectInvalid(() => designGic('inductor-c4', 1, { capacitorF: '1n', resistanceOhms: -5 }), 'OUT_OF_RANGE', 'choices.resistanceOhms');
    expectInvalid(() => designGic('inductor-c4', 1, { ...ok, setBy: 6 as GicPositionNumber }), 'INVALID_ARGUMENT', 'choices.setBy');
    expectInvalid(() => designGic('inductor-c4', 1, { ...ok, values: { z5: 1 } }), 'INVALID_ARGUMENT', 'choices.values.z5');
    expectInvalid(() => designGic('inductor-c4', 1, { ...ok, values: { z6: 1 } as never }), 'INVALID_ARGUMENT', 'choices.values.z6');
    expectInvalid(() => designGic('inductor-c4', 1, { ...ok, values: { z1: -1 } }), 'OUT_OF_RANGE', 'choices.values.z1');
    expectInvalid(() => designGic('inductor-c4', 1, { ...ok, values: { z4: '1 mH' } }), 'INVALID_QUANTITY', 'choices.values.z4');
    // The resistance scaler needs no capacitor.
    expect(designResistanceScaler(2, { resistanceOhms: 1 }).parts.z5.value.equals(F(2))).toBe(true);
  });

  it('parts given to gicElementOfParts / gicPartsImpedances are validated', () => {
    expectInvalid(() => gicElementOfParts(null as unknown as GicParts), 'INVALID_ARGUMENT', 'parts');
    const good = designInductorC4(1, ok).parts;
    expectInvalid(() => gicPartsImpedances({ ...good, z3: { kind: 'L', value: F(1) } } as unknown as GicParts), 'INVALID_ARGUMENT', 'parts.z3');
    expectInvalid(() => gicPartsImpedances({ ...good, z2: { kind: 'R', value: F(0) } }), 'OUT_OF_RANGE', 'parts.z2.value');
    expectInvalid(() => gicElementOfParts({ ...good, z1: { kind: 'R', value: NaN as unknown as Fraction } }), 'INVALID_NUMBER', 'parts.z1.value');
  });
});
