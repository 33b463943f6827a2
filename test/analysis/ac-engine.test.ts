/**
 * The compiled float AC engine against the exact analysis (the independent oracle: the exact
 * RationalFunction evaluated at s = j w in exact Gaussian-rational arithmetic, then rounded once), and
 * its own laws: KCL at every node, value changes equal recompiling, exact-derivative group delay.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fractionFromDouble, fractionToNumber, type RationalFunction } from '../../src/algebra/index';
import { GicladderError } from '../../src/errors';
import { Circuit, SingularCircuitError } from '../../src/netlist/index';
import { compileAc, compileImpedance, drivingPointImpedance, transferFunction } from '../../src/analysis/index';
import { capacitor, gicSubcircuit, randomCircuit, resistor, rng } from './random-circuits';

/** H(j w) exactly at the double w = 2 pi f (the same double the engine uses), rounded once to floats. */
function exactAt(h: RationalFunction, frequencyHz: number): { re: number; im: number } {
  const w = fractionFromDouble(2 * Math.PI * frequencyHz);
  const v = h.evaluateGaussian({ re: 0, im: w });
  return { re: fractionToNumber(v.re), im: fractionToNumber(v.im) };
}

/**
 * Relative agreement bound: the float solve is backward stable with a growth-limited pivot order, so
 * its error is a modest multiple of eps times the condition of the (well-scaled, values near 1) random
 * systems; 1e-12 is the requirement and leaves about 4500 eps.
 */
const REL_TOL = 1e-12;

describe('compileAc agrees with the exact transfer function', () => {
  it('on random R/L/C/op-amp circuits (all op-amp models), at two nodes each, to 1e-12 relative', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), (seed) => {
        const { circuit } = randomCircuit(seed, 6);
        const r = rng(seed ^ 0x5bd1e995);
        const freqs = Array.from({ length: 5 }, () => 10 ** (-2 + 2 * r()) / (2 * Math.PI) * 10); // about 0.016 .. 1.6 Hz
        for (const out of [circuit.nodes[1], circuit.nodes[circuit.nodes.length - 1]]) {
          const h = transferFunction(circuit, { input: 'VIN', output: out });
          const engine = compileAc(circuit, { input: 'VIN', output: out });
          for (const f of freqs) {
            const e = exactAt(h, f);
            const got = engine.transferAt(f);
            const err = Math.hypot(got[0] - e.re, got[1] - e.im);
            const mag = Math.hypot(e.re, e.im);
            if (!(err <= REL_TOL * mag)) {
              throw new Error(`seed ${seed} node ${out} f ${f}: got ${got[0]}+j${got[1]}, exact ${e.re}+j${e.im}, rel err ${err / mag}`);
            }
          }
        }
      }),
      { numRuns: 30 },
    );
  });

  it('solveAt gives every node voltage consistent with the exact per-node transfer functions', () => {
    const { circuit } = randomCircuit(12345, 8);
    const engine = compileAc(circuit, { input: 'VIN', output: circuit.nodes[circuit.nodes.length - 1] });
    const sol = engine.solveAt(0.3);
    circuit.nodes.forEach((n, i) => {
      expect(engine.unknowns[i]).toBe(n);
      const e = exactAt(transferFunction(circuit, { input: 'VIN', output: n }), 0.3);
      expect(Math.hypot(sol.re[i] - e.re, sol.im[i] - e.im)).toBeLessThanOrEqual(REL_TOL * Math.hypot(e.re, e.im));
    });
  });

  it('node-input mode (ratio to a node) and a differential output', () => {
    const c = new Circuit().addVoltageSource('VIN', 'src', '0').addResistor('RS', 'src', 'in', 1).addResistor('R1', 'in', 'a', 2).addCapacitor('C1', 'a', 'b', 3).addResistor('R2', 'b', '0', 5);
    const sourceless = new Circuit().addResistor('R1', 'in', 'a', 2).addCapacitor('C1', 'a', '0', 3);
    const hs = transferFunction(sourceless, { input: 'in', output: 'a' }); // 1/(1 + 6 s), driven by an added 1 V source
    const es = compileAc(sourceless, { input: 'in', output: 'a' });
    for (const f of [0.01, 0.1]) {
      const e = exactAt(hs, f);
      const got = es.transferAt(f);
      expect(Math.hypot(got[0] - e.re, got[1] - e.im)).toBeLessThanOrEqual(REL_TOL * Math.hypot(e.re, e.im));
    }
    for (const spec of [
      { input: 'in', output: 'b' },
      { input: 'VIN', output: { plus: 'a', minus: 'b' } },
      { input: 'in', output: { plus: 'in', minus: 'a' } },
    ]) {
      const h = transferFunction(c, spec);
      const engine = compileAc(c, spec);
      for (const f of [0.01, 0.05, 0.2]) {
        const e = exactAt(h, f);
        const got = engine.transferAt(f);
        expect(Math.hypot(got[0] - e.re, got[1] - e.im)).toBeLessThanOrEqual(REL_TOL * Math.hypot(e.re, e.im));
      }
    }
  });
});

