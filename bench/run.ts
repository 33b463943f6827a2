/**
 * gicladder side by side with ngspice (issue 10). Run: npm run bench (needs ngspice on PATH, or NGSPICE
 * naming the executable). Writes bench/results.json and bench/results.md and prints the table.
 *
 * For each circuit of bench/circuits.ts, on the same netlist (gicladder's circuitToSpice export):
 * - 1,000- and 10,001-point logarithmic AC sweeps (ngspice's `ac dec` gives 10,001 points for 3,333
 *   per decade over three decades; gicladder evaluates exactly ngspice's frequencies);
 * - a 1,000-trial Monte Carlo at 16 frequencies, the same boards on both sides;
 * - the exact transfer function (gicladder only).
 * What each figure includes:
 * - gicladder "engine": CompiledAc.sweep with every node voltage, gain, unwrapped phase and exact group
 *   delay, i.e. a fill + sparse LU + two substitutions of the full MNA system per point (in-process, the
 *   compiled engine reused; compilation reported apart);
 * - gicladder "factored": FloatTransferFunction.sweepInto (gain, phase into caller arrays) of the exact H in second-order
 *   sections; building it is the "exact transfer function" and "factored form" rows;
 * - ngspice "process": the whole `ngspice -b` process: start-up, parsing and expanding the netlist, the
 *   analysis and writing V(out) as text (bash's `time`: real, and user + system);
 * - ngspice "in-process" sweep: several `ac` runs in one process; wall = its own `rusage acTime` per run
 *   (the AC analysis alone), CPU = (CPU of that process - CPU of a process that only loads the netlist)
 *   per run;
 * - Monte Carlo, ngspice in-process: the scripted trials (alter of every R and C, ac, wrdata append,
 *   destroy); wall = `rusage cputime` (elapsed) around them, CPU = (process - idle process), which also
 *   counts reading the long script; and the ac analyses alone (acTime). gicladder: runMonteCarlo
 *   (compiling, drawing, per trial setParameter of every R and C and H at 16 frequencies, streaming
 *   statistics, exact quantiles), and apart the engine loop alone on the pre-drawn boards. ngspice reads
 *   the boards runMonteCarlo draws from its script (drawing is outside its time).
 * Two clocks, because the machine may be shared: wall time (what a user waits) and CPU time (user +
 * system of the process: ngspice's from bash, gicladder's from process.cpuUsage, all threads), which
 * other processes' load disturbs much less.
 * Every time is the median of several repetitions after warm-up runs.
 */
import { writeFileSync } from 'node:fs';
import { availableParallelism, cpus, loadavg } from 'node:os';
import { compileAc } from '../src/analysis/ac-engine';
import { toFloatTransferFunction } from '../src/analysis/factored-response';
import { transferFunction } from '../src/analysis/transfer-function';
import { runMonteCarlo } from '../src/tolerance/monte-carlo';
import { ngspiceStatus } from '../test/helpers/ngspice';
import { BENCH_OPAMP, benchCircuits, type BenchCircuit } from './circuits';
import {
  acCommand,
  compareEngine,
  compareFactored,
  benchToleranceSpec,
  compareGainStatistics,
  compareMonteCarlo,
  drawMonteCarloBoards,
  engineMonteCarlo,
  exportNetlist,
  ngspiceMonteCarlo,
  ngspiceSweep,
  partSlots,
  spiceElementNames,
  TRANSFER,
  type ResponseDifference,
} from './harness';
import { acAnalysisTimesS, AC_SETUP, runNgspiceScript } from './ngspice-driver';

/** Targets of issue 10. */
const SWEEP_SPEEDUP_TARGET = 50;
const MONTE_CARLO_SPEEDUP_TARGET = 30;
const MAX_DIFFERENCE_DB = 1e-4;

/** Sweep sizes: points per decade over each circuit's three decades (333 -> 1,000 points, 3,333 -> 10,001). */
const SWEEPS = [
  { label: '1,000-point sweep', pointsPerDecade: 333, inProcessRuns: 40 },
  { label: '10,001-point sweep', pointsPerDecade: 3333, inProcessRuns: 5 },
];
/** One decade at 15 per decade: 16 frequencies. */
const MONTE_CARLO_POINTS_PER_DECADE = 15;
const MONTE_CARLO_TRIALS = 1000;
const MONTE_CARLO_SEED = 20240610;
/** Repetitions: ngspice processes (each is slow) and gicladder samples. */
const NGSPICE_WARMUP = 1;
const NGSPICE_REPEATS = 7;
const NGSPICE_MC_REPEATS = 3;
const GICLADDER_WARMUP = 5;
const GICLADDER_REPEATS = 15;

