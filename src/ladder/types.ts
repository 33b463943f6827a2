/**
 * The ladder stage's data: a doubly or singly terminated LC ladder, normalised (1 ohm, 1 rad/s for the
 * prototypes this stage makes), listed from the source end. See DESIGN.md, conventions.
 */
import type { Fraction } from '../algebra/rational';

/** Where a branch sits: in the series path, or from the series path to ground. */
export type BranchPlacement = 'series' | 'shunt';

/**
 * One branch. A branch with one part has either `inductanceH` or `capacitanceF`. With both parts,
 * `arrangement` says how they are joined: `'parallel'` (an L || C tank, the series branch of the
 * minimum-inductor form) or `'series'` (an L-C arm resonant at a transmission zero, the shunt branch of
 * the minimum-capacitor form).
 */
export interface Branch {
  placement: BranchPlacement;
  inductanceH?: number;
  capacitanceF?: number;
  arrangement?: 'parallel' | 'series';
}

/**
 * An LC ladder between a source resistance and a load. `sourceOhms` may be 0 (an ideal voltage source,
 * then the load is resistive) and `loadOhms` may be `'open'` (then `sourceOhms` > 0).
 */
export interface Ladder {
  sourceOhms: number;
  loadOhms: number | 'open';
  branches: Branch[];
}

/** The exact twin of {@link Branch}: the same element values as rationals. */
export interface ExactBranch {
  placement: BranchPlacement;
  inductanceH?: Fraction;
  capacitanceF?: Fraction;
  arrangement?: 'parallel' | 'series';
}

/** The exact twin of {@link Ladder}, for the transforms that work in rationals. */
export interface ExactLadder {
  sourceOhms: Fraction;
  loadOhms: Fraction | 'open';
  branches: ExactBranch[];
}

/** A warning or a note about what the synthesis did (never printed: returned to the caller). */
export interface Diagnostic {
  code: string;
  message: string;
}

/** The ladder forms. See {@link LADDER_FORMS} and darlington.ts for which realisation needs which. */
export type LadderForm = 'shunt-first' | 'series-first';
export const LADDER_FORMS: readonly LadderForm[] = ['shunt-first', 'series-first'];

/**
 * Which half of the roots of F(s)F(-s) the reflection polynomial F(s) takes. Roots on the j-axis and at
 * the origin are split evenly whatever the choice; only the others differ (Bessel ladders do).
 */
export type ReflectionZeroChoice = 'minimum-phase' | 'maximum-phase';
export const REFLECTION_ZERO_CHOICES: readonly ReflectionZeroChoice[] = ['minimum-phase', 'maximum-phase'];

/**
 * What to do with a response whose gain at infinity is not zero (even-order elliptic, even-order inverse
 * Chebyshev), which no ladder of this kind realises:
 * - `'none'`: refuse;
 * - `'move-zero'`: move the highest finite transmission zero to infinity;
 * - `'move-zero-and-reflection'`: also move the lowest reflection zero to DC, so the DC gain is the
 *   passband maximum and equal terminations become possible;
 * - `'auto'` (default): `'move-zero-and-reflection'` when equal terminations are asked for and the DC
 *   gain is below the peak, else `'move-zero'`.
 */
export type EvenOrderModification = 'auto' | 'none' | 'move-zero' | 'move-zero-and-reflection';
export const EVEN_ORDER_MODIFICATIONS: readonly EvenOrderModification[] = ['auto', 'none', 'move-zero', 'move-zero-and-reflection'];
