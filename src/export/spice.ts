/**
 * SPICE netlist export: ngspice-compatible text of a {@link Circuit}, so anyone can simulate the
 * realised filter with their own analysis cards.
 *
 * What is written:
 * - `VIN in 0 DC 0 AC 1` drives the input node, always called `in`; the output node is called `out`
 *   (DESIGN.md, "The design file"). A voltage source already in the circuit from the input node to
 *   ground becomes VIN (with its amplitude as the AC value); otherwise VIN is added.
 * - R, C, L, independent V and I sources, E (VCVS) and G (VCCS) one to one; element cards use SPICE's
 *   own sign conventions, which the netlist stage follows.
 * - An FDNR (Y = s^2 D, which SPICE has no element for) as an exact linear equivalent: a VCCS of 1 S
 *   into a 1 H inductor gives s V; a second one into an inductor of D henries gives s^2 D V; a third VCCS
 *   draws that as current from the FDNR's terminals. Linear, no behavioural source, no approximation.
 * - One `.subckt` per op-amp model used (terminals `inp inn out`, output referred to ground), each the
 *   model's 1/A(s) = 1/A0 + s/wt (...) written as currents into a node: a VCCS of 1 S driving a
 *   conductance 1/A0 in parallel with a capacitance 1/wt makes V = A(s) (V+ - V-) exactly, then a unity
 *   VCVS buffers it. The ideal op-amp (nullor) is exact too, with two linear VCVS: `E2 y 0 inn inp 1`
 *   and `E1 out 0 out y 1`; E1's branch row reads V(out) = V(out) + V(inn) - V(inp), i.e. V+ = V-, and
 *   its branch current is free: the nullator/norator pair, without a large-gain approximation.
 * - An `.ac dec` card and `.end`.
 *
 * The integrator model and FDNRs have no DC operating point of their own (a capacitor or an inductor
 * alone on a node), so simulate with `option noopac` (ngspice skips the operating point of linear
 * circuits) or add your own DC paths; a comment in the netlist says so.
 *
 * Determinism and safety: element and node order is the circuit's; every number is JavaScript's
 * shortest round-trip form in exponent notation (`4.7e-9`, `1e+3`), never an SI suffix (SPICE reads
 * `1M` as milli); names are sanitised to [A-Za-z0-9_] and made unique without regard to case (SPICE is
 * case-insensitive), so no user text can start a card, a comment or a new line.
 */
import type { Circuit } from '../netlist/circuit';
import type { CircuitElement } from '../netlist/elements';
import type { OpampModel } from '../netlist/opamp';
import { opampParameters, validateOpampModel } from '../netlist/opamp';
import { fractionToNumber, type Fraction } from '../algebra/index';
import { InvalidInputError, requireInteger, requirePositive, UnrealizableError } from '../errors';

/** A logarithmic AC sweep: `.ac dec pointsPerDecade startHz stopHz`. */
export interface SpiceAcSweep {
  readonly pointsPerDecade: number;
  readonly startHz: number;
  readonly stopHz: number;
}

export interface CircuitToSpiceOptions {
  /** The first line of the netlist (SPICE ignores it); sanitised to one printable line. */
  readonly title?: string;
  /** The circuit node driven by VIN (written as `in`). Default: the circuit's node `in`. */
  readonly input?: string;
  /** The circuit node written as `out`. Default: the circuit's node `out`. */
  readonly output?: string;
  /** The `.ac` card. Default {@link DEFAULT_AC_SWEEP}. */
  readonly acSweep?: SpiceAcSweep;
  /** How to write FDNR (D) elements: `'equivalent'` (default, exact linear controlled sources) or `'refuse'`. */
  readonly fdnr?: 'equivalent' | 'refuse';
}

/** 20 points per decade from 1 Hz to 1 MHz: the audio and low-RF range the GIC filters target. */
export const DEFAULT_AC_SWEEP: SpiceAcSweep = Object.freeze({ pointsPerDecade: 20, startHz: 1, stopHz: 1e6 });

/** ngspice accepts up to this many points per decade without complaint; more is never useful for a filter plot. */
const MAX_POINTS_PER_DECADE = 100_000;
/** Titles longer than this are cut: one readable line in any editor. */
const MAX_TITLE_LENGTH = 100;

/**
 * A number as SPICE text that parses back to the same double: JavaScript's shortest round-trip digits
 * in exponent form. Never an SI suffix. Non-finite values are a caller bug (the circuit stores exact
 * finite rationals), so they throw.
 */
