/**
 * Newton polishing of polynomial roots in BigInt fixed point, for the reflection zeros of the Darlington
 * synthesis. The polynomials are exact (rational coefficients); the float roots from the Aberth iteration
 * are correct to about cond * 2^-53, which at order 15 leaves too few digits for the element values.
 * Newton's method on the exact coefficients in {@link FIXED_POINT_BITS}-bit fixed point doubles the
 * correct digits per step, so {@link NEWTON_STEPS} steps from a float start reach the working precision.
 *
 * A kernel: no throws. A root whose derivative vanishes in working precision is returned unpolished.
 */
import { Fraction } from '../algebra/rational';
import type { Poly } from '../algebra/poly';

/**
 * Fractional bits of the fixed-point numbers: 2^-256 ~ 9e-78 absolute. The root error is this divided by
 * |p'(root)|, which at the clustered high-Q poles of order-15 elliptic responses is ~1e-16: 2^-160 left
 * the poles good to ~1e-30 only and the extraction reported remainders of 1e-21 (measured).
 */
export const FIXED_POINT_BITS = 256;
/** Newton steps from a float start (~2^-40 after clustering effects): 40 -> 80 -> 160 -> 320 bits, plus margin. */
const NEWTON_STEPS = 6;

const P = BigInt(FIXED_POINT_BITS);
const ONE = 1n << P;

/** A Fraction in fixed point, truncated toward zero. */
export function fractionToFixed(f: Fraction): bigint {
  return (f.s * f.n * ONE) / f.d;
}

/** A double in fixed point, exactly when it has no bits below 2^-FIXED_POINT_BITS (every double of moderate size). */
function doubleToFixed(x: number): bigint {
  if (x === 0) return 0n;
  const e = Math.floor(Math.log2(Math.abs(x)));
  const scaled = Math.round(x * 2 ** (52 - e)); // 53 significant bits, exact
  const shift = FIXED_POINT_BITS - 52 + e;
  return shift >= 0 ? BigInt(scaled) << BigInt(shift) : BigInt(scaled) >> BigInt(-shift);
}

/** A fixed-point number as an exact dyadic Fraction. */
export function fixedToFraction(x: bigint): Fraction {
  return new Fraction(x, ONE);
}

const mulFixed = (a: bigint, b: bigint): bigint => (a * b) >> P;
const divFixed = (a: bigint, b: bigint): bigint => (a << P) / b;

/** The fixed-point coefficients of an exact polynomial, ascending. */
export function toFixedCoefficients(p: Poly): bigint[] {
  return p.coefficients.map(fractionToFixed);
}

/** p(x) and p'(x) at real fixed-point x by Horner's rule. */
function hornerReal(c: readonly bigint[], x: bigint): { p: bigint; dp: bigint } {
  let p = 0n;
  let dp = 0n;
  for (let i = c.length - 1; i >= 0; i--) {
    dp = mulFixed(dp, x) + p;
    p = mulFixed(p, x) + c[i];
  }
  return { p, dp };
}

/** p(x) at real fixed-point x. */
export function hornerFixed(c: readonly bigint[], x: bigint): bigint {
  return hornerReal(c, x).p;
}

/** Polishes a real root of the polynomial with fixed-point coefficients `c`; returns it in fixed point. */
export function polishRealRoot(c: readonly bigint[], start: number | bigint): bigint {
  let x = typeof start === 'bigint' ? start : doubleToFixed(start);
  for (let i = 0; i < NEWTON_STEPS; i++) {
    const { p, dp } = hornerReal(c, x);
    if (dp === 0n || p === 0n) break;
    const step = divFixed(p, dp);
    x -= step;
    if (absBig(step) <= CONVERGED) break;
  }
  return x;
}

interface FixedComplex {
  re: bigint;
  im: bigint;
}

/** Polishes a complex root of the real polynomial with fixed-point coefficients `c`. */
export function polishComplexRoot(c: readonly bigint[], start: { re: number; im: number }): FixedComplex {
  let z: FixedComplex = { re: doubleToFixed(start.re), im: doubleToFixed(start.im) };
  for (let i = 0; i < NEWTON_STEPS; i++) {
    let pr = 0n;
    let pi = 0n;
    let dr = 0n;
    let di = 0n;
    for (let k = c.length - 1; k >= 0; k--) {
      // dp = dp * z + p; p = p * z + c_k
      const ndr = mulFixed(dr, z.re) - mulFixed(di, z.im) + pr;
      const ndi = mulFixed(dr, z.im) + mulFixed(di, z.re) + pi;
      dr = ndr;
      di = ndi;
      const npr = mulFixed(pr, z.re) - mulFixed(pi, z.im) + c[k];
      const npi = mulFixed(pr, z.im) + mulFixed(pi, z.re);
      pr = npr;
      pi = npi;
    }
    if (pr === 0n && pi === 0n) break;
    const q = cDivFixed({ re: pr, im: pi }, { re: dr, im: di });
    if (!q) break;
    z = { re: z.re - q.re, im: z.im - q.im };
  }
  return z;
}

