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
import { READY_ID, type WorkerReply, type WorkerRequest, type WorkerSetup } from './worker-protocol';

/** Distributes Omit over the union of request kinds. */
type WithoutId<T> = T extends unknown ? Omit<T, 'id'> : never;

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
export function startWorker(workerData: unknown = null): Worker {
  const here = import.meta.url;
  if (!/\.(c|m)?ts$/.test(new URL(here).pathname)) return new Worker(new URL('./monte-carlo-worker.node.js', here), { workerData });
  const require = createRequire(here);
  const pkgPath = require.resolve('tsx/package.json');
  const pkg = JSON.parse(readFileSync(pkgPath, 'utf8')) as { exports: Record<string, { import: { default: string } }> };
  const api = pathToFileURL(join(dirname(pkgPath), pkg.exports['./esm/api'].import.default)).href;
  const entry = new URL('./monte-carlo-worker.node.ts', here).href;
  const bootstrap = `import(${JSON.stringify(api)}).then((m) => m.tsImport(${JSON.stringify(entry)}, ${JSON.stringify(here)}));`;
  return new Worker(bootstrap, { eval: true, workerData });
}

/**
 * A pool of Monte Carlo worker threads, started once and reused across runs (starting a worker costs
 * tens of milliseconds from the built package, about a second from TypeScript sources). Runs are
 * served one at a time, in the order they are asked for.
 */
export class MonteCarloWorkerPool {
  private readonly pending = new Map<number, { resolve: (r: BlockResult[]) => void; reject: (e: Error) => void }>();
  private nextId = 0;
  private queue: Promise<unknown> = Promise.resolve();
  private failure: Error | null = null;

  private constructor(private readonly workers: Worker[]) {
    for (const w of workers) {
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
    }
  }

  /** Starts `workers` threads (default os.availableParallelism()) and waits until each has loaded its code. */
  static async start(workers: number = availableParallelism()): Promise<MonteCarloWorkerPool> {
    requireInteger(workers, 'workers', 1, 256);
    const list = Array.from({ length: workers }, () => startWorker(null));
    // each worker posts READY_ID once its module has been evaluated (its message listener is attached)
    await Promise.all(list.map((w) => new Promise<void>((resolve, reject) => {
      const onMessage = (m: WorkerReply) => {
        if (m.id !== READY_ID) return;
        w.off('message', onMessage);
        resolve();
      };
      w.on('message', onMessage);
      w.once('error', reject);
    })));
    return new MonteCarloWorkerPool(list);
  }

  get size(): number {
    return this.workers.length;
  }

  private failAll(e: Error): void {
    this.failure = e;
    for (const p of this.pending.values()) p.reject(e);
    this.pending.clear();
  }

  private ask(w: number, msg: WithoutId<WorkerRequest>): Promise<BlockResult[]> {
    if (this.failure) return Promise.reject(this.failure);
    const id = this.nextId++;
    const p = new Promise<BlockResult[]>((resolve, reject) => this.pending.set(id, { resolve, reject }));
    this.workers[w].postMessage({ ...msg, id });
    return p;
  }

  /** Splits the requests into contiguous shares, one per worker, and gathers every result. */
  private async blocks(requests: readonly BlockRequest[]): Promise<BlockResult[]> {
    const n = this.workers.length;
    const share = Math.ceil(requests.length / n);
    const jobs: Promise<BlockResult[]>[] = [];
    for (let w = 0; w < n && w * share < requests.length; w++) jobs.push(this.ask(w, { type: 'blocks', requests: requests.slice(w * share, (w + 1) * share) }));
    return (await Promise.all(jobs)).flat();
  }

  /** {@link runMonteCarlo} on the pool's threads: the same result, byte for byte, for the same seed. */
  run(circuit: Circuit, transfer: TransferSpec, spec: ToleranceSpec, options: MonteCarloOptions): Promise<MonteCarloResult> {
    const job = this.queue.then(() => this.runNow(circuit, transfer, spec, options));
    this.queue = job.catch(() => undefined);
    return job;
  }

  private async runNow(circuit: Circuit, transfer: TransferSpec, spec: ToleranceSpec, options: MonteCarloOptions): Promise<MonteCarloResult> {
    const config = resolveMonteCarloOptions(options);
    if (typeof transfer !== 'object' || transfer === null) throw new InvalidInputError('INVALID_ARGUMENT', 'transfer', transfer, 'must be { input, output }');
    // validates the spec and gives the nominal response before any worker is asked
    const model = new TrialModel(circuit, transfer, spec, config.frequencyHz, config.mask);
    const setup: WorkerSetup = {
      circuit: circuitToJson(circuit),
      transfer: { input: transfer.input, output: transfer.output },
      spec,
      frequencyHz: config.frequencyHz,
      mask: config.mask,
      seed: config.seed,
    };
    await Promise.all(this.workers.map((_, w) => this.ask(w, { type: 'setup', setup })));
    const driver = monteCarloDriver(config, { gainDb: model.nominalGainDb, phaseDeg: model.nominalPhaseDeg }, options.onProgress);
    let step = driver.next();
    while (!step.done) step = driver.next(await this.blocks(step.value));
    return step.value;
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}

/**
 * {@link runMonteCarlo} over worker threads: the same result, byte for byte, for the same seed. Starts
 * and stops a {@link MonteCarloWorkerPool}; keep a pool for repeated runs.
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
  resolveMonteCarloOptions(options); // fail before starting threads
  const workers = requireInteger(options.workers ?? availableParallelism(), 'options.workers', 1, 256);
  const pool = await MonteCarloWorkerPool.start(workers);
  try {
    return await pool.run(circuit, transfer, spec, options);
  } finally {
    await pool.close();
  }
}
