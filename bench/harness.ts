/**
 * The work the side-by-side benchmark gives both simulators, and the comparison of their answers (the
 * correctness part, which test/bench/harness.test.ts also runs). Timing lives in bench/run.ts.
 *
 * - Sweeps: gicladder exports the circuit with circuitToSpice; ngspice runs `ac dec N start stop` on it
 *   and writes V(out) at 17 digits; gicladder evaluates the same circuit at exactly the frequencies
 *   ngspice reports (so the comparison is point for point), with the compiled engine (a full MNA solve
 *   per point) and with the factored exact transfer function.
 * - Monte Carlo: gicladder's runMonteCarlo (src/tolerance) draws every R and C of each trial (uniform
 *   within its tolerance, seeded); the same values are drawn again here and pasted into an ngspice
 *   `.control` script as `alter` commands, one `ac` per trial, so both sides simulate the same boards
 *   and are compared trial by trial (and by their statistics).
 */
import { circuitToSpice } from '../src/export/spice';
import { compileAc, type CompiledAc } from '../src/analysis/ac-engine';
import type { FloatTransferFunction } from '../src/analysis/factored-response';
import type { Circuit } from '../src/netlist/circuit';
import { TrialDraw } from '../src/tolerance/trial-draw';
import { BlockStreams, DEFAULT_BLOCK_SIZE } from '../src/tolerance/random';
import type { MonteCarloResult } from '../src/tolerance/monte-carlo';
import { resolveTolerances, type ToleranceSpec } from '../src/tolerance/spec';
import type { AcPoint } from '../test/helpers/ngspice';
import type { FrequencyRange } from './circuits';
import { AC_SETUP, readAcData, runNgspiceScript, type NgspiceRun } from './ngspice-driver';

/** The transfer every benchmark measures: V(out) / V(in). */
export const TRANSFER = Object.freeze({ input: 'in', output: 'out' });

/** The data file the scripts write. */
const DATA_FILE = 'ac.txt';

/** The `ac` command of a logarithmic sweep. */
export function acCommand(range: FrequencyRange, pointsPerDecade: number): string {
  return `ac dec ${pointsPerDecade} ${range.startHz.toExponential()} ${range.stopHz.toExponential()}`;
}

/** gicladder's SPICE export of the circuit (the netlist ngspice simulates; its `.ac` card is replaced by the scripts' own `ac`). */
export function exportNetlist(circuit: Circuit, title: string): string {
  return circuitToSpice(circuit, { title });
}

/** ngspice's AC sweep of the netlist: V(out) at each frequency it chose, and the run (wall time, log). */
export function ngspiceSweep(netlist: string, range: FrequencyRange, pointsPerDecade: number): { points: AcPoint[]; run: NgspiceRun } {
  const run = runNgspiceScript(netlist, [...AC_SETUP, acCommand(range, pointsPerDecade), `wrdata ${DATA_FILE} real(v(out)) imag(v(out))`, 'rusage acTime', 'quit'], [DATA_FILE]);
  return { points: readAcData(run.files[DATA_FILE]), run };
}

/** 20 log10 |re + j im|. */
function gainDbOf(re: number, im: number): number {
  return 20 * Math.log10(Math.hypot(re, im));
}

/** Phase difference of two complex numbers in degrees, in (-180, 180]. */
function phaseDifferenceDeg(ar: number, ai: number, br: number, bi: number): number {
  // arg(a conj(b)) avoids unwrapping either phase
  return (Math.atan2(ai * br - ar * bi, ar * br + ai * bi) * 180) / Math.PI;
}

export interface ResponseDifference {
  readonly points: number;
  /** max |gain_gicladder - gain_ngspice| over the points (dB). */
  readonly maxGainDb: number;
  /** max |phase difference| (degrees). */
  readonly maxPhaseDeg: number;
  /** The frequency of the largest gain difference (Hz). */
  readonly worstFrequencyHz: number;
}

/** Folds per-point responses into a {@link ResponseDifference}; `h(i)` writes gicladder's H at point i into out. */
function compare(points: readonly AcPoint[], h: (i: number, out: Float64Array) => void): ResponseDifference {
  const out = new Float64Array(2);
  let maxGainDb = 0;
  let maxPhaseDeg = 0;
  let worstFrequencyHz = NaN;
  points.forEach((p, i) => {
    h(i, out);
    const dDb = Math.abs(gainDbOf(out[0], out[1]) - gainDbOf(p.re, p.im));
    const dDeg = Math.abs(phaseDifferenceDeg(out[0], out[1], p.re, p.im));
    if (!(dDb <= maxGainDb)) {
      maxGainDb = dDb; // NaN propagates: a non-finite response is the worst difference
      worstFrequencyHz = p.frequencyHz;
    }
    if (!(dDeg <= maxPhaseDeg)) maxPhaseDeg = dDeg;
  });
  return { points: points.length, maxGainDb, maxPhaseDeg, worstFrequencyHz };
}

