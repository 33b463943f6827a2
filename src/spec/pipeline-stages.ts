/**
 * The stages designFilter runs before substitution, each a small function of the normalised spec:
 * order, prototype and its edge, ladder, denormalisation (frequency and impedance scaling, LP -> HP /
 * BP / BS), and the route and options of the substitution stage.
 *
 * Float boundary of this stage: 2 pi f (irrational) and the prototype edge are rounded to
 * {@link FREQUENCY_DIGITS} significant decimal digits and taken as exact rationals from there on
 * ({@link toExactDecimal}); every later transform is exact.
 */
import { Fraction, Q0, Q1, toFraction } from '../algebra/rational';
import { estimateOrder, frequencyAtAttenuation, gainDbAt, MAX_ORDER, type OrderEstimate, type Zpk } from '../approximation/index';
import { designLadderPrototype, type ExactLadder, type Ladder, type LadderSynthesis } from '../ladder/index';
import { fromLadder, lowpassToBandpass, lowpassToBandstop, lowpassToHighpass, scaleFrequency, scaleImpedance, type NetworkLadder } from '../transform/index';
import type { OpampModel } from '../netlist/opamp';
import type { BufferChoice, RealizationMethod } from '../substitution/realization';
import { nearestPreferredExact } from '../units/eseries';
import type { DesignSpec } from './parse-spec';
import { UnrealizableError } from '../errors';

/**
 * Significant digits of a float frequency made exact: 12 digits move a band edge by < 1e-11 relative,
 * far below any part tolerance, and keep the rationals short.
 */
export const FREQUENCY_DIGITS = 12;

/** A positive double rounded to `digits` significant digits, as the exact decimal. */
export function toExactDecimal(x: number, digits = FREQUENCY_DIGITS): Fraction {
  return toFraction(x.toPrecision(digits));
}

/** A spec number as the decimal it prints as (4.7e-9 -> 47/10^10), not its binary value. */
export function specDecimal(x: number): Fraction {
  return toFraction(String(x));
}

export type Edge = number | [number, number];

export interface OrderChoice {
  readonly order: number;
  /** Present when the order was estimated from the mask. */
  readonly estimate?: OrderEstimate;
  /** The passband edge(s) the design uses: the spec's, or for an estimated bandstop the widened ones. */
  readonly passbandEdgeHz: Edge;
}

/** The given order, or the smallest one that meets the mask (approximation/order.ts). */
export function chooseOrder(spec: DesignSpec): OrderChoice {
  const r = spec.response;
  if (r.order !== undefined) return { order: r.order, passbandEdgeHz: r.passbandEdgeHz as Edge };
  const estimate = estimateOrder({
    type: r.type,
    family: r.family,
    passbandEdgeHz: r.passbandEdgeHz as Edge,
    stopbandEdgeHz: r.stopbandEdgeHz as Edge,
    passbandRippleDb: r.passbandRippleDb,
    stopbandAttenuationDb: r.stopbandAttenuationDb,
  });
  return { order: estimate.order, estimate, passbandEdgeHz: estimate.passbandEdgeHz };
}

/** Log-spaced samples per decade of the stopband check (a step of 0.06 %: minima found to micro-dB). */
const STOPBAND_SAMPLES_PER_DECADE = 4000;
/** Decades above the stopband edge the check covers (beyond, every realisable prototype only falls). */
const STOPBAND_DECADES = 3;

/**
 * The least attenuation (dB below 0 dB, the passband maximum of the prototypes here) of a lowpass
 * prototype from `stopbandEdgeRadPerS` up: log-spaced samples over three decades and the edge itself.
 * Samples only overestimate a minimum, so a negative margin against it is real.
 */
export function worstStopbandAttenuationDb(prototype: Zpk, stopbandEdgeRadPerS: number): number {
  let worst = -gainDbAt(prototype, stopbandEdgeRadPerS);
  const n = STOPBAND_SAMPLES_PER_DECADE * STOPBAND_DECADES;
  for (let i = 1; i <= n; i++) worst = Math.min(worst, -gainDbAt(prototype, stopbandEdgeRadPerS * 10 ** (i / STOPBAND_SAMPLES_PER_DECADE)));
  return worst;
}

/** Worse than this against the mask, a realised prototype's stopband counts as missing it (sampling and rounding are far smaller). */
const STOPBAND_TOLERANCE_DB = 1e-6;

