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
 * Arithmetic: BigInt fixed point with {@link FRACTION_BITS} fractional bits, num and den rescaled
 * together by a power of two after every step so that their largest coefficient is about 1 (W is
 * unchanged by a common scale). Each operation rounds at 2^-FRACTION_BITS of the largest coefficient
 * (~1e-135), far below the ~1e-30 to which the reflection zeros and poles are polished, so the element
 * values are those of the data to every digit a double shows. (Exact rationals within a step, as this
 * module first did, spent most of an order-15 synthesis in gcds of fraction.js.) Remainders that vanish
 * for exact data are dropped; the largest, relative to the polynomial it was divided from, is returned
 * as `residual`. Element values come out as exact dyadic rationals.
 *
 * A kernel: never throws; a negative or missing element is reported in the result.
 */
import { Fraction, Q0, Q1, fractionToNumber } from '../algebra/rational';
import type { Poly } from '../algebra/poly';
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

/** Fractional bits of the fixed-point coefficients: 2^-448 ~ 1e-135 of the largest coefficient. */
const FRACTION_BITS = 448n;
const ONE = 1n << FRACTION_BITS;

type FixedPoly = bigint[]; // ascending; value = c / 2^FRACTION_BITS

const mul = (a: bigint, b: bigint): bigint => (a * b) >> FRACTION_BITS;
const div = (a: bigint, b: bigint): bigint => (a << FRACTION_BITS) / b;
const abs = (x: bigint): bigint => (x < 0n ? -x : x);
const bitLength = (x: bigint): number => (x === 0n ? 0 : abs(x).toString(2).length);

function trim(p: FixedPoly): FixedPoly {
  let n = p.length;
  while (n > 1 && p[n - 1] === 0n) n--;
  return p.slice(0, n);
}

const degree = (p: FixedPoly): number => (p.length === 1 && p[0] === 0n ? -1 : p.length - 1);

function fromFraction(f: Fraction, shift: number): bigint {
  const scaled = shift >= 0 ? f.n << BigInt(shift) : f.n;
  const d = shift >= 0 ? f.d : f.d << BigInt(-shift);
  return f.s * ((scaled << FRACTION_BITS) / d);
}

const toFraction = (x: bigint): Fraction => new Fraction(x, ONE);

/** The pair as fixed-point polynomials, scaled by one power of two so the largest coefficient is ~1. */
function fixedPair(num: Poly, den: Poly): { num: FixedPoly; den: FixedPoly } {
  let top = -Infinity;
  for (const c of [...num.coefficients, ...den.coefficients]) {
    if (c.n !== 0n) top = Math.max(top, bitLength(c.n) - bitLength(c.d));
  }
  const shift = top === -Infinity ? 0 : -top;
  return { num: trim(num.coefficients.map((c) => fromFraction(c, shift))), den: trim(den.coefficients.map((c) => fromFraction(c, shift))) };
}

/** Rescales a pair by one power of two so its largest coefficient has FRACTION_BITS + 1 bits (value ~1). */
function rescale(num: FixedPoly, den: FixedPoly): { num: FixedPoly; den: FixedPoly } {
  let top = 0;
  for (const c of num) top = Math.max(top, bitLength(c));
  for (const c of den) top = Math.max(top, bitLength(c));
  const shift = Number(FRACTION_BITS) + 1 - top;
  if (shift === 0 || top === 0) return { num, den };
  const sh = (c: bigint): bigint => (shift > 0 ? c << BigInt(shift) : c >> BigInt(-shift));
  return { num: num.map(sh), den: den.map(sh) };
}

/** sum c_2i (-w2)^i and sum c_(2i+1) (-w2)^i: p(jw) = even + j w odd. */
function splitAtJOmega(p: FixedPoly, w2: bigint): { even: bigint; odd: bigint } {
  let even = 0n;
  let odd = 0n;
  for (let i = p.length - 1; i >= 0; i--) {
    if (i % 2 === 0) even = mul(even, -w2) + p[i];
    else odd = mul(odd, -w2) + p[i];
  }
  return { even, odd };
}

/**
 * Re[ (num/den)(jw) / (jw) ] for w^2 = w2: with num(jw) = Ne + jw No and den(jw) = De + jw Do, it is
 * (No De - Ne Do) / (De^2 + w2 Do^2). The products are kept at full width (no rounding before the division).
 */
function realPartOverJOmega(num: FixedPoly, den: FixedPoly, w2: bigint): bigint {
  const n = splitAtJOmega(num, w2);
  const d = splitAtJOmega(den, w2);
  const top = n.odd * d.even - n.even * d.odd;
  const bottom = d.even * d.even + mul(w2, d.odd) * d.odd;
  return bottom === 0n ? 0n : (top << FRACTION_BITS) / bottom;
}

/** a - c * s * b. */
function subScaledShift(a: FixedPoly, c: bigint, b: FixedPoly): FixedPoly {
  const out = a.slice();
  while (out.length < b.length + 1) out.push(0n);
  for (let i = 0; i < b.length; i++) out[i + 1] -= mul(c, b[i]);
  return trim(out);
}

