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
import { assertTopology, checkTopology, SingularCircuitError, type Circuit, type TopologyDiagnostic } from '../netlist/index';
import { resolveImpedance, resolveTransfer, type MnaProblem, type TransferSpec } from './mna-system';
import { eliminateExact, solveCombinationExact } from './exact-solve';
import { reduceToRational } from './reduce-rational';
import type { IntPoly } from './int-poly';

/**
 * V(output)/V(input) exactly (see {@link TransferSpec} for what input and output may name). Throws
 * InvalidInputError for unknown names and SingularCircuitError (code SINGULAR_CIRCUIT) when the
 * equations have no unique solution, with the topology findings when they explain it.
 */
export function transferFunction(circuit: Circuit, spec: TransferSpec): RationalFunction {
  assertTopology(circuit);
  const problem = resolveTransfer(circuit, spec);
  if (!problem.reference) return solveOrThrow(problem, problem.output);
  // V(out)/V(in) = (N1/D1)/(N2/D2). Both denominators are the last Bareiss pivot, the determinant of
  // the same row-scaled matrix up to sign, so D2/D1 is a constant and H = N1 (D2/D1) / N2: one
  // reduction of two polynomials, not a division of rational functions (whose gcd would be D).
  const out = eliminateOrThrow(problem, problem.output);
  const ref = eliminateOrThrow(problem, problem.reference);
  if (ref.num.length === 0) throw new SingularCircuitError('input', [], `the circuit's sources leave the input node '${spec.input}' at 0 V`);
  if (out.num.length === 0) return RationalFunction.ZERO;
  const l1 = out.den[out.den.length - 1];
  const l2 = ref.den[ref.den.length - 1];
  const proportional = out.den.length === ref.den.length && out.den.every((c, i) => c * l2 === ref.den[i] * l1);
  if (proportional) return reduceToRational(out.num.map((c) => c * l2), ref.num.map((c) => c * l1));
  return reduceToRational(out.num, out.den).div(reduceToRational(ref.num, ref.den));
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

function eliminateOrThrow(problem: MnaProblem, combination: MnaProblem['output']): { num: IntPoly; den: IntPoly } {
  const r = eliminateExact(problem, combination);
  if (r.ok) return r;
  throw new SingularCircuitError(
    'circuit',
    [],
    `the nodal equations are singular for every s (no pivot left for ${r.unpivoted.map((u) => `'${u}'`).join(', ')})`,
  );
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
 * circuit, so a port node with nothing else on it is not floating. Returns the warnings.
 */
export function assertTopologyWithPort(circuit: Circuit, nodePlus: string, nodeMinus: string): readonly TopologyDiagnostic[] {
  const r = checkTopology(circuit);
  const errors = r.diagnostics.filter(
    (d) => d.severity === 'error' && !(d.code === 'FLOATING_NODE' && d.nodes.every((n) => n === nodePlus || n === nodeMinus)),
  );
  if (errors.length > 0) throw new SingularCircuitError('circuit', errors, errors.map((d) => d.message).join('; '));
  return r.diagnostics.filter((d) => d.severity === 'warning');
}
