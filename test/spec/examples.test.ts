/**
 * The example design files in examples/, each designed through the whole chain, with its key figures
 * asserted: order, op-amp count, worst passband error bound, stability. The bounds are our own design
 * targets (common practice, no source): preferred values plus op-amps within a few tenths of a dB.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { designFilter, type FilterDesign } from '../../src/spec/design-filter';
import { UnstableCircuitError } from '../../src/spec/stability';

const load = (name: string): unknown => JSON.parse(readFileSync(fileURLToPath(new URL(`../../examples/${name}`, import.meta.url)), 'utf8'));

function checkCommon(d: FilterDesign): void {
  expect(d.stability.stable).toBe(true);
  expect(d.stability.rightHalfPlane).toBe(0);
  expect(d.nominalPassbandGainDb).toBeCloseTo(-6.0206, 3); // equal terminations: 20 log10(1/2)
  // The ideal circuit realises the scaled prototype (FDNR DC-path resistors: <= 0.01 dB by design).
  expect(d.evaluation.prototypeDeviationDb).toBeLessThan(0.011);
  expect(d.parts.every((p) => p.series !== undefined && Number.isFinite(p.value) && p.value > 0)).toBe(true);
  // The split adds up: the total is at most the sum of its parts (maxima of differences).
  const e = d.evaluation.passbandErrorDb;
  expect(e.total).toBeLessThanOrEqual(e.rounding + e.opamp + 1e-12);
}

describe('examples', () => {
  it('vibration-antialias-lowpass: elliptic FDNR lowpass, mask -> order 5', () => {
    const d = designFilter(load('vibration-antialias-lowpass.json'));
    checkCommon(d);
    expect(d.method).toBe('fdnr');
    expect(d.order.order).toBe(5);
    expect(d.order.estimate).toBeDefined();
    expect(d.opampCount).toBe(2 * 2 + 1); // two FDNRs (shunt arms 2 and 4) and the output buffer
    expect(d.evaluation.passbandErrorDb.total).toBeLessThan(0.1);
    expect(d.evaluation.gainBandwidth.meets).toBe(true);
    expect(d.evaluation.stopband!.minAttenuationDb.ideal).toBeGreaterThanOrEqual(60 - 1e-6);
    expect(d.parts.filter((p) => p.kind === 'C').every((p) => p.value === 1e-8)).toBe(true); // built around 10 nF
  });

  it('geophone-hum-highpass: Chebyshev simulated-inductor highpass', () => {
    const d = designFilter(load('geophone-hum-highpass.json'));
    checkCommon(d);
    expect(d.method).toBe('simulated-inductor');
    expect(d.order.order).toBe(5);
    expect(d.opampCount).toBe(2 * 2 + 1); // two grounded inductors (from prototype C2, C4) and the output buffer
    expect(d.evaluation.passbandErrorDb.total).toBeLessThan(0.25);
    expect(d.evaluation.stopband!.minAttenuationDb.chosenPartsRealOpamp).toBeGreaterThan(40);
  });

  it('ultrasonic-40k-bandpass: the embedding route has no DC path yet, and the exact stability test says so', () => {
    // Regression guard for the stability check: a root at s = 0 (a node with no DC path, even with ideal
    // op-amps) is a marginal mode, reported as UNSTABLE, never as a plot. When the substitution stage
    // adds DC paths to the embedding route, this example should design and this test be updated.
    let error: unknown;
    try {
      designFilter(load('ultrasonic-40k-bandpass.json'));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(UnstableCircuitError);
    const s = (error as UnstableCircuitError).stability;
    expect((error as UnstableCircuitError).code).toBe('UNSTABLE');
    expect(s.rightHalfPlane).toBe(0);
    expect(s.originRoots).toBe(1);
  });

  it('pulse-shaping-bessel: Bessel FDNR lowpass, two-pole op-amps', () => {
    const d = designFilter(load('pulse-shaping-bessel.json'));
    checkCommon(d);
    expect(d.method).toBe('fdnr');
    expect(d.order.order).toBe(5);
    expect(d.opampCount).toBe(2 * 2 + 1);
    expect(d.evaluation.passbandErrorDb.total).toBeLessThan(0.05);
    // The passband edge is the -3.01 dB point below nominal (magnitude normalisation).
    const i = d.evaluation.frequencyHz.indexOf(100e3);
    expect(d.evaluation.gainDb.ideal[i] - d.nominalPassbandGainDb).toBeCloseTo(-3.0103, 2);
  });
});
