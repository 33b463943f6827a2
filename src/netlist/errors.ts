/**
 * The typed error of a circuit whose equations have no unique solution, with what the topology checks
 * found: the diagnostics, and the nodes and elements involved.
 */
import { GicladderError } from '../errors';
import type { TopologyDiagnostic } from './topology';

/** Code SINGULAR_CIRCUIT; `diagnostics` says why when the topology checks can tell. */
export class SingularCircuitError extends GicladderError {
  /** The error-level findings (may be empty when only the numbers are singular). */
  readonly diagnostics: readonly TopologyDiagnostic[];
  /** Every node named by the findings. */
  readonly nodes: readonly string[];
  /** Every element named by the findings. */
  readonly elements: readonly string[];

  constructor(path: string, diagnostics: readonly TopologyDiagnostic[], message: string) {
    const nodes = [...new Set(diagnostics.flatMap((d) => d.nodes))];
    const elements = [...new Set(diagnostics.flatMap((d) => d.elements))];
    super('SINGULAR_CIRCUIT', path, { codes: diagnostics.map((d) => d.code), nodes, elements }, message);
    this.diagnostics = diagnostics;
    this.nodes = nodes;
    this.elements = elements;
  }
}
