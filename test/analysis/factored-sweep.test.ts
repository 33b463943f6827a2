/**
 * The factored sweep kernels (analysis/factored-sweep.ts): the generated kernel equals the interpreted
 * one bit for bit; gain and phase follow the exact H (phase modulo 360 degrees, continuous), on dense
 * and coarse grids, in any frequency order; zeros and poles on the j w axis and extreme frequencies.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fractionFromDouble, fractionToNumber, Poly, RationalFunction } from '../../src/algebra/index';
import { toFloatTransferFunction } from '../../src/analysis/index';
import { interpretedSweepKernel, sweepKernelFor, type SweepFactors } from '../../src/analysis/factored-sweep';

function exactAt(h: RationalFunction, omega: number): { re: number; im: number } {
  const v = h.evaluateGaussian({ re: 0, im: fractionFromDouble(omega) });
  return { re: fractionToNumber(v.re), im: fractionToNumber(v.im) };
}

/** Distance of two angles in degrees modulo 360. */
function angleGap(a: number, b: number): number {
  const d = (((a - b) % 360) + 360) % 360;
  return Math.min(d, 360 - d);
}

function run(k: ReturnType<typeof sweepKernelFor>, f: ArrayLike<number>, withDelay = true) {
  const fr = Float64Array.from(f);
  const out = { g: new Float64Array(fr.length), p: new Float64Array(fr.length), d: new Float64Array(fr.length) };
  k(fr, out.g, out.p, withDelay ? out.d : null);
  return out;
}

const same = (a: number, b: number) => a === b || (Number.isNaN(a) && Number.isNaN(b));

/** A coefficient from [min, max]; magnitudes below 1e-6 become 0 (no subnormal coefficients). */
const coef = (min: number, max: number) => fc.double({ min, max, noNaN: true }).map((x) => (Math.abs(x) < 1e-6 ? 0 : x));

/** Random factors: stable denominators (c0, c1, c2 > 0), numerators of any sign, some real (j w-axis zeros). */
const factorsArb = fc
  .record({
    gain: fc.double({ min: -10, max: 10, noNaN: true }).filter((g) => Math.abs(g) > 1e-3),
    real: fc.array(fc.tuple(coef(0.1, 10), coef(0.01, 1)), { maxLength: 2 }),
    cplx: fc.array(fc.tuple(coef(-5, 5), coef(-3, 3), coef(0, 2)), { maxLength: 4 }),
    den: fc.array(fc.tuple(coef(0.1, 10), coef(0.01, 5), coef(0, 2)), { minLength: 1, maxLength: 6 }),
  })
  .map(
    (r): SweepFactors => ({
      gain: r.gain,
      realNumerator: Float64Array.from(r.real.flat()),
      complexNumerator: Float64Array.from(r.cplx.flat()),
      denominator: Float64Array.from(r.den.flat()),
    }),
  );

/** The factors' H(j w) directly, one complex division per factor (a plain reference, no shared code). */
function directH(f: SweepFactors, w: number): { re: number; im: number } {
  let re = f.gain;
  let im = 0;
  const mul = (x: number, y: number) => ([re, im] = [re * x - im * y, re * y + im * x]);
  for (let o = 0; o < f.realNumerator.length; o += 2) mul(f.realNumerator[o] - f.realNumerator[o + 1] * w * w, 0);
  for (let o = 0; o < f.complexNumerator.length; o += 3) mul(f.complexNumerator[o] - f.complexNumerator[o + 2] * w * w, f.complexNumerator[o + 1] * w);
  for (let o = 0; o < f.denominator.length; o += 3) {
    const x = f.denominator[o] - f.denominator[o + 2] * w * w;
    const y = f.denominator[o + 1] * w;
    const d = x * x + y * y;
    mul(x / d, -y / d);
  }
  return { re, im };
}