/** Aberth sweeps in fixed point: cubic convergence from float starts needs few; clusters need more. */
const MAX_FIXED_SWEEPS = 60;
/** A step below 2^-(FIXED_POINT_BITS - 24) counts as converged (24 guard bits for rounding). */
const CONVERGED = 1n << 24n;

function cMulFixed(a: FixedComplex, b: FixedComplex): FixedComplex {
  return { re: mulFixed(a.re, b.re) - mulFixed(a.im, b.im), im: mulFixed(a.re, b.im) + mulFixed(a.im, b.re) };
}

/**
 * a / b = a conj(b) / |b|^2 with the products kept at full width (2 * FIXED_POINT_BITS fractional bits)
 * and one rounding at the end. Truncating a conj(b) and |b|^2 to fixed point first lost every digit
 * when |b| is small: Newton steps at the clustered high-Q poles of order-15 elliptic responses have
 * |p'| ~ 1e-16 and |p| ~ 1e-33, whose product is below the 2^-160 then used (measured: the polish stalled at 1e-17).
 */
function cDivFixed(a: FixedComplex, b: FixedComplex): FixedComplex | null {
  const den = b.re * b.re + b.im * b.im;
  if (den === 0n) return null;
  return { re: ((a.re * b.re + a.im * b.im) << P) / den, im: ((a.im * b.re - a.re * b.im) << P) / den };
}

const absBig = (x: bigint): bigint => (x < 0n ? -x : x);

/**
 * All roots of the polynomial with fixed-point coefficients `c` (ascending, real), by the Aberth-Ehrlich
 * iteration in fixed point from float starting values (one per root). Unlike Newton on each root, the
 * simultaneous iteration separates the two members of a split double root, which float cannot resolve.
 */
export function polishAllRoots(c: readonly bigint[], starts: readonly { re: number; im: number }[]): FixedComplex[] {
  const z: FixedComplex[] = starts.map((s) => ({ re: doubleToFixed(s.re), im: doubleToFixed(s.im) }));
  const n = z.length;
  for (let sweep = 0; sweep < MAX_FIXED_SWEEPS; sweep++) {
    let moving = false;
    for (let i = 0; i < n; i++) {
      let p: FixedComplex = { re: 0n, im: 0n };
      let dp: FixedComplex = { re: 0n, im: 0n };
      for (let k = c.length - 1; k >= 0; k--) {
        const t = cMulFixed(dp, z[i]);
        dp = { re: t.re + p.re, im: t.im + p.im };
        const u = cMulFixed(p, z[i]);
        p = { re: u.re + c[k], im: u.im };
      }
      if (p.re === 0n && p.im === 0n) continue;
      const ratio = cDivFixed(p, dp);
      if (!ratio) continue;
      let sum: FixedComplex = { re: 0n, im: 0n };
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const inv = cDivFixed({ re: ONE, im: 0n }, { re: z[i].re - z[j].re, im: z[i].im - z[j].im });
        if (inv) sum = { re: sum.re + inv.re, im: sum.im + inv.im };
      }
      const rs = cMulFixed(ratio, sum);
      const step = cDivFixed(ratio, { re: ONE - rs.re, im: -rs.im });
      if (!step) continue;
      z[i] = { re: z[i].re - step.re, im: z[i].im - step.im };
      if (absBig(step.re) + absBig(step.im) > CONVERGED) moving = true;
    }
    if (!moving) break;
  }
  return z;
}

/** A fixed-point number as a double (for classification; not for values that must stay precise). */
export function fixedToNumber(x: bigint): number {
  const neg = x < 0n;
  const a = neg ? -x : x;
  const bits = a.toString(2).length;
  const shift = Math.max(0, bits - 60);
  const v = Number(a >> BigInt(shift)) * 2 ** (shift - FIXED_POINT_BITS);
  return neg ? -v : v;
}
