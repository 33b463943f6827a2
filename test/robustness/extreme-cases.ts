/**
 * The extreme but legal designs of the robustness table (FIGURES.md): order 1 and 15, edges from 1 Hz
 * to 10 MHz, ripple 0.001 dB and 3 dB, attenuation 20 to 120 dB, a narrow bandpass (Q 100), impedance
 * levels from 100 ohm to 10 Mohm. Each either designs (and its ideal-part response is compared with the
 * scaled prototype) or is refused with a typed error; {@link runExtremeCase} records which, and why.
 *
 * Shared by extreme-designs.test.ts (which asserts the outcomes) and scripts/robustness/figures.ts
 * (which prints the table).
 */
import { compileAc } from '../../src/analysis/ac-engine';
import { gainDbAt } from '../../src/approximation/index';
import { GicladderError } from '../../src/errors';
import { designFilter, prototypeOmega, type FilterDesign } from '../../src/spec/design-filter';

export interface ExtremeCase {
  readonly id: string;
  /** What is extreme about it. */
  readonly what: string;
  readonly spec: Record<string, unknown>;
}

const lp = (response: Record<string, unknown>, rest: Record<string, unknown> = {}): Record<string, unknown> => ({ response: { type: 'lowpass', passbandEdgeHz: 1000, ...response }, ...rest });

export const EXTREME_CASES: readonly ExtremeCase[] = [
  { id: 'order-1-butterworth', what: 'order 1', spec: lp({ family: 'butterworth', order: 1 }) },
  { id: 'order-1-bessel', what: 'order 1', spec: lp({ family: 'bessel', order: 1 }) },
  { id: 'order-15-butterworth', what: 'order 15', spec: lp({ family: 'butterworth', order: 15 }) },
  { id: 'order-15-chebyshev', what: 'order 15', spec: lp({ family: 'chebyshev', order: 15, passbandRippleDb: 0.5 }) },
  { id: 'order-15-bessel', what: 'order 15', spec: lp({ family: 'bessel', order: 15 }) },
  { id: 'order-15-elliptic', what: 'order 15', spec: lp({ family: 'elliptic', order: 15, passbandRippleDb: 0.5, stopbandAttenuationDb: 60 }) },
  { id: 'order-15-inverse-chebyshev', what: 'order 15', spec: lp({ family: 'inverse-chebyshev', order: 15, stopbandAttenuationDb: 80 }) },
  { id: 'edge-1Hz-lowpass', what: 'edge 1 Hz', spec: lp({ family: 'chebyshev', order: 5, passbandEdgeHz: 1, passbandRippleDb: 0.1 }, { realization: { capacitorF: '1u' } }) },
  { id: 'edge-1Hz-highpass', what: 'edge 1 Hz', spec: { response: { type: 'highpass', family: 'butterworth', order: 4, passbandEdgeHz: 1 } } },
  { id: 'edge-10MHz-lowpass', what: 'edge 10 MHz, GBW 10 MHz', spec: lp({ family: 'butterworth', order: 5, passbandEdgeHz: '10 MHz' }, { realization: { capacitorF: '10p' } }) },
  { id: 'edge-10MHz-lowpass-fast-opamp', what: 'edge 10 MHz, GBW 10 GHz', spec: lp({ family: 'butterworth', order: 5, passbandEdgeHz: '10 MHz' }, { realization: { capacitorF: '10p' }, parts: { opamp: { model: 'single-pole', gainBandwidthHz: 1e10, openLoopGainDb: 100 } } }) },
  { id: 'edge-10MHz-highpass', what: 'edge 10 MHz', spec: { response: { type: 'highpass', family: 'chebyshev', order: 3, passbandEdgeHz: '10 MHz', passbandRippleDb: 0.5 }, realization: { impedanceOhms: 1000 } } },
  { id: 'ripple-0.001dB-chebyshev', what: 'ripple 0.001 dB', spec: lp({ family: 'chebyshev', order: 7, passbandRippleDb: 0.001 }) },
  { id: 'ripple-3dB-chebyshev', what: 'ripple 3 dB', spec: lp({ family: 'chebyshev', order: 7, passbandRippleDb: 3 }) },
  { id: 'ripple-0.001dB-elliptic', what: 'ripple 0.001 dB', spec: lp({ family: 'elliptic', order: 5, passbandRippleDb: 0.001, stopbandAttenuationDb: 40 }) },
  { id: 'ripple-3dB-elliptic', what: 'ripple 3 dB', spec: lp({ family: 'elliptic', order: 5, passbandRippleDb: 3, stopbandAttenuationDb: 60 }) },
  { id: 'attenuation-20dB-elliptic-mask', what: 'attenuation 20 dB (order from the mask)', spec: lp({ family: 'elliptic', stopbandEdgeHz: 1500, passbandRippleDb: 0.1, stopbandAttenuationDb: 20 }) },
  { id: 'attenuation-120dB-elliptic-mask', what: 'attenuation 120 dB (order from the mask)', spec: lp({ family: 'elliptic', stopbandEdgeHz: 2000, passbandRippleDb: 0.1, stopbandAttenuationDb: 120 }) },
  { id: 'attenuation-120dB-inverse-chebyshev', what: 'attenuation 120 dB', spec: lp({ family: 'inverse-chebyshev', order: 9, stopbandAttenuationDb: 120 }) },
  { id: 'attenuation-120dB-butterworth-mask', what: 'attenuation 120 dB (order from the mask)', spec: lp({ family: 'butterworth', stopbandEdgeHz: 3000, stopbandAttenuationDb: 120 }) },
  { id: 'bandpass-Q100', what: 'bandpass Q 100 (9950-10050 Hz)', spec: { response: { type: 'bandpass', family: 'butterworth', order: 2, passbandEdgeHz: [9950, 10050] }, realization: { capacitorF: '10n' }, parts: { opamp: { model: 'single-pole', gainBandwidthHz: 1e9, openLoopGainDb: 110 } } } },
  { id: 'bandpass-Q100-default-opamp', what: 'bandpass Q 100, 10 MHz GBW', spec: { response: { type: 'bandpass', family: 'butterworth', order: 2, passbandEdgeHz: [9950, 10050] }, realization: { capacitorF: '10n' } } },
  { id: 'impedance-100ohm', what: 'impedance level 100 ohm', spec: lp({ family: 'chebyshev', order: 5, passbandRippleDb: 0.1 }, { realization: { impedanceOhms: 100 } }) },
  { id: 'impedance-10Mohm', what: 'impedance level 10 Mohm', spec: lp({ family: 'chebyshev', order: 5, passbandRippleDb: 0.1 }, { realization: { impedanceOhms: '10M' } }) },
  { id: 'impedance-100ohm-highpass', what: 'impedance level 100 ohm', spec: { response: { type: 'highpass', family: 'butterworth', order: 5, passbandEdgeHz: 1000 }, realization: { impedanceOhms: 100 } } },
  { id: 'impedance-10Mohm-highpass', what: 'impedance level 10 Mohm', spec: { response: { type: 'highpass', family: 'butterworth', order: 5, passbandEdgeHz: 1000 }, realization: { impedanceOhms: '10M' } } },
  { id: 'highpass-elliptic', what: 'highpass with finite zeros (auto route)', spec: { response: { type: 'highpass', family: 'elliptic', order: 4, passbandEdgeHz: 1000, passbandRippleDb: 0.1, stopbandAttenuationDb: 40 } } },
];

