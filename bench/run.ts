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
 * - gicladder "factored": FloatTransferFunction.sweep (gain, phase) of the exact H in second-order
 *   sections; building it (exact H + roots) is the "exact transfer function" row;
 * - ngspice "process": wall time of `ngspice -b` from spawn to exit: start-up, parsing and expanding the
 *   netlist, the analysis and writing V(out) as text;
 * - ngspice "analysis": ngspice's own `rusage acTime` (the AC analysis alone, no start-up, no parsing,
 *   no output file), averaged over several `ac` runs in one process;
 * - Monte Carlo, ngspice "loop": `rusage cputime` (elapsed) around the scripted trials (alter of every
 *   R and C, ac, wrdata append, destroy), and "AC only": acTime of those trials; gicladder:
 *   runMonteCarlo (compiling, drawing, per trial setParameter of every R and C and H at 16 frequencies,
 *   streaming statistics, exact quantiles), and apart the engine loop alone on pre-drawn boards. ngspice
 *   reads the boards runMonteCarlo draws from its script (drawing is outside its time).
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

/** Median ms per call of f after `warmup` untimed calls. */
function timeMs(f: () => void, warmup = GICLADDER_WARMUP, samples = GICLADDER_REPEATS): number {
  for (let i = 0; i < warmup; i++) f();
  const t: number[] = [];
  for (let k = 0; k < samples; k++) {
    const t0 = performance.now();
    f();
    t.push(performance.now() - t0);
  }
  return median(t);
}

/** Median of `repeats` results of `f` after `warmup` discarded ones. */
function medianOf(f: () => number, warmup: number, repeats: number): number {
  for (let i = 0; i < warmup; i++) f();
  return median(Array.from({ length: repeats }, f));
}

interface Row {
  readonly circuit: string;
  readonly work: string;
  readonly gicladder: string;
  readonly gicladderMs: number;
  /** ngspice whole process (ms). */
  readonly ngspiceProcessMs: number;
  /** ngspice in-process analysis time (ms). */
  readonly ngspiceAnalysisMs: number;
  /** What ngspiceAnalysisMs is. */
  readonly ngspiceAnalysis: string;
  readonly difference: ResponseDifference | null;
  readonly note?: string;
}

function benchSweeps(bc: BenchCircuit, rows: Row[]): void {
  const netlist = exportNetlist(bc.circuit, bc.id);
  const engine = compileAc(bc.circuit, TRANSFER);
  const h = transferFunction(bc.circuit, TRANSFER);
  const factored = toFloatTransferFunction(h);
  for (const s of SWEEPS) {
    const { points } = ngspiceSweep(netlist, bc.sweep, s.pointsPerDecade);
    const frequencies = Float64Array.from(points, (p) => p.frequencyHz);
    const processMs = medianOf(() => ngspiceSweep(netlist, bc.sweep, s.pointsPerDecade).run.wallMs, NGSPICE_WARMUP, NGSPICE_REPEATS);
    const ac = acCommand(bc.sweep, s.pointsPerDecade);
    const script = [...AC_SETUP];
    for (let k = 0; k < s.inProcessRuns; k++) script.push(ac, 'destroy all');
    script.push('rusage acTime', 'quit');
    const analysisMs = medianOf(
      () => {
        const times = acAnalysisTimesS(runNgspiceScript(netlist, script).log);
        return (1000 * times[times.length - 1]) / s.inProcessRuns;
      },
      NGSPICE_WARMUP,
      Math.max(3, Math.ceil(NGSPICE_REPEATS / 2)),
    );
    const analysis = `acTime / ${s.inProcessRuns} runs in one process`;
    const engineMs = timeMs(() => engine.sweep(frequencies, { nodes: 'all' }));
    const factoredMs = timeMs(() => factored.sweep(frequencies, { groupDelay: false }));
    const work = `${s.label} (${points.length} points)`;
    rows.push({ circuit: bc.id, work, gicladder: 'engine: full MNA solve per point, all node voltages, gain, phase, group delay', gicladderMs: engineMs, ngspiceProcessMs: processMs, ngspiceAnalysisMs: analysisMs, ngspiceAnalysis: analysis, difference: compareEngine(engine, points) });
    rows.push({ circuit: bc.id, work, gicladder: 'factored exact H: gain, phase', gicladderMs: factoredMs, ngspiceProcessMs: processMs, ngspiceAnalysisMs: analysisMs, ngspiceAnalysis: analysis, difference: compareFactored(factored, points) });
  }
}

