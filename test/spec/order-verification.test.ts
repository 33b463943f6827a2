/**
 * Estimated orders are checked on the prototype the ladder really realises: an even-order elliptic
 * ladder with equal terminations realises a modified response whose stopband starts higher than the
 * prototype's the estimate was computed on, so a mask the estimate just meets would be missed.
 */
import { describe, expect, it } from 'vitest';
import { estimateOrder, gainDbAt } from '../../src/approximation/index';
import { designFilter } from '../../src/spec/index';
import { worstStopbandAttenuationDb } from '../../src/spec/pipeline-stages';

/** The stopband edge (Hz, passband edge 1 kHz) at which the elliptic estimate's continuous order is just below `order`. */
function edgeJustBelow(order: number, rippleDb: number, attenuationDb: number): number {
  let lo = 1001;
  let hi = 10_000;
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    const e = estimateOrder({ type: 'lowpass', family: 'elliptic', passbandEdgeHz: 1000, stopbandEdgeHz: mid, passbandRippleDb: rippleDb, stopbandAttenuationDb: attenuationDb });
    if (e.continuousOrder! > order - 0.01) lo = mid;
    else hi = mid;
  }
  return hi;
}

const mask = (stopbandEdgeHz: number, rippleDb: number, attenuationDb: number) => ({
  name: 'order-check',
  response: { type: 'lowpass', family: 'elliptic', passbandEdgeHz: 1000, stopbandEdgeHz, passbandRippleDb: rippleDb, stopbandAttenuationDb: attenuationDb },
  parts: { opamp: { model: 'ideal' } },
});

describe('estimated orders on the realised prototype', () => {
  it('an even elliptic estimate whose modified response misses the stopband is raised to the next order, which meets it', () => {
    for (const [order, ripple, att] of [[4, 0.5, 40], [6, 0.5, 60], [4, 0.1, 60]] as const) {
      const edge = edgeJustBelow(order, ripple, att);
      expect(estimateOrder({ type: 'lowpass', family: 'elliptic', passbandEdgeHz: 1000, stopbandEdgeHz: edge, passbandRippleDb: ripple, stopbandAttenuationDb: att }).order).toBe(order);
      const d = designFilter(mask(edge, ripple, att));
      expect(d.order.order).toBe(order + 1);
      expect(d.diagnostics.some((x) => x.code === 'ORDER_RAISED')).toBe(true);
      // the realised prototype of the design meets the mask at and above the stopband edge (prototype frequency = edge / passband edge)
      expect(worstStopbandAttenuationDb(d.ladder.realizedPrototype, edge / 1000)).toBeGreaterThanOrEqual(att - 1e-6);
      expect(d.diagnostics.some((x) => x.code === 'STOPBAND_NOT_MET')).toBe(false);
    }
  });

  it('an even elliptic estimate with room to spare keeps its order (the modified response meets the mask)', () => {
    // continuous order about 3.2: order 4's modified stopband edge is still below the mask's
    const edge = 1000 * 2.2;
    const e = estimateOrder({ type: 'lowpass', family: 'elliptic', passbandEdgeHz: 1000, stopbandEdgeHz: edge, passbandRippleDb: 0.5, stopbandAttenuationDb: 40 });
    expect(e.order).toBe(4);
    const d = designFilter(mask(edge, 0.5, 40));
    expect(d.order.order).toBe(4);
    expect(d.diagnostics.some((x) => x.code === 'ORDER_RAISED')).toBe(false);
    expect(worstStopbandAttenuationDb(d.ladder.realizedPrototype, 2.2)).toBeGreaterThanOrEqual(40 - 1e-6);
    // the note says where the modified stopband begins: below the mask's edge, above the unmodified prototype's
    const note = d.diagnostics.find((x) => x.code === 'ORDER_ESTIMATED')!.message;
    const pct = Number(/begins at ([0-9.]+) %/.exec(note)![1]);
    expect(pct).toBeLessThanOrEqual(100);
    expect(pct / 100).toBeGreaterThan(1.6285 / 2.2); // order 4, 0.5 dB, 40 dB: the unmodified prototype reaches 40 dB at 1.6285 rad/s (this project, by bisection): the modification moves it up
  });

  it('worstStopbandAttenuationDb: an elliptic prototype gives its equiripple minimum, a monotone one its value at the edge', () => {
    const d = designFilter({ ...mask(3000, 0.5, 40), response: { ...mask(3000, 0.5, 40).response, family: 'elliptic', order: 5, stopbandEdgeHz: undefined } });
    const p = d.ladder.realizedPrototype;
    // an order-5 elliptic prototype designed for 40 dB: the minima above its stopband edge are 40 dB (common practice, no source)
    expect(Math.abs(worstStopbandAttenuationDb(p, 3) - 40)).toBeLessThan(1e-6);
    const bw = designFilter({ name: 'bw', response: { type: 'lowpass', family: 'butterworth', order: 3, passbandEdgeHz: 1000 }, parts: { opamp: { model: 'ideal' } } });
    expect(worstStopbandAttenuationDb(bw.ladder.realizedPrototype, 2)).toBeCloseTo(-gainDbAt(bw.ladder.realizedPrototype, 2), 12);
  });
});
