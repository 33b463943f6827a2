/**
 * Monte Carlo over worker threads (Node only). The main thread runs the same deterministic driver as
 * the serial runner (monte-carlo.ts) and hands each list of block requests out to the workers in
 * contiguous shares; the results go back to the driver, which combines them in block order. Each
 * block's random stream depends only on (seed, block) (random.ts), so the result is byte-identical to
 * runMonteCarlo's for the same seed and options, whatever the number of workers.
 *
 * Worker entry: `monte-carlo-worker.node.ts` beside this file; a worker thread does not inherit the
 * parent's TypeScript transform, see {@link startWorker} for how it is loaded from sources (vitest,
 * tsx). From the built package the bundler must emit `monte-carlo-worker.node.js` next to the bundle
 * that contains this module (an ESM entry of its own).
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { InvalidInputError, requireInteger } from '../errors';
import type { TransferSpec } from '../analysis/index';
import type { Circuit } from '../netlist/index';
import { circuitToJson } from './circuit-json';
import { monteCarloDriver, resolveMonteCarloOptions, TrialModel, type BlockRequest, type BlockResult, type MonteCarloOptions, type MonteCarloResult } from './monte-carlo';
import type { ToleranceSpec } from './spec';
import type { WorkerReply, WorkerSetup } from './monte-carlo-worker.node';

export interface ParallelMonteCarloOptions extends MonteCarloOptions {
  /** Worker threads (default: os.availableParallelism()). */
  readonly workers?: number;
}

/**
 * Starts one worker on the entry beside this module. From the built package that is plain
 * JavaScript. From TypeScript sources, `execArgv: ['--import', 'tsx']` does not work for worker
 * threads on Node 20 (the worker's entry is resolved before the loader hooks apply: "Unknown file
 * extension .ts"), so the worker instead evaluates a two-line CommonJS bootstrap that imports tsx's
 * ESM API (`tsImport`, resolved through tsx's package.json exports) and loads the .ts entry with it.
 */
export function startWorker(setup: unknown): Worker {
  const here = import.meta.url;
  if (!/\.(c|m)?ts$/.test(new URL(here).pathname)) return new Worker(new URL('./monte-carlo-worker.node.js', here), { workerData: setup });
  const require = createRequire(here);
  const pkgPath = require.resolve('tsx/package.json');
  const pkg = JSON.parse(readFileSync(pkgPath, 'utf8')) as { exports: Record<string, { import: { default: string } }> };
  const api = pathToFileURL(join(dirname(pkgPath), pkg.exports['./esm/api'].import.default)).href;
  const entry = new URL('./monte-carlo-worker.node.ts', here).href;
  const bootstrap = `import(${JSON.stringify(api)}).then((m) => m.tsImport(${JSON.stringify(entry)}, ${JSON.stringify(here)}));`;
  return new Worker(bootstrap, { eval: true, workerData: setup });
}

class WorkerPool {
  private readonly workers: Worker[];
  private readonly pending = new Map<number, { resolve: (r: BlockResult[]) => void; reject: (e: Error) => void }>();
  private nextId = 0;

  constructor(count: number, setup: WorkerSetup) {
    this.workers = Array.from({ length: count }, () => {
      const w = startWorker(setup);
      w.on('message', (m: WorkerReply) => {
        const p = this.pending.get(m.id);
        if (!p) return;
        this.pending.delete(m.id);
        if ('error' in m) p.reject(new Error(m.error));
        else p.resolve(m.results);
      });
      w.on('error', (e) => this.failAll(e));
      w.on('exit', (code) => {
        if (code !== 0) this.failAll(new Error(`Monte Carlo worker exited with code ${code}`));
      });
      return w;
    });
  }

  private failAll(e: Error): void {
    for (const p of this.pending.values()) p.reject(e);
    this.pending.clear();
  }

  /** Splits the requests into contiguous shares, one per worker, and gathers every result. */
  async run(requests: readonly BlockRequest[]): Promise<BlockResult[]> {
    const n = this.workers.length;
    const share = Math.ceil(requests.length / n);
    const jobs: Promise<BlockResult[]>[] = [];
    for (let w = 0; w < n && w * share < requests.length; w++) {
      const id = this.nextId++;
      const part = requests.slice(w * share, (w + 1) * share);
      jobs.push(new Promise((resolve, reject) => this.pending.set(id, { resolve, reject })));
      this.workers[w].postMessage({ id, requests: part });
    }
    return (await Promise.all(jobs)).flat();
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}

/**
 * {@link runMonteCarlo} over worker threads: the same result, byte for byte, for the same seed.
 *
 * @example
 * const r = await runMonteCarloParallel(circuit, { input: 'in', output: 'out' }, spec, { frequenciesHz, trials: 100_000, seed: 1, workers: 2 });
 */
export async function runMonteCarloParallel(
  circuit: Circuit,
  transfer: TransferSpec,
  spec: ToleranceSpec,
  options: ParallelMonteCarloOptions,
): Promise<MonteCarloResult> {
  const config = resolveMonteCarloOptions(options);
  const workers = requireInteger(options.workers ?? availableParallelism(), 'options.workers', 1, 256);
  // validates the spec and gives the nominal response before any thread starts
  const model = new TrialModel(circuit, transfer, spec, config.frequencyHz, config.mask);
  if (typeof transfer !== 'object' || transfer === null) throw new InvalidInputError('INVALID_ARGUMENT', 'transfer', transfer, 'must be { input, output }');
  const pool = new WorkerPool(workers, {
    circuit: circuitToJson(circuit),
    transfer: { input: transfer.input, output: transfer.output },
    spec,
    frequencyHz: config.frequencyHz,
    mask: config.mask,
    seed: config.seed,
  });
  try {
    const driver = monteCarloDriver(config, { gainDb: model.nominalGainDb, phaseDeg: model.nominalPhaseDeg }, options.onProgress);
    let step = driver.next();
    while (!step.done) step = driver.next(await pool.run(step.value));
    return step.value;
  } finally {
    await pool.close();
  }
}
