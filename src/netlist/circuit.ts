/**
 * The circuit builder: named nodes, named elements with exact values, and subcircuit instances.
 *
 * Nodes are strings; '0' and 'gnd' (any case) are ground, stored as '0'. Values accept a finite number
 * (taken exactly: every double is a rational), a decimal or a/b string ('4.7e-9', '1/3'), a bigint or a
 * Fraction. Names must be unique; subcircuit instances prefix their internal nodes and elements with
 * `${instance}.` ('X1.n2', 'X1.R1').
 *
 * @example
 * const c = new Circuit()
 *   .addVoltageSource('VIN', 'in', '0')
 *   .addResistor('R1', 'in', 'out', '1000')
 *   .addCapacitor('C1', 'out', '0', '1e-6');
 */
import { Fraction, toFraction, type RationalLike } from '../algebra/index';
import { InvalidInputError } from '../errors';
import {
  Capacitor,
  CurrentSource,
  Fdnr,
  GROUND_NAME,
  Inductor,
  Opamp,
  Resistor,
  Vccs,
  Vcvs,
  VoltageSource,
  type CircuitElement,
  type NodeMap,
} from './elements';
import { IDEAL_OPAMP, validateOpampModel, type OpampModel } from './opamp';

/** True for the names that mean ground. */
export function isGround(node: string): boolean {
  return node === GROUND_NAME || node.toLowerCase() === 'gnd';
}

/** The canonical spelling of a node name (ground becomes '0'). */
export function canonicalNode(node: string): string {
  return isGround(node) ? GROUND_NAME : node;
}

/** The op-amp's terminals. */
export interface OpampTerminals {
  readonly plus: string;
  readonly minus: string;
  readonly out: string;
}

/** A circuit under construction or analysis. Builder methods return `this` for chaining. */
export class Circuit {
  private readonly list: CircuitElement[] = [];
  private readonly byName = new Map<string, CircuitElement>();
  private readonly nodeOrder: string[] = [];
  private readonly nodeSet = new Set<string>();

  /** The elements in the order they were added (subcircuit contents in place of the instance). */
  get elements(): readonly CircuitElement[] {
    return this.list;
  }

  /** Every non-ground node, in order of first use. */
  get nodes(): readonly string[] {
    return this.nodeOrder;
  }

  /** The element called `name`, or undefined. */
  element(name: string): CircuitElement | undefined {
    return this.byName.get(name);
  }

  /** True if the circuit uses the (non-ground) node. Ground always exists. */
  hasNode(node: string): boolean {
    return isGround(node) || this.nodeSet.has(node);
  }

  addResistor(name: string, a: string, b: string, ohms: RationalLike): this {
    return this.add(new Resistor(this.checkName(name), this.n(a, name), this.n(b, name), positive(ohms, `${name}.ohms`)));
  }

  addCapacitor(name: string, a: string, b: string, farads: RationalLike): this {
    return this.add(new Capacitor(this.checkName(name), this.n(a, name), this.n(b, name), positive(farads, `${name}.farads`)));
  }

  addInductor(name: string, a: string, b: string, henries: RationalLike): this {
    return this.add(new Inductor(this.checkName(name), this.n(a, name), this.n(b, name), positive(henries, `${name}.henries`)));
  }

  /** An FDNR (D element) with Z = 1/(s^2 D), D in F*s. */
  addFdnr(name: string, a: string, b: string, d: RationalLike): this {
    return this.add(new Fdnr(this.checkName(name), this.n(a, name), this.n(b, name), positive(d, `${name}.d`)));
  }

  /** V(plus) - V(minus) = volts (the AC amplitude; transfer functions use a unit excitation). */
  addVoltageSource(name: string, plus: string, minus: string, volts: RationalLike = 1): this {
    return this.add(new VoltageSource(this.checkName(name), this.n(plus, name), this.n(minus, name), toFraction(volts, `${name}.volts`)));
  }

  /** A current `amps` flowing from `from` through the source to `to` (SPICE: I from to). */
  addCurrentSource(name: string, from: string, to: string, amps: RationalLike = 1): this {
    return this.add(new CurrentSource(this.checkName(name), this.n(from, name), this.n(to, name), toFraction(amps, `${name}.amps`)));
  }

  /** V(outPlus) - V(outMinus) = gain * (V(controlPlus) - V(controlMinus)). */
  addVcvs(name: string, outPlus: string, outMinus: string, controlPlus: string, controlMinus: string, gain: RationalLike): this {
    return this.add(
      new Vcvs(
        this.checkName(name),
        this.n(outPlus, name),
        this.n(outMinus, name),
        this.n(controlPlus, name),
        this.n(controlMinus, name),
        toFraction(gain, `${name}.gain`),
      ),
    );
  }

  /** A current gm * (V(controlPlus) - V(controlMinus)) from outPlus through the source to outMinus. */
  addVccs(name: string, outPlus: string, outMinus: string, controlPlus: string, controlMinus: string, siemens: RationalLike): this {
    return this.add(
      new Vccs(
        this.checkName(name),
        this.n(outPlus, name),
        this.n(outMinus, name),
        this.n(controlPlus, name),
        this.n(controlMinus, name),
        toFraction(siemens, `${name}.siemens`),
      ),
    );
  }

