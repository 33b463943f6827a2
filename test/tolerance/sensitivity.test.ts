import { describe, expect, it } from 'vitest';
import { Fraction, fractionToNumber } from '../../src/algebra/index';
import { compileAc, transferFunction } from '../../src/analysis/index';
import { Circuit, type OpampModel } from '../../src/netlist/index';
import { InvalidInputError } from '../../src/errors';
import { computeSensitivities } from '../../src/tolerance/sensitivity';
import { circuitToJson, circuitFromJson, withValues } from '../../src/tolerance/circuit-json';
import { gicFdnrLowpass, gicInductorBandpass } from '../helpers/gic-circuits';
import { invalidCode } from '../helpers/expect-error';

const SINGLE_POLE: OpampModel = { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 };
const spec = { input: 'in', output: 'out' } as const;

/** Relative sensitivity S = d ln H / d ln p by central differences on the compiled float engine. */
function finiteDifference(circuit: Circuit, parameter: string, f: number, h: number): { re: number; im: number } {
  const e = compileAc(circuit, spec);
  const p0 = e.getValue(parameter);
  const at = (v: number) => {
    e.setValue(parameter, v);
    const t = e.transferAt(f);
    return { re: t[0], im: t[1] };
  };
  const hp = at(p0 * (1 + h));
  const hm = at(p0 * (1 - h));
  const h0 = at(p0);
  const dr = (hp.re - hm.re) / (2 * h);
  const di = (hp.im - hm.im) / (2 * h);
  const d = h0.re * h0.re + h0.im * h0.im;
  return { re: (dr * h0.re + di * h0.im) / d, im: (di * h0.re - dr * h0.im) / d };
}

/**
 * S by a central difference of the exact transfer functions at p (1 +- h), h rational: every step is
 * exact rational arithmetic (the circuit rebuilt with the perturbed exact value, H(j w) evaluated at a
 * rational w); only the O(h^2) truncation of the difference quotient remains.
 */
function exactCentralDifference(circuit: Circuit, element: string, value: Fraction, w: Fraction, h: Fraction): { re: number; im: number } {
  const hAt = (v: Fraction) => transferFunction(withValues(circuit, new Map([[element, v]])), spec).evaluateGaussian({ re: 0, im: w });
  const one = new Fraction(1);
  const hp = hAt(value.mul(one.add(h)));
  const hm = hAt(value.mul(one.sub(h)));
  const h0 = hAt(value);
  const two = h.mul(2);
  const dr = hp.re.sub(hm.re).div(two);
  const di = hp.im.sub(hm.im).div(two);
  const d = h0.re.mul(h0.re).add(h0.im.mul(h0.im));
  return { re: fractionToNumber(dr.mul(h0.re).add(di.mul(h0.im)).div(d)), im: fractionToNumber(di.mul(h0.re).sub(dr.mul(h0.im)).div(d)) };
}

