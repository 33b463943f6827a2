/**
 * The non-ideal GIC: exact Zin from the netlist, the 24 valid input assignments, exact stability,
 * the first-order GBW error against the hand derivation (Eq. (3) of gic-nonideal.ts) and the resistor
 * choice that minimises it.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { Poly, RationalFunction } from '../../src/algebra/index';
import { Circuit, type OpampModel } from '../../src/netlist/index';
import { buildMnaSystem } from '../../src/analysis/index';
import {
  DEFAULT_GIC_INPUTS,
  allGicInputAssignments,
  gicCharacteristicPolynomial,
  gicCircuit,
  gicFirstOrderError,
  gicIdealAssignments,
  gicIdealImpedance,
  gicImpedanceNonideal,
  gicStability,
  mnaDeterminant,
  toFloatFdnrFigures,
  toFloatInductorFigures,
  type GicImpedances,
  type GicInputs,
} from '../../src/converter/gic-nonideal';
import { GicladderError, InvalidInputError, UnrealizableError } from '../../src/errors';

const R = (ohms: number | string) => RationalFunction.constant(ohms);
const C = (farads: number | string) => RationalFunction.fromCoefficients([1], [0, farads]); // 1/(sC)
const IDEAL: OpampModel = { model: 'ideal' };
const integrator = (gbwHz: number): OpampModel => ({ model: 'integrator', gainBandwidthHz: gbwHz });

/** The simulated inductor with C in position 4: L = C4 R1 R3 R5 / R2. */
const inductor = (r1: number, r2: number, r3: number, c4: string, r5: number): GicImpedances => ({ z1: R(r1), z2: R(r2), z3: R(r3), z4: C(c4), z5: R(r5) });
const INDUCTOR = inductor(1000, 1000, 1000, '1e-8', 1000); // 10 mH, w C R = 1 at 1e5 rad/s
/** Values with no special relation, so no assignment matches Eq. (1) by accident. */
const GENERIC: GicImpedances = { z1: R(3), z2: R(5), z3: R(7), z4: C(11), z5: R(13) };

const sameInputs = (x: GicInputs, y: GicInputs) => x.a.plus === y.a.plus && x.a.minus === y.a.minus && x.b.plus === y.b.plus && x.b.minus === y.b.minus;

describe('exact Zin with ideal op-amps', () => {
  it('the netlist gives Z1 Z3 Z5 / (Z2 Z4) exactly (inductor L = C4 R1 R3 R5 / R2 = 10 mH)', () => {
    expect(gicImpedanceNonideal(INDUCTOR, { opamps: IDEAL }).equals(RationalFunction.fromCoefficients([0, '0.01'], [1]))).toBe(true);
  });

  it('property: Eq. (1) for random R/C positions and rational values', () => {
    const part = fc.tuple(fc.boolean(), fc.integer({ min: 1, max: 10_000 })).map(([isC, v]) => (isC ? C(`${v}e-9`) : R(v)));
    fc.assert(
      fc.property(fc.tuple(part, part, part, part, part), ([z1, z2, z3, z4, z5]) => {
        const z = { z1, z2, z3, z4, z5 };
        expect(gicImpedanceNonideal(z, { opamps: IDEAL }).equals(gicIdealImpedance(z))).toBe(true);
      }),
      { numRuns: 25 },
    );
  });

  it('series and parallel combinations become element chains (Z2 = R + 1/(sC), Z5 = R || C)', () => {
    const z = { ...GENERIC, z2: R(5).add(C(2)), z5: R(13).inverse().add(C(3).inverse()).inverse() };
    expect(gicImpedanceNonideal(z, { opamps: IDEAL }).equals(gicIdealImpedance(z))).toBe(true);
  });

  it('an impedance with no element form is refused with UnrealizableError', () => {
    const z = { ...GENERIC, z3: RationalFunction.fromCoefficients([1, 1], [2, 1]) }; // (s + 1)/(s + 2)
    expect(() => gicImpedanceNonideal(z, { opamps: IDEAL })).toThrow(UnrealizableError);
  });
});

