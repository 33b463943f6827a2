/**
 * Worker-thread entry of the parallel Monte Carlo (parallel.node.ts). For each run it rebuilds the
 * circuit from plain data and compiles its own engine ('setup'), then answers block requests with
 * block results; which blocks
 * it runs decides nothing about the values (random.ts), so the combined result is the serial one.
 * Node only.
 */
import { parentPort } from 'node:worker_threads';
import { circuitFromJson } from './circuit-json';
import { TrialModel } from './monte-carlo';
import { BlockStreams } from './random';
import { READY_ID, type WorkerReply, type WorkerRequest } from './worker-protocol';

let model: TrialModel | null = null;
let streams: BlockStreams | null = null;

parentPort!.on('message', (msg: WorkerRequest) => {
  try {
    if (msg.type === 'setup') {
      const s = msg.setup;
      model = new TrialModel(circuitFromJson(s.circuit), s.transfer, s.spec, s.frequencyHz, s.mask);
      streams = new BlockStreams(s.seed);
      parentPort!.postMessage({ id: msg.id, results: [] } satisfies WorkerReply);
      return;
    }
    if (!model || !streams) throw new Error('blocks requested before setup');
    const m = model;
    const st = streams;
    const results = m.runBlocks(msg.requests, st);
    const buffers: ArrayBuffer[] = [];
    for (const r of results) {
      for (const a of [r.failuresAt, r.moments.mean, r.moments.m2, r.moments.min, r.moments.max, r.histogram, r.values]) if (a) buffers.push(a.buffer as ArrayBuffer);
    }
    parentPort!.postMessage({ id: msg.id, results } satisfies WorkerReply, buffers);
  } catch (e) {
    parentPort!.postMessage({ id: msg.id, error: e instanceof Error ? `${e.name}: ${e.message}` : String(e) } satisfies WorkerReply);
  }
});

parentPort!.postMessage({ id: READY_ID, results: [] } satisfies WorkerReply);
