/**
 * The design's outputs: the C header, the SPICE netlist, the JSON report and the plots. Each maps a
 * {@link FilterDesign} onto the export stage's plain-data models, so the writers in src/export know
 * nothing of the design file. Everything here is deterministic: the same design file and library
 * version give byte-identical text.
 */
import { Opamp } from '../netlist/elements';
import { IDEAL_OPAMP, type OpampModel } from '../netlist/opamp';
import type { Circuit } from '../netlist/circuit';
import { transferFunction } from '../analysis/index';
import type { RationalFunction } from '../algebra/rational-function';
import { InvalidInputError } from '../errors';
import { VERSION, GENERATOR } from '../version';
import {
  analogSectionsOfRational,
  bilinearZpk,
  circuitToSpice,
  gainPlot,
  groupDelayPlot,
  hashDesign,
  phasePlot,
  renderCHeader,
  renderCsv,
  renderPlotSvg,
  swingPlot,
  zpkToDigitalSections,
  type CFloatType,
  type CNumberFormat,
  type FixedPointFormat,
  type GainMaskBand,
  type HeaderModel,
  type HeaderTestPoint,
  type HeaderTrim,
} from '../export/index';
import { toFloatTransferFunction } from '../analysis/factored-response';
import type { FilterDesign } from './design-filter';
import { frequencyResponse } from './frequency-response';

/** The input source and output node of every realised circuit (see DESIGN.md). */
const TRANSFER = { input: 'VIN', output: 'out' } as const;

/** What the header holds beyond the design itself: production test points and the trim table, when made. */
export interface HeaderExtras {
  readonly testPoints?: readonly HeaderTestPoint[];
  readonly trim?: HeaderTrim;
}

export interface CHeaderOptions extends HeaderExtras {
  /** Overrides the design file's `export.floatType`. */
  readonly floatType?: CFloatType;
  readonly numberFormat?: CNumberFormat;
  /** Overrides `export.fixedPointFormat`. */
  readonly fixedPoint?: FixedPointFormat | 'none';
  /** Overrides `export.sampleRateHz` (digital sections by the bilinear transform). */
  readonly sampleRateHz?: number;
  /** Prewarp frequency of the bilinear transform; default the passband edge (upper edge for band filters). */
  readonly prewarpHz?: number;
}

/** The hash stamped into every output: of the normalised design file and the library version. */
export function designHashOf(design: FilterDesign): string {
  return hashDesign({ generator: GENERATOR, spec: design.spec });
}

/** The design's circuit with the chosen parts and every op-amp ideal. */
export function idealOpampCircuit(design: FilterDesign): Circuit {
  const models: Record<string, OpampModel> = {};
  for (const e of design.circuit.elements) if (e instanceof Opamp) models[e.name] = IDEAL_OPAMP;
  return design.circuit.withValues({}, models);
}

const transferCache = new WeakMap<FilterDesign, RationalFunction>();

/**
 * The exact V(out)/V(in) of the circuit with the chosen parts and ideal op-amps: the transfer function
 * the header's sections describe (the op-amps' own poles are a property of the part, not of the filter).
 */
export function chosenTransferFunction(design: FilterDesign): RationalFunction {
  let h = transferCache.get(design);
  if (!h) {
    h = transferFunction(idealOpampCircuit(design), TRANSFER);
    transferCache.set(design, h);
  }
  return h;
}

function fixedPointOf(text: string | undefined): FixedPointFormat | undefined {
  if (text === undefined || text === 'none') return undefined;
  const t = text.toUpperCase().replace('Q1.', 'Q');
  if (t === 'Q15' || t === 'Q31') return t;
  throw new InvalidInputError('INVALID_ARGUMENT', 'export.fixedPointFormat', text, "must be 'none', 'Q15' (Q1.15) or 'Q31' (Q1.31)");
}

function upperEdgeHz(design: FilterDesign): number {
  const e = design.spec.response.passbandEdgeHz;
  return Array.isArray(e) ? e[1] : (e as number);
}

