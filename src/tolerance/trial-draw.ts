/**
 * One trial's values from a random stream: the draw order and the value model every Monte Carlo of
 * this project shares (runMonteCarlo's trials, production/boards.ts's kept boards, the benchmark's
 * ngspice replay), so that the same seed and block give the same boards everywhere.
 *
 * Order within a trial: the temperature (when the spec has a range), each group's common offset in
 * spec order, then each input's own deviation in spec order. Value model (spec.ts): value = nominal *
 * (1 + delta_group + delta_part) * (1 + alpha (T - T_ref)).
 */
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import { sampleDeviation } from './distributions';
import type { CompiledAc } from '../analysis/index';
import type { ResolvedTolerances } from './spec';

export class TrialDraw {
  private readonly tempco: Float64Array;
  private readonly groupOf: Int32Array;
  private readonly groupDelta: Float64Array;

  /**
   * The draw for `tol`'s inputs with the engine's current values as nominal: `slots[i]` is the engine
   * parameter of `tol.inputs[i]`, so `engine.setParameters(draw.slots, values)` applies a trial.
   */
  static forEngine(tol: ResolvedTolerances, engine: CompiledAc): TrialDraw {
    const slots = Int32Array.from(tol.inputs, (i) => engine.parameterIndex(i.parameter));
    return new TrialDraw(tol, slots, Float64Array.from(slots, (s) => engine.parameters[s]));
  }

  private constructor(
    private readonly tol: ResolvedTolerances,
    /** Engine parameter index of each input. */
    readonly slots: Int32Array,
    /** Nominal value of each input. */
    readonly nominal: Float64Array,
  ) {
    this.tempco = Float64Array.from(tol.inputs.map((i) => i.tempcoPerK));
    this.groupOf = Int32Array.from(tol.inputs.map((i) => i.group));
    this.groupDelta = new Float64Array(tol.groups.length);
  }

  /** Number of values a trial has (the toleranced inputs). */
  get size(): number {
    return this.nominal.length;
  }

  /** Draws one trial into out[at], ..., out[at + size - 1]. No allocation. */
  draw(rng: RandomGenerator, out: Float64Array, at = 0): void {
    const { tol, nominal, tempco, groupOf, groupDelta } = this;
    const t = tol.temperature;
    let dT = 0;
    if (t) dT = (t.maxC > t.minC ? t.minC + (t.maxC - t.minC) * uniformFloat64(rng) : t.minC) - t.referenceC;
    for (let g = 0; g < groupDelta.length; g++) groupDelta[g] = sampleDeviation(rng, tol.groups[g]);
    const inputs = tol.inputs;
    for (let i = 0; i < nominal.length; i++) {
      const g = groupOf[i];
      const d = sampleDeviation(rng, inputs[i]) + (g >= 0 ? groupDelta[g] : 0);
      out[at + i] = nominal[i] * (1 + d) * (1 + tempco[i] * dT);
    }
  }
}
