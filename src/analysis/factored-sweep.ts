/**
 * The sweep of a factored H(j w): gain (dB), unwrapped phase (degrees) and group delay (s) at many
 * frequencies, the hot loop behind FloatTransferFunction.sweep (factored-response.ts).
 *
 * H = g * prod(real numerator factors) * prod(complex numerator factors) / prod(denominator factors),
 * each factor c0 - c2 w^2 + j c1 w. Per point: N and D as complex products, |H|^2 = |N|^2/|D|^2 (one
 * logarithm), and the phase by steps: the angle from the previous point's H to this one's is the
 * principal argument of P_k conj(P_k-1), with P = N conj(D) (arg P = arg H); for the small steps of a
 * dense sweep (|tan| < 1/16) it is the odd Taylor series of atan to t^13 (truncation below 1e-18
 * relative), else Math.atan2. Summing the steps unwraps the phase with no 2 pi bookkeeping; each step
 * carries a few ulps of 1 rad, so N points drift by at most about N * 4e-16 rad (4e-12 rad, 2e-10
 * degree, for 10,000 points). The first point is arg H in (-180, 180]. Where H = 0 exactly the phase
 * holds its previous value; where H is not finite (a pole on the j w axis) the phase is NaN there
 * and the steps resume from the last finite point. Like any unwrapping, a grid too coarse for the
 * phase (a step of 180 degrees or more between neighbours) loses whole turns.
 *
 * Range: |N|^2 and |D|^2 are formed, so the gain needs |N| and |D| below 1e154 (the unit-scaled
 * factors of factored-response.ts keep them there for any realistic degree and band); the phase step
 * falls back to the difference of principal values where P_k conj(P_k-1) over- or underflows.
 *
 * Two kernels with the same operations in the same order (so the same results bit for bit): a
 * straight-line one generated per transfer function with the coefficients as literals (the loop
 * control and coefficient loads are most of the time for ten-odd factors), compiled with
 * `new Function` and cached by its text (lu-codegen.ts), and an interpreted one over coefficient
 * arrays where code generation is unavailable.
 */
import { cachedFunction, numberLiteral } from './lu-codegen';

/** The factors of H as flat arrays: see the module comment. */
export interface SweepFactors {
  readonly gain: number;
  /** [c0, c2] pairs: numerator factors c0 - c2 w^2, real at s = j w (zeros on the j w axis). */
  readonly realNumerator: Float64Array;
  /** [c0, c1, c2] triples. */
  readonly complexNumerator: Float64Array;
  /** [c0, c1, c2] triples. */
  readonly denominator: Float64Array;
}

/** Fills gainDb, phaseDeg and (unless null) groupDelayS at the frequencies (Hz). */
export type SweepKernel = (frequencyHz: Float64Array, gainDb: Float64Array, phaseDeg: Float64Array, groupDelayS: Float64Array | null) => void;

/** The generated kernel, or the interpreted one where `new Function` is unavailable. */
export function sweepKernelFor(f: SweepFactors): SweepKernel {
  try {
    const k = cachedFunction(['frequencyHz', 'gainDb', 'phaseDeg', 'groupDelayS'], generatedSource(f)) as SweepKernel;
    return k;
  } catch {
    return interpretedSweepKernel(f);
  }
}

const TWO_PI = 2 * Math.PI;
const DEG_PER_RAD = 180 / Math.PI;
/** 10 / ln 10: dB of a power ratio from its natural logarithm. */
const DB_PER_NEPER_POWER = 10 / Math.LN10;
/** Below this |tan| of a phase step the series is used (|t|^15/15 < 6e-20). */
const SERIES_LIMIT = 1 / 16;
const A3 = 1 / 3;
const A5 = 1 / 5;
const A7 = 1 / 7;
const A9 = 1 / 9;
const A11 = 1 / 11;
const A13 = 1 / 13;

