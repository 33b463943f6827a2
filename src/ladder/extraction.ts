/**
 * Cauer continued-fraction extraction with zero shifting, in exact rationals. The driving-point
 * immittance W = num/den (an impedance 'Z' or an admittance 'Y' looking into what is left of the ladder)
 * loses one branch per step:
 * - a pole at infinity removed fully (the last transmission zeros at infinity): a series L (from Z) or a
 *   shunt C (from Y), the quotient of num / den (W. Cauer, "Synthesis of Linear Communication Networks",
 *   1958, ch. 3; the continued fraction at infinity);
 * - a pole at infinity removed partly, k = W(jw)/(jw) (Eq. zero shifting), so that W - k s vanishes at
 *   the transmission zero jw; the inverse then has poles at +-jw, removed fully as a series L||C tank
 *   (from Z) or a shunt series-LC arm (from Y). E. A. Guillemin, "Synthesis of Passive Networks", 1957,
 *   ch. 13 (zero shifting by partial pole removal); Darlington's procedure for doubly terminated
 *   ladders: S. Darlington, J. Math. Phys. 18 (1939) 257-353.
 *
 * Arithmetic is exact within a step; between steps num and den are rounded to WORKING_BITS-bit integers
 * (extended precision, ~1e-96 relative), which keeps the cost polynomial. The doubly terminated data
 * also carry the polishing error of the reflection zeros (~1e-45), so remainders that should vanish are
 * dropped; the largest dropped remainder, relative to the polynomial it was divided from, is returned
 * as `residual`.
 *
 * A kernel: never throws; a negative or missing element is reported in the result.
 */
import { Fraction, Q0, Q1, fractionToNumber } from '../algebra/rational';
import { Poly } from '../algebra/poly';
import type { ExactBranch } from './types';

export type ImmittanceKind = 'Z' | 'Y';

export interface Immittance {
  readonly num: Poly;
  readonly den: Poly;
  readonly kind: ImmittanceKind;
}

export type ExtractionResult =
  | {
      readonly ok: true;
      readonly branches: ExactBranch[];
      /** What is left after the last branch: an impedance (kind 'Z') or admittance (kind 'Y') constant. */
      readonly termination: { readonly kind: ImmittanceKind; readonly value: Fraction };
      readonly residual: number;
    }
  | {
      readonly ok: false;
      /** Index (from the end where extraction starts) of the branch that failed. */
      readonly branchIndex: number;
      readonly element: 'inductanceH' | 'capacitanceF';
      readonly value: number;
      readonly reason: string;
    };

const flip = (k: ImmittanceKind): ImmittanceKind => (k === 'Z' ? 'Y' : 'Z');

/**
 * Bits kept per coefficient between steps. Exact Euclid over Q grows the coefficients by hundreds of
 * bits per step (order 11 took seconds); rounding num and den, scaled together so the largest
 * coefficient has this many bits, bounds the growth and perturbs W by at most 2^-(WORKING_BITS-1)
 * relative per coefficient (~1e-96), far below the 2^-160 polishing of the reflection zeros.
 */
const WORKING_BITS = 320;

const bitLength = (x: bigint): number => (x === 0n ? 0 : (x < 0n ? -x : x).toString(2).length);

/** Scales num and den by one positive power of two and rounds both to integers of about WORKING_BITS bits. */
function normalizePair(num: Poly, den: Poly): { num: Poly; den: Poly } {
  let top = -Infinity;
  for (const c of [...num.coefficients, ...den.coefficients]) {
    if (c.n !== 0n) top = Math.max(top, bitLength(c.n) - bitLength(c.d));
  }
  if (top === -Infinity) return { num, den };
  const shift = WORKING_BITS - top;
  const round = (p: Poly): Poly =>
    Poly.fromCoefficients(
      p.coefficients.map((c) => {
        const scaled = shift >= 0 ? (c.n << BigInt(shift)) : c.n;
        const d = shift >= 0 ? c.d : c.d << BigInt(-shift);
        const q = (2n * scaled + d) / (2n * d); // round half up on the magnitude
        return new Fraction(c.s * q);
      }),
    );
  return { num: round(num), den: round(den) };
}

/** sum c_2i (-w2)^i and sum c_(2i+1) (-w2)^i: p(jw) = even + j w odd. */
function splitAtJOmega(p: Poly, w2: Fraction): { even: Fraction; odd: Fraction } {
  let even = Q0;
  let odd = Q0;
  const minusW2 = w2.neg();
  for (let i = p.degree; i >= 0; i--) {
    if (i % 2 === 0) even = even.mul(minusW2).add(p.coefficient(i));
    else odd = odd.mul(minusW2).add(p.coefficient(i));
  }
  return { even, odd };
}

/**
 * Re[ (num/den)(jw) / (jw) ], exactly, for w^2 = w2 rational: with num(jw) = Ne + jw No and den(jw) =
 * De + jw Do, it is (No De - Ne Do) / (De^2 + w2 Do^2).
 */
