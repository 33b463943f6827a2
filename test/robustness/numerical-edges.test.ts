/**
 * Numerical edge cases where results lose accuracy: the diagnostics must say so, with the measured
 * loss (the same number the evaluation reports).
 * - op-amp gain-bandwidth barely above the band (1.5 x the edge): GBW_TOO_LOW with the GBW needed and
 *   the passband error the op-amps cause;
 * - transmission zeros close to the passband edge (an elliptic mask with a 5 % transition band):
 *   STOPBAND_NOT_MET with the attenuation reached, when preferred values cost the margin;
 * - near-coincident poles (bandpass Q 1e4 to 1e9: the LP->BP map puts each pole pair within 1/(2Q) of
 *   the centre): ROUNDING_ERROR with the rounding loss when preferred values destroy the response, and
 *   PROTOTYPE_DEVIATION with the measured deviation when the exact circuit itself departs from the
 *   prototype (Q 1e9: the band edges differ in the 10th digit, beyond the 12 digits the design's
 *   frequencies are kept to).
 */
import { describe, expect, it } from 'vitest';
import { designFilter, type FilterDesign } from '../../src/spec/design-filter';

const diag = (d: FilterDesign, code: string) => d.diagnostics.find((x) => x.code === code);

describe('diagnostics of lost accuracy', () => {
  it('GBW 1.5 x the band edge: GBW_TOO_LOW names the GBW needed and the passband error it causes', () => {
    const d = designFilter({
      response: { type: 'lowpass', family: 'butterworth', order: 5, passbandEdgeHz: '100k' },
      realization: { capacitorF: '1n' },
      parts: { opamp: { model: 'single-pole', gainBandwidthHz: '150k', openLoopGainDb: 100 } },
      evaluation: { sweepPoints: 100 },
    });
    const g = d.evaluation.gainBandwidth;
    expect(g.meets).toBe(false);
    expect(g.requiredHz).toBeGreaterThan(150e3);
    const w = diag(d, 'GBW_TOO_LOW');
    expect(w?.severity).toBe('warning');
    expect(w?.message).toContain(`${d.evaluation.passbandErrorDb.opamp.toFixed(3)} dB`);
    expect(d.evaluation.passbandErrorDb.opamp).toBeGreaterThan(1);
  });

  it('zeros close to the passband edge: the stopband shortfall is a warning with the attenuation reached', () => {
    const d = designFilter({ response: { type: 'lowpass', family: 'elliptic', passbandEdgeHz: 1000, stopbandEdgeHz: 1050, passbandRippleDb: 0.5, stopbandAttenuationDb: 40 }, evaluation: { sweepPoints: 100 } });
    const s = d.evaluation.stopband!.minAttenuationDb;
    expect(s.ideal).toBeGreaterThanOrEqual(40 - 1e-6); // the exact parts meet the mask
    if (s.chosenPartsRealOpamp < 40) expect(diag(d, 'STOPBAND_NOT_MET')?.message).toContain(`${s.chosenPartsRealOpamp.toFixed(1)} dB`);
    else expect(diag(d, 'STOPBAND_NOT_MET')).toBeUndefined();
  });

  for (const [q, edges] of [
    ['1e4', [99995, 100005]],
    ['1e6', [999999.5, 1000000.5]],
    ['1e9', [1, 1.000000001]],
  ] as const) {
    it(`bandpass Q ${q} (near-coincident poles): rounding and prototype losses are warnings with their size`, () => {
      const d = designFilter({ response: { type: 'bandpass', family: 'butterworth', order: 2, passbandEdgeHz: [...edges] }, realization: { capacitorF: '1n' }, parts: { opamp: { model: 'ideal' } }, evaluation: { sweepPoints: 100 } });
      const e = d.evaluation;
      expect(e.passbandErrorDb.rounding).toBeGreaterThan(d.spec.response.passbandRippleDb);
      expect(diag(d, 'ROUNDING_ERROR')?.message).toContain(`${e.passbandErrorDb.rounding.toFixed(3)} dB`);
      if (e.prototypeDeviationDb > 0.05) expect(diag(d, 'PROTOTYPE_DEVIATION')?.message).toContain(`${e.prototypeDeviationDb.toFixed(3)} dB`);
      else expect(diag(d, 'PROTOTYPE_DEVIATION')).toBeUndefined();
    });
  }

  it('an ordinary design has no ROUNDING_ERROR warning (the threshold is the passband allowance)', () => {
    const d = designFilter({ response: { type: 'lowpass', family: 'chebyshev', order: 5, passbandEdgeHz: 1000, passbandRippleDb: 0.5 }, evaluation: { sweepPoints: 100 } });
    expect(d.evaluation.passbandErrorDb.rounding).toBeLessThan(0.5);
    expect(diag(d, 'ROUNDING_ERROR')).toBeUndefined();
  });
});
