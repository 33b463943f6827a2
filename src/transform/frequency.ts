/**
 * Frequency transformations of a normalised lowpass network ladder, element by element, exact in
 * rationals (e.g. A. I. Zverev, "Handbook of Filter Synthesis", Wiley 1967, ch. 2, the reactance
 * transformations; the same maps as scipy.signal's lp2lp/lp2hp/lp2bp/lp2bs on transfer functions).
 * Each map is given the angular frequencies as exact rationals (rad/s); with s the new variable:
 * - lowpass -> lowpass  s -> s/wc:            L -> L/wc, C -> C/wc, D -> D/wc^2
 * - lowpass -> highpass s -> wc/s:            L -> C = 1/(wc L), C -> L = 1/(wc C)
 * - lowpass -> bandpass s -> (s^2 + w0^2)/(B s): L -> series(L/B, B/(w0^2 L)), C -> parallel(C/B, B/(w0^2 C))
 * - lowpass -> bandstop s -> B s/(s^2 + w0^2):   L -> parallel(L B/w0^2, 1/(B L)), C -> series(C B/w0^2, 1/(B C))
 * Resistors are unchanged by all four. The transfer function becomes H(map(s)) exactly.
 */
import { Fraction, toFraction, type RationalLike } from '../algebra/rational';
import { RationalFunction } from '../algebra/rational-function';
import { InvalidInputError } from '../errors';
import { element, mapLadder, type NetworkElement, type Network, type NetworkLadder } from './network';

function positive(x: RationalLike, path: string): Fraction {
  const f = toFraction(x, path);
  if (!(f.s > 0n && f.n > 0n)) throw new InvalidInputError('OUT_OF_RANGE', path, typeof x === 'object' ? x.toString() : x, 'must be greater than zero');
  return f;
}

function refuseFdnr(e: NetworkElement, map: string): never {
  throw new InvalidInputError('INVALID_ARGUMENT', e.origin, e.kind, `an FDNR has no element image under the ${map} map; transform before the Bruton transform`);
}

/** s -> s/wc: a lowpass with edge 1 rad/s gets its edge at wc rad/s. */
export function scaleFrequency(l: NetworkLadder, omegaRadPerS: RationalLike): NetworkLadder {
  const wc = positive(omegaRadPerS, 'omegaRadPerS');
  return mapLadder(l, (e) => {
    switch (e.kind) {
      case 'R':
        return e;
      case 'L':
      case 'C':
        return element(e.kind, e.value.div(wc), e.origin);
      case 'D':
        return element('D', e.value.div(wc.mul(wc)), e.origin);
    }
  });
}

/** Impedance scaling by r0: every impedance times r0 (R, L times r0; C, D divided by r0). H(s) is unchanged. */
export function scaleImpedance(l: NetworkLadder, ohms: RationalLike): NetworkLadder {
  const r0 = positive(ohms, 'ohms');
  return mapLadder(l, (e) => element(e.kind, e.kind === 'R' || e.kind === 'L' ? e.value.mul(r0) : e.value.div(r0), e.origin));
}

/** s -> wc/s. */
export function lowpassToHighpass(l: NetworkLadder, omegaRadPerS: RationalLike): NetworkLadder {
  const wc = positive(omegaRadPerS, 'omegaRadPerS');
  return mapLadder(l, (e): Network => {
    switch (e.kind) {
      case 'R':
        return e;
      case 'L':
        return element('C', wc.mul(e.value).inverse(), e.origin);
      case 'C':
        return element('L', wc.mul(e.value).inverse(), e.origin);
      case 'D':
        return refuseFdnr(e, 'highpass');
    }
  });
}

/**
 * The two resonator maps share their shape: each reactive element becomes an L-C pair, joined in
 * series or in parallel, with element values from the old one. `pair` gives, for an element of value
 * x, the two new parts and how they are joined.
 */
function resonatorMap(
  l: NetworkLadder,
  map: string,
  pair: (e: NetworkElement) => { kind: 'series' | 'parallel'; first: NetworkElement; second: NetworkElement },
): NetworkLadder {
  return mapLadder(l, (e): Network => {
    if (e.kind === 'R') return e;
    if (e.kind === 'D') return refuseFdnr(e, map);
    const p = pair(e);
    return { kind: p.kind, parts: [p.first, p.second] };
  });
}

/** s -> (s^2 + w0^2)/(B s), with w0^2 and B in (rad/s)^2 and rad/s. */
export function lowpassToBandpass(l: NetworkLadder, w0Squared: RationalLike, bandwidthRadPerS: RationalLike): NetworkLadder {
  const w2 = positive(w0Squared, 'w0Squared');
  const bw = positive(bandwidthRadPerS, 'bandwidthRadPerS');
  return resonatorMap(l, 'bandpass', (e) =>
    e.kind === 'L'
      ? { kind: 'series', first: element('L', e.value.div(bw), e.origin), second: element('C', bw.div(w2.mul(e.value)), e.origin) }
      : { kind: 'parallel', first: element('C', e.value.div(bw), e.origin), second: element('L', bw.div(w2.mul(e.value)), e.origin) },
  );
}

/** s -> B s/(s^2 + w0^2). */
export function lowpassToBandstop(l: NetworkLadder, w0Squared: RationalLike, bandwidthRadPerS: RationalLike): NetworkLadder {
  const w2 = positive(w0Squared, 'w0Squared');
  const bw = positive(bandwidthRadPerS, 'bandwidthRadPerS');
  return resonatorMap(l, 'bandstop', (e) =>
    e.kind === 'L'
      ? { kind: 'parallel', first: element('L', e.value.mul(bw).div(w2), e.origin), second: element('C', bw.mul(e.value).inverse(), e.origin) }
      : { kind: 'series', first: element('C', e.value.mul(bw).div(w2), e.origin), second: element('L', bw.mul(e.value).inverse(), e.origin) },
  );
}

/** The maps on transfer functions that the ladder maps above realise, for the proofs. */
export const transferFunctionMaps = {
  lowpass: (h: RationalFunction, wc: RationalLike) => h.scaleVariable(toFraction(wc).inverse()),
  highpass: (h: RationalFunction, wc: RationalLike) => h.substituteReciprocal(wc),
  bandpass: (h: RationalFunction, w0Squared: RationalLike, bw: RationalLike) => h.substituteBandpass(w0Squared, bw),
  bandstop: (h: RationalFunction, w0Squared: RationalLike, bw: RationalLike) => h.substituteBandstop(w0Squared, bw),
};

