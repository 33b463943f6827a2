/** Shared checks for the ladder tests: the exact chain-matrix response against the prototype. */
import { ladderTransferFunction } from '../../src/ladder/response';
import type { LadderSynthesis } from '../../src/ladder/darlington';
import { normalizedMagnitude } from '../../src/ladder/peak-gain';
import { Fraction, fractionFromDouble, fractionToNumber } from '../../src/algebra/rational';
import type { Poly } from '../../src/algebra/poly';
import type { RationalFunction } from '../../src/algebra/rational-function';
import type { PrototypeZpk } from '../../src/ladder/prototype-polynomials';

/** 200 log-spaced frequencies from 0.01 to 100 rad/s. */
export const FREQUENCIES = Array.from({ length: 200 }, (_, i) => 10 ** (-2 + (4 * i) / 199));

/** Fractional bits of the fixed-point evaluation below: 2^-256 absolute, far below any double. */
const EVAL_BITS = 256n;

/** p(jw) in fixed point from exact coefficients: Horner on the even and odd parts in -w^2. */
function fixedAtJOmega(p: Poly, w: number): { re: number; im: number } {
  const one = 1n << EVAL_BITS;
  const toFixed = (f: Fraction): bigint => (f.s * f.n * one) / f.d;
  const w2 = toFixed(fractionFromDouble(w).mul(fractionFromDouble(w)).neg());
  let even = 0n;
  let odd = 0n;
  for (let i = p.degree; i >= 0; i--) {
    if (i % 2 === 0) even = ((even * w2) >> EVAL_BITS) + toFixed(p.coefficient(i));
    else odd = ((odd * w2) >> EVAL_BITS) + toFixed(p.coefficient(i));
  }
  const toNumber = (x: bigint): number => fractionToNumber(new Fraction(x, one));
  return { re: toNumber(even), im: w * toNumber(odd) };
}

/**
 * |T(jw)| of an exact rational function, evaluated from its exact coefficients in 256-bit fixed point
 * and rounded once: float Horner on the expanded coefficients of an order-15 ladder loses up to 1e-8 in
 * the passband (measured), which would hide the synthesis error this check is for.
 */
export function exactMagnitude(T: RationalFunction, w: number): number {
  const n = fixedAtJOmega(T.num, w);
  const d = fixedAtJOmega(T.den, w);
  return Math.hypot(n.re, n.im) / Math.hypot(d.re, d.im);
}

/**
 * Largest |T(jw)| - T0 |H(jw)|/|H(0)| over FREQUENCIES, relative to T0 (the passband level), where T is
 * the ladder's exact transfer function (evaluated exactly, {@link exactMagnitude}) and H the prototype in
 * product form (the realised one unless `prototype` is given).
 */
export function responseError(s: LadderSynthesis, prototype: PrototypeZpk = s.realizedPrototype): number {
  const T = ladderTransferFunction(s.ladder);
  let worst = 0;
  for (const w of FREQUENCIES) {
    const got = exactMagnitude(T, w);
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
