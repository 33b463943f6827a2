/**
 * designFilter: the whole chain from a design file to a realised, evaluated design with preferred parts
 * (DESIGN.md, the public contract). Stage by stage, every intermediate kept in the result:
 *   1. parseSpec: validation and defaults (SpecError with every issue);
 *   2. order: the given one, or estimateOrder on the mask;
 *   3. prototype (approximation) and ladder (Darlington, minimum-capacitor form, 1 ohm / 1 rad/s);
 *   4. denormalisation: frequency mapping (LP/HP/BP/BS) and impedance scaling (transform);
 *   5. substitution: realizeLadder by the route the spec asks ('auto': fdnr / simulated-inductor /
 *      gic-embedding by type), built with ideal op-amps;
 *   6. selection: preferred values by the spec's strategy;
 *   7. evaluation: responses A/B/C (evaluation.ts), minimum GBW, swing, part ranges, and the exact
 *      stability of the final circuit with the op-amp models (an unstable circuit throws
 *      UnstableCircuitError, code 'UNSTABLE').
 * Warnings go into `diagnostics` (code, message, severity, stage), never to the console.
 */
import type { Fraction } from '../algebra/rational';
import { fractionToNumber } from '../algebra/rational';
import { gainDbAt, type Zpk } from '../approximation/index';
import type { LadderSynthesis } from '../ladder/index';
import type { Circuit } from '../netlist/circuit';
import type { OpampModel } from '../netlist/opamp';
import { selectParts } from '../selection/select-parts';
import { searchParts } from '../selection/search';
import { compileAc } from '../analysis/ac-engine';
import { evaluationGrid } from './evaluation-grid';
import type { SelectedPart, Selection } from '../selection/selected-part';
import { realizeLadder } from '../substitution/realize';
import type { Realization, RealizationMethod } from '../substitution/realization';
import type { NetworkLadder } from '../transform/network';
import { formatQuantity } from '../units/format';
import { evaluateResponse, opampNames, type ResponseEvaluation } from './evaluation';
import { parseSpec, type DesignSpec } from './parse-spec';
import {
  bufferChoice,
  chooseImpedanceLevel,
  chooseMethod,
  chooseOrder,
  denormalise,
  synthesiseVerified,
  nominalPassbandGainDb,
  opampModelOf,
  prototypeEdgeRadPerS,
  referenceFrequencyHz,
  type Edge,
  type ImpedanceLevel,
  type OrderChoice,
} from './pipeline-stages';
import { precompensate, type PrecompensationReport } from './precompensation';
import { circuitStability, UnstableCircuitError, type CircuitStability } from './stability';

export type DiagnosticSeverity = 'info' | 'warning' | 'error';

export interface DesignDiagnostic {
  readonly code: string;
  readonly message: string;
  readonly severity: DiagnosticSeverity;
  /** The stage that raised it: 'ladder', 'substitution', 'selection', 'evaluation'... */
  readonly stage: string;
}

export interface FilterDesign {
  /** The normalised spec (every default filled in). */
  readonly spec: DesignSpec;
  readonly order: OrderChoice;
  /** The lowpass prototype asked for (normalised, zeros/poles/gain). */
  readonly prototype: Zpk;
  /** The prototype's angular frequency (rad/s) that the passband edge maps to. */
  readonly prototypeEdgeRadPerS: number;
  /** The normalised LC ladder (1 ohm, 1 rad/s) and its synthesis record (exact ladder, realised prototype, T0). */
  readonly ladder: LadderSynthesis;
  /** The impedance level and the capacitor the circuit is built around. */
  readonly impedance: ImpedanceLevel;
  /** The ladder denormalised to hertz and ohms and transformed to the response type. */
  readonly scaledLadder: NetworkLadder;
  readonly method: RealizationMethod;
  /** The substitution's result with the exact values and ideal op-amps. */
  readonly realization: Realization;
  readonly selection: Selection;
  /** Every resistor and capacitor: name, value (chosen), exact value, role, series, tolerance, tempco. */
  readonly parts: readonly SelectedPart[];
  readonly opamp: OpampModel;
  /** The circuit to build: the chosen values and the spec's op-amp model. VIN drives 'in'; the output is 'out'. */
  readonly circuit: Circuit;
  /** The passband peak the ladder realises, dB: 20 log10(RL/(Rs + RL)) for a doubly terminated ladder (-6.02 dB when equal). */
  readonly nominalPassbandGainDb: number;
  readonly evaluation: ResponseEvaluation;
  readonly stability: CircuitStability;
  readonly precompensation?: PrecompensationReport;
  /** How many op-amps the circuit uses. */
  readonly opampCount: number;
  readonly diagnostics: readonly DesignDiagnostic[];
}

