/**
 * Regression tests for bugs the robustness fuzzing found, each named after what it guards. The inputs
 * are the shrunk counterexamples (or a simpler one with the same cause).
 */
import { describe, expect, it } from 'vitest';
import { designFilter } from '../../src/spec/design-filter';

describe('robustness regressions', () => {
  it('a finite-gain op-amp too weak for the passband bound gives a diagnostic, not an INVALID_NUMBER error from formatting its infinite GBW', () => {
    // Found by fuzzing designFilter: openLoopGainDb 20 made noteEvaluation format chosenHz = Infinity.
    const d = designFilter({
      response: { type: 'lowpass', family: 'butterworth', order: 1, passbandEdgeHz: 1 },
      parts: { opamp: { model: 'finite-gain', openLoopGainDb: 20 } },
      evaluation: { sweepPoints: 16 },
    });
    expect(d.evaluation.gainBandwidth.meets).toBe(false);
    const diag = d.diagnostics.find((x) => x.code === 'OPAMP_GAIN_TOO_LOW');
    expect(diag?.severity).toBe('warning');
    // The message carries the measured loss, the same number the evaluation reports.
    expect(diag?.message).toContain(`${d.evaluation.passbandErrorDb.opamp.toFixed(3)} dB`);
    expect(d.evaluation.passbandErrorDb.opamp).toBeGreaterThan(0.1);
    for (const x of d.diagnostics) expect(x.message).not.toMatch(/NaN|Infinity/);
  });
});