export interface ExtremeOutcome {
  readonly id: string;
  readonly what: string;
  readonly designed: boolean;
  readonly order?: number;
  readonly method?: string;
  /** design.evaluation.prototypeDeviationDb: ideal parts vs the scaled (realised) prototype, dB. */
  readonly prototypeDeviationDb?: number;
  /** Our own check: the exact-part, ideal-op-amp circuit vs the prototype asked for, over the passband grid, dB. */
  readonly ownDeviationDb?: number;
  readonly passbandErrorDb?: number;
  readonly warnings?: readonly string[];
  /** Every diagnostic code (info and warning). */
  readonly codes?: readonly string[];
  /** The PASSBAND_ERROR diagnostic's message. */
  readonly passbandMessage?: string;
  /** The GBW the design needs for the passband bound, Hz (NaN: none up to 1e10 times the band). */
  readonly requiredGbwHz?: number;
  /** For a refusal: class/code, the path and the reason. */
  readonly error?: { readonly kind: string; readonly path: string; readonly message: string };
  readonly ms: number;
}

/**
 * The largest |gain of the exact-part circuit with ideal op-amps - (nominal + prototype gain at the
 * mapped frequency)| over the evaluation's passband points, computed here with the AC engine and the
 * prototype asked for (design.prototype), independently of evaluation.ts.
 */
export function ownPrototypeDeviationDb(d: FilterDesign): number {
  const f = d.evaluation.frequencyHz.filter((_, i) => d.evaluation.inPassband[i]);
  const g = compileAc(d.realization.circuit, { input: 'VIN', output: 'out' }).sweep(f, { nodes: 'none' }).gainDb;
  const protoDb = (x: number): number => gainDbAt(d.prototype, prototypeOmega(d.spec.response.type, d.order.passbandEdgeHz, d.prototypeEdgeRadPerS, x));
  // The passband reference: the prototype's peak (at omega = 0, or a ripple maximum of an even order).
  const ref = Math.max(gainDbAt(d.prototype, 0), ...d.evaluation.frequencyHz.map(protoDb));
  let m = 0;
  f.forEach((x, i) => {
    m = Math.max(m, Math.abs(g[i] - (d.nominalPassbandGainDb + protoDb(x) - ref)));
  });
  return m;
}

/** Evaluation grid of the table: 100 points per sweep resolve every passband ripple of order <= 15 (7 extrema) finely enough. */
const TABLE_SWEEP_POINTS = 100;

export function runExtremeCase(c: ExtremeCase): ExtremeOutcome {
  const t = performance.now();
  try {
    const d = designFilter({ ...c.spec, evaluation: { sweepPoints: TABLE_SWEEP_POINTS } });
    return {
      id: c.id,
      what: c.what,
      designed: true,
      order: d.order.order,
      method: d.method,
      prototypeDeviationDb: d.evaluation.prototypeDeviationDb,
      ownDeviationDb: ownPrototypeDeviationDb(d),
      passbandErrorDb: d.evaluation.passbandErrorDb.total,
      warnings: [...new Set(d.diagnostics.filter((x) => x.severity === 'warning').map((x) => x.code))],
      codes: [...new Set(d.diagnostics.map((x) => x.code))],
      passbandMessage: d.diagnostics.find((x) => x.code === 'PASSBAND_ERROR')?.message,
      requiredGbwHz: d.evaluation.gainBandwidth.requiredHz,
      ms: performance.now() - t,
    };
  } catch (e) {
    if (!(e instanceof GicladderError)) throw e;
    return { id: c.id, what: c.what, designed: false, error: { kind: `${e.constructor.name}/${e.code}`, path: e.path, message: e.message }, ms: performance.now() - t };
  }
}
