/**
 * Order estimation: the smallest order of a family that meets a mask (passband edge(s) with at most
 * `passbandRippleDb` of loss, stopband edge(s) with at least `stopbandAttenuationDb`).
 *
 * The mask is first mapped to the lowpass prototype by the classical frequency transformations
 * (lowpass omega/omega_p, highpass omega_p/omega, bandpass (omega^2 - omega_0^2)/(B omega), bandstop its
 * reciprocal, with omega_0^2 = product of the passband edges and B their difference), and the more
 * demanding stopband edge after mapping gives the selectivity (the prototype stopband edge when the
 * passband edge is at 1) [Huelsman, Active and Passive Analog Filter Design (1993), ch. 2 and the
 * frequency-transformation chapter; Zverev (1967)]. For bandstop masks each passband edge in turn (lower, then upper) is moved towards
 * its stopband edge when that raises the selectivity: a filter with the wider passband still meets the
 * mask, and the geometric centre moves to balance the two stopband edges. This is the same as
 * scipy.signal's *ord functions with analog=True; we maximise the selectivity by golden-section search
 * to full precision, where scipy minimises the real-valued order with xtol = 1e-5.
 *
 * Order formulas, with D = (10^(A/10) - 1)/(10^(R/10) - 1) and selectivity w_s:
 *   Butterworth  log(D) / (2 log w_s)
 *   Chebyshev I and II  acosh(sqrt D) / acosh(w_s)
 *   elliptic  K(k) K'(k1) / (K'(k) K(k1)), k = 1/w_s, k1 = 1/sqrt(D)   [the degree equation, Orfanidis (2006)]
 *   Bessel  no closed form: the smallest N whose delay-normalised response, scaled so that its loss at
 *           the passband edge is exactly `passbandRippleDb`, has at least `stopbandAttenuationDb` at the
 *           selectivity. (The Bessel magnitude is monotone, so that scaling is the best one.)
 * An elliptic estimate of 1 is raised to 2, the lowest elliptic order {@link lowpassPrototype} builds.
 */

import { InvalidInputError, UnrealizableError, requireOneOf, requirePositive } from '../errors.js';
import { besselPrototype } from './bessel.js';
import { powerRatioMinusOne } from './chebyshev.js';
import { ellipticDiscrimination, periodRatio } from './elliptic-functions.js';
import {
  APPROXIMATION_FAMILIES,
  MAX_ORDER,
  MIN_ELLIPTIC_ORDER,
  requireAttenuationAboveRipple,
  type ApproximationFamily,
} from './prototype.js';
import { frequencyAtAttenuation, gainDbAt } from './zpk.js';

export const FILTER_TYPES = ['lowpass', 'highpass', 'bandpass', 'bandstop'] as const;
export type FilterType = (typeof FILTER_TYPES)[number];
export type BandEdgesHz = readonly [number, number];

export interface OrderMask {
  type: FilterType;
  family: ApproximationFamily;
  /** A number for lowpass/highpass, [low, high] for bandpass/bandstop. */
  passbandEdgeHz: number | BandEdgesHz;
  stopbandEdgeHz: number | BandEdgesHz;
  passbandRippleDb: number;
  stopbandAttenuationDb: number;
}

export interface OrderEstimate {
  /** The smallest order that meets the mask, 1..15 (elliptic 2..15). */
  order: number;
  /** The prototype stopband edge in rad/s when its passband edge is at 1 rad/s (> 1). */
  selectivity: number;
  /** The real-valued order before rounding up; absent for Bessel, which has no formula. */
  continuousOrder?: number;
  /**
   * Attenuation the chosen order reaches at the (more demanding) stopband edge, minus the attenuation
   * asked for, in dB (>= 0), with the passband edge loss exactly `passbandRippleDb`.
   */
  attenuationMarginDb: number;
  /** The passband edges the estimate is based on: the mask's, or for bandstop the widened ones. */
  passbandEdgeHz: number | [number, number];
}

/** Golden-section steps: the bracket shrinks by 0.618 per step, 200 steps reach adjacent doubles. */
const GOLDEN_STEPS = 200;
const INV_PHI = (Math.sqrt(5) - 1) / 2;

/**
 * Where a quasi-concave function is largest between `edge` and `limit` (either order), by golden-section
 * search (J. Kiefer, "Sequential minimax search for a maximum", Proc. AMS 4 (1953) 502-506). Returns
 * `edge` itself unless moving away from it helps.
 */
