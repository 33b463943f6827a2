/**
 * frequencyResponse (DESIGN.md, the public contract): V(out)/V(in) of the realised circuit with the
 * chosen parts and the spec's op-amp model, from the compiled float AC engine (analysis/ac-engine.ts:
 * unwrapped phase, exact-derivative group delay). The engine is compiled once per design and cached.
 */
import { compileAc, type CompiledAc } from '../analysis/ac-engine';
import { InvalidInputError } from '../errors';
import type { FilterDesign } from './design-filter';

export interface FrequencyResponse {
  readonly frequencyHz: number[];
  readonly gainDb: number[];
  /** Unwrapped along the frequencies in the order given, degrees. */
  readonly phaseDeg: number[];
  readonly groupDelayS: number[];
}

const engines = new WeakMap<FilterDesign, CompiledAc>();

/** The most frequencies one call accepts (a 1M-point sweep is a mistake, not a plot). */
export const MAX_RESPONSE_POINTS = 1_000_000;

/**
 * The response of `design` at `frequenciesHz` (each finite and > 0). Throws InvalidInputError naming
 * `frequenciesHz[i]` for a bad frequency and 'design' for something that is not a FilterDesign.
 *
 * @example
 * // const r = frequencyResponse(designFilter(spec), [100, 1000, 10000]); r.gainDb[1] is the gain at 1 kHz
 */
export function frequencyResponse(design: FilterDesign, frequenciesHz: readonly number[]): FrequencyResponse {
  if (typeof design !== 'object' || design === null || !design.circuit) throw new InvalidInputError('INVALID_ARGUMENT', 'design', design, 'must be a FilterDesign from designFilter');
  if (!Array.isArray(frequenciesHz) || frequenciesHz.length > MAX_RESPONSE_POINTS) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'frequenciesHz', frequenciesHz, `must be an array of at most ${MAX_RESPONSE_POINTS} frequencies`);
  }
  frequenciesHz.forEach((f, i) => {
    if (typeof f !== 'number' || !Number.isFinite(f) || f <= 0) throw new InvalidInputError('OUT_OF_RANGE', `frequenciesHz[${i}]`, f, 'must be a finite frequency > 0 in Hz');
  });
  let engine = engines.get(design);
  if (!engine) {
    engine = compileAc(design.circuit, { input: 'VIN', output: 'out' });
    engines.set(design, engine);
  }
  const s = engine.sweep(frequenciesHz, { nodes: 'none' });
  return { frequencyHz: [...frequenciesHz], gainDb: Array.from(s.gainDb), phaseDeg: Array.from(s.phaseDeg), groupDelayS: Array.from(s.groupDelayS) };
}