/** Division by s^2 + w2: quotient and remainder (degree <= 1). */
function divideByQuadratic(a: FixedPoly, w2: bigint): { quotient: FixedPoly; remainder: FixedPoly } {
  const r = a.slice();
  const n = r.length - 1;
  if (n < 2) return { quotient: [0n], remainder: trim(r) };
  const q: bigint[] = new Array(n - 1).fill(0n);
  for (let i = n - 2; i >= 0; i--) {
    q[i] = r[i + 2];
    r[i + 2] = 0n;
    r[i] -= mul(w2, q[i]);
  }
  return { quotient: trim(q), remainder: trim(r.slice(0, 2)) };
}

function relativeSize(remainder: FixedPoly, of: FixedPoly): number {
  const size = (p: FixedPoly): number => p.reduce((m, c) => Math.max(m, Math.abs(fractionToNumber(toFraction(c)))), 0);
  const r = size(remainder);
  return r === 0 ? 0 : r / Math.max(size(of), Number.MIN_VALUE);
}

function elementBranch(kind: ImmittanceKind, value: Fraction): ExactBranch {
  return kind === 'Z' ? { placement: 'series', inductanceH: value } : { placement: 'shunt', capacitanceF: value };
}

/**
 * Extracts the ladder from W. `zeroOmegaSquared` lists the finite transmission zeros (w^2) in the order
 * their tanks or arms are to appear, counted from the end where W looks in.
 */
export function extractLadder(w: Immittance, zeroOmegaSquared: readonly Fraction[]): ExtractionResult {
  let { num, den } = fixedPair(w.num, w.den);
  let kind = w.kind;
  const branches: ExactBranch[] = [];
  let residual = 0;
  const fail = (element: 'inductanceH' | 'capacitanceF', value: bigint | number, reason: string): ExtractionResult => ({
    ok: false,
    branchIndex: branches.length,
    element,
    value: typeof value === 'number' ? value : fractionToNumber(toFraction(value)),
    reason,
  });
  const partElement = (k: ImmittanceKind): 'inductanceH' | 'capacitanceF' => (k === 'Z' ? 'inductanceH' : 'capacitanceF');

  for (const w2f of zeroOmegaSquared) {
    const w2 = fromFraction(w2f, 0);
    if (degree(num) !== degree(den) + 1) return fail(partElement(kind), NaN, 'no pole at infinity to shift the next transmission zero with');
    const full = div(num[num.length - 1], den[den.length - 1]);
    const k = realPartOverJOmega(num, den, w2); // Eq. zero shifting: k = W(jw)/(jw)
    if (k <= 0n) return fail(partElement(kind), k, 'the partial removal that shifts a zero to the transmission zero is negative');
    if (k > full) return fail(partElement(kind), full - k, 'the partial removal exceeds the pole at infinity');
    branches.push(elementBranch(kind, toFraction(k)));
    const shifted = subScaledShift(num, k, den);
    const { quotient: Qs, remainder: r1 } = divideByQuadratic(shifted, w2);
    residual = Math.max(residual, relativeSize(r1, shifted));
    // V = 1/(W - k s) = den / ((s^2 + w2) Qs) has poles at +-jw with residue factor K.
    const K = realPartOverJOmega(den, Qs, w2);
    const arm = flip(kind);
    if (K <= 0n) return fail(arm === 'Z' ? 'capacitanceF' : 'inductanceH', K === 0n ? NaN : fractionToNumber(Q1.div(toFraction(K))), 'the resonant branch at the transmission zero has a negative element');
    const Kf = toFraction(K);
    branches.push(
      arm === 'Z'
        ? { placement: 'series', inductanceH: Kf.div(w2f), capacitanceF: Q1.div(Kf), arrangement: 'parallel' }
        : { placement: 'shunt', inductanceH: Q1.div(Kf), capacitanceF: Kf.div(w2f), arrangement: 'series' },
    );
    const rest = subScaledShift(den, K, Qs);
    const { quotient: D1, remainder: r2 } = divideByQuadratic(rest, w2);
    residual = Math.max(residual, relativeSize(r2, rest));
    ({ num, den } = rescale(Qs, D1)); // W_next = 1 / (D1 / Qs), same kind as W
  }

  for (;;) {
    const dn = degree(num);
    const dd = degree(den);
    if (dn === dd + 1) {
      // num / den = a s + b + remainder / den
      const a = div(num[dn], den[dd]);
      if (a <= 0n) return fail(partElement(kind), a, 'the pole at infinity has a negative residue');
      branches.push(elementBranch(kind, toFraction(a)));
      const afterA = subScaledShift(num, a, den).slice(0, dn);
      const b = dd === 0 ? div(afterA[0] ?? 0n, den[0]) : div(afterA[dd] ?? 0n, den[dd]);
      if (dd === 0) return { ok: true, branches, termination: { kind, value: toFraction(b) }, residual };
      // b is zero for exact data and rounding-level otherwise: dropped.
      const remainder = trim(afterA.slice(0, dd).map((c, i) => c - mul(b, den[i])));
      ({ num, den } = rescale(den, remainder));
      kind = flip(kind);
    } else if (dn <= 0 && dd === 0) {
      return { ok: true, branches, termination: { kind, value: dn < 0 ? Q0 : toFraction(div(num[0], den[0])) }, residual };
    } else {
      return fail(partElement(kind), NaN, 'the remaining immittance has no pole at infinity');
    }
  }
}