export interface VerifiedOrder {
  readonly order: OrderChoice;
  readonly ladder: LadderSynthesis & { prototype: Zpk };
  /** Set when the estimated order's realised (modified) prototype missed the stopband and order + 1 is used. */
  readonly raisedFrom?: { readonly order: number; readonly worstAttenuationDb: number };
  /** The realised prototype's least stopband attenuation minus the mask's, dB (estimated orders whose ladder realises a modified prototype). */
  readonly realizedMarginDb?: number;
  /** Where the realised prototype's stopband begins, as a fraction of the mask's stopband edge (lowpass prototype frequencies; <= 1 when met). */
  readonly stopbandStartRatio?: number;
}

/**
 * Synthesises the chosen order and, for an estimated order, checks the prototype the ladder really
 * realises. The estimate is computed on the unmodified prototype; an even-order elliptic ladder
 * realises a modified response whose stopband begins higher (for order 4, 0.5 dB ripple and 40 dB: at
 * 1.85 instead of 1.63 rad/s), so a mask the estimate just meets can be missed by ten dB or more.
 * Then the next order (odd, unmodified, which meets it) is used.
 */
export function synthesiseVerified(spec: DesignSpec, choice: OrderChoice): VerifiedOrder {
  const ladder = synthesise(spec, choice.order);
  const estimate = choice.estimate;
  // the estimate holds for the prototype itself; only a ladder that realises another one needs the check
  if (!estimate || sameZpk(ladder.realizedPrototype, ladder.prototype)) return { order: choice, ladder };
  const asked = spec.response.stopbandAttenuationDb!;
  const check = (l: typeof ladder) => {
    const edge = estimate.selectivity * prototypeEdgeRadPerS(spec, l.prototype);
    const realizedMarginDb = worstStopbandAttenuationDb(l.realizedPrototype, edge) - asked;
    const met = realizedMarginDb >= -STOPBAND_TOLERANCE_DB;
    return { met, found: { realizedMarginDb, stopbandStartRatio: met ? stopbandStart(l.realizedPrototype, asked, edge) / edge : undefined } };
  };
  const first = check(ladder);
  if (first.met || choice.order >= MAX_ORDER) return { order: choice, ladder, ...first.found };
  const raised = { ...choice, order: choice.order + 1 };
  const next = synthesise(spec, raised.order);
  return { order: raised, ladder: next, raisedFrom: { order: choice.order, worstAttenuationDb: first.found.realizedMarginDb + asked }, ...check(next).found };
}

/** Bisection steps for the stopband start: the bracket [1, edge] shrinks to rounding. */
const START_STEPS = 60;

/**
 * Where a lowpass prototype's loss first reaches `attenuationDb` below `edgeRadPerS` (the loss rises
 * monotonically through the transition band): bisection on [1, edge].
 */
function stopbandStart(prototype: Zpk, attenuationDb: number, edgeRadPerS: number): number {
  let lo = Math.min(1, edgeRadPerS);
  let hi = edgeRadPerS;
  for (let i = 0; i < START_STEPS; i++) {
    const mid = Math.sqrt(lo * hi);
    if (-gainDbAt(prototype, mid) >= attenuationDb - STOPBAND_TOLERANCE_DB) hi = mid;
    else lo = mid;
  }
  return hi;
}

function sameZpk(a: Zpk, b: Zpk): boolean {
  const same = (x: readonly { re: number; im: number }[], y: readonly { re: number; im: number }[]) => x.length === y.length && x.every((r, i) => r.re === y[i].re && r.im === y[i].im);
  return a.gain === b.gain && same(a.zeros, b.zeros) && same(a.poles, b.poles);
}

/**
 * The prototype's angular frequency (rad/s) that the passband edge maps to. Chebyshev and elliptic
 * prototypes have their ripple edge at 1 rad/s, and a Bessel prototype in 'delay' or 'phase'
 * normalisation is mapped by its own 1 rad/s. Butterworth, inverse Chebyshev and the 'magnitude' Bessel
 * use the frequency where the loss is passbandRippleDb (1 rad/s for Butterworth at 3.01 dB), as order
 * estimation assumes.
 */
