/**
 * The circuit elements. Each one stamps itself into modified nodal analysis through a
 * {@link StampContext} (see stamp.ts); the analyses never switch on the element kind. Values are exact
 * rationals. Sign conventions follow SPICE so that the export stage can write elements one to one:
 * a voltage source's branch current flows from its + node through the source to its - node; a current
 * source's (and a VCCS's) current flows from its first node through the source to its second node.
 */
import type { Fraction } from '../algebra/index';
import { opampParameters, type OpampModel } from './opamp';
import type { ElementTopology, StampContext, Stampable } from './stamp';

/** Maps an element's node names when it is copied into another circuit (subcircuit instances). */
export type NodeMap = (node: string) => string;

abstract class TwoTerminal implements Stampable {
  constructor(
    readonly name: string,
    /** First terminal. */
    readonly a: string,
    /** Second terminal. */
    readonly b: string,
  ) {}
  get nodes(): readonly string[] {
    return [this.a, this.b];
  }
  abstract stamp(ctx: StampContext): void;
  abstract topology(): ElementTopology;
}

/** A resistor of `ohms` between a and b: admittance 1/R. */
export class Resistor extends TwoTerminal {
  readonly kind = 'R' as const;
  constructor(name: string, a: string, b: string, readonly ohms: Fraction) {
    super(name, a, b);
  }
  stamp(ctx: StampContext): void {
    const p = ctx.parameter('', this.ohms);
    ctx.admittance(ctx.node(this.a), ctx.node(this.b), 0, 1, [{ slot: p, exponent: -1 }]); // Y = 1/R
  }
  topology(): ElementTopology {
    return { edges: [{ a: this.a, b: this.b, dc: true }], voltageDefined: [], sensed: [] };
  }
  renamed(name: string, map: NodeMap): Resistor {
    return new Resistor(name, map(this.a), map(this.b), this.ohms);
  }
  /** A copy with another value (same name and nodes). */
  withValue(value: Fraction): Resistor {
    return new Resistor(this.name, this.a, this.b, value);
  }
}

/** A capacitor of `farads`: admittance sC. */
export class Capacitor extends TwoTerminal {
  readonly kind = 'C' as const;
  constructor(name: string, a: string, b: string, readonly farads: Fraction) {
    super(name, a, b);
  }
  stamp(ctx: StampContext): void {
    const p = ctx.parameter('', this.farads);
    ctx.admittance(ctx.node(this.a), ctx.node(this.b), 1, 1, [{ slot: p, exponent: 1 }]); // Y = sC
  }
  topology(): ElementTopology {
    return { edges: [{ a: this.a, b: this.b, dc: false }], voltageDefined: [], sensed: [] };
  }
  renamed(name: string, map: NodeMap): Capacitor {
    return new Capacitor(name, map(this.a), map(this.b), this.farads);
  }
  /** A copy with another value (same name and nodes). */
  withValue(value: Fraction): Capacitor {
    return new Capacitor(this.name, this.a, this.b, value);
  }
}

/**
 * An inductor of `henries`, with its current as an MNA unknown (so L enters as a polynomial, and the
 * matrix stays polynomial in s): KCL gets +-i, the branch row is V(a) - V(b) - sL i = 0.
 */
export class Inductor extends TwoTerminal {
  readonly kind = 'L' as const;
  constructor(name: string, a: string, b: string, readonly henries: Fraction) {
    super(name, a, b);
  }
  stamp(ctx: StampContext): void {
    const p = ctx.parameter('', this.henries);
    const a = ctx.node(this.a);
    const b = ctx.node(this.b);
    const k = ctx.branch('i');
    ctx.entry(a, k, 0, 1);
    ctx.entry(b, k, 0, -1);
    ctx.entry(k, a, 0, 1);
    ctx.entry(k, b, 0, -1);
    ctx.entry(k, k, 1, -1, [{ slot: p, exponent: 1 }]); // V = sL i
  }
  topology(): ElementTopology {
    return { edges: [{ a: this.a, b: this.b, dc: true }], voltageDefined: [], sensed: [] };
  }
  renamed(name: string, map: NodeMap): Inductor {
    return new Inductor(name, map(this.a), map(this.b), this.henries);
  }
  /** A copy with another value (same name and nodes). */
  withValue(value: Fraction): Inductor {
    return new Inductor(this.name, this.a, this.b, value);
  }
}

