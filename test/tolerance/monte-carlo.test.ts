import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../src/errors';
import { runMonteCarlo, type MonteCarloResult } from '../../src/tolerance/monte-carlo';
import { estimateYield } from '../../src/tolerance/estimate-yield';
import { propagateUncertainty } from '../../src/tolerance/propagation';
import type { ToleranceSpec } from '../../src/tolerance/spec';
import { gicFdnrLowpass } from '../helpers/gic-circuits';
import { divider, GIC_INDUCTOR_PARTS, gicInductorProbe } from './circuits';
import { resultJson } from './result-json';

const SINGLE_POLE = { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 } as const;
/** A relative change of L is ln(10)/20 times the change of 20 log10 |j w L| in dB. */
const REL_PER_DB = Math.LN10 / 20;


describe('the GIC inductor L = C4 R1 R3 R5 / R2 with five 1 % rectangular parts', () => {
  // JCGM 100 rules: u(x_i)/x_i = 0.01/sqrt(3) each (4.3.7), |c_i| = 1 for a product of powers +-1 (5.1.6),
  // so u(L)/L = sqrt(5) * 0.01 / sqrt(3) = 1.2910 % (closed form, no source)
  const closedForm = (Math.sqrt(5) * 0.01) / Math.sqrt(3);
  // ideal op-amps: the closed form is the ideal GIC identity (with a single-pole model the 160 kOhm of C4 at
  // 100 Hz against 1 kOhm amplifies 1/A by ~160, moving the sensitivities of R2..R5 by up to 0.3 %)
  const circuit = gicInductorProbe({ model: 'ideal' });
  const transfer = { input: 'IIN', output: 'p' };
  const spec: ToleranceSpec = { parts: GIC_INDUCTOR_PARTS.map((element) => ({ element, tolerance: 0.01 })) };
  const lowHz = 100;

  it('linear propagation gives 1.291 %', () => {
    const r = propagateUncertainty(circuit, transfer, spec, [lowHz]);
    expect(Math.abs((r.gainDbStandardUncertainty[0] * REL_PER_DB) / closedForm - 1)).toBeLessThan(1e-12);
    // L_eff itself: |H| / w = 10 mH
    expect(10 ** (r.nominalGainDb[0] / 20) / (2 * Math.PI * lowHz)).toBeCloseTo(0.01, 6);
  });

  it('Monte Carlo (10^5 trials) gives 1.291 % and a symmetric 95 % interval near +-1.96 u', () => {
    const r = runMonteCarlo(circuit, transfer, spec, { frequenciesHz: [lowHz], trials: 100_000, seed: 2024 });
    expect(r.quantileMethod).toBe('histogram');
    // relative standard error of a standard deviation from 10^5 trials of this near-normal sum: ~0.2 %; 1 % is ~5 sigma
    expect(Math.abs((r.gainDb.standardDeviation[0] * REL_PER_DB) / closedForm - 1)).toBeLessThan(0.01);
    const halfWidth = ((r.gainDb.coverageHigh[0] - r.gainDb.coverageLow[0]) / 2) * REL_PER_DB;
    // the sum of five rectangulars is close to normal: the 95 % half-width is within a few per cent of 1.96 u (common practice, no source)
    expect(Math.abs(halfWidth / (1.96 * closedForm) - 1)).toBeLessThan(0.03);
  });
});

