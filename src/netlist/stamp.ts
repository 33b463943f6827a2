/**
 * The stamping interface between elements and the analyses. Modified nodal analysis (C.-W. Ho,
 * A. E. Ruehli, P. A. Brennan, "The modified nodal approach to network analysis", IEEE Trans. Circuits
 * and Systems CAS-22(6), 1975): unknowns are the non-ground node voltages plus one branch current for
 * each element that needs one (voltage sources, VCVS outputs, op-amp outputs, inductors).
 *
 * An element describes its contribution as a list of terms `coefficient * prod(p_i^e_i) * s^k` at
 * (row, column) of the MNA matrix, where the p_i are named parameters (component values). The exact
 * analysis multiplies the parameters out in Q[s]; the float engine keeps them in a Float64Array, so a
 * value can change without recompiling. Neither analysis knows any element kind.
 */
import type { Fraction } from '../algebra/index';

/** The unknown index of the ground node: terms on it are dropped (its voltage is the reference). */
export const GROUND = -1;

/** One factor p^exponent of a term's coefficient; `slot` is returned by {@link StampContext.parameter}. */
export interface ParameterFactor {
  readonly slot: number;
  readonly exponent: number;
}

/** What an element may do while stamping itself. */
export interface StampContext {
  /** The unknown index of a node voltage (node names as the element stores them); {@link GROUND} for ground. */
  node(name: string): number;
  /**
   * Allocates a branch-current unknown owned by the stamping element and returns its index; the row of
   * the same index is the element's constraint equation. `label` names it in results (`${element}#${label}`).
   */
  branch(label: string): number;
  /**
   * Registers a named parameter with its exact value and returns its slot. `label` '' names the
   * element's main value (the parameter is then called by the element's name, e.g. 'R1'); any other
   * label gives `${element}.${label}` (e.g. 'U1.openLoopGain').
   */
  parameter(label: string, value: Fraction): number;
  /** Adds `coefficient * prod(factors) * s^sPower` to the matrix at (row, col). Ground rows/columns are dropped. */
  entry(row: number, col: number, sPower: number, coefficient: number, factors?: readonly ParameterFactor[]): void;
  /**
   * Adds an admittance `coefficient * prod(factors) * s^sPower` between node unknowns a and b (the
   * four-entry pattern +y at (a,a), (b,b), -y at (a,b), (b,a)).
   */
  admittance(a: number, b: number, sPower: number, coefficient: number, factors?: readonly ParameterFactor[]): void;
  /**
   * Declares the element an independent source whose unit excitation puts `coefficient` into the
   * right-hand side at `row`; `valueSlot` (optional) is the parameter holding its amplitude.
   */
  excitation(row: number, coefficient: number, valueSlot?: number): void;
}

/** How an element connects its nodes, for the topology checks (the solver does not use this). */
export interface ElementTopology {
  /** Pairs of nodes joined by a finite impedance or a voltage-defining branch; `dc` if it conducts at s = 0. */
  readonly edges: readonly { readonly a: string; readonly b: string; readonly dc: boolean }[];
  /** Branches that force the voltage between two nodes (voltage sources, VCVS and op-amp outputs). */
  readonly voltageDefined: readonly { readonly plus: string; readonly minus: string }[];
  /** Nodes the element only senses (draws no current from): VCVS/VCCS controls, op-amp inputs. */
  readonly sensed: readonly string[];
  /** For op-amps: the output node (two on one node are tied outputs). */
  readonly driven?: string;
  /** Nullator pairs (ideal op-amp inputs): the element forces V(plus) = V(minus). */
  readonly nullators?: readonly { readonly plus: string; readonly minus: string }[];
}

/** Anything that can stamp itself into a circuit analysis. */
export interface Stampable {
  /** Unique within its circuit. */
  readonly name: string;
  /** Every node the element touches, in terminal order. */
  readonly nodes: readonly string[];
  stamp(ctx: StampContext): void;
  topology(): ElementTopology;
}