/**
 * A frequency-dependent negative resistor (FDNR, "D element") of value D in F*s: Z = 1/(s^2 D),
 * admittance s^2 D (L. T. Bruton, "Network transfer functions using the concept of frequency-dependent
 * negative resistance", IEEE Trans. Circuit Theory CT-16(3), 1969).
 */
export class Fdnr extends TwoTerminal {
  readonly kind = 'D' as const;
  constructor(name: string, a: string, b: string, readonly d: Fraction) {
    super(name, a, b);
  }
  stamp(ctx: StampContext): void {
    const p = ctx.parameter('', this.d);
    ctx.admittance(ctx.node(this.a), ctx.node(this.b), 2, 1, [{ slot: p, exponent: 1 }]); // Y = s^2 D
  }
  topology(): ElementTopology {
    return { edges: [{ a: this.a, b: this.b, dc: false }], voltageDefined: [], sensed: [] };
  }
  renamed(name: string, map: NodeMap): Fdnr {
    return new Fdnr(name, map(this.a), map(this.b), this.d);
  }
  /** A copy with another value (same name and nodes). */
  withValue(value: Fraction): Fdnr {
    return new Fdnr(this.name, this.a, this.b, value);
  }
}

/** An independent voltage source V(plus) - V(minus) = amplitude (AC amplitude, default 1). */
export class VoltageSource extends TwoTerminal {
  readonly kind = 'V' as const;
  constructor(name: string, plus: string, minus: string, readonly volts: Fraction) {
    super(name, plus, minus);
  }
  get plus(): string {
    return this.a;
  }
  get minus(): string {
    return this.b;
  }
  stamp(ctx: StampContext): void {
    const p = ctx.parameter('', this.volts);
    const a = ctx.node(this.a);
    const b = ctx.node(this.b);
    const k = ctx.branch('i');
    ctx.entry(a, k, 0, 1);
    ctx.entry(b, k, 0, -1);
    ctx.entry(k, a, 0, 1);
    ctx.entry(k, b, 0, -1);
    ctx.excitation(k, 1, p);
  }
  topology(): ElementTopology {
    return { edges: [{ a: this.a, b: this.b, dc: true }], voltageDefined: [{ plus: this.a, minus: this.b }], sensed: [] };
  }
  renamed(name: string, map: NodeMap): VoltageSource {
    return new VoltageSource(name, map(this.a), map(this.b), this.volts);
  }
  /** A copy with another value (same name and nodes). */
  withValue(value: Fraction): VoltageSource {
    return new VoltageSource(this.name, this.a, this.b, value);
  }
}

/** An independent current source of `amps` flowing from node a through the source to node b. */
export class CurrentSource extends TwoTerminal {
  readonly kind = 'I' as const;
  constructor(name: string, from: string, to: string, readonly amps: Fraction) {
    super(name, from, to);
  }
  stamp(ctx: StampContext): void {
    const p = ctx.parameter('', this.amps);
    // KCL rows are "current leaving the node through elements = injected current".
    ctx.excitation(ctx.node(this.a), -1, p);
    ctx.excitation(ctx.node(this.b), 1, p);
  }
  topology(): ElementTopology {
    return { edges: [], voltageDefined: [], sensed: [this.a, this.b] };
  }
  renamed(name: string, map: NodeMap): CurrentSource {
    return new CurrentSource(name, map(this.a), map(this.b), this.amps);
  }
  /** A copy with another value (same name and nodes). */
  withValue(value: Fraction): CurrentSource {
    return new CurrentSource(this.name, this.a, this.b, value);
  }
}