describe('Monte Carlo against linear propagation with small tolerances (the JCGM 101 validation of JCGM 100)', () => {
  const circuit = gicFdnrLowpass(SINGLE_POLE);
  const transfer = { input: 'in', output: 'out' };
  const freqs = [200, 700, 1000, 1200, 3000];
  const passives = circuit.elements.filter((e) => e.kind === 'R' || e.kind === 'C');
  const opamps = circuit.elements.filter((e) => e.kind === 'OPAMP').map((e) => e.name);

  const agree = (spec: ToleranceSpec, trials: number, label: string) => {
    const lin = propagateUncertainty(circuit, transfer, spec, freqs);
    const mc = runMonteCarlo(circuit, transfer, spec, { frequenciesHz: freqs, trials, seed: 99 });
    freqs.forEach((f, i) => {
      // 20,000 trials: relative standard error of a standard deviation ~0.5-0.7 %; 3.5 % leaves > 5 sigma
      expect(Math.abs(mc.gainDb.standardDeviation[i] / lin.gainDbStandardUncertainty[i] - 1), `${label} gain @ ${f}`).toBeLessThan(0.035);
      expect(Math.abs(mc.phaseDeg.standardDeviation[i] / lin.phaseDegStandardUncertainty[i] - 1), `${label} phase @ ${f}`).toBeLessThan(0.035);
      // mean: nominal + first-order shift, within 5 standard errors of the mean (the second-order bias is ~u^2, negligible at 0.1 %)
      const se = mc.gainDb.standardDeviation[i] / Math.sqrt(trials);
      expect(Math.abs(mc.gainDb.mean[i] - (lin.nominalGainDb[i] + lin.gainDbMeanShift[i])), `${label} mean @ ${f}`).toBeLessThan(5 * se + 1e-9);
    });
    return { lin, mc };
  };

  it('uniform parts and op-amp gain-bandwidth', () => {
    agree(
      {
        parts: passives.map((e) => ({ element: e.name, tolerance: 0.001 })),
        opamps: opamps.map((element) => ({ element, gainBandwidthTolerance: 0.05 })),
      },
      20_000,
      'uniform',
    );
  });

  it('Gaussian and truncated-Gaussian parts, capacitors sharing a reel offset (GUM eq. (13) with correlations)', () => {
    const { lin } = agree(
      {
        parts: passives.map((e, i) =>
          e.kind === 'C'
            ? { element: e.name, tolerance: 0.0005, distribution: 'truncated-gaussian' as const, sigmaK: 2, group: 'reel' }
            : { element: e.name, tolerance: 0.001, distribution: i % 2 ? ('gaussian' as const) : ('uniform' as const), sigmaK: 3 },
        ),
        groups: [{ name: 'reel', tolerance: 0.002, distribution: 'gaussian', sigmaK: 2 }],
      },
      20_000,
      'correlated',
    );
    expect(lin.budget.map((b) => b.name)).toContain('group:reel');
  });

  it('temperature uniform over 0..70 C with tempcos, reference 25 C (a mean shift of its own)', () => {
    const { lin } = agree(
      {
        parts: passives.map((e) => ({ element: e.name, tolerance: 0.0005, tempcoPpmPerK: e.kind === 'R' ? 50 : -150 })),
        temperature: { referenceC: 25, minC: 0, maxC: 70 },
      },
      20_000,
      'temperature',
    );
    expect(Math.max(...lin.gainDbMeanShift.map(Math.abs))).toBeGreaterThan(0);
    expect(lin.budget.at(-1)!.name).toBe('temperature');
  });

  it('a fixed temperature corner moves the response by the sensitivities times alpha dT', () => {
    const parts = passives.map((e) => ({ element: e.name, tolerance: 0, tempcoPpmPerK: e.kind === 'R' ? 100 : 0 }));
    const hot = runMonteCarlo(circuit, transfer, { parts, temperature: { referenceC: 25, fixedC: 85 } }, { frequenciesHz: freqs, trials: 3, seed: 1 });
    const lin = propagateUncertainty(circuit, transfer, { parts, temperature: { referenceC: 25, fixedC: 85 } }, freqs);
    freqs.forEach((_, i) => {
      expect(hot.gainDb.standardDeviation[i]).toBe(0);
      // first order: shift = sum c_i alpha_i 60 K; the remainder is second order, a few times alpha dT = 6e-3 relative
      expect(Math.abs(hot.gainDb.mean[i] - hot.nominalGainDb[i] - lin.gainDbMeanShift[i])).toBeLessThan(0.03 * Math.abs(lin.gainDbMeanShift[i]) + 1e-6);
    });
  });
});