/** Reasons a part outside the practical range is a problem (common practice, no source). */
const RANGE_REASONS = {
  lowR: 'loads the op-amp outputs and raises distortion and supply current',
  highR: 'raises thermal noise and bias-current error, and stray capacitance shifts the response',
  lowC: 'is comparable with stray and op-amp input capacitance',
  highC: 'is large, costly and not available in stable dielectrics (film, C0G)',
};

/**
 * Designs the filter a design file describes. Throws SpecError (INVALID_SPEC) for an invalid file,
 * UnrealizableError (UNREALIZABLE) for a mask or route that cannot be built, and UnstableCircuitError
 * (UNSTABLE) when the final circuit with its op-amp models is unstable.
 *
 * @example
 * const design = designFilter({ name: 'demo', response: { type: 'lowpass', family: 'butterworth', order: 3, passbandEdgeHz: '1 kHz' } });
 * // design.parts: every R and C with its chosen value; design.evaluation.passbandErrorDb.total: the worst passband error
 */
export function designFilter(input: unknown): FilterDesign {
  const spec = parseSpec(input);
  const diagnostics: DesignDiagnostic[] = [];
  const note = (stage: string, severity: DiagnosticSeverity, code: string, message: string) => diagnostics.push({ stage, severity, code, message });

  const verified = synthesiseVerified(spec, chooseOrder(spec));
  const { order, ladder } = verified;
  if (verified.raisedFrom) {
    const r = verified.raisedFrom;
    note('approximation', 'info', 'ORDER_RAISED', `order ${r.order} as a ladder (the modified even-order response) reaches only ${r.worstAttenuationDb.toFixed(1)} dB at the stopband edge; order ${order.order} is used`);
  }
  if (order.estimate) {
    const spare = verified.realizedMarginDb ?? order.estimate.attenuationMarginDb; // a modified prototype's own margin
    const start = verified.stopbandStartRatio === undefined ? '' : `; the stopband of the realised (modified) response begins at ${(100 * verified.stopbandStartRatio).toFixed(1)} % of the mask's stopband edge (lowpass prototype frequency)`;
    note('approximation', 'info', 'ORDER_ESTIMATED', `order ${order.order} meets the mask with ${Math.max(0, spare).toFixed(spare < 0.01 ? 3 : 2)} dB to spare${start}`);
  }
  const edges: Edge = order.passbandEdgeHz;
  for (const d of ladder.diagnostics) note('ladder', 'info', d.code, d.message);
  const edgeRadPerS = prototypeEdgeRadPerS(spec, ladder.prototype);
  const impedance = chooseImpedanceLevel(spec, edges);
  if (impedance.capacitorRounded) note('selection', 'info', 'CAPACITOR_LEVEL_ROUNDED', `the capacitor to build around was moved to the preferred value ${formatQuantity(fractionToNumber(impedance.capacitorF), 'F')}`);
  const scaledLadder = denormalise(spec, ladder, edgeRadPerS, edges, impedance.impedanceOhms);
  const method = chooseMethod(spec);
  const opamp = opampModelOf(spec);

  const realize = (capacitorF: Fraction, gicResistanceOhms?: number): Realization =>
    realizeLadder(scaledLadder, {
      method,
      capacitorF,
      resistanceOhms: gicResistanceOhms,
      designFrequencyHz: referenceFrequencyHz(edges),
      opamp: { model: 'ideal' },
      buffers: bufferChoice(spec),
      ...(spec.response.type === 'lowpass' ? { passbandEdgeHz: edges as number } : {}),
    });
  let realization = realize(impedance.capacitorF, spec.realization.gicResistanceOhms);
  const families = { resistors: spec.parts.resistors, capacitors: spec.parts.capacitors };
  let selection: Selection;
  if (spec.parts.selection === 'search') {
    const found = searchParts(impedance.capacitorF, families, spec.parts.searchMaxEvaluations, (c) => realize(c, spec.realization.gicResistanceOhms), (r, s) =>
      roundingErrorDb(r, s, spec.response.type, edges, spec.evaluation.sweepPoints),
    );
    realization = found.realization;
    selection = found.selection;
    const tried = found.candidates.map((c) => `${formatQuantity(fractionToNumber(c.capacitorF), 'F')}: ${c.errorDb.toFixed(3)} dB`).join(', ');
    note('selection', 'info', 'SEARCH', `capacitor ${formatQuantity(fractionToNumber(found.best.capacitorF), 'F')} chosen (worst passband rounding error ${found.best.errorDb.toFixed(3)} dB; tried ${tried})`);
  } else selection = selectParts(realization, { strategy: spec.parts.selection, ...families });
  for (const d of realization.diagnostics) note('substitution', 'info', d.code, d.message);
  for (const d of selection.diagnostics) note('selection', 'warning', d.code, d.message);

  const chosenIdeal = realization.circuit.withValues(selection.values);
  const names = opampNames(realization.circuit);
  const withModel = (c: Circuit): Circuit => c.withValues({}, Object.fromEntries(names.map((n) => [n, opamp])));
  let precompensation: PrecompensationReport | undefined;
  if (spec.evaluation.precompensate && opamp.model !== 'ideal') {
    const pre = precompensate(realization, selection, chosenIdeal, opamp, spec);
    precompensation = pre.report;
    selection = pre.selection;
    note('evaluation', 'info', 'PRECOMPENSATED', `${pre.report.adjusted.length} GIC resistors adjusted for the op-amp model at ${formatQuantity(pre.report.frequencyHz, 'Hz')}`);
  }
  // With pre-compensation the circuit's GIC resistors are adjusted; the target (B) stays the uncompensated parts.
  const circuit = withModel(precompensation ? realization.circuit.withValues(selection.values) : chosenIdeal);

  const nominal = nominalPassbandGainDb(ladder);
  const rp = ladder.realizedPrototype;
  const dc = gainDbAt(rp, 0);
  const evaluation = evaluateResponse({
    type: spec.response.type,
    passbandEdgeHz: edges,
    stopbandEdgeHz: spec.response.stopbandEdgeHz as Edge | undefined,
    points: spec.evaluation.sweepPoints,
    ideal: realization.circuit,
    chosenIdeal,
    chosenReal: circuit,
    opamp,
    outputSwingV: spec.parts.opamp.outputSwingV,
    maxPassbandErrorDb: spec.evaluation.maxPassbandErrorDb,
    nominalPassbandGainDb: nominal,
    prototypeGainDb: (f) => gainDbAt(rp, prototypeOmega(spec.response.type, edges, edgeRadPerS, f)) - dc,
  });

  const stability = circuitStability(circuit);
  if (!stability.stable) throw new UnstableCircuitError('circuit', stability, `the realised circuit with the ${opamp.model} op-amp model`);

  noteEvaluation(spec, evaluation, note);
  noteRanges(spec, selection.parts, note);
  const design: FilterDesign = {
    spec,
    order,
    prototype: ladder.prototype,
    prototypeEdgeRadPerS: edgeRadPerS,
    ladder,
    impedance,
    scaledLadder,
    method,
    realization,
    selection,
    parts: selection.parts,
    opamp,
    circuit,
    nominalPassbandGainDb: nominal,
    evaluation,
    stability,
    ...(precompensation ? { precompensation } : {}),
    opampCount: names.length,
    diagnostics,
  };
  return design;
}