function maximiseFrom(f: (x: number) => number, edge: number, limit: number): number {
  let a = Math.min(edge, limit);
  let b = Math.max(edge, limit);
  let c = b - INV_PHI * (b - a);
  let d = a + INV_PHI * (b - a);
  let fc = f(c);
  let fd = f(d);
  for (let i = 0; i < GOLDEN_STEPS && c > a && d < b && c < d; i++) {
    if (fc >= fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - INV_PHI * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + INV_PHI * (b - a);
      fd = f(d);
    }
  }
  const x = (a + b) / 2;
  return f(edge) >= f(x) ? edge : x;
}

/** Bandstop selectivity: min over the stopband edges of B s / |s^2 - w0^2|. */
function bandstopSelectivity(pass: BandEdgesHz, stop: BandEdgesHz): number {
  const bandwidth = pass[1] - pass[0];
  const centreSq = pass[0] * pass[1];
  return Math.min(...stop.map((s) => Math.abs((bandwidth * s) / (s * s - centreSq))));
}

function selectivityOf(type: FilterType, pass: number | BandEdgesHz, stop: number | BandEdgesHz): {
  selectivity: number;
  passbandEdgeHz: number | [number, number];
} {
  if (type === 'lowpass') return { selectivity: (stop as number) / (pass as number), passbandEdgeHz: pass as number };
  if (type === 'highpass') return { selectivity: (pass as number) / (stop as number), passbandEdgeHz: pass as number };
  const p = pass as BandEdgesHz;
  const s = stop as BandEdgesHz;
  if (type === 'bandpass') {
    const bandwidth = p[1] - p[0];
    const centreSq = p[0] * p[1];
    const selectivity = Math.min(...s.map((w) => Math.abs((w * w - centreSq) / (bandwidth * w))));
    return { selectivity, passbandEdgeHz: [p[0], p[1]] };
  }
  const low = maximiseFrom((x) => bandstopSelectivity([x, p[1]], s), p[0], s[0]);
  const high = maximiseFrom((x) => bandstopSelectivity([low, x], s), p[1], s[1]);
  return { selectivity: bandstopSelectivity([low, high], s), passbandEdgeHz: [low, high] };
}

function requireEdges(value: unknown, path: string, type: FilterType): number | BandEdgesHz {
  if (type === 'lowpass' || type === 'highpass') return requirePositive(value, path);
  if (!Array.isArray(value) || value.length !== 2) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, value, `must be [low, high] for a ${type} mask`);
  }
  const low = requirePositive(value[0], `${path}[0]`);
  const high = requirePositive(value[1], `${path}[1]`);
  if (!(low < high)) throw new InvalidInputError('OUT_OF_RANGE', path, value, 'must be increasing: [low, high]');
  return [low, high];
}

/** Throws unless each stopband edge lies outside the passband on its own side. */
function requireStopbandOutsidePassband(type: FilterType, pass: number | BandEdgesHz, stop: number | BandEdgesHz): void {
  let ok: boolean;
  if (type === 'lowpass') ok = (stop as number) > (pass as number);
  else if (type === 'highpass') ok = (stop as number) < (pass as number);
  else {
    const [p0, p1] = pass as BandEdgesHz;
    const [s0, s1] = stop as BandEdgesHz;
    ok = type === 'bandpass' ? s0 < p0 && p1 < s1 : p0 < s0 && s1 < p1;
  }
  if (!ok) {
    throw new UnrealizableError(
      'UNREALIZABLE',
      'stopbandEdgeHz',
      { passbandEdgeHz: pass, stopbandEdgeHz: stop },
      `the ${type} stopband edge ${JSON.stringify(stop)} Hz must lie outside the passband ${JSON.stringify(pass)} Hz`,
    );
  }
}

/** Attenuation in dB of a response of given family and order at the selectivity (passband edge at R dB). */
function closedFormAttenuationDb(
  family: Exclude<ApproximationFamily, 'bessel'>,
  order: number,
  selectivity: number,
  rippleDb: number,
): number {
  const epsSq = powerRatioMinusOne(rippleDb);
  if (family === 'butterworth') return 10 * Math.log10(1 + epsSq * selectivity ** (2 * order));
  if (family === 'elliptic') {
    const k = 1 / selectivity;
    const { k: k1 } = ellipticDiscrimination(order, k, Math.sqrt((selectivity - 1) * (selectivity + 1)) / selectivity);
    return 10 * Math.log10(1 + epsSq / (k1 * k1));
  }
  return 10 * Math.log10(1 + epsSq * Math.cosh(order * Math.acosh(selectivity)) ** 2); // both Chebyshevs
}