describe('compileImpedance', () => {
  it('a GIC with single-pole op-amps: the float Zin agrees with the exact drivingPointImpedance', () => {
    const model = { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 } as const;
    const c = new Circuit().addSubcircuit(gicSubcircuit([resistor('1000'), capacitor('1e-8'), resistor('1000'), resistor('1000'), resistor('1000')], model), 'X1', { p: 'in' });
    const z = drivingPointImpedance(c, 'in');
    const engine = compileImpedance(c, 'in');
    for (const f of [100, 1e3, 1e4, 1e5]) {
      const e = exactAt(z, f);
      const got = engine.transferAt(f);
      expect(Math.hypot(got[0] - e.re, got[1] - e.im)).toBeLessThanOrEqual(REL_TOL * Math.hypot(e.re, e.im));
    }
    // with ideal op-amps Z = j w L, L = C2 R1 R3 R5 / R4 = 10 mH (the GIC identity)
    const ideal = compileImpedance(new Circuit().addSubcircuit(gicSubcircuit([resistor('1000'), capacitor('1e-8'), resistor('1000'), resistor('1000'), resistor('1000')]), 'X1', { p: 'in' }), 'in');
    const z1k = ideal.transferAt(1000);
    expect(Math.abs(z1k[1] / (2 * Math.PI * 1000 * 0.01) - 1)).toBeLessThan(1e-13);
    expect(Math.abs(z1k[0])).toBeLessThan(1e-13 * Math.abs(z1k[1]));
  });
});

