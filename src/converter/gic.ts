/**
 * The two-op-amp generalised impedance converter (GIC) of A. Antoniou, "Realisation of gyrators using
 * operational amplifiers, and their use in RC-active-network synthesis", Proc. IEE 116(11), 1969:
 * five impedances in a chain, node 1 the port, Z1 between nodes 1-2, Z2 2-3, Z3 3-4, Z4 4-5, Z5 from
 * 5 to ground; op-amp a drives node 2, op-amp b drives node 4. With ideal op-amps the input impedance is
 *
 *   Zin = Z1 Z3 Z5 / (Z2 Z4)                                                       (Antoniou, 1969)
 *
 * Derivation (ideal op-amps are nullors: V+ = V-, no input current): the two input pairs tie
 * V1 = V3 = V5 = V. KCL at node 5 gives V4 = V (1 + Z4/Z5); at node 3, (V2 - V)/Z2 = -(V4 - V)/Z3;
 * the port current is (V - V2)/Z1 = V Z2 Z4 / (Z1 Z3 Z5). Any two different input pairs from
 * {1, 3, 5} tie the same three nodes, so with ideal op-amps the result does not depend on `inputs`
 * (the polarity matters for stability with real op-amps).
 *
 * Non-ideal op-amps: {@link gicImpedance} hands the circuit to ./gic-nonideal, which builds the GIC as a
 * netlist and solves it by exact nodal analysis (src/analysis). The types GicImpedances, GicInputs and
 * DEFAULT_GIC_INPUTS are defined there and shared.
 */
import { ArithmeticError, InvalidInputError } from '../errors';
import { RationalFunction } from '../algebra/rational-function';
import { validateOpampModel, type OpampModel } from './opamp-model';
import { DEFAULT_GIC_INPUTS, gicImpedanceNonideal, type GicImpedances, type GicInputNode, type GicInputs } from './gic-nonideal';

export interface GicOptions {
  /** Default ideal; one model for both op-amps, or [a, b] when they differ. */
  opamps?: OpampModel | [OpampModel, OpampModel];
  /** Default: a + on 5, - on 3; b + on 1, - on 3 (DEFAULT_GIC_INPUTS). */
  inputs?: GicInputs;
}

export const GIC_POSITIONS = Object.freeze(['z1', 'z2', 'z3', 'z4', 'z5'] as const);
export type GicPosition = (typeof GIC_POSITIONS)[number];

/**
 * The input impedance of the GIC, exact. Validates its arguments (InvalidInputError with path 'z.z1'...
 * or 'options...'). Ideal op-amps (the default): {@link idealGicImpedance}, throwing ArithmeticError
 * 'DIVISION_BY_ZERO' when Z2 or Z4 is zero and InvalidInputError when both op-amps sense the same node
 * pair. Otherwise exact nodal analysis of the circuit with the op-amp models ({@link nonIdealGicImpedance}).
 *
 * @example
 * const r = resistorImpedance(1000);
 * gicImpedance({ z1: r, z2: r, z3: r, z4: capacitorImpedance('10n'), z5: r }).toString(); // '1/100*s' (10 mH)
 */
export function gicImpedance(z: GicImpedances, options: GicOptions = {}): RationalFunction {
  const zs = validateGicImpedances(z, 'z');
  if (typeof options !== 'object' || options === null) throw new InvalidInputError('INVALID_ARGUMENT', 'options', options, 'must be an object');
  const models = validateOpamps(options.opamps);
  const inputs = validateGicInputs(options.inputs ?? DEFAULT_GIC_INPUTS, 'options.inputs', models.every((m) => m.model === 'ideal'));
  if (models.every((m) => m.model === 'ideal')) return idealGicImpedance(zs);
  return nonIdealGicImpedance(zs, models, inputs);
}

/**
 * Zin = Z1 Z3 Z5 / (Z2 Z4) for ideal op-amps, exact and reduced. Throws ArithmeticError
 * 'DIVISION_BY_ZERO' when Z2 or Z4 is the zero function. Does not validate further (see gicImpedance).
 */
