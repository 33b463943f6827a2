/**
 * Simulated-inductor realisation: every grounded inductor of the ladder becomes a grounded GIC
 * (A. Antoniou, Proc. IEE 116(11), 1969) presenting exactly that inductance, with the capacitor in
 * position 4 (default) or 2 and the optimum resistor choice of gic-choices.ts; resistors and capacitors
 * stay as they are, terminations included. Inductors are grounded in the shunt branches of highpass
 * ladders (the LP prototype's shunt capacitors) and in shunt series-L-C or L||C arms, where
 * ladder-placement.ts puts the inductor at the ground end. A floating inductor is refused (the
 * 'gic-embedding' method realises it).
 *
 * With ideal op-amps each GIC's port impedance is s L exactly, so the circuit's V(out)/V(in) equals the
 * ladder's networkLadderTransferFunction; test/substitution proves it as RationalFunction equality.
 */
import { Circuit } from '../netlist/circuit';
import { fractionToNumber } from '../algebra/rational';
import { UnrealizableError } from '../errors';
import { networkLadderTransferFunction } from '../transform/response';
import type { NetworkLadder } from '../transform/network';
import { addBuffers } from './buffers';
import { chooseInductorGic } from './gic-choices';
import { addGic } from './gic-instance';
import { ElementNames, GROUND, placeLadder } from './ladder-placement';
import type { ResolvedOptions } from './options';
import { addPassive } from './passive-parts';
import type { Realization, RealizationDiagnostic, RealizedPart } from './realization';

export function realizeSimulatedInductorResolved(ladder: NetworkLadder, o: ResolvedOptions): Realization {
  const circuit = new Circuit().addVoltageSource('VIN', 'in', GROUND);
  const ports = addBuffers(circuit, o.buffers === 'auto' ? 'none' : o.buffers, o.opamp);
  const placed = placeLadder(ladder, ports.ladderInput, ports.ladderOutput, (e) => e.kind === 'L');
  const names = new ElementNames();
  const parts: RealizedPart[] = [];
  const diagnostics: RealizationDiagnostic[] = [];
  for (const p of placed.elements) {
    const e = p.element;
    if (e.kind === 'R' || e.kind === 'C') parts.push(addPassive(circuit, names, p));
    else if (e.kind === 'L') {
      if (p.b !== GROUND) {
        throw new UnrealizableError(
          'UNREALIZABLE',
          'options.method',
          'simulated-inductor',
          `ladder.${p.where}: inductor ${e.origin} is floating (between two ungrounded nodes); a grounded GIC cannot simulate it (use method 'gic-embedding', or a ladder form whose inductors are in shunt arms)`,
        );
      }
      const { design, free } = chooseInductorGic(e.value, o.capacitorF, o.omega0, o.inductorCapacitorPosition, o.resistanceOhms);
      parts.push(...addGic(circuit, names.make('X', e.origin), p.a, design.parts, o.opamp, { realises: e.origin, free }));
    } else {
      throw new UnrealizableError('UNREALIZABLE', 'options.method', 'simulated-inductor', `ladder.${p.where}: an FDNR (${e.origin}) has no place in the simulated-inductor route (use method 'fdnr' on the lowpass ladder)`);
    }
  }
  diagnostics.push({ code: 'GIC_WORKING_FREQUENCY', message: `GIC resistors chosen for omega0 C R5 = 1 at omega0 = ${fractionToNumber(o.omega0)} rad/s` });
  return {
    method: 'simulated-inductor',
    circuit,
    parts,
    reference: { ladder, transferFunction: networkLadderTransferFunction(ladder) },
    opamp: o.opamp,
    diagnostics,
  };
}
