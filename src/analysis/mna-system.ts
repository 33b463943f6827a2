/**
 * Assembles the modified-nodal-analysis description of a circuit from its elements' stamps (Ho,
 * Ruehli and Brennan, IEEE Trans. CAS-22(6), 1975), and resolves which excitation and which output an
 * analysis asks for. Both the exact analysis and the compiled float engine start from this one
 * description, so they solve the same equations.
 *
 * Unknowns: the circuit's non-ground nodes in order of first use, then the branch currents in the order
 * the elements were stamped. KCL rows read "current leaving the node through the elements = current
 * injected by independent sources".
 */
import { Fraction, Q0, toFraction } from '../algebra/index';
import { InvalidInputError } from '../errors';
import { GROUND, isGround, type Circuit, type ParameterFactor, type StampContext } from '../netlist/index';

/** One matrix term: coefficient * prod(parameter^exponent) * s^sPower at (row, col). */
export interface MnaTerm {
  readonly row: number;
  readonly col: number;
  readonly sPower: number;
  readonly coefficient: number;
  readonly factors: readonly ParameterFactor[];
}

/** An independent source's unit excitation: `coefficient` in the right-hand side at `row`. */
export interface MnaExcitation {
  readonly element: string;
  readonly row: number;
  readonly coefficient: number;
  /** The parameter slot of the source's amplitude. */
  readonly valueSlot: number | undefined;
}

export interface MnaSystem {
  /** Number of unknowns. */
  readonly size: number;
  /** Node names for node unknowns, `${element}#${label}` for branch currents. */
  readonly unknowns: readonly string[];
  /** Number of node unknowns (they come first). */
  readonly nodeCount: number;
  readonly nodeIndex: ReadonlyMap<string, number>;
  readonly terms: readonly MnaTerm[];
  readonly parameterNames: readonly string[];
  readonly parameterValues: readonly Fraction[];
  readonly parameterIndex: ReadonlyMap<string, number>;
  readonly excitations: readonly MnaExcitation[];
}

/** Stamps every element of the circuit. */
export function buildMnaSystem(circuit: Circuit): MnaSystem {
  const nodeIndex = new Map<string, number>();
  circuit.nodes.forEach((n, i) => nodeIndex.set(n, i));
  const unknowns: string[] = [...circuit.nodes];
  const terms: MnaTerm[] = [];
  const parameterNames: string[] = [];
  const parameterValues: Fraction[] = [];
  const parameterIndex = new Map<string, number>();
  const excitations: MnaExcitation[] = [];
  let current = '';
  const ctx: StampContext = {
    node(name) {
      if (isGround(name)) return GROUND;
      const i = nodeIndex.get(name);
      if (i === undefined) throw new InvalidInputError('INVALID_ARGUMENT', `${current}.node`, name, 'is not a node of the circuit');
      return i;
    },
    branch(label) {
      unknowns.push(`${current}#${label}`);
      return unknowns.length - 1;
    },
    parameter(label, value) {
      const name = label === '' ? current : `${current}.${label}`;
      const existing = parameterIndex.get(name);
      if (existing !== undefined) return existing;
      parameterNames.push(name);
      parameterValues.push(toFraction(value, name));
      parameterIndex.set(name, parameterNames.length - 1);
      return parameterNames.length - 1;
    },
    entry(row, col, sPower, coefficient, factors = []) {
      if (row === GROUND || col === GROUND || coefficient === 0) return;
      terms.push({ row, col, sPower, coefficient, factors });
    },
    admittance(a, b, sPower, coefficient, factors = []) {
      this.entry(a, a, sPower, coefficient, factors);
      this.entry(b, b, sPower, coefficient, factors);
      this.entry(a, b, sPower, -coefficient, factors);
      this.entry(b, a, sPower, -coefficient, factors);
    },
    excitation(row, coefficient, valueSlot) {
      if (row === GROUND) return;
      excitations.push({ element: current, row, coefficient, valueSlot });
    },
  };
  for (const e of circuit.elements) {
    current = e.name;
    e.stamp(ctx);
  }
  return {
    size: unknowns.length,
    unknowns,
    nodeCount: circuit.nodes.length,
    nodeIndex,
    terms,
    parameterNames,
    parameterValues,
    parameterIndex,
    excitations,
  };
}

/** An output: a node voltage, or the difference V(plus) - V(minus). */
export type OutputSpec = string | { readonly plus: string; readonly minus: string };

/** What to excite and what to observe. */
export interface TransferSpec {
  /**
   * A source name: that source with unit amplitude, every other independent source off; the result is
   * V(out) per volt (or per ampere for a current source). A node name: the ratio V(out)/V(node) with
   * the circuit's own sources at their amplitudes, or, if it has none, driven by a 1 V source from the
   * node to ground.
   */
  readonly input: string;
  readonly output: OutputSpec;
}

/** A linear combination of unknowns, as (index, weight) pairs; empty for ground. */
export type Combination = readonly { readonly index: number; readonly weight: number }[];