/** The header model of a design (the plain data renderCHeader writes). */
export function headerModelOf(design: FilterDesign, options: CHeaderOptions = {}): HeaderModel {
  const spec = design.spec;
  const h = chosenTransferFunction(design);
  const sampleRateHz = options.sampleRateHz ?? spec.export.sampleRateHz;
  let digital: HeaderModel['digital'];
  if (sampleRateHz !== undefined) {
    const prewarpHz = options.prewarpHz ?? Math.min(upperEdgeHz(design), 0.45 * sampleRateHz);
    const f = toFloatTransferFunction(h);
    digital = { sampleRateHz, prewarpHz, sections: zpkToDigitalSections(bilinearZpk({ zeros: f.zeros, poles: f.poles, gain: f.gain }, sampleRateHz, { prewarpHz })) };
  }
  const fixed = options.fixedPoint === 'none' ? undefined : (options.fixedPoint ?? fixedPointOf(spec.export.fixedPointFormat as string | undefined));
  return {
    name: spec.name,
    prefix: spec.export.identifierPrefix,
    libraryVersion: VERSION,
    designHash: designHashOf(design),
    floatType: options.floatType ?? spec.export.floatType,
    numberFormat: options.numberFormat,
    fixedPoint: fixed,
    parts: design.parts.map((p) => ({ name: p.name, valueSi: p.value, unit: p.kind === 'R' ? 'ohm' : 'farad' })),
    testPoints: options.testPoints,
    trim: options.trim,
    analogSections: analogSectionsOfRational(h, { gain: 'spread' }),
    digital,
  };
}

/** The C header of a design: part values, test points and limits, trim table, analog and digital sections. */
export function toCHeader(design: FilterDesign, options: CHeaderOptions = {}): string {
  return renderCHeader(headerModelOf(design, options));
}

export interface SpiceNetlistOptions {
  /** Points per decade of the .ac card; default 50. */
  readonly pointsPerDecade?: number;
  /** The sweep, default two decades either side of the passband. */
  readonly startHz?: number;
  readonly stopHz?: number;
}

/** The ngspice netlist of the circuit to build (chosen parts, the design file's op-amp model). */
export function toSpiceNetlist(design: FilterDesign, options: SpiceNetlistOptions = {}): string {
  const e = design.spec.response.passbandEdgeHz;
  const lo = Array.isArray(e) ? e[0] : (e as number);
  const hi = Array.isArray(e) ? e[1] : (e as number);
  return circuitToSpice(design.circuit, {
    title: `${design.spec.name}: ${GENERATOR}, design ${designHashOf(design)}`,
    input: 'in',
    output: TRANSFER.output,
    acSweep: { pointsPerDecade: options.pointsPerDecade ?? 50, startHz: options.startHz ?? lo / 100, stopHz: options.stopHz ?? hi * 100 },
  });
}

/** The spec mask as plot bands (relative to the nominal passband gain). */
export function maskBands(design: FilterDesign): GainMaskBand[] {
  const r = design.spec.response;
  const g0 = design.nominalPassbandGainDb;
  const pass = r.passbandEdgeHz;
  const stop = r.stopbandEdgeHz;
  const bands: GainMaskBand[] = [];
  const passMin = g0 - r.passbandRippleDb;
  const stopMax = g0 - r.stopbandAttenuationDb;
  const f = design.evaluation.frequencyHz;
  const fLo = f[0];
  const fHi = f[f.length - 1];
  switch (r.type) {
    case 'lowpass':
      bands.push({ fromHz: fLo, toHz: pass as number, minDb: passMin, maxDb: g0 });
      if (stop !== undefined) bands.push({ fromHz: stop as number, toHz: fHi, maxDb: stopMax });
      break;
    case 'highpass':
      bands.push({ fromHz: pass as number, toHz: fHi, minDb: passMin, maxDb: g0 });
      if (stop !== undefined) bands.push({ fromHz: fLo, toHz: stop as number, maxDb: stopMax });
      break;
    case 'bandpass': {
      const [a, b] = pass as [number, number];
      bands.push({ fromHz: a, toHz: b, minDb: passMin, maxDb: g0 });
      if (stop !== undefined) {
        const [c, d] = stop as [number, number];
        bands.push({ fromHz: fLo, toHz: c, maxDb: stopMax }, { fromHz: d, toHz: fHi, maxDb: stopMax });
      }
      break;
    }
    case 'bandstop': {
      const [a, b] = pass as [number, number];
      bands.push({ fromHz: fLo, toHz: a, minDb: passMin, maxDb: g0 }, { fromHz: b, toHz: fHi, minDb: passMin, maxDb: g0 });
      if (stop !== undefined) {
        const [c, d] = stop as [number, number];
        bands.push({ fromHz: c, toHz: d, maxDb: stopMax });
      }
      break;
    }
  }
  return bands;
}

