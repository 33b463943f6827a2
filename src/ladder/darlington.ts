/**
 * Darlington synthesis of LC ladders from a lowpass prototype (S. Darlington, "Synthesis of reactance
 * 4-poles which produce prescribed insertion loss characteristics", J. Math. Phys. 18 (1939) 257-353;
 * textbook form: W.-K. Chen, "Passive and Active Filters", 1986, ch. 4).
 *
 * The realised voltage transfer is T(s) = V(load)/V(source) = T0 * H(s)/H(0), T0 = RL/(Rs + RL) for
 * doubly terminated ladders and 1 for singly terminated ones (at DC every ladder here is a wire from
 * source to load). Doubly terminated: S21 = 2 sqrt(Rs/RL) T = sigma P/E with
 * sigma^2 = 4 Rs RL/(Rs + RL)^2 * (E(0)/P(0))^2 (the termination factor times the DC normalisation);
 * Feldtkeller F(s)F(-s) = E(s)E(-s) - sigma^2 P(s)P(-s) (reflection.ts); Zin = Rs (E + F)/(E - F) for
 * the series-first form and its dual Yin = (E + F)/(Rs (E - F)) for the shunt-first form; then Cauer
 * extraction with zero shifting (extraction.ts). Singly terminated: with an open load,
 * z11 = Rs m/n (m, n the even and odd parts of E); with a zero-ohm source, y22 = m/(RL n) extracted from
 * the load end (Chen, sec. 4.4). Both are exact (no reflection zeros to find).
 *
 * Forms. 'shunt-first' starts with a shunt capacitor; for responses with finite transmission zeros it is
 * the minimum-inductor form (shunt C, series L||C tanks). 'series-first' starts with a series inductor;
 * with finite zeros it is the minimum-capacitor form (series L, shunt series-LC arms), where every
 * capacitor is in a shunt arm to ground. That is the form both active realisations need: the Bruton
 * (FDNR) lowpass turns every capacitor into a grounded FDNR, and the LP -> HP transform turns every
 * capacitor into an inductor, which must be grounded to be simulated by one GIC. Singly terminated
 * ladders have one form only (the one whose last element faces the open end or the ideal source).
 *
 * Precision. With terminations lossless at the passband maxima (equal terminations of odd and modified
 * even orders, the computed load of even-order Chebyshev) the reflection zeros lie on the j-axis, where
 * D = EE* - sigma^2 PP* has double roots that float root finding locates only to ~sqrt(eps). There F is
 * formed from the reflection zeros themselves (the approximation's analytic ones when given, else the
 * maxima of |H| found as simple roots: inferred-characteristic.ts) and E is re-derived from
 * sigma^2 PP* + FF* by polishing the prototype's poles in 256-bit fixed point
 * (characteristic-factorization.ts). Other terminations have simple reflection zeros off the axis, found
 * by reflection.ts. The extraction runs in 448-bit fixed point (extraction.ts); element values are
 * exact dyadic rationals rounded once to doubles. Measured against a 50-digit mpmath synthesis
 * (test/ladder/high-order.test.ts, elliptic 0.1/40, 0.5/60, 1/80 dB and inverse Chebyshev 40/60/80 dB,
 * orders 3-15, both forms): worst relative element error 1e-14 to order 11 and 1e-13 to order 15 (the
 * double rounding of the prototype's zeros); the Butterworth and Chebyshev closed forms hold to 2e-12
 * (closed-form.test.ts). The exact response of every ladder matches the prototype to ~1e-14.
 */
import { Fraction, Q0, Q1, fractionFromDouble, fractionToNumber } from '../algebra/rational';
import { Poly } from '../algebra/poly';
import { InvalidInputError, UnrealizableError, requireFinite, requireOneOf } from '../errors';
import { extractLadder, type ExtractionResult, type Immittance } from './extraction';
import { moveReflectionZeros, moveTransmissionZeroToInfinity } from './even-order-modification';
import { factorFromCharacteristic } from './characteristic-factorization';
import { inferCharacteristic } from './inferred-characteristic';
import type { LowpassCharacteristic } from '../approximation/index';
import { normalizedMagnitude, peakPowerRatio } from './peak-gain';
import { prototypePolynomials, type PrototypeZpk } from './prototype-polynomials';
import { factorFeldtkeller } from './reflection';
import {
  EVEN_ORDER_MODIFICATIONS,
  LADDER_FORMS,
  REFLECTION_ZERO_CHOICES,
  type Branch,
  type Diagnostic,
  type EvenOrderModification,
  type ExactBranch,
  type ExactLadder,
  type Ladder,
  type LadderForm,
  type ReflectionZeroChoice,
} from './types';