export function idealGicImpedance(z: GicImpedances): RationalFunction {
  if (z.z2.isZero()) throw new ArithmeticError('DIVISION_BY_ZERO', 'z.z2', '0', 'Z2 must not be a short');
  if (z.z4.isZero()) throw new ArithmeticError('DIVISION_BY_ZERO', 'z.z4', '0', 'Z4 must not be a short');
  return z.z1.mul(z.z3).mul(z.z5).div(z.z2.mul(z.z4)); // Eq.: Zin = Z1 Z3 Z5 / (Z2 Z4)
}

/**
 * The GIC with non-ideal op-amps, exact: delegates to the circuit engine's exact nodal analysis
 * (./gic-nonideal, gicImpedanceNonideal), which throws UnrealizableError for an impedance with no
 * R/L/C/FDNR element form and SingularCircuitError for a singular input assignment.
 */
export function nonIdealGicImpedance(z: GicImpedances, models: readonly [OpampModel, OpampModel], inputs: GicInputs): RationalFunction {
  return gicImpedanceNonideal(z, { opamps: [models[0], models[1]], inputs });
}

/** Checks the five impedances; returns them as a fresh record. */
export function validateGicImpedances(z: unknown, path: string): GicImpedances {
  if (typeof z !== 'object' || z === null) throw new InvalidInputError('INVALID_ARGUMENT', path, z, 'must be an object { z1, z2, z3, z4, z5 }');
  const r = z as Record<string, unknown>;
  for (const p of GIC_POSITIONS) {
    if (!(r[p] instanceof RationalFunction)) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.${p}`, r[p], 'must be a RationalFunction');
  }
  return { z1: r.z1, z2: r.z2, z3: r.z3, z4: r.z4, z5: r.z5 } as GicImpedances;
}

function validateOpamps(opamps: unknown): [OpampModel, OpampModel] {
  if (opamps === undefined) return [{ model: 'ideal' }, { model: 'ideal' }];
  if (Array.isArray(opamps)) {
    if (opamps.length !== 2) throw new InvalidInputError('INVALID_ARGUMENT', 'options.opamps', opamps, 'must be one model or a pair [a, b]');
    return [validateOpampModel(opamps[0], 'options.opamps[0]'), validateOpampModel(opamps[1], 'options.opamps[1]')];
  }
  const m = validateOpampModel(opamps, 'options.opamps');
  return [m, m];
}

/**
 * Checks op-amp input connections: each input on node 1, 3 or 5 and plus and minus different. With
 * `ideal` set, also the two op-amps on different node pairs: two nullators across the same pair leave
 * the third node undetermined (the circuit is singular). With finite gains that case may be solvable,
 * so it is left to the nodal analysis.
 */
export function validateGicInputs(inputs: unknown, path: string, ideal = true): GicInputs {
  if (typeof inputs !== 'object' || inputs === null) throw new InvalidInputError('INVALID_ARGUMENT', path, inputs, 'must be { a: { plus, minus }, b: { plus, minus } }');
  const r = inputs as Record<string, unknown>;
  const pair = (name: 'a' | 'b'): { plus: GicInputNode; minus: GicInputNode } => {
    const p = r[name];
    if (typeof p !== 'object' || p === null) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.${name}`, p, 'must be { plus, minus }');
    const q = p as Record<string, unknown>;
    for (const k of ['plus', 'minus'] as const) {
      if (q[k] !== 1 && q[k] !== 3 && q[k] !== 5) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.${name}.${k}`, q[k], 'must be node 1, 3 or 5');
    }
    if (q.plus === q.minus) throw new InvalidInputError('INVALID_ARGUMENT', `${path}.${name}`, p, 'plus and minus must be different nodes');
    return { plus: q.plus as GicInputNode, minus: q.minus as GicInputNode };
  };
  const a = pair('a');
  const b = pair('b');
  const same = (a.plus === b.plus && a.minus === b.minus) || (a.plus === b.minus && a.minus === b.plus);
  if (same && ideal) throw new InvalidInputError('INVALID_ARGUMENT', path, inputs, 'both op-amps sense the same node pair; the circuit would be singular');
  return { a, b };
}
