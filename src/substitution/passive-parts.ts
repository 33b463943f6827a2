/**
 * Ladder elements that stay passive in the realised circuit: resistors and capacitors added one to
 * one, named `${kind}_${origin}`, labelled as terminations (the source and load networks) or ladder parts.
 */
import type { Circuit } from '../netlist/circuit';
import type { ElementNames, PlacedElement } from './ladder-placement';
import type { PartRoleKind, RealizedPart } from './realization';

/** Adds a placed R or C (callers dispatch L and D elsewhere) to the circuit and returns its part record. */
export function addPassive(circuit: Circuit, names: ElementNames, p: PlacedElement, role?: PartRoleKind): RealizedPart {
  const e = p.element;
  const name = names.make(e.kind, e.origin);
  if (e.kind === 'R') circuit.addResistor(name, p.a, p.b, e.value);
  else circuit.addCapacitor(name, p.a, p.b, e.value);
  const kind = role ?? (p.where === 'source' || p.where === 'load' ? 'termination' : 'ladder');
  return { name, kind: e.kind === 'R' ? 'R' : 'C', exactValue: e.value, role: { kind, realises: e.origin, free: false } };
}