function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/** A time on both clocks (ms): wall (performance.now / bash's real) and CPU (user + system). */
interface Times {
  readonly wallMs: number;
  readonly cpuMs: number;
}

const scale = (t: Times, k: number): Times => ({ wallMs: t.wallMs * k, cpuMs: t.cpuMs * k });

/**
 * Medians (each clock apart) of `samples` samples of f after `warmup` untimed calls, per call; a
 * sample times `inner` calls (for sub-millisecond work, where one call is near the clocks' resolution
 * and a single collection skews it). CPU: process.cpuUsage, all threads.
 */
function timeIt(f: () => void, warmup = GICLADDER_WARMUP, samples = GICLADDER_REPEATS, inner = 1): Times {
  for (let i = 0; i < warmup; i++) f();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let k = 0; k < samples; k++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    for (let i = 0; i < inner; i++) f();
    wall.push((performance.now() - t0) / inner);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000 / inner);
  }
  return { wallMs: median(wall), cpuMs: median(cpu) };
}

/** Runs `f` warmup + repeats times and returns the last `repeats` results. */
function repeat<T>(f: () => T, warmup: number, repeats: number): T[] {
  return Array.from({ length: warmup + repeats }, f).slice(warmup);
}

interface Row {
  readonly circuit: string;
  readonly work: string;
  readonly gicladder: string;
  readonly gicladderTimes: Times;
  /** ngspice, the whole `ngspice -b` process. */
  readonly ngspiceProcess: Times | null;
  /** ngspice, in-process: wall from its rusage, CPU from the difference to a run without the work. */
  readonly ngspiceInProcess: Times | null;
  /** What ngspiceInProcess is. */
  readonly ngspiceInProcessIs: string;
  readonly difference: ResponseDifference | null;
  readonly note?: string;
}

/** CPU time (ms) of an ngspice process that loads the netlist and does nothing: the baseline of the CPU differences. */
function ngspiceBaselineCpuMs(netlist: string): number {
  return median(repeat(() => runNgspiceScript(netlist, [...AC_SETUP, 'quit']).cpuMs, NGSPICE_WARMUP, NGSPICE_REPEATS));
}

function benchSweeps(bc: BenchCircuit, rows: Row[]): void {
  const netlist = exportNetlist(bc.circuit, bc.id);
  const engine = compileAc(bc.circuit, TRANSFER);
  const h = transferFunction(bc.circuit, TRANSFER);
  const factored = toFloatTransferFunction(h);
  const baselineCpuMs = ngspiceBaselineCpuMs(netlist);
  for (const s of SWEEPS) {
    const { points } = ngspiceSweep(netlist, bc.sweep, s.pointsPerDecade);
    const frequencies = Float64Array.from(points, (p) => p.frequencyHz);
    const single = repeat(() => ngspiceSweep(netlist, bc.sweep, s.pointsPerDecade).run, NGSPICE_WARMUP, NGSPICE_REPEATS);
    const processTimes = { wallMs: median(single.map((r) => r.wallMs)), cpuMs: median(single.map((r) => r.cpuMs)) };
    const script = [...AC_SETUP];
    for (let k = 0; k < s.inProcessRuns; k++) script.push(acCommand(bc.sweep, s.pointsPerDecade), 'destroy all');
    script.push('rusage acTime', 'quit');
    const multi = repeat(() => runNgspiceScript(netlist, script), NGSPICE_WARMUP, NGSPICE_REPEATS);
    const inProcess = {
      wallMs: median(multi.map((r) => (1000 * acAnalysisTimesS(r.log).at(-1)!) / s.inProcessRuns)),
      cpuMs: (median(multi.map((r) => r.cpuMs)) - baselineCpuMs) / s.inProcessRuns,
    };
    const what = `${s.inProcessRuns} sweeps in one process: wall = acTime / ${s.inProcessRuns}, CPU = (process - idle process) / ${s.inProcessRuns}`;
    const work = `${s.label} (${points.length} points)`;
    const engineTimes = timeIt(() => engine.sweep(frequencies, { nodes: 'all' }));
    // into caller arrays (sweepInto): the allocating sweep() adds collections of this process's large
    // heap (every node's voltages of the engine sweeps) that have nothing to do with the sweep
    const gainOut = new Float64Array(frequencies.length);
    const phaseOut = new Float64Array(frequencies.length);
    const factoredTimes = timeIt(() => factored.sweepInto(frequencies, gainOut, phaseOut), 5 * GICLADDER_WARMUP, GICLADDER_REPEATS, 20);
    rows.push({ circuit: bc.id, work, gicladder: 'engine: full MNA solve per point; all node voltages, gain, phase, group delay', gicladderTimes: engineTimes, ngspiceProcess: processTimes, ngspiceInProcess: inProcess, ngspiceInProcessIs: what, difference: compareEngine(engine, points) });
    rows.push({ circuit: bc.id, work, gicladder: 'factored exact H (sections): gain, phase into caller arrays (sweepInto)', gicladderTimes: factoredTimes, ngspiceProcess: processTimes, ngspiceInProcess: inProcess, ngspiceInProcessIs: what, difference: compareFactored(factored, points) });
  }
}

