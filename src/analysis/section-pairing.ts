/**
 * Pairing of zeros and poles into second-order sections, by the rule scipy.signal.zpk2sos documents
 * (pairing 'minimal' for analog, 'nearest' for digital), shared by the evaluation sections of
 * factored-response.ts and the header sections of export/sos.ts:
 * 1. Conjugate pairs are kept together; near-real roots (|im| <= 100 eps |r|) count as real.
 * 2. The sections are filled from the last to the first. Each time the "worst" remaining pole is taken:
 *    the one closest to the unit circle (digital, smallest |1 - |p||) or to the j w axis (analog,
 *    smallest |Re p|), i.e. the highest-Q pole. A complex pole brings its conjugate; a real pole is
 *    joined by the worst remaining real pole.
 * 3. That pole pair gets the zeros nearest to it (a complex pair, or up to two real zeros), so each
 *    section's zeros partly cancel its poles' resonance (which keeps a cascade's partial products, and
 *    so the rounding of an evaluation section by section, small).
 */
import type { Complex } from '../algebra/complex';
import { InvalidInputError } from '../errors';

/** Roots whose imaginary part is within this many eps of |root| are real (scipy's _cplxreal uses 100). */
const REAL_TOLERANCE_EPS = 100;

/** A conjugate pair (represented by its upper root) or a real root. */
export interface Root {
  readonly re: number;
  readonly im: number; // >= 0; 0 means real
}

/**
 * Upper-half representatives of conjugate pairs (the pair's mean, so tiny asymmetry is removed), sorted
 * by real part, then the real roots sorted: the order scipy's _cplxreal gives, so ties break alike.
 */
export function splitRoots(roots: readonly Complex[], path: string): Root[] {
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
export interface SectionRoots {
  readonly z: Complex[];
  readonly p: Complex[];
}

const isReal = (r: Root) => r.im === 0;
const both = (r: Root): Complex[] => (isReal(r) ? [r] : [r, { re: r.re, im: -r.im }]);

/**
 * Steps 2 and 3 of the module comment; returns `count` sections first to last. Takes its roots out of
 * `zeros` and `poles`: zeros no section could take (an improper H) are left in `zeros`.
 */
export function pairRoots(zeros: Root[], poles: Root[], count: number, domain: 'analog' | 'digital'): SectionRoots[] {
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