/** The loop over coefficient arrays (also the reference the generated kernel is tested against). */
export function interpretedSweepKernel(f: SweepFactors): SweepKernel {
  const g = f.gain;
  const rn = f.realNumerator;
  const cn = f.complexNumerator;
  const dn = f.denominator;
  return (frequencyHz, gainDb, phaseDeg, groupDelayS) => {
    const m = frequencyHz.length;
    let phase = 0;
    let qr = 0;
    let qi = 0;
    let have = false;
    for (let p = 0; p < m; p++) {
      const w = TWO_PI * frequencyHz[p];
      const w2 = w * w;
      let nr = g;
      let ni = 0;
      let dr = 1;
      let di = 0;
      let x = 0;
      let y = 0;
      let t = 0;
      for (let o = 0; o < rn.length; o += 2) {
        x = rn[o] - rn[o + 1] * w2;
        nr *= x;
        ni *= x;
      }
      for (let o = 0; o < cn.length; o += 3) {
        x = cn[o] - cn[o + 2] * w2;
        y = cn[o + 1] * w;
        t = nr * x - ni * y;
        ni = nr * y + ni * x;
        nr = t;
      }
      for (let o = 0; o < dn.length; o += 3) {
        x = dn[o] - dn[o + 2] * w2;
        y = dn[o + 1] * w;
        t = dr * x - di * y;
        di = dr * y + di * x;
        dr = t;
      }
      const pr = nr * dr + ni * di;
      const pi = ni * dr - nr * di;
      const n2 = nr * nr + ni * ni;
      const d2 = dr * dr + di * di;
      gainDb[p] = DB_PER_NEPER_POWER * Math.log(n2 / d2);
      if (!(d2 > 0) || pr - pr !== 0 || pi - pi !== 0) {
        phaseDeg[p] = NaN; // a pole on the j w axis, or H not finite
      } else {
        if (n2 !== 0) {
          if (!have) {
            phase = Math.atan2(pi, pr);
            have = true;
          } else {
            const rr = pr * qr + pi * qi;
            const ri = pi * qr - pr * qi;
            const s = ri / rr;
            let d: number;
            if (rr > 0 && rr < Infinity && s < SERIES_LIMIT && s > -SERIES_LIMIT) {
              const s2 = s * s;
              d = s * (1 - s2 * (A3 - s2 * (A5 - s2 * (A7 - s2 * (A9 - s2 * (A11 - s2 * A13))))));
            } else if (rr - rr === 0 && ri - ri === 0 && (rr !== 0 || ri !== 0)) {
              d = Math.atan2(ri, rr);
            } else {
              d = Math.atan2(pi, pr) - Math.atan2(qi, qr); // R over- or underflowed: the principal difference
              if (d > Math.PI) d -= TWO_PI;
              else if (d <= -Math.PI) d += TWO_PI;
            }
            phase += d;
          }
          qr = pr;
          qi = pi;
        }
        phaseDeg[p] = phase * DEG_PER_RAD;
      }
      if (groupDelayS !== null) {
        // tau = -d arg H/dw = sum over factors of -+ d/dw arg(x + j y) = (x y' - y x')/(x^2 + y^2),
        // with x = c0 - c2 w^2, y = c1 w: x' = -2 c2 w, y' = c1; real numerator factors have constant
        // phase (0 or pi) between their zeros
        let tau = 0;
        for (let o = 0; o < dn.length; o += 3) {
          x = dn[o] - dn[o + 2] * w2;
          y = dn[o + 1] * w;
          tau += (x * dn[o + 1] + y * 2 * dn[o + 2] * w) / (x * x + y * y);
        }
        for (let o = 0; o < cn.length; o += 3) {
          x = cn[o] - cn[o + 2] * w2;
          y = cn[o + 1] * w;
          tau -= (x * cn[o + 1] + y * 2 * cn[o + 2] * w) / (x * x + y * y);
        }
        groupDelayS[p] = tau;
      }
    }
  };
}

const lit = numberLiteral;