describe('computeSensitivities', () => {
  it('matches the closed form of an RC lowpass: S_R = S_C = -j w RC / (1 + j w RC) (first-order circuit algebra, no source)', () => {
    const c = new Circuit().addVoltageSource('V', 'in', '0').addResistor('R1', 'in', 'out', 1000).addCapacitor('C1', 'out', '0', '1e-6');
    const f = [10, 159.15494309189535, 2000];
    const s = computeSensitivities(c, { input: 'V', output: 'out' }, f);
    expect(s.parameters.map((p) => p.name)).toEqual(['R1', 'C1']);
    f.forEach((fr, i) => {
      const x = 2 * Math.PI * fr * 1e-3;
      const d = 1 + x * x; // -j x (1 - j x) / (1 + x^2) = (-x^2 - j x) / (1 + x^2)
      for (const p of s.parameters) {
        expect(p.relativeRe[i]).toBeCloseTo(-(x * x) / d, 13);
        expect(p.relativeIm[i]).toBeCloseTo(-x / d, 13);
        expect(p.gainDbPerPercent[i]).toBeCloseTo(((20 / Math.LN10) * -(x * x) / d) * 0.01, 13);
        expect(p.phaseDegPerPercent[i]).toBeCloseTo(((180 / Math.PI) * -x / d) * 0.01, 12);
      }
    });
  });

  it('agrees with central finite differences of the compiled engine for every part and GBW of a GIC FDNR lowpass', () => {
    const c = gicFdnrLowpass(SINGLE_POLE);
    const freqs = [100, 800, 1000, 1300, 5000];
    const s = computeSensitivities(c, spec, freqs);
    expect(s.parameters.map((p) => p.name)).toContain('G1_UA.gainBandwidth');
    for (const p of s.parameters) {
      freqs.forEach((f, i) => {
        // h = 1e-5: truncation ~ h^2 = 1e-10, rounding ~ eps / h = 2e-11, relative to |S| (floor 1e-6 for tiny S)
        const fd = finiteDifference(c, p.parameter, f, 1e-5);
        const scale = Math.max(Math.hypot(fd.re, fd.im), 1e-3);
        expect(Math.abs(p.relativeRe[i] - fd.re) / scale, `${p.name} @ ${f} Hz re`).toBeLessThan(1e-6);
        expect(Math.abs(p.relativeIm[i] - fd.im) / scale, `${p.name} @ ${f} Hz im`).toBeLessThan(1e-6);
      });
    }
  });

  it('agrees with exact rational central differences of the transfer function (GIC inductor bandpass)', () => {
    const c = gicInductorBandpass(SINGLE_POLE);
    const f = 9000;
    const w = new Fraction(2 * Math.PI * f); // the double taken exactly; the float side uses the same double
    const s = computeSensitivities(c, spec, [f], { parameters: ['G1_R1', 'G1_R2', 'G1_C4', 'CP', 'RS'] });
    for (const p of s.parameters) {
      const value = (c.element(p.name) as { ohms?: Fraction; farads?: Fraction }).ohms ?? (c.element(p.name) as { farads: Fraction }).farads;
      // h = 1e-7 exactly: the truncation of the central quotient is O(h^2) = 1e-14 relative
      const ex = exactCentralDifference(c, p.name, value, w, new Fraction(1, 10_000_000));
      const scale = Math.hypot(ex.re, ex.im);
      expect(Math.abs(p.relativeRe[0] - ex.re) / scale, p.name).toBeLessThan(1e-9);
      expect(Math.abs(p.relativeIm[0] - ex.im) / scale, p.name).toBeLessThan(1e-9);
    }
  });

  it('handles a node input with the circuit own source (ratio V(out)/V(in)) like the direct transfer', () => {
    const base = gicInductorBandpass(SINGLE_POLE);
    const json = circuitToJson(base);
    const driven = circuitFromJson({ elements: [{ kind: 'V', name: 'VS', nodes: ['src', '0'], value: '1/1' }, { kind: 'R', name: 'RSRC', nodes: ['src', 'in'], value: '50/1' }, ...json.elements] });
    const a = computeSensitivities(base, spec, [5000, 10_000], { parameters: ['G1_R3', 'CP'] });
    const b = computeSensitivities(driven, spec, [5000, 10_000], { parameters: ['G1_R3', 'CP'] });
    // V(out)/V(in) does not depend on what drives 'in'
    for (let k = 0; k < 2; k++) {
      for (let i = 0; i < 2; i++) {
        expect(b.parameters[k].relativeRe[i]).toBeCloseTo(a.parameters[k].relativeRe[i], 9);
        expect(b.parameters[k].relativeIm[i]).toBeCloseTo(a.parameters[k].relativeIm[i], 9);
      }
      expect(b.gainDb[k]).toBeCloseTo(a.gainDb[k], 10);
    }
  });

  it('sums to the scaling laws: impedance scaling (R up, C down) leaves H unchanged, so sum S_R - sum S_C = 0 (ideal op-amps)', () => {
    const c = gicFdnrLowpass({ model: 'ideal' });
    const s = computeSensitivities(c, spec, [300, 1000, 3000]);
    for (let i = 0; i < 3; i++) {
      let re = 0;
      let im = 0;
      for (const p of s.parameters) {
        const sign = c.element(p.name)!.kind === 'R' ? 1 : -1;
        re += sign * p.relativeRe[i];
        im += sign * p.relativeIm[i];
      }
      expect(Math.abs(re)).toBeLessThan(1e-9);
      expect(Math.abs(im)).toBeLessThan(1e-9);
    }
  });

  it('rejects unknown and unsuitable parameters and bad frequencies', () => {
    const c = gicFdnrLowpass({ model: 'ideal' });
    const codes = invalidCode;
    expect(codes(() => computeSensitivities(c, spec, [1], { parameters: ['nope'] }))).toBe('INVALID_ARGUMENT');
    expect(codes(() => computeSensitivities(c, spec, [1], { parameters: ['G1_UA'] }))).toBe('INVALID_ARGUMENT'); // ideal: no GBW
    expect(codes(() => computeSensitivities(c, spec, []))).toBe('INVALID_ARGUMENT');
    expect(codes(() => computeSensitivities(c, spec, [NaN]))).toBe('INVALID_NUMBER');
    expect(codes(() => computeSensitivities(c, spec, [-1]))).toBe('OUT_OF_RANGE');
  });
});
