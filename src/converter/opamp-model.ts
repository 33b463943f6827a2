/**
 * Op-amp models for the GIC, as the public contract (DESIGN.md) defines them. The open-loop gain A(s):
 *   ideal:        A = infinity (a nullor: V+ = V-, no input current)
 *   finite-gain:  A = gain (frequency independent)
 *   integrator:   A(s) = 2*pi*GBW / s
 *   single-pole:  A(s) = A0 / (1 + s/wp) with A0 = 10^(openLoopGainDb/20), wp = 2*pi*GBW / A0
 *   two-pole:     the single-pole model times 1 / (1 + s/(2*pi*secondPoleHz))
 * The analysis with non-ideal models belongs to src/analysis (exact nodal analysis); this file only
 * defines and validates the models.
 */
import { InvalidInputError, requirePositive } from '../errors';

export type OpampModel =
  | { model: 'ideal' }
  | { model: 'finite-gain'; gain: number }
  | { model: 'integrator'; gainBandwidthHz: number }
  | { model: 'single-pole'; gainBandwidthHz: number; openLoopGainDb: number }
  | { model: 'two-pole'; gainBandwidthHz: number; openLoopGainDb: number; secondPoleHz: number };

export const OPAMP_MODEL_NAMES = Object.freeze(['ideal', 'finite-gain', 'integrator', 'single-pole', 'two-pole'] as const);

/**
 * Checks that `m` is an {@link OpampModel} with finite positive parameters and returns it typed.
 * Throws InvalidInputError: 'INVALID_ARGUMENT' for a non-object or an unknown `model` (path
 * `${path}.model`), 'INVALID_NUMBER' / 'OUT_OF_RANGE' for a parameter that is not a finite positive
 * number (path `${path}.<field>`). Unknown extra fields are ignored.
 */
export function validateOpampModel(m: unknown, path = 'opamp'): OpampModel {
  if (typeof m !== 'object' || m === null || Array.isArray(m)) {
    throw new InvalidInputError('INVALID_ARGUMENT', path, m, 'must be an op-amp model object such as { model: "ideal" }');
  }
  const r = m as Record<string, unknown>;
  switch (r.model) {
    case 'ideal':
      return { model: 'ideal' };
    case 'finite-gain':
      return { model: 'finite-gain', gain: requirePositive(r.gain, `${path}.gain`) };
    case 'integrator':
      return { model: 'integrator', gainBandwidthHz: requirePositive(r.gainBandwidthHz, `${path}.gainBandwidthHz`) };
    case 'single-pole':
      return {
        model: 'single-pole',
        gainBandwidthHz: requirePositive(r.gainBandwidthHz, `${path}.gainBandwidthHz`),
        openLoopGainDb: requirePositive(r.openLoopGainDb, `${path}.openLoopGainDb`),
      };
    case 'two-pole':
      return {
        model: 'two-pole',
        gainBandwidthHz: requirePositive(r.gainBandwidthHz, `${path}.gainBandwidthHz`),
        openLoopGainDb: requirePositive(r.openLoopGainDb, `${path}.openLoopGainDb`),
        secondPoleHz: requirePositive(r.secondPoleHz, `${path}.secondPoleHz`),
      };
    default:
      throw new InvalidInputError('INVALID_ARGUMENT', `${path}.model`, r.model, `must be one of ${OPAMP_MODEL_NAMES.map((n) => `'${n}'`).join(', ')}`);
  }
}

/** True for the ideal (nullor) model. */
export function isIdealOpamp(m: OpampModel): boolean {
  return m.model === 'ideal';
}
