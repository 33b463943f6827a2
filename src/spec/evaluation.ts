/**
 * Evaluation of a realised design with the float AC engine (analysis/ac-engine.ts): three responses on
 * one grid,
 *   A  the exact parts with ideal op-amps (the ladder's own response, up to the FDNR DC-path resistors),
 *   B  the chosen (preferred) parts with ideal op-amps,
 *   C  the chosen parts with the spec's op-amp model,
 * so that B - A is what rounding costs and C - B what the finite gain-bandwidth costs; the minimum
 * gain-bandwidth for a stated passband error (bisection on GBW); and the signal swing at the op-amp
 * outputs (node voltages of C per volt of input).
 */
import { compileAc, type CompiledAc } from '../analysis/ac-engine';
import type { Circuit } from '../netlist/circuit';
import type { OpampModel } from '../netlist/opamp';
import type { FilterType } from '../approximation/order';
import type { Edge } from './pipeline-stages';
import { evaluationGrid } from './evaluation-grid';

/** Bisection steps on log(GBW): 60 halvings of a 10-decade bracket reach 1e-8 relative. */
const GBW_BISECTION_STEPS = 60;
/** The bracket of the GBW search, as ratios to the highest passband frequency: 1x .. 1e10x. */
const GBW_BRACKET = [1, 1e10] as const;
/** Open-loop gain used for the GBW search when the spec's model has none (ideal, integrator), dB. */
export const SEARCH_OPEN_LOOP_GAIN_DB = 100;

export interface ErrorSplit {
  /** B vs A: the preferred values. */
  readonly rounding: number;
  /** C vs B: the op-amp model. */
  readonly opamp: number;
  /** C vs A. */
  readonly total: number;
}

export interface GainBandwidthReport {
  /** The passband error (C vs B) the minimum is found for, dB. */
  readonly forPassbandErrorDb: number;
  /** The smallest GBW (Hz) with at most that error, the other op-amp parameters as in the spec; NaN if none up to 1e10 times the band. */
  readonly requiredHz: number;
  /** The spec's GBW (Hz); Infinity for the ideal and finite-gain models. */
  readonly chosenHz: number;
  readonly meets: boolean;
}

export interface SwingReport {
  /** The largest |V(op-amp output)| / |V(in)| over the grid. */
  readonly maxGain: number;
  readonly opamp: string;
  readonly frequencyHz: number;
  /** The op-amp's peak output swing, V. */
  readonly outputSwingV: number;
  /** The peak input voltage at which that op-amp output reaches its swing: outputSwingV / maxGain. */
  readonly clippingInputV: number;
}

export interface ResponseEvaluation {
  readonly frequencyHz: readonly number[];
  readonly inPassband: readonly boolean[];
  readonly inStopband: readonly boolean[];
  readonly gainDb: { readonly ideal: readonly number[]; readonly chosenParts: readonly number[]; readonly chosenPartsRealOpamp: readonly number[] };
  /** The passband peak the ladder is designed for, dB (see pipeline-stages.ts nominalPassbandGainDb). */
  readonly nominalPassbandGainDb: number;
  /** The largest |A - (nominal + prototype)| in the passband, dB: how well the circuit realises the prototype. */
  readonly prototypeDeviationDb: number;
  /** The largest |gain difference| over the passband, dB. */
  readonly passbandErrorDb: ErrorSplit;
  /** The smallest attenuation (below nominal) over the stopband, dB, and how much each step loses of it; null without a stopband edge. */
  readonly stopband: null | {
    readonly minAttenuationDb: { readonly ideal: number; readonly chosenParts: number; readonly chosenPartsRealOpamp: number };
    readonly lossDb: ErrorSplit;
  };
  readonly gainBandwidth: GainBandwidthReport;
  readonly swing: SwingReport | null;
}

