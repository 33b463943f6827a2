/**
 * Named GIC configurations: which of the five positions hold capacitors (the rest resistors), what
 * element the port then presents, and inverse design in exact rationals.
 *
 * With Zin = Z1 Z3 Z5 / (Z2 Z4) (see ./gic), a resistor R contributes R and a capacitor C contributes
 * 1/(sC). So Zin = K s^p, with p = (capacitors in even positions) - (capacitors in odd positions) and
 *   K = prod_{odd i} k_i / prod_{even i} k_i,   k_i = R_i (resistor) or 1/C_i (capacitor).
 * The element presented, by p: +2 FDNC (Z = s^2 E, E = K), +1 inductor (Z = sL, L = K), 0 resistor
 * (R = K), -1 capacitor (Z = 1/(sC), C = 1/K), -2 FDNR (Z = 1/(s^2 D), D = 1/K).
 *
 * The configurations, each by its Zin (Antoniou 1969 for the GIC; Bruton 1969 for the FDNR):
 *   inductor-c2            Zin = s C2 R1 R3 R5 / R4                 L = C2 R1 R3 R5 / R4
 *   inductor-c4            Zin = s C4 R1 R3 R5 / R2                 L = C4 R1 R3 R5 / R2
 *   fdnr-c1c3              Zin = R5 / (s^2 C1 C3 R2 R4)             D = C1 C3 R2 R4 / R5
 *   fdnr-c1c5              Zin = R3 / (s^2 C1 C5 R2 R4)             D = C1 C5 R2 R4 / R3
 *   fdnr-c3c5              Zin = R1 / (s^2 C3 C5 R2 R4)             D = C3 C5 R2 R4 / R1
 *   capacitance-scaler-c1  Zin = R3 R5 / (s C1 R2 R4)               C = C1 R2 R4 / (R3 R5)
 *   capacitance-scaler-c3  Zin = R1 R5 / (s C3 R2 R4)               C = C3 R2 R4 / (R1 R5)
 *   capacitance-scaler-c5  Zin = R1 R3 / (s C5 R2 R4)               C = C5 R2 R4 / (R1 R3)
 *   resistance-scaler      Zin = R1 R3 R5 / (R2 R4)                 R = R1 R3 R5 / (R2 R4)
 *   fdnc-c2c4              Zin = s^2 C2 C4 R1 R3 R5                 E = C2 C4 R1 R3 R5
 *
 * Inverse design: every capacitor takes `capacitorF`, every resistor `resistanceOhms`, individual
 * parts may be overridden with `values`, and the part in position `setBy` is solved so that the
 * identity gives the target exactly. The default `setBy` is the highest-numbered resistor (so the
 * grounded Z5 sets the value where it is a resistor, as is common practice for trimming).
 */
import { InvalidInputError, requireOneOf } from '../errors';
import { Fraction, Q1, type RationalLike } from '../algebra/rational';
import { RationalFunction } from '../algebra/rational-function';
import { toPositiveValue } from './component-value';
import { capacitorImpedance, elementImpedance, resistorImpedance, type ElementKind } from './impedances';
import { GIC_POSITIONS, type GicPosition } from './gic';
import type { GicImpedances } from './gic-nonideal';

export type GicConfiguration =
  | 'inductor-c2'
  | 'inductor-c4'
  | 'fdnr-c1c3'
  | 'fdnr-c1c5'
  | 'fdnr-c3c5'
  | 'capacitance-scaler-c1'
  | 'capacitance-scaler-c3'
  | 'capacitance-scaler-c5'
  | 'resistance-scaler'
  | 'fdnc-c2c4';

/** Position number 1..5 of a GIC impedance. */
export type GicPositionNumber = 1 | 2 | 3 | 4 | 5;

export interface GicConfigurationInfo {
  /** Positions holding capacitors; the others hold resistors. */
  readonly capacitors: readonly GicPositionNumber[];
  /** The element the port presents. */
  readonly element: ElementKind;
  /** The position solved by default in inverse design. */
  readonly defaultSetBy: GicPositionNumber;
}

function info(capacitors: GicPositionNumber[], element: ElementKind): GicConfigurationInfo {
  const resistors = ([1, 2, 3, 4, 5] as GicPositionNumber[]).filter((p) => !capacitors.includes(p));
  return Object.freeze({ capacitors: Object.freeze(capacitors), element, defaultSetBy: resistors[resistors.length - 1] });
}

export const GIC_CONFIGURATIONS: Readonly<Record<GicConfiguration, GicConfigurationInfo>> = Object.freeze({
  'inductor-c2': info([2], 'L'),
  'inductor-c4': info([4], 'L'),
  'fdnr-c1c3': info([1, 3], 'D'),
  'fdnr-c1c5': info([1, 5], 'D'),
  'fdnr-c3c5': info([3, 5], 'D'),
  'capacitance-scaler-c1': info([1], 'C'),
  'capacitance-scaler-c3': info([3], 'C'),
  'capacitance-scaler-c5': info([5], 'C'),
  'resistance-scaler': info([], 'R'),
  'fdnc-c2c4': info([2, 4], 'E'),
});