function benchMonteCarlo(bc: BenchCircuit, rows: Row[]): void {
  const netlist = exportNetlist(bc.circuit, bc.id);
  const spec = benchToleranceSpec(bc.circuit);
  const boards = drawMonteCarloBoards(bc.circuit, spec, MONTE_CARLO_TRIALS, MONTE_CARLO_SEED);
  const names = spiceElementNames(bc.circuit, netlist);
  const baselineCpuMs = ngspiceBaselineCpuMs(netlist);
  const runs = repeat(() => ngspiceMonteCarlo(netlist, boards, names, bc.monteCarlo, MONTE_CARLO_POINTS_PER_DECADE), NGSPICE_WARMUP, NGSPICE_MC_REPEATS);
  const { points } = runs[0];
  const perTrial = 1 / MONTE_CARLO_TRIALS;
  const processTimes = scale({ wallMs: median(runs.map((r) => r.run.wallMs)), cpuMs: median(runs.map((r) => r.run.cpuMs)) }, perTrial);
  const loopTimes = scale({ wallMs: median(runs.map((r) => 1000 * loopElapsedS(r.run.log))), cpuMs: median(runs.map((r) => r.run.cpuMs)) - baselineCpuMs }, perTrial);
  const acOnlyWallMs = perTrial * median(runs.map((r) => 1000 * acAnalysisTimesS(r.run.log).at(-1)!));
  const f = MONTE_CARLO_POINTS_PER_DECADE + 1;
  const frequencies = Float64Array.from(points.slice(0, f), (p) => p.frequencyHz);
  // the library's Monte Carlo: compile, draws, trials, streaming statistics and exact quantiles
  const options = { frequenciesHz: frequencies, trials: MONTE_CARLO_TRIALS, seed: MONTE_CARLO_SEED };
  const libraryTimes = scale(timeIt(() => runMonteCarlo(bc.circuit, TRANSFER, spec, options), 2, 9), perTrial);
  const statsDb = compareGainStatistics(points, runMonteCarlo(bc.circuit, TRANSFER, spec, options));
  // the same boards through the compiled engine, trial by trial
  const engine = compileAc(bc.circuit, TRANSFER);
  const slots = partSlots(engine, boards);
  const re = new Float64Array(boards.trials * f);
  const im = new Float64Array(boards.trials * f);
  const loopOnlyTimes = scale(timeIt(() => engineMonteCarlo(engine, slots, boards, frequencies, re, im)), perTrial);
  engineMonteCarlo(engine, slots, boards, frequencies, re, im);
  const difference = compareMonteCarlo(points, re, im);
  const work = `Monte Carlo, ${MONTE_CARLO_TRIALS} trials x ${f} frequencies, ${boards.names.length} parts, per trial`;
  const loopIs = 'the scripted loop (alter every part, ac, wrdata, destroy): wall = rusage elapsed around it, CPU = (process - idle process)';
  rows.push({ circuit: bc.id, work, gicladder: 'runMonteCarlo (src/tolerance): compile, draws, engine, statistics, exact quantiles', gicladderTimes: libraryTimes, ngspiceProcess: processTimes, ngspiceInProcess: loopTimes, ngspiceInProcessIs: loopIs, difference: null, note: `same boards; gain statistics (mean, sd, min, max) differ by ${statsDb.toExponential(1)} dB` });
  rows.push({ circuit: bc.id, work, gicladder: 'engine loop alone on the same boards (setParameter x parts, transferAt x 16)', gicladderTimes: loopOnlyTimes, ngspiceProcess: processTimes, ngspiceInProcess: loopTimes, ngspiceInProcessIs: loopIs, difference });
  rows.push({ circuit: bc.id, work, gicladder: 'runMonteCarlo, against the ac analyses alone', gicladderTimes: libraryTimes, ngspiceProcess: null, ngspiceInProcess: { wallMs: acOnlyWallMs, cpuMs: NaN }, ngspiceInProcessIs: 'the ac analyses alone (acTime, wall only)', difference: null, note: 'same boards' });
}

