/**
 * The circuit builder: exact values, ground spelling, name checks, subcircuit instances, op-amp models.
 */
import { describe, expect, it } from 'vitest';
import { Fraction, Poly, RationalFunction, fractionFromDouble } from '../../src/algebra/index';
import { GicladderError } from '../../src/errors';
import { Circuit, Subcircuit, opampGain, opampInverseGain, validateOpampModel, Resistor, Opamp } from '../../src/netlist/index';

describe('Circuit builder', () => {
  it('stores values exactly: numbers as their exact double, strings as written', () => {
    const c = new Circuit().addResistor('R1', 'a', 'b', 0.1).addResistor('R2', 'b', '0', '0.1').addCapacitor('C1', 'a', 'gnd', '1/3');
    const r1 = c.element('R1') as Resistor;
    const r2 = c.element('R2') as Resistor;
    // 0.1 as a double is 3602879701896397 / 2^55 (IEEE 754 binary64), not 1/10
    expect(r1.ohms.equals(new Fraction(3602879701896397n, 36028797018963968n))).toBe(true);
    expect(r2.ohms.equals(new Fraction(1n, 10n))).toBe(true);
    expect(c.nodes).toEqual(['a', 'b']);
    expect(c.element('C1')!.nodes).toEqual(['a', '0']);
  });

  it('treats 0, gnd and GND as the one ground node', () => {
    const c = new Circuit().addResistor('R1', 'x', 'GND', 1).addResistor('R2', 'x', 'gnd', 1).addResistor('R3', 'x', '0', 1);
    expect(c.nodes).toEqual(['x']);
    expect(c.elements.map((e) => e.nodes[1])).toEqual(['0', '0', '0']);
  });

  it('rejects duplicate names, bad nodes and non-positive passive values with typed errors', () => {
    const c = new Circuit().addResistor('R1', 'a', '0', 1);
    const codeOf = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        expect(e).toBeInstanceOf(GicladderError);
        return (e as GicladderError).code;
      }
      return 'no error';
    };
    expect(codeOf(() => c.addResistor('R1', 'a', '0', 1))).toBe('INVALID_ARGUMENT');
    expect(codeOf(() => c.addResistor('R9', '', '0', 1))).toBe('INVALID_ARGUMENT');
    expect(codeOf(() => c.addResistor('R9', 'a', '0', 0))).toBe('OUT_OF_RANGE');
    expect(codeOf(() => c.addCapacitor('C9', 'a', '0', -1e-9))).toBe('OUT_OF_RANGE');
    expect(codeOf(() => c.addInductor('L9', 'a', '0', Number.NaN))).toBe('INVALID_NUMBER');
    expect(codeOf(() => c.addResistor('R9', 'a', '0', '4k7'))).toBe('INVALID_NUMBER');
    expect(codeOf(() => c.addOpamp('U1', { plus: 'a', minus: 'b', out: 'c' }, { model: 'single-pole', gainBandwidthHz: -1, openLoopGainDb: 100 }))).toBe('OUT_OF_RANGE');
    expect(codeOf(() => c.addOpamp('U1', { plus: 'a', minus: 'b', out: 'c' }, { model: 'magic' } as never))).toBe('INVALID_ARGUMENT');
  });

  it('instantiates a subcircuit twice with prefixed internal nodes and elements, ports mapped, ground shared', () => {
    const block = new Subcircuit('rc', ['in', 'out']).addResistor('R', 'in', 'mid', 1).addResistor('R2', 'mid', 'out', 2).addCapacitor('C', 'mid', '0', 3);
    const c = new Circuit().addSubcircuit(block, 'X1', { in: 'a', out: 'b' }).addSubcircuit(block, 'X2', { in: 'b', out: 'c' });
    expect(c.elements.map((e) => e.name)).toEqual(['X1.R', 'X1.R2', 'X1.C', 'X2.R', 'X2.R2', 'X2.C']);
    expect(c.elements.map((e) => e.nodes)).toEqual([
      ['a', 'X1.mid'],
      ['X1.mid', 'b'],
      ['X1.mid', '0'],
      ['b', 'X2.mid'],
      ['X2.mid', 'c'],
      ['X2.mid', '0'],
    ]);
    expect(() => c.addSubcircuit(block, 'X3', { in: 'a' })).toThrow(GicladderError);
    expect(() => c.addSubcircuit(block, 'X1', { in: 'a', out: 'z' })).toThrow(GicladderError); // X1.R exists
  });

  it('nests subcircuits', () => {
    const inner = new Subcircuit('r', ['p']).addResistor('R', 'p', 'q', 1).addResistor('S', 'q', '0', 1);
    const outer = new Subcircuit('rr', ['p']).addSubcircuit(inner, 'A', { p: 'p' }).addSubcircuit(inner, 'B', { p: 'p' });
    const c = new Circuit().addSubcircuit(outer, 'X', { p: 'in' });
    expect(c.nodes).toEqual(['in', 'X.A.q', 'X.B.q']);
    expect(c.elements.map((e) => e.name)).toEqual(['X.A.R', 'X.A.S', 'X.B.R', 'X.B.S']);
    expect((c.element('X.B.R') as Resistor).ohms.equals(new Fraction(1))).toBe(true);
  });

  it('withValues copies the circuit with replaced values and op-amp models, leaving the original alone', () => {
    const c = new Circuit().addVoltageSource('V1', 'in', '0').addResistor('R1', 'in', 'out', 1).addCapacitor('C1', 'out', '0', 2).addOpamp('U1', { plus: 'out', minus: 'o', out: 'o' });
    const d = c.withValues({ R1: '4.7', V1: 3 }, { U1: { model: 'finite-gain', gain: 100 } });
    expect((d.element('R1') as Resistor).ohms.equals(new Fraction(47, 10))).toBe(true);
    expect((c.element('R1') as Resistor).ohms.equals(new Fraction(1))).toBe(true);
    expect((d.element('U1') as Opamp).model).toEqual({ model: 'finite-gain', gain: 100 });
    expect(d.nodes).toEqual(c.nodes);
    expect(d.elements.map((e) => e.name)).toEqual(c.elements.map((e) => e.name));
    const code = (f: () => unknown) => {
      try {
        f();
        return 'none';
      } catch (e) {
        return (e as GicladderError).code;
      }
    };
    expect(code(() => c.withValues({ R9: 1 }))).toBe('INVALID_ARGUMENT');
    expect(code(() => c.withValues({ C1: -1 }))).toBe('OUT_OF_RANGE');
    expect(code(() => c.withValues({ U1: 1 }))).toBe('INVALID_ARGUMENT');
    expect(code(() => c.withValues({}, { R1: { model: 'ideal' } }))).toBe('INVALID_ARGUMENT');
  });

  it('keeps the op-amp model and terminals', () => {
    const c = new Circuit().addOpamp('U1', { plus: 'p', minus: 'm', out: 'o' });
    const u = c.element('U1') as Opamp;
    expect([u.plus, u.minus, u.out, u.model.model]).toEqual(['p', 'm', 'o', 'ideal']);
  });
});

