import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runMonteCarlo } from '../../src/tolerance/monte-carlo';
import { MonteCarloWorkerPool, runMonteCarloParallel } from '../../src/tolerance/parallel.node';
import type { ToleranceSpec } from '../../src/tolerance/spec';
import { gicFdnrLowpass } from '../helpers/gic-circuits';
import { resultJson } from './result-json';

const circuit = gicFdnrLowpass({ model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 });
const transfer = { input: 'in', output: 'out' };
const spec: ToleranceSpec = {
  parts: circuit.elements
    .filter((e) => e.kind === 'R' || e.kind === 'C')
    .map((e) => (e.kind === 'C' ? { element: e.name, tolerance: 0.01, distribution: 'truncated-gaussian' as const, group: 'reel' } : { element: e.name, tolerance: 0.01, tempcoPpmPerK: 100 })),
  groups: [{ name: 'reel', tolerance: 0.02, distribution: 'gaussian' }],
  opamps: [{ element: 'G1_UA', gainBandwidthTolerance: 0.3 }],
  temperature: { referenceC: 25, minC: -40, maxC: 85 },
};
const mask = { passband: [{ fromHz: 0, toHz: 800, minGainDb: -7.5, maxGainDb: -5.5 }], stopband: [{ fromHz: 3000, toHz: 10_000, maxGainDb: -30 }] };

describe('parallel Monte Carlo (2 worker threads, loaded from the TypeScript sources through tsx)', () => {
  let pool: MonteCarloWorkerPool;
  beforeAll(async () => {
    pool = await MonteCarloWorkerPool.start(2);
  });
  afterAll(async () => {
    await pool.close();
  });

  it('gives a byte-identical result to the serial run: histogram quantiles, mask yield, uneven last block', async () => {
    const options = { frequenciesHz: [100, 800, 1000, 3000, 5000], trials: 12_000 + 321, seed: 77, blockSize: 512, exactQuantileLimit: 0, mask };
    const serial = runMonteCarlo(circuit, transfer, spec, options);
    const progress: number[] = [];
    const parallel = await pool.run(circuit, transfer, spec, { ...options, onProgress: (p) => progress.push(p.completedTrials) });
    expect(serial.quantileMethod).toBe('histogram');
    expect(resultJson(parallel)).toBe(resultJson(serial));
    expect(progress.at(-1)).toBe(options.trials);
    expect(serial.yield!.passed).toBeGreaterThan(0);
  });

  it('reports a bad specification from the main thread with a typed error, and the pool stays usable', async () => {
    await expect(pool.run(circuit, transfer, { parts: [{ element: 'nope', tolerance: 0.01 }] }, { frequenciesHz: [1], trials: 10, seed: 1 })).rejects.toMatchObject({ code: 'INVALID_ARGUMENT', path: 'spec.parts[0].element' });
    const o = { frequenciesHz: [1000], trials: 1500, seed: 2 };
    expect(resultJson(await pool.run(circuit, transfer, spec, o))).toBe(resultJson(runMonteCarlo(circuit, transfer, spec, o)));
  });

  it('gives a byte-identical result in exact-quantile mode (a pool started for the one run) and with adaptive stopping (the shared pool, reused)', async () => {
    const small = { frequenciesHz: [500, 1200], trials: 3000, seed: -5 };
    expect(resultJson(await runMonteCarloParallel(circuit, transfer, spec, { ...small, workers: 2 }))).toBe(resultJson(runMonteCarlo(circuit, transfer, spec, small)));
    const adaptive = { frequenciesHz: [1000], trials: 200_000, seed: 3, adaptive: { significantDigits: 1 } };
    const s = runMonteCarlo(circuit, transfer, spec, adaptive);
    expect(s.adaptive!.converged).toBe(true);
    expect(resultJson(await pool.run(circuit, transfer, spec, adaptive))).toBe(resultJson(s));
  });
});
