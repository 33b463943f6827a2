/**
 * The selection stage's data: every resistor and capacitor of a realised circuit with its exact value
 * and the value chosen for the board.
 */
import type { Fraction } from '../algebra/rational';
import type { ESeriesName } from '../units/eseries';
import type { PartRole } from '../substitution/realization';

/** How preferred values are chosen (see select-parts.ts). */
export type SelectionStrategy = 'exact' | 'round' | 'capacitors-first' | 'search';
export const SELECTION_STRATEGIES: readonly SelectionStrategy[] = Object.freeze(['exact', 'round', 'capacitors-first', 'search']);

/** The series, tolerance and temperature coefficient of one kind of part. */
export interface PartFamily {
  readonly series: ESeriesName;
  readonly tolerancePercent: number;
  readonly temperatureCoefficientPpmPerK: number;
}

export interface SelectionOptions {
  readonly strategy: SelectionStrategy;
  readonly resistors: PartFamily;
  readonly capacitors: PartFamily;
}

/** One part with its exact and chosen values. */
export interface SelectedPart {
  /** The element name in the circuit ('X_L2.R1', 'R_L2', 'C_Rs'...). */
  readonly name: string;
  readonly kind: 'R' | 'C';
  /** What the part is for: which GIC and position, which ladder element it realises, whether it was free. */
  readonly role: PartRole;
  /** The value the realisation computed, ohms or farads, exact. */
  readonly exactValue: Fraction;
  /** The value chosen for the board, exact (an E-series decimal unless the strategy is 'exact'). */
  readonly chosenValue: Fraction;
  /** The chosen value as a double: `parts[i].value`. */
  readonly value: number;
  /** The series the chosen value is from; undefined for 'exact'. */
  readonly series: ESeriesName | undefined;
  readonly tolerancePercent: number;
  readonly temperatureCoefficientPpmPerK: number;
  /** chosen/exact - 1 (float). */
  readonly deviation: number;
  /** For a GIC part whose value was recomputed after the capacitors were rounded: the recomputed exact value. */
  readonly recomputedValue?: Fraction;
}

export interface SelectionDiagnostic {
  readonly code: string;
  readonly message: string;
}

export interface Selection {
  readonly strategy: SelectionStrategy;
  readonly parts: readonly SelectedPart[];
  /** Element name -> chosen value, for Circuit.withValues / the AC engine. */
  readonly values: Readonly<Record<string, Fraction>>;
  readonly diagnostics: readonly SelectionDiagnostic[];
}