/** Four-terminal controlled sources share the node layout of SPICE's E and G cards. */
abstract class Controlled implements Stampable {
  constructor(
    readonly name: string,
    readonly outPlus: string,
    readonly outMinus: string,
    readonly controlPlus: string,
    readonly controlMinus: string,
  ) {}
  get nodes(): readonly string[] {
    return [this.outPlus, this.outMinus, this.controlPlus, this.controlMinus];
  }
  abstract stamp(ctx: StampContext): void;
  abstract topology(): ElementTopology;
}

/** Voltage-controlled voltage source: V(outPlus) - V(outMinus) = gain * (V(controlPlus) - V(controlMinus)). */
export class Vcvs extends Controlled {
  readonly kind = 'E' as const;
  constructor(name: string, outPlus: string, outMinus: string, controlPlus: string, controlMinus: string, readonly gain: Fraction) {
    super(name, outPlus, outMinus, controlPlus, controlMinus);
  }
  stamp(ctx: StampContext): void {
    const p = ctx.parameter('', this.gain);
    const op = ctx.node(this.outPlus);
    const om = ctx.node(this.outMinus);
    const cp = ctx.node(this.controlPlus);
    const cm = ctx.node(this.controlMinus);
    const k = ctx.branch('i');
    ctx.entry(op, k, 0, 1);
    ctx.entry(om, k, 0, -1);
    ctx.entry(k, op, 0, 1);
    ctx.entry(k, om, 0, -1);
    ctx.entry(k, cp, 0, -1, [{ slot: p, exponent: 1 }]);
    ctx.entry(k, cm, 0, 1, [{ slot: p, exponent: 1 }]);
  }
  topology(): ElementTopology {
    return {
      edges: [{ a: this.outPlus, b: this.outMinus, dc: true }],
      voltageDefined: [{ plus: this.outPlus, minus: this.outMinus }],
      sensed: [this.controlPlus, this.controlMinus],
    };
  }
  renamed(name: string, map: NodeMap): Vcvs {
    return new Vcvs(name, map(this.outPlus), map(this.outMinus), map(this.controlPlus), map(this.controlMinus), this.gain);
  }
  /** A copy with another value (same name and nodes). */
  withValue(value: Fraction): Vcvs {
    return new Vcvs(this.name, this.outPlus, this.outMinus, this.controlPlus, this.controlMinus, value);
  }
}

/**
 * Voltage-controlled current source: a current gm * (V(controlPlus) - V(controlMinus)) flows from
 * outPlus through the source to outMinus (SPICE's G card).
 */
export class Vccs extends Controlled {
  readonly kind = 'G' as const;
  constructor(
    name: string,
    outPlus: string,
    outMinus: string,
    controlPlus: string,
    controlMinus: string,
    readonly transconductance: Fraction,
  ) {
    super(name, outPlus, outMinus, controlPlus, controlMinus);
  }
  stamp(ctx: StampContext): void {
    const p = ctx.parameter('', this.transconductance);
    const f = [{ slot: p, exponent: 1 }];
    const op = ctx.node(this.outPlus);
    const om = ctx.node(this.outMinus);
    const cp = ctx.node(this.controlPlus);
    const cm = ctx.node(this.controlMinus);
    ctx.entry(op, cp, 0, 1, f);
    ctx.entry(op, cm, 0, -1, f);
    ctx.entry(om, cp, 0, -1, f);
    ctx.entry(om, cm, 0, 1, f);
  }
  topology(): ElementTopology {
    // The output is counted as a connection (it carries current between its nodes), the controls are sensed.
    return { edges: [{ a: this.outPlus, b: this.outMinus, dc: true }], voltageDefined: [], sensed: [this.controlPlus, this.controlMinus] };
  }
  renamed(name: string, map: NodeMap): Vccs {
    return new Vccs(name, map(this.outPlus), map(this.outMinus), map(this.controlPlus), map(this.controlMinus), this.transconductance);
  }
  /** A copy with another value (same name and nodes). */
  withValue(value: Fraction): Vccs {
    return new Vccs(this.name, this.outPlus, this.outMinus, this.controlPlus, this.controlMinus, value);
  }
}

