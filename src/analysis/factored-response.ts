/**
 * The float boundary of an exact transfer function: `toFloatTransferFunction` factors a
 * RationalFunction into zeros, poles and gain, and groups them into second-order sections with real
 * coefficients, each scaled to unit gain at s = 0 (or at infinity for a zero at the origin), so the
 * product never over- or underflows where H itself is representable. Evaluating H(j w) section by
 * section avoids the cancellation of expanded high-degree polynomials (the same reason scipy.signal
 * prefers 'sos' over 'ba'; A. V. Oppenheim and R. W. Schafer, "Discrete-Time Signal Processing",
 * 3rd ed., section 6.3.3 on cascade forms).
 *
 * Roots come from algebra/roots (Aberth-Ehrlich with polishing, exact conjugate symmetry). Pairing:
 * section-pairing.ts, the rule of scipy.signal.zpk2sos (the header's sections use the same).
 */
import { Fraction, fractionToNumber, polynomialRoots, divideParts as cdiv, type Complex, type RationalFunction } from '../algebra/index';
import { InvalidInputError } from '../errors';
import { sweepKernelFor, type SweepKernel } from './factored-sweep';
import { pairRoots, splitRoots } from './section-pairing';

/** num(s)/den(s) = (n2 s^2 + n1 s + n0) / (d2 s^2 + d1 s + d0), real coefficients. */
export interface AnalogSection {
  readonly n0: number;
  readonly n1: number;
  readonly n2: number;
  readonly d0: number;
  readonly d1: number;
  readonly d2: number;
}

export interface FactoredSweep {
  readonly frequencyHz: Float64Array;
  readonly gainDb: Float64Array;
  /**
   * Unwrapped along the sweep, in the order the frequencies were given: each step is the principal
   * angle between neighbouring points (factored-sweep.ts).
   */
  readonly phaseDeg: Float64Array;
  /** Exact derivative, section by section; NaN-free only away from zeros on the j w axis. */
  readonly groupDelayS: Float64Array;
}

export interface FloatTransferFunction {
  /** H(s) = gain * prod(s - z) / prod(s - p). Sorted as algebra/roots sorts them. */
  readonly zeros: readonly Complex[];
  readonly poles: readonly Complex[];
  readonly gain: number;
  /** H(s) = sectionGain * prod(sections). */
  readonly sections: readonly AnalogSection[];
  readonly sectionGain: number;
  /** H at any complex s (float). */
  evaluate(s: Complex): Complex;
  /** Gain, phase and group delay at the frequencies (Hz); `groupDelay: false` skips the delay (faster). */
  sweep(frequenciesHz: ArrayLike<number>, options?: { readonly groupDelay?: boolean }): FactoredSweep;
  /**
   * The same into caller-owned arrays of the frequencies' length (no allocation: repeated sweeps of
   * a plot or a tuning loop); the group delay only when `groupDelayS` is given.
   */
  sweepInto(frequencyHz: Float64Array, gainDb: Float64Array, phaseDeg: Float64Array, groupDelayS?: Float64Array): void;
}

/**
 * The flat factored form for inner loops: `gain` is lead(num)/lead(den); `zeros` and `poles` hold one
 * [c0, c1, c2] triple per real factor c2 s^2 + c1 s + c0 (monic: quadratics with c2 = 1, linear
 * factors s - r as [-r, 1, 0]), so H = gain * prod zeros / prod poles; `sections` holds the scaled
 * sections as [n0, n1, n2, d0, d1, d2] sextuples with H = sectionGain * prod sections (what
 * {@link evaluateFactored} uses, free of overflow where H is representable).
 */
export interface FloatFactored {
  readonly gain: number;
  readonly zeros: Float64Array;
  readonly poles: Float64Array;
  readonly sections: Float64Array;
  readonly sectionGain: number;
}

/** The flat factored form of an exact transfer function (the float boundary, as {@link toFloatTransferFunction}). */
export function toFloatFactored(h: RationalFunction): FloatFactored {
  const f = toFloatTransferFunction(h);
  const triples = (roots: readonly Complex[]) => {
    const gs = groups(roots);
    const out = new Float64Array(gs.length * 3);
    gs.forEach((g, i) => {
      if (g.roots.length === 1) out.set([-g.roots[0].re, 1, 0], i * 3);
      else if (g.roots[0].im !== 0) out.set([g.roots[0].re ** 2 + g.roots[0].im ** 2, -2 * g.roots[0].re, 1], i * 3);
      else out.set([g.roots[0].re * g.roots[1].re, -(g.roots[0].re + g.roots[1].re), 1], i * 3);
    });
    return out;
  };
  const sections = new Float64Array(f.sections.length * 6);
  f.sections.forEach((q, i) => sections.set([q.n0, q.n1, q.n2, q.d0, q.d1, q.d2], i * 6));
  return { gain: f.gain, zeros: triples(f.zeros), poles: triples(f.poles), sections, sectionGain: f.sectionGain };
}

