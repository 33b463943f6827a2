/**
 * Complex floats as plain `{ re, im }` records. Immutable by convention: every function returns a new
 * record. Division and magnitude are the scaled forms, so they neither overflow nor underflow where the
 * result is representable.
 */

export interface Complex {
  readonly re: number;
  readonly im: number;
}

export const complex = (re: number, im = 0): Complex => ({ re, im });
export const ZERO: Complex = Object.freeze({ re: 0, im: 0 });
export const ONE: Complex = Object.freeze({ re: 1, im: 0 });
export const I: Complex = Object.freeze({ re: 0, im: 1 });

export const cAdd = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
export const cSub = (a: Complex, b: Complex): Complex => ({ re: a.re - b.re, im: a.im - b.im });
export const cNeg = (a: Complex): Complex => ({ re: -a.re, im: -a.im });
export const cConj = (a: Complex): Complex => ({ re: a.re, im: -a.im });
export const cScale = (a: Complex, k: number): Complex => ({ re: a.re * k, im: a.im * k });
export const cMul = (a: Complex, b: Complex): Complex => ({
  re: a.re * b.re - a.im * b.im,
  im: a.re * b.im + a.im * b.re,
});

/**
 * a / b by Smith's algorithm (R. L. Smith, "Algorithm 116: Complex division", CACM 5(8), 1962): divides
 * by the larger component of b first so that no intermediate squares |b|. Division by 0 gives
 * Infinity/NaN per IEEE, never a throw.
 */
export function cDiv(a: Complex, b: Complex): Complex {
  if (b.im === 0) return { re: a.re / b.re, im: a.im / b.re };
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re; // |r| <= 1
    const den = b.re + b.im * r;
    return { re: (a.re + a.im * r) / den, im: (a.im - a.re * r) / den };
  }
  const r = b.re / b.im;
  const den = b.re * r + b.im;
  return { re: (a.re * r + a.im) / den, im: (a.im * r - a.re) / den };
}

/** 1 / b, scaled as in {@link cDiv}. */
export const cInv = (b: Complex): Complex => cDiv(ONE, b);

/** |a| without overflow (Math.hypot scales internally). */
export const cAbs = (a: Complex): number => Math.hypot(a.re, a.im);

/** The principal argument in radians, (-pi, pi]. */
export const cArg = (a: Complex): number => Math.atan2(a.im, a.re);

export const cFromPolar = (r: number, theta: number): Complex => ({ re: r * Math.cos(theta), im: r * Math.sin(theta) });

/** Principal square root, stable for either sign of the real part. */
export function cSqrt(a: Complex): Complex {
  if (a.re === 0 && a.im === 0) return ZERO;
  const m = cAbs(a);
  if (a.re >= 0) {
    const t = Math.sqrt((m + a.re) / 2);
    return { re: t, im: a.im / (2 * t) };
  }
  const t = Math.sqrt((m - a.re) / 2);
  return { re: Math.abs(a.im) / (2 * t), im: a.im >= 0 ? t : -t };
}

export const cExp = (a: Complex): Complex => cFromPolar(Math.exp(a.re), a.im);

/** 20*log10|a| in dB, computed from the magnitude so it does not overflow. */
export const cDb = (a: Complex): number => 20 * Math.log10(cAbs(a));

/** True when both parts are finite. */
export const cIsFinite = (a: Complex): boolean => Number.isFinite(a.re) && Number.isFinite(a.im);

/**
 * Smith's division on separate parts, returning [re, im]: for hot loops that keep real and imaginary
 * parts in typed arrays (the AC engine, sensitivities, root polishing). Same algorithm as {@link cDiv}.
 */
export function divideParts(ar: number, ai: number, br: number, bi: number): [number, number] {
  if (Math.abs(br) >= Math.abs(bi)) {
    const t = bi / br;
    const d = br + bi * t;
    return [(ar + ai * t) / d, (ai - ar * t) / d];
  }
  const t = br / bi;
  const d = br * t + bi;
  return [(ar * t + ai) / d, (ai * t - ar) / d];
}

/** (j w)^k as [re, im], exactly: the power of j by k mod 4, so no rounding enters the phase. */
export function jwPower(w: number, k: number): [number, number] {
  const m = w ** k;
  switch (k & 3) {
    case 0:
      return [m, 0];
    case 1:
      return [0, m];
    case 2:
      return [-m, 0];
    default:
      return [0, -m];
  }
}