function continuousOrderOf(family: Exclude<ApproximationFamily, 'bessel'>, selectivity: number, rippleDb: number, attenuationDb: number): number {
  const passSq = powerRatioMinusOne(rippleDb);
  const stopSq = powerRatioMinusOne(attenuationDb);
  if (family === 'butterworth') return Math.log(stopSq / passSq) / (2 * Math.log(selectivity));
  if (family === 'elliptic') {
    const k = 1 / selectivity;
    const kp = Math.sqrt((selectivity - 1) * (selectivity + 1)) / selectivity;
    const k1 = Math.sqrt(passSq / stopSq);
    const k1p = Math.sqrt((stopSq - passSq) / stopSq);
    // K(k) K'(k1) / (K'(k) K(k1)) = periodRatio(k1) / periodRatio(k)
    return periodRatio(k1, k1p) / periodRatio(k, kp);
  }
  return Math.acosh(Math.sqrt(stopSq / passSq)) / Math.acosh(selectivity);
}

/** The Bessel loss at `selectivity` times the frequency where the loss is `rippleDb`. */
function besselAttenuationDb(order: number, selectivity: number, rippleDb: number): number {
  const zpk = besselPrototype(order, 'delay');
  return -gainDbAt(zpk, selectivity * frequencyAtAttenuation(zpk, rippleDb));
}

/** The mask needs more than {@link MAX_ORDER}; `detail` names the numbers (required order or loss reached). */
function tooHigh(mask: OrderMask, detail: Record<string, number>, why: string): never {
  throw new UnrealizableError(
    'UNREALIZABLE',
    'order',
    { ...detail, maxOrder: MAX_ORDER },
    `the mask needs a ${mask.family} order above the maximum ${MAX_ORDER}: ${why}`,
  );
}

/**
 * The smallest order of `mask.family` that meets the mask, with the selectivity it was computed from.
 *
 * @example
 * estimateOrder({ type: 'lowpass', family: 'butterworth', passbandEdgeHz: 1000, stopbandEdgeHz: 2000,
 *   passbandRippleDb: 3, stopbandAttenuationDb: 40 }).order; // 7
 */
export function estimateOrder(mask: OrderMask): OrderEstimate {
  if (typeof mask !== 'object' || mask === null) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'mask', mask, 'must be an object');
  }
  const type = requireOneOf(mask.type, 'type', FILTER_TYPES);
  const family = requireOneOf(mask.family, 'family', APPROXIMATION_FAMILIES);
  const pass = requireEdges(mask.passbandEdgeHz, 'passbandEdgeHz', type);
  const stop = requireEdges(mask.stopbandEdgeHz, 'stopbandEdgeHz', type);
  const rippleDb = requirePositive(mask.passbandRippleDb, 'passbandRippleDb');
  const attenuationDb = requirePositive(mask.stopbandAttenuationDb, 'stopbandAttenuationDb');
  requireAttenuationAboveRipple(rippleDb, attenuationDb);
  requireStopbandOutsidePassband(type, pass, stop);

  const { selectivity, passbandEdgeHz } = selectivityOf(type, pass, stop);
  if (family === 'bessel') {
    let reached = Number.NaN;
    for (let order = 1; order <= MAX_ORDER; order++) {
      reached = besselAttenuationDb(order, selectivity, rippleDb);
      if (reached >= attenuationDb) {
        return { order, selectivity, attenuationMarginDb: reached - attenuationDb, passbandEdgeHz };
      }
    }
    return tooHigh(
      mask,
      { attenuationAtMaxOrderDb: reached, stopbandAttenuationDb: attenuationDb },
      `order ${MAX_ORDER} reaches ${reached.toFixed(2)} dB of the ${attenuationDb} dB asked for`,
    );
  }
  const continuousOrder = continuousOrderOf(family, selectivity, rippleDb, attenuationDb);
  let order = Math.ceil(continuousOrder);
  if (!(order <= MAX_ORDER)) {
    return tooHigh(mask, { requiredOrder: order, continuousOrder }, `the mask needs order ${order}`);
  }
  if (family === 'elliptic') order = Math.max(order, MIN_ELLIPTIC_ORDER);
  order = Math.max(order, 1);
  const reached = closedFormAttenuationDb(family, order, selectivity, rippleDb);
  return { order, selectivity, continuousOrder, attenuationMarginDb: reached - attenuationDb, passbandEdgeHz };
}