export interface SynthesisOptions {
  /** Source resistance in ohms, >= 0; default 1. */
  sourceOhms?: number;
  /**
   * Load resistance in ohms (> 0) or 'open'. Default: equal to the source when the response allows it;
   * otherwise (even-order Chebyshev...) the load that makes the passband peaks lossless, computed.
   */
  loadOhms?: number | 'open';
  /** Default 'series-first' for doubly terminated ladders (see the module comment); forced when singly terminated. */
  form?: LadderForm;
  /** Default 'minimum-phase'. */
  reflectionZeros?: ReflectionZeroChoice;
  /**
   * The order of the finite transmission zeros along the ladder from the source end, as indices into the
   * zeros sorted by ascending frequency (0 = the lowest). Default 'auto': the first order, in the
   * sequence described at {@link autoTankOrders}, that gives positive elements.
   */
  tankOrder?: 'auto' | readonly number[];
  /** Default 'auto'; see {@link EvenOrderModification}. */
  evenOrder?: EvenOrderModification;
  /**
   * The zeros of the prototype's characteristic function when the approximation knows them exactly
   * (approximation stage, `lowpassCharacteristic`; {@link designLadderPrototype} passes them). With
   * terminations lossless at the passband maxima, F(s) is then formed from them instead of being found
   * numerically (characteristic-factorization.ts), which is what makes high-order elliptic and inverse
   * Chebyshev ladders accurate. Without them, or for other terminations, F comes from reflection.ts.
   */
  characteristic?: LowpassCharacteristic | null;
}

export interface LadderSynthesis {
  readonly ladder: Ladder;
  /** The same ladder with the exact rational element values the extraction produced. */
  readonly exactLadder: ExactLadder;
  /** The prototype actually realised (after an even-order modification, if any). */
  readonly realizedPrototype: PrototypeZpk;
  /** T0: the ladder realises V(load)/V(source) = T0 * H(s)/H(0) for the realised H. */
  readonly dcTransfer: number;
  /** The order of the transmission zeros used (indices as in {@link SynthesisOptions.tankOrder}). */
  readonly tankOrder: readonly number[];
  readonly diagnostics: Diagnostic[];
}

/** Relative tolerance for "equal" terminations and peak gains: far above the rounding of the prototype. */
const TERMINATION_TOLERANCE = 1e-9;
/** Most zero orders 'auto' tries (7 tanks at order 15 have 5040 orders; the good ones come early). */
const MAX_AUTO_ORDERS = 200;

/**
 * Darlington synthesis. Throws InvalidInputError for malformed options and UnrealizableError for a
 * response or termination no ladder of this kind realises (each with the offending field as `path`).
 *
 * @example
 * const { ladder } = synthesizeLadder({ zeros: [], poles: [{ re: -1, im: 0 }], gain: 1 });
 * // ladder.branches = [{ placement: 'series', inductanceH: 2 }] (Rs = RL = 1: L = 2 for -3 dB at 1 rad/s)
 */