export function realPartOverJOmega(num: Poly, den: Poly, w2: Fraction): Fraction {
  const n = splitAtJOmega(num, w2);
  const d = splitAtJOmega(den, w2);
  const bottom = d.even.mul(d.even).add(w2.mul(d.odd).mul(d.odd));
  return n.odd.mul(d.even).sub(n.even.mul(d.odd)).div(bottom);
}

function relativeSize(remainder: Poly, of: Poly): number {
  if (remainder.isZero()) return 0;
  const size = (p: Poly): number => p.coefficients.reduce((m, c) => Math.max(m, Math.abs(fractionToNumber(c))), 0);
  return size(remainder) / Math.max(size(of), Number.MIN_VALUE);
}

function elementBranch(kind: ImmittanceKind, value: Fraction): ExactBranch {
  return kind === 'Z' ? { placement: 'series', inductanceH: value } : { placement: 'shunt', capacitanceF: value };
}

/**
 * Extracts the ladder from W. `zeroOmegaSquared` lists the finite transmission zeros (w^2) in the order
 * their tanks or arms are to appear, counted from the end where W looks in.
 */
export function extractLadder(w: Immittance, zeroOmegaSquared: readonly Fraction[]): ExtractionResult {
  let { num, den } = normalizePair(w.num, w.den);
  let kind = w.kind;
  const branches: ExactBranch[] = [];
  let residual = 0;
  const fail = (element: 'inductanceH' | 'capacitanceF', value: Fraction | number, reason: string): ExtractionResult => ({
    ok: false,
    branchIndex: branches.length,
    element,
    value: typeof value === 'number' ? value : fractionToNumber(value),
    reason,
  });
  const partElement = (k: ImmittanceKind): 'inductanceH' | 'capacitanceF' => (k === 'Z' ? 'inductanceH' : 'capacitanceF');

  for (const w2 of zeroOmegaSquared) {
    if (num.degree !== den.degree + 1) return fail(partElement(kind), NaN, 'no pole at infinity to shift the next transmission zero with');
    const full = num.leading.div(den.leading);
    const k = realPartOverJOmega(num, den, w2); // Eq. zero shifting: k = W(jw)/(jw)
    if (k.compare(Q0) <= 0) return fail(partElement(kind), k, 'the partial removal that shifts a zero to the transmission zero is negative');
    if (k.compare(full) > 0) return fail(partElement(kind), full.sub(k), 'the partial removal exceeds the pole at infinity');
    branches.push(elementBranch(kind, k));
    const quadratic = Poly.fromCoefficients([w2, Q0, Q1]);
    const shifted = num.sub(Poly.S.mul(den).scale(k));
    const { quotient: Qs, remainder: r1 } = shifted.divmod(quadratic);
    residual = Math.max(residual, relativeSize(r1, shifted));
    // V = 1/(W - k s) = den / ((s^2 + w2) Qs) has poles at +-jw with residue factor K.
    const K = realPartOverJOmega(den, Qs, w2);
    const arm = flip(kind);
    if (K.compare(Q0) <= 0) return fail(arm === 'Z' ? 'capacitanceF' : 'inductanceH', Q1.div(K), 'the resonant branch at the transmission zero has a negative element');
    branches.push(
      arm === 'Z'
        ? { placement: 'series', inductanceH: K.div(w2), capacitanceF: Q1.div(K), arrangement: 'parallel' }
        : { placement: 'shunt', inductanceH: Q1.div(K), capacitanceF: K.div(w2), arrangement: 'series' },
    );
    const rest = den.sub(Poly.S.mul(Qs).scale(K));
    const { quotient: D1, remainder: r2 } = rest.divmod(quadratic);
    residual = Math.max(residual, relativeSize(r2, rest));
    ({ num, den } = normalizePair(Qs, D1)); // W_next = 1 / (D1 / Qs), same kind as W
  }

  for (;;) {
    if (num.degree === den.degree + 1) {
      const { quotient, remainder } = num.divmod(den);
      const a = quotient.coefficient(1);
      if (a.compare(Q0) <= 0) return fail(partElement(kind), a, 'the pole at infinity has a negative residue');
      branches.push(elementBranch(kind, a));
      if (den.degree === 0) return { ok: true, branches, termination: { kind, value: quotient.coefficient(0) }, residual };
      // quotient.coefficient(0) is zero for exact data and rounding-level otherwise: dropped.
      ({ num, den } = normalizePair(den, remainder));
      kind = flip(kind);
    } else if (num.degree <= 0 && den.degree === 0) {
      return { ok: true, branches, termination: { kind, value: num.isZero() ? Q0 : num.coefficient(0).div(den.coefficient(0)) }, residual };
    } else {
      return fail(partElement(kind), NaN, 'the remaining immittance has no pole at infinity');
    }
  }
}
