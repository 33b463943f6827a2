/** Shared checks of a Realization: its exact transfer function and the consistency of its part list. */
import { expect } from 'vitest';
import { cAbs, cDiv } from '../../src/algebra/complex';
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

/**
 * The ideal-op-amp proof: the circuit's exact H equals the ladder's, as RationalFunctions. For an
 * embedding realisation with DC references (r.dcPath set), it equals the exact H of the ladder with their
 * passive equivalents in (reference.withDcPath), and that H is within the stated bound of the ladder's
 * over the band the report names (checked here on a grid of its own).
 */
export function expectExactRealization(r: Realization): void {
  const h = circuitTransferFunction(r);
  const want = r.reference.withDcPath ?? r.reference.transferFunction;
  const ok = h.equals(want);
  if (!ok) expect.fail(`realised H differs from the ladder's:\n got ${h.toString()}\n want ${want.toString()}`);
  if (r.reference.withDcPath) {
    expect(r.method).toBe('gic-embedding');
    const d = r.dcPath!;
    // Met, or reported as not met (extreme bands, Q ~ 1000, where the float evaluation's floor is ~0.01 dB).
    const met = d.errorDb <= d.boundDb;
    expect(met || r.diagnostics.some((x) => x.code === 'DC_PATH_ERROR_ABOVE_BOUND')).toBe(true);
    const lo = 2 * Math.PI * (d.passbandLowHz ?? 0);
    const hi = 2 * Math.PI * d.passbandEdgeHz;
    let worst = 0;
    for (let i = 0; i <= 300; i++) {
      const s = { re: 0, im: lo + ((hi - lo) * i) / 300 };
      worst = Math.max(worst, Math.abs(20 * Math.log10(cAbs(cDiv(h.evaluateComplex(s), r.reference.transferFunction.evaluateComplex(s))))));
    }
    // A finer grid than the report's may find a slightly larger maximum (the bound is met on the report's grid).
    expect(worst).toBeLessThanOrEqual(1.05 * Math.max(d.boundDb, d.errorDb));
  }
  expectPartsMatchCircuit(r);
}