/** The resolved problem: the right-hand side, the observed combination, and a reference for ratios. */
export interface MnaProblem {
  readonly system: MnaSystem;
  /** Right-hand side entries (row, exact value). */
  readonly rhs: readonly { readonly row: number; readonly value: Fraction }[];
  readonly output: Combination;
  /** When set, the result is output / reference (node-input mode with the circuit's own sources). */
  readonly reference: Combination | null;
}

/** Resolves a {@link TransferSpec}; throws InvalidInputError for unknown names. */
export function resolveTransfer(circuit: Circuit, spec: TransferSpec): MnaProblem {
  if (typeof spec !== 'object' || spec === null) throw new InvalidInputError('INVALID_ARGUMENT', 'spec', spec, 'must be { input, output }');
  const base = buildMnaSystem(circuit);
  const output = resolveOutput(base, spec.output, 'output');
  const el = circuit.element(spec.input);
  if (el && (el.kind === 'V' || el.kind === 'I')) {
    const rhs = base.excitations.filter((x) => x.element === el.name).map((x) => ({ row: x.row, value: toFraction(x.coefficient) }));
    return { system: base, rhs, output, reference: null };
  }
  if (typeof spec.input !== 'string' || !circuit.hasNode(spec.input) || isGround(spec.input)) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'input', spec.input, 'is neither an independent source nor a non-ground node');
  }
  const inNode = base.nodeIndex.get(spec.input)!;
  if (base.excitations.length > 0) {
    const rhs = base.excitations.map((x) => ({
      row: x.row,
      value: x.valueSlot === undefined ? toFraction(x.coefficient) : toFraction(x.coefficient).mul(base.parameterValues[x.valueSlot]),
    }));
    return { system: base, rhs: mergeRhs(rhs), output, reference: [{ index: inNode, weight: 1 }] };
  }
  // No source: drive the input node with a 1 V source to ground (an extra branch unknown).
  const k = base.size;
  const system: MnaSystem = {
    ...base,
    size: k + 1,
    unknowns: [...base.unknowns, `${spec.input}#drive`],
    terms: [...base.terms, { row: inNode, col: k, sPower: 0, coefficient: 1, factors: [] }, { row: k, col: inNode, sPower: 0, coefficient: 1, factors: [] }],
  };
  return { system, rhs: [{ row: k, value: new Fraction(1) }], output, reference: null };
}

/**
 * The driving-point problem: 1 A injected into nodePlus and drawn from nodeMinus, every independent
 * source off (voltage sources shorted, current sources open); observe V(plus) - V(minus).
 */
export function resolveImpedance(circuit: Circuit, nodePlus: string, nodeMinus: string): MnaProblem {
  const system = buildMnaSystem(circuit);
  const output = resolveOutput(system, { plus: nodePlus, minus: nodeMinus }, 'node');
  if (canonical(nodePlus) === canonical(nodeMinus)) throw new InvalidInputError('INVALID_ARGUMENT', 'nodeMinus', nodeMinus, 'must differ from nodePlus');
  const rhs: { row: number; value: Fraction }[] = [];
  const p = isGround(nodePlus) ? GROUND : system.nodeIndex.get(nodePlus)!;
  const m = isGround(nodeMinus) ? GROUND : system.nodeIndex.get(nodeMinus)!;
  if (p !== GROUND) rhs.push({ row: p, value: new Fraction(1) });
  if (m !== GROUND) rhs.push({ row: m, value: new Fraction(-1) });
  return { system, rhs, output, reference: null };
}

function canonical(n: string): string {
  return isGround(n) ? '0' : n;
}

function resolveOutput(system: MnaSystem, out: OutputSpec, path: string): Combination {
  const one = (n: unknown, p: string): number => {
    if (typeof n !== 'string') throw new InvalidInputError('INVALID_ARGUMENT', p, n, 'must be a node name');
    if (isGround(n)) return GROUND;
    const i = system.nodeIndex.get(n);
    if (i === undefined) throw new InvalidInputError('INVALID_ARGUMENT', p, n, 'is not a node of the circuit');
    return i;
  };
  const combo: { index: number; weight: number }[] = [];
  if (typeof out === 'object' && out !== null) {
    const a = one(out.plus, `${path}.plus`);
    const b = one(out.minus, `${path}.minus`);
    if (a !== GROUND) combo.push({ index: a, weight: 1 });
    if (b !== GROUND && b !== a) combo.push({ index: b, weight: -1 });
    if (a === b) combo.length = 0;
  } else {
    const a = one(out, path);
    if (a !== GROUND) combo.push({ index: a, weight: 1 });
  }
  return combo;
}

function mergeRhs(rhs: readonly { row: number; value: Fraction }[]): { row: number; value: Fraction }[] {
  const m = new Map<number, Fraction>();
  for (const r of rhs) m.set(r.row, (m.get(r.row) ?? Q0).add(r.value));
  return [...m.entries()].filter(([, v]) => v.n !== 0n).map(([row, value]) => ({ row, value }));
}