/** The loop's in-process time: the second `rusage cputime` prints "elapsed time since last call". */
function loopElapsedS(log: string): number {
  const m = /elapsed time since last call \(seconds\) = ([0-9.eE+-]+)/.exec(log.slice(log.indexOf('MC_END')));
  if (!m) throw new Error('no loop elapsed time in the ngspice log');
  return Number(m[1]);
}

function benchExact(bc: BenchCircuit, rows: Row[]): void {
  const h = transferFunction(bc.circuit, TRANSFER);
  const only = (work: string, gicladder: string, t: Times): Row => ({ circuit: bc.id, work, gicladder, gicladderTimes: t, ngspiceProcess: null, ngspiceInProcess: null, ngspiceInProcessIs: '', difference: null });
  rows.push(only(`exact transfer function (degree ${h.num.degree}/${h.den.degree})`, 'transferFunction (exact rationals)', timeIt(() => transferFunction(bc.circuit, TRANSFER), 2, 7)));
  rows.push(only('factored form of the exact H', 'toFloatTransferFunction (roots, sections)', timeIt(() => toFloatTransferFunction(h), 2, 7)));
  rows.push(only('compile the AC engine', 'compileAc', timeIt(() => compileAc(bc.circuit, TRANSFER), 2, 7)));
}

function fmtMs(ms: number | undefined): string {
  if (ms === undefined || !Number.isFinite(ms)) return '';
  return ms >= 100 ? `${ms.toFixed(0)} ms` : ms >= 1 ? `${ms.toPrecision(3)} ms` : `${(ms * 1000).toPrecision(3)} us`;
}

function fmtRatio(x: number): string {
  return Number.isFinite(x) ? `${x >= 100 ? x.toFixed(0) : x.toPrecision(3)}x` : '';
}

const both = (t: Times | null) => (t ? `${fmtMs(t.wallMs)} / ${fmtMs(t.cpuMs)}` : '');

function table(rows: readonly Row[]): string {
  const lines = [
    '| circuit | work | gicladder | gicladder wall / CPU | ngspice process wall / CPU | ngspice in-process wall / CPU | in-process ratio, wall | in-process ratio, CPU | process ratio, wall | max difference |',
    '|---|---|---|---|---|---|---|---|---|---|',
  ];
  for (const r of rows) {
    const d = r.difference ? `${r.difference.maxGainDb.toExponential(1)} dB, ${r.difference.maxPhaseDeg.toExponential(1)} deg` : (r.note ?? '');
    const g = r.gicladderTimes;
    const ip = r.ngspiceInProcess;
    lines.push(
      `| ${r.circuit} | ${r.work} | ${r.gicladder} | ${both(g)} | ${both(r.ngspiceProcess)} | ${both(ip)} | ${fmtRatio((ip?.wallMs ?? NaN) / g.wallMs)} | ${fmtRatio((ip?.cpuMs ?? NaN) / g.cpuMs)} | ${fmtRatio((r.ngspiceProcess?.wallMs ?? NaN) / g.wallMs)} | ${d} |`,
    );
  }
  return lines.join('\n');
}