export function synthesizeLadder(prototype: PrototypeZpk, options: SynthesisOptions = {}): LadderSynthesis {
  if (typeof options !== 'object' || options === null) throw new InvalidInputError('INVALID_ARGUMENT', 'options', options, 'must be an object');
  const diagnostics: Diagnostic[] = [];
  const sourceOhms = options.sourceOhms === undefined ? 1 : requireFinite(options.sourceOhms, 'sourceOhms');
  if (sourceOhms < 0) throw new InvalidInputError('OUT_OF_RANGE', 'sourceOhms', sourceOhms, 'must be zero or positive');
  const load = options.loadOhms;
  if (load !== undefined && load !== 'open' && !(typeof load === 'number' && Number.isFinite(load) && load > 0)) {
    throw new InvalidInputError('OUT_OF_RANGE', 'loadOhms', load, "must be a positive number or 'open'");
  }
  if (sourceOhms === 0 && load === 'open') {
    throw new InvalidInputError('INVALID_ARGUMENT', 'loadOhms', load, 'an open load needs a source resistance above zero');
  }
  const form = options.form === undefined ? undefined : requireOneOf(options.form, 'form', LADDER_FORMS);
  const choice = options.reflectionZeros === undefined ? 'minimum-phase' : requireOneOf(options.reflectionZeros, 'reflectionZeros', REFLECTION_ZERO_CHOICES);
  const evenOrder = options.evenOrder === undefined ? 'auto' : requireOneOf(options.evenOrder, 'evenOrder', EVEN_ORDER_MODIFICATIONS);
  const doubly = sourceOhms > 0 && load !== 'open';
  const equalAsked = doubly && (load === undefined || Math.abs(load - sourceOhms) <= TERMINATION_TOLERANCE * sourceOhms);

  let zpk: PrototypeZpk = prototype;
  let polys = prototypePolynomials(zpk);
  const n = polys.E.degree;
  // Without the approximation's zeros, where they are needed the reflection zeros on the axis are found
  // as the maxima of |H| (simple roots; inferred-characteristic.ts), checked against the poles before use.
  let characteristic = validCharacteristic(options.characteristic, n);
  if (polys.P.degree > n) {
    throw new UnrealizableError('UNREALIZABLE', 'prototype.zeros', prototype.zeros.length, 'more zeros than poles: not a lowpass response');
  }
  if (polys.P.degree === n) {
    if (evenOrder === 'none') {
      throw new UnrealizableError(
        'UNREALIZABLE',
        'evenOrder',
        evenOrder,
        'the response has nonzero gain at infinity (even-order elliptic or inverse Chebyshev), which no ladder of this kind realises; ' +
          "use evenOrder 'move-zero' or 'move-zero-and-reflection'",
      );
    }
    let reflectionOmega = 0;
    if (evenOrder === 'move-zero-and-reflection' || (evenOrder === 'auto' && equalAsked)) {
      const peak = responsePeak(zpk, polys.E, polys.P, characteristic);
      if (peak > 1 + TERMINATION_TOLERANCE) {
        characteristic ??= inferCharacteristic(zpk, polys.E, polys.P, peak);
        if (characteristic && characteristic.reflectionOmegasRadPerS.length > 0) reflectionOmega = characteristic.reflectionOmegasRadPerS[0];
        else if (!characteristic) {
          const dc = polys.E.coefficient(0).div(polys.P.coefficient(0));
          const f = factorFeldtkeller(polys.E, polys.P, dc.mul(dc).mul(fractionFromDouble(1 / peak)), 'minimum-phase');
          if (f && f.jAxisOmegaSquared.length > 0) reflectionOmega = Math.sqrt(fractionToNumber(f.jAxisOmegaSquared[0]));
        }
      }
      if (reflectionOmega === 0 && evenOrder === 'move-zero-and-reflection') {
        diagnostics.push({ code: 'NO_REFLECTION_ZERO_TO_MOVE', message: 'the DC gain is already the passband maximum: only the transmission zero was moved' });
      }
    }
    const highest = Math.sqrt(fractionToNumber(polys.zeroOmegaSquared[polys.zeroOmegaSquared.length - 1]));
    if (characteristic) characteristic = moveReflectionZeros(zpk, reflectionOmega, characteristic);
    zpk = moveTransmissionZeroToInfinity(zpk, reflectionOmega);
    polys = prototypePolynomials(zpk);
    diagnostics.push({
      code: 'EVEN_ORDER_ZERO_MOVED',
      message: `even-order response with nonzero gain at infinity: the highest transmission zero (${highest} rad/s) was moved to infinity, keeping the band edge at 1 rad/s`,
    });
    if (reflectionOmega > 0) {
      diagnostics.push({
        code: 'EVEN_ORDER_REFLECTION_ZERO_MOVED',
        message: `the lowest reflection zero (${reflectionOmega} rad/s) was moved to DC so that equal terminations are possible`,
      });
    }
  }
  const { P } = polys;
  let E = polys.E;
  const dcRatio = E.coefficient(0).div(P.coefficient(0)); // E(0)/P(0) = gain / H(0)
  const zeroCount = polys.zeroOmegaSquared.length;
  const orders = tankOrders(options.tankOrder, zeroCount);

  const Rs = fractionFromDouble(sourceOhms);
  let W: Immittance;
  let fromLoad = false;
  let requestedLoad: Fraction | 'open' | undefined;
  const m = E.evenPart();
  const od = E.oddPart();
  if (doubly) {
    const peak = responsePeak(zpk, E, P, characteristic);
    if (!Number.isFinite(peak)) throw new UnrealizableError('UNREALIZABLE', 'prototype', prototype, 'the peak gain of the response could not be found');
    let t: Fraction;
    if (load === undefined) {
      t = peak <= 1 + TERMINATION_TOLERANCE ? Q1 : fractionFromDouble(1 / peak);
      requestedLoad = peak <= 1 + TERMINATION_TOLERANCE ? Rs : undefined;
    } else {
      const RL = fractionFromDouble(load);
      requestedLoad = RL;
      t = Rs.mul(RL).mul(4).div(Rs.add(RL).pow(2));
      if (fractionToNumber(t) * peak > 1 + TERMINATION_TOLERANCE) {
        const r = (1 + Math.sqrt(1 - 1 / peak)) ** 2 * peak; // 4r/(1+r)^2 = 1/peak, r > 1
        throw new UnrealizableError(
          'UNREALIZABLE',
          'loadOhms',
          load,
          `the passband peaks ${(10 * Math.log10(peak)).toFixed(6)} dB above the DC gain, so the load must be at most ${sourceOhms / r} ` +
            `or at least ${sourceOhms * r} ohms (equal terminations need an odd order or a modified response)`,
        );
      }
    }
    const sigma2 = t.mul(dcRatio).mul(dcRatio);
    // Lossless at the passband maxima (t * peak = 1): the reflection zeros are on the j-axis.
    const lossless = requestedLoad === undefined || (t.equals(Q1) && peak <= 1 + TERMINATION_TOLERANCE);
    if (lossless) characteristic ??= inferCharacteristic(zpk, E, P, peak);
    const analytic = characteristic && lossless ? factorFromCharacteristic(P, sigma2, characteristic, zpk.poles) : null;
    let F: Poly;
    if (analytic) {
      F = analytic.F;
      E = analytic.E;
      zpk = { zeros: zpk.zeros, poles: analytic.poles, gain: zpk.gain * poleMagnitudeRatio(analytic.poles, zpk.poles) };
      if (analytic.largestPoleMove > POLE_MOVE_NOTE) {
        diagnostics.push({
          code: 'POLES_REPOLISHED',
          message: `the prototype's poles moved by up to ${analytic.largestPoleMove.toExponential(2)} (relative) onto the roots of its characteristic function`,
        });
      }
    } else {
      const fact = factorFeldtkeller(E, P, sigma2, choice);
      if (!fact) {
        throw new UnrealizableError('UNREALIZABLE', 'prototype', prototype, '|S21| would exceed 1 on the j-axis: the response is not passive with these terminations');
      }
      F = fact.F;
    }
    const wanted = form ?? 'series-first';
    W =
      wanted === 'series-first'
        ? { num: E.add(F).scale(Rs), den: E.sub(F), kind: 'Z' }
        : { num: E.add(F), den: E.sub(F).scale(Rs), kind: 'Y' };
  } else if (load === 'open') {
    // z11 = Rs m/n: series-first when m has the higher degree (even order).
    W = m.degree > od.degree ? { num: m.scale(Rs), den: od, kind: 'Z' } : { num: od, den: m.scale(Rs), kind: 'Y' };
    requestedLoad = 'open';
  } else {
    const RL = fractionFromDouble(load!);
    requestedLoad = RL;
    fromLoad = true;
    // y22 = m / (RL n), looking in from the load with the ideal source shorted.
    W = m.degree > od.degree ? { num: m, den: od.scale(RL), kind: 'Y' } : { num: od.scale(RL), den: m, kind: 'Z' };
  }
  if (!doubly) {
    const forced: LadderForm = fromLoad ? 'series-first' : W.kind === 'Z' ? 'series-first' : 'shunt-first';
    if (form !== undefined && form !== forced) {
      throw new UnrealizableError(
        'UNREALIZABLE',
        'form',
        form,
        `a singly terminated ladder of order ${n} with ${fromLoad ? 'a zero-ohm source' : 'an open load'} exists only in the '${forced}' form`,
      );
    }
  }

  // Extraction, over the zero orders asked for.
  let result: ExtractionResult | undefined;
  let usedOrder: readonly number[] = [];
  let firstFailure: ExtractionResult | undefined;
  for (const order of orders) {
    const fromEnd = fromLoad ? [...order].reverse() : order;
    const r = extractLadder(W, fromEnd.map((i) => polys.zeroOmegaSquared[i]));
    if (r.ok) {
      result = r;
      usedOrder = order;
      break;
    }
    firstFailure ??= r;
  }
  if (!result || !result.ok) {
    const f = firstFailure as Extract<ExtractionResult, { ok: false }>;
    const explicit = Array.isArray(options.tankOrder);
    const index = fromLoad ? `${f.branchIndex} from the load end` : String(f.branchIndex);
    const all = orders.length === factorial(zeroCount);
    const searched = explicit
      ? ''
      : zeroCount <= 1
        ? 'no ladder of this structure has positive elements; '
        : `none of the ${orders.length} tank orders tried${all ? ' (every order)' : ` (of ${factorial(zeroCount)})`} gives positive elements; ` +
          `with the default order [${orders[0].join(', ')}], `;
    throw new UnrealizableError(
      'UNREALIZABLE',
      explicit ? 'tankOrder' : 'prototype',
      explicit ? options.tankOrder : prototype,
      `${searched}branch ${index} would have ${f.element} = ${f.value}: ${f.reason}` + (explicit ? '; try another tankOrder or omit it' : ''),
    );
  }
  const exactBranches = fromLoad ? result.branches.slice().reverse() : result.branches;

  // The termination left at the far end.
  const term = result.termination;
  let realizedLoad: Fraction | 'open';
  if (doubly) {
    if (term.value.compare(Q0) <= 0) throw new UnrealizableError('UNREALIZABLE', 'loadOhms', load, 'the synthesis ended in a non-positive load');
    realizedLoad = term.kind === 'Z' ? term.value : Q1.div(term.value);
    if (requestedLoad instanceof Fraction) {
      const rel = Math.abs(fractionToNumber(realizedLoad.div(requestedLoad)) - 1);
      if (rel > 1e-6) {
        throw new UnrealizableError(
          'UNREALIZABLE',
          'loadOhms',
          fractionToNumber(requestedLoad),
          `the '${form ?? 'series-first'}' form of this response ends in ${fractionToNumber(realizedLoad)} ohms, not the load asked for; ` +
            `use the other form, or a load on the other side of the source resistance`,
        );
      }
    } else {
      diagnostics.push({
        code: 'LOAD_COMPUTED',
        message: `the response peaks above its DC gain, so equal terminations are impossible: the load was set to ${fractionToNumber(realizedLoad)} ohms (lossless at the passband peaks)`,
      });
    }
  } else {
    realizedLoad = load === 'open' ? 'open' : (requestedLoad as Fraction);
  }
  if (result.residual > 1e-30) {
    diagnostics.push({ code: 'SYNTHESIS_RESIDUAL', message: `largest dropped remainder in the extraction: ${result.residual.toExponential(2)} (relative)` });
  }

  const exactLadder: ExactLadder = { sourceOhms: Rs, loadOhms: realizedLoad, branches: exactBranches };
  const keptLoad = load === undefined || load === 'open' ? (requestedLoad instanceof Fraction ? sourceOhms : undefined) : load;
  const ladder = toFloatLadder(exactLadder, keptLoad);
  const dcTransfer = doubly ? fractionToNumber((realizedLoad as Fraction).div(Rs.add(realizedLoad as Fraction))) : 1;
  return { ladder, exactLadder, realizedPrototype: zpk, dcTransfer, tankOrder: usedOrder, diagnostics };
}