/**
 * H(j w) at each angular frequency (rad/s) into re/im, section by section; no allocation. A kernel:
 * poles on the j w axis give Infinity/NaN.
 */
export function evaluateFactored(f: FloatFactored, omegaRadPerS: ArrayLike<number>, re: Float64Array, im: Float64Array): void {
  const sec = f.sections;
  const ns = sec.length;
  const g = f.sectionGain;
  for (let p = 0; p < omegaRadPerS.length; p++) {
    const w = omegaRadPerS[p];
    const w2 = w * w;
    let pr = g;
    let pi = 0;
    let q = 1;
    for (let o = 0; o < ns; o += 6) {
      const ny = sec[o + 1] * w; // N(jw) = nx + j ny, D(jw) = dx + j dy
      const nx = sec[o] - sec[o + 2] * w2;
      const dy = sec[o + 4] * w;
      const dx = sec[o + 3] - sec[o + 5] * w2;
      const cr = nx * dx + ny * dy; // N conj(D)
      const ci = ny * dx - nx * dy;
      const t = pr * cr - pi * ci;
      pi = pr * ci + pi * cr;
      pr = t;
      q *= dx * dx + dy * dy;
    }
    re[p] = pr / q;
    im[p] = pi / q;
  }
}

/** Factors an exact transfer function (see the module comment). The float boundary of exact H(s). */
export function toFloatTransferFunction(h: RationalFunction): FloatTransferFunction {
  const zeros = h.num.isZero() ? [] : polynomialRoots(h.num);
  const poles = polynomialRoots(h.den);
  const lead = h.num.isZero() ? new Fraction(0) : h.num.leading.div(h.den.leading);
  // Pair: the zpk2sos rule (section-pairing.ts): the highest-Q poles first, each with its nearest zeros;
  // zeros beyond what the pole pairs take (an improper H) get sections of their own.
  const zr = splitRoots(zeros, 'h.num');
  const sectionRoots = pairRoots(zr, splitRoots(poles, 'h.den'), Math.ceil(poles.length / 2), 'analog');
  const pairs: { p: Group | null; z: Group | null }[] = sectionRoots.map((r) => ({ p: r.p.length ? { roots: r.p } : null, z: r.z.length ? { roots: r.z } : null }));
  for (const z of groups(zr.flatMap((r) => (r.im === 0 ? [r] : [r, { re: r.re, im: -r.im }])))) pairs.push({ p: null, z });

  // Scale each factor to unit gain at 0 (or leave a root at the origin as s), tracking log2 of the gain.
  let log2 = log2Abs(lead);
  let sign = lead.s < 0n ? -1 : 1;
  const sections: AnalogSection[] = pairs.map(({ p, z }) => {
    const [n0, n1, n2, ln, sn] = quadratic(z);
    const [d0, d1, d2, ld, sd] = quadratic(p);
    log2 += ln - ld;
    sign *= sn * sd;
    return { n0, n1, n2, d0, d1, d2 };
  });
  const sectionGain = sign * 2 ** log2;
  const gain = fractionToNumber(lead);

  const evaluate = (s: Complex): Complex => {
    let re = sectionGain;
    let im = 0;
    for (const q of sections) {
      const nr = q.n2 * (s.re * s.re - s.im * s.im) + q.n1 * s.re + q.n0;
      const ni = q.n2 * 2 * s.re * s.im + q.n1 * s.im;
      const dr = q.d2 * (s.re * s.re - s.im * s.im) + q.d1 * s.re + q.d0;
      const di = q.d2 * 2 * s.re * s.im + q.d1 * s.im;
      const [qr, qi] = cdiv(nr, ni, dr, di);
      const t = re * qr - im * qi;
      im = re * qi + im * qr;
      re = t;
    }
    return { re, im };
  };

  // The sweep evaluates numerator and denominator factors apart (factored-sweep.ts); factors equal to
  // 1 are dropped and numerator factors with no s term (zeros on the j w axis) are real at s = j w,
  // so they cost two multiplications.
  const cplxNum: number[] = [];
  const realNum: number[] = [];
  const dens: number[] = [];
  for (const q of sections) {
    if (q.n1 !== 0) cplxNum.push(q.n0, q.n1, q.n2);
    else if (q.n2 !== 0 || q.n0 !== 1) realNum.push(q.n0, q.n2);
    if (q.d1 !== 0 || q.d2 !== 0 || q.d0 !== 1) dens.push(q.d0, q.d1, q.d2);
  }
  let kernel: SweepKernel | null = null; // generated on the first sweep
  const kernelOf = () =>
    (kernel ??= sweepKernelFor({ gain: sectionGain, realNumerator: Float64Array.from(realNum), complexNumerator: Float64Array.from(cplxNum), denominator: Float64Array.from(dens) }));
  const sweep = (frequenciesHz: ArrayLike<number>, options: { readonly groupDelay?: boolean } = {}): FactoredSweep => {
    const m = frequenciesHz.length;
    const frequencyHz = new Float64Array(m);
    for (let i = 0; i < m; i++) frequencyHz[i] = frequenciesHz[i];
    const gainDb = new Float64Array(m);
    const phaseDeg = new Float64Array(m);
    const groupDelayS = new Float64Array(m);
    if (options.groupDelay ?? true) kernelOf()(frequencyHz, gainDb, phaseDeg, groupDelayS);
    else {
      kernelOf()(frequencyHz, gainDb, phaseDeg, null);
      groupDelayS.fill(NaN);
    }
    return { frequencyHz, gainDb, phaseDeg, groupDelayS };
  };
  const sweepInto = (frequencyHz: Float64Array, gainDb: Float64Array, phaseDeg: Float64Array, groupDelayS?: Float64Array): void => {
    const m = frequencyHz.length;
    const check = (a: Float64Array | undefined, name: string) => {
      if (a !== undefined && (!(a instanceof Float64Array) || a.length !== m)) throw new InvalidInputError('INVALID_ARGUMENT', name, a, `must be a Float64Array of the frequencies' length (${m})`);
    };
    if (!(frequencyHz instanceof Float64Array)) throw new InvalidInputError('INVALID_ARGUMENT', 'frequencyHz', frequencyHz, 'must be a Float64Array');
    check(gainDb, 'gainDb');
    check(phaseDeg, 'phaseDeg');
    check(groupDelayS, 'groupDelayS');
    kernelOf()(frequencyHz, gainDb, phaseDeg, groupDelayS ?? null);
  };

  return { zeros, poles, gain, sections, sectionGain, evaluate, sweep, sweepInto };
}

