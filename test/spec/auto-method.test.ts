import { describe, expect, it } from 'vitest';
import { designFilter } from '../../src/spec/index';

const highpass = (family: string) =>
  designFilter({
    name: 'hp',
    response: { type: 'highpass', family, order: 5, passbandEdgeHz: 1000, passbandRippleDb: 0.5, stopbandAttenuationDb: 50 },
    parts: { opamp: { model: 'single-pole', gainBandwidthHz: 50e6 } },
  });

describe("realization.method 'auto'", () => {
  it('takes GIC embedding for a highpass with finite zeros, whose grounded-inductor form would have a node without a DC path, and designs it stable', () => {
    for (const family of ['elliptic', 'inverse-chebyshev']) {
      const d = highpass(family);
      expect(d.method).toBe('gic-embedding');
      expect(d.stability.stable).toBe(true);
      expect(d.stability.imaginaryAxis).toBe(0);
    }
  });

  it('keeps simulated inductors for an all-pole highpass', () => {
    const d = highpass('chebyshev');
    expect(d.method).toBe('simulated-inductor');
    expect(d.stability.stable).toBe(true);
  });
});
