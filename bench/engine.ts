/**
 * Engine benchmarks on a 7th-order FDNR ladder (test/helpers/gic-circuits.ts: three grounded GIC
 * FDNRs, six single-pole op-amps, 18 nodes, 25 MNA unknowns with the input drive):
 * - the exact transfer function (target <= 100 ms);
 * - a 10,000-point sweep of H(j w) in factored form, analysis/factored-response.ts (target <= 0.5 ms);
 * - a full solve (every node voltage) at one frequency after changing a value (target <= 1.5 us).
 * Each figure: warm-up runs, then repetitions, the median reported. Run: npx tsx bench/engine.ts
 * Writes bench/results-engine.json and prints a Markdown table.
 */
import { writeFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { fdnrLadder7 } from '../test/helpers/gic-circuits';
import { compileAc, transferFunction } from '../src/analysis/index';
import { toFloatTransferFunction } from '../src/analysis/factored-response';

const MODEL = { model: 'single-pole', gainBandwidthHz: 1e6, openLoopGainDb: 100 } as const;
const SWEEP_POINTS = 10_000;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/** Median milliseconds per call of f, after `warmup` untimed calls; `inner` calls per timed sample. */
function timeMs(f: () => void, warmup: number, samples: number, inner = 1): number {
  for (let i = 0; i < warmup; i++) f();
  const t: number[] = [];
  for (let k = 0; k < samples; k++) {
    const t0 = performance.now();
    for (let i = 0; i < inner; i++) f();
    t.push((performance.now() - t0) / inner);
  }
  return median(t);
}

const circuit = fdnrLadder7(MODEL);
const spec = { input: 'in', output: 'out' } as const;

const exactMs = timeMs(() => transferFunction(circuit, spec), 2, 7);

const h = transferFunction(circuit, spec);
const factored = toFloatTransferFunction(h);
const frequencies = new Float64Array(SWEEP_POINTS);
for (let i = 0; i < SWEEP_POINTS; i++) frequencies[i] = 10 * 10 ** ((4 * i) / (SWEEP_POINTS - 1)); // 10 Hz .. 100 kHz
let last = factored.sweep(frequencies, { groupDelay: false });
const sweepMs = timeMs(() => {
  last = factored.sweep(frequencies, { groupDelay: false });
}, 50, 31, 5);
const sweepWithDelayMs = timeMs(() => factored.sweep(frequencies), 20, 21, 2);

// accuracy of the factored sweep against the exact H (Float64 evaluation of the reduced exact function)
let worstDb = 0;
for (let i = 0; i < SWEEP_POINTS; i += 97) {
  const e = h.evaluateComplex({ re: 0, im: 2 * Math.PI * frequencies[i] });
  worstDb = Math.max(worstDb, Math.abs(last.gainDb[i] - 20 * Math.log10(Math.hypot(e.re, e.im))));
}

const engine = compileAc(circuit, spec);
const solution = engine.createSolution();
const slot = engine.parameterIndex('R3');
const r3 = engine.parameters[slot];
let flip = false;
const solveUs =
  1000 *
  timeMs(
    () => {
      flip = !flip;
      engine.setParameter(slot, flip ? r3 * 1.001 : r3);
      engine.solveAt(1000, solution);
    },
    20_000,
    31,
    10_000,
  );

const results = {
  circuit: { description: '7th-order Butterworth FDNR ladder, 1 kHz, 3 GIC FDNRs, single-pole op-amps (1 MHz, 100 dB)', nodes: circuit.nodes.length, opamps: 6, unknowns: engine.unknowns.length, transferDegree: { num: h.num.degree, den: h.den.degree } },
  node: process.version,
  exactTransferFunctionMs: { median: exactMs, target: 100 },
  factoredSweep10kMs: { median: sweepMs, target: 0.5, withGroupDelayMs: sweepWithDelayMs, worstGainDbDifferenceToExact: worstDb },
  machine: { cpus: availableParallelism(), loadAverage1m: loadavg()[0] },
  fullSolveAfterValueChangeUs: { median: solveUs, target: 1.5 },
};
writeFileSync(new URL('./results-engine.json', import.meta.url), `${JSON.stringify(results, null, 2)}\n`);
const row = (name: string, v: number, unit: string, target: number) => `| ${name} | ${v.toPrecision(3)} ${unit} | <= ${target} ${unit} | ${v <= target ? 'met' : 'missed'} |`;
console.log(
  [
    `Circuit: ${results.circuit.description}; ${results.circuit.nodes} nodes, ${results.circuit.unknowns} unknowns, H of degree ${h.num.degree}/${h.den.degree}. Node ${process.version}.`,
    '',
    '| measurement | median | target | |',
    '|---|---|---|---|',
    row('exact transfer function', exactMs, 'ms', 100),
    row('10,000-point sweep, factored form (gain, phase)', sweepMs, 'ms', 0.5),
    `| same with group delay | ${sweepWithDelayMs.toPrecision(3)} ms | | |`,
    row('full solve after a value change', solveUs, 'us', 1.5),
    '',
    `factored sweep vs exact H: worst gain difference ${worstDb.toExponential(2)} dB; load average ${loadavg()[0].toFixed(1)} on ${availableParallelism()} CPUs`,
  ].join('\n'),
);
