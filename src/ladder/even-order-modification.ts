/**
 * The standard modifications of even-order responses whose gain at infinity is not zero (even-order
 * elliptic and inverse Chebyshev), which no ladder of series/shunt L, C, tanks and resonant arms realises.
 * A frequency transformation of the squared magnitude in x = w^2,
 *
 *   X = (a x + c) / (1 + b x),   b = (1 - c) / (wz^2 - 1),   a = wz^2 b,                 (Eq. M1)
 *
 * maps x = 1 to X = 1 (the band edge stays), x = inf to X = wz^2 (the highest transmission zero moves to
 * infinity) and x = 0 to X = c: with c = 0 the DC gain is kept ("type b" in the usual catalogue
 * naming), with c = wr^2, the lowest reflection zero, the DC gain becomes the passband maximum, so equal
 * terminations become possible ("type c"). |H'(jw)|^2 = |H(jW(w))|^2 stays rational: each root X_i of
 * the old numerator or denominator becomes x_i = (X_i - c) / (a - b X_i) (Eq. M2), the factors
 * (1 + b x) cancel because the old numerator and denominator have the same degree. New poles take the
 * left-half-plane root of s^2 = -x_i. R. Saal and E. Ulbrich, "On the design of filters by synthesis",
 * IRE Trans. Circuit Theory CT-5 (1958) 284-327, describe these modified elliptic responses; the form of
 * the map here is this module's own derivation.
 *
 * A kernel: float in, float out (the transformed roots are as accurate as the old ones).
 */
import { type Complex, cDiv, cSqrt } from '../algebra/complex';
import type { PrototypeZpk } from './prototype-polynomials';
import { normalizedMagnitude } from './peak-gain';
import type { LowpassCharacteristic } from '../approximation/index';

export interface ModifiedPrototype {
  readonly zeros: Complex[];
  readonly poles: Complex[];
  readonly gain: number;
}

/**
 * Moves the highest finite transmission zero to infinity and, when `lowestReflectionOmega` > 0, the
 * reflection zero there to DC. The returned gain makes |H'(0)| = |H(j lowestReflectionOmega)|.
 */
export function moveTransmissionZeroToInfinity(zpk: PrototypeZpk, lowestReflectionOmega = 0): ModifiedPrototype {
  const upperZeros = zpk.zeros.filter((z) => z.im > 0);
  const { highest, map } = modificationMap(zpk, lowestReflectionOmega);

  const zeros: Complex[] = [];
  for (const z of upperZeros) {
    if (z.im === highest) continue;
    const x = map({ re: z.im * z.im, im: 0 }).re;
    const w = Math.sqrt(x);
    zeros.push({ re: 0, im: w }, { re: 0, im: -w });
  }
  const poles: Complex[] = [];
  for (const p of zpk.poles) {
    if (p.im < 0) continue;
    const X = { re: -(p.re * p.re - p.im * p.im), im: -2 * p.re * p.im }; // X = -p^2
    const x = map(X);
    let s = cSqrt({ re: -x.re, im: -x.im });
    if (s.re > 0) s = { re: -s.re, im: -s.im };
    if (p.im === 0) poles.push({ re: s.re, im: 0 });
    else {
      const up = { re: s.re, im: Math.abs(s.im) };
      poles.push(up, { re: up.re, im: -up.im });
    }
  }
  zeros.sort((u, v) => u.im - v.im);
  poles.sort((u, v) => u.im - v.im || u.re - v.re);
  // Gain: |H'(0)| = |H(j sqrt(c))|, with H'(0) real and of the sign of H(0).
  const target = Math.abs(zpk.gain * dcProduct(zpk)) * normalizedMagnitude(zpk, { re: 0, im: lowestReflectionOmega });
  const unit = dcProduct({ zeros, poles, gain: 1 });
  const gain = (Math.sign(zpk.gain * dcProduct(zpk)) * target) / unit;
  return { zeros, poles, gain };
}

/** The map of Eq. M2 for a prototype and the reflection zero moved to DC (0: none). */
function modificationMap(zpk: PrototypeZpk, lowestReflectionOmega: number): { highest: number; map: (X: Complex) => Complex } {
  const highest = zpk.zeros.reduce((m, z) => Math.max(m, z.im), 0);
  const wz2 = highest * highest;
  const c = lowestReflectionOmega * lowestReflectionOmega;
  const b = (1 - c) / (wz2 - 1); // Eq. M1
  // a - b X = b (wz^2 - X), formed without cancellation for X near wz^2.
  const map = (X: Complex): Complex => cDiv({ re: X.re - c, im: X.im }, { re: b * (wz2 - X.re), im: -b * X.im }); // Eq. M2
  return { highest, map };
}

/**
 * The reflection zeros of the modified response: the same map (Eq. M2) applied to their squared
 * frequencies; the one moved to DC (`lowestReflectionOmega`, bit-equal to the lowest listed) becomes a
 * double zero at the origin, s^2 in F.
 */
export function moveReflectionZeros(zpk: PrototypeZpk, lowestReflectionOmega: number, characteristic: LowpassCharacteristic): LowpassCharacteristic {
  const { map } = modificationMap(zpk, lowestReflectionOmega);
  let originMultiplicity = characteristic.originMultiplicity;
  const omegas: number[] = [];
  for (const w of characteristic.reflectionOmegasRadPerS) {
    if (lowestReflectionOmega > 0 && w === lowestReflectionOmega) {
      originMultiplicity += 2;
      continue;
    }
    omegas.push(Math.sqrt(map({ re: w * w, im: 0 }).re));
  }
  omegas.sort((u, v) => u - v);
  return { originMultiplicity, reflectionOmegasRadPerS: omegas };
}

/** prod(-z) / prod(-p): H(0) / gain. */
function dcProduct(zpk: PrototypeZpk): number {
  let h = 1;
  const n = Math.max(zpk.zeros.length, zpk.poles.length);
  for (let i = 0; i < n; i++) {
    if (i < zpk.zeros.length) h *= Math.hypot(zpk.zeros[i].re, zpk.zeros[i].im);
    if (i < zpk.poles.length) h /= Math.hypot(zpk.poles[i].re, zpk.poles[i].im);
  }
  return h;
}
