/**
 * Op-amp models and their exact open-loop gain A(s).
 *
 * The models (DESIGN.md, "OpampModel"):
 * - `ideal`: the nullor, A = infinity (V+ = V-, no input current, any output current);
 * - `finite-gain`: A(s) = A0;
 * - `integrator`: A(s) = wt / s with wt = 2*pi*GBW;
 * - `single-pole`: A(s) = A0 / (1 + s/wp) with wp = wt / A0 (the dominant-pole model);
 * - `two-pole`: A(s) = A0 / ((1 + s/wp)(1 + s/w2)) with w2 = 2*pi*secondPoleHz.
 * See A. S. Sedra and K. C. Smith, "Microelectronic Circuits", ch. 2 (frequency response of op-amps).
 *
 * Exactness boundary: 2*pi and 10^(dB/20) are irrational, so the exact analysis takes the doubles
 * `2 * Math.PI * gainBandwidthHz`, `2 * Math.PI * secondPoleHz` and `10 ** (openLoopGainDb / 20)`
 * as exact rationals (every double is one). The float engine uses the same doubles, so the exact and
 * float results describe the same circuit.
 */
import { Fraction, fractionFromDouble, Poly, RationalFunction, Q1 } from '../algebra/index';
import { InvalidInputError, requireFinite, requirePositive } from '../errors';

/** An op-amp's open-loop model (DESIGN.md's OpampModel; the converter stage re-exports it). */
export type OpampModel =
  | { model: 'ideal' }
  | { model: 'finite-gain'; gain: number }
  | { model: 'integrator'; gainBandwidthHz: number } // A(s) = 2*pi*GBW / s
  | { model: 'single-pole'; gainBandwidthHz: number; openLoopGainDb: number }
  | { model: 'two-pole'; gainBandwidthHz: number; openLoopGainDb: number; secondPoleHz: number };

/** The ideal op-amp (nullor). */
export const IDEAL_OPAMP: OpampModel = Object.freeze({ model: 'ideal' }) as OpampModel;

/**
 * The exact parameters of a model, in the units the stamps use. Absent fields do not apply.
 * `openLoopGain` is A0 (linear), `unityGainRadPerS` is wt = 2*pi*GBW, `secondPoleRadPerS` is w2.
 */
export interface OpampParameters {
  readonly openLoopGain?: Fraction;
  readonly unityGainRadPerS?: Fraction;
  readonly secondPoleRadPerS?: Fraction;
}

/** Validates a model (throws InvalidInputError naming `path.field`) and returns it unchanged. */
export function validateOpampModel(model: unknown, path = 'opamp'): OpampModel {
  if (typeof model !== 'object' || model === null) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, model, 'must be an op-amp model object');
  }
  const m = model as Record<string, unknown>;
  switch (m.model) {
    case 'ideal':
      return model as OpampModel;
    case 'finite-gain': {
      const g = requireFinite(m.gain, `${path}.gain`);
      if (g === 0) throw new InvalidInputError('OUT_OF_RANGE', `${path}.gain`, g, 'must be nonzero');
      return model as OpampModel;
    }
    case 'integrator':
      requirePositive(m.gainBandwidthHz, `${path}.gainBandwidthHz`);
      return model as OpampModel;
    case 'single-pole':
      requirePositive(m.gainBandwidthHz, `${path}.gainBandwidthHz`);
      requireFinite(m.openLoopGainDb, `${path}.openLoopGainDb`);
      return model as OpampModel;
    case 'two-pole':
      requirePositive(m.gainBandwidthHz, `${path}.gainBandwidthHz`);
      requireFinite(m.openLoopGainDb, `${path}.openLoopGainDb`);
      requirePositive(m.secondPoleHz, `${path}.secondPoleHz`);
      return model as OpampModel;
    default:
      throw new InvalidInputError(
        'INVALID_ARGUMENT',
        `${path}.model`,
        m.model,
        "must be one of 'ideal', 'finite-gain', 'integrator', 'single-pole', 'two-pole'",
      );
  }
}

/** The exact parameters of a (validated) model; see the module comment for the float-to-exact step. */
export function opampParameters(model: OpampModel): OpampParameters {
  switch (model.model) {
    case 'ideal':
      return {};
    case 'finite-gain':
      return { openLoopGain: fractionFromDouble(model.gain, 'gain') };
    case 'integrator':
      return { unityGainRadPerS: fractionFromDouble(2 * Math.PI * model.gainBandwidthHz, 'gainBandwidthHz') };
    case 'single-pole':
      return {
        openLoopGain: fractionFromDouble(10 ** (model.openLoopGainDb / 20), 'openLoopGainDb'),
        unityGainRadPerS: fractionFromDouble(2 * Math.PI * model.gainBandwidthHz, 'gainBandwidthHz'),
      };
    case 'two-pole':
      return {
        openLoopGain: fractionFromDouble(10 ** (model.openLoopGainDb / 20), 'openLoopGainDb'),
        unityGainRadPerS: fractionFromDouble(2 * Math.PI * model.gainBandwidthHz, 'gainBandwidthHz'),
        secondPoleRadPerS: fractionFromDouble(2 * Math.PI * model.secondPoleHz, 'secondPoleHz'),
      };
  }
}

/**
 * The reciprocal open-loop gain 1/A(s) as a polynomial in s, written with the exact parameters:
 * finite gain 1/A0; integrator s/wt; single pole 1/A0 + s/wt; two poles
 * 1/A0 + s/wt + s/(A0 w2) + s^2/(wt w2). Zero for the ideal op-amp. The op-amp's constraint row is
 * (1/A(s)) Vout - (V+ - V-) = 0, which tends to the nullor's V+ = V- as A grows.
 */
export function opampInverseGain(model: OpampModel): Poly {
  const p = opampParameters(model);
  const a0 = p.openLoopGain;
  const wt = p.unityGainRadPerS;
  const w2 = p.secondPoleRadPerS;
  switch (model.model) {
    case 'ideal':
      return Poly.ZERO;
    case 'finite-gain':
      return Poly.fromCoefficients([Q1.div(a0!)]);
    case 'integrator':
      return Poly.fromCoefficients([0, Q1.div(wt!)]);
    case 'single-pole':
      return Poly.fromCoefficients([Q1.div(a0!), Q1.div(wt!)]);
    case 'two-pole':
      return Poly.fromCoefficients([Q1.div(a0!), Q1.div(wt!).add(Q1.div(a0!.mul(w2!))), Q1.div(wt!.mul(w2!))]);
  }
}

/** The exact open-loop gain A(s) of a model; null for the ideal op-amp (A = infinity). */
export function opampGain(model: OpampModel): RationalFunction | null {
  if (model.model === 'ideal') return null;
  return RationalFunction.fromPolys(Poly.ONE, opampInverseGain(model));
}
