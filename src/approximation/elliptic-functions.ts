/**
 * Elliptic integrals and functions for the elliptic (Cauer) approximation, in Float64.
 *
 * Every function takes the modulus `k` together with its complement `kp = sqrt(1 - k^2)`. Elliptic
 * filters live near both ends (k1 ~ 1e-4 for the ripple/attenuation modulus, k -> 1 for high orders), and
 * forming `1 - k^2` from `k` there loses the digits that matter; callers that know the complement
 * accurately pass it (habit: complement forms for elliptic moduli). Omitted, it is computed as
 * `sqrt((1 - k)(1 + k))`, which is exact to rounding for k near 1.
 *
 * Sources:
 * - [AS] M. Abramowitz, I. A. Stegun, Handbook of Mathematical Functions (1964): 17.6 (AGM for K),
 *   16.4 (AGM / descending Landen for sn, cn, dn), 16.20 (Jacobi's imaginary transformation), 16.38
 *   (nome series for k), 17.3.17 (nome q = exp(-pi K'/K)).
 * - [O] S. J. Orfanidis, "Lecture notes on elliptic filter design" (2006): Eq. (49) degree equation by
 *   nomes, Eq. (56) inverse sn by descending Landen transformations.
 *
 * Kernels: no throws; invalid moduli give NaN per IEEE.
 */

/** Complementary modulus sqrt(1 - k^2) in the product form (exact to rounding near k = 1). */
export function complementaryModulus(k: number): number {
  return Math.sqrt((1 - k) * (1 + k));
}

/**
 * AGM iterations allowed. Convergence is quadratic once a ~ b; from b/a = 1e-300 it takes about
 * log2(690) + 6 ~ 16 steps, so 64 is never reached for finite positive input.
 */
const MAX_AGM_STEPS = 64;

/** Arithmetic-geometric mean of two non-negative numbers [AS 17.6.1]. */
export function arithmeticGeometricMean(a0: number, b0: number): number {
  if (a0 === 0 || b0 === 0) return 0;
  let a = a0;
  let b = b0;
  for (let i = 0; i < MAX_AGM_STEPS && Math.abs(a - b) > 2 * Number.EPSILON * a; i++) {
    const next = (a + b) / 2;
    b = Math.sqrt(a) * Math.sqrt(b); // split sqrt: a*b may underflow for tiny b
    a = next;
  }
  return (a + b) / 2;
}

/** Complete elliptic integral of the first kind K(k) = pi / (2 AGM(1, k')) [AS 17.6.1]. */
export function completeEllipticK(k: number, kp: number = complementaryModulus(k)): number {
  if (!(k >= 0 && k <= 1)) return Number.NaN;
  return Math.PI / (2 * arithmeticGeometricMean(1, kp));
}

/** The three Jacobi elliptic functions of one argument. */
export interface JacobiValues {
  readonly sn: number;
  readonly cn: number;
  readonly dn: number;
}

/**
 * sn, cn, dn(u, k) for real u and 0 <= k <= 1, by the AGM scale with descending Landen back-substitution
 * [AS 16.4.3]. `c` is updated as c_n^2 / (4 a_{n+1}) instead of (a_n - b_n)/2 to avoid cancellation, and
 * dn is taken as sqrt(k'^2 + k^2 cn^2) (no cancellation, dn > 0 on the real axis).
 */
export function jacobiElliptic(u: number, k: number, kp: number = complementaryModulus(k)): JacobiValues {
  if (!(k >= 0 && k <= 1) || !Number.isFinite(u)) return { sn: Number.NaN, cn: Number.NaN, dn: Number.NaN };
  if (k === 0) return { sn: Math.sin(u), cn: Math.cos(u), dn: 1 };
  if (kp === 0) {
    // k = 1: sn = tanh, cn = dn = sech [AS 16.6.1-3]
    const sech = 1 / Math.cosh(u);
    return { sn: Math.tanh(u), cn: sech, dn: sech };
  }
  const a: number[] = [1];
  const c: number[] = [k];
  let b = kp;
  for (let n = 0; n < MAX_AGM_STEPS && c[n] > Number.EPSILON * a[n]; n++) {
    const an = a[n];
    const next = (an + b) / 2;
    b = Math.sqrt(an) * Math.sqrt(b);
    a.push(next);
    c.push((c[n] * c[n]) / (4 * next)); // (a_n - b_n)/2 without cancellation
  }
  const last = a.length - 1;
  let phi = 2 ** last * a[last] * u; // [AS 16.4.3]
  for (let n = last; n >= 1; n--) {
    phi = (phi + Math.asin((c[n] / a[n]) * Math.sin(phi))) / 2;
  }
  const sn = Math.sin(phi);
  const cn = Math.cos(phi);
  return { sn, cn, dn: Math.sqrt(kp * kp + k * k * cn * cn) };
}

