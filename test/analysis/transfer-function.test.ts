/**
 * Exact network functions: closed forms derived by hand (circuit theory, no source needed beyond
 * the named identity), circuit laws (KCL at every node, Thevenin = Norton) and the GIC identity, all as
 * exact equalities of RationalFunctions.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Fraction, Poly, RationalFunction, fractionFromDouble, fractionToNumber } from '../../src/algebra/index';
import { GicladderError } from '../../src/errors';
import { Circuit, SingularCircuitError, type OpampModel, opampGain } from '../../src/netlist/index';
import { compileAc, drivingPointImpedance, transferFunction } from '../../src/analysis/index';
import { capacitor, gicSubcircuit, randomCircuit, randomValue, resistor, rng, type Adder } from './random-circuits';

const rf = (num: (number | string)[], den: (number | string)[]) => RationalFunction.fromCoefficients(num, den);

describe('transferFunction', () => {
  it('RC lowpass: H = 1/(1 + sRC) exactly, with the decimal values as written', () => {
    const c = new Circuit().addVoltageSource('VIN', 'in', '0').addResistor('R1', 'in', 'out', '4.7e3').addCapacitor('C1', 'out', '0', '2.2e-9');
    // 1/(1 + s R C) with R C = 4.7e3 * 2.2e-9 = 1.034e-5 exactly
    expect(transferFunction(c, { input: 'VIN', output: 'out' }).equals(rf([1], [1, '1.034e-5']))).toBe(true);
  });

  it('the same from the input node, and the ratio V(out)/V(in) through a source resistance', () => {
    const c = new Circuit().addVoltageSource('VIN', 'src', '0', 3).addResistor('RS', 'src', 'in', 1).addResistor('R1', 'in', 'out', 2).addCapacitor('C1', 'out', '0', 5);
    // V(out)/V(in) = 1/(1 + 10 s) whatever RS and the source amplitude
    expect(transferFunction(c, { input: 'in', output: 'out' }).equals(rf([1], [1, 10]))).toBe(true);
    // from VIN: 1/(1 + 15 s)
    expect(transferFunction(c, { input: 'VIN', output: 'out' }).equals(rf([1], [1, 15]))).toBe(true);
    // a sourceless circuit driven at a node
    const d = new Circuit().addResistor('R1', 'in', 'out', 2).addCapacitor('C1', 'out', '0', 5);
    expect(transferFunction(d, { input: 'in', output: 'out' }).equals(rf([1], [1, 10]))).toBe(true);
  });

  it('node-input mode equals the quotient of the two source-driven functions (random circuits)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), (seed) => {
        const { circuit } = randomCircuit(seed, 5);
        const [a, b] = [circuit.nodes[1], circuit.nodes[circuit.nodes.length - 1]];
        const va = transferFunction(circuit, { input: 'VIN', output: a });
        if (va.isZero()) return;
        const vb = transferFunction(circuit, { input: 'VIN', output: b });
        expect(transferFunction(circuit, { input: a, output: b }).equals(vb.div(va))).toBe(true);
      }),
      { numRuns: 20 },
    );
  });

  it('a differential output and a current-source input (transimpedance)', () => {
    const c = new Circuit().addCurrentSource('I1', '0', 'a', 1).addResistor('R1', 'a', 'b', 3).addResistor('R2', 'b', '0', 4);
    expect(transferFunction(c, { input: 'I1', output: { plus: 'a', minus: 'b' } }).equals(RationalFunction.constant(3))).toBe(true);
    expect(transferFunction(c, { input: 'I1', output: { plus: 'b', minus: 'a' } }).equals(RationalFunction.constant(-3))).toBe(true);
    expect(transferFunction(c, { input: 'I1', output: 'a' }).equals(RationalFunction.constant(7))).toBe(true);
  });

  it('an ideal inverting amplifier gives -R2/R1 and a finite-gain one -R2/R1 / (1 + (1 + R2/R1)/A0)', () => {
    const build = (m: OpampModel) =>
      new Circuit().addVoltageSource('VIN', 'in', '0').addResistor('R1', 'in', 'm', 2).addResistor('R2', 'm', 'out', 10).addOpamp('U1', { plus: '0', minus: 'm', out: 'out' }, m);
    expect(transferFunction(build({ model: 'ideal' }), { input: 'VIN', output: 'out' }).equals(RationalFunction.constant(-5))).toBe(true);
    // -A R2 / (R1 + R2 + A R1) with A = 1000 (textbook closed-loop gain, Sedra & Smith ch. 2)
    expect(transferFunction(build({ model: 'finite-gain', gain: 1000 }), { input: 'VIN', output: 'out' }).equals(RationalFunction.constant(new Fraction(-10000, 2012)))).toBe(true);
    // single pole: the same with A(s) in place of A0
    const m: OpampModel = { model: 'single-pole', gainBandwidthHz: 1e5, openLoopGainDb: 80 };
    const a = opampGain(m)!;
    const expected = a.scale(-10).div(a.scale(2).add(RationalFunction.constant(12)));
    expect(transferFunction(build(m), { input: 'VIN', output: 'out' }).equals(expected)).toBe(true);
  });

  it('controlled sources: a VCVS buffer with gain, a VCCS into a load (SPICE sign conventions)', () => {
    const e = new Circuit().addVoltageSource('VIN', 'in', '0').addResistor('R1', 'in', '0', 1).addVcvs('E1', 'out', '0', 'in', '0', '5/2').addResistor('RL', 'out', '0', 1);
    expect(transferFunction(e, { input: 'VIN', output: 'out' }).equals(RationalFunction.constant('5/2'))).toBe(true);
    // G out 0 in 0 gm: the current gm V(in) flows from out through the source to ground, so V(out) = -gm RL V(in)
    const g = new Circuit().addVoltageSource('VIN', 'in', '0').addResistor('R1', 'in', '0', 1).addVccs('G1', 'out', '0', 'in', '0', '1/1000').addResistor('RL', 'out', '0', 2000).addCapacitor('CL', 'out', '0', '1/2000');
    // -gm / (1/RL + s CL) = -(1/1000) / (1/2000 + s/2000) = -2 / (1 + s)
    expect(transferFunction(g, { input: 'VIN', output: 'out' }).equals(rf([-2], [1, 1]))).toBe(true);
  });

  it('series RLC: Z = R + sL + 1/(sC); FDNR: Z = 1/(s^2 D)', () => {
    const c = new Circuit().addResistor('R', 'a', 'b', 2).addInductor('L', 'b', 'c', 3).addCapacitor('C', 'c', '0', 5);
    // (3*5 s^2 + 2*5 s + 1) / (5 s)
    expect(drivingPointImpedance(c, 'a').equals(rf([1, 10, 15], [0, 5]))).toBe(true);
    const d = new Circuit().addFdnr('D1', 'a', '0', '1/7');
    expect(drivingPointImpedance(d, 'a').equals(rf([7], [0, 0, 1]))).toBe(true);
  });

  it('rejects unknown inputs and outputs with typed errors', () => {
    const c = new Circuit().addVoltageSource('VIN', 'in', '0').addResistor('R1', 'in', '0', 1);
    for (const spec of [{ input: 'nope', output: 'in' }, { input: 'VIN', output: 'nope' }, { input: 'R1', output: 'in' }]) {
      try {
        transferFunction(c, spec);
        expect.unreachable();
      } catch (e) {
        expect(e).toBeInstanceOf(GicladderError);
        expect((e as GicladderError).code).toBe('INVALID_ARGUMENT');
      }
    }
  });

  it('throws SINGULAR_CIRCUIT naming the loop for parallel voltage sources, and for a numerically singular matrix', () => {
    const c = new Circuit().addVoltageSource('VIN', 'in', '0').addVoltageSource('V2', 'in', '0').addResistor('R1', 'in', '0', 1);
    try {
      transferFunction(c, { input: 'VIN', output: 'in' });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(SingularCircuitError);
      expect((e as SingularCircuitError).code).toBe('SINGULAR_CIRCUIT');
      expect([...(e as SingularCircuitError).elements].sort()).toEqual(['V2', 'VIN']);
    }
    // a VCCS from a to ground controlled by a with gm = 1/R cancels the resistor: no topology finding, singular numbers
    const d = new Circuit().addCurrentSource('I1', '0', 'a', 1).addResistor('R1', 'a', '0', 2).addVccs('G1', '0', 'a', 'a', '0', '1/2');
    expect(() => transferFunction(d, { input: 'I1', output: 'a' })).toThrow(SingularCircuitError);
  });
});

describe('circuit laws, exactly', () => {
  /** The current leaving node `n` through each element, from exact node voltages (unit excitation). */
  it('KCL holds exactly at every node of random R/L/C/op-amp circuits', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), (seed) => {
        const { circuit } = randomCircuit(seed, 4);
        const v = new Map<string, RationalFunction>([['0', RationalFunction.ZERO]]);
        for (const n of circuit.nodes) v.set(n, transferFunction(circuit, { input: 'VIN', output: n }));
        const s = RationalFunction.S;
        const leaving = new Map<string, RationalFunction>();
        const add = (n: string, i: RationalFunction) => leaving.set(n, (leaving.get(n) ?? RationalFunction.ZERO).add(i));
        const unknownCurrent = new Set<string>(); // nodes where an op-amp output or source current enters
        for (const e of circuit.elements) {
          if (e.kind === 'R' || e.kind === 'C' || e.kind === 'L') {
            const y =
              e.kind === 'R' ? RationalFunction.constant(e.ohms).inverse() : e.kind === 'C' ? s.scale(e.farads) : s.scale(e.henries).inverse();
            const i = v.get(e.a)!.sub(v.get(e.b)!).mul(y);
            add(e.a, i);
            add(e.b, i.neg());
          } else if (e.kind === 'OPAMP') {
            unknownCurrent.add(e.out);
          } else if (e.kind === 'V') {
            unknownCurrent.add(e.a);
            unknownCurrent.add(e.b);
          }
        }
        for (const n of circuit.nodes) {
          if (unknownCurrent.has(n)) continue;
          expect((leaving.get(n) ?? RationalFunction.ZERO).isZero()).toBe(true);
        }
        // and the op-amp constraints: ideal V+ = V-, otherwise Vout = A (V+ - V-)
        for (const e of circuit.elements) {
          if (e.kind !== 'OPAMP') continue;
          const diff = v.get(e.plus)!.sub(v.get(e.minus)!);
          const a = opampGain(e.model);
          if (a === null) expect(diff.isZero()).toBe(true);
          else expect(v.get(e.out)!.equals(a.mul(diff))).toBe(true);
        }
      }),
      { numRuns: 25 },
    );
  });

  it('Thevenin = Norton: a source network seen from a port, exactly', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), (seed) => {
        const r = rng(seed);
        const vals = Array.from({ length: 5 }, () => randomValue(r));
        const net = (c: Circuit) => c.addResistor('R1', 'in', 'a', vals[0]).addCapacitor('C1', 'a', '0', vals[1]).addInductor('L1', 'a', 'p', vals[2]).addResistor('R2', 'p', '0', vals[3]);
        const withSource = net(new Circuit().addVoltageSource('VIN', 'in', '0'));
        const vth = transferFunction(withSource, { input: 'VIN', output: 'p' }); // open-circuit voltage
        const zth = drivingPointImpedance(withSource, 'p'); // source shorted
        // the port loaded by 1 ohm, its current measured by a 0 V source in series
        const shorted = net(new Circuit().addVoltageSource('VIN', 'in', '0')).addVoltageSource('VS', 'p', 'q', 0).addResistor('RX', 'q', '0', 1);
        const i1 = transferFunction(shorted, { input: 'VIN', output: 'q' }); // = the current through RX = 1 ohm
        expect(i1.equals(vth.div(zth.add(RationalFunction.ONE)))).toBe(true); // Thevenin source into 1 ohm
        // Norton: Vth/Zth in parallel with Zth reproduces Vth at the open port
        const load = RationalFunction.constant(vals[4]);
        const vLoadedThevenin = vth.mul(load).div(zth.add(load));
        const loaded = net(new Circuit().addVoltageSource('VIN', 'in', '0')).addResistor('RL', 'p', '0', vals[4]);
        const vLoaded = transferFunction(loaded, { input: 'VIN', output: 'p' });
        expect(vLoaded.equals(vLoadedThevenin)).toBe(true);
        const yth = zth.inverse();
        const vLoadedNorton = vth.mul(yth).div(yth.add(load.inverse()));
        expect(vLoaded.equals(vLoadedNorton)).toBe(true);
      }),
      { numRuns: 25 },
    );
  });
});

