/**
 * A plain-data copy of a circuit (structured-cloneable: strings and plain objects only), so that a
 * circuit can be sent to a worker thread and rebuilt there exactly, and so that tests can rebuild a
 * circuit with one value changed. Values travel as exact "n/d" strings.
 */
import { Fraction, toFraction } from '../algebra/index';
import { InvalidInputError } from '../errors';
import { Circuit, type OpampModel } from '../netlist/index';

/** One element as data. `nodes` in the element's own order (a, b / out+, out-, ctrl+, ctrl- / +, -, out). */
export interface CircuitElementJson {
  readonly kind: 'R' | 'C' | 'L' | 'D' | 'V' | 'I' | 'E' | 'G' | 'OPAMP';
  readonly name: string;
  readonly nodes: readonly string[];
  /** Exact value as "n/d" (absent for op-amps). */
  readonly value?: string;
  readonly model?: OpampModel;
}

export interface CircuitJson {
  readonly elements: readonly CircuitElementJson[];
}

function exact(f: Fraction): string {
  return `${f.s * f.n}/${f.d}`;
}

/** The circuit as plain data. */
export function circuitToJson(circuit: Circuit): CircuitJson {
  return {
    elements: circuit.elements.map((e): CircuitElementJson => {
      switch (e.kind) {
        case 'R':
          return { kind: e.kind, name: e.name, nodes: [e.a, e.b], value: exact(e.ohms) };
        case 'C':
          return { kind: e.kind, name: e.name, nodes: [e.a, e.b], value: exact(e.farads) };
        case 'L':
          return { kind: e.kind, name: e.name, nodes: [e.a, e.b], value: exact(e.henries) };
        case 'D':
          return { kind: e.kind, name: e.name, nodes: [e.a, e.b], value: exact(e.d) };
        case 'V':
          return { kind: e.kind, name: e.name, nodes: [e.a, e.b], value: exact(e.volts) };
        case 'I':
          return { kind: e.kind, name: e.name, nodes: [e.a, e.b], value: exact(e.amps) };
        case 'E':
          return { kind: e.kind, name: e.name, nodes: e.nodes, value: exact(e.gain) };
        case 'G':
          return { kind: e.kind, name: e.name, nodes: e.nodes, value: exact(e.transconductance) };
        case 'OPAMP':
          return { kind: e.kind, name: e.name, nodes: [e.plus, e.minus, e.out], model: { ...e.model } };
      }
    }),
  };
}

/**
 * Rebuilds a circuit from {@link circuitToJson}'s data; `overrides` replaces exact values of named
 * elements (R, C, L, D, sources, controlled sources).
 */
export function circuitFromJson(json: CircuitJson, overrides: ReadonlyMap<string, Fraction> = new Map()): Circuit {
  if (typeof json !== 'object' || json === null || !Array.isArray(json.elements)) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'json.elements', json, 'must be an array of elements');
  }
  const c = new Circuit();
  for (const e of json.elements) {
    const v = overrides.get(e.name) ?? (e.value === undefined ? undefined : toFraction(e.value, `${e.name}.value`));
    const [a, b, p, q] = e.nodes;
    switch (e.kind) {
      case 'R':
        c.addResistor(e.name, a, b, v!);
        break;
      case 'C':
        c.addCapacitor(e.name, a, b, v!);
        break;
      case 'L':
        c.addInductor(e.name, a, b, v!);
        break;
      case 'D':
        c.addFdnr(e.name, a, b, v!);
        break;
      case 'V':
        c.addVoltageSource(e.name, a, b, v!);
        break;
      case 'I':
        c.addCurrentSource(e.name, a, b, v!);
        break;
      case 'E':
        c.addVcvs(e.name, a, b, p, q, v!);
        break;
      case 'G':
        c.addVccs(e.name, a, b, p, q, v!);
        break;
      case 'OPAMP':
        c.addOpamp(e.name, { plus: a, minus: b, out: p }, e.model!);
        break;
      default:
        throw new InvalidInputError('INVALID_ARGUMENT', `json.elements.${(e as { name: string }).name}.kind`, (e as { kind: unknown }).kind, 'is not an element kind');
    }
  }
  return c;
}

/** A copy of the circuit with some exact values replaced (sensitivity checks, corner analysis). */
export function withValues(circuit: Circuit, overrides: ReadonlyMap<string, Fraction>): Circuit {
  return circuitFromJson(circuitToJson(circuit), overrides);
}
