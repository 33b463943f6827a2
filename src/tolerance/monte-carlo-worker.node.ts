/**
 * Worker-thread entry of the parallel Monte Carlo (parallel.node.ts). It rebuilds the circuit from
 * plain data, compiles its own engine, and answers block requests with block results; which blocks
 * it runs decides nothing about the values (random.ts), so the combined result is the serial one.
 * Node only.
 */
import { parentPort, workerData } from 'node:worker_threads';
import type { TransferSpec } from '../analysis/index';
import { circuitFromJson, type CircuitJson } from './circuit-json';
import { TrialModel, type BlockRequest, type BlockResult } from './monte-carlo';
import { BlockStreams } from './random';
import type { ToleranceSpec } from './spec';
import type { SpecMask } from './yield';

/** What the parent sends at start-up (structured-cloneable). */
export interface WorkerSetup {
  readonly circuit: CircuitJson;
  readonly transfer: TransferSpec;
  readonly spec: ToleranceSpec;
  readonly frequencyHz: Float64Array;
  readonly mask: SpecMask | null;
  readonly seed: number;
}

export interface WorkerRequest {
  readonly id: number;
  readonly requests: readonly BlockRequest[];
}

export type WorkerReply = { readonly id: number; readonly results: BlockResult[] } | { readonly id: number; readonly error: string };

const setup = workerData as WorkerSetup;
const model = new TrialModel(circuitFromJson(setup.circuit), setup.transfer, setup.spec, setup.frequencyHz, setup.mask);
const streams = new BlockStreams(setup.seed);

parentPort!.on('message', (msg: WorkerRequest) => {
  try {
    const results = msg.requests.map((r) => model.runBlock(r, streams.generatorFor(r.block)));
    const buffers: ArrayBuffer[] = [];
    for (const r of results) {
      for (const a of [r.failuresAt, r.moments.mean, r.moments.m2, r.moments.min, r.moments.max, r.histogram, r.values]) if (a) buffers.push(a.buffer as ArrayBuffer);
    }
    parentPort!.postMessage({ id: msg.id, results } satisfies WorkerReply, buffers);
  } catch (e) {
    parentPort!.postMessage({ id: msg.id, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) } satisfies WorkerReply);
  }
});
