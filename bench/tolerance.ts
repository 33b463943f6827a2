/**
 * Tolerance benchmark on the 7th-order FDNR ladder of bench/engine.ts (test/helpers/gic-circuits.ts:
 * three grounded GIC FDNRs, six single-pole op-amps, 25 MNA unknowns): every R and C 1 % uniform, every
 * op-amp's gain-bandwidth +-30 % uniform, 16 log-spaced frequencies from 100 Hz to 10 kHz.
 * - 100,000 trials serial (one thread) and over 2 worker threads (target <= 2 s wall on 2 cores), on a
 *   started pool (MonteCarloWorkerPool) and cold (start-up included: loading the worker from the
 *   TypeScript sources through tsx takes about a second, the built package's JS entry much less); the
 *   results must be byte-identical;
 * - 10^6 trials over 2 workers with the resident set size sampled every 50 ms (target <= 300 MB);
 * - the per-trial cost against the figure for a general-purpose simulator's scripted Monte
 *   Carlo (about 0.6 ms per trial, the statement; goal at least 30 times faster, <= 20 us).
 * Run: npx tsx bench/tolerance.ts. Writes bench/results-tolerance.json and prints a Markdown table.
 */
import { writeFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { fdnrLadder7 } from '../test/helpers/gic-circuits';
import { runMonteCarlo, type MonteCarloResult } from '../src/tolerance/monte-carlo';
import type { ToleranceSpec } from '../src/tolerance/spec';
import { machineCheckMs } from './machine-check';

/**
 * tsx resolves an extensionless './x.node' as the file 'x.node' (a native-addon name) and does not try
 * 'x.node.ts', so the Node-only module is imported by its full file name (vite/vitest and esbuild resolve it either way).
 */
const PARALLEL_MODULE = '../src/tolerance/parallel.node.ts';
const { runMonteCarloParallel, MonteCarloWorkerPool } = (await import(PARALLEL_MODULE)) as typeof import('../src/tolerance/parallel.node');

const MODEL = { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 } as const;
const FREQUENCIES = 16;
const TRIALS = 100_000;
const BIG_TRIALS = 1_000_000;
const WORKERS = 2;
/** The figure for a general-purpose simulator's scripted Monte Carlo on such a circuit. */
const SIMULATOR_MS_PER_TRIAL = 0.6;

const circuit = fdnrLadder7(MODEL);
const transfer = { input: 'in', output: 'out' } as const;
const spec: ToleranceSpec = {
  parts: circuit.elements.filter((e) => e.kind === 'R' || e.kind === 'C').map((e) => ({ element: e.name, tolerance: 0.01 })),
  opamps: circuit.elements.filter((e) => e.kind === 'OPAMP').map((e) => ({ element: e.name, gainBandwidthTolerance: 0.3 })),
};
const frequenciesHz = Array.from({ length: FREQUENCIES }, (_, i) => 100 * 10 ** ((2 * i) / (FREQUENCIES - 1)));
const options = { frequenciesHz, trials: TRIALS, seed: 20_240_601 };

const json = (r: MonteCarloResult) => JSON.stringify(r, (_k, v) => (ArrayBuffer.isView(v) ? Array.from(v as Float64Array) : v));

// warm-up (JIT) on a small run
runMonteCarlo(circuit, transfer, spec, { ...options, trials: 5000 });

const checkBeforeMs = machineCheckMs();
let t0 = performance.now();
const serialCpu0 = process.cpuUsage();
const serial = runMonteCarlo(circuit, transfer, spec, options);
const serialS = (performance.now() - t0) / 1000;
const serialCpu = process.cpuUsage(serialCpu0);
const serialCpuS = (serialCpu.user + serialCpu.system) / 1e6;

t0 = performance.now();
const cold = await runMonteCarloParallel(circuit, transfer, spec, { ...options, workers: WORKERS });
const coldS = (performance.now() - t0) / 1000;

const pool = await MonteCarloWorkerPool.start(WORKERS);
await pool.run(circuit, transfer, spec, { ...options, trials: 5000 }); // warm-up (JIT) in the workers
t0 = performance.now();
const cpu0 = process.cpuUsage();
const parallel = await pool.run(circuit, transfer, spec, options);
const parallelS = (performance.now() - t0) / 1000;
const cpu = process.cpuUsage(cpu0); // every thread of the process
const parallelCpuS = (cpu.user + cpu.system) / 1e6;
const identical = json(parallel) === json(serial) && json(cold) === json(serial);

let peakRss = process.memoryUsage().rss;
const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);
t0 = performance.now();
const big = await pool.run(circuit, transfer, spec, { ...options, trials: BIG_TRIALS });
await pool.close();
const bigS = (performance.now() - t0) / 1000;
clearInterval(sampler);
peakRss = Math.max(peakRss, process.memoryUsage().rss);
const peakRssMb = peakRss / 2 ** 20;

