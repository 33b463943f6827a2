/**
 * Board responses at a set of frequencies: gain (dB) and phase (degrees) of V(out)/V(in) for each
 * board, the phase continued from the nominal unwrapped phase as tolerance/monte-carlo.ts does
 * (nominal unwrapped phase + arg(H conj(H0)), so a board's phase sits next to the nominal one rather
 * than jumping by 360 degrees).
 */
import type { CompiledAc } from '../analysis/index';

const DEG = 180 / Math.PI;

export interface BoardResponses {
  readonly frequencyHz: readonly number[];
  /** Nominal (design) response, per frequency. */
  readonly nominalGainDb: Float64Array;
  readonly nominalPhaseDeg: Float64Array;
  /** Per frequency, one value per board. */
  readonly gainDb: Float64Array[];
  readonly phaseDeg: Float64Array[];
}

/**
 * A recorder: reads the nominal response from the engine as it is now (call it with nominal values
 * set), then `record(board)` stores the engine's current response as that board's.
 */
export function createResponseRecorder(engine: CompiledAc, frequenciesHz: readonly number[], boards: number): { responses: BoardResponses; record(board: number): void } {
  const m = frequenciesHz.length;
  const order = frequenciesHz.map((_, i) => i).sort((a, b) => frequenciesHz[a] - frequenciesHz[b]);
  const sweep = engine.sweep(order.map((i) => frequenciesHz[i]), { nodes: 'none' }); // unwrapped upwards in frequency
  const nominalGainDb = new Float64Array(m);
  const nominalPhaseDeg = new Float64Array(m);
  order.forEach((i, k) => {
    nominalGainDb[i] = sweep.gainDb[k];
    nominalPhaseDeg[i] = sweep.phaseDeg[k];
  });
  const h = new Float64Array(2);
  const h0 = frequenciesHz.map((f) => Array.from(engine.transferAt(f, h)));
  const gainDb = frequenciesHz.map(() => new Float64Array(boards));
  const phaseDeg = frequenciesHz.map(() => new Float64Array(boards));
  return {
    responses: { frequencyHz: [...frequenciesHz], nominalGainDb, nominalPhaseDeg, gainDb, phaseDeg },
    record(board: number) {
      for (let i = 0; i < m; i++) {
        engine.transferAt(frequenciesHz[i], h);
        const [r0, i0] = h0[i];
        gainDb[i][board] = 10 * Math.log10(h[0] * h[0] + h[1] * h[1]);
        phaseDeg[i][board] = nominalPhaseDeg[i] + Math.atan2(h[1] * r0 - h[0] * i0, h[0] * r0 + h[1] * i0) * DEG; // arg(H conj(H0))
      }
    },
  };
}