function benchMonteCarlo(bc: BenchCircuit, rows: Row[]): void {
  const netlist = exportNetlist(bc.circuit, bc.id);
  const spec = benchToleranceSpec(bc.circuit);
  const boards = drawMonteCarloBoards(bc.circuit, spec, MONTE_CARLO_TRIALS, MONTE_CARLO_SEED);
  const names = spiceElementNames(bc.circuit, netlist);
  const runs = Array.from({ length: NGSPICE_WARMUP + NGSPICE_MC_REPEATS }, () => ngspiceMonteCarlo(netlist, boards, names, bc.monteCarlo, MONTE_CARLO_POINTS_PER_DECADE)).slice(NGSPICE_WARMUP);
  const { points } = runs[0];
  const perTrial = (ms: number) => ms / MONTE_CARLO_TRIALS;
  const processMs = median(runs.map((r) => r.run.wallMs));
  const loopMs = median(runs.map((r) => 1000 * loopElapsedS(r.run.log)));
  const acOnlyMs = median(
    runs.map((r) => {
      const t = acAnalysisTimesS(r.run.log);
      return 1000 * t[t.length - 1];
    }),
  );
  const f = MONTE_CARLO_POINTS_PER_DECADE + 1;
  const frequencies = Float64Array.from(points.slice(0, f), (p) => p.frequencyHz);
  // the library's Monte Carlo: compile, draws, trials, streaming statistics and exact quantiles
  const options = { frequenciesHz: frequencies, trials: MONTE_CARLO_TRIALS, seed: MONTE_CARLO_SEED };
  const libraryMs = timeMs(() => runMonteCarlo(bc.circuit, TRANSFER, spec, options), 2, 9);
  const statsDb = compareGainStatistics(points, runMonteCarlo(bc.circuit, TRANSFER, spec, options));
  // the same boards through the compiled engine, trial by trial
  const engine = compileAc(bc.circuit, TRANSFER);
  const slots = partSlots(engine, boards);
  const re = new Float64Array(boards.trials * f);
  const im = new Float64Array(boards.trials * f);
  const loopOnlyMs = timeMs(() => engineMonteCarlo(engine, slots, boards, frequencies, re, im));
  engineMonteCarlo(engine, slots, boards, frequencies, re, im);
  const difference = compareMonteCarlo(points, re, im);
  const work = `Monte Carlo, ${MONTE_CARLO_TRIALS} trials x ${f} frequencies, ${boards.names.length} parts (per trial)`;
  const ngspiceLoop = 'scripted loop: alter, ac, wrdata, destroy (rusage elapsed)';
  rows.push({ circuit: bc.id, work, gicladder: 'runMonteCarlo (src/tolerance): draws, engine, statistics, exact quantiles', gicladderMs: perTrial(libraryMs), ngspiceProcessMs: perTrial(processMs), ngspiceAnalysisMs: perTrial(loopMs), ngspiceAnalysis: ngspiceLoop, difference: null, note: `gain statistics (mean, sd, min, max) vs ngspice's trials: ${statsDb.toExponential(1)} dB` });
  rows.push({ circuit: bc.id, work, gicladder: 'same', gicladderMs: perTrial(libraryMs), ngspiceProcessMs: perTrial(processMs), ngspiceAnalysisMs: perTrial(acOnlyMs), ngspiceAnalysis: 'the ac analyses alone (acTime)', difference: null, note: 'same boards' });
  rows.push({ circuit: bc.id, work, gicladder: 'engine loop alone on the same boards (setParameter, transferAt x 16)', gicladderMs: perTrial(loopOnlyMs), ngspiceProcessMs: perTrial(processMs), ngspiceAnalysisMs: perTrial(loopMs), ngspiceAnalysis: ngspiceLoop, difference });
}

/** The loop's in-process time: the second `rusage cputime` prints "elapsed time since last call". */
function loopElapsedS(log: string): number {
  const m = /elapsed time since last call \(seconds\) = ([0-9.eE+-]+)/.exec(log.slice(log.indexOf('MC_END')));
  if (!m) throw new Error('no loop elapsed time in the ngspice log');
  return Number(m[1]);
}

