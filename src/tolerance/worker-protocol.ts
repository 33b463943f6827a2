/**
 * The message protocol between parallel.node.ts and its worker entry (monte-carlo-worker.node.ts):
 * types and the id of the "ready" message, in a module of their own so that the parent does not
 * import (and run) the worker entry. Browser-safe (no code depends on Node).
 */
import type { TransferSpec } from '../analysis/index';
import type { CircuitJson } from './circuit-json';
import type { BlockRequest, BlockResult } from './monte-carlo';
import type { ToleranceSpec } from './spec';
import type { SpecMask } from './yield';

/** The id of the message a worker posts once its code is loaded. */
export const READY_ID = -1;

/** What the parent sends before a run (structured-cloneable). */
export interface WorkerSetup {
  readonly circuit: CircuitJson;
  readonly transfer: TransferSpec;
  readonly spec: ToleranceSpec;
  readonly frequencyHz: Float64Array;
  readonly mask: SpecMask | null;
  readonly seed: number;
}

export type WorkerRequest =
  | { readonly id: number; readonly type: 'setup'; readonly setup: WorkerSetup }
  | { readonly id: number; readonly type: 'blocks'; readonly requests: readonly BlockRequest[] };

export type WorkerReply = { readonly id: number; readonly results: BlockResult[] } | { readonly id: number; readonly error: string };