/**
 * max |H(jw)|^2/|H(0)|^2. With the characteristic known, the maxima are its reflection zeros (|K| = 0
 * there): 1 when one is at DC, else the value at any of them (the largest is taken); otherwise the
 * stationary points are searched (peak-gain.ts).
 */
function responsePeak(zpk: PrototypeZpk, E: Poly, P: Poly, characteristic: LowpassCharacteristic | undefined): number {
  if (!characteristic) return peakPowerRatio(zpk, E, P);
  if (characteristic.originMultiplicity > 0) return 1;
  let peak = 1;
  for (const w of characteristic.reflectionOmegasRadPerS) peak = Math.max(peak, normalizedMagnitude(zpk, { re: 0, im: w }) ** 2);
  return peak;
}

/** Relative pole move above which the re-derivation of E is reported: far above double rounding. */
const POLE_MOVE_NOTE = 1e-10;

/** prod |p'| / prod |p|: keeps H(0) when the poles move from `old` to `next` (same count, same signs). */
function poleMagnitudeRatio(next: readonly { re: number; im: number }[], old: readonly { re: number; im: number }[]): number {
  let r = 1;
  for (let i = 0; i < next.length; i++) r *= Math.hypot(next[i].re, next[i].im) / Math.hypot(old[i].re, old[i].im);
  return r;
}