describe('the GIC identity Zin = Z1 Z3 Z5 / (Z2 Z4) for ideal op-amps', () => {
  it('holds exactly for random R/C choices of the five impedances', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), (seed) => {
        const r = rng(seed);
        const zs: Adder[] = [];
        const z: RationalFunction[] = [];
        for (let i = 0; i < 5; i++) {
          const v = randomValue(r);
          if (r() < 0.5) {
            zs.push(resistor(v));
            z.push(RationalFunction.constant(v));
          } else {
            zs.push(capacitor(v));
            z.push(RationalFunction.fromPolys(Poly.ONE, Poly.fromCoefficients([0, v]))); // 1/(sC)
          }
        }
        const c = new Circuit().addSubcircuit(gicSubcircuit(zs as [Adder, Adder, Adder, Adder, Adder]), 'X1', { p: 'in' });
        const expected = z[0].mul(z[2]).mul(z[4]).div(z[1].mul(z[3]));
        expect(drivingPointImpedance(c, 'in').equals(expected)).toBe(true);
      }),
      { numRuns: 30 },
    );
  });

  it('a simulated inductor: Z2 = C gives L = C R1 R3 R5 / R4', () => {
    const c = new Circuit().addSubcircuit(gicSubcircuit([resistor('1000'), capacitor('1e-8'), resistor('2000'), resistor('3000'), resistor('500')]), 'X', { p: 'in' });
    // L = 1e-8 * 1000 * 2000 * 500 / 3000 = 1/300 H
    expect(drivingPointImpedance(c, 'in').equals(rf([0, '1/300'], [1]))).toBe(true);
  });
});

