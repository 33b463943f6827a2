/**
 * The bilinear transform of an analog filter in zeros/poles/gain, with optional prewarping, for the
 * digital sections of the C header.
 *
 * s = 2 fs (z - 1) / (z + 1) maps the analog j W axis onto the unit circle with W = 2 fs tan(w / (2 fs))
 * (A. V. Oppenheim and R. W. Schafer, "Discrete-Time Signal Processing", 3rd ed., section 7.2, Eq. (7.26)).
 * Each root r goes to (2 fs + r) / (2 fs - r); each zero at infinity (poles minus zeros of a proper H)
 * goes to z = -1; the gain becomes k Re(prod(2 fs - z) / prod(2 fs - p)), so H(z) at z = 1 equals H(s)
 * at s = 0 (the same mapping as scipy.signal.bilinear_zpk).
 *
 * Prewarping at wp = 2 pi prewarpHz: the usual substitution s = K (z - 1) / (z + 1) with
 * K = wp / tan(wp / (2 fs)) makes the digital response at wp equal the analog response at wp. It is done
 * the standard way, by frequency-scaling the analog filter first: H'(s) = H(s K / (2 fs)), i.e. every
 * root multiplied by c = 2 fs / K = (2 fs / wp) tan(wp / (2 fs)) and the gain by c^(poles - zeros)
 * (scipy's lp2lp_zpk with wo = c), then the plain transform.
 *
 * Float throughout (the input is already float zeros/poles). Conjugate pairs stay exact conjugates: the
 * lower root of a pair is mapped as the conjugate of its partner's image.
 */
import { cDiv, cMul, type Complex } from '../algebra/complex';
import { InvalidInputError, requirePositive } from '../errors';
import type { ZpkInput } from './sos';

export interface BilinearOptions {
  /** Frequency (Hz, 0 < prewarpHz < sampleRateHz / 2) where analog and digital responses agree. */
  readonly prewarpHz?: number;
}

/** Zeros/poles/gain in z; see the module comment. */
export interface DigitalZpk {
  readonly zeros: Complex[];
  readonly poles: Complex[];
  readonly gain: number;
}

/** The prewarp scale c = (2 fs / wp) tan(wp / (2 fs)) applied to every analog root (1 without prewarp). */
export function prewarpScale(sampleRateHz: number, prewarpHz?: number): number {
  requirePositive(sampleRateHz, 'sampleRateHz');
  if (prewarpHz === undefined) return 1;
  requirePositive(prewarpHz, 'prewarpHz');
  if (!(prewarpHz < sampleRateHz / 2)) {
    throw new InvalidInputError('OUT_OF_RANGE', 'prewarpHz', prewarpHz, `must be below the Nyquist frequency ${sampleRateHz / 2} Hz`);
  }
  const wp = 2 * Math.PI * prewarpHz;
  const fs2 = 2 * sampleRateHz;
  return (fs2 / wp) * Math.tan(wp / fs2); // Eq. (7.26) solved for the analog frequency, divided by wp
}

/**
 * Bilinear transform (with optional prewarp) of a proper analog H(s), roots in rad/s.
 *
 * @example
 * // a first-order lowpass at 1 kHz, 8 kHz sampling, prewarped at 1 kHz:
 * // H(z) = (1 - 1/sqrt 2)(1 + z^-1) / (1 + (1 - sqrt 2) z^-1)
 * const wc = 2 * Math.PI * 1000;
 * const [s] = zpkToDigitalSections(bilinearZpk({ zeros: [], poles: [{ re: -wc, im: 0 }], gain: wc }, 8000, { prewarpHz: 1000 }));
 * [s.b0, s.b1, s.a1]; // about [0.2929, 0.2929, -0.4142]
 */
export function bilinearZpk(analog: ZpkInput, sampleRateHz: number, options: BilinearOptions = {}): DigitalZpk {
  const c = prewarpScale(sampleRateHz, options.prewarpHz);
  if (!Array.isArray(analog?.zeros) || !Array.isArray(analog?.poles) || typeof analog.gain !== 'number') {
    throw new InvalidInputError('INVALID_ARGUMENT', 'analog', analog, 'must be { zeros: Complex[], poles: Complex[], gain: number }');
  }
  const excess = analog.poles.length - analog.zeros.length;
  if (excess < 0) throw new InvalidInputError('OUT_OF_RANGE', 'analog.zeros', analog.zeros.length, 'an analog H(s) needs no more zeros than poles');
  const fs2 = 2 * sampleRateHz;
  const scaled = (r: Complex): Complex => ({ re: r.re * c, im: r.im * c });
  const map = (r: Complex): Complex => {
    if (r.im < 0) {
      const up = map({ re: r.re, im: -r.im });
      return { re: up.re, im: -up.im };
    }
    return cDiv({ re: fs2 + r.re, im: r.im }, { re: fs2 - r.re, im: -r.im }); // z = (2 fs + s) / (2 fs - s)
  };
  const zs = analog.zeros.map(scaled);
  const ps = analog.poles.map(scaled);
  // k' = k c^(excess) prod(2 fs - z) / prod(2 fs - p), factors alternated so the product stays in range
  let g: Complex = { re: analog.gain * c ** excess, im: 0 };
  for (let i = 0; i < ps.length; i++) {
    if (i < zs.length) g = cMul(g, { re: fs2 - zs[i].re, im: -zs[i].im });
    g = cDiv(g, { re: fs2 - ps[i].re, im: -ps[i].im });
  }
  return {
    zeros: [...zs.map(map), ...Array.from({ length: excess }, () => ({ re: -1, im: 0 }))],
    poles: ps.map(map),
    gain: g.re,
  };
}
