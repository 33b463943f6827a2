/**
 * Second-order sections from zeros/poles/gain, analog (s in rad/s) and digital (z), for the C header.
 *
 * Pairing and order follow the rule scipy.signal.zpk2sos documents (pairing 'minimal' for analog,
 * 'nearest' for digital; analysis/section-pairing.ts, steps 1-3), so the sections can be checked
 * against it coefficient by coefficient; then:
 * 4. The overall gain goes into the numerator of the first section (analog: optionally spread evenly).
 * The result: the highest-Q sections come last, after the low-Q ones have already attenuated the
 * out-of-band signal, which keeps the peak gain of every partial cascade low (less overflow and
 * limit-cycle risk in fixed point; L. B. Jackson, "Digital Filters and Signal Processing", 3rd ed.,
 * section 11.4 on pairing and ordering of cascade sections).
 *
 * Digital sections are H(z) = (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2) (a0 = 1); digital
 * filters with an odd number of roots get a root at the origin so every section is biquadratic in
 * form. Analog sections reuse {@link AnalogSection} of src/analysis (ascending powers of s) with a monic
 * denominator: d2 = 1 for a pole pair, d1 = 1 and d2 = 0 for a single real pole.
 */
import type { Complex } from '../algebra/complex';
import type { Zpk } from '../approximation/zpk';
import type { RationalFunction } from '../algebra/rational-function';
import { toFloatTransferFunction, type AnalogSection } from '../analysis/factored-response';
import { pairRoots, splitRoots } from '../analysis/section-pairing';
import { InvalidInputError, requireFinite, requireOneOf } from '../errors';

export type { AnalogSection };

/** H(z) = (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2). */
export interface DigitalSection {
  readonly b0: number;
  readonly b1: number;
  readonly b2: number;
  readonly a1: number;
  readonly a2: number;
}

/** Zeros/poles/gain, H = gain prod(x - zeros) / prod(x - poles), x = s (rad/s) or z: the approximation stage's Zpk. */
export type ZpkInput = Zpk;

export interface AnalogSectionOptions {
  /**
   * Where the overall gain goes: 'first' (default, as scipy) into the first numerator; 'spread' as
   * |gain|^(1/n) into every numerator (the sign into the first), which keeps each coefficient near the
   * scale of s^2 (rad/s): a 9th-order lowpass at 20 kHz has gain ~ 1e46, beyond binary32.
   */
  readonly gain?: 'first' | 'spread';
}

/** Analog second-order sections of a proper H(s) (no more zeros than poles); see the module comment. */
export function zpkToAnalogSections(zpk: ZpkInput, options: AnalogSectionOptions = {}): AnalogSection[] {
  const { zeros, poles, gain } = validateZpk(zpk);
  if (zeros.length > poles.length) {
    throw new InvalidInputError('OUT_OF_RANGE', 'zpk.zeros', zeros.length, 'an analog H(s) needs no more zeros than poles');
  }
  if (poles.length === 0) return [{ n0: gain, n1: 0, n2: 0, d0: 1, d1: 0, d2: 0 }];
  const count = Math.ceil(poles.length / 2);
  const pairs = pairRoots(splitRoots(zeros, 'zpk.zeros'), splitRoots(poles, 'zpk.poles'), count, 'analog');
  const spread = requireOneOf(options.gain ?? 'first', 'options.gain', ['first', 'spread'] as const) === 'spread';
  return pairs.map(({ z, p }, i) => {
    const [n2, n1, n0] = padLeft(monicPoly(z), 3);
    const [d2, d1, d0] = padLeft(monicPoly(p), 3);
    const k = spread ? (i === 0 ? Math.sign(gain) : 1) * Math.abs(gain) ** (1 / pairs.length) : i === 0 ? gain : 1;
    return { n0: n0 * k + 0, n1: n1 * k + 0, n2: n2 * k + 0, d0, d1, d2 }; // + 0: never -0
  });
}

/**
 * Analog sections of an exact H(s) (e.g. the realised circuit's transfer function): its zeros, poles and
 * gain come from src/analysis's toFloatTransferFunction (that stage's documented float boundary:
 * Aberth roots with exact conjugate pairs), then {@link zpkToAnalogSections} pairs and orders them.
 */
export function analogSectionsOfRational(h: RationalFunction, options: AnalogSectionOptions = {}): AnalogSection[] {
  const f = toFloatTransferFunction(h);
  return zpkToAnalogSections({ zeros: f.zeros, poles: f.poles, gain: f.gain }, options);
}

/** Digital second-order sections (a0 = 1) of H(z); see the module comment. */
export function zpkToDigitalSections(zpk: ZpkInput): DigitalSection[] {
  const v = validateZpk(zpk);
  if (v.zeros.length === 0 && v.poles.length === 0) return [{ b0: v.gain, b1: 0, b2: 0, a1: 0, a2: 0 }];
  const origin = (n: number): Complex[] => Array.from({ length: Math.max(n, 0) }, () => ({ re: 0, im: 0 }));
  let zeros = [...v.zeros, ...origin(v.poles.length - v.zeros.length)];
  let poles = [...v.poles, ...origin(v.zeros.length - v.poles.length)];
  const count = Math.ceil(poles.length / 2);
  if (poles.length % 2 === 1) {
    zeros = [...zeros, { re: 0, im: 0 }];
    poles = [...poles, { re: 0, im: 0 }];
  }
  const pairs = pairRoots(splitRoots(zeros, 'zpk.zeros'), splitRoots(poles, 'zpk.poles'), count, 'digital');
  return pairs.map(({ z, p }, i) => {
    const [b0, b1, b2] = padRight(monicPoly(z), 3);
    const [, a1, a2] = padRight(monicPoly(p), 3);
    const k = i === 0 ? v.gain : 1;
    return { b0: b0 * k + 0, b1: b1 * k + 0, b2: b2 * k + 0, a1, a2 }; // + 0: never -0
  });
}

function validateZpk(zpk: ZpkInput): ZpkInput {
  if (typeof zpk !== 'object' || zpk === null || !Array.isArray(zpk.zeros) || !Array.isArray(zpk.poles)) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'zpk', zpk, 'must be { zeros: Complex[], poles: Complex[], gain: number }');
  }
  const check = (roots: readonly Complex[], path: string) =>
    roots.forEach((r, i) => {
      requireFinite(r?.re, `${path}[${i}].re`);
      requireFinite(r?.im, `${path}[${i}].im`);
    });
  check(zpk.zeros, 'zpk.zeros');
  check(zpk.poles, 'zpk.poles');
  return { zeros: zpk.zeros, poles: zpk.poles, gain: requireFinite(zpk.gain, 'zpk.gain') };
}

/**
 * Coefficients of prod(x - r), highest power first, leading 1 (real: conjugates are written out);
 * adding +0 turns a negative zero (from a root at the origin) into +0.
 */
function monicPoly(roots: readonly Complex[]): number[] {
  if (roots.length === 0) return [1];
  if (roots.length === 1) return [1, -roots[0].re + 0];
  const [a, b] = roots;
  if (a.im !== 0) return [1, -2 * a.re + 0, a.re * a.re + a.im * a.im]; // (x - a)(x - conj a)
  return [1, -(a.re + b.re) + 0, a.re * b.re + 0];
}

function padLeft(c: number[], n: number): number[] {
  return [...new Array(n - c.length).fill(0), ...c];
}

function padRight(c: number[], n: number): number[] {
  return [...c, ...new Array(n - c.length).fill(0)];
}