/** The compiled engine's H at ngspice's frequencies against ngspice's V(out). */
export function compareEngine(engine: CompiledAc, points: readonly AcPoint[]): ResponseDifference {
  return compare(points, (i, out) => engine.transferAt(points[i].frequencyHz, out));
}

/** The factored exact transfer function at ngspice's frequencies against ngspice's V(out). */
export function compareFactored(h: FloatTransferFunction, points: readonly AcPoint[]): ResponseDifference {
  return compare(points, (i, out) => {
    const v = h.evaluate({ re: 0, im: 2 * Math.PI * points[i].frequencyHz });
    out[0] = v.re;
    out[1] = v.im;
  });
}

/** Compiles the circuit and compares its sweep with ngspice's (the harness's correctness check). */
export function crossCheckSweep(circuit: Circuit, range: FrequencyRange, pointsPerDecade: number): ResponseDifference {
  const { points } = ngspiceSweep(exportNetlist(circuit, 'gicladder cross-check'), range, pointsPerDecade);
  return compareEngine(compileAc(circuit, TRANSFER), points);
}

// ---------------------------------------------------------------- Monte Carlo

/** Tolerances of the benchmark's boards: 1 % resistors, 2 % capacitors, uniform (common practice, no source). */
export const RESISTOR_TOLERANCE = 0.01;
export const CAPACITOR_TOLERANCE = 0.02;

/** The boards of a Monte Carlo: `values[t * names.length + k]` is part `names[k]` in trial t. */
export interface MonteCarloBoards {
  readonly names: readonly string[];
  readonly trials: number;
  readonly values: Float64Array;
}

/** The benchmark's tolerance specification: every R and C of the circuit, uniform within tolerance. */
export function benchToleranceSpec(circuit: Circuit): ToleranceSpec {
  const parts = circuit.elements.filter((e) => e.kind === 'R' || e.kind === 'C');
  return { parts: parts.map((e) => ({ element: e.name, tolerance: e.kind === 'R' ? RESISTOR_TOLERANCE : CAPACITOR_TOLERANCE, distribution: 'uniform' as const })) };
}

/**
 * The boards gicladder's runMonteCarlo (tolerance/monte-carlo.ts) simulates for this spec and seed,
 * drawn with the same TrialDraw (tolerance/trial-draw.ts) from block b's generator of BlockStreams.
 * Valid for part tolerances (the alter cards set element values; op-amp gain-bandwidth tolerances are
 * refused); the harness test checks that runMonteCarlo's statistics equal those of these boards.
 */
export function drawMonteCarloBoards(circuit: Circuit, spec: ToleranceSpec, trials: number, seed: number, blockSize = DEFAULT_BLOCK_SIZE): MonteCarloBoards {
  const tol = resolveTolerances(circuit, spec);
  if (tol.inputs.some((i) => i.parameter !== i.name)) throw new Error('drawMonteCarloBoards: only part tolerances are replayed (alter cards set element values)');
  const engine = compileAc(circuit, TRANSFER);
  const draws = TrialDraw.forEngine(tol, engine);
  const streams = new BlockStreams(seed);
  const p = tol.inputs.length;
  const values = new Float64Array(trials * p);
  for (let block = 0; block * blockSize < trials; block++) {
    const rng = streams.generatorFor(block);
    for (let t = block * blockSize; t < Math.min(trials, (block + 1) * blockSize); t++) draws.draw(rng, values, t * p);
  }
  return { names: tol.inputs.map((i) => i.parameter), trials, values };
}

/**
 * The SPICE name of each circuit element in circuitToSpice's output. The export writes one card per
 * element in circuit order (R, C and op-amp instances here; the circuits have no FDNR elements, which
 * would take five cards), after the header comments and the added VIN line.
 */
export function spiceElementNames(circuit: Circuit, netlist: string): Map<string, string> {
  const lines = netlist.split('\n').slice(1);
  const cards = lines.filter((l) => l.length > 0 && !l.startsWith('*') && !l.startsWith('.') && !/^VIN\s/.test(l));
  const names = new Map<string, string>();
  let i = 0;
  for (const e of circuit.elements) {
    const letter = e.kind === 'OPAMP' ? 'X' : e.kind;
    const card = cards[i++];
    const name = card?.split(/\s+/)[0] ?? '';
    if (name[0]?.toUpperCase() !== letter) throw new Error(`spiceElementNames: element ${e.name} (${e.kind}) does not match card ${JSON.stringify(card)}`);
    names.set(e.name, name);
  }
  return names;
}