describe('quantiles', () => {
  // divider with R2 rectangular +-10 %: gain g(d) = 20 log10((1 + d) / (2 + d)) is monotone in d, so its
  // p-quantile is g(0.1 (2p - 1)) exactly (closed form, no source)
  const g = (d: number) => 20 * Math.log10((1 + d) / (2 + d));
  const spec: ToleranceSpec = { parts: [{ element: 'R2', tolerance: 0.1 }] };
  const ps = [0.025, 0.5, 0.975];
  const err = (r: MonteCarloResult) => Math.max(...ps.map((p, a) => Math.abs(r.gainDb.quantiles[a][0] - g(0.1 * (2 * p - 1)))));

  it('converge to the exact quantiles as the trials grow (exact order statistics, then the histogram)', () => {
    const run = (trials: number) => runMonteCarlo(divider(), { input: 'in', output: 'out' }, spec, { frequenciesHz: [1], trials, seed: 5, quantiles: ps });
    const small = run(1000);
    const mid = run(10_000);
    const large = run(300_000);
    expect(small.quantileMethod).toBe('exact-order-statistics');
    expect(large.quantileMethod).toBe('histogram');
    // sampling error of a quantile: sqrt(p(1-p)/N) / density; density of d is 5, dg/dd <= 4.5 dB: at N = 3e5, sd <= 4.1e-3 dB... times 1/5
    const sd = (n: number) => (Math.sqrt(0.25 / n) / 5) * 4.5;
    expect(err(large)).toBeLessThan(5 * sd(300_000) + large.gainDb.quantileResolution[0]);
    expect(err(mid)).toBeLessThan(5 * sd(10_000));
    expect(err(large)).toBeLessThan(err(small));
    // the min and max approach the ends of the rectangle
    expect(large.gainDb.min[0]).toBeGreaterThan(g(-0.1));
    expect(large.gainDb.min[0] - g(-0.1)).toBeLessThan(1e-3);
  });

  it('histogram quantiles agree with exact order statistics of the same trials within the bin width', () => {
    const opts = { frequenciesHz: [1], trials: 50_000, seed: 8, quantiles: ps };
    const h = runMonteCarlo(divider(), { input: 'in', output: 'out' }, spec, opts);
    const x = runMonteCarlo(divider(), { input: 'in', output: 'out' }, spec, { ...opts, exactQuantileLimit: 50_000 });
    expect(h.quantileMethod).toBe('histogram');
    expect(x.quantileMethod).toBe('exact-order-statistics');
    expect(h.gainDb.mean[0]).toBe(x.gainDb.mean[0]);
    ps.forEach((_, a) => expect(Math.abs(h.gainDb.quantiles[a][0] - x.gainDb.quantiles[a][0])).toBeLessThan(2 * h.gainDb.quantileResolution[0]));
  });
});