export function prototypeEdgeRadPerS(spec: DesignSpec, prototype: Zpk): number {
  const r = spec.response;
  if (r.family === 'chebyshev' || r.family === 'elliptic') return 1;
  if (r.family === 'bessel' && r.besselNormalization !== 'magnitude') return 1;
  const w = frequencyAtAttenuation(prototype, r.passbandRippleDb);
  if (!(w > 0 && Number.isFinite(w))) {
    throw new UnrealizableError('UNREALIZABLE', 'response.passbandRippleDb', r.passbandRippleDb, `the ${r.family} prototype of order ${prototype.poles.length} never loses ${r.passbandRippleDb} dB at a finite frequency: no passband edge to scale to`);
  }
  return w;
}

/**
 * The ladder in the minimum-capacitor ('series-first') form: every capacitor in a shunt arm, which the
 * FDNR route needs (each becomes a grounded FDNR) and the highpass route needs (each becomes a grounded
 * inductor); the embedding route takes any form. Equal 1-ohm terminations where the response allows.
 */
export function synthesise(spec: DesignSpec, order: number): LadderSynthesis & { prototype: Zpk } {
  const r = spec.response;
  return designLadderPrototype({
    family: r.family,
    order,
    passbandRippleDb: r.passbandRippleDb,
    stopbandAttenuationDb: r.stopbandAttenuationDb,
    normalization: r.besselNormalization,
    form: 'series-first',
  });
}

/** The frequency the impedance level is tied to: the passband edge, or the centre of a band. */
export function referenceFrequencyHz(edges: Edge): number {
  return Array.isArray(edges) ? Math.sqrt(edges[0] * edges[1]) : edges;
}

export interface ImpedanceLevel {
  /** The terminations' resistance, ohms (exact). */
  readonly impedanceOhms: Fraction;
  /** The capacitor the circuit is built around, F (exact). */
  readonly capacitorF: Fraction;
  /** True when capacitorF was moved to a preferred value. */
  readonly capacitorRounded: boolean;
}

/**
 * The impedance level R0 and the capacitor C, tied by R0 C 2 pi f_ref = 1 (f_ref the reference
 * frequency): given one, the other follows. Unless the strategy is 'exact', C is first moved to the
 * nearest preferred value of the capacitor series (the capacitors-first choice), and R0 follows it.
 */
export function chooseImpedanceLevel(spec: DesignSpec, edges: Edge): ImpedanceLevel {
  const omega = toExactDecimal(2 * Math.PI * referenceFrequencyHz(edges));
  const rz = spec.realization;
  let c = rz.capacitorF !== undefined ? specDecimal(rz.capacitorF) : toExactDecimal(1 / (2 * Math.PI * referenceFrequencyHz(edges) * rz.impedanceOhms!), FREQUENCY_DIGITS);
  let rounded = false;
  if (spec.parts.selection !== 'exact') {
    const preferred = nearestPreferredExact(c, spec.parts.capacitors.series);
    rounded = !preferred.equals(c);
    c = preferred;
  }
  const r0 = rz.impedanceOhms !== undefined && !rounded ? specDecimal(rz.impedanceOhms) : Q1.div(omega.mul(c));
  return { impedanceOhms: r0, capacitorF: c, capacitorRounded: rounded };
}

/**
 * Significant digits the normalised element values keep as exact decimals. The synthesis is accurate to
 * about 1e-13 (ladder/darlington.ts), so 15 digits lose nothing, while its exact rationals (hundreds of
 * digits) would make the exact analysis of the whole circuit needlessly slow.
 */
export const LADDER_DIGITS = 15;

/** A float ladder with every value as the exact decimal of LADDER_DIGITS significant digits. */
export function toDecimalLadder(ladder: Ladder): ExactLadder {
  const d = (x: number) => toExactDecimal(x, LADDER_DIGITS);
  return {
    sourceOhms: ladder.sourceOhms === 0 ? Q0 : d(ladder.sourceOhms),
    loadOhms: ladder.loadOhms === 'open' ? 'open' : d(ladder.loadOhms),
    branches: ladder.branches.map((b) => ({
      placement: b.placement,
      ...(b.inductanceH !== undefined ? { inductanceH: d(b.inductanceH) } : {}),
      ...(b.capacitanceF !== undefined ? { capacitanceF: d(b.capacitanceF) } : {}),
      ...(b.arrangement !== undefined ? { arrangement: b.arrangement } : {}),
    })),
  };
}