export const GIC_CONFIGURATION_NAMES = Object.freeze(Object.keys(GIC_CONFIGURATIONS) as GicConfiguration[]);

/** One part of a designed GIC. */
export interface GicPart {
  kind: 'R' | 'C';
  /** Ohms for 'R', farads for 'C'; exact. */
  value: Fraction;
}

export type GicParts = Record<GicPosition, GicPart>;

export interface GicDesignChoices {
  /** Every capacitor's value, F (required when the configuration has capacitors). */
  capacitorF?: RationalLike;
  /** Every resistor's value except the solved one, ohms. */
  resistanceOhms: RationalLike;
  /** The position solved for the target (a resistor or a capacitor); default per configuration. */
  setBy?: GicPositionNumber;
  /** Individual part values overriding capacitorF / resistanceOhms (ohms or farads by the position's kind). */
  values?: Partial<Record<GicPosition, RationalLike>>;
}

export interface GicDesign {
  configuration: GicConfiguration;
  /** The element the port presents and its value (H, F, ohm, F*s, ohm*s^2). */
  element: ElementKind;
  target: Fraction;
  /** The solved position. */
  setBy: GicPositionNumber;
  parts: GicParts;
}

/** The unit a target value string may carry, by element. */
const TARGET_UNIT: Record<ElementKind, string | undefined> = { R: 'ohm', C: 'F', L: 'H', D: undefined, E: undefined };

/**
 * Inverse design of any configuration: parts such that the ideal GIC identity presents exactly the
 * target element. Throws InvalidInputError for an unknown configuration ('configuration'), a target
 * that is not finite positive ('target'), or bad choices ('choices....').
 */
export function designGic(configuration: GicConfiguration, target: RationalLike, choices: GicDesignChoices): GicDesign {
  const name = requireOneOf(configuration, 'configuration', GIC_CONFIGURATION_NAMES);
  const cfg = GIC_CONFIGURATIONS[name];
  const t = toPositiveValue(target, 'target', TARGET_UNIT[cfg.element]);
  if (typeof choices !== 'object' || choices === null) throw new InvalidInputError('INVALID_ARGUMENT', 'choices', choices, 'must be an object');
  const setBy = choices.setBy ?? cfg.defaultSetBy;
  if (![1, 2, 3, 4, 5].includes(setBy)) throw new InvalidInputError('INVALID_ARGUMENT', 'choices.setBy', setBy, 'must be a position 1..5');
  const r = toPositiveValue(choices.resistanceOhms, 'choices.resistanceOhms', 'ohm');
  const c = cfg.capacitors.length > 0 ? toPositiveValue(choices.capacitorF as RationalLike, 'choices.capacitorF', 'F') : undefined;
  const overrides = choices.values ?? {};
  if (typeof overrides !== 'object' || overrides === null) throw new InvalidInputError('INVALID_ARGUMENT', 'choices.values', overrides, 'must be an object');
  for (const key of Object.keys(overrides)) {
    if (!(GIC_POSITIONS as readonly string[]).includes(key)) throw new InvalidInputError('INVALID_ARGUMENT', `choices.values.${key}`, key, 'must be one of z1..z5');
  }
  const solvedKey = `z${setBy}` as GicPosition;
  if (overrides[solvedKey] !== undefined) {
    throw new InvalidInputError('INVALID_ARGUMENT', `choices.values.${solvedKey}`, overrides[solvedKey], 'is the solved part (choices.setBy) and cannot be given');
  }

  const parts = {} as GicParts;
  GIC_POSITIONS.forEach((key, i) => {
    const kind: 'R' | 'C' = cfg.capacitors.includes((i + 1) as GicPositionNumber) ? 'C' : 'R';
    const given = overrides[key];
    const value = given !== undefined ? toPositiveValue(given, `choices.values.${key}`, kind === 'R' ? 'ohm' : 'F') : kind === 'R' ? r : (c as Fraction);
    parts[key] = { kind, value };
  });

  // K_target from the element value; K_rest = K with k_setBy = 1; then solve k_setBy.
  const kTarget = cfg.element === 'C' || cfg.element === 'D' ? Q1.div(t) : t;
  const kRest = coefficientK({ ...parts, [solvedKey]: { kind: 'R', value: Q1 } });
  const kSolved = setBy % 2 === 1 ? kTarget.div(kRest) : kRest.div(kTarget); // K = k_set^(+-1) * K_rest
  const kind = parts[solvedKey].kind;
  parts[solvedKey] = { kind, value: kind === 'R' ? kSolved : Q1.div(kSolved) }; // k = R, or k = 1/C
  return { configuration: name, element: cfg.element, target: t, setBy, parts };
}

/** K = prod_{odd} k_i / prod_{even} k_i with k = R or 1/C: the coefficient of Zin = K s^p. */
function coefficientK(parts: GicParts): Fraction {
  let k = Q1;
  GIC_POSITIONS.forEach((key, i) => {
    const p = parts[key];
    const ki = p.kind === 'R' ? p.value : Q1.div(p.value);
    k = i % 2 === 0 ? k.mul(ki) : k.div(ki);
  });
  return k;
}

