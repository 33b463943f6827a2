/** Shared checks of a Realization: its exact transfer function and the consistency of its part list. */
import { expect } from 'vitest';
import type { RationalFunction } from '../../src/algebra/rational-function';
import { transferFunction } from '../../src/analysis/index';
import type { Realization } from '../../src/substitution/index';

/** V(out)/V(in) of the realised circuit, exactly (src/analysis). */
export const circuitTransferFunction = (r: Realization): RationalFunction => transferFunction(r.circuit, { input: 'VIN', output: 'out' });

/** Every R and C of the circuit is listed once in `parts` with its exact value, and nothing else is. */
export function expectPartsMatchCircuit(r: Realization): void {
  const listed = new Map(r.parts.map((p) => [p.name, p]));
  expect(listed.size).toBe(r.parts.length);
  let count = 0;
  for (const e of r.circuit.elements) {
    if (e.kind !== 'R' && e.kind !== 'C') continue;
    count += 1;
    const p = listed.get(e.name);
    expect(p, `part ${e.name} listed`).toBeDefined();
    expect(p!.kind).toBe(e.kind);
    expect(p!.exactValue.equals(e.kind === 'R' ? e.ohms : e.farads)).toBe(true);
  }
  expect(count).toBe(r.parts.length);
}

/** The ideal-op-amp proof: the circuit's exact H equals the ladder's, as RationalFunctions. */
export function expectExactRealization(r: Realization): void {
  const h = circuitTransferFunction(r);
  const ok = h.equals(r.reference.transferFunction);
  if (!ok) expect.fail(`realised H differs from the ladder's:\n got ${h.toString()}\n want ${r.reference.transferFunction.toString()}`);
  expectPartsMatchCircuit(r);
}
