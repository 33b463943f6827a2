/**
 * estimateOrder against scipy.signal.buttord / cheb1ord / cheb2ord / ellipord with analog=True on the
 * seeded masks of test/fixtures/scipy/order.json (scripts/fixtures/approximation.py; masks within a small
 * change of the attenuation of the next order are left out there, see `robust`). Bessel has no scipy
 * counterpart: its estimate is checked by evaluating the response on the mask's own frequency axis.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cAbs, cDiv, cMul, cSub, type Complex } from '../../src/algebra/complex.js';
import {
  estimateOrder,
  lowpassPrototype,
  type FilterType,
  type OrderMask,
} from '../../src/approximation/index.js';
import fixture from '../fixtures/scipy/order.json';

interface FixtureMask {
  type: FilterType;
  passbandEdgeHz: number | [number, number];
  stopbandEdgeHz: number | [number, number];
  passbandRippleDb: number;
  stopbandAttenuationDb: number;
  orders: Record<'butterworth' | 'chebyshev' | 'inverse-chebyshev' | 'elliptic', number>;
}

const masks = fixture.masks as FixtureMask[];
const families = ['butterworth', 'chebyshev', 'inverse-chebyshev', 'elliptic'] as const;

describe(`estimateOrder matches scipy ${fixture.versions.scipy} (analog=True)`, () => {
  it('has at least 30 masks of each type', () => {
    for (const type of ['lowpass', 'highpass', 'bandpass', 'bandstop']) {
      expect(masks.filter((m) => m.type === type).length).toBeGreaterThanOrEqual(30);
    }
  });

  for (const family of families) {
    it.each(masks.map((m, i) => [`${m.type} #${i}`, m] as const))(`${family} %s`, (_name, m) => {
      const { orders, ...mask } = m;
      const estimate = estimateOrder({ ...mask, family });
      expect(estimate.order, JSON.stringify(mask)).toBe(orders[family]);
      expect(estimate.attenuationMarginDb).toBeGreaterThanOrEqual(-1e-9);
      expect(estimate.selectivity).toBeGreaterThan(1);
    });
  }
});

// ---- Bessel: evaluate the designed response on the real frequency axis of the mask ----

/** H(s) = k prod(s - z)/prod(s - p) of a lowpass prototype. */
function evaluate(zpk: { readonly zeros: readonly Complex[]; readonly poles: readonly Complex[]; readonly gain: number }, s: Complex): number {
  let h: Complex = { re: zpk.gain, im: 0 };
  for (const z of zpk.zeros) h = cMul(h, cSub(s, z));
  for (const p of zpk.poles) h = cDiv(h, cSub(s, p));
  return cAbs(h);
}

/** The prototype frequency (rad/s) an actual frequency maps to, given the passband edges used. */
function prototypeFrequency(type: FilterType, passband: number | [number, number], f: number): number {
  if (type === 'lowpass') return f / (passband as number);
  if (type === 'highpass') return (passband as number) / f;
  const [p0, p1] = passband as [number, number];
  const x = Math.abs((f * f - p0 * p1) / ((p1 - p0) * f));
  return type === 'bandpass' ? x : 1 / x;
}

/** Loss in dB of the order-N Bessel (magnitude normalised, rescaled so its loss at 1 rad/s is `rippleDb`). */
function besselLoss(order: number, rippleDb: number, omega: number): number {
  const zpk = lowpassPrototype({ family: 'bessel', order, normalization: 'magnitude' });
  const loss = (w: number) => -20 * Math.log10(evaluate(zpk, { re: 0, im: w }));
  let lo = 0; // bisection for the frequency where the loss is rippleDb (the magnitude is monotone)
  let hi = 1;
  while (loss(hi) < rippleDb) hi *= 2;
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (loss(mid) < rippleDb) lo = mid;
    else hi = mid;
  }
  return loss(omega * lo);
}

function meetsMask(mask: OrderMask, order: number, passbandUsed: number | [number, number]): boolean {
  const stops = typeof mask.stopbandEdgeHz === 'number' ? [mask.stopbandEdgeHz] : [...mask.stopbandEdgeHz];
  const passes = typeof mask.passbandEdgeHz === 'number' ? [mask.passbandEdgeHz] : [...mask.passbandEdgeHz];
  const tolDb = 1e-9;
  const stopOk = stops.every(
    (f) => besselLoss(order, mask.passbandRippleDb, prototypeFrequency(mask.type, passbandUsed, f)) >= mask.stopbandAttenuationDb - tolDb,
  );
  const passOk = passes.every(
    (f) => besselLoss(order, mask.passbandRippleDb, prototypeFrequency(mask.type, passbandUsed, f)) <= mask.passbandRippleDb + tolDb,
  );
  return stopOk && passOk;
}

