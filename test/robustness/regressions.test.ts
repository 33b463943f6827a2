/**
 * Regression tests for bugs the robustness fuzzing found, each named after what it guards. The inputs
 * are the shrunk counterexamples (or a simpler one with the same cause).
 */
import { describe, expect, it } from 'vitest';
import { designFilter } from '../../src/spec/design-filter';
import { SpecError } from '../../src/spec/spec-error';
import { renderDesignOutputs } from '../../src/cli/design-command';
import { GicladderError, UnrealizableError } from '../../src/errors';
import { frequencyAtAttenuation, gainDbAt } from '../../src/approximation/index';
import { outputProblems } from './output-checks';

/** The error designFilter throws for `spec`, or undefined. */
function errorOf(spec: unknown): unknown {
  try {
    renderDesignOutputs(spec);
  } catch (e) {
    return e;
  }
  return undefined;
}

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

  it('absurd quantities are refused by the design file reader, naming the field (they used to fail deep inside with internal paths or an untyped fraction.js error)', () => {
    // Each of these passed validation and failed later: 'Division by Zero' (a plain Error from fraction.js
    // in the embedding route), or typed errors naming 'parts[1].valueSi', 'analogSections[0].n0',
    // 'UOUT.model.gainBandwidthHz', 'digital.sampleRateHz' or SINGULAR_CIRCUIT instead of the file's field.
    const base = { response: { type: 'lowpass', family: 'chebyshev', order: 3, passbandEdgeHz: 1000, passbandRippleDb: 0.5 }, evaluation: { sweepPoints: 16 } };
    const cases: [unknown, string][] = [
      [{ ...base, response: { type: 'bandpass', family: 'butterworth', order: 2, passbandEdgeHz: [1e6, 1e300] } }, 'response.passbandEdgeHz'],
      [{ ...base, response: { ...base.response, passbandEdgeHz: 1e-30 } }, 'response.passbandEdgeHz'],
      [{ ...base, response: { ...base.response, passbandEdgeHz: 1e30 } }, 'response.passbandEdgeHz'],
      [{ ...base, realization: { capacitorF: 1e-300 } }, 'realization.capacitorF'],
      [{ ...base, realization: { capacitorF: 1e300 } }, 'realization.capacitorF'],
      [{ ...base, realization: { impedanceOhms: 1e300 } }, 'realization.impedanceOhms'],
      [{ ...base, realization: { gicResistanceOhms: 1e-300 } }, 'realization.gicResistanceOhms'],
      [{ ...base, export: { sampleRateHz: 1e300 } }, 'export.sampleRateHz'],
      [{ ...base, parts: { opamp: { model: 'two-pole', gainBandwidthHz: 1e7, secondPoleHz: 1e-300 } } }, 'parts.opamp.secondPoleHz'],
    ];
    for (const [spec, path] of cases) {
      const e = errorOf(spec);
      expect(e, path).toBeInstanceOf(SpecError);
      expect((e as SpecError).issues.map((i) => i.path)).toContain(path);
    }
  });

  it('the ends of the accepted ranges design, every output clean (1e-6 Hz and 1e10 Hz with 1 fF, 1 F, 1 mohm and 1 Tohm levels)', () => {
    for (const type of ['lowpass', 'highpass', 'bandpass', 'bandstop'] as const) {
      for (const f of [1e-6, 1e10]) {
        for (const level of [{ capacitorF: 1e-15 }, { capacitorF: 1 }, { impedanceOhms: 1e-3 }, { impedanceOhms: 1e12 }]) {
          const banded = type === 'bandpass' || type === 'bandstop';
          const spec = { name: 'corner', response: { type, family: 'butterworth', order: 2, passbandEdgeHz: banded ? (f > 1 ? [f / 2, f] : [f, 2 * f]) : f }, realization: level, evaluation: { sweepPoints: 16 } };
          let r;
          try {
            r = renderDesignOutputs(spec);
          } catch (e) {
            // A refusal is acceptable only as a typed error; none is expected here.
            expect(e).toBeInstanceOf(GicladderError);
            throw e;
          }
          expect(outputProblems(r.files), JSON.stringify(spec)).toEqual([]);
          expect(r.design.evaluation.prototypeDeviationDb).toBeLessThan(0.011); // as the examples (FDNR DC-path resistors <= 0.01 dB)
        }
      }
    }
  });

  it('frequencyAtAttenuation returns NaN for a level no finite frequency reaches (it looped forever once the bracket doubled to Infinity)', () => {
    // Found by fuzzing designFilter: a Bessel bandstop with passbandRippleDb 2^53 hung the process.
    const bessel4 = { zeros: [], poles: [{ re: -1, im: 0 }, { re: -1, im: 0 }, { re: -1, im: 1 }, { re: -1, im: -1 }], gain: 2 };
    expect(frequencyAtAttenuation(bessel4, 2 ** 53)).toBeNaN();
    expect(frequencyAtAttenuation(bessel4, 1e308)).toBeNaN();
    // The ordinary case still bisects to the level: the gain there is the level asked for.
    const w = frequencyAtAttenuation(bessel4, 3);
    expect(-gainDbAt(bessel4, w)).toBeCloseTo(3, 9);
  });

  it('a passband loss the prototype never reaches is refused naming response.passbandRippleDb (was a hang)', () => {
    // The design file now bounds the ripple (60 dB), so the reader refuses it at the field...
    const e = errorOf({ response: { type: 'bandstop', family: 'bessel', order: 4, passbandEdgeHz: [1, 1.8735], passbandRippleDb: 2 ** 53 }, evaluation: { sweepPoints: 16 } });
    expect(e).toBeInstanceOf(SpecError);
    expect((e as SpecError).path).toBe('response.passbandRippleDb');
    // ...and the kernel that hung returns NaN instead of bisecting on Infinity forever.
    const zpk = { zeros: [], poles: [{ re: -1, im: 0 }], gain: 1 };
    expect(frequencyAtAttenuation(zpk, 2 ** 53)).toBeNaN();
  });
});

