/**
 * The design file (DESIGN.md, "The design file"): a zod schema of strict objects, so a misspelt key is
 * an error (with a suggestion, see parse-spec.ts) instead of being silently ignored. JSON, camelCase,
 * units in names, base SI units; every quantity may be a number or a quantity string ('4k7', '10n',
 * '2.2 kHz'). Every field is described and every optional field has a default, stated in its
 * description and filled in by {@link parseSpec}. The JSON Schema shipped as `gicladder/schema.json`
 * is generated from this file (scripts/build-schema.ts).
 *
 * The sections: name, response, realization, parts, evaluation, production, trim, export, safety.
 */
import { z } from 'zod';
import { APPROXIMATION_FAMILIES, BESSEL_NORMALIZATIONS, MAX_ORDER } from '../approximation/prototype';
import { FILTER_TYPES } from '../approximation/order';
import { E_SERIES_NAMES } from '../units/eseries';
import { frequencyOrPair, positiveNumber, quantity } from './fields';

/** Longest design name kept (for display; identifiers derived from it are sanitised downstream). */
/** Beyond these no filter or op-amp exists; the bounds keep errors at the field instead of deep in the chain. */
const MAX_RIPPLE_DB = 60;
const MAX_ATTENUATION_DB = 300;
const MAX_OPEN_LOOP_GAIN_DB = 300;
export const MAX_NAME_LENGTH = 1000;

/** 10 log10(2): the loss of a Butterworth response at its half-power frequency, dB. */
export const HALF_POWER_DB = 10 * Math.log10(2);

export const REALIZATION_METHODS = ['auto', 'simulated-inductor', 'fdnr', 'gic-embedding'] as const;
export type RealizationMethod = (typeof REALIZATION_METHODS)[number];
export const SELECTION_STRATEGIES = ['exact', 'round', 'capacitors-first', 'search'] as const;
export type SelectionStrategy = (typeof SELECTION_STRATEGIES)[number];
export const DECISION_RULES = ['simple-acceptance', 'guarded-acceptance', 'guarded-rejection'] as const;

