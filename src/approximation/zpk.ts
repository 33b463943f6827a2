/**
 * The zeros/poles/gain form every approximation returns, and the few float helpers on it that this stage
 * needs: a canonical root order with exact conjugate pairs, evaluation of H(s), and the frequency at which
 * a monotone lowpass response reaches a given attenuation.
 *
 * H(s) = gain * prod(s - zeros[i]) / prod(s - poles[i])  (the convention of scipy.signal's `zpk`).
 */

import { type Complex, cAbs, cDiv, cMul, cSub } from '../algebra/complex.js';

/** A transfer function in zeros/poles/gain form, roots in rad/s. */
export interface Zpk {
  readonly zeros: readonly Complex[];
  readonly poles: readonly Complex[];
  readonly gain: number;
}

/** Orders roots by imaginary part, then by real part (both ascending). */
export function compareRoots(a: Complex, b: Complex): number {
  return a.im - b.im || a.re - b.re;
}

/**
 * Builds the roots of a real polynomial from its upper-half-plane roots and its real roots: every upper
 * root `u` is paired with `{ re: u.re, im: -u.im }` (bit-exact conjugate), real roots get `im` exactly 0,
 * and the result is sorted by {@link compareRoots}, so the output order is deterministic.
 */
export function conjugateRootSet(upper: readonly Complex[], real: readonly number[] = []): Complex[] {
  const roots: Complex[] = [];
  for (const u of upper) {
    roots.push({ re: u.re, im: u.im }, { re: u.re, im: -u.im });
  }
  for (const r of real) roots.push({ re: r, im: 0 });
  return roots.sort(compareRoots);
}

/** H(s) for a zpk; factors are applied alternately so partial products neither overflow nor underflow. */
export function evaluateZpk(zpk: Zpk, s: Complex): Complex {
  let h: Complex = { re: zpk.gain, im: 0 };
  const n = Math.max(zpk.zeros.length, zpk.poles.length);
  for (let i = 0; i < n; i++) {
    if (i < zpk.zeros.length) h = cMul(h, cSub(s, zpk.zeros[i]));
    if (i < zpk.poles.length) h = cDiv(h, cSub(s, zpk.poles[i]));
  }
  return h;
}

/** 20*log10|H(j*omega)| in dB, as a sum of logarithms (no overflow for any order). */
export function gainDbAt(zpk: Zpk, omegaRadPerS: number): number {
  let db = 20 * Math.log10(Math.abs(zpk.gain));
  for (const z of zpk.zeros) db += 20 * Math.log10(cAbs({ re: -z.re, im: omegaRadPerS - z.im }));
  for (const p of zpk.poles) db -= 20 * Math.log10(cAbs({ re: -p.re, im: omegaRadPerS - p.im }));
  return db;
}

/** Bisection steps allowed while bracketing by doubling/halving: 2^1100 spans every finite double. */
const MAX_BRACKET_STEPS = 1100;

/**
 * The angular frequency at which a lowpass response whose gain falls monotonically with frequency
 * (Butterworth, Bessel) reaches `attenuationDb` below 0 dB. Brackets by doubling from 1 rad/s, then
 * bisects until the bracket is two adjacent doubles, so the answer is as accurate as {@link gainDbAt}.
 * Returns NaN when no bracket is found (a response that is not monotone or never reaches the level).
 */
export function frequencyAtAttenuation(zpk: Zpk, attenuationDb: number): number {
  const above = (w: number): boolean => -gainDbAt(zpk, w) < attenuationDb; // not yet attenuated enough
  let lo = 1;
  let hi = 1;
  if (above(1)) {
    for (let i = 0; above(hi); i++) {
      if (i > MAX_BRACKET_STEPS) return Number.NaN;
      hi *= 2;
    }
    lo = hi / 2;
  } else {
    for (let i = 0; !above(lo); i++) {
      if (i > MAX_BRACKET_STEPS) return Number.NaN;
      lo /= 2;
    }
    hi = lo * 2;
  }
  // Doubling past the largest double gives Infinity (the level is never reached by a finite frequency),
  // halving below the smallest gives 0: no bracket. (An infinite bracket made the bisection loop on NaN forever.)
  if (!(lo > 0 && Number.isFinite(hi))) return Number.NaN;
  for (;;) {
    const mid = lo + (hi - lo) / 2;
    if (!(mid > lo && mid < hi)) break;
    if (above(mid)) lo = mid;
    else hi = mid;
  }
  return lo + (hi - lo) / 2;
}