export interface PlotExtras {
  /** A Monte Carlo envelope of the gain (quantile band). */
  readonly envelope?: { readonly label: string; readonly frequencyHz: ArrayLike<number>; readonly lower: ArrayLike<number>; readonly upper: ArrayLike<number> };
  readonly testLimits?: readonly HeaderTestPoint[];
}

/** The design's plots as SVG text, by file stem: gain, phase, group delay and op-amp output swing. */
export function designPlots(design: FilterDesign, extras: PlotExtras = {}): Record<'gain' | 'phase' | 'group-delay' | 'swing', string> {
  const f = design.evaluation.frequencyHz;
  const response = frequencyResponse(design, f);
  const name = design.spec.name;
  const out = {} as Record<'gain' | 'phase' | 'group-delay' | 'swing', string>;
  out.gain = renderPlotSvg(
    gainPlot({
      title: `${name}: gain`,
      frequencyHz: f,
      gainDb: response.gainDb,
      label: 'chosen parts, op-amp model',
      mask: maskBands(design),
      envelope: extras.envelope,
      testLimits: extras.testLimits,
    }),
  );
  out.phase = renderPlotSvg(phasePlot({ title: `${name}: phase`, frequencyHz: f, phaseDeg: response.phaseDeg }));
  out['group-delay'] = renderPlotSvg(groupDelayPlot({ title: `${name}: group delay`, frequencyHz: f, groupDelayS: response.groupDelayS }));
  out.swing = renderPlotSvg(swingPlot(swingInput(design, f)));
  return out;
}

function swingInput(design: FilterDesign, f: readonly number[]) {
  const opamps = design.circuit.elements.filter((e): e is Opamp => e instanceof Opamp);
  const nodes = [...new Set(opamps.map((o) => o.out))];
  // The swing sweep uses the compiled engine's node voltages relative to the input (1 V peak input).
  const sweep = compiledFor(design).sweep(f, { nodes });
  return {
    title: `${design.spec.name}: op-amp output swing`,
    frequencyHz: f,
    outputs: opamps.map((o) => {
      const v = sweep.nodes[o.out];
      return { label: o.name, peakV: Float64Array.from(v.re, (re, i) => Math.hypot(re, v.im[i])) };
    }),
    clippingV: design.spec.parts.opamp.outputSwingV,
    inputLevel: '1 V peak input',
  };
}

import { compileAc, type CompiledAc } from '../analysis/index';
const compiledCache = new WeakMap<FilterDesign, CompiledAc>();
function compiledFor(design: FilterDesign): CompiledAc {
  let c = compiledCache.get(design);
  if (!c) {
    c = compileAc(design.circuit, TRANSFER);
    compiledCache.set(design, c);
  }
  return c;
}

/**
 * The response of the circuit to build as CSV: frequency_hz, gain_db (chosen parts and the op-amp model),
 * phase_deg (unwrapped), group_delay_s, and the ideal design's gain_ideal_db for comparison.
 */
export function toResponseCsv(design: FilterDesign): string {
  const f = design.evaluation.frequencyHz;
  const r = frequencyResponse(design, f);
  return renderCsv([
    { name: 'frequency_hz', values: f },
    { name: 'gain_db', values: r.gainDb },
    { name: 'phase_deg', values: r.phaseDeg },
    { name: 'group_delay_s', values: r.groupDelayS },
    { name: 'gain_ideal_db', values: design.evaluation.gainDb.ideal },
  ]);
}