export function formatSpiceNumber(x: number): string {
  if (!Number.isFinite(x)) throw new InvalidInputError('INVALID_NUMBER', 'value', x, 'SPICE values must be finite');
  if (x === 0) return '0';
  return x.toExponential(); // Shortest digits that round-trip (ECMA-262 Number.prototype.toExponential with undefined digits).
}

/** An exact rational component value as SPICE text: its nearest double, correctly rounded. */
function formatValue(f: Fraction): string {
  return formatSpiceNumber(fractionToNumber(f));
}

/** Allocates SPICE names: sanitised, unique without regard to case, some reserved. */
class NameTable {
  private readonly taken = new Set<string>();
  constructor(reserved: readonly string[]) {
    for (const r of reserved) this.taken.add(r.toLowerCase());
  }
  /** A fresh name from `wanted` (characters outside [A-Za-z0-9_] become '_'), with `_2`, `_3`... if taken. */
  allocate(wanted: string): string {
    const base = sanitiseSpiceName(wanted);
    let name = base;
    for (let k = 2; this.taken.has(name.toLowerCase()); k++) name = `${base}_${k}`;
    this.taken.add(name.toLowerCase());
    return name;
  }
}

/** Replaces every character outside [A-Za-z0-9_] by '_'; an empty name becomes '_'. */
export function sanitiseSpiceName(text: string): string {
  const s = String(text).replace(/[^A-Za-z0-9_]/g, '_');
  return s.length > 0 ? s : '_';
}

/**
 * One printable line: control characters and newlines become spaces, and it starts with a letter or a
 * digit (ngspice warns about, and rewrites, a title line that starts with '"', '*', '.' or other
 * punctuation).
 */
function sanitiseTitle(text: string): string {
  const oneLine = String(text)
    .replace(/[^\x20-\x7e]/g, ' ')
    .replace(/\s+/g, ' ')
    .trim()
    .replace(/^[^A-Za-z0-9]+/, '');
  return (oneLine.length > 0 ? oneLine : 'gicladder netlist').slice(0, MAX_TITLE_LENGTH);
}

/** The SPICE element letter of an element name. */
function elementName(names: NameTable, letter: string, name: string): string {
  const s = sanitiseSpiceName(name);
  return names.allocate(s[0].toUpperCase() === letter ? s : `${letter}_${s}`);
}

/** A stable key of an op-amp model's parameters, so equal models share one subcircuit. */
function modelKey(model: OpampModel): string {
  const p = opampParameters(model);
  const part = (f: Fraction | undefined) => (f ? f.toFraction() : '-');
  return `${model.model}|${part(p.openLoopGain)}|${part(p.unityGainRadPerS)}|${part(p.secondPoleRadPerS)}`;
}

/** The `.subckt` text of an op-amp model (terminals inp inn out). See the module comment. */
function opampSubcircuit(name: string, model: OpampModel): string[] {
  const p = opampParameters(model);
  const lines = [`* op-amp model: ${describeModel(model)}`, `.subckt ${name} inp inn out`];
  switch (model.model) {
    case 'ideal':
      lines.push('* nullor: V(inp) = V(inn), free output current (exact, no large gain)');
      lines.push('E2 y 0 inn inp 1', 'E1 out 0 out y 1');
      break;
    case 'finite-gain':
      lines.push(`E1 out 0 inp inn ${formatValue(p.openLoopGain!)}`);
      break;
    case 'integrator':
      // 1 S into C = 1/wt: V(x) = (wt/s) (V+ - V-)
      lines.push('G1 0 x inp inn 1', `C1 x 0 ${formatSpiceNumber(1 / fractionToNumber(p.unityGainRadPerS!))}`, 'E1 out 0 x 0 1');
      break;
    case 'single-pole':
      // 1 S into R = A0 || C = 1/wt: V(x) = (V+ - V-) / (1/A0 + s/wt)
      lines.push(
        'G1 0 x inp inn 1',
        `R1 x 0 ${formatValue(p.openLoopGain!)}`,
        `C1 x 0 ${formatSpiceNumber(1 / fractionToNumber(p.unityGainRadPerS!))}`,
        'E1 out 0 x 0 1',
      );
      break;
    case 'two-pole':
      // the first stage as single-pole, then 1 S into 1 ohm || C = 1/w2: V(y) = V(x) / (1 + s/w2)
      lines.push(
        'G1 0 x inp inn 1',
        `R1 x 0 ${formatValue(p.openLoopGain!)}`,
        `C1 x 0 ${formatSpiceNumber(1 / fractionToNumber(p.unityGainRadPerS!))}`,
        'G2 0 y x 0 1',
        'R2 y 0 1',
        `C2 y 0 ${formatSpiceNumber(1 / fractionToNumber(p.secondPoleRadPerS!))}`,
        'E1 out 0 y 0 1',
      );
      break;
  }
  lines.push(`.ends ${name}`);
  return lines;
}

