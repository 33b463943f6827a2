/**
 * Second-order sections and the bilinear transform against scipy.signal (test/fixtures/scipy/
 * digital-sections.json, made by scripts/fixtures/digital_sections.py with bilinear_zpk, zpk2sos,
 * lp2lp_zpk and lp2hp_zpk), plus laws that need no reference: the prewarp frequency maps exactly, DC is
 * kept, the cascade equals the zpk form, and typed errors for bad input.
 */
import { describe, expect, it } from 'vitest';
import fixture from '../fixtures/scipy/digital-sections.json';
import { bilinearZpk, prewarpScale } from '../../src/export/bilinear';
import { analogSectionsOfRational, zpkToAnalogSections, zpkToDigitalSections, type DigitalSection } from '../../src/export/sos';
import { RationalFunction } from '../../src/algebra/rational-function';
import type { AnalogSection } from '../../src/analysis/factored-response';
import { cDiv, cMul, type Complex } from '../../src/algebra/complex';
import { evaluateZpk } from '../../src/approximation/zpk';
import { lowpassPrototype } from '../../src/approximation/prototype';
import { expectInvalidInput } from './helpers/expect-error';

const EPS = Number.EPSILON;
/**
 * Our complex divisions and sums may differ from numpy's by a few ulps per root, and a coefficient
 * combines two roots and the gain: 64 eps times the largest coefficient of the same polynomial.
 */
const COEFF_TOL_EPS = 64;
/** Digital roots are O(1); the map (2 fs + r)/(2 fs - r) loses a few ulps: 16 eps absolute. */
const ROOT_TOL = 16 * EPS;

const toComplex = (pairs: number[][]): Complex[] => pairs.map(([re, im]) => ({ re, im }));
const zpkOf = (f: { zeros: number[][]; poles: number[][]; gain: number }) => ({ zeros: toComplex(f.zeros), poles: toComplex(f.poles), gain: f.gain });
const sortRoots = (r: Complex[]) => [...r].sort((a, b) => a.re - b.re || a.im - b.im);

function expectPolyClose(got: number[], expected: number[], what: string): void {
  const scale = Math.max(...expected.map(Math.abs));
  const tol = COEFF_TOL_EPS * EPS * scale;
  got.forEach((g, i) => {
    const diff = Math.abs(g - expected[i]);
    if (!(diff <= tol)) throw new Error(`${what}[${i}]: got ${g}, expected ${expected[i]}, diff ${diff}, tol ${tol}`);
  });
}

describe('against scipy.signal', () => {
  for (const c of fixture.cases) {
    it(c.name, () => {
      const analog = zpkOf(c.analog);
      // analog sections: scipy rows are [b0 b1 b2 a0 a1 a2], highest power of s first
      const as = zpkToAnalogSections(analog);
      expect(as.length).toBe(c.analogSos.length);
      as.forEach((s, i) => {
        const row = c.analogSos[i];
        expectPolyClose([s.n2, s.n1, s.n0], row.slice(0, 3), `analog section ${i} numerator`);
        expectPolyClose([s.d2, s.d1, s.d0], row.slice(3, 6), `analog section ${i} denominator`);
      });
      const dz = bilinearZpk(analog, c.sampleRateHz, c.prewarpHz === null ? {} : { prewarpHz: c.prewarpHz });
      const want = zpkOf(c.digital);
      expect(dz.zeros.length).toBe(want.zeros.length);
      expect(dz.poles.length).toBe(want.poles.length);
      for (const [got, exp] of [[dz.zeros, want.zeros], [dz.poles, want.poles]] as const) {
        const g = sortRoots(got);
        sortRoots(exp).forEach((e, i) => {
          expect(Math.abs(g[i].re - e.re)).toBeLessThanOrEqual(ROOT_TOL);
          expect(Math.abs(g[i].im - e.im)).toBeLessThanOrEqual(ROOT_TOL);
        });
      }
      expect(Math.abs(dz.gain - want.gain)).toBeLessThanOrEqual(COEFF_TOL_EPS * EPS * Math.abs(want.gain));
      const ds = zpkToDigitalSections(dz);
      expect(ds.length).toBe(c.digitalSos.length);
      ds.forEach((s, i) => {
        const row = c.digitalSos[i];
        expect(row[3]).toBe(1);
        expectPolyClose([s.b0, s.b1, s.b2], row.slice(0, 3), `digital section ${i} numerator`);
        expectPolyClose([1, s.a1, s.a2], row.slice(3, 6), `digital section ${i} denominator`);
      });
    });
  }
});

function analogCascade(sections: AnalogSection[], s: Complex): Complex {
  let h: Complex = { re: 1, im: 0 };
  for (const q of sections) {
    const s2 = cMul(s, s);
    const n = { re: q.n0 + q.n1 * s.re + q.n2 * s2.re, im: q.n1 * s.im + q.n2 * s2.im };
    const d = { re: q.d0 + q.d1 * s.re + q.d2 * s2.re, im: q.d1 * s.im + q.d2 * s2.im };
    h = cMul(h, cDiv(n, d));
  }
  return h;
}