/**
 * The normalised ladder denormalised: the prototype edge w_p to the passband edge (LP: s -> s w_p/w_e;
 * HP: s -> w_p w_e / s; BP/BS: s -> s w_p, then the band maps with w0^2 = w1 w2 and B = w2 - w1), then
 * impedance-scaled to R0 (transform/frequency.ts).
 */
export function denormalise(spec: DesignSpec, synthesis: LadderSynthesis, edgeRadPerS: number, edges: Edge, r0: Fraction): NetworkLadder {
  const n0 = fromLadder(toDecimalLadder(synthesis.ladder));
  const wp = toExactDecimal(edgeRadPerS);
  const w = (hz: number): Fraction => toExactDecimal(2 * Math.PI * hz);
  let n: NetworkLadder;
  switch (spec.response.type) {
    case 'lowpass':
      n = scaleFrequency(n0, w(edges as number).div(wp));
      break;
    case 'highpass':
      n = lowpassToHighpass(n0, w(edges as number).mul(wp));
      break;
    case 'bandpass':
    case 'bandstop': {
      const [f1, f2] = edges as [number, number];
      const w1 = w(f1);
      const w2 = w(f2);
      const unit = scaleFrequency(n0, Q1.div(wp));
      n = spec.response.type === 'bandpass' ? lowpassToBandpass(unit, w1.mul(w2), w2.sub(w1)) : lowpassToBandstop(unit, w1.mul(w2), w2.sub(w1));
      break;
    }
  }
  return scaleImpedance(n, r0);
}

/**
 * The route 'auto' takes: fdnr for lowpass (every capacitor of the minimum-capacitor ladder is
 * grounded, so every one becomes a grounded FDNR and no inductor is left), simulated-inductor for
 * all-pole highpass (the inductors from the prototype's shunt capacitors are all grounded),
 * gic-embedding for bandpass and bandstop (their series resonators hold floating inductors) and for
 * highpass with finite transmission zeros (elliptic, inverse Chebyshev: the series-first ladder's
 * shunt L-C arms leave a node reached only through capacitors, which has no DC path once the grounded
 * inductor becomes a GIC; the embedding keeps a DC path).
 */
export function chooseMethod(spec: DesignSpec): RealizationMethod {
  const m = spec.realization.method;
  if (m !== 'auto') return m;
  switch (spec.response.type) {
    case 'lowpass':
      return 'fdnr';
    case 'highpass':
      return spec.response.family === 'elliptic' || spec.response.family === 'inverse-chebyshev' ? 'gic-embedding' : 'simulated-inductor';
    default:
      return 'gic-embedding';
  }
}

/** The spec's buffers as the substitution stage's choice. */
export function bufferChoice(spec: DesignSpec): BufferChoice {
  const { input, output } = spec.realization.buffers;
  return input && output ? 'both' : input ? 'input' : output ? 'output' : 'none';
}

/** The spec's op-amp as the netlist's model (finite gain from dB to a ratio). */
export function opampModelOf(spec: DesignSpec): OpampModel {
  const o = spec.parts.opamp;
  switch (o.model) {
    case 'ideal':
      return { model: 'ideal' };
    case 'finite-gain':
      return { model: 'finite-gain', gain: 10 ** (o.openLoopGainDb / 20) };
    case 'integrator':
      return { model: 'integrator', gainBandwidthHz: o.gainBandwidthHz };
    case 'single-pole':
      return { model: 'single-pole', gainBandwidthHz: o.gainBandwidthHz, openLoopGainDb: o.openLoopGainDb };
    case 'two-pole':
      return { model: 'two-pole', gainBandwidthHz: o.gainBandwidthHz, openLoopGainDb: o.openLoopGainDb, secondPoleHz: o.secondPoleHz };
  }
}

/**
 * The nominal passband gain of the ladder, dB: the ladder realises T0 H(s)/H(0) (ladder/darlington.ts),
 * T0 = RL/(Rs + RL) for doubly terminated ladders (-6.02 dB for equal terminations), and the
 * normalised prototypes peak at 0 dB, so the passband peak is 20 log10(T0) - 20 log10|H(0)|.
 */
export function nominalPassbandGainDb(synthesis: LadderSynthesis): number {
  return 20 * Math.log10(synthesis.dcTransfer) - gainDbAt(synthesis.realizedPrototype, 0);
}

