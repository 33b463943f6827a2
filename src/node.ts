/**
 * The Node-only entry `gicladder/node`: what needs worker threads or the file system. The core
 * (`gicladder`) stays free of Node built-ins so it bundles for browsers.
 */
export { MonteCarloWorkerPool, runMonteCarloParallel, startWorker, type ParallelMonteCarloOptions } from './tolerance/parallel.node.js';
