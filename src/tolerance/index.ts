/**
 * Tolerance analysis (browser-safe parts): sensitivities by the adjoint method, linear propagation of
 * uncertainty (JCGM 100), Monte Carlo (JCGM 101) with streaming statistics and adaptive stopping, and
 * yield against a specification mask. The worker-thread runner is Node-only: parallel.node.ts.
 */
export * from './spec';
export * from './distributions';
export * from './random';
export * from './adjoint';
export * from './sensitivity';
export * from './propagation';
export * from './streaming-stats';
export * from './monte-carlo';
export * from './yield';
export * from './estimate-yield';
export * from './circuit-json';
export type { WorkerReply, WorkerRequest, WorkerSetup } from './worker-protocol';
