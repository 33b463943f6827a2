/**
 * Test ladders for the substitution proofs: Darlington ladders of every family from src/ladder's
 * synthesizeLadder (the minimum-capacitor 'series-first' form: series inductors, shunt C or series-L-C
 * arms), made exact with fromLadder (each double taken as the rational it is), then transformed and
 * scaled by src/transform. Prototypes are cached: their synthesis costs up to a few hundred ms.
 */
import { Fraction } from '../../src/algebra/rational';
import { lowpassPrototype } from '../../src/approximation/index';
import { synthesizeLadder } from '../../src/ladder/darlington';
import {
  fromLadder,
  lowpassToBandpass,
  lowpassToBandstop,
  lowpassToHighpass,
  scaleFrequency,
  scaleImpedance,
  type NetworkLadder,
} from '../../src/transform/index';

export const FAMILIES = ['butterworth', 'chebyshev', 'inverse-chebyshev', 'elliptic', 'bessel'] as const;
export type Family = (typeof FAMILIES)[number];
export type ResponseType = 'lowpass' | 'highpass' | 'bandpass' | 'bandstop';

/** The lowest order each family exists at (the elliptic prototype starts at 2). */
export const MIN_ORDER: Record<Family, number> = { butterworth: 1, chebyshev: 1, 'inverse-chebyshev': 1, elliptic: 2, bessel: 1 };

/**
 * Ripple / attenuation pairs tried in turn. The ladder stage refuses some elliptic and inverse Chebyshev
 * combinations (0.5 dB / 50 dB: inverse Chebyshev 9 and elliptic 8, a partial removal that would need a
 * negative element); 1 dB / 60 dB realises every family at orders 1 to 9.
 */
const SPECS = [
  { passbandRippleDb: 1, stopbandAttenuationDb: 60 },
  { passbandRippleDb: 0.1, stopbandAttenuationDb: 60 },
  { passbandRippleDb: 0.5, stopbandAttenuationDb: 50 },
];

const cache = new Map<string, NetworkLadder>();

/** The normalised (1 ohm, 1 rad/s) lowpass ladder of a family and order. */
export function prototypeLadder(family: Family, order: number): NetworkLadder {
  const key = `${family}/${order}`;
  const hit = cache.get(key);
  if (hit) return hit;
  let last: unknown;
  for (const spec of SPECS) {
    try {
      const s = synthesizeLadder(lowpassPrototype({ family, order, ...spec }), { form: 'series-first' });
      const l = fromLadder(s.ladder);
      cache.set(key, l);
      return l;
    } catch (e) {
      last = e;
    }
  }
  throw last;
}

export interface Scale {
  /** Edge (lowpass, highpass) or centre (bandpass, bandstop), rad/s. */
  readonly omegaRadPerS: Fraction;
  /** Bandwidth of bandpass and bandstop, rad/s. */
  readonly bandwidthRadPerS: Fraction;
  readonly ohms: Fraction;
}

export const DEFAULT_SCALE: Scale = { omegaRadPerS: new Fraction(6283), bandwidthRadPerS: new Fraction(1500), ohms: new Fraction(1000) };

/** The prototype transformed to a response type and scaled. */
export function transformedLadder(family: Family, order: number, type: ResponseType, scale: Scale = DEFAULT_SCALE): NetworkLadder {
  const p = prototypeLadder(family, order);
  const w = scale.omegaRadPerS;
  const t =
    type === 'lowpass'
      ? scaleFrequency(p, w)
      : type === 'highpass'
        ? lowpassToHighpass(p, w)
        : type === 'bandpass'
          ? lowpassToBandpass(p, w.mul(w), scale.bandwidthRadPerS)
          : lowpassToBandstop(p, w.mul(w), scale.bandwidthRadPerS);
  return scaleImpedance(t, scale.ohms);
}