function verdicts(rows: readonly Row[]): string[] {
  const out: string[] = [];
  const worst = (rs: readonly Row[], clock: keyof Times) => Math.min(...rs.map((r) => r.ngspiceInProcess![clock] / r.gicladderTimes[clock]));
  const verdict = (x: number, target: number) => `${fmtRatio(x)} (${x >= target ? 'met' : 'missed'})`;
  const sweepRows = rows.filter((r) => r.work.includes('sweep'));
  for (const method of ['engine', 'factored']) {
    const rs = sweepRows.filter((r) => r.gicladder.startsWith(method));
    out.push(`sweep, ${method}: the slowest case is ${verdict(worst(rs, 'wallMs'), SWEEP_SPEEDUP_TARGET)} faster than ngspice's in-process sweep by wall time, ${verdict(worst(rs, 'cpuMs'), SWEEP_SPEEDUP_TARGET)} by CPU time (target ${SWEEP_SPEEDUP_TARGET}x)`);
  }
  const lib = rows.filter((r) => r.gicladder.startsWith('runMonteCarlo (src'));
  const acOnly = rows.filter((r) => r.gicladder.startsWith('runMonteCarlo, against'));
  out.push(`Monte Carlo per trial, runMonteCarlo: ${verdict(worst(lib, 'wallMs'), MONTE_CARLO_SPEEDUP_TARGET)} faster than ngspice's scripted loop by wall time, ${verdict(worst(lib, 'cpuMs'), MONTE_CARLO_SPEEDUP_TARGET)} by CPU time; ${verdict(worst(acOnly, 'wallMs'), MONTE_CARLO_SPEEDUP_TARGET)} than its ac analyses alone (target ${MONTE_CARLO_SPEEDUP_TARGET}x)`);
  const worstDb = Math.max(...rows.filter((r) => r.difference).map((r) => r.difference!.maxGainDb));
  out.push(`largest response difference: ${worstDb.toExponential(2)} dB (target <= ${MAX_DIFFERENCE_DB} dB): ${worstDb <= MAX_DIFFERENCE_DB ? 'met' : 'missed'}`);
  return out;
}

function main(): void {
  const status = ngspiceStatus();
  if (!status.available) {
    console.error(`npm run bench needs ngspice (apt-get install -y ngspice): ${status.reason}`);
    process.exit(2);
  }
  const loadBefore = loadavg()[0];
  const started = new Date();
  const rows: Row[] = [];
  for (const bc of benchCircuits()) {
    benchSweeps(bc, rows);
    benchMonteCarlo(bc, rows);
    benchExact(bc, rows);
  }
  const machine = {
    cpu: cpus()[0]?.model ?? 'unknown',
    cpus: availableParallelism(),
    node: process.version,
    ngspice: status.version,
    platform: `${process.platform} ${process.arch}`,
    loadAverage1mBefore: loadBefore,
    loadAverage1mAfter: loadavg()[0],
  };
  const v = verdicts(rows);
  const results = { date: started.toISOString(), machine, opamp: BENCH_OPAMP, circuits: benchCircuits().map((b) => ({ id: b.id, description: b.description, nodes: b.circuit.nodes.length, sweepHz: b.sweep, monteCarloHz: b.monteCarlo })), rows, verdicts: v };
  writeFileSync(new URL('./results.json', import.meta.url), `${JSON.stringify(results, null, 2)}\n`);
  const md = [
    `<!-- generated by npm run bench (bench/run.ts); do not edit -->`,
    `Machine: ${machine.cpu}, ${machine.cpus} CPUs, Node ${machine.node}, ngspice ${machine.ngspice}; load average ${loadBefore.toFixed(1)} before, ${machine.loadAverage1mAfter.toFixed(1)} after. ${started.toISOString().slice(0, 10)}.`,
    '',
    ...results.circuits.map((c) => `- ${c.id}: ${c.description}, ${c.nodes} nodes; op-amps single-pole ${BENCH_OPAMP.model === 'single-pole' ? `${BENCH_OPAMP.gainBandwidthHz / 1e6} MHz, ${BENCH_OPAMP.openLoopGainDb} dB` : ''}`),
    'Times are medians after warm-up runs, as wall / CPU (see bench/run.ts for what each includes); ratios are ngspice / gicladder.',
    '',
    table(rows),
    '',
    ...v.map((x) => `- ${x}`),
    '',
  ].join('\n');
  writeFileSync(new URL('./results.md', import.meta.url), md);
  console.log(md);
}

main();
