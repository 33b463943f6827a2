/** Small circuits for the tolerance tests, independent of the substitution stage. */
import { Circuit, type OpampModel } from '../../src/netlist/index';
import { addGic } from '../helpers/gic-circuits';

/** A resistive divider in -R1- out -R2- ground: H = R2 / (R1 + R2). */
export function divider(r1 = 1000, r2 = 1000): Circuit {
  return new Circuit().addResistor('R1', 'in', 'out', r1).addResistor('R2', 'out', '0', r2);
}

/** The GIC simulated-inductor parts: Z1, Z2, Z3, R5 resistors and C4, L = C4 R1 R3 R5 / R2 = 10 mH. */
export const GIC_INDUCTOR_PARTS = ['G_R1', 'G_R2', 'G_R3', 'G_C4', 'G_R5'] as const;

/**
 * A grounded GIC simulated inductor fed by a 1 A current source, so that H = V(p)/I = Zin(j w) = j w L_eff:
 * the gain in dB is 20 log10(w L_eff) and a relative change of L_eff is (ln 10 / 20) times the change of the gain.
 */
export function gicInductorProbe(opamp: OpampModel): Circuit {
  const c = new Circuit().addCurrentSource('IIN', '0', 'p', 1);
  return addGic(c, 'G', 'p', [{ kind: 'R', ohms: '1000' }, { kind: 'R', ohms: '1000' }, { kind: 'R', ohms: '1000' }, { kind: 'C', farads: '1e-8' }, { kind: 'R', ohms: '1000' }], opamp);
}