export interface EvaluationInput {
  readonly type: FilterType;
  readonly passbandEdgeHz: Edge;
  readonly stopbandEdgeHz: Edge | undefined;
  readonly points: number;
  readonly ideal: Circuit;
  readonly chosenIdeal: Circuit;
  readonly chosenReal: Circuit;
  readonly opamp: OpampModel;
  readonly outputSwingV: number;
  readonly maxPassbandErrorDb: number;
  readonly nominalPassbandGainDb: number;
  /** The prototype's gain (dB, 0 at its peak) at a frequency of the denormalised filter. */
  readonly prototypeGainDb: (frequencyHz: number) => number;
}

const TRANSFER = { input: 'VIN', output: 'out' } as const;

/** Gains in dB of a compiled circuit at the frequencies. */
function gains(engine: CompiledAc, frequencyHz: readonly number[]): number[] {
  return Array.from(engine.sweep(frequencyHz, { nodes: 'none' }).gainDb);
}

function maxAbsDiff(a: readonly number[], b: readonly number[], mask: readonly boolean[]): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) if (mask[i]) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

function minAttenuation(g: readonly number[], nominal: number, mask: readonly boolean[]): number {
  let m = Infinity;
  for (let i = 0; i < g.length; i++) if (mask[i]) m = Math.min(m, nominal - g[i]);
  return m;
}

/** The op-amp names of a circuit, in order. */
export function opampNames(circuit: Circuit): string[] {
  return circuit.elements.filter((e) => e.kind === 'OPAMP').map((e) => e.name);
}

/** The model used to search the GBW: the spec's kind with GBW varied, or single-pole for models without one. */
export function withGainBandwidth(model: OpampModel, gbwHz: number): OpampModel {
  switch (model.model) {
    case 'single-pole':
    case 'two-pole':
      return { ...model, gainBandwidthHz: gbwHz };
    case 'integrator':
      return { model: 'integrator', gainBandwidthHz: gbwHz };
    case 'finite-gain':
      return { model: 'single-pole', gainBandwidthHz: gbwHz, openLoopGainDb: 20 * Math.log10(Math.abs(model.gain)) };
    case 'ideal':
      return { model: 'single-pole', gainBandwidthHz: gbwHz, openLoopGainDb: SEARCH_OPEN_LOOP_GAIN_DB };
  }
}

/**
 * The smallest GBW at which the passband error (vs `reference` gains) is at most `boundDb`, by bisection
 * on log GBW. Assumes the error falls as GBW grows (first-order GIC error is proportional to 1/GBW,
 * converter/gic-nonideal.ts Eq. (4)). NaN when even the top of the bracket does not reach the bound.
 */
export function minimumGainBandwidthHz(
  circuit: Circuit,
  model: OpampModel,
  frequencyHz: readonly number[],
  reference: readonly number[],
  boundDb: number,
): number {
  const names = opampNames(circuit);
  if (names.length === 0) return 0;
  const kind = withGainBandwidth(model, 1);
  const engine = compileAc(circuit.withValues({}, Object.fromEntries(names.map((n) => [n, kind]))), TRANSFER);
  const top = Math.max(...frequencyHz);
  const error = (gbw: number): number => {
    const m = withGainBandwidth(model, gbw);
    for (const n of names) engine.setOpampModel(n, m);
    const g = gains(engine, frequencyHz);
    let e = 0;
    for (let i = 0; i < g.length; i++) e = Math.max(e, Math.abs(g[i] - reference[i]));
    return Number.isNaN(e) ? Infinity : e;
  };
  let lo = Math.log(top * GBW_BRACKET[0]);
  let hi = Math.log(top * GBW_BRACKET[1]);
  if (!(error(Math.exp(hi)) <= boundDb)) return NaN;
  if (error(Math.exp(lo)) <= boundDb) return Math.exp(lo);
  for (let i = 0; i < GBW_BISECTION_STEPS; i++) {
    const mid = (lo + hi) / 2;
    if (error(Math.exp(mid)) <= boundDb) hi = mid;
    else lo = mid;
  }
  return Math.exp(hi);
}

