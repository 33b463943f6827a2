/**
 * Monte Carlo boards kept one by one: the component values of every trial, so that a firmware trim can
 * be simulated board by board (measure, choose a code, apply it, measure again).
 *
 * The boards are the *same* trials as tolerance/monte-carlo.ts's runMonteCarlo for the same circuit,
 * tolerance specification, seed and block size: the same random streams (tolerance/random.ts
 * BlockStreams, one per block of trials), the same value model (tolerance/spec.ts: value = nominal *
 * (1 + delta_group + delta_part) * (1 + alpha (T - T_ref))) and the same draw order within a trial
 * (temperature, group offsets, then the inputs in specification order): tolerance/trial-draw.ts. A test
 * checks that the gain statistics agree with runMonteCarlo's. runMonteCarlo does not keep the trials'
 * values (it streams statistics), hence this sampler.
 *
 * Memory: trials x toleranced inputs doubles (10^4 boards x 40 inputs = 3.2 MB).
 */
import { requireInteger } from '../errors';
import { compileAc, type CompiledAc, type TransferSpec } from '../analysis/index';
import type { Circuit } from '../netlist/index';
import { resolveTolerances, type ToleranceSpec } from '../tolerance/spec';
import { TrialDraw } from '../tolerance/trial-draw';
import { BlockStreams, DEFAULT_BLOCK_SIZE } from '../tolerance/random';

export interface BoardSampleOptions {
  readonly trials: number;
  /** 32-bit integer seed (as runMonteCarlo's). */
  readonly seed: number;
  /** As runMonteCarlo's blockSize (default the same); the boards depend on it. */
  readonly blockSize?: number;
}

/** The sampled boards and the engine to evaluate them with. */
export interface BoardSample {
  /** The circuit the boards are of. */
  readonly circuit: Circuit;
  /** The compiled circuit (nominal values until {@link BoardSample.apply}). */
  readonly engine: CompiledAc;
  /** Number of boards. */
  readonly count: number;
  /** Compiled parameter names that vary, in the order of a board's values. */
  readonly parameters: readonly string[];
  /** Engine parameter indices of {@link BoardSample.parameters}. */
  readonly slots: Int32Array;
  /** Nominal values of the varying parameters. */
  readonly nominal: Float64Array;
  /** Board-major values: board b's value of parameter i is values[b * parameters.length + i]. */
  readonly values: Float64Array;
  /** Sets board b's values into the engine. */
  apply(board: number): void;
  /** Puts the nominal values back. */
  restoreNominal(): void;
  /** Board b's value of a named parameter (for one that does not vary: the engine's current value). */
  valueOf(board: number, parameter: string): number;
}

/** Draws `trials` boards for `circuit` under `spec`: the trials of runMonteCarlo with the same seed and block size. */
export function sampleBoards(circuit: Circuit, transfer: TransferSpec, spec: ToleranceSpec, options: BoardSampleOptions): BoardSample {
  const trials = requireInteger(options?.trials, 'options.trials', 1, 1e7);
  const seed = requireInteger(options.seed, 'options.seed', -(2 ** 31), 2 ** 31 - 1);
  const blockSize = requireInteger(options.blockSize ?? DEFAULT_BLOCK_SIZE, 'options.blockSize', 1, 2 ** 20);
  const tol = resolveTolerances(circuit, spec);
  const engine = compileAc(circuit, transfer);
  const parameters = tol.inputs.map((i) => i.parameter);
  const draws = TrialDraw.forEngine(tol, engine); // runMonteCarlo's draw order and value model
  const { slots, nominal } = draws;
  const q = slots.length;
  const values = new Float64Array(trials * q);
  const streams = new BlockStreams(seed);
  for (let block = 0; block * blockSize < trials; block++) {
    const rng = streams.generatorFor(block);
    const end = Math.min(trials, (block + 1) * blockSize);
    for (let b = block * blockSize; b < end; b++) draws.draw(rng, values, b * q);
  }
  const index = new Map(parameters.map((p, i) => [p, i]));
  return {
    circuit,
    engine,
    count: trials,
    parameters,
    slots,
    nominal,
    values,
    apply(board: number) {
      engine.setParameters(slots, values.subarray(board * q, board * q + q));
    },
    restoreNominal() {
      engine.setParameters(slots, nominal);
    },
    valueOf(board: number, parameter: string) {
      const i = index.get(parameter);
      return i === undefined ? engine.parameters[engine.parameterIndex(parameter)] : values[board * q + i];
    },
  };
}