/**
 * The ngspice script of a Monte Carlo: per trial an `alter` of every R and C with the drawn value
 * (JavaScript's shortest round-trip digits, as circuitToSpice writes values), one `ac` at the 16
 * frequencies, V(out) appended to the data file, the plot dropped. `rusage cputime` before and after
 * the trials gives the loop's in-process time; `rusage acTime` the AC analyses alone.
 */
export function monteCarloScript(boards: MonteCarloBoards, spiceNames: ReadonlyMap<string, string>, range: FrequencyRange, pointsPerDecade: number): string[] {
  const lines = [...AC_SETUP, 'set appendwrite', 'echo MC_START', 'rusage cputime'];
  const ac = acCommand(range, pointsPerDecade);
  const p = boards.names.length;
  const spice = boards.names.map((n) => spiceNames.get(n)!);
  for (let t = 0; t < boards.trials; t++) {
    for (let k = 0; k < p; k++) lines.push(`alter ${spice[k]} = ${boards.values[t * p + k].toExponential()}`);
    lines.push(ac, `wrdata ${DATA_FILE} real(v(out)) imag(v(out))`, 'destroy all');
  }
  lines.push('echo MC_END', 'rusage cputime', 'rusage acTime', 'quit');
  return lines;
}

/** Runs the ngspice Monte Carlo; `points[t * f + i]` is trial t at frequency i. */
export function ngspiceMonteCarlo(netlist: string, boards: MonteCarloBoards, spiceNames: ReadonlyMap<string, string>, range: FrequencyRange, pointsPerDecade: number): { points: AcPoint[]; run: NgspiceRun } {
  const run = runNgspiceScript(netlist, monteCarloScript(boards, spiceNames, range, pointsPerDecade), [DATA_FILE]);
  return { points: readAcData(run.files[DATA_FILE]), run };
}

/** Parameter slots of the boards' parts in a compiled engine. */
export function partSlots(engine: CompiledAc, boards: MonteCarloBoards): Int32Array {
  return Int32Array.from(boards.names, (n) => engine.parameterIndex(n));
}

/**
 * gicladder's Monte Carlo over the same boards with the compiled engine: per trial every part set by
 * setParameter, then H at each frequency; writes H into re/im (`[t * f + i]`). Restores nothing: the
 * engine keeps the last board's values.
 */
export function engineMonteCarlo(engine: CompiledAc, slots: Int32Array, boards: MonteCarloBoards, frequenciesHz: Float64Array, re: Float64Array, im: Float64Array): void {
  const p = slots.length;
  const f = frequenciesHz.length;
  const h = new Float64Array(2);
  const v = boards.values;
  for (let t = 0; t < boards.trials; t++) {
    for (let k = 0; k < p; k++) engine.setParameter(slots[k], v[t * p + k]);
    for (let i = 0; i < f; i++) {
      engine.transferAt(frequenciesHz[i], h);
      re[t * f + i] = h[0];
      im[t * f + i] = h[1];
    }
  }
}

/** Compares gicladder's Monte Carlo responses with ngspice's, trial by trial and frequency by frequency. */
export function compareMonteCarlo(points: readonly AcPoint[], re: Float64Array, im: Float64Array): ResponseDifference {
  if (points.length !== re.length) throw new Error(`compareMonteCarlo: ngspice returned ${points.length} points, gicladder ${re.length}`);
  return compare(points, (i, out) => {
    out[0] = re[i];
    out[1] = im[i];
  });
}

/**
 * runMonteCarlo's gain statistics (mean, standard deviation, min, max per frequency) against the same
 * statistics of ngspice's trials (`points[t * f + i]`): the largest absolute difference in dB. Equal
 * boards give differences at the level of the trial-by-trial ones; other boards give the sampling spread.
 */
export function compareGainStatistics(points: readonly AcPoint[], result: MonteCarloResult): number {
  const f = result.frequencyHz.length;
  const trials = points.length / f;
  let worst = 0;
  for (let i = 0; i < f; i++) {
    const g = Array.from({ length: trials }, (_, t) => gainDbOf(points[t * f + i].re, points[t * f + i].im));
    const mean = g.reduce((a, b) => a + b, 0) / trials;
    const sd = Math.sqrt(g.reduce((a, b) => a + (b - mean) ** 2, 0) / (trials - 1));
    for (const d of [mean - result.gainDb.mean[i], sd - result.gainDb.standardDeviation[i], Math.min(...g) - result.gainDb.min[i], Math.max(...g) - result.gainDb.max[i]]) {
      if (!(Math.abs(d) <= worst)) worst = Math.abs(d);
    }
  }
  return worst;
}