/** The largest op-amp output voltage per volt of input over the grid, with where it occurs. */
function swingOf(engine: CompiledAc, circuit: Circuit, frequencyHz: readonly number[], outputSwingV: number): SwingReport | null {
  const outs = circuit.elements.filter((e) => e.kind === 'OPAMP').map((e) => ({ name: e.name, node: (e as { out: string }).out }));
  if (outs.length === 0) return null;
  const sweep = engine.sweep(frequencyHz, { nodes: [...new Set(outs.map((o) => o.node))] });
  let best: SwingReport | null = null;
  for (const o of outs) {
    const v = sweep.nodes[o.node];
    for (let i = 0; i < frequencyHz.length; i++) {
      const g = Math.hypot(v.re[i], v.im[i]);
      if (best === null || g > best.maxGain) best = { maxGain: g, opamp: o.name, frequencyHz: frequencyHz[i], outputSwingV, clippingInputV: outputSwingV / g };
    }
  }
  return best;
}

/** Runs the evaluation described in the module comment. */
export function evaluateResponse(input: EvaluationInput): ResponseEvaluation {
  const grid = evaluationGrid(input.type, input.passbandEdgeHz, input.stopbandEdgeHz, input.points);
  const f = grid.frequencyHz;
  const a = gains(compileAc(input.ideal, TRANSFER), f);
  const b = gains(compileAc(input.chosenIdeal, TRANSFER), f);
  const realEngine = compileAc(input.chosenReal, TRANSFER);
  const c = gains(realEngine, f);
  const nominal = input.nominalPassbandGainDb;
  let prototypeDeviationDb = 0;
  for (let i = 0; i < f.length; i++) if (grid.passband[i]) prototypeDeviationDb = Math.max(prototypeDeviationDb, Math.abs(a[i] - nominal - input.prototypeGainDb(f[i])));
  const split = (x: readonly number[], y: readonly number[], z: readonly number[], mask: readonly boolean[]): ErrorSplit => ({
    rounding: maxAbsDiff(y, x, mask),
    opamp: maxAbsDiff(z, y, mask),
    total: maxAbsDiff(z, x, mask),
  });
  let stopband: ResponseEvaluation['stopband'] = null;
  if (grid.stopband.some(Boolean)) {
    const ideal = minAttenuation(a, nominal, grid.stopband);
    const chosenParts = minAttenuation(b, nominal, grid.stopband);
    const chosenPartsRealOpamp = minAttenuation(c, nominal, grid.stopband);
    stopband = {
      minAttenuationDb: { ideal, chosenParts, chosenPartsRealOpamp },
      lossDb: { rounding: ideal - chosenParts, opamp: chosenParts - chosenPartsRealOpamp, total: ideal - chosenPartsRealOpamp },
    };
  }
  const passF = f.filter((_, i) => grid.passband[i]);
  const passB = b.filter((_, i) => grid.passband[i]);
  const requiredHz = minimumGainBandwidthHz(input.chosenIdeal, input.opamp, passF, passB, input.maxPassbandErrorDb);
  const chosenHz = 'gainBandwidthHz' in input.opamp ? input.opamp.gainBandwidthHz : Infinity;
  const meets = input.opamp.model === 'ideal' ? true : input.opamp.model === 'finite-gain' ? maxAbsDiff(c, b, grid.passband) <= input.maxPassbandErrorDb : chosenHz >= requiredHz;
  return {
    frequencyHz: f,
    inPassband: grid.passband,
    inStopband: grid.stopband,
    gainDb: { ideal: a, chosenParts: b, chosenPartsRealOpamp: c },
    nominalPassbandGainDb: nominal,
    prototypeDeviationDb,
    passbandErrorDb: split(a, b, c, grid.passband),
    stopband,
    gainBandwidth: { forPassbandErrorDb: input.maxPassbandErrorDb, requiredHz, chosenHz, meets },
    swing: swingOf(realEngine, input.chosenReal, f, input.outputSwingV),
  };
}