describe('runMonteCarlo behaviour', () => {
  const spec: ToleranceSpec = { parts: [{ element: 'R1', tolerance: 0.05 }, { element: 'R2', tolerance: 0.05, distribution: 'gaussian' }] };
  const transfer = { input: 'in', output: 'out' };

  it('is reproducible: the same seed gives a byte-identical result, another seed a different one', () => {
    const o = { frequenciesHz: [1, 10], trials: 5000, seed: 3 };
    const a = resultJson(runMonteCarlo(divider(), transfer, spec, o));
    expect(resultJson(runMonteCarlo(divider(), transfer, spec, o))).toBe(a);
    expect(resultJson(runMonteCarlo(divider(), transfer, spec, { ...o, seed: 4 }))).not.toBe(a);
  });

  it('reports progress up to the total', () => {
    const seen: number[] = [];
    runMonteCarlo(divider(), transfer, spec, { frequenciesHz: [1], trials: 70_000, seed: 1, onProgress: (p) => seen.push(p.completedTrials) });
    expect(seen.at(-1)).toBe(70_000);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThan(seen[i - 1]);
    expect(seen.length).toBeGreaterThan(2);
  });

  it('adaptive stopping (JCGM 101 7.9) stops after whole batches once the statistics are stable', () => {
    const r = runMonteCarlo(divider(), transfer, spec, { frequenciesHz: [1], trials: 2_000_000, seed: 1, adaptive: { significantDigits: 1 } });
    expect(r.adaptive!.converged).toBe(true);
    expect(r.adaptive!.batchSize).toBeGreaterThanOrEqual(10_000); // M = max(J, 10^4), J = 2000 for p = 0.95
    expect(r.adaptive!.batches).toBeGreaterThanOrEqual(2);
    expect(r.trials).toBe(r.adaptive!.batches * r.adaptive!.batchSize);
    expect(r.trials).toBeLessThan(2_000_000);
    // three significant digits (delta = 5e-4 dB against u = 0.3 dB) need about 1.4e6 trials: a 100,000 cap stops first
    const r3 = runMonteCarlo(divider(), transfer, spec, { frequenciesHz: [1], trials: 100_000, seed: 1, adaptive: { significantDigits: 3 } });
    expect(r3.adaptive!.converged).toBe(false);
    expect(r3.trials).toBe(100_000);
  });

  it('counts yield against a mask with a Wilson interval: a +-5 % window on a +-10 % rectangular part passes half the boards', () => {
    const g = (d: number) => 20 * Math.log10((1 + d) / (2 + d));
    const mask = { passband: [{ fromHz: 0, toHz: 10, minGainDb: g(-0.05), maxGainDb: g(0.05) }], stopband: [] };
    const trials = 20_000;
    const r = runMonteCarlo(divider(), transfer, { parts: [{ element: 'R2', tolerance: 0.1 }] }, { frequenciesHz: [1], trials, seed: 12, mask, coverageProbability: 0.999 });
    const y = r.yield!;
    expect(y.trials).toBe(trials);
    expect(Math.abs(y.estimate - 0.5)).toBeLessThan(4 * Math.sqrt(0.25 / trials));
    expect(y.low).toBeLessThan(0.5);
    expect(y.high).toBeGreaterThan(0.5);
    expect(y.failuresAt[0]).toBe(trials - y.passed);
  });

  it('estimateYield on a mask grid: a generous mask passes every board, a mask tighter than the nominal passes none', () => {
    const g0 = 20 * Math.log10(0.5);
    const loose = { passband: [{ fromHz: 0, toHz: 100, minGainDb: g0 - 3, maxGainDb: g0 + 3 }], stopband: [] };
    const y = estimateYield(divider(), transfer, spec, loose, { trials: 2000, seed: 4, pointsPerBand: 3 });
    expect(y.passed).toBe(2000);
    expect(y.monteCarlo.frequencyHz.length).toBe(3);
    expect(y.high).toBe(1);
    expect(y.low).toBeGreaterThan(0.99); // Wilson with 0 failures in 2000: 1 - z^2/(n + z^2) = 0.998
    const impossible = { passband: [], stopband: [{ fromHz: 0, toHz: 100, maxGainDb: g0 - 3 }] };
    const z = estimateYield(divider(), transfer, spec, impossible, { trials: 500, seed: 4 });
    expect(z.passed).toBe(0);
    expect(z.low).toBe(0);
  });

  it('rejects bad specifications and options with typed errors', () => {
    const code = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        expect(e).toBeInstanceOf(InvalidInputError);
        return `${(e as InvalidInputError).code} ${(e as InvalidInputError).path}`;
      }
      return 'none';
    };
    const ok = { frequenciesHz: [1], trials: 10, seed: 1 };
    const run = (s: unknown, o: unknown = ok) => () => runMonteCarlo(divider(), transfer, s as ToleranceSpec, o as typeof ok);
    expect(code(run({ parts: [{ element: 'RX', tolerance: 0.01 }] }))).toBe('INVALID_ARGUMENT spec.parts[0].element');
    expect(code(run({ parts: [{ element: 'R1', tolerance: 0.9 }] }))).toBe('OUT_OF_RANGE spec.parts[0].tolerance');
    expect(code(run({ parts: [{ element: 'R1', tolerance: 0.01, distribution: 'cauchy' }] }))).toBe('INVALID_ARGUMENT spec.parts[0].distribution');
    expect(code(run({ parts: [{ element: 'R1', tolerance: 0.01, distribution: 'gaussian', sigmaK: 0.1 }] }))).toBe('OUT_OF_RANGE spec.parts[0].sigmaK');
    expect(code(run({ parts: [{ element: 'R1', tolerance: 0.01, group: 'g' }] }))).toBe('INVALID_ARGUMENT spec.parts[0].group');
    expect(code(run({ parts: [{ element: 'R1', tolerance: 0.01 }, { element: 'R1', tolerance: 0.01 }] }))).toBe('INVALID_ARGUMENT spec.parts[1].element');
    expect(code(run({ parts: [], opamps: [{ element: 'R1', gainBandwidthTolerance: 0.1 }] }))).toBe('INVALID_ARGUMENT spec.opamps[0].element');
    expect(code(run({ parts: [], temperature: { referenceC: 25, minC: 50, maxC: 0 } }))).toBe('OUT_OF_RANGE spec.temperature.maxC');
    expect(code(run({ parts: [] }, { ...ok, trials: 0 }))).toBe('OUT_OF_RANGE options.trials');
    expect(code(run({ parts: [] }, { ...ok, seed: 1.5 }))).toBe('OUT_OF_RANGE options.seed');
    expect(code(run({ parts: [] }, { ...ok, quantiles: [2] }))).toBe('OUT_OF_RANGE options.quantiles[0]');
    expect(code(run({ parts: [] }, { ...ok, adaptive: { significantDigits: 9 } }))).toBe('OUT_OF_RANGE options.adaptive.significantDigits');
    expect(code(run({ parts: [] }, { ...ok, frequenciesHz: [] }))).toBe('INVALID_ARGUMENT options.frequenciesHz');
    expect(code(() => propagateUncertainty(divider(), transfer, { parts: [] }, [1]))).toBe('INVALID_ARGUMENT spec.parts');
  });
});