/** The interpreted kernel's text with the factor loops unrolled and the coefficients as literals. */
function generatedSource(f: SweepFactors): string {
  const rn = f.realNumerator;
  const cn = f.complexNumerator;
  const dn = f.denominator;
  const factors: string[] = [];
  for (let o = 0; o < rn.length; o += 2) factors.push(`x = ${lit(rn[o])} - ${lit(rn[o + 1])} * w2; nr *= x; ni *= x;`);
  for (let o = 0; o < cn.length; o += 3) factors.push(`x = ${lit(cn[o])} - ${lit(cn[o + 2])} * w2; y = ${lit(cn[o + 1])} * w; t = nr * x - ni * y; ni = nr * y + ni * x; nr = t;`);
  for (let o = 0; o < dn.length; o += 3) factors.push(`x = ${lit(dn[o])} - ${lit(dn[o + 2])} * w2; y = ${lit(dn[o + 1])} * w; t = dr * x - di * y; di = dr * y + di * x; dr = t;`);
  const delay: string[] = [];
  for (let o = 0; o < dn.length; o += 3) delay.push(`x = ${lit(dn[o])} - ${lit(dn[o + 2])} * w2; y = ${lit(dn[o + 1])} * w; tau += (x * ${lit(dn[o + 1])} + y * 2 * ${lit(dn[o + 2])} * w) / (x * x + y * y);`);
  for (let o = 0; o < cn.length; o += 3) delay.push(`x = ${lit(cn[o])} - ${lit(cn[o + 2])} * w2; y = ${lit(cn[o + 1])} * w; tau -= (x * ${lit(cn[o + 1])} + y * 2 * ${lit(cn[o + 2])} * w) / (x * x + y * y);`);
  const PI = lit(Math.PI);
  return `
const m = frequencyHz.length;
let phase = 0, qr = 0, qi = 0, have = false;
for (let p = 0; p < m; p++) {
  const w = ${lit(TWO_PI)} * frequencyHz[p];
  const w2 = w * w;
  let nr = ${lit(f.gain)}, ni = 0, dr = 1, di = 0, x = 0, y = 0, t = 0;
  ${factors.join('\n  ')}
  const pr = nr * dr + ni * di;
  const pi = ni * dr - nr * di;
  const n2 = nr * nr + ni * ni;
  const d2 = dr * dr + di * di;
  gainDb[p] = ${lit(DB_PER_NEPER_POWER)} * Math.log(n2 / d2);
  if (!(d2 > 0) || pr - pr !== 0 || pi - pi !== 0) {
    phaseDeg[p] = NaN;
  } else {
    if (n2 !== 0) {
      if (!have) {
        phase = Math.atan2(pi, pr);
        have = true;
      } else {
        const rr = pr * qr + pi * qi;
        const ri = pi * qr - pr * qi;
        const s = ri / rr;
        let d;
        if (rr > 0 && rr < Infinity && s < ${lit(SERIES_LIMIT)} && s > ${lit(-SERIES_LIMIT)}) {
          const s2 = s * s;
          d = s * (1 - s2 * (${lit(A3)} - s2 * (${lit(A5)} - s2 * (${lit(A7)} - s2 * (${lit(A9)} - s2 * (${lit(A11)} - s2 * ${lit(A13)}))))));
        } else if (rr - rr === 0 && ri - ri === 0 && (rr !== 0 || ri !== 0)) {
          d = Math.atan2(ri, rr);
        } else {
          d = Math.atan2(pi, pr) - Math.atan2(qi, qr);
          if (d > ${PI}) d -= ${lit(TWO_PI)};
          else if (d <= ${lit(-Math.PI)}) d += ${lit(TWO_PI)};
        }
        phase += d;
      }
      qr = pr;
      qi = pi;
    }
    phaseDeg[p] = phase * ${lit(DEG_PER_RAD)};
  }
  if (groupDelayS !== null) {
    let tau = 0;
    ${delay.join('\n    ')}
    groupDelayS[p] = tau;
  }
}`;
}