describe('engine laws', () => {
  it('KCL holds at every node of a solved random circuit (float, relative to the largest branch current)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), (seed) => {
        const { circuit } = randomCircuit(seed, 6);
        const engine = compileAc(circuit, { input: 'VIN', output: 'n1' });
        const f = 0.2;
        const w = 2 * Math.PI * f;
        const sol = engine.solveAt(f);
        const idx = new Map(circuit.nodes.map((n, i) => [n, i]));
        const v = (n: string) => (n === '0' ? [0, 0] : [sol.re[idx.get(n)!], sol.im[idx.get(n)!]]);
        const sum = new Map<string, [number, number]>();
        const scale = new Map<string, number>();
        const skip = new Set<string>();
        for (const e of circuit.elements) {
          if (e.kind === 'OPAMP') skip.add(e.out);
          if (e.kind === 'V') skip.add(e.a);
          if (e.kind !== 'R' && e.kind !== 'C' && e.kind !== 'L') continue;
          const [ar, ai] = v(e.a);
          const [br, bi] = v(e.b);
          const dr = ar - br;
          const di = ai - bi;
          // admittance: 1/R, j w C, 1/(j w L) = -j/(w L)
          const [yr, yi] = e.kind === 'R' ? [1 / Number(e.ohms.valueOf()), 0] : e.kind === 'C' ? [0, w * Number(e.farads.valueOf())] : [0, -1 / (w * Number(e.henries.valueOf()))];
          const ir = dr * yr - di * yi;
          const ii = dr * yi + di * yr;
          for (const [n, sgn] of [
            [e.a, 1],
            [e.b, -1],
          ] as const) {
            const s = sum.get(n) ?? [0, 0];
            sum.set(n, [s[0] + sgn * ir, s[1] + sgn * ii]);
            scale.set(n, Math.max(scale.get(n) ?? 0, Math.hypot(ir, ii)));
          }
        }
        for (const n of circuit.nodes) {
          if (skip.has(n) || !sum.has(n)) continue;
          const [sr, si] = sum.get(n)!;
          // values are rounded to doubles for the check itself: 1e-12 of the largest current is ample
          expect(Math.hypot(sr, si)).toBeLessThanOrEqual(1e-12 * scale.get(n)!);
        }
      }),
      { numRuns: 30 },
    );
  });

  it('generated straight-line kernels give bit-for-bit the results of the interpreted ones', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), (seed) => {
        const { circuit } = randomCircuit(seed, 7);
        const out = circuit.nodes[circuit.nodes.length - 1];
        const fast = compileAc(circuit, { input: 'VIN', output: out });
        const slow = compileAc(circuit, { input: 'VIN', output: out }, { generateKernels: false });
        const freqs = [0.01, 0.1, 0.3, 1, 3];
        const a = fast.sweep(freqs);
        const b = slow.sweep(freqs);
        for (let i = 0; i < freqs.length; i++) {
          // === (not Object.is): a zero may differ in sign only
          expect(a.gainDb[i] === b.gainDb[i] || (Number.isNaN(a.gainDb[i]) && Number.isNaN(b.gainDb[i]))).toBe(true);
          expect(a.phaseDeg[i] === b.phaseDeg[i] || (Number.isNaN(a.phaseDeg[i]) && Number.isNaN(b.phaseDeg[i]))).toBe(true);
          expect(a.groupDelayS[i] === b.groupDelayS[i] || (Number.isNaN(a.groupDelayS[i]) && Number.isNaN(b.groupDelayS[i]))).toBe(true);
        }
        const sa = fast.solveAt(0.2);
        const sb = slow.solveAt(0.2);
        for (let i = 0; i < sa.re.length; i++) expect(sa.re[i] === sb.re[i] && sa.im[i] === sb.im[i]).toBe(true);
      }),
      { numRuns: 30 },
    );
  });

  it('the fused transfer kernel (transfer-codegen.ts) gives transferAt bit for bit the interpreted H, by source and by node ratio', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), fc.boolean(), (seed, byNode) => {
        const { circuit } = randomCircuit(seed, 7);
        const out = circuit.nodes[circuit.nodes.length - 1];
        // a node as input: H = V(out)/V(in) with a reference combination (Smith's division in the kernel)
        const spec = { input: byNode ? circuit.nodes[0] : 'VIN', output: out };
        const fast = compileAc(circuit, spec);
        const slow = compileAc(circuit, spec, { generateKernels: false });
        const h = new Float64Array(2);
        for (const f of [0.01, 0.1, 0.3, 1, 3, 10]) {
          fast.transferAt(f, h);
          const ref = slow.solveAt(f);
          const g = slow.transferAt(f);
          // === (not Object.is): a zero may differ in sign only
          expect(h[0] === g[0] || (Number.isNaN(h[0]) && Number.isNaN(g[0]))).toBe(true);
          expect(h[1] === g[1] || (Number.isNaN(h[1]) && Number.isNaN(g[1]))).toBe(true);
          if (Number.isFinite(ref.hRe)) expect(Math.hypot(h[0] - ref.hRe, h[1] - ref.hIm)).toBeLessThanOrEqual(1e-12 * Math.hypot(ref.hRe, ref.hIm));
        }
      }),
      { numRuns: 40 },
    );
  });

  it('setParameters (one generated weight update) leaves the engine bit for bit as setParameter one by one', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2 ** 31 - 1 }), fc.integer({ min: 1, max: 2 ** 31 - 1 }), fc.boolean(), (seed, drawSeed, generate) => {
        const { circuit } = randomCircuit(seed, 7);
        const spec = { input: 'VIN', output: circuit.nodes[circuit.nodes.length - 1] };
        const a = compileAc(circuit, spec, { generateKernels: generate });
        const b = compileAc(circuit, spec, { generateKernels: generate });
        // a random subset of the parameters, each scaled by a random factor in [0.5, 1.5)
        let x = drawSeed;
        const next = () => ((x = (Math.imul(x, 1103515245) + 12345) >>> 0) / 2 ** 32);
        const idx = a.parameterNames.map((_, i) => i).filter(() => next() < 0.6);
        const vals = Float64Array.from(idx, (i) => a.parameters[i] * (0.5 + next()));
        a.setParameters(Int32Array.from(idx), vals);
        idx.forEach((i, k) => b.setParameter(i, vals[k]));
        for (const f of [0.05, 0.5, 5]) {
          const ha = a.transferAt(f);
          const hb = b.transferAt(f);
          expect(Object.is(ha[0], hb[0]) && Object.is(ha[1], hb[1])).toBe(true);
          const sa = a.solveAt(f);
          const sb = b.solveAt(f);
          for (let i = 0; i < sa.re.length; i++) expect(Object.is(sa.re[i], sb.re[i]) && Object.is(sa.im[i], sb.im[i])).toBe(true);
        }
        // and a later single change still starts from consistent cached weights
        if (idx.length > 0) {
          a.setParameter(idx[0], vals[0] * 1.25);
          b.setParameter(idx[0], vals[0] * 1.25);
          const ha = a.transferAt(0.5);
          const hb = b.transferAt(0.5);
          expect(Object.is(ha[0], hb[0]) && Object.is(ha[1], hb[1])).toBe(true);
        }
      }),
      { numRuns: 40 },
    );
  });

  it('setValue then solving equals compiling the changed circuit; setOpampModel likewise', () => {
    const build = (r2: number, gbw: number) =>
      new Circuit()
        .addVoltageSource('VIN', 'in', '0')
        .addResistor('R1', 'in', 'm', 1000)
        .addResistor('R2', 'm', 'out', r2)
        .addCapacitor('C1', 'm', 'out', 1e-9)
        .addOpamp('U1', { plus: '0', minus: 'm', out: 'out' }, { model: 'single-pole', gainBandwidthHz: gbw, openLoopGainDb: 100 });
    const engine = compileAc(build(2200, 1e6), { input: 'VIN', output: 'out' });
    engine.setValue('R2', 4700);
    engine.setOpampModel('U1', { model: 'single-pole', gainBandwidthHz: 3e6, openLoopGainDb: 100 });
    const fresh = compileAc(build(4700, 3e6), { input: 'VIN', output: 'out' });
    for (const f of [100, 1e4, 1e5, 1e6]) {
      const a = engine.transferAt(f);
      const b = fresh.transferAt(f);
      expect(a[0]).toBe(b[0]);
      expect(a[1]).toBe(b[1]);
    }
    expect(engine.getValue('R2')).toBe(4700);
    expect(() => engine.setValue('R9', 1)).toThrow(GicladderError);
    expect(() => engine.setOpampModel('U1', { model: 'ideal' })).toThrow(GicladderError);
  });

  it('group delay equals the exact derivative of the phase, and phase is unwrapped', () => {
    // a 4-section RC-ladder-with-followers: phase goes well past -180 degrees
    const c = new Circuit().addVoltageSource('VIN', 'in', '0');
    let prev = 'in';
    for (let k = 1; k <= 4; k++) {
      c.addResistor(`R${k}`, prev, `a${k}`, 1).addCapacitor(`C${k}`, `a${k}`, '0', 1).addOpamp(`U${k}`, { plus: `a${k}`, minus: `b${k}`, out: `b${k}` });
      prev = `b${k}`;
    }
    const h = transferFunction(c, { input: 'VIN', output: prev }); // 1/(1+s)^4
    const engine = compileAc(c, { input: 'VIN', output: prev });
    const freqs = Array.from({ length: 200 }, (_, i) => 10 ** (-3 + (4 * i) / 199));
    const sw = engine.sweep(freqs);
    for (let i = 0; i < freqs.length; i++) {
      const w = 2 * Math.PI * freqs[i];
      // closed form: phase -4 atan(w), delay 4/(1 + w^2) (circuit theory, no source needed)
      expect(sw.phaseDeg[i]).toBeCloseTo((-4 * Math.atan(w) * 180) / Math.PI, 9);
      expect(Math.abs(sw.groupDelayS[i] - 4 / (1 + w * w))).toBeLessThanOrEqual(1e-12 * (4 / (1 + w * w)));
      expect(Math.abs(sw.groupDelayS[i] - h.groupDelayS(w))).toBeLessThanOrEqual(1e-9 * (4 / (1 + w * w)));
      expect(sw.gainDb[i]).toBeCloseTo(-80 * Math.log10(Math.hypot(1, w)), 9); // 20 log10 |1/(1 + jw)^4|
    }
    expect(sw.phaseDeg[freqs.length - 1]).toBeLessThan(-350);
    expect(Object.keys(sw.nodes)).toEqual(c.nodes);
  });

  it('group delay in node-input mode and through a GIC inductor matches the exact function', () => {
    const c = new Circuit()
      .addVoltageSource('VIN', 'src', '0')
      .addResistor('RS', 'src', 'in', 1)
      .addResistor('R1', 'in', 'out', '1/2')
      .addCapacitor('C1', 'out', '0', '1/3')
      .addSubcircuit(gicSubcircuit([resistor('1'), capacitor('1'), resistor('1'), resistor('2'), resistor('1')]), 'X1', { p: 'out' });
    const h = transferFunction(c, { input: 'in', output: 'out' });
    const engine = compileAc(c, { input: 'in', output: 'out' });
    const freqs = [0.05, 0.1, 0.2, 0.3, 0.5];
    const sw = engine.sweep(freqs, { nodes: ['out'] });
    freqs.forEach((f, i) => {
      const w = 2 * Math.PI * f;
      const tau = h.groupDelayS(w);
      expect(Math.abs(sw.groupDelayS[i] - tau)).toBeLessThanOrEqual(1e-10 * Math.abs(tau) + 1e-15);
      const e = exactAt(h, f);
      expect(sw.nodes.out.re[i]).toBeCloseTo(e.re, 12);
      expect(sw.nodes.out.im[i]).toBeCloseTo(e.im, 12);
    });
  });

  it('returns NaN (does not throw) at a singular frequency, and throws SINGULAR_CIRCUIT at compile for a singular topology', () => {
    // an integrator model op-amp follower at DC is fine; a capacitor-only node is singular at f = 0
    const c = new Circuit().addVoltageSource('VIN', 'in', '0').addCapacitor('C1', 'in', 'a', 1).addCapacitor('C2', 'a', '0', 1);
    const engine = compileAc(c, { input: 'VIN', output: 'a' });
    expect(engine.diagnostics.map((d) => d.code)).toEqual(['NO_DC_PATH']);
    expect(engine.transferAt(1)[0]).toBeCloseTo(0.5, 14);
    const sol = engine.solveAt(0);
    expect(Number.isNaN(sol.hRe) || !Number.isFinite(sol.hRe)).toBe(true);
    const bad = new Circuit().addVoltageSource('VIN', 'in', '0').addVoltageSource('V2', 'in', '0');
    expect(() => compileAc(bad, { input: 'VIN', output: 'in' })).toThrow(SingularCircuitError);
  });
});
