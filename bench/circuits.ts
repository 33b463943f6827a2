/**
 * The two circuits of the side-by-side benchmark (bench/run.ts), built by hand until the substitution
 * stage lands, so that the benchmark measures the engine and not the synthesis:
 * - a 7th-order Butterworth FDNR lowpass (test/helpers/gic-circuits.ts `fdnrLadder7`: three grounded
 *   GIC FDNRs, six op-amps), 1 kHz;
 * - a 5th-order Butterworth highpass with three grounded GIC simulated inductors (six op-amps), 1 kHz,
 *   {@link gicInductorHighpass5}.
 * Both with the same single-pole op-amp model, and the sweep ranges each is measured over.
 */
import { Circuit } from '../src/netlist/circuit';
import type { OpampModel } from '../src/netlist/opamp';
import { addGic, fdnrLadder7 } from '../test/helpers/gic-circuits';

/** A common general-purpose op-amp: 1 MHz gain-bandwidth, 100 dB open-loop gain (common practice, no source). */
export const BENCH_OPAMP: OpampModel = Object.freeze({ model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 });

/** A logarithmic frequency range (Hz) a benchmark sweeps. */
export interface FrequencyRange {
  readonly startHz: number;
  readonly stopHz: number;
}

export interface BenchCircuit {
  readonly id: string;
  readonly description: string;
  readonly circuit: Circuit;
  /** The range of the 1,000- and 10,000-point sweeps: two decades of passband, one of stopband. */
  readonly sweep: FrequencyRange;
  /** The range of the 16-frequency Monte Carlo: one decade around the 1 kHz edge. */
  readonly monteCarlo: FrequencyRange;
}

/** Rounds to 4 significant digits as a decimal string (an exact value, like a trimmed production part). */
function dec4(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

/** Butterworth ladder values g_k = 2 sin((2k - 1) pi / (2n)) (closed form, e.g. Zverev, "Handbook of Filter Synthesis", 1967; from memory). */
function butterworthG(k: number, n: number): number {
  return 2 * Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
}

/**
 * A 5th-order Butterworth highpass, 1 kHz, 10 kOhm terminations: the shunt-first lowpass prototype
 * C1 L2 C3 L4 C5 under s -> wc/s becomes shunt L1, series C2, shunt L3, series C4, shunt L5
 * (L_k = R0 / (g_k wc), C_k = 1 / (g_k R0 wc)). Each grounded inductor is a GIC with C in position 4,
 * L = C4 R1 R3 R5 / R2 with C4 = 10 nF and R1 = R2 = R3 = 10 kOhm, so R5 = L / (C4 R1). Passband gain 1/2.
 */
export function gicInductorHighpass5(opamp: OpampModel): Circuit {
  const n = 5;
  const cutoffRadPerS = 2 * Math.PI * 1000;
  const r0 = 1e4;
  const gicCapacitorF = 1e-8;
  const gicOhms = 1e4;
  const c = new Circuit().addResistor('RS', 'in', 'p1', dec4(r0));
  const shuntNode = (k: number) => (k === n ? 'out' : `p${k}`);
  for (let k = 1; k <= n; k++) {
    const g = butterworthG(k, n);
    if (k % 2 === 1) {
      const inductanceH = r0 / (g * cutoffRadPerS);
      const r5 = dec4(inductanceH / (gicCapacitorF * gicOhms));
      addGic(c, `G${(k + 1) / 2}`, shuntNode(k), [{ kind: 'R', ohms: dec4(gicOhms) }, { kind: 'R', ohms: dec4(gicOhms) }, { kind: 'R', ohms: dec4(gicOhms) }, { kind: 'C', farads: dec4(gicCapacitorF) }, { kind: 'R', ohms: r5 }], opamp);
    } else {
      c.addCapacitor(`C${k}`, shuntNode(k - 1), shuntNode(k + 1), dec4(1 / (g * r0 * cutoffRadPerS)));
    }
  }
  c.addResistor('RL', 'out', '0', dec4(r0));
  return c;
}

/** The benchmark's circuits with the given op-amp model (default {@link BENCH_OPAMP}). */
export function benchCircuits(opamp: OpampModel = BENCH_OPAMP): BenchCircuit[] {
  return [
    {
      id: 'fdnr-lowpass-7',
      description: '7th-order Butterworth FDNR lowpass, 1 kHz (3 GIC FDNRs, 6 single-pole op-amps)',
      circuit: fdnrLadder7(opamp),
      sweep: { startHz: 10, stopHz: 1e4 },
      monteCarlo: { startHz: 300, stopHz: 3000 },
    },
    {
      id: 'gic-highpass-5',
      description: '5th-order Butterworth simulated-inductor highpass, 1 kHz (3 GIC inductors, 6 single-pole op-amps)',
      circuit: gicInductorHighpass5(opamp),
      sweep: { startHz: 100, stopHz: 1e5 },
      monteCarlo: { startHz: 300, stopHz: 3000 },
    },
  ];
}