  /** An op-amp (output referred to ground); ideal (nullor) unless a model is given. */
  addOpamp(name: string, terminals: OpampTerminals, model: OpampModel = IDEAL_OPAMP): this {
    if (typeof terminals !== 'object' || terminals === null) {
      throw new InvalidInputError('INVALID_ARGUMENT', `${name}.terminals`, terminals, 'must be { plus, minus, out }');
    }
    validateOpampModel(model, `${name}.model`);
    return this.add(
      new Opamp(this.checkName(name), this.n(terminals.plus, name), this.n(terminals.minus, name), this.n(terminals.out, name), model),
    );
  }

  /**
   * Instantiates a subcircuit: its ports connect to `ports[portName]` of this circuit, its other nodes
   * become `${instanceName}.${node}`, its elements `${instanceName}.${element}`. Ground stays ground.
   */
  addSubcircuit(definition: Subcircuit, instanceName: string, ports: Readonly<Record<string, string>>): this {
    if (typeof instanceName !== 'string' || instanceName.length === 0 || instanceName.includes(' ')) {
      throw new InvalidInputError('INVALID_ARGUMENT', 'instanceName', instanceName, 'must be a non-empty name without spaces');
    }
    for (const p of definition.ports) {
      if (!(p in ports)) throw new InvalidInputError('INVALID_ARGUMENT', `${instanceName}.ports.${p}`, ports, `port '${p}' is not connected`);
    }
    for (const p of Object.keys(ports)) {
      if (!definition.ports.includes(p)) throw new InvalidInputError('INVALID_ARGUMENT', `${instanceName}.ports.${p}`, p, 'is not a port of the subcircuit');
    }
    const outer = new Map<string, string>();
    for (const p of definition.ports) outer.set(p, this.n(ports[p], instanceName));
    const map: NodeMap = (node) => (isGround(node) ? GROUND_NAME : outer.get(node) ?? `${instanceName}.${node}`);
    for (const e of definition.elements) {
      const copy = e.renamed(`${instanceName}.${e.name}`, map);
      this.checkName(copy.name);
      for (const node of copy.nodes) this.n(node, copy.name);
      this.add(copy);
    }
    return this;
  }

  /**
   * A new circuit with some elements' main values replaced (R ohms, C farads, L henries, FDNR D, source
   * amplitudes, E gain, G transconductance) and some op-amps' models; everything else is shared.
   * Throws InvalidInputError for an unknown name or a value the element does not accept.
   */
  withValues(values: Readonly<Record<string, RationalLike>>, opampModels: Readonly<Record<string, OpampModel>> = {}): Circuit {
    for (const name of [...Object.keys(values), ...Object.keys(opampModels)]) {
      if (!this.byName.has(name)) throw new InvalidInputError('INVALID_ARGUMENT', `values.${name}`, name, 'is not an element of the circuit');
    }
    const out = new Circuit();
    for (const e of this.list) {
      let copy: CircuitElement = e;
      if (e.name in values) {
        const path = `values.${e.name}`;
        if (e.kind === 'OPAMP') throw new InvalidInputError('INVALID_ARGUMENT', path, values[e.name], 'op-amps take a model (opampModels), not a value');
        const passive = e.kind === 'R' || e.kind === 'C' || e.kind === 'L' || e.kind === 'D';
        copy = e.withValue(passive ? positive(values[e.name], path) : toFraction(values[e.name], path));
      }
      if (e.name in opampModels) {
        if (e.kind !== 'OPAMP') throw new InvalidInputError('INVALID_ARGUMENT', `opampModels.${e.name}`, e.name, 'is not an op-amp');
        copy = e.withModel(validateOpampModel(opampModels[e.name], `opampModels.${e.name}`));
      }
      for (const node of copy.nodes) out.n(node, copy.name);
      out.add(copy);
    }
    return out;
  }

  private add(e: CircuitElement): this {
    this.list.push(e);
    this.byName.set(e.name, e);
    return this;
  }

  private checkName(name: string): string {
    if (typeof name !== 'string' || name.length === 0 || /\s/.test(name)) {
      throw new InvalidInputError('INVALID_ARGUMENT', 'name', name, 'element names must be non-empty without whitespace');
    }
    if (this.byName.has(name)) throw new InvalidInputError('INVALID_ARGUMENT', 'name', name, 'is already used by another element');
    return name;
  }

  private n(node: string, element: string): string {
    if (typeof node !== 'string' || node.length === 0 || /\s/.test(node)) {
      throw new InvalidInputError('INVALID_ARGUMENT', `${element}.node`, node, 'node names must be non-empty without whitespace');
    }
    const c = canonicalNode(node);
    if (c !== GROUND_NAME && !this.nodeSet.has(c)) {
      this.nodeSet.add(c);
      this.nodeOrder.push(c);
    }
    return c;
  }
}

/**
 * A reusable circuit block with named ports (e.g. a GIC). Build it like a circuit; nodes not in
 * `ports` (and not ground) are internal and get a per-instance prefix.
 */
export class Subcircuit extends Circuit {
  readonly ports: readonly string[];

  constructor(
    readonly name: string,
    ports: readonly string[],
  ) {
    super();
    if (!Array.isArray(ports) || ports.some((p) => typeof p !== 'string' || isGround(p))) {
      throw new InvalidInputError('INVALID_ARGUMENT', `${name}.ports`, ports, 'must be non-ground node names');
    }
    if (new Set(ports).size !== ports.length) throw new InvalidInputError('INVALID_ARGUMENT', `${name}.ports`, ports, 'has duplicates');
    this.ports = Object.freeze([...ports]);
  }
}

function positive(x: RationalLike, path: string): Fraction {
  const f = toFraction(x, path);
  if (f.s <= 0n || f.n === 0n) throw new InvalidInputError('OUT_OF_RANGE', path, x, 'must be greater than zero');
  return f;
}