/** The prototype frequency (rad/s) a frequency of the filter maps to: |Omega| of the LP/HP/BP/BS map. */
export function prototypeOmega(type: DesignSpec['response']['type'], edges: Edge, edgeRadPerS: number, frequencyHz: number): number {
  const f = frequencyHz;
  switch (type) {
    case 'lowpass':
      return (edgeRadPerS * f) / (edges as number);
    case 'highpass':
      return (edgeRadPerS * (edges as number)) / f;
    case 'bandpass': {
      const [a, b] = edges as [number, number];
      return (edgeRadPerS * Math.abs(f * f - a * b)) / (f * (b - a));
    }
    case 'bandstop': {
      const [a, b] = edges as [number, number];
      return (edgeRadPerS * f * (b - a)) / Math.abs(a * b - f * f);
    }
  }
}

/** The worst passband |gain(chosen parts) - gain(exact parts)|, ideal op-amps, dB: the search's score. */
function roundingErrorDb(r: Realization, s: Selection, type: DesignSpec['response']['type'], edges: Edge, points: number): number {
  const grid = evaluationGrid(type, edges, undefined, points);
  const f = grid.frequencyHz.filter((_, i) => grid.passband[i]);
  const transfer = { input: 'VIN', output: 'out' } as const;
  const a = compileAc(r.circuit, transfer).sweep(f, { nodes: 'none' }).gainDb;
  const b = compileAc(r.circuit.withValues(s.values), transfer).sweep(f, { nodes: 'none' }).gainDb;
  let m = 0;
  for (let i = 0; i < f.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return Number.isNaN(m) ? Infinity : m;
}

type Note = (stage: string, severity: DiagnosticSeverity, code: string, message: string) => void;

function noteEvaluation(spec: DesignSpec, e: ResponseEvaluation, note: Note): void {
  const pe = e.passbandErrorDb;
  note('evaluation', 'info', 'PASSBAND_ERROR', `worst passband error ${pe.total.toFixed(3)} dB: ${pe.rounding.toFixed(3)} dB from preferred values, ${pe.opamp.toFixed(3)} dB from the op-amp model`);
  if (pe.rounding > spec.response.passbandRippleDb) {
    // Preferred values that move the passband by more than the whole passband allowance have lost the design
    // (a narrow bandpass is the usual case: its element values need more digits than any E-series has).
    note('selection', 'warning', 'ROUNDING_ERROR', `preferred values move the passband by up to ${pe.rounding.toFixed(3)} dB, more than the ${Number(spec.response.passbandRippleDb.toPrecision(4))} dB passband allowance; try parts.selection 'search' or 'exact' (with trimming), a finer series, or another capacitorF`);
  }
  if (e.prototypeDeviationDb > 0.05) note('evaluation', 'warning', 'PROTOTYPE_DEVIATION', `the ideal circuit departs from the scaled prototype by ${e.prototypeDeviationDb.toFixed(3)} dB in the passband`);
  if (e.stopband) {
    const s = e.stopband.minAttenuationDb;
    note('evaluation', 'info', 'STOPBAND_ATTENUATION', `minimum stopband attenuation ${s.chosenPartsRealOpamp.toFixed(1)} dB (ideal ${s.ideal.toFixed(1)} dB)`);
    if (s.chosenPartsRealOpamp < spec.response.stopbandAttenuationDb) {
      note('evaluation', 'warning', 'STOPBAND_NOT_MET', `the stopband attenuation ${s.chosenPartsRealOpamp.toFixed(1)} dB is below the ${spec.response.stopbandAttenuationDb} dB asked for`);
    }
  }
  const g = e.gainBandwidth;
  if (!g.meets && !Number.isFinite(g.chosenHz)) {
    // A model without a gain-bandwidth (finite-gain): its open-loop gain alone misses the bound.
    note('evaluation', 'warning', 'OPAMP_GAIN_TOO_LOW', `the op-amp model's finite open-loop gain costs ${pe.opamp.toFixed(3)} dB of passband error, above the ${g.forPassbandErrorDb} dB allowed`);
  } else if (!g.meets) {
    const need = Number.isFinite(g.requiredHz) ? formatQuantity(g.requiredHz, 'Hz') : 'more than any GBW searched';
    note('evaluation', 'warning', 'GBW_TOO_LOW', `the op-amp's gain-bandwidth ${formatQuantity(g.chosenHz, 'Hz')} is below the ${need} needed for ${g.forPassbandErrorDb} dB passband error; with it the op-amps move the passband by up to ${pe.opamp.toFixed(3)} dB`);
  } else if (Number.isFinite(g.requiredHz)) {
    note('evaluation', 'info', 'GBW_REQUIRED', `${formatQuantity(g.requiredHz, 'Hz')} gain-bandwidth keeps the op-amp error within ${g.forPassbandErrorDb} dB`);
  }
  if (e.swing) {
    const s = e.swing;
    const severity: DiagnosticSeverity = s.clippingInputV < 1 ? 'warning' : 'info';
    note('evaluation', severity, 'SIGNAL_SWING', `${s.opamp} swings ${s.maxGain.toFixed(2)} V per volt of input at ${formatQuantity(s.frequencyHz, 'Hz')}: inputs above ${s.clippingInputV.toFixed(2)} V peak clip at its ${s.outputSwingV} V swing`);
  }
}

function noteRanges(spec: DesignSpec, parts: readonly SelectedPart[], note: Note): void {
  const r = spec.parts.resistors;
  const c = spec.parts.capacitors;
  for (const p of parts) {
    const v = p.value;
    if (p.kind === 'R' && v < r.minOhms) note('selection', 'warning', 'RESISTOR_TOO_SMALL', `${p.name} = ${formatQuantity(v, 'ohm')} is below ${formatQuantity(r.minOhms, 'ohm')}: it ${RANGE_REASONS.lowR}`);
    if (p.kind === 'R' && v > r.maxOhms) note('selection', 'warning', 'RESISTOR_TOO_LARGE', `${p.name} = ${formatQuantity(v, 'ohm')} is above ${formatQuantity(r.maxOhms, 'ohm')}: it ${RANGE_REASONS.highR}`);
    if (p.kind === 'C' && v < c.minF) note('selection', 'warning', 'CAPACITOR_TOO_SMALL', `${p.name} = ${formatQuantity(v, 'F')} is below ${formatQuantity(c.minF, 'F')}: it ${RANGE_REASONS.lowC}`);
    if (p.kind === 'C' && v > c.maxF) note('selection', 'warning', 'CAPACITOR_TOO_LARGE', `${p.name} = ${formatQuantity(v, 'F')} is above ${formatQuantity(c.maxF, 'F')}: it ${RANGE_REASONS.highC}`);
  }
}