const checkAfterMs = machineCheckMs();
const serialUsPerTrial = (serialS / TRIALS) * 1e6;
const parallelUsPerTrial = (parallelS / TRIALS) * 1e6;
const results = {
  circuit: { description: '7th-order Butterworth FDNR ladder, 1 kHz, 3 GIC FDNRs, single-pole op-amps (1 MHz, 100 dB)', nodes: circuit.nodes.length, opamps: 6, tolerancedInputs: spec.parts.length + spec.opamps!.length },
  frequencies: FREQUENCIES,
  node: process.version,
  machine: { cpus: availableParallelism(), loadAverage1m: loadavg()[0], machineCheckMs: { before: checkBeforeMs, after: checkAfterMs } },
  serial100k: { seconds: serialS, usPerTrial: serialUsPerTrial, cpuSeconds: serialCpuS },
  parallel100k: { workers: WORKERS, seconds: parallelS, usPerTrial: parallelUsPerTrial, target: 2, identicalToSerial: identical, coldSecondsWithWorkerStartup: coldS, cpuSecondsAllThreads: parallelCpuS, cpuShareOfTwoCores: parallelCpuS / (2 * parallelS) },
  parallel1M: { workers: WORKERS, seconds: bigS, peakRssMb, targetRssMb: 300, quantileMethod: big.quantileMethod },
  speedupOverSimulator: { simulatorMsPerTrial: SIMULATOR_MS_PER_TRIAL, factor: (SIMULATOR_MS_PER_TRIAL * 1000) / parallelUsPerTrial, target: 30 },
  sample: { frequencyHz: frequenciesHz[8], gainDbMean: serial.gainDb.mean[8], gainDbStd: serial.gainDb.standardDeviation[8] },
};
writeFileSync(new URL('./results-tolerance.json', import.meta.url), `${JSON.stringify(results, null, 2)}\n`);
const row = (name: string, v: string, target: string, met: boolean) => `| ${name} | ${v} | ${target} | ${met ? 'met' : 'missed'} |`;
console.log(
  [
    `Circuit: ${results.circuit.description}; ${results.circuit.tolerancedInputs} toleranced inputs, ${FREQUENCIES} frequencies. Node ${process.version}, ${availableParallelism()} CPUs, load average ${loadavg()[0].toFixed(1)}.`,
    '',
    '| measurement | value | target | |',
    '|---|---|---|---|',
    `| 100,000 trials, serial | ${serialS.toFixed(2)} s (${serialUsPerTrial.toFixed(1)} us/trial; CPU ${serialCpuS.toFixed(2)} s) | | |`,
    row(`100,000 trials, pool of ${WORKERS} started workers`, `${parallelS.toFixed(2)} s (${parallelUsPerTrial.toFixed(1)} us/trial)`, '<= 2 s', parallelS <= 2),
    `| same: CPU time of all threads / share of 2 cores obtained | ${parallelCpuS.toFixed(2)} s / ${((100 * parallelCpuS) / (2 * parallelS)).toFixed(0)} % | | |`,
    `| same, cold (worker start-up from TypeScript sources included) | ${coldS.toFixed(2)} s | | |`,
    row('parallel results byte-identical to serial', String(identical), 'true', identical),
    row(`10^6 trials, ${WORKERS} workers: peak resident set`, `${peakRssMb.toFixed(0)} MB (${bigS.toFixed(1)} s)`, '<= 300 MB', peakRssMb <= 300),
    row('speed-up over 0.6 ms/trial', `${results.speedupOverSimulator.factor.toFixed(0)} x`, '>= 30 x', results.speedupOverSimulator.factor >= 30),
    '',
    `machine check (bench/machine-check.ts, about 40-50 ms when idle): ${checkBeforeMs.toFixed(0)} ms before, ${checkAfterMs.toFixed(0)} ms after`,
  ].join('\n'),
);