/**
 * The characteristic option, checked against the prototype's order: F must have the degree of E (the
 * zeros counted with multiplicity). A mismatch is the caller's error.
 */
function validCharacteristic(c: LowpassCharacteristic | null | undefined, n: number): LowpassCharacteristic | undefined {
  if (c === undefined || c === null) return undefined;
  const omegas = c.reflectionOmegasRadPerS;
  if (
    typeof c !== 'object' ||
    !Number.isInteger(c.originMultiplicity) ||
    c.originMultiplicity < 0 ||
    !Array.isArray(omegas) ||
    omegas.some((w, i) => !(Number.isFinite(w) && w > 0 && (i === 0 || w > omegas[i - 1]))) ||
    c.originMultiplicity + 2 * omegas.length !== n
  ) {
    throw new InvalidInputError(
      'INVALID_ARGUMENT',
      'characteristic',
      c,
      `must be { originMultiplicity, reflectionOmegasRadPerS: ascending positive numbers } with originMultiplicity + 2 * count = ${n}, the order`,
    );
  }
  return c;
}

/**
 * The float boundary of this stage: element values (exact rationals from the extraction) rounded once
 * to the nearest doubles. `loadOhms`, when the caller gave it, is kept as given.
 */
export function toFloatLadder(exact: ExactLadder, loadOhms?: number): Ladder {
  const branches: Branch[] = exact.branches.map((b: ExactBranch) => {
    const out: Branch = { placement: b.placement };
    if (b.inductanceH !== undefined) out.inductanceH = fractionToNumber(b.inductanceH);
    if (b.capacitanceF !== undefined) out.capacitanceF = fractionToNumber(b.capacitanceF);
    if (b.arrangement !== undefined) out.arrangement = b.arrangement;
    return out;
  });
  const load = exact.loadOhms === 'open' ? 'open' : loadOhms ?? fractionToNumber(exact.loadOhms);
  return { sourceOhms: fractionToNumber(exact.sourceOhms), loadOhms: load, branches };
}