function digitalCascade(sections: DigitalSection[], omegaT: number): Complex {
  const z1 = { re: Math.cos(omegaT), im: -Math.sin(omegaT) }; // z^-1 on the unit circle
  const z2 = cMul(z1, z1);
  let h: Complex = { re: 1, im: 0 };
  for (const q of sections) {
    const n = { re: q.b0 + q.b1 * z1.re + q.b2 * z2.re, im: q.b1 * z1.im + q.b2 * z2.im };
    const d = { re: 1 + q.a1 * z1.re + q.a2 * z2.re, im: q.a1 * z1.im + q.a2 * z2.im };
    h = cMul(h, cDiv(n, d));
  }
  return h;
}

const scaleZpk = (p: { readonly zeros: readonly Complex[]; readonly poles: readonly Complex[]; readonly gain: number }, w: number) => ({
  zeros: p.zeros.map((z) => ({ re: z.re * w, im: z.im * w })),
  poles: p.poles.map((z) => ({ re: z.re * w, im: z.im * w })),
  gain: p.gain * w ** (p.poles.length - p.zeros.length),
});

describe('laws (no reference needed)', () => {
  const families = [
    lowpassPrototype({ family: 'elliptic', order: 5, passbandRippleDb: 0.2, stopbandAttenuationDb: 55 }),
    lowpassPrototype({ family: 'chebyshev', order: 6, passbandRippleDb: 1 }),
    lowpassPrototype({ family: 'bessel', order: 4, normalization: 'magnitude' }),
  ];
  const wc = 2 * Math.PI * 3000;

  it('analog sections multiply back to H(s) of the zpk form', () => {
    for (const proto of families) {
      const zpk = scaleZpk(proto, wc);
      for (const f of [10, 1000, 3000, 7000, 50000]) {
        const s = { re: 0, im: 2 * Math.PI * f };
        const want = evaluateZpk(zpk, s);
        for (const gain of ['first', 'spread'] as const) {
          const got = analogCascade(zpkToAnalogSections(zpk, { gain }), s);
          // each section is a few roundings; relative 1e-12 leaves room for the poles near the j w axis
          expect(Math.hypot(got.re - want.re, got.im - want.im)).toBeLessThanOrEqual(1e-12 * Math.hypot(want.re, want.im));
        }
      }
    }
  });

  it('sections of an exact H(s) multiply back to it (analysis float boundary, then pairing)', () => {
    // H(s) = 2 (s^2 + 4) / ((s + 3)(s^2 + s/2 + 1)): a notch pair, a real pole and a Q = 2 pair
    const h = RationalFunction.fromCoefficients([8, 0, 2], [3, 2.5, 3.5, 1]);
    const sections = analogSectionsOfRational(h);
    expect(sections).toHaveLength(2);
    expect(sections[1].d1).toBeCloseTo(0.5, 14); // the high-Q pair is last
    for (const w of [0.1, 1, 2, 2.5, 10]) {
      const want = h.evaluateComplex({ re: 0, im: w });
      const got = analogCascade(sections, { re: 0, im: w });
      // Aberth roots of a cubic are accurate to a few ulps; 1e-13 relative (absolute near the zero at w = 2)
      expect(Math.hypot(got.re - want.re, got.im - want.im)).toBeLessThanOrEqual(1e-13 * Math.max(1, Math.hypot(want.re, want.im)));
    }
  });

  it('prewarping makes the digital response equal the analog one at the prewarp frequency; DC is kept', () => {
    for (const proto of families) {
      const zpk = scaleZpk(proto, wc);
      for (const [fs, fp] of [[8000, 3000], [48000, 3000], [44100, 10000]]) {
        const sections = zpkToDigitalSections(bilinearZpk(zpk, fs, { prewarpHz: fp }));
        const analog = evaluateZpk(zpk, { re: 0, im: 2 * Math.PI * fp });
        const digital = digitalCascade(sections, (2 * Math.PI * fp) / fs);
        // tan near Nyquist amplifies rounding: 1e-9 relative is still far below any audible/measurable error
        expect(Math.hypot(digital.re - analog.re, digital.im - analog.im)).toBeLessThanOrEqual(1e-9 * Math.hypot(analog.re, analog.im));
        const dc = digitalCascade(sections, 0);
        const dcA = evaluateZpk(zpk, { re: 0, im: 0 });
        expect(Math.abs(dc.re - dcA.re)).toBeLessThanOrEqual(1e-12 * Math.abs(dcA.re));
        // without prewarp the same frequency is off (the law would not be tested otherwise)
        const plain = digitalCascade(zpkToDigitalSections(bilinearZpk(zpk, fs)), (2 * Math.PI * fp) / fs);
        expect(Math.hypot(plain.re - analog.re, plain.im - analog.im)).toBeGreaterThan(1e-3 * Math.hypot(analog.re, analog.im));
      }
    }
  });

  it('the highest-Q section is last and the gain sits in the first', () => {
    const zpk = scaleZpk(families[1], wc);
    const a = zpkToAnalogSections(zpk);
    const q = a.map((s) => Math.sqrt(s.d0) / s.d1);
    expect([...q].sort((x, y) => x - y)).toEqual(q);
    expect(a[0].n0).toBeCloseTo(zpk.gain, 0);
    const d = zpkToDigitalSections(bilinearZpk(zpk, 48000));
    const r = d.map((s) => Math.sqrt(s.a2)); // pole radius of a complex pair
    expect([...r].sort((x, y) => x - y)).toEqual(r);
  });

  it('a digital filter with an odd number of roots pads one section with roots at the origin', () => {
    const zpk = scaleZpk(lowpassPrototype({ family: 'butterworth', order: 3 }), wc);
    const d = zpkToDigitalSections(bilinearZpk(zpk, 48000));
    expect(d).toHaveLength(2);
    // the real pole with the origin pole, the complex pair with the last -1 and the origin zero (as scipy)
    expect(d[0].a2).toBe(0);
    expect(d[1].b2).toBe(0); // +0, never -0
    expect(d[0].b2).toBeGreaterThan(0);
  });

  it('a real pole picked first, with only complex zeros left, gets no zeros: every section stays proper', () => {
    // the real pole -0.1 is closest to the j w axis, so it is taken first; the zeros +-2j go with the pair
    const zpk = { zeros: [{ re: 0, im: -2 }, { re: 0, im: 2 }], poles: [{ re: -0.5, im: -1 }, { re: -0.5, im: 1 }, { re: -0.1, im: 0 }], gain: 3 };
    const sections = zpkToAnalogSections(zpk);
    expect(sections).toHaveLength(2);
    expect(sections[1]).toEqual({ n0: 1, n1: 0, n2: 0, d0: 0.1, d1: 1, d2: 0 });
    expect(sections[0]).toEqual({ n0: 12, n1: 0, n2: 3, d0: 1.25, d1: 1, d2: 1 });
    for (const w of [0.3, 1, 5]) {
      const s = { re: 0, im: w };
      const want = evaluateZpk(zpk, s);
      const got = analogCascade(sections, s);
      expect(Math.hypot(got.re - want.re, got.im - want.im)).toBeLessThanOrEqual(1e-14 * Math.hypot(want.re, want.im));
    }
  });

  it('a constant gives one trivial section', () => {
    expect(zpkToAnalogSections({ zeros: [], poles: [], gain: 2 })).toEqual([{ n0: 2, n1: 0, n2: 0, d0: 1, d1: 0, d2: 0 }]);
    expect(zpkToDigitalSections({ zeros: [], poles: [], gain: 2 })).toEqual([{ b0: 2, b1: 0, b2: 0, a1: 0, a2: 0 }]);
  });
});