function benchExact(bc: BenchCircuit, rows: Row[]): void {
  const exactMs = timeMs(() => transferFunction(bc.circuit, TRANSFER), 2, 7);
  const h = transferFunction(bc.circuit, TRANSFER);
  const factorMs = timeMs(() => toFloatTransferFunction(h), 2, 7);
  const compileMs = timeMs(() => compileAc(bc.circuit, TRANSFER), 2, 7);
  rows.push({ circuit: bc.id, work: `exact transfer function (degree ${h.num.degree}/${h.den.degree})`, gicladder: 'transferFunction (exact rationals)', gicladderMs: exactMs, ngspiceProcessMs: NaN, ngspiceAnalysisMs: NaN, ngspiceAnalysis: '', difference: null });
  rows.push({ circuit: bc.id, work: 'factored form of exact H', gicladder: 'toFloatTransferFunction (roots, sections)', gicladderMs: factorMs, ngspiceProcessMs: NaN, ngspiceAnalysisMs: NaN, ngspiceAnalysis: '', difference: null });
  rows.push({ circuit: bc.id, work: 'compile the AC engine', gicladder: 'compileAc', gicladderMs: compileMs, ngspiceProcessMs: NaN, ngspiceAnalysisMs: NaN, ngspiceAnalysis: '', difference: null });
}

function fmtMs(ms: number): string {
  if (!Number.isFinite(ms)) return '';
  return ms >= 100 ? `${ms.toFixed(0)} ms` : ms >= 1 ? `${ms.toPrecision(3)} ms` : `${(ms * 1000).toPrecision(3)} us`;
}

function fmtRatio(x: number): string {
  return Number.isFinite(x) ? `${x >= 100 ? x.toFixed(0) : x.toPrecision(3)}x` : '';
}

function table(rows: readonly Row[]): string {
  const lines = [
    '| circuit | work | gicladder | gicladder time | ngspice process | ngspice in-process | in-process / gicladder | process / gicladder | max difference |',
    '|---|---|---|---|---|---|---|---|---|',
  ];
  for (const r of rows) {
    const d = r.difference ? `${r.difference.maxGainDb.toExponential(1)} dB, ${r.difference.maxPhaseDeg.toExponential(1)} deg` : (r.note ?? '');
    const inProcess = Number.isFinite(r.ngspiceAnalysisMs) ? `${fmtMs(r.ngspiceAnalysisMs)} (${r.ngspiceAnalysis})` : '';
    lines.push(
      `| ${r.circuit} | ${r.work} | ${r.gicladder} | ${fmtMs(r.gicladderMs)} | ${fmtMs(r.ngspiceProcessMs)} | ${inProcess} | ${fmtRatio(r.ngspiceAnalysisMs / r.gicladderMs)} | ${fmtRatio(r.ngspiceProcessMs / r.gicladderMs)} | ${d} |`,
    );
  }
  return lines.join('\n');
}

function verdicts(rows: readonly Row[]): string[] {
  const out: string[] = [];
  const sweepRows = rows.filter((r) => r.work.includes('sweep'));
  const mcRows = rows.filter((r) => r.work.startsWith('Monte Carlo') && !r.gicladder.startsWith('engine loop')); // the library's runMonteCarlo
  for (const method of ['engine', 'factored']) {
    const rs = sweepRows.filter((r) => r.gicladder.startsWith(method));
    const worst = Math.min(...rs.map((r) => r.ngspiceAnalysisMs / r.gicladderMs));
    out.push(`sweep, ${method}: at least ${fmtRatio(worst)} faster than ngspice's in-process analysis (target ${SWEEP_SPEEDUP_TARGET}x): ${worst >= SWEEP_SPEEDUP_TARGET ? 'met' : 'missed'}`);
  }
  const loop = Math.min(...mcRows.filter((r) => r.ngspiceAnalysis.startsWith('scripted')).map((r) => r.ngspiceAnalysisMs / r.gicladderMs));
  const acOnly = Math.min(...mcRows.filter((r) => r.ngspiceAnalysis.startsWith('the ac')).map((r) => r.ngspiceAnalysisMs / r.gicladderMs));
  out.push(`Monte Carlo per trial (runMonteCarlo): at least ${fmtRatio(loop)} faster than ngspice's scripted loop, ${fmtRatio(acOnly)} than its AC analyses alone (target ${MONTE_CARLO_SPEEDUP_TARGET}x): ${loop >= MONTE_CARLO_SPEEDUP_TARGET ? 'met' : 'missed'} against the loop, ${acOnly >= MONTE_CARLO_SPEEDUP_TARGET ? 'met' : 'missed'} against AC alone`);
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