/** Landen steps allowed: k_{n+1} ~ k_n^2 / 4 reaches 0 (underflow) in under 20 steps from k < 1. */
const MAX_LANDEN_STEPS = 64;

/**
 * The real u with sc(u, k) = w, for w >= 0 (sc = sn/cn). Uses Jacobi's imaginary transformation
 * sc(u, k) = -i sn(iu, k') [AS 16.20.3] and the descending Landen inverse of sn [O, Eq. (56)] on the
 * complementary modulus k' — which stays real for imaginary argument:
 *   y_{n+1} = 2 y_n / ((1 + k'_{n+1}) (1 + sqrt(1 + k'_n^2 y_n^2))),  u = K(k') (2/pi) asinh(y_inf).
 * The elliptic design calls it with k close to 1, where this form keeps full accuracy. The Landen step
 * k_{n+1} = (1 - k_n')/(1 + k_n') is computed as k_n^2 / (1 + k_n')^2 (no cancellation).
 */
export function inverseJacobiSc(w: number, k: number, kp: number = complementaryModulus(k)): number {
  let m = kp; // the Landen sequence runs on the complementary modulus
  let mc = k;
  let y = w;
  let scale = Math.PI / 2; // becomes K(k') = prod(1 + k'_n) * pi/2
  for (let i = 0; i < MAX_LANDEN_STEPS && m > 0; i++) {
    const next = (m * m) / ((1 + mc) * (1 + mc));
    y = (2 * y) / ((1 + next) * (1 + Math.sqrt(1 + m * m * y * y)));
    scale *= 1 + next;
    m = next;
    mc = complementaryModulus(next);
  }
  return scale * (2 / Math.PI) * Math.asinh(y);
}

/** A modulus with its complement. */
export interface ModulusPair {
  readonly k: number;
  readonly kp: number;
}

/** Terms of the theta series kept: with q <= exp(-pi) ~ 0.0432, q^(7*8) < 1e-76 is far below rounding. */
const THETA_TERMS = 7;

/** k from the nome, k = theta2^2/theta3^2 [AS 16.38.5, 16.38.7], for q <= exp(-pi). */
function modulusFromSmallNome(q: number): number {
  let num = 0; // sum_{n>=0} q^(n(n+1)); theta2 = 2 q^(1/4) num
  let den = 0; // sum_{n>=1} q^(n^2); theta3 = 1 + 2 den
  for (let n = THETA_TERMS; n >= 0; n--) num += q ** (n * (n + 1)); // small terms first
  for (let n = THETA_TERMS + 1; n >= 1; n--) den += q ** (n * n);
  const ratio = num / (1 + 2 * den);
  return 4 * Math.sqrt(q) * ratio * ratio;
}

/**
 * The modulus pair whose period ratio K'(k)/K(k) equals `tau` > 0. The nome q = exp(-pi tau) [AS 17.3.17]
 * goes into the theta series when tau >= 1 (q <= exp(-pi)); otherwise the complementary nome
 * q' = exp(-pi / tau) gives k' first, so the small one of k, k' is always the accurately computed one.
 */
export function modulusFromPeriodRatio(tau: number): ModulusPair {
  if (!(tau > 0)) return { k: Number.NaN, kp: Number.NaN };
  if (tau >= 1) {
    const k = modulusFromSmallNome(Math.exp(-Math.PI * tau));
    return { k, kp: complementaryModulus(k) };
  }
  const kp = modulusFromSmallNome(Math.exp(-Math.PI / tau));
  return { k: complementaryModulus(kp), kp };
}

/** K'(k)/K(k) = AGM(1, k') / AGM(1, k). */
export function periodRatio(k: number, kp: number = complementaryModulus(k)): number {
  return arithmeticGeometricMean(1, kp) / arithmeticGeometricMean(1, k);
}

/**
 * Solves the degree equation N K'(k)/K(k) = K'(k1)/K(k1) for the selectivity modulus k given the
 * discrimination modulus k1 [O, Eq. (49)], through nomes: q = q1^(1/N).
 */
export function ellipticDegree(order: number, k1: number, k1p: number = complementaryModulus(k1)): ModulusPair {
  return modulusFromPeriodRatio(periodRatio(k1, k1p) / order);
}

/** The inverse: the discrimination modulus k1 an order-N elliptic filter of selectivity modulus k reaches. */
export function ellipticDiscrimination(order: number, k: number, kp: number = complementaryModulus(k)): ModulusPair {
  return modulusFromPeriodRatio(order * periodRatio(k, kp));
}