/**
 * An op-amp with output referred to ground. Its output current is an MNA unknown; its constraint row
 * is (1/A(s)) V(out) - (V(plus) - V(minus)) = 0 with 1/A(s) from {@link opampInverseGain}'s terms, and
 * for the ideal model (the nullor) V(plus) - V(minus) = 0. Parameters: `${name}.openLoopGain` (A0),
 * `${name}.unityGainRadPerS` (2*pi*GBW) and `${name}.secondPoleRadPerS`, as the model has them.
 */
export class Opamp implements Stampable {
  readonly kind = 'OPAMP' as const;
  constructor(
    readonly name: string,
    readonly plus: string,
    readonly minus: string,
    readonly out: string,
    readonly model: OpampModel,
  ) {}
  get nodes(): readonly string[] {
    return [this.plus, this.minus, this.out];
  }
  stamp(ctx: StampContext): void {
    const o = ctx.node(this.out);
    const p = ctx.node(this.plus);
    const m = ctx.node(this.minus);
    const k = ctx.branch('out');
    ctx.entry(o, k, 0, 1); // the output current leaves the output node into the op-amp (sign is a convention)
    ctx.entry(k, p, 0, -1);
    ctx.entry(k, m, 0, 1);
    const q = opampParameters(this.model);
    const a0 = q.openLoopGain && ctx.parameter('openLoopGain', q.openLoopGain);
    const wt = q.unityGainRadPerS && ctx.parameter('unityGainRadPerS', q.unityGainRadPerS);
    const w2 = q.secondPoleRadPerS && ctx.parameter('secondPoleRadPerS', q.secondPoleRadPerS);
    const inv = (slot: number) => ({ slot, exponent: -1 });
    switch (this.model.model) {
      case 'ideal':
        break;
      case 'finite-gain':
        ctx.entry(k, o, 0, 1, [inv(a0 as number)]); // 1/A0
        break;
      case 'integrator':
        ctx.entry(k, o, 1, 1, [inv(wt as number)]); // s/wt
        break;
      case 'single-pole':
        ctx.entry(k, o, 0, 1, [inv(a0 as number)]); // 1/A0 + s/wt
        ctx.entry(k, o, 1, 1, [inv(wt as number)]);
        break;
      case 'two-pole':
        ctx.entry(k, o, 0, 1, [inv(a0 as number)]); // 1/A0 + s/wt + s/(A0 w2) + s^2/(wt w2)
        ctx.entry(k, o, 1, 1, [inv(wt as number)]);
        ctx.entry(k, o, 1, 1, [inv(a0 as number), inv(w2 as number)]);
        ctx.entry(k, o, 2, 1, [inv(wt as number), inv(w2 as number)]);
        break;
    }
  }
  topology(): ElementTopology {
    return {
      edges: [{ a: this.out, b: GROUND_NAME, dc: true }],
      voltageDefined: [{ plus: this.out, minus: GROUND_NAME }],
      sensed: [this.plus, this.minus],
      driven: this.out,
      nullators: this.model.model === 'ideal' ? [{ plus: this.plus, minus: this.minus }] : [],
    };
  }
  renamed(name: string, map: NodeMap): Opamp {
    return new Opamp(name, map(this.plus), map(this.minus), map(this.out), this.model);
  }
  /** A copy with another model (same name and nodes). */
  withModel(model: OpampModel): Opamp {
    return new Opamp(this.name, this.plus, this.minus, this.out, model);
  }
}

/** The canonical name of the ground node. */
export const GROUND_NAME = '0';

/** Every element kind the circuit builder makes; switch on `kind` (SPICE letters, 'OPAMP'). */
export type CircuitElement = Resistor | Capacitor | Inductor | Fdnr | VoltageSource | CurrentSource | Vcvs | Vccs | Opamp;
