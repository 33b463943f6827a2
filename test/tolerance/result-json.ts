import type { MonteCarloResult } from '../../src/tolerance/monte-carlo';

/** Everything in a result as JSON (typed arrays as plain arrays), for byte-level comparisons. */
export function resultJson(r: MonteCarloResult): string {
  return JSON.stringify(r, (_k, v) => (ArrayBuffer.isView(v) ? Array.from(v as Float64Array) : v));
}