describe('op-amp models', () => {
  it('single pole: A(s) = A0/(1 + s/wp) with wp = 2 pi GBW / A0 (the doubles taken exactly)', () => {
    const m = { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 } as const;
    const a0 = new Fraction(1e5);
    const wt = fractionFromDouble(2 * Math.PI * 1e6);
    const wp = wt.div(a0);
    const expected = RationalFunction.fromPolys(Poly.constant(a0), Poly.fromCoefficients([1, new Fraction(1).div(wp)]));
    expect(opampGain(m)!.equals(expected)).toBe(true);
  });

  it('integrator: A(s) = wt/s; finite gain: A = A0; two poles: A0/((1+s/wp)(1+s/w2))', () => {
    const wt = fractionFromDouble(2 * Math.PI * 1e6);
    // A = wt/s = 1 / (s/wt)
    expect(opampGain({ model: 'integrator', gainBandwidthHz: 1e6 })!.equals(RationalFunction.fromPolys(Poly.constant(wt), Poly.S))).toBe(true);
    expect(opampGain({ model: 'finite-gain', gain: 1000 })!.equals(RationalFunction.constant(1000))).toBe(true);
    const two = opampGain({ model: 'two-pole', gainBandwidthHz: 1e6, openLoopGainDb: 80, secondPoleHz: 5e6 })!;
    // poles at -wp and -w2 (the denominator factors), DC gain 10^(80/20) = 1e4 exactly (the double 1e4)
    expect(two.evaluate(0).equals(new Fraction(10000))).toBe(true);
    expect(two.den.degree).toBe(2);
    const w2 = fractionFromDouble(2 * Math.PI * 5e6);
    expect(two.den.evaluate(w2.neg()).n).toBe(0n);
    expect(opampGain({ model: 'ideal' })).toBeNull();
    expect(opampInverseGain({ model: 'ideal' }).isZero()).toBe(true);
  });

  it('validateOpampModel names the offending field', () => {
    try {
      validateOpampModel({ model: 'two-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100, secondPoleHz: 0 }, 'parts.opamp');
      expect.unreachable();
    } catch (e) {
      expect((e as GicladderError).path).toBe('parts.opamp.secondPoleHz');
      expect((e as GicladderError).code).toBe('OUT_OF_RANGE');
    }
  });
});
