/**
 * Second-order sections from zeros/poles/gain, analog (s in rad/s) and digital (z), for the C header.
 *
 * Pairing and order follow the rule scipy.signal.zpk2sos documents (pairing 'minimal' for analog,
 * 'nearest' for digital), so the sections can be checked against it coefficient by coefficient:
 * 1. Conjugate pairs are kept together; near-real roots (|im| <= 100 eps |r|) count as real.
 * 2. The sections are filled from the last to the first. Each time the "worst" remaining pole is taken:
 *    the one closest to the unit circle (digital, smallest |1 - |p||) or to the j w axis (analog,
 *    smallest |Re p|), i.e. the highest-Q pole. A complex pole brings its conjugate; a real pole is
 *    joined by the worst remaining real pole.
 * 3. That pole pair gets the zeros nearest to it (a complex pair, or up to two real zeros), so each
 *    section's zeros partly cancel its poles' resonance.
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
import type { RationalFunction } from '../algebra/rational-function';
import { toFloatTransferFunction, type AnalogSection } from '../analysis/factored-response';
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

/** Zeros/poles/gain, H = gain prod(x - zeros) / prod(x - poles), x = s (rad/s) or z. */
export interface ZpkInput {
  readonly zeros: readonly Complex[];
  readonly poles: readonly Complex[];
  readonly gain: number;
}

/** Roots whose imaginary part is within this many eps of |root| are real (scipy's _cplxreal uses 100). */
const REAL_TOLERANCE_EPS = 100;

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

/** A conjugate pair (represented by its upper root) or a real root. */
interface Root {
  readonly re: number;
  readonly im: number; // >= 0; 0 means real
}

/**
 * Upper-half representatives of conjugate pairs (the pair's mean, so tiny asymmetry is removed), sorted
 * by real part, then the real roots sorted: the order scipy's _cplxreal gives, so ties break alike.
 */
function splitRoots(roots: readonly Complex[], path: string): Root[] {
  const reals: Root[] = [];
  const upper: Complex[] = [];
  const lower: Complex[] = [];
  for (const r of roots) {
    const tol = REAL_TOLERANCE_EPS * Number.EPSILON * Math.hypot(r.re, r.im);
    if (Math.abs(r.im) <= tol) reals.push({ re: r.re, im: 0 });
    else (r.im > 0 ? upper : lower).push(r);
  }
  if (upper.length !== lower.length) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, roots, 'complex roots must come in conjugate pairs');
  }
  const byPosition = (a: Complex, b: Complex) => a.re - b.re || Math.abs(a.im) - Math.abs(b.im);
  upper.sort(byPosition);
  lower.sort(byPosition);
  const pairs: Root[] = upper.map((u, i) => {
    const l = lower[i];
    const tol = REAL_TOLERANCE_EPS * Number.EPSILON * Math.hypot(u.re, u.im);
    if (Math.abs(u.re - l.re) > tol || Math.abs(u.im + l.im) > tol) {
      throw new InvalidInputError('INVALID_ARGUMENT', path, roots, 'complex roots must come in conjugate pairs');
    }
    return { re: (u.re + l.re) / 2, im: (u.im - l.im) / 2 };
  });
  reals.sort((a, b) => a.re - b.re);
  return [...pairs, ...reals];
}

/** The roots of one section: each list holds 0, 1 or 2 roots, a complex pair written out in full. */
interface SectionRoots {
  readonly z: Complex[];
  readonly p: Complex[];
}

const isReal = (r: Root) => r.im === 0;
const both = (r: Root): Complex[] => (isReal(r) ? [r] : [r, { re: r.re, im: -r.im }]);

/** Steps 2 and 3 of the module comment; returns sections first to last. */
function pairRoots(zeros: Root[], poles: Root[], count: number, domain: 'analog' | 'digital'): SectionRoots[] {
  const badness = domain === 'digital' ? (p: Root) => Math.abs(1 - Math.hypot(p.re, p.im)) : (p: Root) => Math.abs(p.re);
  const takeWorst = (list: Root[], accept: (r: Root) => boolean): Root => {
    let best = -1;
    for (let i = 0; i < list.length; i++) if (accept(list[i]) && (best < 0 || badness(list[i]) < badness(list[best]))) best = i;
    return list.splice(best, 1)[0];
  };
  /** The zero nearest to p of the kind asked for (-1 when there is none); first of equals wins. */
  const nearest = (p: Root, kind: 'real' | 'complex' | 'any'): number => {
    let best = -1;
    let bestDist = Infinity;
    for (let i = 0; i < zeros.length; i++) {
      if ((kind === 'real' && !isReal(zeros[i])) || (kind === 'complex' && isReal(zeros[i]))) continue;
      const d = Math.hypot(zeros[i].re - p.re, zeros[i].im - p.im);
      if (d < bestDist) {
        bestDist = d;
        best = i;
      }
    }
    return best;
  };
  const take = (i: number): Root => zeros.splice(i, 1)[0];
  const out: SectionRoots[] = new Array(count);
  for (let si = count - 1; si >= 0; si--) {
    const p1 = takeWorst(poles, () => true);
    const realPolesLeft = poles.filter(isReal).length;
    if (isReal(p1) && realPolesLeft === 0) {
      // the last real pole: with the nearest real zero if there is one (digital filters always have one:
      // the padding); an analog one without gets none, so every section stays proper (scipy would fail
      // here; the complex pole pairs left can take the complex zeros left, since a proper H with an odd
      // number of poles and only complex zeros has fewer zeros than poles)
      const i = nearest(p1, 'real');
      out[si] = { z: i >= 0 ? both(take(i)) : [], p: [p1] };
      continue;
    }
    if (!isReal(p1) && poles.length + 1 === zeros.length && realPolesLeft === 1 && zeros.filter(isReal).length === 1) {
      // one real pole and one real zero left for the other sections: this pair must take a complex zero
      out[si] = { z: both(take(nearest(p1, 'complex'))), p: both(p1) };
      continue;
    }
    const p = isReal(p1) ? [p1, takeWorst(poles, isReal)] : both(p1);
    const z: Complex[] = [];
    if (zeros.length > 0) {
      const z1 = take(nearest(p1, 'any'));
      z.push(...both(z1));
      if (isReal(z1) && zeros.length > 0) {
        const i = nearest(p1, 'real');
        if (i >= 0) z.push(take(i));
      }
    }
    out[si] = { z, p };
  }
  return out;
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