/** Checks a Bessel estimate; returns false when the mask needs more than order 15. */
function checkBessel(mask: OrderMask): boolean {
  let estimate;
  try {
    estimate = estimateOrder(mask);
  } catch (e) {
    expect((e as { code?: string }).code).toBe('UNREALIZABLE'); // above order 15
    const used = mask.type === 'bandstop' ? estimateOrder({ ...mask, family: 'butterworth' }).passbandEdgeHz : mask.passbandEdgeHz;
    expect(meetsMask(mask, 15, used as number | [number, number])).toBe(false);
    return false;
  }
  expect(estimate.continuousOrder).toBeUndefined();
  expect(meetsMask(mask, estimate.order, estimate.passbandEdgeHz)).toBe(true);
  if (estimate.order > 1) expect(meetsMask(mask, estimate.order - 1, estimate.passbandEdgeHz)).toBe(false);
  return true;
}

describe('Bessel order estimate: the smallest order whose response meets the mask', () => {
  const besselMasks = masks.filter((_m, i) => i % 3 === 0);
  it.each(besselMasks.map((m, i) => [`${m.type} #${i}`, m] as const))('fixture mask %s', (_name, m) => {
    const { orders: _orders, ...rest } = m;
    checkBessel({ ...rest, family: 'bessel' });
  });

  it('holds on random masks with Bessel-sized transition bands', () => {
    let realizable = 0;
    const mask = fc.record({
      type: fc.constantFrom<FilterType>('lowpass', 'highpass', 'bandpass', 'bandstop'),
      rippleDb: fc.double({ min: 0.5, max: 3, noNaN: true }),
      attenuationDb: fc.double({ min: 10, max: 40, noNaN: true }),
      width: fc.double({ min: 1.1, max: 2, noNaN: true }),
      ratio: fc.double({ min: 2, max: 12, noNaN: true }),
    });
    fc.assert(
      fc.property(mask, ({ type, rippleDb, attenuationDb, width, ratio }) => {
        const centre = 1000;
        const edges: Pick<OrderMask, 'passbandEdgeHz' | 'stopbandEdgeHz'> =
          type === 'lowpass' ? { passbandEdgeHz: centre, stopbandEdgeHz: centre * ratio }
          : type === 'highpass' ? { passbandEdgeHz: centre, stopbandEdgeHz: centre / ratio }
          : type === 'bandpass' ? { passbandEdgeHz: [centre / width, centre * width], stopbandEdgeHz: [centre / width / ratio, centre * width * ratio] }
          : { passbandEdgeHz: [centre / width / ratio, centre * width * ratio], stopbandEdgeHz: [centre / width, centre * width] };
        if (checkBessel({ type, family: 'bessel', passbandRippleDb: rippleDb, stopbandAttenuationDb: attenuationDb, ...edges })) realizable++;
      }),
      { numRuns: 60 },
    );
    expect(realizable).toBeGreaterThan(20);
  });
});

describe('estimateOrder details', () => {
  it('runs the @example of estimateOrder and lowpassPrototype', () => {
    expect(estimateOrder({ type: 'lowpass', family: 'butterworth', passbandEdgeHz: 1000, stopbandEdgeHz: 2000,
      passbandRippleDb: 3, stopbandAttenuationDb: 40 }).order).toBe(7);
    const { poles, gain } = lowpassPrototype({ family: 'butterworth', order: 2 });
    expect(poles.map((p) => [p.re, p.im])).toEqual([[-Math.SQRT1_2, -Math.SQRT1_2], [-Math.SQRT1_2, Math.SQRT1_2]].map(([a, b]) => [expect.closeTo(a, 15), expect.closeTo(b, 15)]));
    expect(gain).toBe(1);
  });

  it('raises an elliptic estimate of 1 to the lowest elliptic order, 2', () => {
    // A loose mask: scipy.signal.ellipord(1, 10, 3, 10, analog=True) gives 1.
    const e = estimateOrder({ type: 'lowpass', family: 'elliptic', passbandEdgeHz: 1, stopbandEdgeHz: 10,
      passbandRippleDb: 3, stopbandAttenuationDb: 10 });
    expect(e.order).toBe(2);
    expect(e.continuousOrder).toBeLessThan(1);
  });

  it('widens a bandstop passband only towards the stopband', () => {
    const mask: OrderMask = { type: 'bandstop', family: 'butterworth', passbandEdgeHz: [100, 1000],
      stopbandEdgeHz: [200, 300], passbandRippleDb: 1, stopbandAttenuationDb: 40 };
    const e = estimateOrder(mask);
    const [p0, p1] = e.passbandEdgeHz as [number, number];
    expect(p0).toBeGreaterThanOrEqual(100);
    expect(p0).toBeLessThan(200);
    expect(p1).toBeLessThanOrEqual(1000);
    expect(p1).toBeGreaterThan(300);
  });

  it('gives the same order for a lowpass and the highpass with reciprocal edges', () => {
    for (const family of ['butterworth', 'chebyshev', 'inverse-chebyshev', 'elliptic', 'bessel'] as const) {
      const lp = estimateOrder({ type: 'lowpass', family, passbandEdgeHz: 1000, stopbandEdgeHz: 8000,
        passbandRippleDb: 3, stopbandAttenuationDb: 35 });
      const hp = estimateOrder({ type: 'highpass', family, passbandEdgeHz: 1 / 1000, stopbandEdgeHz: 1 / 8000,
        passbandRippleDb: 3, stopbandAttenuationDb: 35 });
      expect(hp.order).toBe(lp.order);
    }
  });
});
