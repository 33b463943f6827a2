/**
 * The factored float form of an exact transfer function against the exact function itself (evaluated
 * in exact Gaussian-rational arithmetic and rounded once): zeros/poles/gain of known factorisations,
 * the section products, the sweep's gain, unwrapped phase and exact-derivative group delay.
 */
import { describe, expect, it } from 'vitest';
import { fractionFromDouble, fractionToNumber, Poly, RationalFunction } from '../../src/algebra/index';
import { Circuit } from '../../src/netlist/index';
import { evaluateFactored, toFloatFactored, toFloatTransferFunction, transferFunction } from '../../src/analysis/index';
import { capacitor, gicSubcircuit, resistor } from './random-circuits';
import { InvalidInputError } from '../../src/errors';
import { expectThrows } from '../helpers/expect-error';

function exactAt(h: RationalFunction, omega: number): { re: number; im: number } {
  const v = h.evaluateGaussian({ re: 0, im: fractionFromDouble(omega) });
  return { re: fractionToNumber(v.re), im: fractionToNumber(v.im) };
}

/** A 5-section GIC-inductor LC ladder (degree 10 denominator, zeros at the origin). */
function ladder(): RationalFunction {
  const c = new Circuit().addVoltageSource('VIN', 'in', '0');
  let prev = 'in';
  for (let k = 1; k <= 5; k++) {
    const node = `s${k}`;
    c.addResistor(`RS${k}`, prev, node, '1/2').addCapacitor(`CP${k}`, node, '0', `${k}/3`);
    c.addSubcircuit(gicSubcircuit([resistor('1'), capacitor(`${k + 1}/5`), resistor('1'), resistor('1'), resistor('1')]), `X${k}`, { p: node });
    prev = node;
  }
  return transferFunction(c, { input: 'VIN', output: prev });
}