describe('factored sweep kernels', () => {
  it('generated and interpreted kernels agree bit for bit (random factors, dense and coarse grids)', () => {
    fc.assert(
      fc.property(factorsArb, fc.integer({ min: 2, max: 400 }), fc.boolean(), (f, n, withDelay) => {
        const freqs = Array.from({ length: n }, (_, i) => 1e-3 * 10 ** ((5 * i) / (n - 1)));
        const a = run(sweepKernelFor(f), freqs, withDelay);
        const b = run(interpretedSweepKernel(f), freqs, withDelay);
        for (let i = 0; i < n; i++) {
          expect(same(a.g[i], b.g[i]) && same(a.p[i], b.p[i]) && same(a.d[i], b.d[i])).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('gain and phase follow H (phase modulo 360 within 1e-9 degree, steps below 180), in any frequency order', () => {
    fc.assert(
      fc.property(factorsArb, fc.integer({ min: 2, max: 300 }), fc.boolean(), (f, n, shuffle) => {
        let freqs = Array.from({ length: n }, (_, i) => 1e-3 * 10 ** ((5 * i) / (n - 1)));
        if (shuffle) freqs = freqs.map((x, i) => freqs[(i * 7919) % n] ?? x);
        const s = run(sweepKernelFor(f), freqs);
        for (let i = 0; i < n; i++) {
          const h = directH(f, 2 * Math.PI * freqs[i]);
          const mag = Math.hypot(h.re, h.im);
          if (!(mag > 1e-100 && mag < 1e100)) continue; // a factor at (or within rounding of) a zero
          // the direct product rounds once per factor: 1e-12 relative is about 1e-11 dB
          expect(Math.abs(s.g[i] - 20 * Math.log10(mag))).toBeLessThan(1e-9);
          expect(angleGap(s.p[i], (Math.atan2(h.im, h.re) * 180) / Math.PI)).toBeLessThan(1e-9);
          if (i > 0) expect(Math.abs(s.p[i] - s.p[i - 1])).toBeLessThanOrEqual(180 + 1e-9);
        }
        expect(s.p[0]).toBeGreaterThan(-180);
        expect(s.p[0]).toBeLessThanOrEqual(180);
      }),
      { numRuns: 200 },
    );
  });

  it('10,000 points: the summed phase steps stay within 1e-9 degree of the exact arg H (modulo 360)', () => {
    // a degree-8 all-pole H: the phase turns by -720 degrees over the sweep
    const den = [[1, 0.39, 1], [1, 1.11, 1], [1, 1.66, 1], [1, 1.96, 1]];
    let p = Poly.fromCoefficients([1]);
    for (const [c0, c1, c2] of den) p = p.mul(Poly.fromCoefficients([c0, c1, c2].map((c) => fractionFromDouble(c))));
    const h = RationalFunction.fromPolys(Poly.fromCoefficients([1]), p);
    const n = 10_000;
    const freqs = Array.from({ length: n }, (_, i) => 1e-3 * 10 ** ((4 * i) / (n - 1)));
    const s = toFloatTransferFunction(h).sweep(freqs);
    let worst = 0;
    for (let i = 0; i < n; i += 37) {
      const e = exactAt(h, 2 * Math.PI * freqs[i]);
      worst = Math.max(worst, angleGap(s.phaseDeg[i], (Math.atan2(e.im, e.re) * 180) / Math.PI));
    }
    expect(worst).toBeLessThan(1e-9);
    expect(s.phaseDeg[n - 1]).toBeLessThan(-700); // unwrapped past two turns
  });

  it('a zero on the j w axis at a grid point: gain -Infinity there, phase held, then a 180-degree step', () => {
    // H = (w0^2 - w^2) / (s^2 + s + 1) with w0^2 the kernel's own w^2 at 1 Hz: an exact zero there
    const w = 2 * Math.PI * 1;
    const f: SweepFactors = { gain: 1, realNumerator: Float64Array.of(w * w, 1), complexNumerator: new Float64Array(0), denominator: Float64Array.of(1, 1, 1) };
    const s = run(sweepKernelFor(f), [0.5, 0.9, 1, 1.1, 2]);
    expect(s.g[2]).toBe(-Infinity);
    expect(s.p[2]).toBe(s.p[1]);
    // from 0.9 to 1.1 Hz: the real factor changes sign (a 180-degree step) and the pole pair turns on by a few degrees
    const pole = (fHz: number) => Math.atan2(-2 * Math.PI * fHz, 1 - (2 * Math.PI * fHz) ** 2);
    const turn = ((pole(1.1) - pole(0.9)) * 180) / Math.PI;
    expect(Math.abs(Math.abs(s.p[3] - s.p[1] - turn) - 180)).toBeLessThan(1e-9);
  });

  it('a pole on the j w axis at a grid point: NaN phase there, the steps resume from the last finite point', () => {
    const f: SweepFactors = { gain: 1, realNumerator: new Float64Array(0), complexNumerator: new Float64Array(0), denominator: Float64Array.of(0, 1, 0) }; // 1/(j w)
    const s = run(sweepKernelFor(f), [1, 0, 2]);
    expect(s.p[0]).toBeCloseTo(-90, 12);
    expect(Number.isNaN(s.p[1])).toBe(true);
    expect(s.p[2]).toBeCloseTo(-90, 12);
  });

  it('extreme frequencies: products far beyond 1e154 still give the phase (the over- and underflow path)', () => {
    const f: SweepFactors = { gain: 1, realNumerator: new Float64Array(0), complexNumerator: new Float64Array(0), denominator: Float64Array.from({ length: 30 }, (_, i) => [1, 1.4, 1][i % 3]) }; // (s^2 + 1.4 s + 1)^10
    // 12 decades, 2,000 points: above about 8 MHz P_k conj(P_k-1) exceeds the double range
    const freqs = Array.from({ length: 2000 }, (_, i) => 1e-3 * 10 ** ((12 * i) / 1999));
    const s = run(sweepKernelFor(f), freqs);
    for (let i = 0; i < freqs.length; i += 13) {
      const w = 2 * Math.PI * freqs[i];
      const one = Math.atan2(-1.4 * w, 1 - w * w); // arg of 1/(1 - w^2 + 1.4 j w), in (-180, 0] degrees
      expect(Math.abs(s.p[i] - (10 * one * 180) / Math.PI)).toBeLessThan(1e-6); // unwrapped: equal, not only modulo 360
    }
    expect(s.p[1999]).toBeLessThan(-1799);
  });
});