/**
 * The element a set of R/C parts presents through the ideal GIC: its kind and exact value, or kind
 * undefined when the power of s is outside -2..2 (three capacitors in odd positions, for instance).
 */
export function gicElementOfParts(parts: GicParts): { kind: ElementKind | undefined; powerOfS: number; value: Fraction } {
  validateParts(parts, 'parts');
  let p = 0;
  GIC_POSITIONS.forEach((key, i) => {
    if (parts[key].kind === 'C') p += i % 2 === 0 ? -1 : 1;
  });
  const k = coefficientK(parts);
  const kinds: Record<number, ElementKind> = { 2: 'E', 1: 'L', 0: 'R', [-1]: 'C', [-2]: 'D' };
  const kind = kinds[p];
  const value = kind === 'C' || kind === 'D' ? Q1.div(k) : k;
  return { kind, powerOfS: p, value };
}

/** The impedances of designed parts, ready for gicImpedance. */
export function gicPartsImpedances(parts: GicParts): GicImpedances {
  validateParts(parts, 'parts');
  const z = {} as Record<GicPosition, RationalFunction>;
  for (const key of GIC_POSITIONS) {
    const p = parts[key];
    z[key] = p.kind === 'R' ? resistorImpedance(p.value, `parts.${key}.value`) : capacitorImpedance(p.value, `parts.${key}.value`);
  }
  return z;
}

/** The impedance the configuration should present for a target value: the element's impedance. */
export function gicTargetImpedance(design: Pick<GicDesign, 'element' | 'target'>): RationalFunction {
  return elementImpedance(design.element, design.target, 'design');
}

function validateParts(parts: unknown, path: string): asserts parts is GicParts {
  if (typeof parts !== 'object' || parts === null) throw new InvalidInputError('INVALID_ARGUMENT', path, parts, 'must be { z1..z5: { kind, value } }');
  const r = parts as Record<string, unknown>;
  for (const key of GIC_POSITIONS) {
    const p = r[key] as { kind?: unknown; value?: unknown } | undefined;
    if (typeof p !== 'object' || p === null || (p.kind !== 'R' && p.kind !== 'C')) {
      throw new InvalidInputError('INVALID_ARGUMENT', `${path}.${key}`, p, "must be { kind: 'R' | 'C', value }");
    }
    toPositiveValue(p.value as RationalLike, `${path}.${key}.value`);
  }
}

/** L = C2 R1 R3 R5 / R4: a grounded simulated inductor with the capacitor in position 2. */
export const designInductorC2 = (inductanceH: RationalLike, choices: GicDesignChoices): GicDesign => designGic('inductor-c2', inductanceH, choices);
/** L = C4 R1 R3 R5 / R2: a grounded simulated inductor with the capacitor in position 4. */
export const designInductorC4 = (inductanceH: RationalLike, choices: GicDesignChoices): GicDesign => designGic('inductor-c4', inductanceH, choices);
/** D = C1 C3 R2 R4 / R5: an FDNR with capacitors in positions 1 and 3. */
export const designFdnrC1C3 = (dFs: RationalLike, choices: GicDesignChoices): GicDesign => designGic('fdnr-c1c3', dFs, choices);
/** D = C1 C5 R2 R4 / R3: an FDNR with capacitors in positions 1 and 5. */
export const designFdnrC1C5 = (dFs: RationalLike, choices: GicDesignChoices): GicDesign => designGic('fdnr-c1c5', dFs, choices);
/** D = C3 C5 R2 R4 / R1: an FDNR with capacitors in positions 3 and 5. */
export const designFdnrC3C5 = (dFs: RationalLike, choices: GicDesignChoices): GicDesign => designGic('fdnr-c3c5', dFs, choices);
/** C = C1 R2 R4 / (R3 R5): a capacitance scaler with the capacitor in position 1. */
export const designCapacitanceScalerC1 = (capacitanceF: RationalLike, choices: GicDesignChoices): GicDesign =>
  designGic('capacitance-scaler-c1', capacitanceF, choices);
/** C = C3 R2 R4 / (R1 R5): a capacitance scaler with the capacitor in position 3. */
export const designCapacitanceScalerC3 = (capacitanceF: RationalLike, choices: GicDesignChoices): GicDesign =>
  designGic('capacitance-scaler-c3', capacitanceF, choices);
/** C = C5 R2 R4 / (R1 R3): a capacitance scaler with the capacitor in position 5. */
export const designCapacitanceScalerC5 = (capacitanceF: RationalLike, choices: GicDesignChoices): GicDesign =>
  designGic('capacitance-scaler-c5', capacitanceF, choices);
/** R = R1 R3 R5 / (R2 R4): a resistance scaler. */
export const designResistanceScaler = (resistanceOhms: RationalLike, choices: GicDesignChoices): GicDesign =>
  designGic('resistance-scaler', resistanceOhms, choices);
/** E = C2 C4 R1 R3 R5: a frequency-dependent negative conductance, Z = s^2 E. */
export const designFdncC2C4 = (eOhmS2: RationalLike, choices: GicDesignChoices): GicDesign => designGic('fdnc-c2c4', eOhmS2, choices);
