/**
 * Yield of a circuit against a specification mask in one call: the mask's own frequency grid
 * (yield.ts maskFrequencyGrid), a Monte Carlo run on it (monte-carlo.ts), and the Wilson interval of
 * the pass fraction. Failed (non-finite) trials count as failing boards.
 */
import type { TransferSpec } from '../analysis/index';
import type { Circuit } from '../netlist/index';
import { runMonteCarlo, type MonteCarloOptions, type MonteCarloResult, type MonteCarloYield } from './monte-carlo';
import type { ToleranceSpec } from './spec';
import { DEFAULT_POINTS_PER_BAND, maskFrequencyGrid, type SpecMask } from './yield';

export interface YieldOptions extends Omit<MonteCarloOptions, 'frequenciesHz' | 'mask'> {
  /** Grid points per band (default {@link DEFAULT_POINTS_PER_BAND}); ignored when frequenciesHz is given. */
  readonly pointsPerBand?: number;
  /** An explicit grid instead of the mask's. */
  readonly frequenciesHz?: ArrayLike<number>;
}

export interface YieldEstimate extends MonteCarloYield {
  /** The whole Monte Carlo result on the grid (gain and phase statistics per frequency). */
  readonly monteCarlo: MonteCarloResult;
}

/**
 * @example
 * const y = estimateYield(circuit, { input: 'in', output: 'out' }, spec,
 *   { passband: [{ fromHz: 0, toHz: 1000, minGainDb: -6.5, maxGainDb: -5.5 }], stopband: [] }, { trials: 10_000, seed: 1 });
 * [y.low, y.estimate, y.high]; // 95 % Wilson interval by default (coverageProbability)
 */
export function estimateYield(circuit: Circuit, transfer: TransferSpec, spec: ToleranceSpec, mask: SpecMask, options: YieldOptions): YieldEstimate {
  const frequenciesHz = options.frequenciesHz ?? maskFrequencyGrid(mask, options.pointsPerBand ?? DEFAULT_POINTS_PER_BAND);
  const monteCarlo = runMonteCarlo(circuit, transfer, spec, { ...options, frequenciesHz, mask });
  return { ...monteCarlo.yield!, monteCarlo };
}
