/** Shared checks for the ladder tests: the exact chain-matrix response against the prototype. */
import { ladderTransferFunction } from '../../src/ladder/response';
import type { LadderSynthesis } from '../../src/ladder/darlington';
import { normalizedMagnitude } from '../../src/ladder/peak-gain';
import { Fraction, fractionFromDouble, fractionToNumber } from '../../src/algebra/rational';
import type { RationalFunction } from '../../src/algebra/rational-function';
import type { PrototypeZpk } from '../../src/ladder/prototype-polynomials';

/** 200 log-spaced frequencies from 0.01 to 100 rad/s. */
export const FREQUENCIES = Array.from({ length: 200 }, (_, i) => 10 ** (-2 + (4 * i) / 199));

/** Fractional bits of the fixed-point evaluation below: 2^-256 absolute, far below any double. */
const EVAL_BITS = 256n;

const ONE = 1n << EVAL_BITS;
const toFixed = (f: Fraction): bigint => (f.s * f.n * ONE) / f.d;
/** A fixed-point number as the double nearest to it within 2^-60 relative (no gcd of a Fraction). */
function fixedToNumber(x: bigint): number {
  const a = x < 0n ? -x : x;
  const shift = Math.max(0, a.toString(16).length * 4 - 64);
  const v = Number(a >> BigInt(shift)) * 2 ** (shift - Number(EVAL_BITS));
  return x < 0n ? -v : v;
}

/** p(jw) in fixed point from the fixed-point coefficients: Horner on the even and odd parts in -w^2. */
function fixedAtJOmega(c: readonly bigint[], w: number): { re: number; im: number } {
  const w2 = toFixed(fractionFromDouble(w).mul(fractionFromDouble(w)).neg());
  let even = 0n;
  let odd = 0n;
  for (let i = c.length - 1; i >= 0; i--) {
    if (i % 2 === 0) even = ((even * w2) >> EVAL_BITS) + c[i];
    else odd = ((odd * w2) >> EVAL_BITS) + c[i];
  }
  return { re: fixedToNumber(even), im: w * fixedToNumber(odd) };
}

/**
 * |T(jw)| at each w of an exact rational function, evaluated from its exact coefficients in 256-bit
 * fixed point and rounded once: float Horner on the expanded coefficients of an order-15 ladder loses
 * up to 1e-8 in the passband (measured), which would hide the synthesis error this check is for.
 */
export function exactMagnitudes(T: RationalFunction, omegas: readonly number[]): number[] {
  const num = T.num.coefficients.map(toFixed);
  const den = T.den.coefficients.map(toFixed);
  return omegas.map((w) => {
    const n = fixedAtJOmega(num, w);
    const d = fixedAtJOmega(den, w);
    return Math.hypot(n.re, n.im) / Math.hypot(d.re, d.im);
  });
}

/**
 * Largest |T(jw)| - T0 |H(jw)|/|H(0)| over FREQUENCIES, relative to T0 (the passband level), where T is
 * the ladder's exact transfer function (evaluated exactly, {@link exactMagnitudes}) and H the prototype in
 * product form (the realised one unless `prototype` is given).
 */
export function responseError(s: LadderSynthesis, prototype: PrototypeZpk = s.realizedPrototype): number {
  const magnitudes = exactMagnitudes(ladderTransferFunction(s.ladder), FREQUENCIES);
  let worst = 0;
  for (const [i, w] of FREQUENCIES.entries()) {
    const got = magnitudes[i];
    const want = s.dcTransfer * normalizedMagnitude(prototype, { re: 0, im: w });
    worst = Math.max(worst, Math.abs(got - want) / s.dcTransfer);
  }
  return worst;
}

/** All element values of a ladder in order (L then C within a branch), with the load when resistive. */
export function elementValues(s: LadderSynthesis): number[] {
  const out: number[] = [];
  for (const b of s.ladder.branches) {
    if (b.inductanceH !== undefined) out.push(b.inductanceH);
    if (b.capacitanceF !== undefined) out.push(b.capacitanceF);
  }
  return out;
}