describe('input assignments', () => {
  it('exactly the 24 assignments with the two op-amps across different node pairs give Eq. (1)', () => {
    const found = gicIdealAssignments(GENERIC);
    expect(found).toHaveLength(24);
    const expected = allGicInputAssignments().filter((x) => new Set([x.a.plus, x.a.minus]).size === 2 && !(new Set([x.a.plus, x.a.minus, x.b.plus, x.b.minus]).size === 2));
    expect(expected).toHaveLength(24);
    for (const x of expected) expect(found.some((y) => sameInputs(x, y))).toBe(true);
    expect(found.some((y) => sameInputs(y, DEFAULT_GIC_INPUTS))).toBe(true);
  });

  it('stability of each assignment with integrator op-amps matches the sympy/numpy reference', () => {
    // Reference: scripts/fixtures/gic_stability.py (sympy determinant of hand-written nodal equations, numpy roots).
    const ref = JSON.parse(readFileSync(new URL('../fixtures/sympy/gic-stability.json', import.meta.url), 'utf8')) as {
      assignments: { a: GicInputs['a']; b: GicInputs['b']; rightHalfPlane: { open: number; short: number; load: number } }[];
    };
    expect(ref.assignments).toHaveLength(24);
    const stable: GicInputs[] = [];
    for (const row of ref.assignments) {
      const inputs = { a: row.a, b: row.b };
      const st = gicStability(INDUCTOR, { opamps: integrator(1e6), inputs }, 1000);
      expect([st.open.rightHalfPlane, st.shorted.rightHalfPlane, st.loaded.rightHalfPlane]).toEqual([row.rightHalfPlane.open, row.rightHalfPlane.short, row.rightHalfPlane.load]);
      if (st.stable) stable.push(inputs);
    }
    // Three assignments are stable open, shorted and loaded; the default one is among them.
    expect(stable).toEqual([
      { a: { plus: 5, minus: 1 }, b: { plus: 1, minus: 3 } },
      { a: { plus: 5, minus: 3 }, b: { plus: 1, minus: 3 } },
      { a: { plus: 5, minus: 3 }, b: { plus: 1, minus: 5 } },
    ]);
  });

  it('the default assignment is stable with single-pole and two-pole op-amps too, for the inductor and the FDNR', () => {
    const models: OpampModel[] = [
      { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 },
      { model: 'two-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100, secondPoleHz: 2e7 },
    ];
    const fdnr = { z1: C('1e-8'), z2: R(1000), z3: C('1e-8'), z4: R(1000), z5: R(1000) };
    for (const opamps of models) {
      expect(gicStability(INDUCTOR, { opamps }, 1000).stable).toBe(true);
      expect(gicStability(fdnr, { opamps }, 1000).stable).toBe(true);
    }
    // and a swapped b (+ on 3, - on 1) is not
    expect(gicStability(INDUCTOR, { opamps: models[0], inputs: { a: { plus: 5, minus: 3 }, b: { plus: 3, minus: 1 } } }, 1000).stable).toBe(false);
  });

  it('the characteristic polynomial is the MNA determinant: R || C to ground gives 1/R + sC', () => {
    const c = new Circuit().addResistor('R1', 'a', '0', 2).addCapacitor('C1', 'a', '0', 3);
    expect(mnaDeterminant(buildMnaSystem(c)).equals(Poly.fromCoefficients(['1/2', 3]))).toBe(true);
    // open vs shorted port of the ideal inductor GIC differ (node 1 is removed when shorted)
    const open = gicCharacteristicPolynomial(INDUCTOR, { opamps: integrator(1e6) }, { port: 'open' });
    const shorted = gicCharacteristicPolynomial(INDUCTOR, { opamps: integrator(1e6) }, { port: 'short' });
    expect(open.equals(shorted)).toBe(false);
    expect(open.leading.s > 0n).toBe(true);
    // a shorted simulated inductor keeps a constant current: one root at s = 0, reported apart
    const st = gicStability(INDUCTOR, { opamps: integrator(1e6) }, 1000);
    expect(st.shorted.originRoots).toBe(1);
    expect(st.shorted.stableExceptOrigin).toBe(true);
    expect(st.open.originRoots).toBe(0);
  });
});

describe('first-order GBW error', () => {
  it('matches the hand derivation, Eq. (3), exactly for the default inputs', () => {
    for (const z of [GENERIC, INDUCTOR, { z1: C(2), z2: R(3), z3: C(5), z4: R(7), z5: R(11) }]) {
      const { z2, z3, z4, z5 } = z;
      const common = z4.add(z5).mul(z3.mul(z5).sub(z2.mul(z4))).neg().div(z2.mul(z3).mul(z4).mul(z5));
      const e = gicFirstOrderError(z);
      expect(e.a.equals(common.mul(z2))).toBe(true);
      expect(e.b.equals(common.mul(z3))).toBe(true);
    }
  });

  it('is the first-order term: the remainder of the exact Zin falls as 1/A^2', () => {
    const e = gicFirstOrderError(GENERIC);
    const ideal = gicIdealImpedance(GENERIC);
    const remainder = (gain: number) => {
      const exact = gicImpedanceNonideal(GENERIC, { opamps: { model: 'finite-gain', gain } });
      const first = ideal.mul(RationalFunction.ONE.add(e.a.add(e.b).scale(1 / gain)));
      const s = { re: 0, im: 0.7 };
      const a = exact.evaluateComplex(s);
      const b = first.evaluateComplex(s);
      return Math.hypot(a.re - b.re, a.im - b.im);
    };
    const ratio = remainder(1e4) / remainder(2e4);
    expect(ratio).toBeGreaterThan(3.9); // 4 for a pure 1/A^2 remainder
    expect(ratio).toBeLessThan(4.1);
  });

  it('R2 = R3 cancels the first-order loss for any op-amp mismatch: the loss falls as 1/GBW^2', () => {
    const w = 1e5;
    const loss = (z: GicImpedances, gbwA: number, gbwB: number) => toFloatInductorFigures(gicImpedanceNonideal(z, { opamps: [integrator(gbwA), integrator(gbwB)] }), w).lossOhms;
    const equal = inductor(1000, 1000, 1000, '1e-8', 1000);
    const unequal = inductor(2000, 2000, 1000, '1e-8', 1000); // same L, R2 != R3
    for (const [ga, gb] of [
      [1e6, 1e6],
      [1e6, 1.5e6],
    ]) {
      expect(loss(equal, ga, gb) / loss(equal, 2 * ga, 2 * gb)).toBeGreaterThan(3.8); // second order
      expect(loss(unequal, ga, gb) / loss(unequal, 2 * ga, 2 * gb)).toBeLessThan(2.2); // first order
    }
    // and Q is far higher with R2 = R3 (first-order loss cancelled)
    const qEqual = toFloatInductorFigures(gicImpedanceNonideal(equal, { opamps: integrator(1e6) }), w).q;
    const qUnequal = toFloatInductorFigures(gicImpedanceNonideal(unequal, { opamps: integrator(1e6) }), w).q;
    expect(Math.abs(qEqual)).toBeGreaterThan(20 * Math.abs(qUnequal));
  });

  it('with R2 = R3 the first-order inductance error (w/wa + w/wb)(x + 1/x), x = w C4 R5, is smallest at x = 1', () => {
    const w = 1e5;
    const wt = 2 * Math.PI * 1e6;
    const L = 0.01;
    const errorAt = (r5: number) => {
      const r1 = (L * 1000) / (1e-8 * 1000 * r5); // keeps L = C4 R1 R3 R5 / R2
      const z = inductor(r1, 1000, 1000, '1e-8', r5);
      const e = gicFirstOrderError(z);
      // eps(jw) = (E_a + E_b) * (jw / wt) for matched integrators
      const v = e.a.add(e.b).evaluateComplex({ re: 0, im: w });
      const eps = { re: -v.im * (w / wt), im: v.re * (w / wt) };
      const x = w * 1e-8 * r5;
      expect(eps.im).toBeCloseTo(0, 12); // no first-order loss
      expect(eps.re).toBeCloseTo(((2 * w) / wt) * (x + 1 / x), 12); // Eq. (4) with R2 = R3
      return eps.re;
    };
    const values = [250, 500, 800, 1000, 1250, 2000, 4000].map(errorAt);
    expect(Math.min(...values)).toBe(values[3]); // R5 = 1 kOhm: w C4 R5 = 1
    expect(values[3]).toBeCloseTo((4 * w) / wt, 12); // 4 w / wt
    // The exact (all orders) inductance error agrees with the first-order one to O((w/wt)^2).
    const exact = toFloatInductorFigures(gicImpedanceNonideal(INDUCTOR, { opamps: integrator(1e6) }), w).inductanceH / L - 1;
    expect(Math.abs(exact - values[3])).toBeLessThan(3 * (w / wt) ** 2 * 4);
  });
});

describe('figures at a frequency', () => {
  it('ideal op-amps: L_eff = L, no loss, infinite Q; FDNR D_eff = C1 C3 R2 R4 / R5', () => {
    const f = toFloatInductorFigures(gicImpedanceNonideal(INDUCTOR, { opamps: IDEAL }), 2e4);
    expect(f.inductanceH).toBeCloseTo(0.01, 15);
    // zero up to the float evaluation's rounding of (j w)^k (about 1e-16 relative to |Zin|)
    expect(Math.abs(f.lossOhms)).toBeLessThan(1e-14 * 2e4 * 0.01);
    expect(Math.abs(f.q)).toBeGreaterThan(1e13);
    const fdnr = { z1: C('1e-8'), z2: R(1000), z3: C('1e-8'), z4: R(2000), z5: R(1000) };
    const d = toFloatFdnrFigures(gicImpedanceNonideal(fdnr, { opamps: IDEAL }), 3e4);
    expect(Math.abs(d.dFaradSeconds / 2e-13 - 1)).toBeLessThan(1e-14); // float evaluation of an exact 1/(s^2 D): a few ulps
    expect(Math.abs(d.reactanceOhms)).toBeLessThan(1e-12 * Math.abs(1 / (9e8 * 2e-13))); // zero up to rounding of j w
    expect(d.q).toBeGreaterThan(1e11);
  });

  it('a finite-gain op-amp gives a first-order loss: R_loss of the default inductor with A0 = 1e4', () => {
    const w = 1e5;
    const f = toFloatInductorFigures(gicImpedanceNonideal(INDUCTOR, { opamps: { model: 'finite-gain', gain: 1e4 } }), w);
    // Zin = j w L (1 + eps), eps = (E_a + E_b)/A0 (Eq. (2)): R_loss = -w L Im(eps) to first order
    const e = gicFirstOrderError(INDUCTOR);
    const eps = e.a.add(e.b).evaluateComplex({ re: 0, im: w });
    const predicted = (-w * 0.01 * eps.im) / 1e4;
    expect(predicted).not.toBe(0);
    expect(Math.abs(f.lossOhms / predicted - 1)).toBeLessThan(1e-3); // second-order remainder ~ 1/A0
  });
});

describe('invalid arguments', () => {
  const cases: [string, () => unknown, string][] = [
    ['missing z', () => gicCircuit({ ...GENERIC, z3: undefined } as never, { opamps: IDEAL }), 'z.z3'],
    ['zero z', () => gicCircuit({ ...GENERIC, z1: RationalFunction.ZERO }, { opamps: IDEAL }), 'z.z1'],
    ['bad node', () => gicCircuit(GENERIC, { opamps: IDEAL, inputs: { a: { plus: 2 as never, minus: 3 }, b: { plus: 1, minus: 3 } } }), 'options.inputs.a.plus'],
    ['same node', () => gicCircuit(GENERIC, { opamps: IDEAL, inputs: { a: { plus: 5, minus: 3 }, b: { plus: 1, minus: 1 } } }), 'options.inputs.b'],
    ['bad model', () => gicCircuit(GENERIC, { opamps: { model: 'magic' } as never }), 'options.opamps.model'],
    ['three models', () => gicCircuit(GENERIC, { opamps: [IDEAL, IDEAL, IDEAL] as never }), 'options.opamps'],
    ['bad load', () => gicStability(GENERIC, { opamps: IDEAL }, -5), 'condition.loadOhms'],
    ['bad port', () => gicCharacteristicPolynomial(GENERIC, { opamps: IDEAL }, { port: 'half' } as never), 'condition.port'],
    ['bad omega', () => toFloatInductorFigures(R(1), 0), 'omegaRadPerS'],
  ];
  it.each(cases)('%s', (_name, f, path) => {
    try {
      f();
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InvalidInputError);
      expect((e as GicladderError).path).toBe(path);
    }
  });
});
