/**
 * Polynomial roots in floating point: the Aberth-Ehrlich simultaneous iteration (O. Aberth, "Iteration
 * methods for finding all zeros of a polynomial simultaneously", Math. Comp. 27(122), 1973, eq. (3);
 * L. W. Ehrlich, CACM 10(2), 1967), started on a circle from the Cauchy-type bound, followed by Newton
 * polishing on the original coefficients. For real coefficients the result is made exactly
 * conjugate-symmetric (pairs share the real part and have negated imaginary parts, bit for bit) and
 * real roots exactly real. Sorted deterministically (see {@link compareRoots}).
 *
 * A kernel: it never throws. Leading zeros are ignored; an empty or constant input has no roots; NaN
 * coefficients give NaN roots.
 */
import { divideParts as divide, type Complex } from './complex';
import { Poly } from './poly';
import { evaluateAccurately } from './compensated-horner';

/** Iteration cap. Aberth converges cubically once separated; 500 sweeps cover clustered starts of degree <= 60. */
const MAX_SWEEPS = 500;
/** Newton polishing steps after convergence; each at least doubles the correct digits of a simple root. */
const POLISH_STEPS = 4;
/** Relative size of the nudge that separates two colliding iterates. */
const NUDGE = 1e-8;

/**
 * The roots as the iteration leaves them, polished, in no particular order and without the conjugate
 * clean-up: for callers that pair roots themselves (the ladder's Feldtkeller factorisation). Roots at the
 * origin come out exactly.
 */
export function aberthRoots(p: readonly number[] | Poly, options: { polish?: boolean } = {}): Complex[] {
  const asc = p instanceof Poly ? p.toFloatCoefficients() : trimmed(p);
  if (asc.some((c) => Number.isNaN(c))) return new Array(Math.max(asc.length - 1, 0)).fill({ re: NaN, im: NaN });
  let zerosAtOrigin = 0;
  while (zerosAtOrigin < asc.length - 1 && asc[zerosAtOrigin] === 0) zerosAtOrigin++;
  const a = asc.slice(zerosAtOrigin);
  const out: Complex[] = new Array(zerosAtOrigin).fill(null).map(() => ({ re: 0, im: 0 }));
  if (a.length < 2) return out;
  if (a.length === 2) return [...out, { re: -a[0] / a[1], im: 0 }];
  const found = aberth(a);
  // Callers that refine in extended precision themselves (near-double roots converge linearly there,
  // and a float Newton step can pull a split pair off its midpoint) ask for the raw iterates.
  if (options.polish !== false) polish(a, found);
  return [...out, ...found];
}

/** Roots of a polynomial given by ascending float coefficients, or of a Poly (converted with correct rounding). */
export function polynomialRoots(p: readonly number[] | Poly): Complex[] {
  const asc = p instanceof Poly ? p.toFloatCoefficients() : trimmed(p);
  let zerosAtOrigin = 0;
  while (zerosAtOrigin < asc.length - 1 && asc[zerosAtOrigin] === 0) zerosAtOrigin++;
  if (asc.length - zerosAtOrigin === 3 && !asc.some((c) => Number.isNaN(c))) {
    // Quadratic: the cancellation-free closed form beats iteration.
    const [c, b, a] = asc.slice(zerosAtOrigin);
    return sortRoots([...new Array(zerosAtOrigin).fill(null).map(() => ({ re: 0, im: 0 })), ...quadraticRoots(a, b, c)]);
  }
  return sortRoots(enforceConjugateSymmetry(aberthRoots(asc)));
}

function trimmed(asc: readonly number[]): number[] {
  let n = asc.length;
  while (n > 0 && asc[n - 1] === 0) n--;
  return asc.slice(0, n);
}

/** Roots of a x^2 + b x + c with the cancellation-free form (the larger root first, then c/(a r)). */
export function quadraticRoots(a: number, b: number, c: number): Complex[] {
  const disc = b * b - 4 * a * c;
  if (disc >= 0) {
    const sq = Math.sqrt(disc);
    const qv = -0.5 * (b + (b >= 0 ? sq : -sq));
    if (qv === 0) return [{ re: 0, im: 0 }, { re: 0, im: 0 }];
    return [{ re: qv / a, im: 0 }, { re: c / qv, im: 0 }];
  }
  const re = -b / (2 * a);
  const im = Math.sqrt(-disc) / (2 * Math.abs(a));
  return [{ re, im: -im }, { re, im }];
}

/** p(z) and p'(z) by Horner, as [pr, pi, dr, di]. */
function evalWithDerivative(a: readonly number[], zr: number, zi: number, out: Float64Array): void {
  let pr = 0, pi = 0, dr = 0, di = 0;
  for (let k = a.length - 1; k >= 0; k--) {
    const ndr = dr * zr - di * zi + pr;
    di = dr * zi + di * zr + pi;
    dr = ndr;
    const npr = pr * zr - pi * zi + a[k];
    pi = pr * zi + pi * zr;
    pr = npr;
  }
  out[0] = pr; out[1] = pi; out[2] = dr; out[3] = di;
}