describe('bad input', () => {
  const lp = { zeros: [], poles: [{ re: -1, im: 0 }], gain: 1 };
  const cases: [string, () => unknown, string, string][] = [
    ['sample rate zero', () => bilinearZpk(lp, 0), 'OUT_OF_RANGE', 'sampleRateHz'],
    ['sample rate NaN', () => bilinearZpk(lp, NaN), 'INVALID_NUMBER', 'sampleRateHz'],
    ['prewarp at Nyquist', () => bilinearZpk(lp, 1000, { prewarpHz: 500 }), 'OUT_OF_RANGE', 'prewarpHz'],
    ['prewarp negative', () => prewarpScale(1000, -1), 'OUT_OF_RANGE', 'prewarpHz'],
    ['improper H', () => bilinearZpk({ zeros: [{ re: 0, im: 0 }, { re: 1, im: 0 }], poles: [{ re: -1, im: 0 }], gain: 1 }, 1000), 'OUT_OF_RANGE', 'analog.zeros'],
    ['improper analog sections', () => zpkToAnalogSections({ zeros: [{ re: 0, im: 0 }], poles: [], gain: 1 }), 'OUT_OF_RANGE', 'zpk.zeros'],
    ['unpaired complex pole', () => zpkToAnalogSections({ zeros: [], poles: [{ re: -1, im: 1 }], gain: 1 }), 'INVALID_ARGUMENT', 'zpk.poles'],
    ['mismatched conjugates', () => zpkToDigitalSections({ zeros: [], poles: [{ re: 0.5, im: 0.1 }, { re: 0.4, im: -0.1 }], gain: 1 }), 'INVALID_ARGUMENT', 'zpk.poles'],
    ['NaN root', () => zpkToDigitalSections({ zeros: [{ re: NaN, im: 0 }], poles: [], gain: 1 }), 'INVALID_NUMBER', 'zpk.zeros[0].re'],
    ['Infinite gain', () => zpkToAnalogSections({ zeros: [], poles: [], gain: Infinity }), 'INVALID_NUMBER', 'zpk.gain'],
    ['not a zpk', () => zpkToAnalogSections(null as never), 'INVALID_ARGUMENT', 'zpk'],
  ];
  for (const [name, run, code, path] of cases) {
    it(name, () => expectInvalidInput(run, code, path));
  }
});