const seriesEnum = z.enum(E_SERIES_NAMES as unknown as readonly ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192']);

// ---------------------------------------------------------------- response
const response = z
  .strictObject({
    type: z.enum(FILTER_TYPES).default('lowpass').describe("The filter type. Default 'lowpass'."),
    family: z
      .enum(APPROXIMATION_FAMILIES)
      .default('butterworth')
      .describe("The approximation: butterworth, chebyshev (I), inverse-chebyshev, elliptic (Cauer) or bessel. Default 'butterworth'."),
    order: z
      .number()
      .int()
      .min(1)
      .max(MAX_ORDER)
      .optional()
      .describe(`The order of the lowpass prototype, 1..${MAX_ORDER} (elliptic from 2). Default: estimated from the mask (stopbandEdgeHz and stopbandAttenuationDb).`),
    passbandEdgeHz: frequencyOrPair().describe(
      'The passband edge in Hz where the loss reaches passbandRippleDb; [low, high] for bandpass and bandstop. Required. ' +
        "For bessel with besselNormalization 'delay' or 'phase' it is the frequency the prototype's 1 rad/s maps to.",
    ),
    stopbandEdgeHz: frequencyOrPair()
      .optional()
      .describe('The stopband edge in Hz where the loss must reach stopbandAttenuationDb; [low, high] for bandpass and bandstop. Default: none (then order is required).'),
    passbandRippleDb: positiveNumber()
      .max(MAX_RIPPLE_DB)
      .optional()
      .describe(
        'The largest passband loss in dB (the ripple for chebyshev and elliptic). Default 0.5 dB for chebyshev and elliptic, ' +
          '10 log10(2) = 3.0103 dB (the half-power point) for butterworth, inverse-chebyshev and bessel.',
      ),
    stopbandAttenuationDb: positiveNumber()
      .max(MAX_ATTENUATION_DB)
      .optional()
      .describe('The smallest stopband loss in dB (inverse-chebyshev, elliptic, and order estimation). Default 40 dB.'),
    besselNormalization: z
      .enum(BESSEL_NORMALIZATIONS as unknown as readonly ['delay', 'magnitude', 'phase'])
      .default('magnitude')
      .describe(
        "Bessel only: what passbandEdgeHz means. 'magnitude': the loss is passbandRippleDb there; 'delay': passbandEdgeHz = 1/(2 pi tau0), " +
          "tau0 the group delay at DC; 'phase': the phase-normalised prototype's 1 rad/s. Default 'magnitude'.",
      ),
  })
  .describe('The response asked for: type, family, band edges, ripple and attenuation, or an explicit order.');

// ---------------------------------------------------------------- realization
const buffers = z
  .strictObject({
    input: z.boolean().default(false).describe('A unity-gain buffer between the source and the filter input. Default false.'),
    output: z.boolean().default(true).describe('A unity-gain buffer at the filter output (the FDNR lowpass output is a high-impedance node). Default true.'),
  })
  .describe('Unity-gain buffers at the ends. Default { input: false, output: true }.');

const realization = z
  .strictObject({
    method: z
      .enum(REALIZATION_METHODS)
      .default('auto')
      .describe(
        "How the LC ladder becomes an active circuit. 'simulated-inductor': grounded inductors become GIC inductors; 'fdnr': the Bruton 1/s " +
          "transform makes every capacitor a grounded FDNR (lowpass); 'gic-embedding': floating inductors by GIC embedding; 'auto' (the default): " +
          'fdnr for lowpass (all capacitors grounded in the minimum-capacitor form), simulated-inductor for all-pole highpass, gic-embedding for bandpass, bandstop and highpass with finite zeros (elliptic, inverse-chebyshev).',
      ),
    impedanceOhms: quantity('ohm')
      .optional()
      .describe('The impedance level: the source and load terminations in ohms (before the Bruton transform). Default: set by capacitorF.'),
    capacitorF: quantity('F')
      .optional()
      .describe('The capacitor value to build around, in F: the impedance level is chosen so this value appears in the circuit. Default 10 nF when impedanceOhms is not given.'),
    gicResistanceOhms: quantity('ohm')
      .optional()
      .describe("The GIC's fixed resistors in ohms. Default: chosen by the substitution stage (the capacitor's reactance equal to the resistors at the band edge)."),
    buffers: buffers.prefault({}),
  })
  .describe('How the ladder is realised with GICs, and at what impedance level.');

// ---------------------------------------------------------------- parts
const opampCommon = {
  supplyV: quantity('V')
    .default(30)
    .describe('The total supply voltage V+ - V- in volts (30 for +-15 V). Default 30 V.'),
  outputSwingV: quantity('V')
    .optional()
    .describe('The peak output voltage swing in volts (symmetric about mid-supply). Default supplyV/2 - 1.5 V (common practice, no source).'),
};
const gbw = quantity('Hz').describe('The gain-bandwidth product in Hz.');
const a0Db = z.number().min(0).max(MAX_OPEN_LOOP_GAIN_DB).describe('The open-loop DC gain in dB, 0 to 300. Default 100 dB.');
const opamp = z
  .discriminatedUnion('model', [
    z.strictObject({ model: z.literal('ideal').describe('The nullor: infinite gain.'), ...opampCommon }),
    z.strictObject({
      model: z.literal('finite-gain').describe('A(s) = A0.'),
      openLoopGainDb: a0Db.default(100),
      ...opampCommon,
    }),
    z.strictObject({ model: z.literal('integrator').describe('A(s) = 2 pi GBW / s.'), gainBandwidthHz: gbw, ...opampCommon }),
    z.strictObject({
      model: z.literal('single-pole').describe('A(s) = A0 / (1 + s A0 / (2 pi GBW)).'),
      gainBandwidthHz: gbw,
      openLoopGainDb: a0Db.default(100),
      ...opampCommon,
    }),
    z.strictObject({
      model: z.literal('two-pole').describe('The single-pole model with a second pole at secondPoleHz.'),
      gainBandwidthHz: gbw,
      openLoopGainDb: a0Db.default(100),
      secondPoleHz: quantity('Hz').describe('The second pole in Hz.'),
      ...opampCommon,
    }),
  ])
  .describe("The op-amp model every op-amp of the circuit uses. Default { model: 'single-pole', gainBandwidthHz: 10 MHz, openLoopGainDb: 100 }.");

export const DEFAULT_OPAMP = Object.freeze({ model: 'single-pole', gainBandwidthHz: 10e6, openLoopGainDb: 100 }) as { model: 'single-pole'; gainBandwidthHz: number; openLoopGainDb: number };

const resistors = z
  .strictObject({
    series: seriesEnum.default('E96').describe("The E-series (IEC 60063) resistors are chosen from. Default 'E96'."),
    tolerancePercent: positiveNumber().default(1).describe('The resistors\' tolerance in percent. Default 1 %.'),
    temperatureCoefficientPpmPerK: z.number().finite().default(50).describe('The resistors\' temperature coefficient in ppm/K. Default 50 ppm/K (metal film).'),
    minOhms: quantity('ohm').default(1e3).describe('Below this a resistor is flagged (op-amp output loading). Default 1 kOhm.'),
    maxOhms: quantity('ohm').default(1e6).describe('Above this a resistor is flagged (noise, bias current, stray capacitance). Default 1 MOhm.'),
  })
  .describe('The resistors.');

const capacitors = z
  .strictObject({
    series: seriesEnum.default('E12').describe("The E-series (IEC 60063) capacitors are chosen from. Default 'E12'."),
    tolerancePercent: positiveNumber().default(5).describe('The capacitors\' tolerance in percent. Default 5 %.'),
    temperatureCoefficientPpmPerK: z.number().finite().default(30).describe('The capacitors\' temperature coefficient in ppm/K. Default 30 ppm/K (C0G/NP0).'),
    minF: quantity('F').default(100e-12).describe('Below this a capacitor is flagged (stray and op-amp input capacitance). Default 100 pF.'),
    maxF: quantity('F').default(1e-6).describe('Above this a capacitor is flagged (no stable film or C0G parts). Default 1 uF.'),
  })
  .describe('The capacitors.');

const parts = z
  .strictObject({
    resistors: resistors.prefault({}),
    capacitors: capacitors.prefault({}),
    opamp: opamp.prefault(DEFAULT_OPAMP),
    selection: z
      .enum(SELECTION_STRATEGIES)
      .default('capacitors-first')
      .describe(
        "How preferred values are chosen. 'exact': no rounding; 'round': every part to its series; 'capacitors-first' (the default): capacitors from " +
          "their series, resistors computed exactly for them, then rounded to theirs; 'search': capacitors-first for the capacitor to build around and its neighbouring preferred values (up to searchMaxEvaluations), keeping the one with the smallest worst passband error after rounding.",
      ),
    searchMaxEvaluations: z
      .number()
      .int()
      .min(1)
      .max(10_000)
      .default(5)
      .describe("'search' only: the most candidate capacitor values realised and scored (bounds the time; each costs one realisation). Default 5."),
  })
  .describe('The parts: E-series, tolerances, temperature coefficients, the op-amp, and how preferred values are chosen.');

// ---------------------------------------------------------------- evaluation
const evaluation = z
  .strictObject({
    maxPassbandErrorDb: positiveNumber()
      .default(0.1)
      .describe('The passband error in dB against the ideal response that the minimum op-amp gain-bandwidth is found for. Default 0.1 dB.'),
    sweepPoints: z.number().int().min(16).max(20_000).default(400).describe('Frequencies in each evaluation sweep (log-spaced). Default 400.'),
    precompensate: z
      .boolean()
      .default(false)
      .describe("Adjust each GIC's set resistor so that, with the op-amp model, its element value is right at precompensationFrequencyHz. Default false."),
    precompensationFrequencyHz: quantity('Hz')
      .optional()
      .describe('The frequency where pre-compensation makes the element values right. Default: the passband edge (the upper one for bandpass).'),
  })
  .describe('What the evaluation checks and how finely.');

// ---------------------------------------------------------------- production, trim, export
const production = z
  .strictObject({
    enabled: z.boolean().default(false).describe('Whether the production test is planned (Monte Carlo boards, test points, limits, yields and risks; it goes into the report and the C header). Default false.'),
    testPoints: z
      .union([z.literal('auto'), z.array(quantity('Hz')).min(1).max(1000)])
      .default('auto')
      .describe("Test frequencies in Hz, or 'auto' (band edges, passband centre and stopband edges). Default 'auto'."),
    limits: z
      .enum(['statistical', 'mask'])
      .default('statistical')
      .describe("Where the tolerance at each test point comes from: 'statistical' (the default; the central limitCoverage share of the Monte Carlo boards, so the test catches boards that are not like the design) or 'mask' (the spec mask itself: passband within the ripple, stopband below the attenuation)."),
    limitCoverage: z.number().gt(0).lt(1).default(0.9973).describe('statistical limits only: the share of Monte Carlo boards the tolerance interval covers. Default 0.9973 (+-3 sigma of a normal process).'),
    coverageProbability: z.number().gt(0).lt(1).default(0.95).describe('The coverage probability of the expanded measurement uncertainty U = k u (JCGM 100, 6.2); k from the normal distribution (0.95 gives k = 1.96). Default 0.95.'),
    measurementUncertaintyDb: z.number().min(0).finite().default(0.05).describe('The standard uncertainty of a gain measurement in dB. Default 0.05 dB.'),
    decisionRule: z
      .enum(DECISION_RULES)
      .default('guarded-acceptance')
      .describe("How measurement uncertainty enters the limits (JCGM 106): 'simple-acceptance', 'guarded-acceptance' (the default) or 'guarded-rejection'."),
    trials: z.number().int().min(10).max(1_000_000).default(10_000).describe('Monte Carlo trials (JCGM 101). Default 10000.'),
    seed: z.number().int().min(0).max(2 ** 31 - 1).default(1).describe('The Monte Carlo seed. Default 1.'),
  })
  .describe('Production test: test points, limits with guard bands, Monte Carlo.');

const trimDevice = z
  .strictObject({
    steps: z.number().int().min(2).max(1_048_576).default(256).describe('Wiper positions of the trimmer or digital potentiometer. Default 256.'),
    endToEndOhms: quantity('ohm').default(10e3).describe('The end-to-end resistance in ohms. Default 10 kOhm.'),
    endToEndTolerancePercent: positiveNumber().default(20).describe('The end-to-end resistance tolerance in percent. Default 20 %.'),
    wiperOhms: quantity('ohm', { allowZero: true }).default(50).describe('The wiper resistance in ohms. Default 50 Ohm.'),
  })
  .describe('The trim device.');

const trim = z
  .strictObject({
    enabled: z.boolean().default(false).describe('Whether a trim table is made. Default false.'),
    element: z
      .string()
      .max(MAX_NAME_LENGTH)
      .default('auto')
      .describe("The part to trim, by name, or 'auto' (the set resistor of the GIC with the largest sensitivity at the trim frequency). Default 'auto'."),
    device: trimDevice.prefault({}),
    frequencyHz: quantity('Hz').optional().describe('The trim frequency in Hz. Default: the passband edge (the centre for bandpass and bandstop).'),
  })
  .describe('Trimming: which element, the device, and the frequency.');

const exportSection = z
  .strictObject({
    identifierPrefix: z
      .string()
      .max(MAX_NAME_LENGTH)
      .optional()
      .describe('The prefix of C identifiers. Default: the name, sanitised to [A-Za-z0-9_] (upper case for macros).'),
    floatType: z.enum(['float', 'double']).default('float').describe("The C floating type. Default 'float'."),
    fixedPointFormat: z
      .union([z.literal('none'), z.string().regex(/^Q(\d{1,2}\.)?\d{1,2}$/, "must be 'none' or Qm.n / Qn, e.g. 'Q15', 'Q1.15'")])
      .default('none')
      .describe("A fixed-point format for coefficients ('Q15', 'Q1.15', ...), or 'none'. Default 'none'."),
    sampleRateHz: quantity('Hz').optional().describe('The sample rate in Hz of digital sections (e.g. a compensating filter after the ADC). Default: none.'),
  })
  .describe('The C header and other exports.');

// ---------------------------------------------------------------- safety
const safety = z
  .strictObject({
    mainsConnected: z.boolean().default(false).describe('The circuit connects to the mains (the CLI prints a caution). Default false.'),
    safetyRelated: z.boolean().default(false).describe('The filter is part of a safety function (the CLI prints a caution). Default false.'),
  })
  .describe('Facts the CLI turns into cautions.');

// ---------------------------------------------------------------- the file
export const designSpecSchema = z
  .strictObject({
    $schema: z.string().max(2000).optional().describe('The JSON Schema URL or path, for editors; ignored.'),
    name: z
      .string()
      .min(1)
      .max(MAX_NAME_LENGTH)
      .default('filter')
      .describe("The design's name, for display (any characters; identifiers derived from it are sanitised). Default 'filter'."),
    response,
    realization: realization.prefault({}),
    parts: parts.prefault({}),
    evaluation: evaluation.prefault({}),
    production: production.prefault({}),
    trim: trim.prefault({}),
    export: exportSection.prefault({}),
    safety: safety.prefault({}),
  })
  .describe('A gicladder design file: one active GIC filter from its response to its parts.');

/** A design file as written (numbers or quantity strings, defaults absent). */
export type DesignSpecInput = z.input<typeof designSpecSchema>;
/** A design file as zod reads it (quantities as numbers, defaults filled where they are constants). */
export type ParsedSpec = z.output<typeof designSpecSchema>;
export type OpampSpec = ParsedSpec['parts']['opamp'];

/** The JSON Schema (draft 2020-12) of the design file, of the input form. */
export function designSpecJsonSchema(): Record<string, unknown> {
  return z.toJSONSchema(designSpecSchema, { io: 'input', target: 'draft-2020-12' }) as Record<string, unknown>;
}