function aberth(a: readonly number[]): Complex[] {
  const n = a.length - 1;
  // Start radius: geometric mean of the root moduli |a0/an|^(1/n), bounded by the Fujiwara bound.
  let fujiwara = 0;
  for (let k = 1; k <= n; k++) fujiwara = Math.max(fujiwara, Math.pow(Math.abs(a[n - k] / a[n]), 1 / k));
  fujiwara *= 2;
  let radius = Math.pow(Math.abs(a[0] / a[n]), 1 / n);
  if (!(radius > 0) || !Number.isFinite(radius)) radius = 1;
  radius = Math.min(radius, fujiwara);
  const zr = new Float64Array(n);
  const zi = new Float64Array(n);
  // Offset angle avoids starting on the real axis (symmetric starts stall on real polynomials).
  for (let k = 0; k < n; k++) {
    const theta = (2 * Math.PI * k) / n + 0.4;
    zr[k] = radius * Math.cos(theta);
    zi[k] = radius * Math.sin(theta);
  }
  const done = new Uint8Array(n);
  const buf = new Float64Array(4);
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    let active = 0;
    for (let k = 0; k < n; k++) {
      if (done[k]) continue;
      active++;
      evalWithDerivative(a, zr[k], zi[k], buf);
      const [pr, pi, dr, di] = buf;
      if (pr === 0 && pi === 0) { done[k] = 1; continue; }
      // Newton ratio w = p/p'
      const [wr, wi] = divide(pr, pi, dr, di);
      // sum 1/(z_k - z_j)
      let sr = 0, si = 0;
      for (let j = 0; j < n; j++) {
        if (j === k) continue;
        const [ir, ii] = divide(1, 0, zr[k] - zr[j], zi[k] - zi[j]);
        sr += ir; si += ii;
      }
      // Eq. (3): z_k <- z_k - w / (1 - w * S)
      const denr = 1 - (wr * sr - wi * si);
      const deni = -(wr * si + wi * sr);
      const [cr, ci] = divide(wr, wi, denr, deni);
      if (!Number.isFinite(cr) || !Number.isFinite(ci)) {
        // Two iterates met or p' vanished: nudge this one off the collision (deterministically).
        zr[k] += NUDGE * radius;
        zi[k] += NUDGE * radius;
        continue;
      }
      zr[k] -= cr;
      zi[k] -= ci;
      if (Math.hypot(cr, ci) <= 4 * Number.EPSILON * Math.hypot(zr[k], zi[k])) done[k] = 1;
    }
    if (active === 0) break;
  }
  const out: Complex[] = [];
  for (let k = 0; k < n; k++) out.push({ re: zr[k], im: zi[k] });
  return out;
}

/**
 * Newton steps on each root with the residual from compensated Horner ({@link evaluateAccurately}; the
 * derivative needs no extra precision), keeping the last iterate whose residual did not grow.
 */
function polish(a: readonly number[], z: Complex[]): void {
  for (let k = 0; k < z.length; k++) z[k] = polishRoot(a, z[k]);
}

/** One root polished by Newton's method on ascending coefficients `a` (see {@link polish}). */
export function polishRoot(a: readonly number[], start: Complex): Complex {
  const buf = new Float64Array(4);
  let best = start;
  let p = evaluateAccurately(a, start);
  let bestResidual = Math.hypot(p.re, p.im);
  let z = start;
  for (let step = 0; step < POLISH_STEPS && bestResidual > 0; step++) {
    evalWithDerivative(a, z.re, z.im, buf);
    const [cr, ci] = divide(p.re, p.im, buf[2], buf[3]);
    if (!Number.isFinite(cr) || !Number.isFinite(ci)) break;
    z = { re: z.re - cr, im: z.im - ci };
    p = evaluateAccurately(a, z);
    const residual = Math.hypot(p.re, p.im);
    if (!(residual < bestResidual)) break;
    best = z;
    bestResidual = residual;
  }
  return best;
}


/**
 * Makes a root set of a real polynomial exactly conjugate-symmetric: roots whose imaginary part is
 * within a small multiple of their modulus' rounding error become real; the rest are paired greedily
 * with their nearest mirror image and given a common real part and opposite imaginary parts.
 */
/** Relative size of an imaginary part below which a root counts as real (clusters of multiplicity m have errors ~ eps^(1/m)). */
const REAL_ROOT_TOLERANCE = 1e-7;

export function enforceConjugateSymmetry(roots: readonly Complex[]): Complex[] {
  const out: Complex[] = [];
  const upper: Complex[] = [];
  const lower: Complex[] = [];
  for (const z of roots) {
    const scale = Math.max(Math.hypot(z.re, z.im), Number.MIN_VALUE);
    if (Math.abs(z.im) <= REAL_ROOT_TOLERANCE * scale) out.push({ re: z.re, im: 0 });
    else if (z.im > 0) upper.push(z);
    else lower.push(z);
  }
  // Unequal halves: move the smallest-|im| extras to the real axis.
  const byIm = (x: Complex, y: Complex) => Math.abs(x.im) - Math.abs(y.im);
  upper.sort(byIm);
  lower.sort(byIm);
  while (upper.length > lower.length) out.push({ re: upper.shift()!.re, im: 0 });
  while (lower.length > upper.length) out.push({ re: lower.shift()!.re, im: 0 });
  const used = new Uint8Array(lower.length);
  for (const u of upper) {
    let best = -1;
    let bestDist = Infinity;
    for (let j = 0; j < lower.length; j++) {
      if (used[j]) continue;
      const d = Math.hypot(u.re - lower[j].re, u.im + lower[j].im);
      if (d < bestDist) { bestDist = d; best = j; }
    }
    used[best] = 1;
    const l = lower[best];
    const re = (u.re + l.re) / 2;
    const im = (u.im - l.im) / 2;
    out.push({ re, im }, { re, im: -im });
  }
  return out;
}

/**
 * Deterministic root order: by real part ascending, then by |imaginary part| ascending, and within a
 * conjugate pair the negative imaginary part first. Exactly equal keys keep input order.
 */
export function compareRoots(x: Complex, y: Complex): number {
  if (x.re !== y.re) return x.re - y.re;
  const ax = Math.abs(x.im);
  const ay = Math.abs(y.im);
  if (ax !== ay) return ax - ay;
  return x.im - y.im;
}

export function sortRoots(roots: Complex[]): Complex[] {
  return roots.slice().sort(compareRoots);
}