function describeModel(model: OpampModel): string {
  switch (model.model) {
    case 'ideal':
      return 'ideal';
    case 'finite-gain':
      return `finite-gain A0=${formatSpiceNumber(model.gain)}`;
    case 'integrator':
      return `integrator GBW=${formatSpiceNumber(model.gainBandwidthHz)} Hz`;
    case 'single-pole':
      return `single-pole GBW=${formatSpiceNumber(model.gainBandwidthHz)} Hz A0=${formatSpiceNumber(model.openLoopGainDb)} dB`;
    case 'two-pole':
      return `two-pole GBW=${formatSpiceNumber(model.gainBandwidthHz)} Hz A0=${formatSpiceNumber(model.openLoopGainDb)} dB p2=${formatSpiceNumber(model.secondPoleHz)} Hz`;
  }
}

function validateSweep(sweep: SpiceAcSweep): SpiceAcSweep {
  if (typeof sweep !== 'object' || sweep === null) throw new InvalidInputError('INVALID_ARGUMENT', 'options.acSweep', sweep, 'must be { pointsPerDecade, startHz, stopHz }');
  requireInteger(sweep.pointsPerDecade, 'options.acSweep.pointsPerDecade', 1, MAX_POINTS_PER_DECADE);
  requirePositive(sweep.startHz, 'options.acSweep.startHz');
  requirePositive(sweep.stopHz, 'options.acSweep.stopHz');
  if (!(sweep.stopHz >= sweep.startHz)) throw new InvalidInputError('OUT_OF_RANGE', 'options.acSweep.stopHz', sweep.stopHz, 'must not be below startHz');
  return sweep;
}

/**
 * ngspice-compatible netlist text of a circuit, with VIN (AC 1) on the input node `in`, the output
 * node written as `out`, one `.subckt` per op-amp model and an `.ac` card. Throws InvalidInputError
 * for bad options or unknown nodes, and UnrealizableError for an FDNR with `fdnr: 'refuse'`.
 *
 * @example
 * const c = new Circuit().addResistor('R1', 'in', 'out', 1000).addCapacitor('C1', 'out', '0', '1e-6');
 * circuitToSpice(c, { acSweep: { pointsPerDecade: 10, startHz: 10, stopHz: 1e5 } });
 * // 'gicladder netlist\n* generated by gicladder ... VIN in 0 DC 0 AC 1\nR1 in out 1e+3\n...'
 */