/**
 * The zero orders to try. Explicit: that one, validated. 'auto': first the order that alternates from
 * the outside in, the highest zeros at the ends and the lowest (nearest the passband, hardest to shift
 * to) in the middle, then every other permutation in lexicographic order, up to {@link MAX_AUTO_ORDERS}.
 */
function tankOrders(option: SynthesisOptions['tankOrder'], count: number): number[][] {
  if (option !== undefined && option !== 'auto') {
    if (!Array.isArray(option) || option.length !== count || [...option].sort((a, b) => a - b).some((v, i) => v !== i)) {
      throw new InvalidInputError('INVALID_ARGUMENT', 'tankOrder', option, `must be a permutation of 0..${count - 1} (one index per finite transmission zero pair)`);
    }
    return [[...option]];
  }
  return autoTankOrders(count);
}

const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1));

export function autoTankOrders(count: number): number[][] {
  const first: number[] = new Array(count);
  let lo = 0;
  let hi = count - 1;
  let next = count - 1;
  // Highest zeros at the ends, alternating, lowest in the middle.
  while (lo <= hi) {
    first[lo++] = next--;
    if (lo <= hi) first[hi--] = next--;
  }
  const out: number[][] = [first];
  const perm = Array.from({ length: count }, (_, i) => i);
  const key = (p: number[]): string => p.join(',');
  const seen = new Set([key(first)]);
  const visit = (prefix: number[], rest: number[]): void => {
    if (out.length >= MAX_AUTO_ORDERS) return;
    if (rest.length === 0) {
      if (!seen.has(key(prefix))) out.push(prefix);
      return;
    }
    for (let i = 0; i < rest.length; i++) visit([...prefix, rest[i]], [...rest.slice(0, i), ...rest.slice(i + 1)]);
  };
  visit([], perm);
  return out;
}
