/**
 * Exact network functions of a circuit as RationalFunctions over Q: transfer functions and
 * driving-point impedances, from the MNA equations by fraction-free elimination over Z[s] (see
 * exact-solve.ts). Component values are the circuit's exact rationals; op-amp models enter as their
 * polynomial 1/A(s) (see netlist/opamp.ts for how GBW and A0 become rationals).
 *
 * @example
 * const c = new Circuit().addVoltageSource('VIN', 'in', '0').addResistor('R1', 'in', 'out', 1000).addCapacitor('C1', 'out', '0', '1e-6');
 * transferFunction(c, { input: 'VIN', output: 'out' }).toString(); // '(1000) / (s + 1000)'
 */
import { RationalFunction } from '../algebra/index';
import { assertTopology, SingularCircuitError, type Circuit } from '../netlist/index';
import { resolveImpedance, resolveTransfer, type MnaProblem, type TransferSpec } from './mna-system';
import { solveCombinationExact } from './exact-solve';

/**
 * V(output)/V(input) exactly (see {@link TransferSpec} for what input and output may name). Throws
 * InvalidInputError for unknown names and SingularCircuitError (code SINGULAR_CIRCUIT) when the
 * equations have no unique solution, with the topology findings when they explain it.
 */
export function transferFunction(circuit: Circuit, spec: TransferSpec): RationalFunction {
  assertTopology(circuit);
  const problem = resolveTransfer(circuit, spec);
  const out = solveOrThrow(problem, problem.output);
  if (!problem.reference) return out;
  const ref = solveOrThrow(problem, problem.reference);
  if (ref.isZero()) throw new SingularCircuitError('input', [], `the circuit's sources leave the input node '${spec.input}' at 0 V`);
  return out.div(ref);
}

/**
 * The impedance seen between nodePlus and nodeMinus (default ground) with every independent source
 * off (voltage sources shorted, current sources open): V(plus) - V(minus) per ampere injected.
 */
export function drivingPointImpedance(circuit: Circuit, nodePlus: string, nodeMinus = '0'): RationalFunction {
  const problem = resolveImpedance(circuit, nodePlus, nodeMinus);
  assertTopologyWithPort(circuit, nodePlus, nodeMinus);
  return solveOrThrow(problem, problem.output);
}

function solveOrThrow(problem: MnaProblem, combination: MnaProblem['output']): RationalFunction {
  const r = solveCombinationExact(problem, combination);
  if (r.ok) return r.value;
  throw new SingularCircuitError(
    'circuit',
    [],
    `the nodal equations are singular for every s (no pivot left for ${r.unpivoted.map((u) => `'${u}'`).join(', ')})`,
  );
}

/**
 * The topology check for an impedance: the test current source between the port nodes is part of the
 * circuit, so a port node with nothing else on it is not floating.
 */
function assertTopologyWithPort(circuit: Circuit, nodePlus: string, nodeMinus: string): void {
  try {
    assertTopology(circuit);
  } catch (e) {
    if (!(e instanceof SingularCircuitError)) throw e;
    const real = e.diagnostics.filter((d) => !(d.code === 'FLOATING_NODE' && d.nodes.every((n) => n === nodePlus || n === nodeMinus)));
    if (real.length > 0) throw new SingularCircuitError('circuit', real, real.map((d) => d.message).join('; '));
  }
}