export function circuitToSpice(circuit: Circuit, options: CircuitToSpiceOptions = {}): string {
  if (typeof circuit !== 'object' || circuit === null || !Array.isArray(circuit.elements)) {
    throw new InvalidInputError('INVALID_ARGUMENT', 'circuit', circuit, 'must be a Circuit');
  }
  const sweep = validateSweep(options.acSweep ?? DEFAULT_AC_SWEEP);
  const input = options.input ?? 'in';
  const output = options.output ?? 'out';
  const fdnrMode = options.fdnr ?? 'equivalent';
  if (fdnrMode !== 'equivalent' && fdnrMode !== 'refuse') {
    throw new InvalidInputError('INVALID_ARGUMENT', 'options.fdnr', fdnrMode, "must be 'equivalent' or 'refuse'");
  }
  if (!circuit.hasNode(input) || input === '0' || input.toLowerCase() === 'gnd') {
    throw new InvalidInputError('INVALID_ARGUMENT', 'options.input', input, 'must be a non-ground node of the circuit');
  }
  if (!circuit.hasNode(output) || output === '0' || output.toLowerCase() === 'gnd') {
    throw new InvalidInputError('INVALID_ARGUMENT', 'options.output', output, 'must be a non-ground node of the circuit');
  }

  // Node names: ground '0', the input 'in', the output 'out' (input === output is allowed: 'in').
  const nodeNames = new NameTable(['0', 'gnd', 'in', 'out']);
  const nodeMap = new Map<string, string>();
  nodeMap.set('0', '0');
  nodeMap.set(input, 'in');
  if (output !== input) nodeMap.set(output, 'out');
  for (const n of circuit.nodes) if (!nodeMap.has(n)) nodeMap.set(n, nodeNames.allocate(`n_${n}`));
  const node = (n: string): string => nodeMap.get(n)!;

  const elementNames = new NameTable(['VIN']);
  const cards: string[] = [];
  const models = new Map<string, { name: string; model: OpampModel }>();
  let driven = false;

  for (const e of circuit.elements as readonly CircuitElement[]) {
    switch (e.kind) {
      case 'R':
        cards.push(`${elementName(elementNames, 'R', e.name)} ${node(e.a)} ${node(e.b)} ${formatValue(e.ohms)}`);
        break;
      case 'C':
        cards.push(`${elementName(elementNames, 'C', e.name)} ${node(e.a)} ${node(e.b)} ${formatValue(e.farads)}`);
        break;
      case 'L':
        cards.push(`${elementName(elementNames, 'L', e.name)} ${node(e.a)} ${node(e.b)} ${formatValue(e.henries)}`);
        break;
      case 'D': {
        if (fdnrMode === 'refuse') {
          throw new UnrealizableError('UNREALIZABLE', `circuit.elements.${e.name}`, e.name, 'SPICE has no FDNR (D) element; build it from a GIC or export with fdnr: equivalent');
        }
        const base = sanitiseSpiceName(e.name);
        const x = nodeNames.allocate(`${base}_x`);
        const y = nodeNames.allocate(`${base}_y`);
        cards.push(`* FDNR ${base}: Y = s^2 D, D = ${formatValue(e.d)} F*s, as linear controlled sources (exact)`);
        cards.push(`${elementName(elementNames, 'G', `${base}_1`)} 0 ${x} ${node(e.a)} ${node(e.b)} 1`);
        cards.push(`${elementName(elementNames, 'L', `${base}_1`)} ${x} 0 1`);
        cards.push(`${elementName(elementNames, 'G', `${base}_2`)} 0 ${y} ${x} 0 1`);
        cards.push(`${elementName(elementNames, 'L', `${base}_2`)} ${y} 0 ${formatValue(e.d)}`);
        cards.push(`${elementName(elementNames, 'G', `${base}_3`)} ${node(e.a)} ${node(e.b)} ${y} 0 1`);
        break;
      }
      case 'V': {
        const isInputSource = !driven && e.a === input && e.b === '0';
        const name = isInputSource ? 'VIN' : elementName(elementNames, 'V', e.name);
        if (isInputSource) driven = true;
        cards.push(`${name} ${node(e.a)} ${node(e.b)} DC 0 AC ${formatValue(e.volts)}`);
        break;
      }
      case 'I':
        cards.push(`${elementName(elementNames, 'I', e.name)} ${node(e.a)} ${node(e.b)} DC 0 AC ${formatValue(e.amps)}`);
        break;
      case 'E':
        cards.push(
          `${elementName(elementNames, 'E', e.name)} ${node(e.outPlus)} ${node(e.outMinus)} ${node(e.controlPlus)} ${node(e.controlMinus)} ${formatValue(e.gain)}`,
        );
        break;
      case 'G':
        cards.push(
          `${elementName(elementNames, 'G', e.name)} ${node(e.outPlus)} ${node(e.outMinus)} ${node(e.controlPlus)} ${node(e.controlMinus)} ${formatValue(e.transconductance)}`,
        );
        break;
      case 'OPAMP': {
        const model = validateOpampModel(e.model, `circuit.elements.${e.name}.model`);
        const key = modelKey(model);
        let entry = models.get(key);
        if (!entry) {
          entry = { name: `OPAMP_${models.size + 1}`, model };
          models.set(key, entry);
        }
        cards.push(`${elementName(elementNames, 'X', e.name)} ${node(e.plus)} ${node(e.minus)} ${node(e.out)} ${entry.name}`);
        break;
      }
      default: {
        const unknown: { name?: unknown; kind?: unknown } = e;
        throw new InvalidInputError('INVALID_ARGUMENT', `circuit.elements.${String(unknown.name)}`, unknown.kind, 'is an element kind SPICE export does not know');
      }
    }
  }

  const lines: string[] = [sanitiseTitle(options.title ?? 'gicladder netlist')];
  lines.push('* generated by gicladder (circuitToSpice); do not edit: regenerate from the design');
  lines.push('* input node: in (driven by VIN, AC 1); output node: out');
  lines.push('* integrator op-amp models and FDNRs have no DC path of their own: run AC with "option noopac"');
  if (!driven) lines.push('VIN in 0 DC 0 AC 1');
  lines.push(...cards);
  for (const { name, model } of models.values()) lines.push(...opampSubcircuit(name, model));
  lines.push(`.ac dec ${sweep.pointsPerDecade} ${formatSpiceNumber(sweep.startHz)} ${formatSpiceNumber(sweep.stopHz)}`);
  lines.push('.end');
  return `${lines.join('\n')}\n`;
}