describe('toFloatTransferFunction', () => {
  it('2 (s + 1)/((s + 2)(s^2 + s + 4)): one real zero, a real pole and a conjugate pair, gain 2', () => {
    const h = RationalFunction.fromPolys(Poly.fromCoefficients([2, 2]), Poly.fromCoefficients([2, 1]).mul(Poly.fromCoefficients([4, 1, 1])));
    const f = toFloatTransferFunction(h);
    expect(f.gain).toBe(2);
    expect(f.zeros).toEqual([{ re: -1, im: 0 }]);
    expect(f.poles.length).toBe(3);
    const pair = f.poles.filter((p) => p.im !== 0);
    expect(pair.length).toBe(2);
    expect(pair[0].re).toBe(pair[1].re); // exactly conjugate
    expect(pair[0].im).toBe(-pair[1].im);
    // s^2 + s + 4: re = -1/2, im = sqrt(15)/2 (quadratic formula)
    expect(Math.abs(pair[0].re + 0.5)).toBeLessThan(1e-15);
    expect(Math.abs(Math.abs(pair[0].im) - Math.sqrt(15) / 2)).toBeLessThan(4e-16 * 2);
    for (const w of [0, 0.3, 1, 2, 7, 100]) {
      const e = exactAt(h, w);
      const g = f.evaluate({ re: 0, im: w });
      expect(Math.hypot(g.re - e.re, g.im - e.im)).toBeLessThan(1e-14 * Math.hypot(e.re, e.im)); // a few ulps
    }
  });

  it('a degree-10 ladder: the sweep follows the exact H (1e-10 dB, 1e-9 relative delay), phase unwrapped', () => {
    const h = ladder();
    expect(h.den.degree).toBe(10);
    const f = toFloatTransferFunction(h);
    expect(f.sections.length).toBe(5);
    const freqs = Array.from({ length: 100 }, (_, i) => 10 ** (-3 + (3 * i) / 99));
    const sw = f.sweep(freqs);
    const sw2 = f.sweep(freqs, { groupDelay: false });
    let prevPhase = sw.phaseDeg[0];
    for (let i = 0; i < freqs.length; i++) {
      const w = 2 * Math.PI * freqs[i];
      const e = exactAt(h, w);
      const mag = Math.hypot(e.re, e.im);
      // well-separated simple roots: the float roots carry ~1e-15 relative error; 1e-10 dB is about 1e-11 relative
      expect(Math.abs(sw.gainDb[i] - 20 * Math.log10(mag))).toBeLessThan(1e-10);
      const tau = h.groupDelayS(w); // the exact rational derivative, evaluated in floats
      expect(Math.abs(sw.groupDelayS[i] - tau)).toBeLessThan(1e-9 * Math.abs(tau) + 1e-12);
      // the phase is continuous and agrees with arg H modulo 360 degrees
      const d = ((sw.phaseDeg[i] - (Math.atan2(e.im, e.re) * 180) / Math.PI) % 360 + 360) % 360;
      expect(Math.min(d, 360 - d)).toBeLessThan(1e-8);
      expect(Math.abs(sw.phaseDeg[i] - prevPhase)).toBeLessThan(90);
      prevPhase = sw.phaseDeg[i];
      expect(sw2.gainDb[i]).toBe(sw.gainDb[i]);
      expect(Number.isNaN(sw2.groupDelayS[i])).toBe(true);
    }
    expect(sw.phaseDeg[freqs.length - 1] - sw.phaseDeg[0]).toBeLessThan(-360); // a degree-10 lowpass-ish ladder turns past one revolution
  });

  it('evaluateFactored equals evaluate, and the flat factors multiply back to H', () => {
    const h = ladder();
    const f = toFloatTransferFunction(h);
    const flat = toFloatFactored(h);
    expect(flat.gain).toBe(f.gain);
    expect(flat.poles.length).toBe(15); // five quadratic pole factors as [c0, c1, c2]
    const ws = [0.01, 0.1, 0.5, 1, 3];
    const re = new Float64Array(ws.length);
    const im = new Float64Array(ws.length);
    evaluateFactored(flat, ws, re, im);
    ws.forEach((w, i) => {
      const e = exactAt(h, w);
      const mag = Math.hypot(e.re, e.im);
      expect(Math.hypot(re[i] - e.re, im[i] - e.im)).toBeLessThan(1e-12 * mag);
      // gain * prod zeros / prod poles from the monic triples
      let nr = flat.gain;
      let ni = 0;
      for (let k = 0; k < flat.zeros.length; k += 3) {
        const x = flat.zeros[k] - flat.zeros[k + 2] * w * w;
        const y = flat.zeros[k + 1] * w;
        [nr, ni] = [nr * x - ni * y, nr * y + ni * x];
      }
      let dr = 1;
      let di = 0;
      for (let k = 0; k < flat.poles.length; k += 3) {
        const x = flat.poles[k] - flat.poles[k + 2] * w * w;
        const y = flat.poles[k + 1] * w;
        [dr, di] = [dr * x - di * y, dr * y + di * x];
      }
      const d2 = dr * dr + di * di;
      expect(Math.hypot((nr * dr + ni * di) / d2 - e.re, (ni * dr - nr * di) / d2 - e.im)).toBeLessThan(1e-12 * mag);
    });
  });

  it('sweepInto writes what sweep returns, bit for bit, into caller arrays; wrong arrays are refused by name', () => {
    const f = toFloatTransferFunction(ladder());
    const freqs = Float64Array.from({ length: 257 }, (_, i) => 10 ** (-3 + (3 * i) / 256));
    const ref = f.sweep(freqs);
    const g = new Float64Array(257);
    const p = new Float64Array(257);
    const d = new Float64Array(257);
    f.sweepInto(freqs, g, p, d);
    for (let i = 0; i < 257; i++) expect(Object.is(g[i], ref.gainDb[i]) && Object.is(p[i], ref.phaseDeg[i]) && Object.is(d[i], ref.groupDelayS[i])).toBe(true);
    const g2 = new Float64Array(257);
    f.sweepInto(freqs, g2, p);
    expect(Array.from(g2)).toEqual(Array.from(ref.gainDb));
    expectThrows(() => f.sweepInto(freqs, new Float64Array(3), p), InvalidInputError, 'INVALID_ARGUMENT', 'gainDb');
    expectThrows(() => f.sweepInto(freqs, g, p, new Float64Array(1)), InvalidInputError, 'INVALID_ARGUMENT', 'groupDelayS');
    expectThrows(() => f.sweepInto([1, 2] as unknown as Float64Array, g, p), InvalidInputError, 'INVALID_ARGUMENT', 'frequencyHz');
  });

  it('an improper H (more zeros than poles) and a polynomial: the zeros no pole pair takes get sections of their own', () => {
    const cases = [
      // (s + 1)(s + 2)(s^2 + s + 3) / (s + 5): four zeros, one pole
      RationalFunction.fromPolys(Poly.fromCoefficients([1, 1]).mul(Poly.fromCoefficients([2, 1])).mul(Poly.fromCoefficients([3, 1, 1])), Poly.fromCoefficients([5, 1])),
      // 2 (s^2 + 0.5 s + 4)(s - 3): a polynomial
      RationalFunction.fromPolys(Poly.fromCoefficients([4, '1/2', 1]).mul(Poly.fromCoefficients([-3, 1])).mul(Poly.fromCoefficients([2])), Poly.fromCoefficients([1])),
    ];
    for (const h of cases) {
      const f = toFloatTransferFunction(h);
      const ws = [0.01, 0.3, 1, 2, 7, 40];
      const sw = f.sweep(ws.map((w) => w / (2 * Math.PI)));
      ws.forEach((w, i) => {
        const e = exactAt(h, w);
        const mag = Math.hypot(e.re, e.im);
        const g = f.evaluate({ re: 0, im: w });
        expect(Math.hypot(g.re - e.re, g.im - e.im)).toBeLessThan(1e-13 * mag);
        expect(Math.abs(sw.gainDb[i] - 20 * Math.log10(mag))).toBeLessThan(1e-11);
      });
    }
  });

  it('a constant and the zero function', () => {
    const c = toFloatTransferFunction(RationalFunction.constant('-3/2'));
    expect(c.evaluate({ re: 0, im: 5 })).toEqual({ re: -1.5, im: 0 });
    expect(c.sweep([1]).phaseDeg[0]).toBeCloseTo(180, 12);
    const z = toFloatTransferFunction(RationalFunction.ZERO);
    expect(z.evaluate({ re: 0, im: 1 }).re).toBe(0);
  });
});