interface Group {
  readonly roots: readonly Complex[]; // one real root, two real roots, or a conjugate pair (im < 0 first)
}

/** Conjugate pairs together; real roots paired in sorted order, one left over when their count is odd. */
function groups(roots: readonly Complex[]): Group[] {
  const out: Group[] = [];
  const reals: Complex[] = [];
  const used = new Uint8Array(roots.length);
  for (let i = 0; i < roots.length; i++) {
    if (used[i]) continue;
    const r = roots[i];
    if (r.im === 0) {
      reals.push(r);
      continue;
    }
    // the exact conjugate follows in the sorted list (algebra/roots guarantees bitwise symmetry)
    let j = i + 1;
    while (j < roots.length && (used[j] || roots[j].re !== r.re || roots[j].im !== -r.im)) j++;
    if (j < roots.length) used[j] = 1;
    out.push({ roots: r.im < 0 ? [r, { re: r.re, im: -r.im }] : [{ re: r.re, im: -r.im }, r] });
  }
  reals.sort((a, b) => a.re - b.re);
  for (let i = 0; i + 1 < reals.length; i += 2) out.push({ roots: [reals[i], reals[i + 1]] });
  if (reals.length % 2 === 1) out.push({ roots: [reals[reals.length - 1]] });
  return out;
}

/**
 * The group's polynomial as [c0, c1, c2, log2 of the scale removed, sign removed], scaled to c0 = +-1
 * (unit gain at s = 0) unless c0 = 0, then to a unit leading coefficient. An absent group is 1.
 */
function quadratic(g: Group | null): [number, number, number, number, number] {
  if (!g) return [1, 0, 0, 0, 1];
  let c0: number;
  let c1: number;
  let c2: number;
  if (g.roots.length === 1) {
    c0 = -g.roots[0].re;
    c1 = 1;
    c2 = 0;
  } else {
    const [a, b] = g.roots;
    if (a.im !== 0) {
      c0 = a.re * a.re + a.im * a.im; // (s - a)(s - conj a) = s^2 - 2 Re a s + |a|^2
      c1 = -2 * a.re;
    } else {
      c0 = a.re * b.re;
      c1 = -(a.re + b.re);
    }
    c2 = 1;
  }
  const scale = c0 !== 0 ? c0 : c2 !== 0 ? c2 : c1;
  const sgn = scale < 0 ? -1 : 1;
  const mag = Math.abs(scale);
  return [c0 / mag / sgn, c1 / mag / sgn, c2 / mag / sgn, Math.log2(mag), sgn];
}

/** log2 |f| for a nonzero Fraction, without overflow (the Fraction may exceed the double range). */
function log2Abs(f: Fraction): number {
  if (f.n === 0n) return -Infinity;
  const shift = (x: bigint) => Math.max(0, x.toString(2).length - 60);
  const sn = shift(f.n);
  const sd = shift(f.d);
  return Math.log2(Number(f.n >> BigInt(sn))) + sn - Math.log2(Number(f.d >> BigInt(sd))) - sd;
}

