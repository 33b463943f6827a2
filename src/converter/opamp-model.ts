/**
 * Op-amp models for the GIC, as the public contract (DESIGN.md) defines them. The type, the ideal
 * model and the validator live with the circuit model (src/netlist/opamp), which stamps them into the
 * nodal equations; the converter re-exports them so that there is one definition:
 *   ideal:        A = infinity (a nullor: V+ = V-, no input current)
 *   finite-gain:  A = gain (frequency independent)
 *   integrator:   A(s) = 2*pi*GBW / s
 *   single-pole:  A(s) = A0 / (1 + s/wp) with A0 = 10^(openLoopGainDb/20), wp = 2*pi*GBW / A0
 *   two-pole:     the single-pole model times 1 / (1 + s/(2*pi*secondPoleHz))
 * `validateOpampModel(m, path)` throws InvalidInputError naming `${path}.<field>`.
 */
import type { OpampModel } from '../netlist/opamp';

export { IDEAL_OPAMP, validateOpampModel, type OpampModel } from '../netlist/opamp';

/** True for the ideal (nullor) model. */
export function isIdealOpamp(m: OpampModel): boolean {
  return m.model === 'ideal';
}