describe('a large circuit', () => {
  it('solves a 31-node cascade with single-pole op-amps (degree 24) exactly, and the float engine agrees', () => {
    const model = { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 } as const;
    const block = gicSubcircuit([resistor('1000'), capacitor('1e-8'), resistor('1000'), resistor('1000'), resistor('1000')], model); // L = 10 mH
    const c = new Circuit().addVoltageSource('VIN', 'in', '0');
    let prev = 'in';
    for (let k = 1; k <= 6; k++) {
      const node = `s${k}`;
      c.addResistor(`RS${k}`, prev, node, 1000).addCapacitor(`CP${k}`, node, '0', '1e-8');
      c.addSubcircuit(block, `X${k}`, { p: node });
      prev = node;
    }
    expect(c.nodes.length).toBe(31);
    const h = transferFunction(c, { input: 'VIN', output: prev });
    expect(h.den.degree).toBe(24); // 6 x (C, L) + 12 op-amp poles
    // the float engine (its own elimination, in floats) agrees with the exact H evaluated exactly at
    // s = j w, to the 1e-12 relative (measured about 1e-14, also at -200 dB)
    const engine = compileAc(c, { input: 'VIN', output: prev });
    for (const f of [300, 1000, 3000, 10000, 1e5]) {
      const e = h.evaluateGaussian({ re: 0, im: fractionFromDouble(2 * Math.PI * f) });
      const er = fractionToNumber(e.re);
      const ei = fractionToNumber(e.im);
      const g = engine.transferAt(f);
      expect(Math.hypot(g[0] - er, g[1] - ei)).toBeLessThan(1e-12 * Math.hypot(er, ei));
    }
  });

  it('solves a 31-node cascade of GIC-inductor LC sections (degree 20) exactly', () => {
    // Ten sections: series R, shunt GIC-simulated inductor in parallel with a capacitor.
    const block = gicSubcircuit([resistor('1'), capacitor('1'), resistor('1'), resistor('1'), resistor('1')]); // L = 1 H
    const c = new Circuit().addVoltageSource('VIN', 'in', '0');
    let prev = 'in';
    for (let k = 1; k <= 10; k++) {
      const node = `s${k}`;
      c.addResistor(`RS${k}`, prev, node, 1);
      c.addCapacitor(`CP${k}`, node, '0', '1/2');
      c.addSubcircuit(block, `X${k}`, { p: node });
      prev = node;
    }
    expect(c.nodes.length).toBeGreaterThanOrEqual(30);
    const h = transferFunction(c, { input: 'VIN', output: prev });
    expect(h.den.degree).toBe(20);
    // Independent check: the same ladder with real inductors (each section's shunt L = 1 H exactly)
    const lc = new Circuit().addVoltageSource('VIN', 'in', '0');
    prev = 'in';
    for (let k = 1; k <= 10; k++) {
      const node = `s${k}`;
      lc.addResistor(`RS${k}`, prev, node, 1).addCapacitor(`CP${k}`, node, '0', '1/2').addInductor(`L${k}`, node, '0', 1);
      prev = node;
    }
    expect(h.equals(transferFunction(lc, { input: 'VIN', output: prev }))).toBe(true);
  });
});
