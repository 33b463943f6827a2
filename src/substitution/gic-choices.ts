/**
 * The free choices of each GIC and the default (optimum) resistor choice, exact.
 *
 * Simulated inductor, capacitor in position 4 (L = C4 R1 R3 R5 / R2, converter/configurations.ts): the
 * circuit engine's first-order op-amp analysis (converter/gic-nonideal.ts, Eq. (4)) shows that R2 = R3
 * cancels the first-order loss and that the inductance error is smallest at omega0 C4 R5 = 1. So:
 *   C4 = capacitorF (free), R5 = 1/(omega0 C4) (free: set by the optimum), R2 = R3 = resistanceOhms
 *   (free, default R5: all but R1 equal), R1 = L R2 / (C4 R3 R5) = omega0 L (computed).
 * Capacitor in position 2 (L = C2 R1 R3 R5 / R4): the same choice with the roles of R2 and R4 swapped,
 * R3 = R4 = resistanceOhms, R5 = 1/(omega0 C2), R1 solved (by symmetry with the C4 case; not derived).
 *
 * FDNR (D = C1 C3 R2 R4 / R5 and the 1-5, 3-5 variants): both capacitors capacitorF; the two resistors
 * in even positions resistanceOhms (free), the odd resistor solved. Default resistanceOhms = D / C^2,
 * which makes all three resistors equal (D = C^2 R R / R = C^2 R), the equal-resistor design that is
 * common practice (no source).
 *
 * The embedding converter (Zin = s k Z with k = C4 R1 R3 / R2, or C2 R1 R3 / R4): R2 = R3 (or R3 = R4)
 * = resistanceOhms, R1 = k / C; one k for the whole ladder (see gic-embedding.ts).
 */
import { Fraction, Q1, fractionToNumber, toFraction } from '../algebra/rational';
import { designGic, type GicDesign } from '../converter/configurations';
import { isElement, ladderElements, type Network, type NetworkLadder } from '../transform/network';
import type { GicPositionNumber } from './gic-instance';
import type { FdnrCapacitorPositions } from './realization';

/** Significant digits of a float-derived choice made exact: enough that it is not a visible rounding. */
export const CHOICE_SIGNIFICANT_DIGITS = 6;

/** x rounded to `digits` significant decimal digits, as an exact rational (x > 0, finite). */
export function roundToSignificant(x: number, digits = CHOICE_SIGNIFICANT_DIGITS): Fraction {
  return toFraction(x.toPrecision(digits));
}

/** The resistance of a single-resistor termination, or undefined. */
function terminationOhms(n: Network | null | 'open'): Fraction | undefined {
  return n !== null && n !== 'open' && isElement(n) && n.kind === 'R' ? n.value : undefined;
}

/** The ladder's resistance level: the source resistor, else the load resistor, else 1 ohm. */
export function ladderResistanceLevel(l: NetworkLadder): Fraction {
  return terminationOhms(l.source) ?? terminationOhms(l.load) ?? Q1;
}

/**
 * The ladder's characteristic angular frequency, rad/s (float): the geometric mean of R0/L over its
 * inductors and 1/(R0 C) over its capacitors (D: sqrt(1/(R0 D))), R0 the resistance level. For a ladder
 * scaled from a 1-ohm, 1-rad/s prototype to R0 and omega_c this is omega_c times the geometric mean of the
 * g-values' reciprocals and near omega_c; for a bandpass each L-C pair from one prototype element
 * contributes (B/g)(omega0^2 g/B), so the mean is the centre omega0. Used as the working frequency of the
 * resistor optimum when none is given. NaN for a ladder without reactive elements.
 */
export function ladderCharacteristicOmega(l: NetworkLadder): number {
  const r0 = fractionToNumber(ladderResistanceLevel(l));
  let logSum = 0;
  let count = 0;
  for (const e of ladderElements(l)) {
    const v = fractionToNumber(e.value);
    if (e.kind === 'L') logSum += Math.log(r0 / v);
    else if (e.kind === 'C') logSum += Math.log(1 / (r0 * v));
    else if (e.kind === 'D') logSum += 0.5 * Math.log(1 / (r0 * v));
    else continue;
    count += 1;
  }
  return count === 0 ? NaN : Math.exp(logSum / count);
}

/** A designed GIC and which positions were free choices. */
export interface ChosenGic {
  readonly design: GicDesign;
  readonly free: Partial<Record<GicPositionNumber, boolean>>;
}

/** The simulated inductor L (H) with the optimum resistor choice at omega0 (rad/s, exact). */
export function chooseInductorGic(inductanceH: Fraction, c: Fraction, omega0: Fraction, position: 2 | 4, resistanceOhms?: Fraction): ChosenGic {
  const r5 = Q1.div(omega0.mul(c)); // omega0 C R5 = 1 (gic-nonideal.ts, Eq. (4))
  const r = resistanceOhms ?? r5;
  const values = position === 4 ? { z2: r, z3: r, z5: r5 } : { z3: r, z4: r, z5: r5 };
  const design = designGic(position === 4 ? 'inductor-c4' : 'inductor-c2', inductanceH, { capacitorF: c, resistanceOhms: r, values, setBy: 1 });
  // Free: the capacitor (2 or 4), the equal pair and R5; R1 is computed.
  return { design, free: { 2: true, 3: true, 4: true, 5: true } };
}

const FDNR_CONFIG = {
  '1-3': { configuration: 'fdnr-c1c3', setBy: 5, free: { 1: true, 2: true, 3: true, 4: true } },
  '1-5': { configuration: 'fdnr-c1c5', setBy: 3, free: { 1: true, 2: true, 4: true, 5: true } },
  '3-5': { configuration: 'fdnr-c3c5', setBy: 1, free: { 2: true, 3: true, 4: true, 5: true } },
} as const;

/** The FDNR D (F*s) with both capacitors c and the even resistors resistanceOhms (default D/c^2). */
export function chooseFdnrGic(d: Fraction, c: Fraction, positions: FdnrCapacitorPositions, resistanceOhms?: Fraction): ChosenGic {
  const cfg = FDNR_CONFIG[positions];
  const r = resistanceOhms ?? d.div(c.mul(c)); // equal resistors: D = C^2 R
  const design = designGic(cfg.configuration, d, { capacitorF: c, resistanceOhms: r, setBy: cfg.setBy });
  return { design, free: cfg.free };
}

/**
 * The embedding converter with conversion constant k (s): Zin = s k Z(load). Capacitor c in position 4
 * (k = C4 R1 R3 / R2) or 2 (k = C2 R1 R3 / R4), the equal pair resistanceOhms, R1 solved.
 * Built with designGic's inductor configuration: with Z5 = R5 = 1 ohm it presents L = k, so the same
 * inverse design gives R1; z5 is then dropped by the caller.
 */
export function chooseConverterGic(k: Fraction, c: Fraction, position: 2 | 4, resistanceOhms: Fraction): ChosenGic {
  const values = position === 4 ? { z2: resistanceOhms, z3: resistanceOhms, z5: Q1 } : { z3: resistanceOhms, z4: resistanceOhms, z5: Q1 };
  const design = designGic(position === 4 ? 'inductor-c4' : 'inductor-c2', k, { capacitorF: c, resistanceOhms, values, setBy: 1 });
  return { design, free: { 2: true, 3: true, 4: true } };
}
